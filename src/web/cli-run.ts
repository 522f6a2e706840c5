/**
 * The workbench's one way into armwind: run a CLI command in-process, exactly as `armwind …` would
 * run with the shop folder as its working folder, and keep what it printed. The HTTP handlers are a
 * thin shell over this: the same `main(args, io)` the terminal uses, so the page and the CLI cannot
 * drift apart.
 */
import { main } from "../cli/main.js";
import type { Io } from "../cli/io.js";

export interface CliRun {
  /** The exit status the command would have given. */
  status: number;
  /** Standard output, as the terminal would have shown it. */
  stdout: string;
  stderr: string;
}

/** Run `armwind <args>` with `dir` as the working folder; `stdin` is what "-" reads. Never a shell. */
export async function runCli(dir: string, args: string[], stdin = ""): Promise<CliRun> {
  const out: string[] = [];
  const err: string[] = [];
  const io: Io = {
    out: (s) => out.push(s.endsWith("\n") ? s : s + "\n"),
    err: (s) => err.push(s.endsWith("\n") ? s : s + "\n"),
    stdin: () => stdin,
    env: process.env,
    cwd: dir,
  };
  let status: number;
  try {
    status = await main(args, io);
  } catch (e) {
    err.push(`armwind: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
    status = 70;
  }
  return { status, stdout: out.join(""), stderr: err.join("") };
}

/**
 * HTTP status for an exit status (docs/contracts.md, the workbench's HTTP contract): 0, 2 and 4 → 200
 * with the same JSON; 1 → 422; 3 and 70 → 500.
 */
export function httpStatus(exit: number): number {
  if (exit === 0 || exit === 2 || exit === 4) return 200;
  if (exit === 1) return 422;
  return 500;
}
