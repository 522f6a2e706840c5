/**
 * Which armature family each logbook record belongs to, kept as a cache in the user's cache folder
 * (never in the logbook, which benches share and merge), so that learning reads only the records
 * of the job's family instead of every record in the folder.
 *
 * Per logbook folder (named by a hash of its path) the cache holds the whole index (file name →
 * family) and, per family asked for, that family's share: its file names, stamped with a hash of
 * the folder's listing, and each of its records as last read and validated, stamped with the
 * file's size, times and inode. A plan reads the share; when the folder's own stamp (inode,
 * modification and change times) is the one the share was made with, the folder has not gained,
 * lost or renamed a file since, and it is not listed at all; otherwise it is listed (one readdir)
 * and the listing's hash compared. Each of the share's files is then `stat`ed: a record whose stamp
 * still holds is taken from the share as validated then (the part learning reads: learn.ts
 * `learningPart`), the others are read and validated in full. When the listing differs (records
 * added by `armwind log`, by hand, by another bench or by a merge; records removed), the whole
 * index is brought up to date by reading only the names it does not know, and the share is
 * written anew. A record edited in place by hand to another family is
 * seen again after `armwind history`, which reads every record changed since it last ran (its own
 * summary, history-index.ts, knows which), rewrites the index and drops the shares.
 *
 * Stamps are trusted only once they are old enough to be safe: a change within the file system's
 * time granularity of the stamp (a second on some) could leave it as it was, so a folder or record
 * whose modification and change times are both within TRUST_AFTER_MS of the moment it was looked
 * at is not stamped, and is listed or read again next time (the rule git applies to files changed
 * in the same second as its index, "racy clean"). A missing, damaged or unwritable cache only costs
 * the time of reading every record, never a wrong plan: records read are still checked for their
 * family, and a share of another armwind version is not used.
 */
import { mkdirSync, readdirSync, renameSync, rmSync, statSync, writeFileSync, type Stats } from "node:fs";
import { readUserFile } from "../files.js";
import { homedir } from "node:os";
import { basename, dirname, join, resolve } from "node:path";
import { VERSION as ARMWIND_VERSION } from "../version.js";
import { learningPart, type LearningRecord } from "./learn.js";
import { byDateThenName, type Logbook, type LogbookWarning, mayBeRecord, peekFamily, readLogbook, readRecordFile } from "./store.js";

const VERSION = 3;

/**
 * How long after its last change a file's or folder's stamp is trusted, ms: longer than the
 * coarsest time granularity of a common file system (FAT's 2 s), so any later change moves it.
 */
export const TRUST_AFTER_MS = 2000;

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
  /** The armwind version that validated the records kept here (another version validates them again). */
  armwind: string;
  dir: string;
  listing: string;
  /** The folder's stamp when it was listed, when settled then (same stamp: same listing, no readdir). */
  folder?: string;
  family: string;
  /** The family's files, and damaged files of unknown family (read each time and warned about). */
  names: string[];
  /** What learning reads of each of the family's records as read and validated, under its file's stamp (settled files only). */
  records: Record<string, { stamp: string; record: LearningRecord }>;
}

/** A family's records as learning reads them (as `readLogbook` gives them, each record cut to what learning reads). */
export type FamilyBook = Omit<Logbook, "records"> & { records: { file: string; record: LearningRecord }[] };

/**
 * A file's or folder's stamp: size, modification and change times (ns where the file system keeps
 * them) and inode; undefined while it is not yet settled (both times within TRUST_AFTER_MS of
 * `now`, ms since the epoch), since a change in the same tick could leave it as it was.
 */
export function settledStamp(st: Stats, now: number): string | undefined {
  if (Math.min(st.mtimeMs, st.ctimeMs) > now - TRUST_AFTER_MS) return undefined;
  return `${st.size}:${st.mtimeMs}:${st.ctimeMs}:${st.ino}`;
}

/** `path`'s stat (followed through links), or undefined when it cannot be taken: then a read says why. */
export function statOf(path: string): Stats | undefined {
  try {
    return statSync(path, { throwIfNoEntry: false });
  } catch {
    return undefined;
  }
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
 * file name, with warnings for damaged records), reading only the family's files when the share
 * in `cache` knows the folder's listing (and of those only the ones changed since they were last
 * validated), else only the files the index does not place in another family (then the index is
 * brought up to date). Files: stats the folder, lists it unless its stamp is the share's, stats the
 * family's files, reads changed ones; reads and writes the index in `cache`.
 */
