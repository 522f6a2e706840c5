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
import { basename, dirname, isAbsolute, join, relative, resolve, sep } from "node:path";
import { fileURLToPath } from "node:url";
import { randomBytes } from "node:crypto";
import { stringify } from "yaml";
import { ArmwindError } from "../errors.js";
import { jobSchema } from "../job/schema.js";
import { guarded, type Io, type Where } from "./io.js";
import { today } from "./card.js";
import { COMMAND_TEXT } from "./commands.js";

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
    return new ArmwindError(
      {
        code: "file_exists",
        path: "",
        file: shown,
        message: `already exists; armwind new never overwrites a file: choose another name with -o FILE or --id ID`,
      },
      3,
    );
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

/** The `$schema` reference for a file written into `dir`: the relative path to templates/<name>, so an editor finds it. */
export function schemaRef(dir: string, name: string): string {
  const rel = relative(dir, join(templatesDir(), name)).split(sep).join("/");
  return rel.startsWith(".") ? rel : `./${rel}`;
}

/** The first line of a template, pointing its `$schema` at the real file. */
function withSchemaRef(text: string, dir: string, name: string): string {
  return text.replace(/^# yaml-language-server: \$schema=\S+/, `# yaml-language-server: $schema=${schemaRef(dir, name)}`);
}

/** Where to write: -o FILE, -o DIR (then DIR/<name>), or <name> in the working folder. */
function target(io: Io, output: string | undefined, name: string): { file: string; shown: string } {
  let file = resolve(io.cwd, output ?? name);
  if (output !== undefined && (/[\\/]$/.test(output) || isDir(file))) file = join(file, name);
  return { file, shown: shownPath(io.cwd, file) };
}

/** Write the new job file; returns the exit status (problems are thrown as ArmwindError). */
export function runNew(io: Io, opts: NewOptions): number {
  const id = opts.id ?? `rewind-${today(io)}`;
  checkId(id);
  const { file, shown } = target(io, opts.output, `${id}.yaml`);
  writeNew(file, withSchemaRef(templateText(opts.style, id), dirname(file), "job.schema.json"), shown);
  if (opts.json) io.out(JSON.stringify({ ok: true, errors: [], file, id, style: opts.style }, null, 2));
  else {
    io.out(`job file written: ${shown} (${opts.style} winding, id ${id})`);
    io.out(`  every value in it is an example: replace them with your measurements, then run armwind check ${shown}`);
  }
  return 0;
}

/** Write a commented shop profile (armwind.yaml here by default). */
export function runNewShop(io: Io, opts: { output?: string; json?: boolean }): number {
  const { file, shown } = target(io, opts.output, "armwind.yaml");
  const text = readFileSync(join(templatesDir(), "shop.yaml"), "utf8");
  writeNew(file, withSchemaRef(text, dirname(file), "shop.schema.json"), shown);
  if (opts.json) io.out(JSON.stringify({ ok: true, errors: [], file }, null, 2));
  else {
    io.out(`shop profile written: ${shown}`);
    io.out(`  every value in it is an example: set your shop, bench, shelf and logbook; commands run in this folder or below it use it`);
  }
  return 0;
}

/** Write a commented measured-readings file for the job JOB (<id>-measured-<date>.yaml here by default). */
export async function runNewMeasured(
  io: Io,
  job: string,
  opts: { output?: string; json?: boolean; logbook?: string; learn?: boolean },
  where: Where,
): Promise<number> {
  const { planFromFile } = await import("./plan.js");
  const { measuredTemplate } = await import("./new-measured.js");
  const { resolveMeter } = await import("./meter.js");
  const plan = planFromFile(io, job, where, { logbook: opts.logbook, learn: opts.learn });
  const date = today(io);
  const { file, shown } = target(io, opts.output, `${plan.job.id}-measured-${date}.yaml`);
  // the bench's meter as every command takes it ($ARMWIND_METER_RESOLUTION, else the shop profile's); left blank when neither says
  const meter = resolveMeter(io, undefined);
  writeNew(file, measuredTemplate(plan, date, schemaRef(dirname(file), "measured.schema.json"), meter.source === "default" ? undefined : meter.ohm), shown);
  if (opts.json) io.out(JSON.stringify({ ok: true, errors: [], file, job: plan.job.id }, null, 2));
  else {
    io.out(`measured file written: ${shown} (job ${plan.job.id}, ${plan.layout.bars} bar-to-bar readings to fill in)`);
    io.out(`  fill in every ~, then run armwind log ${where.file ?? job} --measured ${shown}`);
  }
  return 0;
}

const KINDS = ["job", "measured", "shop"] as const;

export function newCommand(yargs: Argv, io: Io, setStatus: (n: number) => void) {
  return yargs.command(
    COMMAND_TEXT.new.command,
    COMMAND_TEXT.new.describe,
    (y) =>
      y
        .positional("kind", { choices: KINDS, describe: "what to write: job (default), measured or shop" })
        .positional("job", { type: "string", describe: "new measured: the job file the readings are for" })
        .option("style", { choices: STYLES, describe: "new job: winding style of the armature: tooth, lap or wave" })
        .option("id", { type: "string", describe: "new job: job id (letters, digits, . _ -); default rewind-<today's date>" })
        .option("output", { alias: "o", type: "string", describe: "file to create (a folder: the file goes in it); never overwritten" })
        .option("logbook", { type: "string", describe: "new measured: logbook folder the plan learns from" })
        .option("learn", { type: "boolean", default: true, describe: "new measured: use finished rewinds of the same family" })
        .option("json", { type: "boolean", default: false, describe: "print { ok, file, … } as JSON" }),
    async (argv) => {
      const kind = argv.kind ?? "job";
      const usage =
        kind === "job" && argv.style === undefined
          ? "new job needs --style tooth, lap or wave"
          : kind === "measured" && !argv.job
            ? "new measured needs the job file: armwind new measured JOB"
            : kind !== "measured" && argv.job
              ? `unexpected "${argv.job}": only new measured takes a job file`
              : "";
      if (usage) {
        io.err(`armwind: ${usage} (armwind new --help)`);
        return setStatus(1);
      }
      if (kind === "shop") setStatus(await guarded(io, argv.json, () => runNewShop(io, { output: argv.output, json: argv.json })));
      else if (kind === "measured")
        setStatus(
          await guarded(io, argv.json, (where) =>
            runNewMeasured(io, argv.job as string, { output: argv.output, json: argv.json, logbook: argv.logbook, learn: argv.learn }, where),
          ),
        );
      else setStatus(await guarded(io, argv.json, () => runNew(io, { style: argv.style as Style, id: argv.id, output: argv.output, json: argv.json })));
    },
  );
}
