/**
 * `armwind new --style tooth|lap|wave [--id ID] [-o FILE] [--json]`: a job file to fill in, copied
 * from templates/<style>.yaml (every field commented: what to measure, where, with what; at the top
 * the order to record things while stripping) with its id filled in.
 *
 * Never overwrites: the text goes to a temporary file beside the target, which is then hard-linked
 * into place (a link fails when the name exists, so two writers cannot replace each other) and the
 * temporary name removed. An existing file is exit status 3 with one clear line.
 */
import type { Argv } from "yargs";
import { makeFolders } from "./write.js";
import { closeSync, linkSync, openSync, readFileSync, statSync, unlinkSync, writeFileSync, writeSync } from "node:fs";
import { basename, dirname, isAbsolute, join, relative, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { randomBytes } from "node:crypto";
import { stringify } from "yaml";
import { ArmwindError } from "../errors.js";
import { jobSchema } from "../job/schema.js";
import { guarded, type Io } from "./io.js";
import { today } from "./card.js";

export const STYLES = ["tooth", "lap", "wave"] as const;
export type Style = (typeof STYLES)[number];

/** The folder of the job-file templates (templates/ at the package root, beside src/ and dist/). */
export function templatesDir(): string {
  return fileURLToPath(new URL("../../templates/", import.meta.url));
}

/** The template's text for a style, with `id` written in place of its example id. Pure but for reading the template. */
export function templateText(style: Style, id: string): string {
  const text = readFileSync(join(templatesDir(), `${style}.yaml`), "utf8");
  // stringify quotes an id that YAML would read as a number or a boolean ("123", "true")
  const value = stringify(id).trimEnd();
  const filled = text.replace(/^id: \S+.*$/m, `id: ${value}`.padEnd(35) + "# unique: letters, digits, . _ - ; names the card and logbook records");
  if (filled === text) throw new Error(`template ${style}.yaml has no "id:" line`);
  return filled;
}

/** Check an id as the job file would (it names files); a bad one is exit status 1. */
export function checkId(id: string): void {
  const r = jobSchema.shape.id.safeParse(id);
  if (!r.success) {
    throw new ArmwindError({
      code: "bad_id",
      path: "id",
      message: `--id "${id}" ${r.error.issues[0]?.message ?? "is not a valid job id"}, e.g. --id blind-motor-0032`,
    });
  }
}

/** The problem (exit status 3) for a file that could not be written, from the system's error code. */
export function writeFailure(code: string | undefined, shown: string): ArmwindError {
  if (code === "EEXIST") {
    return new ArmwindError({ code: "file_exists", path: "", file: shown, message: `already exists; armwind new never overwrites a file: choose another name with -o FILE or --id ID` }, 3);
  }
  const why =
    code === "EACCES" || code === "EPERM"
      ? "permission denied"
      : code === "ENOTDIR" || code === "MKDIR_EEXIST"
        ? "a file stands where a folder is needed"
        : code === "ENOENT"
          ? "no file can be created in that folder"
          : code === "EROFS"
            ? "the file system is read-only"
            : code === "ENOSPC"
              ? "the disk is full"
              : (code ?? "error");
  return new ArmwindError({ code: "write_failed", path: "", file: shown, message: `cannot be written: ${why}; choose another place with -o FILE` }, 3);
}

/** A path as the user should see it: relative to the working folder when it lies inside it. */
export function shownPath(cwd: string, file: string): string {
  const rel = relative(cwd, file);
  return rel && !rel.startsWith("..") && !isAbsolute(rel) ? rel : file;
}

/** Create `file` with `data` without ever replacing an existing file or leaving it half-written. */
export function writeNew(file: string, data: string, shown = file): void {
  const fail = (code: string | undefined): never => {
    throw writeFailure(code, shown);
  };
  const dir = dirname(file);
  try {
    makeFolders(dir);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    fail(code === "EEXIST" ? "MKDIR_EEXIST" : code);
  }
  const tmp = join(dir, `.armwind-tmp-${basename(file)}-${process.pid}-${randomBytes(4).toString("hex")}`);
  try {
    writeFileSync(tmp, data, { flag: "wx" });
  } catch (e) {
    fail((e as NodeJS.ErrnoException).code);
  }
  try {
    linkSync(tmp, file);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === "EEXIST") {
      unlinkQuietly(tmp);
      fail(code);
    }
    // a file system without hard links: fall back to an exclusive create (still never replaces)
    unlinkQuietly(tmp);
    let fd: number | undefined;
    try {
      fd = openSync(file, "wx");
      writeSync(fd, data);
    } catch (e2) {
      if (fd !== undefined) unlinkQuietly(file);
      fail((e2 as NodeJS.ErrnoException).code);
    } finally {
      if (fd !== undefined) closeSync(fd);
    }
    return;
  }
  unlinkQuietly(tmp);
}

function unlinkQuietly(f: string): void {
  try {
    unlinkSync(f);
  } catch {
    // already gone
  }
}

function isDir(p: string): boolean {
  try {
    return statSync(p).isDirectory();
  } catch {
    return false;
  }
}

export interface NewOptions {
  style: Style;
  id?: string;
  output?: string;
  json?: boolean;
}

/** Write the new job file; returns the exit status (problems are thrown as ArmwindError). */
export function runNew(io: Io, opts: NewOptions): number {
  const id = opts.id ?? `rewind-${today(io)}`;
  checkId(id);
  let file = resolve(io.cwd, opts.output ?? `${id}.yaml`);
  // -o into a folder: the file is named after the id
  if (opts.output !== undefined && (/[\\/]$/.test(opts.output) || isDir(file))) file = join(file, `${id}.yaml`);
  const shown = shownPath(io.cwd, file);
  writeNew(file, templateText(opts.style, id), shown);
  if (opts.json) io.out(JSON.stringify({ ok: true, file, id, style: opts.style }, null, 2));
  else {
    io.out(`job file written: ${shown} (${opts.style} winding, id ${id})`);
    io.out(`  every value in it is an example: replace them with your measurements, then run armwind check ${shown}`);
  }
  return 0;
}

export function newCommand(yargs: Argv, io: Io, setStatus: (n: number) => void) {
  return yargs.command(
    "new",
    "Start a job file from a template, every field commented (what to measure, where, with what)",
    (y) =>
      y
        .option("style", { choices: STYLES, demandOption: true, describe: "winding style of the armature: tooth, lap or wave" })
        .option("id", { type: "string", describe: "job id (letters, digits, . _ -); default rewind-<today's date>" })
        .option("output", { alias: "o", type: "string", describe: "file to create (default <id>.yaml here; a folder: <folder>/<id>.yaml); never overwritten" })
        .option("json", { type: "boolean", default: false, describe: "print { ok, file, id, style } as JSON" }),
    async (argv) => {
      // yargs has already said what is wrong with the command line (status 1) when style is missing
      if (!STYLES.includes(argv.style as Style)) return;
      setStatus(await guarded(io, argv.json, () => runNew(io, { style: argv.style as Style, id: argv.id, output: argv.output, json: argv.json })));
    },
  );
}
