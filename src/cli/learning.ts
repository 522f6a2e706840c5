/** Where the logbook lives, and what it tells the next plan of the same armature family. */
import { resolve } from "node:path";
import type { Job } from "../job/schema.js";
import type { PlanOptions } from "../design/plan.js";
import type { Io } from "./io.js";
import { shopLogbook } from "./shop.js";
import { cacheFolder, recordsOfFamily } from "../logbook/family-index.js";
import { learnFromRecords } from "../logbook/learn.js";

/**
 * The logbook folder: --logbook DIR, else $ARMWIND_LOGBOOK, else the shop profile's `logbook`
 * (relative to the profile), else jobs/logbook/ (relative to the working directory).
 */
export function logbookDir(io: Io, given?: string): string {
  return resolve(io.cwd, given || io.env.ARMWIND_LOGBOOK || shopLogbook(io) || "jobs/logbook");
}

/**
 * The logbook's corrections for a job that names an armature family: the records of that family
 * (read here, the shell's part) turned into plan options by the pure `learnFromRecords`.
 * `before` (YYYY-MM-DD) keeps only records dated before it: the plan as it stood before a rewind.
 * Damaged records are warnings on stderr naming the file; the rest still count.
 */
export function logbookOptionsFor(io: Io, job: Job, dir?: string, opts: { before?: string } = {}): PlanOptions {
  if (!job.armature.family) return {};
  // only the family's records (an index in the user's cache folder knows which files those are)
  const book = recordsOfFamily(logbookDir(io, dir), job.armature.family, cacheFolder(io.env));
  for (const w of book.warnings) io.err(`armwind: warning: ${w.message} [${w.code}]`);
  const records = opts.before ? book.records.filter((r) => r.record.date < opts.before!) : book.records;
  const learned = learnFromRecords(job, records);
  return learned.options ? { logbook: learned.options } : {};
}
