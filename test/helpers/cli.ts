/**
 * Run the CLI: `runCli` starts the built command as a user would (a new Node process; use it where
 * the process boundary is what is tested: exit codes set by the process, signals, real stdin,
 * start-up); `runMain` runs the same `main(args, io)` in this process with captured output, for
 * everything else (far cheaper on a busy machine). Also loads demo jobs for in-process tests.
 */
import { spawnSync } from "node:child_process";
import { readdirSync, readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { loadYaml } from "../../src/job/load.js";
import { jobSchema, type Job } from "../../src/job/schema.js";
import type { Io } from "../../src/cli/io.js";

export const ROOT = resolve(import.meta.dirname, "../..");
/** The installed command: bin/armwind.mjs runs the bundle dist/armwind.cjs (built by `npm install`, and by the slow project's global setup). */
export const CLI = join(ROOT, "bin/armwind.mjs");

export interface CliResult {
  status: number;
  stdout: string;
  stderr: string;
}

export function runCli(args: string[], opts: { cwd?: string; input?: string; env?: Record<string, string> } = {}): CliResult {
  const r = spawnSync(process.execPath, [CLI, ...args], {
    cwd: opts.cwd ?? ROOT,
    input: opts.input,
    encoding: "utf8",
    env: { ...process.env, NO_COLOR: "1", ARMWIND_LOGBOOK: join(ROOT, "jobs/logbook"), ...opts.env },
  });
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

/** `main(args, io)` in this process, with the environment and output a `runCli` process would have. */
export async function runMain(args: string[], opts: { cwd?: string; input?: string; env?: Record<string, string> } = {}): Promise<CliResult> {
  const { main } = await import("../../src/cli/main.js");
  let stdout = "";
  let stderr = "";
  const line = (s: string) => (s.endsWith("\n") ? s : s + "\n");
  const io: Io = {
    out: (s) => {
      stdout += line(s);
    },
    err: (s) => {
      stderr += line(s);
    },
    stdin: () => opts.input ?? "",
    env: { ...process.env, NO_COLOR: "1", ARMWIND_LOGBOOK: join(ROOT, "jobs/logbook"), ...opts.env },
    cwd: opts.cwd ?? ROOT,
  };
  let status: number;
  try {
    status = await main(args, io);
  } catch (e) {
    // what the process would print for a fault that escapes main (see src/cli/main.ts)
    stderr += `armwind: internal error: ${e instanceof Error ? e.message : String(e)}\n`;
    status = 70;
  }
  return { status, stdout, stderr };
}

export function demoJobFiles(): string[] {
  return readdirSync(join(ROOT, "jobs"))
    .filter((f) => f.endsWith(".yaml"))
    .map((f) => join(ROOT, "jobs", f));
}

export function loadJobFile(file: string): Job {
  return loadYaml(readFileSync(file, "utf8"), file, jobSchema).value;
}

export function loadJobText(text: string, file = "job.yaml"): Job {
  return loadYaml(text, file, jobSchema).value;
}
