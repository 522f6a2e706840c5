#!/usr/bin/env node
/** armwind: the command line. Each command lives in its own file; this one only wires them up. */
import yargs from "yargs";
import { hideBin } from "yargs/helpers";
import { processIo } from "./io.js";
import { planCommand } from "./plan.js";
import { wiresCommand } from "./wires-command.js";
import { cardCommand } from "./card.js";
import { schemaCommand } from "./schema.js";
import { newCommand } from "./new.js";
import { VERSION } from "./version.js";

export async function main(args: string[], io = processIo()): Promise<number> {
  let status = 0;
  const setStatus = (n: number) => {
    status = n;
  };
  let y = yargs(args)
    .scriptName("armwind")
    .usage("armwind <command> [options]\n\nPlan the rewind of a brushed DC or universal motor armature, print its job card, keep the logbook.")
    .version(VERSION)
    .strict()
    .demandCommand(1, "give a command: plan, card, check, wires … (armwind --help lists them)")
    .recommendCommands()
    .wrap(Math.min(100, process.stdout.columns || 100))
    .fail((msg, err) => {
      // a bad command line stops here: the command does not run
      throw err ?? new UsageError(msg);
    });
  y = planCommand(y, io, setStatus);
  y = cardCommand(y, io, setStatus);
  y = wiresCommand(y, io, setStatus);
  y = (await import("./log.js")).logCommand(y, io, setStatus);
  y = (await import("./diagnose.js")).diagnoseCommand(y, io, setStatus);
  y = (await import("./history.js")).historyCommand(y, io, setStatus);
  y = schemaCommand(y, io, setStatus);
  y = newCommand(y, io, setStatus);
  try {
    await y.parseAsync();
  } catch (e) {
    if (!(e instanceof UsageError)) throw e;
    io.err(`armwind: ${e.message} (armwind --help lists commands and options)`);
    return 1;
  }
  return status;
}

class UsageError extends Error {}

const isMain = process.argv[1] && /main\.(js|ts)$|armwind(\.mjs)?$/.test(process.argv[1]);
if (isMain) {
  main(hideBin(process.argv)).then(
    (code) => {
      process.exitCode = code;
    },
    (e: unknown) => {
      process.stderr.write(`armwind: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
      process.exitCode = 70;
    },
  );
}
