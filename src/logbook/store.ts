/**
 * The logbook folder: one YAML file per finished rewind, `<job id>-<date>-<bench>-<n>.yaml` (DESIGN.md:
 * the bench name makes folders written on several benches merge with no collision; records named
 * `<job id>-<date>-<n>.yaml` by earlier versions are still read). This is the
 * logbook's shell (it touches files; the rest of src/logbook is pure).
 *
 * Writing never half-writes and never replaces: the record goes into a hidden temporary file in the
 * same folder (named with this host and process id), is flushed to disk, and is then given its
 * final name with a hard link, which fails with EEXIST when another writer took that name first
 * (then n + 1 is tried). A rename would silently replace another writer's record. Where the file
 * system refuses hard links (some network shares), the final name is created exclusively instead
 * and the record copied into it (a reader that meets it unfinished finds it damaged). The
 * temporary name is unlinked afterwards; a process killed before the link leaves only a hidden
 * `.…tmp` file, never a partial record, and the next writer on the same host removes it once its
 * process is gone (never another host's: a logbook may be shared by several benches).
 *
 * Reading trusts nothing in the folder: a record is read only if it is a regular file of at most
 * RECORD_FILE_LIMIT bytes (a FIFO or a link to a device is a damaged record, never waited on),
 * every number is checked against its physical range (src/job/ranges.ts), and a record whose
 * name belongs to another job is set aside with a warning.
 */
import { closeSync, constants, copyFileSync, fsyncSync, linkSync, openSync, readdirSync, unlinkSync, writeSync } from "node:fs";
import { join } from "node:path";
import { parse } from "yaml";
import { ArmwindError } from "../errors.js";
import { PARSE_ONCE } from "../job/load.js";
import { isTempName, makeFolders, readUserFile, RECORD_FILE_LIMIT, removeLeftovers, tempName } from "../files.js";
import { recordIssue, recordSchema, type ReadRecord } from "./record.js";

/** `<job id>-<date>-<bench>-<n>.yaml`. */
export function recordFileName(jobId: string, date: string, bench: string, n: number): string {
  return `${jobId}-${date}-${bench}-${n}.yaml`;
}

/** A bench name as it may stand in a record's name: letters, digits, _ and -, at most 32. */
export const BENCH_NAME = /^[A-Za-z0-9][A-Za-z0-9_-]{0,31}$/;

/** `<job id>-<date>-<n>.yaml`, or with a bench name before n (`<job id>-<date>-<bench>-<n>.yaml`). */
const RECORD_NAME = /^[A-Za-z0-9][A-Za-z0-9._-]*-\d{4}-\d{2}-\d{2}-(?:[A-Za-z0-9._-]+-)?\d+\.yaml$/;

export interface WriteOptions {
  /** Test hook: sleep this long (ms) with half the temporary file written, so a test can kill the process mid-write. */
  holdMs?: number;
  /** Test hook: behave as on a file system that refuses hard links (the exclusive-create fallback). */
  noLink?: boolean;
}

const LINK_REFUSED = new Set(["EPERM", "ENOTSUP", "EOPNOTSUPP", "ENOSYS", "EMLINK", "EXDEV"]);

function writeFailed(file: string, e: unknown): ArmwindError {
  const code = (e as NodeJS.ErrnoException).code;
  const why =
    code === "EACCES" || code === "EPERM"
      ? "permission denied"
      : code === "ENOTDIR"
        ? "a file stands where the logbook folder should be"
        : code === "ENOSPC"
          ? "the disk is full"
          : code === "EROFS"
            ? "the file system is read-only"
            : (code ?? (e instanceof Error ? e.message : String(e)));
  return new ArmwindError(
    { code: "write_failed", message: `cannot write the logbook record: ${why}; choose another folder with --logbook DIR`, path: "", file },
    3,
  );
}

