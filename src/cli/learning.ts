/** Where the logbook lives, and what it tells the next plan of the same armature family. */
import { resolve } from "node:path";
import type { Job } from "../job/schema.js";
import type { PlanOptions } from "../design/plan.js";
import type { Io } from "./io.js";

/** The logbook folder: --logbook DIR, else $ARMWIND_LOGBOOK, else jobs/logbook/ (relative to the working directory). */
export function logbookDir(io: Io, given?: string): string {
  return resolve(io.cwd, given ?? io.env.ARMWIND_LOGBOOK ?? "jobs/logbook");
}

/** The logbook's corrections for a job that names an armature family (filled in by the logbook module). */
export function logbookOptionsFor(_io: Io, _job: Job, _dir?: string): PlanOptions {
  return {};
}
