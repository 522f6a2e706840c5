/**
 * The history summary: the row `armwind history` prints for each record of a logbook folder (or
 * the warning it gives for a damaged one), kept as a cache in the user's cache folder beside the
 * family index (never in the logbook, which benches share and merge), so that history reads again
 * only the records that changed since it last ran, instead of reading and validating every record.
 *
 * Trust, but verify: each entry is stamped with its file's size, modification and change times and
 * inode number, taken by one `stat` per file on every run (a file changed within the last two
 * seconds is read and not kept: `settledStamp` in family-index.ts says why). A file whose stamp
 * differs (a record added by `armwind log`, by hand, by another bench or by a merge; edited in
 * place; its permissions changed) is read and validated in full as before and its entry
 * replaced; entries of files gone are dropped. Anything that is not a regular file is read every time (so a FIFO or a link to a
 * device is still a damaged record, never waited on). A missing, damaged or unwritable summary
 * only costs the time of reading every record, never a wrong row.
 */
import { readdirSync } from "node:fs";
import { join, resolve } from "node:path";
import { historyRows, type HistoryRow } from "./history.js";
import { readJson, settledStamp, shortHash, statOf, writeJson } from "./family-index.js";
import { type Logbook, type LogbookWarning, mayBeRecord, readLogbook, readRecordFile } from "./store.js";

const VERSION = 1;

/** One file's entry: its stamp and what history makes of it (its row, or the warning it gives). */
interface Entry {
  stamp: string;
  row?: HistoryRow;
  warning?: LogbookWarning;
}

interface SummaryFile {
  version: number;
  dir: string;
  entries: Record<string, Entry>;
}

/** What history shows of a folder: its facts and warnings as `readLogbook` gives them (no records), and a row per good record. */
export interface FolderHistory {
  book: Logbook;
  /** One row per record that reads, in file-name order (history sorts them by date). */
  rows: HistoryRow[];
  /** Whether any record was read anew or any entry dropped since the summary was last written (history then refreshes the family index). */
  changed: boolean;
}

/** Where the history summary of logbook folder `dir` is kept inside `cache`. */
export function summaryFile(cache: string, dir: string): string {
  return join(cache, `history-${shortHash(resolve(dir))}.json`);
}

/** The summary's entries for `dir`, or none when there is no summary (or a damaged or foreign one). */
function loadEntries(cache: string, dir: string): Map<string, Entry> {
  const file = readJson<SummaryFile>(summaryFile(cache, dir));
  if (file?.version !== VERSION || file.dir !== resolve(dir) || typeof file.entries !== "object" || file.entries === null) return new Map();
  return new Map(Object.entries(file.entries));
}

/** An entry is used only when it is well formed: a stamp, and a row of its own file or a warning. */
const usable = (name: string, e: Entry | undefined, stamp: string): e is Entry =>
  typeof e === "object" && e !== null && e.stamp === stamp && (e.row?.file === name || typeof e.warning?.message === "string");

/** Read one record file in full and make its entry: its row, or its warning. */
function readEntry(dir: string, name: string, stamp: string): Entry {
  const r = readRecordFile(dir, name);
  if ("warning" in r) return { stamp, warning: r.warning };
  return { stamp, row: historyRows([{ file: name, record: r.record }])[0] };
}

/**
 * Every record of `dir` as history shows it: the rows of records whose files are unchanged since
 * the summary in `cache` was written come from it; the others are read and validated in full (as
 * `readLogbook` reads them) and the summary is rewritten. Files: lists `dir`, stats each record
 * file, reads changed ones, reads and writes the summary in `cache`.
 */
export function historyOfFolder(dir: string, cache: string): FolderHistory {
  let names: string[];
  try {
    names = readdirSync(dir).sort();
  } catch {
    return { book: readLogbook(dir), rows: [], changed: false }; // missing or unreadable: readLogbook says which
  }
  const known = loadEntries(cache, dir);
  const entries: Record<string, Entry> = {};
  const rows: HistoryRow[] = [];
  const warnings: LogbookWarning[] = [];
  let changed = false;
  const prefix = join(dir, "/"); // the folder with its separator: each file's path by concatenation
  const now = Date.now();
  for (const name of names) {
    if (!mayBeRecord(name)) continue;
    const entry = entryOf(dir, prefix + name, name, known, now);
    if (entry.stamp) {
      entries[name] = entry;
      changed ||= entry !== known.get(name);
    } else changed ||= entry.row !== undefined; // a record too fresh to keep: read, not kept (the index still learns of it)
    if (entry.row) rows.push(entry.row);
    else if (entry.warning) warnings.push(entry.warning);
  }
  changed ||= [...known.keys()].some((name) => !(name in entries));
  if (changed) writeJson(summaryFile(cache, dir), { version: VERSION, dir: resolve(dir), entries } satisfies SummaryFile);
  return { book: { dir, exists: true, records: [], warnings }, rows, changed };
}

/**
 * One file's entry: the summary's when its stamp still holds, else read anew (stamp "" for what is
 * not kept: not a regular file, or changed too recently for its stamp to be trusted, `settledStamp`).
 */
function entryOf(dir: string, path: string, name: string, known: Map<string, Entry>, now: number): Entry {
  const st = statOf(path); // unreadable since the listing: the read says which
  const stamp = st?.isFile() ? settledStamp(st, now) : undefined;
  if (stamp === undefined) return readEntry(dir, name, "");
  const old = known.get(name);
  return usable(name, old, stamp) ? old : readEntry(dir, name, stamp);
}
