/** Options several commands share, declared once so that they read the same everywhere. */
import type { Argv } from "yargs";

/** The job file argument. */
export function withJob<T>(y: Argv<T>, describe = "job file (YAML), or - for standard input") {
  return y.positional("job", { type: "string", demandOption: true, describe });
}

/** --logbook DIR and --learn/--no-learn: where finished rewinds are kept, and whether the plan uses those of the same family. */
export function withLogbook<T>(y: Argv<T>, learn = "use finished rewinds of the same armature family from the logbook (--no-learn: without)") {
  return y
    .option("logbook", { type: "string", describe: "logbook folder (default $ARMWIND_LOGBOOK, else jobs/logbook)" })
    .option("learn", { type: "boolean", default: true, describe: learn });
}