function sleepSync(ms: number) {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

/**
 * Create a new record file in `dir` (made if missing) holding `text`; returns its path. The first
 * free n from one past the highest already there is taken; never overwrites. Errors: exit status 3.
 */
export function writeRecordFile(dir: string, jobId: string, date: string, bench: string, text: string, opts: WriteOptions = {}): string {
  try {
    // one folder at a time: Node 20's recursive mkdir spins for ever under /proc
    makeFolders(dir);
  } catch (e) {
    throw writeFailed(dir, e);
  }
  removeLeftovers(dir);
  const tmp = tempName(dir, `${jobId}-${date}`);
  const data = Buffer.from(text, "utf8");
  try {
    const fd = openSync(tmp, "wx", 0o644);
    try {
      if (opts.holdMs && opts.holdMs > 0) {
        const half = Math.floor(data.length / 2);
        writeSync(fd, data, 0, half);
        fsyncSync(fd);
        sleepSync(opts.holdMs);
        writeSync(fd, data, half, data.length - half);
      } else {
        writeSync(fd, data, 0, data.length);
      }
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
  } catch (e) {
    try {
      unlinkSync(tmp);
    } catch {
      /* nothing to remove */
    }
    // the folder is what the user can do something about, not the hidden temporary name
    throw writeFailed(dir, e);
  }
  try {
    let n = nextNumber(dir, jobId, date, bench);
    for (let tries = 0; tries < 100000; tries++, n++) {
      const file = join(dir, recordFileName(jobId, date, bench, n));
      try {
        if (opts.noLink) throw Object.assign(new Error("hard links refused (test)"), { code: "EPERM" });
        linkSync(tmp, file);
        return file;
      } catch (e) {
        const code = (e as NodeJS.ErrnoException).code;
        if (code === "EEXIST") continue;
        if (code !== undefined && LINK_REFUSED.has(code)) {
          // file systems without hard links: an exclusive copy (still never replaces a record)
          try {
            copyFileSync(tmp, file, constants.COPYFILE_EXCL);
            return file;
          } catch (e2) {
            if ((e2 as NodeJS.ErrnoException).code === "EEXIST") continue;
            throw writeFailed(file, e2);
          }
        }
        throw writeFailed(file, e);
      }
    }
    throw writeFailed(dir, new Error("no free record number"));
  } finally {
    try {
      unlinkSync(tmp);
    } catch {
      /* already gone */
    }
  }
}

function nextNumber(dir: string, jobId: string, date: string, bench: string): number {
  const prefix = `${jobId}-${date}-${bench}-`;
  let max = 0;
  for (const f of readdirSync(dir)) {
    if (!f.startsWith(prefix) || !f.endsWith(".yaml")) continue;
    const n = Number(f.slice(prefix.length, -5));
    if (Number.isInteger(n) && n > max) max = n;
  }
  return max + 1;
}

/**
 * Parse a record's text: records are written as YAML in its JSON form under a comment header, read
 * here by JSON.parse (fast); anything else (a record re-saved as block YAML) by the YAML parser.
 */
export function parseRecordText(text: string): unknown {
  let i = 0;
  while (i < text.length) {
    if (text[i] === "#") {
      const nl = text.indexOf("\n", i);
      i = nl < 0 ? text.length : nl + 1;
    } else if (text[i] === "\n" || text[i] === "\r" || text[i] === " " || text[i] === "\t") i++;
    else break;
  }
  if (text[i] === "{") {
    try {
      return JSON.parse(text.slice(i));
    } catch {
      /* not JSON after all: the YAML parser says what is wrong */
    }
  }
  return parse(text);
}

export interface LogbookWarning {
  code: "record_damaged" | "record_mismatch" | "logbook_unreadable";
  message: string;
  /** The record's file name (the folder for logbook_unreadable). */
  file: string;
  path: string;
}

export interface ReadOptions {
  /** Read only these files of the folder (src/logbook/family-index.ts: a family's records), not every file. */
  names?: string[];
}

/** File names in numeric order (…-2- before …-10-): one collator for every comparison (a locale lookup per call is slow). */
export function byFileName(a: string, b: string): number {
  // made on first use: loading the locale's collation rules is about 10 ms, which a plan without records need not spend
  if (!fileNameCollator) fileNameCollator = new Intl.Collator("en", { numeric: true });
  return fileNameCollator.compare(a, b);
}
let fileNameCollator: Intl.Collator | undefined;

/** The logbook's order of records: by date, then by file name (numeric). */
export function byDateThenName(a: { file: string; record: { date: string } }, b: { file: string; record: { date: string } }): number {
  return a.record.date < b.record.date ? -1 : a.record.date > b.record.date ? 1 : byFileName(a.file, b.file);
}

export interface Logbook {
  dir: string;
  /** Whether the folder exists at all. */
  exists: boolean;
  /** The folder exists but cannot be listed (permission denied…): no records, a `logbook_unreadable` warning. */
  unreadable?: boolean;
  records: { file: string; record: ReadRecord }[];
  warnings: LogbookWarning[];
}

/**
 * Read every record in `dir` (sorted by date, then file name). A record that cannot be read, does
 * not parse, lacks what history and learning need, or holds a number outside its physical range
 * is a `record_damaged` warning naming its file; a record whose name belongs to another job or
 * date a `record_mismatch` warning; neither is listed or learned from, the others still are.
 * Hidden files (temporary files of writers in progress, or of killed ones) are not records. A
 * folder that cannot be listed gives no records and a `logbook_unreadable` warning: a plan then
 * goes on without learning.
 */
export function readLogbook(dir: string, opts: ReadOptions = {}): Logbook {
  let names: string[];
  try {
    names = opts.names ?? readdirSync(dir);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === "ENOENT" || code === "ENOTDIR") return { dir, exists: false, records: [], warnings: [] };
    const why = code === "EACCES" || code === "EPERM" ? "permission denied" : (code ?? "error");
    return {
      dir,
      exists: false,
      unreadable: true,
      records: [],
      warnings: [
        { code: "logbook_unreadable", file: dir, path: "", message: `the logbook folder ${dir} cannot be read (${why}); going on without its records` },
      ],
    };
  }
  const records: { file: string; record: ReadRecord }[] = [];
  const warnings: LogbookWarning[] = [];
  for (const name of names.sort()) {
    if (!mayBeRecord(name)) continue;
    const r = readRecordFile(dir, name);
    if ("warning" in r) warnings.push(r.warning);
    else records.push({ file: name, record: r.record });
  }
  records.sort(byDateThenName);
  return { dir, exists: true, records, warnings };
}

/**
 * A record file's armature family as its text says it (`job.family`: a string, or null for none),
 * without validating the rest: what the family index needs of a record of another family, which
 * learning never reads. Undefined when it cannot tell (a bad name, not a regular file, too large,
 * not YAML or JSON, no such field): the caller then reads the file in full and warns as it must.
 */
export function peekFamily(dir: string, name: string): string | null | undefined {
  if (!RECORD_NAME.test(name)) return undefined;
  try {
    const raw = parseRecordText(readUserFile(join(dir, name), { limit: RECORD_FILE_LIMIT })) as { job?: { family?: unknown } } | null;
    const family = raw?.job?.family;
    return typeof family === "string" || family === null ? family : undefined;
  } catch {
    return undefined;
  }
}

/** Whether a file of the logbook folder is read as a record at all (hidden and temporary files, and anything not .yaml, are not). */
export const mayBeRecord = (name: string): boolean => !(isTempName(name) || name.startsWith(".") || !name.endsWith(".yaml"));

/** One record file of the folder, read and checked; a warning when it is not to be trusted. */
export function readRecordFile(dir: string, name: string): { record: ReadRecord } | { warning: LogbookWarning } {
  const damaged = (why: string) => ({
    warning: { code: "record_damaged" as const, file: name, path: "", message: `${name}: damaged record, left out (${why})` },
  });
  if (!RECORD_NAME.test(name)) return damaged("the name is not <job id>-<date>-<bench>-<n>.yaml");
  let text: string;
  try {
    text = readUserFile(join(dir, name), { limit: RECORD_FILE_LIMIT });
  } catch (e) {
    return damaged(e instanceof ArmwindError ? e.problems[0].message : "cannot be read");
  }
  let raw: unknown;
  try {
    raw = parseRecordText(text);
  } catch (e) {
    return damaged(e instanceof Error ? `not valid YAML: ${e.message.split("\n")[0]}` : "not valid YAML");
  }
  const r = recordSchema.safeParse(raw, PARSE_ONCE);
  if (!r.success) return damaged(raw === null || typeof raw !== "object" ? "empty or not a mapping" : recordIssue(r.error.issues[0]));
  const record = r.data as ReadRecord;
  if (!name.startsWith(`${record.job.id}-${record.date}-`)) {
    return {
      warning: {
        code: "record_mismatch",
        file: name,
        path: "job.id",
        message: `${name}: the record inside is of job "${record.job.id}" of ${record.date}, not what its name says; left out (rename it ${record.job.id}-${record.date}-<bench>-<n>.yaml if it is right)`,
      },
    };
  }
  return { record };
}
