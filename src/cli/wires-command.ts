/** yargs shell of `armwind wires` (the pure part is wires.ts). */
import type { Argv } from "yargs";
import type { Io } from "./io.js";
import { runWires } from "./wires.js";
import { COMMAND_TEXT } from "./commands.js";

export function wiresCommand(yargs: Argv, io: Io, setStatus: (n: number) => void) {
  return yargs.command(
    COMMAND_TEXT.wires.command,
    COMMAND_TEXT.wires.describe,
    (y) =>
      y
        .option("system", { type: "string", describe: "only one system: awg, swg or metric" })
        .option("min", {
          type: "string",
          describe: 'smallest bare diameter, e.g. "0.1 mm" or "30 AWG" (bare number: mm; a gauge number with --system awg or swg)',
        })
        .option("max", {
          type: "string",
          describe: 'largest bare diameter, e.g. "0.02 in" or "25 AWG"; two gauges give the sizes between them, whichever way round',
        })
        .option("json", { type: "boolean", default: false, describe: "print the catalogue as JSON" }),
    (argv) => {
      const r = runWires({ system: argv.system, min: argv.min, max: argv.max, json: argv.json });
      if (r.stdout) io.out(r.stdout);
      if (r.stderr) io.err(r.stderr);
      setStatus(r.status);
    },
  );
}
