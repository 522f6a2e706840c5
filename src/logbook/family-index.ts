/**
 * Which armature family each logbook record belongs to, kept as a cache in the user's cache folder
 * (never in the logbook, which benches share and merge), so that learning reads only the records
 * of the job's family instead of every record in the folder.
 *
 * The index maps a record's file name to its family, one index per logbook folder (named by a hash
 * of the folder's path). It is brought up to date on every read: names not in it (records added by
 * `armwind log`, by hand, by another bench or by a merge) are read and added; names gone from the
 * folder are dropped. A record is named once and never rewritten (store.ts), so a known name keeps
 * its family; a record edited in place by hand to another family is seen again once `armwind
 * history` (which reads every record) has refreshed the index. A missing, damaged or unwritable
 * cache only costs the time of reading every record, never a wrong plan: the records read are
 * still checked for their family by the learning itself.
 */
import { createHash } from "node:crypto";
import { mkdirSync, readFileSync, renameSync, writeFileSync } from "node:fs";
import { homedir } from "node:os";
import { join, resolve } from "node:path";
import { readLogbook, type Logbook } from "./store.js";

const VERSION = 1;

interface IndexFile {
  version: number;
  dir: string;
  /** File name → family (null: a record of no family). */
  families: Record<string, string | null>;
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

/** Where the index of logbook folder `dir` is kept inside `cache`. */
export function indexFile(cache: string, dir: string): string {
  return join(cache, `logbook-${createHash("sha256").update(resolve(dir)).digest("hex").slice(0, 16)}.json`);
}

function loadIndex(file: string, dir: string): Map<string, string | null> {
  try {
    const j = JSON.parse(readFileSync(file, "utf8")) as IndexFile;
    if (j.version === VERSION && j.dir === resolve(dir) && j.families && typeof j.families === "object") return new Map(Object.entries(j.families));
  } catch {
    /* no index yet, or a damaged one: read every record once */
  }
  return new Map();
}

function saveIndex(file: string, dir: string, families: Map<string, string | null>): void {
  const body: IndexFile = { version: VERSION, dir: resolve(dir), families: Object.fromEntries(families) };
  const tmp = `${file}.${process.pid}.tmp`;
  try {
    mkdirSync(join(file, ".."), { recursive: true });
    writeFileSync(tmp, JSON.stringify(body));
    renameSync(tmp, file);
  } catch {
    /* a read-only or missing cache folder: the next run reads every record again */
  }
}

/**
 * The records of `family` in logbook folder `dir` (as `readLogbook` gives them, sorted by date and
 * file name, with warnings for damaged records), reading only the files that the index in `cache`
 * does not place in another family. Files: the index in `cache` is read and rewritten when the
 * folder's names changed.
 */
export function recordsOfFamily(dir: string, family: string, cache: string): Logbook {
  const file = indexFile(cache, dir);
  const known = loadIndex(file, dir);
  const present = new Set<string>();
  const book = readLogbook(dir, {
    keep: (name) => {
      present.add(name);
      const f = known.get(name);
      return f === undefined || f === family;
    },
  });
  let changed = false;
  for (const { file: name, record } of book.records) {
    if (known.get(name) !== record.job.family) {
      known.set(name, record.job.family);
      changed = true;
    }
  }
  for (const name of known.keys()) {
    if (!present.has(name)) {
      known.delete(name);
      changed = true;
    }
  }
  if (changed && book.exists) saveIndex(file, dir, known);
  return { ...book, records: book.records.filter((r) => r.record.job.family === family) };
}

/** After a whole read of `dir` (history), write the index afresh from what was read. */
export function refreshIndex(book: Logbook, cache: string): void {
  if (!book.exists) return;
  saveIndex(indexFile(cache, book.dir), book.dir, new Map(book.records.map((r) => [r.file, r.record.job.family])));
}