export function recordsOfFamily(dir: string, family: string, cache: string): FamilyBook {
  const now = Date.now();
  const at = resolve(dir);
  // the folder's stamp before it is listed: a change after this moves it
  const dirStat = statOf(dir);
  const folder = dirStat?.isDirectory() ? settledStamp(dirStat, now) : undefined;
  const share = shareOf(readJson<FamilyFile>(indexFile(cache, dir, family)), at, family);
  if (share && folder !== undefined && share.folder === folder) return readShare(dir, share, cache, now);
  let names: string[];
  try {
    names = readdirSync(dir);
  } catch {
    return readLogbook(dir); // missing or unreadable: readLogbook says which
  }
  const listing = listingOf(names);
  if (share?.listing === listing) return readShare(dir, { ...share, folder }, cache, now, share.folder !== folder);
  return rebuildIndex(dir, family, cache, names, { listing, folder });
}

/** A share as read from the cache, when it is one of this version for this folder and family. */
function shareOf(share: FamilyFile | undefined, at: string, family: string): FamilyFile | undefined {
  const ok =
    share?.version === VERSION &&
    share.armwind === ARMWIND_VERSION &&
    share.dir === at &&
    share.family === family &&
    Array.isArray(share.names) &&
    typeof share.records === "object" &&
    share.records !== null;
  return ok ? share : undefined;
}

/**
 * The share's records: each file whose stamp is the one its record was kept under is taken from the
 * share, the others are read and validated in full (and kept when settled). Rewrites the share when
 * anything kept changed or `dirty`. A record edited by hand to another family is left out.
 */
function readShare(dir: string, share: FamilyFile, cache: string, now: number, dirty = false): FamilyBook {
  const records: FamilyBook["records"] = [];
  const warnings: LogbookWarning[] = [];
  const kept: FamilyFile["records"] = {};
  const prefix = join(dir, "/");
  for (const name of [...share.names].sort()) {
    if (!mayBeRecord(name)) continue;
    const st = statOf(prefix + name);
    const stamp = st?.isFile() ? settledStamp(st, now) : undefined;
    const old = share.records[name];
    if (stamp !== undefined && old?.stamp === stamp && old.record?.job?.family === share.family) {
      kept[name] = old;
      records.push({ file: name, record: old.record });
      continue;
    }
    const r = readRecordFile(dir, name);
    dirty = true;
    if ("warning" in r) warnings.push(r.warning);
    else if (r.record.job.family === share.family) {
      const record = learningPart(r.record);
      records.push({ file: name, record });
      if (stamp !== undefined) kept[name] = { stamp, record };
    }
  }
  dirty ||= Object.keys(share.records).some((name) => !(name in kept));
  if (dirty) writeJson(indexFile(cache, dir, share.family), { ...share, records: kept } satisfies FamilyFile);
  return { dir, exists: true, records: records.sort(byDateThenName), warnings };
}

/**
 * The slow path, when the folder's listing is not the share's: the files the whole index does not
 * know are placed by the family their text names (`peekFamily`, no validation: a record of another
 * family is never learned from here); this family's files, and any whose family cannot be told, are
 * read in full. The index is brought up to date and the family's share written anew (its records
 * are kept by the next read, which stamps each file before reading it).
 */
function rebuildIndex(dir: string, family: string, cache: string, names: string[], seen: { listing: string; folder?: string }): FamilyBook {
  const at = resolve(dir);
  const whole = readJson<IndexFile>(indexFile(cache, dir));
  const known = new Map(whole?.version === VERSION && whole.dir === at && whole.families ? Object.entries(whole.families) : []);
  const book = readLogbook(dir, {
    names: names.filter((name) => {
      let f = known.get(name);
      if (f === undefined && mayBeRecord(name)) {
        f = peekFamily(dir, name);
        if (f !== undefined && f !== family) known.set(name, f);
      }
      return f === undefined || f === family;
    }),
  });
  const present = new Set(names);
  for (const name of known.keys()) if (!present.has(name)) known.delete(name);
  for (const { file: name, record } of book.records) known.set(name, record.job.family);
  const own = book.records.filter((r) => r.record.job.family === family);
  writeJson(indexFile(cache, dir), { version: VERSION, dir: at, listing: seen.listing, families: Object.fromEntries(known) } satisfies IndexFile);
  // damaged files stay out of the index (their family is not known) but in the share, so they are read each time and warned about
  const damaged = book.warnings.map((w) => w.file);
  const share: FamilyFile = {
    version: VERSION,
    armwind: ARMWIND_VERSION,
    dir: at,
    ...seen,
    family,
    names: [...own.map((r) => r.file), ...damaged],
    records: {},
  };
  writeJson(indexFile(cache, dir, family), share);
  return { ...book, records: own.map(({ file, record }) => ({ file, record: learningPart(record) })) };
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
