/**
 * Files the user owns, read and written without trusting what their names say. Shared by the CLI
 * (job, measured and profile files, cards) and the logbook store (records); the core never
 * imports this.
 *
 *  - `readUserFile` opens a file only if it is a regular file (a FIFO, a device, a folder or a
 *    socket is refused with one line and never waited on: the open is non-blocking and the check
 *    is made on the open descriptor, so a file swapped after a check cannot slip through) and reads
 *    at most a stated number of bytes.
 *  - `readStdin` reads standard input ("-"), which may be a pipe, with the same limit.
 *  - Temporary files carry the host name and the process id (`tempName`), so a writer can remove
 *    the leftovers of its own host's processes that are gone (`removeLeftovers`) and never touches
 *    another bench's files in a shared folder (docs/contracts.md, "The measured file and the logbook record").
 */
import { closeSync, constants, existsSync, fstatSync, mkdirSync, openSync, readdirSync, readSync, statSync, unlinkSync, type Stats } from "node:fs";
import { hostname } from "node:os";
import { dirname, join, resolve } from "node:path";
import { createRequire } from "node:module";
import { ArmwindError } from "./errors.js";

/** node:crypto, loaded when a file is first written (loading it is about 10 ms, which reading commands need not spend). */
const crypto = () => createRequire(import.meta.url)("node:crypto") as typeof import("node:crypto");

/** Job, measured and shop-profile files, and standard input: 1 MiB (the largest real job, a 400-bar armature with a long wire shelf, is under 20 KiB). */
export const TEXT_FILE_LIMIT = 1024 * 1024;
/** A logbook record: 4 MiB (a record of a 400-bar armature is about 200 KiB). */
export const RECORD_FILE_LIMIT = 4 * 1024 * 1024;

const MIB = (n: number) => `${Math.round((n / 1024 / 1024) * 10) / 10} MiB`;

/** What a file that is not a regular file is, for "… is a FIFO (named pipe), not a file". */
function kindOf(st: Stats): string {
  if (st.isDirectory()) return "a folder";
  if (st.isFIFO()) return "a FIFO (named pipe)";
  if (st.isCharacterDevice()) return "a character device";
  if (st.isBlockDevice()) return "a block device";
  if (st.isSocket()) return "a socket";
  return "not a regular file";
}

function whyUnreadable(code: string | undefined): string {
  switch (code) {
    case "ENOENT":
      return "no such file";
    case "EISDIR":
      return "is a folder, not a file";
    case "EACCES":
    case "EPERM":
      return "cannot be read (permission denied)";
    case "ENOTDIR":
      return "no such file (a part of the path is not a folder)";
    case "ELOOP":
      return "cannot be read (too many symbolic links)";
    case "ENAMETOOLONG":
      return "cannot be read (the name is too long)";
    default:
      return `cannot be read (${code ?? "error"})`;
  }
}

export interface ReadOptions {
  /** Most bytes read (default TEXT_FILE_LIMIT). */
  limit?: number;
  /** Field path for the problem ("" for the file itself). */
  path?: string;
  /** The file's name as the user gave it, for messages (default: `file`). */
  name?: string;
}

/** Problems of reading a file: `file_unreadable`, `not_a_file`, `file_too_large` (exit status 1). */
export function readProblem(file: string, code: "file_unreadable" | "not_a_file" | "file_too_large", message: string, path = ""): ArmwindError {
  return new ArmwindError({ code, message, path, file });
}

const tooLarge = (file: string, limit: number, path: string) =>
  readProblem(
    file,
    "file_too_large",
    `larger than ${MIB(limit)}, the most armwind reads from one file (the largest real armature needs a few KiB); is it the right file?`,
    path,
  );

/**
 * Read a regular file's text (UTF-8), at most `limit` bytes. Throws ArmwindError (status 1) for a
 * missing or unreadable file, anything that is not a regular file, or a file over the limit.
 */
export function readUserFile(file: string, opts: ReadOptions = {}): string {
  const limit = opts.limit ?? TEXT_FILE_LIMIT;
  const path = opts.path ?? "";
  const at = file;
  file = opts.name ?? file;
  let fd: number;
  try {
    // O_NONBLOCK: opening a FIFO never waits for a writer; O_NOCTTY: a terminal never becomes ours
    fd = openSync(at, constants.O_RDONLY | constants.O_NONBLOCK | constants.O_NOCTTY);
  } catch (e) {
    throw readProblem(file, "file_unreadable", whyUnreadable((e as NodeJS.ErrnoException).code), path);
  }
  try {
    const st = fstatSync(fd);
    if (!st.isFile()) throw readProblem(file, "not_a_file", `is ${kindOf(st)}, not a regular file; give a file`, path);
    if (st.size > limit) throw tooLarge(file, limit, path);
    return readFd(
      fd,
      limit,
      () => tooLarge(file, limit, path),
      (code) => readProblem(file, "file_unreadable", whyUnreadable(code), path),
      st.size,
    );
  } finally {
    closeSync(fd);
  }
}

