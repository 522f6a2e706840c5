/**
 * The logbook folder: one YAML file per finished rewind, `<job id>-<date>-<n>.yaml`. This is the
 * logbook's shell (it touches files; the rest of src/logbook is pure).
 *
 * Writing never half-writes and never replaces: the record goes into a hidden temporary file in the
 * same folder, is flushed to disk, and is then given its final name with a hard link, which fails
 * with EEXIST when another writer took that name first (then n + 1 is tried). A rename would
 * silently replace another writer's record. The temporary name is unlinked afterwards; a process
 * killed before the link leaves only a hidden `.…tmp` file, never a partial record.
 */
import { closeSync, constants, copyFileSync, fsyncSync, linkSync, mkdirSync, openSync, readdirSync, readFileSync, unlinkSync, writeSync } from "node:fs";
import { join } from "node:path";
import { randomBytes } from "node:crypto";
import { parse } from "yaml";
import { ArmwindError } from "../errors.js";
import { recordSchema, type ReadRecord } from "./record.js";

/** `<job id>-<date>-<n>.yaml`. */
export function recordFileName(jobId: string, date: string, n: number): string {
  return `${jobId}-${date}-${n}.yaml`;
}

const RECORD_NAME = /^[A-Za-z0-9][A-Za-z0-9._-]*-\d{4}-\d{2}-\d{2}-\d+\.yaml$/;

export interface WriteOptions {
  /** Test hook: sleep this long (ms) with half the temporary file written, so a test can kill the process mid-write. */
  holdMs?: number;
}

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
  return new ArmwindError({ code: "write_failed", message: `cannot write the logbook record ${file}: ${why}; choose another folder with --logbook DIR`, path: "", file }, 3);
}

function sleepSync(ms: number) {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

/**
 * Create a new record file in `dir` (made if missing) holding `text`; returns its path. The first
 * free n from one past the highest already there is taken; never overwrites. Errors: exit status 3.
 */
export function writeRecordFile(dir: string, jobId: string, date: string, text: string, opts: WriteOptions = {}): string {
  try {
    mkdirSync(dir, { recursive: true });
  } catch (e) {
    throw writeFailed(dir, e);
  }
  const tmp = join(dir, `.${jobId}-${date}.${process.pid}.${randomBytes(6).toString("hex")}.tmp`);
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
    throw writeFailed(tmp, e);
  }
  try {
    let n = nextNumber(dir, jobId, date);
    for (let tries = 0; tries < 100000; tries++, n++) {
      const file = join(dir, recordFileName(jobId, date, n));
      try {
        linkSync(tmp, file);
        return file;
      } catch (e) {
        const code = (e as NodeJS.ErrnoException).code;
        if (code === "EEXIST") continue;
        if (code === "EPERM" || code === "ENOTSUP" || code === "EOPNOTSUPP" || code === "ENOSYS") {
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

function nextNumber(dir: string, jobId: string, date: string): number {
  const prefix = `${jobId}-${date}-`;
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
  code: "record_damaged";
  message: string;
  /** The record's file name. */
  file: string;
  path: string;
}

export interface ReadOptions {
  /** Read only these files of the folder (src/logbook/family-index.ts: a family's records), not every file. */
  names?: string[];
}

/** File names in numeric order (…-2- before …-10-): one collator for every comparison (a locale lookup per call is slow). */
export const byFileName = new Intl.Collator("en", { numeric: true }).compare;

export interface Logbook {
  dir: string;
  /** Whether the folder exists at all. */
  exists: boolean;
  records: { file: string; record: ReadRecord }[];
  warnings: LogbookWarning[];
}

/**
 * Read every record in `dir` (sorted by date, then file name). A record that does not parse or lacks
 * what history and learning need is a warning naming its file; the others still list. Hidden files
 * (temporary files of writers in progress, or of killed ones) are not records.
 */
export function readLogbook(dir: string, opts: ReadOptions = {}): Logbook {
  let names: string[];
  try {
    names = opts.names ?? readdirSync(dir);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === "ENOENT" || code === "ENOTDIR") return { dir, exists: false, records: [], warnings: [] };
    throw new ArmwindError({ code: "file_unreadable", message: `the logbook folder ${dir} cannot be read (${code ?? "error"})`, path: "", file: dir });
  }
  const records: { file: string; record: ReadRecord }[] = [];
  const warnings: LogbookWarning[] = [];
  for (const name of names.sort()) {
    if (name.startsWith(".") || !name.endsWith(".yaml")) continue;
    const file = join(dir, name);
    const damaged = (why: string) => warnings.push({ code: "record_damaged", file: name, path: "", message: `${name}: damaged record, left out (${why})` });
    if (!RECORD_NAME.test(name)) {
      damaged("the name is not <job id>-<date>-<n>.yaml");
      continue;
    }
    let raw: unknown;
    try {
      raw = parseRecordText(readFileSync(file, "utf8"));
    } catch (e) {
      damaged(e instanceof Error ? `not valid YAML: ${e.message.split("\n")[0]}` : "cannot be read");
      continue;
    }
    const r = recordSchema.safeParse(raw);
    if (!r.success) {
      const i = r.error.issues[0];
      damaged(raw === null || typeof raw !== "object" ? "empty or not a mapping" : `${i.path.join(".") || "the record"}: ${i.message}`);
      continue;
    }
    records.push({ file: name, record: r.data as ReadRecord });
  }
  records.sort((a, b) => (a.record.date < b.record.date ? -1 : a.record.date > b.record.date ? 1 : byFileName(a.file, b.file)));
  return { dir, exists: true, records, warnings };
}
