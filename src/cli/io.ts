/**
 * The shell's edges: reading job files (or standard input as "-"), printing problems, exit
 * statuses, and the `--json` error shape of docs/contracts.md.
 *
 * Reading: every file armwind opens by name goes through `readUserFile` (a regular file only, never
 * waited on, read with a size limit); standard input through `readStdin` (a pipe is fine, the same
 * limit). Writing to the terminal: `writeStream`, the one output routine (a reader that closes
 * early ends the command quietly, a full disk is exit status 3 with one line).
 */
import { resolve } from "node:path";
import { ArmwindError, formatProblem, type Problem } from "../errors.js";
import { readUserFile } from "../files.js";
import { OutputError } from "./output.js";

export { readUserFile } from "../files.js";
export { OutputError } from "./output.js";
import { loadYaml, oneLine } from "../job/load.js";
import { jobSchema, type Job } from "../job/schema.js";
import { z } from "zod";
import { isLayoutOnly } from "../winding/layout-job.js";
import { loadShop } from "./shop.js";
import { mergeShopIntoJob } from "../shop/merge.js";

export { type Io, processIo } from "./process-io.js";
import type { Io } from "./process-io.js";

/**
 * Read a job, measured or profile file's text, or standard input for "-": a regular file only (a
 * FIFO, device or folder is refused, never waited on), at most `TEXT_FILE_LIMIT` bytes; every
 * problem is one located line (`file_unreadable`, `not_a_file`, `file_too_large`).
 */
export function readText(io: Io, file: string, path = ""): string {
  // yargs hands a lone "-" over as an empty string
  if (file === "-" || file === "") return io.stdin();
  // relative to the command's working folder (the workbench serves a folder as if run there)
  return readUserFile(resolve(io.cwd, file), { path, name: file });
}

export const isStdin = (file: string): boolean => file === "-" || file === "";

export function loadFile<S extends z.ZodType>(io: Io, file: string, schema: S) {
  const text = readText(io, file);
  return loadYaml(text, isStdin(file) ? "<stdin>" : file, schema);
}

export function loadJob(io: Io, file: string): { job: Job; file: string; locate: (path: (string | number)[]) => { line: number; column: number } } {
  // the shop profile's defaults fill in where the job is silent (src/shop/merge.ts)
  const shop = loadShop(io);
  return loadJobText(readText(io, file), isStdin(file) ? "<stdin>" : file, shop ? (raw) => mergeShopIntoJob(raw, shop.raw) : undefined);
}

/** A job from its text (`name` locates the problems): refused in one line when it holds only the layout. */
export function loadJobText(
  text: string,
  name: string,
  prepare?: (raw: Record<string, unknown>) => Record<string, unknown>,
): { job: Job; file: string; locate: (path: (string | number)[]) => { line: number; column: number } } {
  // a layout-only job (version, id, armature, winding) serves `diagnose` alone: one line, not a list of every missing field
  const peek = loadYaml(text, name, z.unknown());
  if (isLayoutOnly(peek.raw)) {
    throw new ArmwindError({
      code: "layout_only_job",
      path: "",
      message:
        "this job holds only the layout (no original, no target): armwind diagnose reads it; plan, card and log need the original winding and a target (armwind new job writes a full one)",
      file: name,
      line: 1,
      column: 1,
    });
  }
  const r = loadYaml(text, name, jobSchema, prepare);
  return { job: r.value, file: name, locate: r.locate };
}

/** Attach file, line and column to problems that carry only a field path (thrown by the core). */
export function locateProblems(
  problems: Problem[],
  file: string | undefined,
  locate?: (path: (string | number)[]) => { line: number; column: number },
): Problem[] {
  return problems.map((p) => {
    // a problem of a command-line option (path "--bars[2]") is not in the file
    if (p.file || !file || p.path.startsWith("--")) return p;
    const parts: (string | number)[] = [];
    for (const m of p.path.matchAll(/([^.[\]]+)|\[(\d+)\]/g)) parts.push(m[2] !== undefined ? Number(m[2]) : m[1]);
    const at = locate ? locate(parts) : { line: 1, column: 1 };
    return { ...p, file, ...at };
  });
}

export interface Outcome {
  status: 0 | 1 | 2 | 3 | 4;
}

/** Print an ArmwindError as one line per problem (stderr), and the `--json` error object (stdout) when asked. */
export function reportError(io: Io, e: ArmwindError, json: boolean): number {
  // one line each, whatever the thrower quoted from the file
  const problems = e.problems.map((p) => ({ ...p, message: oneLine(p.message) }));
  for (const p of problems) io.err(formatProblem(p));
  if (json) {
    io.out(
      JSON.stringify(
        {
          ok: false,
          errors: problems.map((p) => ({
            code: p.code,
            message: p.message,
            file: p.file ?? null,
            line: p.line ?? null,
            column: p.column ?? null,
            path: p.path,
          })),
        },
        null,
        2,
      ),
    );
  }
  return e.status;
}

/** Where a command's job file is, once it is known, so that problems the core throws later are located in it. */
export interface Where {
  file?: string;
  locate?: (p: (string | number)[]) => { line: number; column: number };
}

/** Run a command body, turning every error into a line and an exit status; never a stack trace.
 * The body fills in `where` as soon as it has loaded its job file. */
export async function guarded(io: Io, json: boolean, body: (where: Where) => Promise<number> | number): Promise<number> {
  const where: Where = {};
  try {
    return await body(where);
  } catch (e) {
    // the terminal itself failed: main ends the command (quietly for a closed pipe, exit 3 for a full disk)
    if (e instanceof OutputError) throw e;
    if (e instanceof ArmwindError) {
      const located = new ArmwindError(locateProblems(e.problems, where.file, where.locate), e.status);
      return reportError(io, located, json);
    }
    const msg = oneLine(e instanceof Error ? e.message : String(e));
    io.err(`armwind: internal error: ${msg} (this is a fault in armwind, not in your file; please report it with the job file)`);
    if (json)
      io.out(JSON.stringify({ ok: false, errors: [{ code: "internal_error", message: msg, file: null, line: null, column: null, path: "" }] }, null, 2));
    return 70;
  }
}

/** Whether to colour terminal output: never when NO_COLOR is set (no-color.org) or output is not a terminal. */
export function useColour(io: Io): boolean {
  return !io.env.NO_COLOR && Boolean(process.stdout.isTTY);
}