/** Read standard input whole (a pipe, a file or a terminal), at most `limit` bytes. */
export function readStdin(limit = TEXT_FILE_LIMIT): string {
  return readFd(
    0,
    limit,
    () => readProblem("<stdin>", "file_too_large", `standard input is larger than ${MIB(limit)}, the most armwind reads as one file`),
    (code) => readProblem("<stdin>", "file_unreadable", `standard input cannot be read (${code ?? "error"})`),
  );
}

function sleepSync(ms: number): void {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

/** Read until end of file, refusing more than `limit` bytes; a non-blocking pipe is waited on politely. */
function readFd(fd: number, limit: number, over: () => Error, failed: (code?: string) => Error, sizeHint = 0): string {
  // read straight into one buffer sized by the hint (a regular file's size: one read), grown by doubling up to limit + 1
  let buf = Buffer.allocUnsafe(Math.min(Math.max(sizeHint + 1, 64 * 1024), limit + 1));
  let total = 0;
  for (;;) {
    if (total === buf.length) {
      const bigger = Buffer.allocUnsafe(Math.min(buf.length * 2, limit + 1));
      buf.copy(bigger, 0, 0, total);
      buf = bigger;
    }
    let n: number;
    try {
      n = readSync(fd, buf, total, buf.length - total, null);
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      if (code === "EAGAIN") {
        sleepSync(5);
        continue;
      }
      if (code === "EOF") break; // Windows: a closed pipe
      throw failed(code);
    }
    if (n === 0) break;
    total += n;
    if (total > limit) throw over();
  }
  return buf.toString("utf8", 0, total);
}

// ---------------------------------------------------------------------------------------------
// temporary files: `.<base>.<host>.<pid>.<random>.tmp`, beside the file they become

/** The host name as it goes into temporary names (letters, digits, '-' only). */
export function tempHost(): string {
  return (
    hostname()
      .replace(/[^A-Za-z0-9-]/g, "-")
      .slice(0, 63) || "host"
  );
}

/** A temporary name for `base` in `dir`: hidden, with this host and process, never a record's or card's name. */
export function tempName(dir: string, base: string): string {
  return join(dir, `.${base}.${tempHost()}.${process.pid}.${crypto().randomBytes(6).toString("hex")}.tmp`);
}

const TEMP = /^\.(.+)\.([A-Za-z0-9-]+)\.(\d+)\.[0-9a-f]{12}\.tmp$/;

/** Whether a name is one of armwind's temporary files (readers ignore these). */
export const isTempName = (name: string): boolean => name.startsWith(".") && name.endsWith(".tmp");

function processGone(pid: number): boolean {
  if (pid === process.pid) return false;
  try {
    process.kill(pid, 0);
    return false;
  } catch (e) {
    // ESRCH: no such process; EPERM: it exists (another user's)
    return (e as NodeJS.ErrnoException).code === "ESRCH";
  }
}

/**
 * Remove the temporary files in `dir` that this host's processes left when they were killed: only
 * names of armwind's own pattern, only this host's, only of processes that no longer run. A folder
 * shared by several benches keeps the other benches' files. Quiet: cleaning is best effort.
 */
export function removeLeftovers(dir: string): number {
  let names: string[];
  try {
    names = readdirSync(dir);
  } catch {
    return 0;
  }
  const host = tempHost();
  let removed = 0;
  for (const name of names) {
    const m = TEMP.exec(name);
    if (!m || m[2] !== host || !processGone(Number(m[3]))) continue;
    try {
      unlinkSync(join(dir, name));
      removed++;
    } catch {
      /* gone already, or not ours to remove */
    }
  }
  return removed;
}

/**
 * Create a folder and its missing parents, one at a time. (Node 20's `mkdirSync(…, { recursive:
 * true })` spins for ever on a folder that cannot be made under /proc, where mkdir says ENOENT
 * although the parent exists; made one by one, the first refusal is an error.)
 */
export function makeFolders(dir: string): void {
  const missing: string[] = [];
  let d = resolve(dir);
  while (!existsSync(d)) {
    missing.unshift(d);
    const up = dirname(d);
    if (up === d) break;
    d = up;
  }
  for (const m of missing) {
    try {
      mkdirSync(m);
    } catch (e) {
      // made meanwhile by someone else: fine if it is a folder
      if ((e as NodeJS.ErrnoException).code !== "EEXIST" || !statSync(m).isDirectory()) throw e;
    }
  }
}
