/**
 * Which armature family each logbook record belongs to, kept as a cache in the user's cache folder
 * (never in the logbook, which benches share and merge), so that learning reads only the records
 * of the job's family instead of every record in the folder.
 *
 * Per logbook folder (named by a hash of its path) the cache holds the whole index (file name →
 * family) and, per family asked for, that family's share (its file names), each stamped with a
 * hash of the folder's listing. A plan lists the folder (one readdir) and, when the listing is the
 * one its family's share was made from, reads only those files. When it differs (records added by
 * `armwind log`, by hand, by another bench or by a merge; records removed), the whole index is
 * brought up to date by reading only the names it does not know, and the share is written anew.
 * A record is named once and never rewritten (store.ts); a record edited in place by hand to
 * another family is seen again after `armwind history`, which reads every record changed since it
 * last ran (its own summary, history-index.ts, knows which), rewrites the index and drops the
 * shares. A missing, damaged or unwritable cache only costs the time of reading every record,
 * never a wrong plan: the records read are still checked for their family.
 */
import { mkdirSync, readdirSync, renameSync, rmSync, writeFileSync } from "node:fs";
import { readUserFile } from "../files.js";
import { homedir } from "node:os";
import { basename, dirname, join, resolve } from "node:path";
import { readLogbook, type Logbook } from "./store.js";

const VERSION = 2;

/** The whole index of a folder: every record's family, and the folder's listing it was made from. */
interface IndexFile {
  version: number;
  dir: string;
  /** A hash of the folder's file names when the index was written. */
  listing: string;
  /** File name → family (null: a record of no family). */
  families: Record<string, string | null>;
}

/** One family's share, read on the fast path: valid while the folder's listing is unchanged. */
interface FamilyFile {
  version: number;
  dir: string;
  listing: string;
  family: string;
  names: string[];
}

/**
 * The user's cache folder for armwind: $ARMWIND_CACHE_DIR, else $XDG_CACHE_HOME/armwind (XDG Base
 * Directory Specification), else the platform's usual place (~/Library/Caches on macOS,
 * %LOCALAPPDATA% on Windows, ~/.cache elsewhere).
 */
export function cacheFolder(env: NodeJS.ProcessEnv, platform: NodeJS.Platform = process.platform): string {
  if (env.ARMWIND_CACHE_DIR) return resolve(env.ARMWIND_CACHE_DIR);
  if (env.XDG_CACHE_HOME) return join(env.XDG_CACHE_HOME, "armwind");
  if (platform === "darwin") return join(homedir(), "Library", "Caches", "armwind");
  if (platform === "win32" && env.LOCALAPPDATA) return join(env.LOCALAPPDATA, "armwind", "Cache");
  return join(homedir(), ".cache", "armwind");
}

/** Where the index of logbook folder `dir` is kept inside `cache` (with `family`: that family's share). */
export function indexFile(cache: string, dir: string, family?: string): string {
  return join(cache, `logbook-${shortHash(resolve(dir))}${family === undefined ? "" : `-${shortHash(family)}`}.json`);
}

/**
 * A 64-bit hash of `text` as 16 hex digits: FNV-1a (Fowler, Noll and Vo; its 32-bit prime) run
 * twice over the UTF-16 code units, from the published offset basis and from one of our own. A cache
 * key, not a safeguard against anyone: a folder's listing and the cache files' names. (SHA-256
 * would mean loading node:crypto, about 10 ms of every plan that learns.)
 */
export function shortHash(text: string): string {
  let a = 0x811c9dc5;
  let b = 0x050c5d1f;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    a = Math.imul(a ^ c, 0x01000193);
    b = Math.imul(b ^ c, 0x01000193);
  }
  return (a >>> 0).toString(16).padStart(8, "0") + (b >>> 0).toString(16).padStart(8, "0");
}

/** A hash of the folder's file names, in the order the folder lists them. */
const listingOf = (names: string[]) => shortHash(names.join("\n"));

/** A cache file's JSON, or undefined when it is missing or damaged. */
export function readJson<T>(file: string): T | undefined {
  try {
    // a regular file only, never waited on (a FIFO planted in the cache folder), at most 64 MiB
    return JSON.parse(readUserFile(file, { limit: 64 * 1024 * 1024 })) as T;
  } catch {
    return undefined; // no index yet, or a damaged one: the slow path reads and rewrites it
  }
}

/** Write a cache file whole (temporary file, then rename); a cache that cannot be written is skipped. */
export function writeJson(file: string, body: unknown): void {
  const tmp = `${file}.${process.pid}.tmp`;
  try {
    mkdirSync(dirname(file), { recursive: true });
    writeFileSync(tmp, JSON.stringify(body));
    renameSync(tmp, file);
  } catch {
    /* a read-only or missing cache folder: the next run reads every record again */
  }
}

/**
 * The records of `family` in logbook folder `dir` (as `readLogbook` gives them, sorted by date and
 * file name, with warnings for damaged records), reading only the family's files when the index in
 * `cache` knows the folder's listing, else only the files the index does not place in another
 * family (then the index is brought up to date). Files: reads and writes the index in `cache`.
 */
export function recordsOfFamily(dir: string, family: string, cache: string): Logbook {
  let names: string[];
  try {
    names = readdirSync(dir);
  } catch {
    return readLogbook(dir); // missing or unreadable: readLogbook says which
  }
  const at = resolve(dir);
  const listing = listingOf(names);
  const share = readJson<FamilyFile>(indexFile(cache, dir, family));
  if (share?.version === VERSION && share.dir === at && share.listing === listing && share.family === family && Array.isArray(share.names)) {
    const book = readLogbook(dir, { names: share.names });
    // a record edited by hand to another family is not this family's (history refreshes the index)
    return { ...book, records: book.records.filter((r) => r.record.job.family === family) };
  }
  const whole = readJson<IndexFile>(indexFile(cache, dir));
  const known = new Map(whole?.version === VERSION && whole.dir === at && whole.families ? Object.entries(whole.families) : []);
  const book = readLogbook(dir, {
    names: names.filter((name) => {
      const f = known.get(name);
      return f === undefined || f === family;
    }),
  });
  const present = new Set(names);
  for (const name of known.keys()) if (!present.has(name)) known.delete(name);
  for (const { file: name, record } of book.records) known.set(name, record.job.family);
  const own = book.records.filter((r) => r.record.job.family === family);
  writeJson(indexFile(cache, dir), { version: VERSION, dir: at, listing, families: Object.fromEntries(known) } satisfies IndexFile);
  // damaged files stay out of the share (not known to be of this family), so they are read each time and warned about
  const damaged = book.warnings.map((w) => w.file);
  writeJson(indexFile(cache, dir, family), { version: VERSION, dir: at, listing, family, names: [...own.map((r) => r.file), ...damaged] } satisfies FamilyFile);
  return { ...book, records: own };
}

/** After a whole read of `dir` (history), write the index afresh from what was read: file name → family. */
export function refreshIndex(dir: string, read: Iterable<[string, string | null]>, cache: string): void {
  let names: string[];
  try {
    names = readdirSync(dir);
  } catch {
    return;
  }
  const families = Object.fromEntries(read);
  // the families' shares go: the next plan of each family takes its share from this index
  const prefix = basename(indexFile(cache, dir)).replace(/\.json$/, "-");
  try {
    for (const f of readdirSync(cache)) if (f.startsWith(prefix)) rmSync(join(cache, f), { force: true });
  } catch {
    /* no cache folder yet */
  }
  writeJson(indexFile(cache, dir), { version: VERSION, dir: resolve(dir), listing: listingOf(names), families } satisfies IndexFile);
}
