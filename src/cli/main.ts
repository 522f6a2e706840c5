#!/usr/bin/env node
/** armwind: the command line. Each command lives in its own file; this one only wires them up. */
import yargs, { type Argv } from "yargs";
import { hideBin } from "yargs/helpers";
import { COMMAND_TEXT, type CommandName } from "./commands.js";
import { processIo, type Io } from "./process-io.js";
import { endForOutputError, OutputError, writeStream } from "./output.js";
import { VERSION } from "../version.js";

export async function main(args: string[], io = processIo()): Promise<number> {
  let status = 0;
  const setStatus = (n: number) => {
    status = n;
  };
  let y: Argv = yargs(args)
    .scriptName("armwind")
    .usage("armwind <command> [options]\n\nPlan the rewind of a brushed DC or universal motor armature, print its job card, keep the logbook.")
    .version(VERSION)
    .strict()
    .demandCommand(1, "give a command: plan, card, check, wires, new, log, diagnose, history …")
    .recommendCommands()
    .option("shop", { type: "string", global: true, describe: "shop profile (default $ARMWIND_SHOP, else armwind.yaml here or in the nearest parent folder)" })
    .middleware((argv) => {
      if (typeof argv.shop === "string" && argv.shop) io.shop = argv.shop;
    })
    .wrap(Math.min(100, process.stdout.columns || 100))
    .fail((msg, err) => {
      // a bad command line stops here: the command does not run
      throw err ?? new UsageError(msg);
    });
  // yargs renders a command's whole help right after starting its handler, to have it should the
  // handler fail; armwind never prints help for a failed command (its errors are one line), and
  // rendering it was a tenth of a plan's time
  usageOf(y).cacheHelpMessage = () => {};
  // evaluate only the commands named on the command line (each pulls in its own part of armwind:
  // the job schema, the design core, pdfkit); the others are listed from their text alone, which
  // is all that top-level help, no command or a mistyped one (yargs suggests the nearest) need
  for (const c of COMMANDS) y = c.names.some((n) => args.includes(n)) ? await c.register(y, io, setStatus) : listOnly(y, c.names);
  try {
    // with a callback yargs never exits the process, and hands help and version text back: printed
    // through io, so that `main` can run in-process (tests) exactly as it runs in a process
    await y.exitProcess(false).parseAsync(args, {}, (_err, _argv, output) => {
      if (output) io.out(output);
    });
  } catch (e) {
    // standard output closed early (quiet, 0) or could not be written (one line, 3)
    if (e instanceof OutputError) return endForOutputError(e);
    if (!(e instanceof UsageError)) throw e;
    io.err(`armwind: ${e.message} (armwind --help lists commands and options)`);
    return 1;
  }
  return status;
}

class UsageError extends Error {}

type Register = (y: Argv, io: Io, setStatus: (n: number) => void) => Promise<Argv>;

/** yargs' help renderer (an internal of yargs 18, pinned). */
const usageOf = (y: Argv) =>
  (y as unknown as { getInternalMethods(): { getUsageInstance(): { cacheHelpMessage: () => void } } }).getInternalMethods().getUsageInstance();

/**
 * A command listed by its usage line and description only. Never run: a command whose name is on
 * the command line is registered whole (a name that reaches yargs as a command is on the line).
 */
function listOnly(y: Argv, names: readonly CommandName[]): Argv {
  for (const n of names)
    y = y.command(COMMAND_TEXT[n].command, COMMAND_TEXT[n].describe, {}, () => {
      throw new Error(`command ${n} was not loaded`);
    });
  return y;
}

/** Every command, in the order --help lists them. */
const COMMANDS: { names: CommandName[]; register: Register }[] = [
  { names: ["plan", "check"], register: async (y, io, s) => (await import("./plan.js")).planCommand(y, io, s) },
  { names: ["card"], register: async (y, io, s) => (await import("./card.js")).cardCommand(y, io, s) },
  { names: ["wires"], register: async (y, io, s) => (await import("./wires-command.js")).wiresCommand(y, io, s) },
  { names: ["log"], register: async (y, io, s) => (await import("./log.js")).logCommand(y, io, s) },
  { names: ["diagnose"], register: async (y, io, s) => (await import("./diagnose.js")).diagnoseCommand(y, io, s) },
  { names: ["history"], register: async (y, io, s) => (await import("./history.js")).historyCommand(y, io, s) },
  { names: ["schema"], register: async (y, io, s) => (await import("./schema.js")).schemaCommand(y, io, s) },
  { names: ["new"], register: async (y, io, s) => (await import("./new.js")).newCommand(y, io, s) },
  { names: ["serve"], register: async (y, io, s) => (await import("./serve.js")).serveCommand(y, io, s) },
];

const isMain = process.argv[1] && /main\.(js|ts)$|armwind(\.mjs)?$/.test(process.argv[1]);
if (isMain) {
  // yargs prints help and usage through console.log: a reader that closes early (EPIPE) or a full
  // disk there ends the command as the output routine would, never with a stack trace
  for (const [stream, fd] of [
    [process.stdout, 1],
    [process.stderr, 2],
  ] as const) {
    stream.on("error", (e: NodeJS.ErrnoException) => {
      process.exitCode = endForOutputError(new OutputError(fd, e.code ?? "error"));
    });
  }
  main(hideBin(process.argv)).then(
    (code) => {
      process.exitCode = code;
    },
    (e: unknown) => {
      if (e instanceof OutputError) {
        process.exitCode = endForOutputError(e);
        return;
      }
      try {
        writeStream(2, `armwind: internal error: ${e instanceof Error ? e.message.split("\n")[0] : String(e)}\n`);
      } catch {
        /* standard error is gone: the status says it */
      }
      process.exitCode = 70;
    },
  );
}
