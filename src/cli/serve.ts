/**
 * `armwind serve [--dir DIR] [--port N] [--host ADDR] [--allow-host NAME …]`: the workbench, a local
 * web page for the bench on the same core (docs/contracts.md, the workbench's HTTP contract). Loopback by
 * default; serving the network makes a token at each start and prints the link that carries it once.
 */
import type { Argv } from "yargs";
import { resolve } from "node:path";
import { statSync } from "node:fs";
import { guarded, type Io } from "./io.js";
import { inputError } from "../errors.js";
import { COMMAND_TEXT } from "./commands.js";

export function serveCommand(yargs: Argv, io: Io, setStatus: (n: number) => void) {
  return yargs.command(
    COMMAND_TEXT.serve.command,
    COMMAND_TEXT.serve.describe,
    (y) =>
      y
        .option("dir", {
          type: "string",
          default: ".",
          describe: "shop folder to serve (jobs, measured files, logbook), as the working folder of every command",
        })
        .option("port", { type: "number", default: 8417, describe: "port (0: any free port)" })
        .option("host", {
          type: "string",
          default: "127.0.0.1",
          describe: "address to listen on; anything but loopback serves the network and needs the printed token",
        })
        .option("allow-host", {
          type: "string",
          array: true,
          default: [] as string[],
          describe: "another name this machine is reached by (the Host header is checked against a list)",
        }),
    async (argv) => {
      setStatus(
        await guarded(io, false, async () => {
          const dir = resolve(io.cwd, argv.dir);
          let isDir = false;
          try {
            isDir = statSync(dir).isDirectory();
          } catch {
            // said below
          }
          if (!isDir) throw inputError("file_unreadable", "dir", `--dir ${argv.dir}: no such folder`);
          if (!Number.isInteger(argv.port) || argv.port < 0 || argv.port > 65535)
            throw inputError("out_of_range", "port", `--port ${argv.port}: give a port from 0 to 65535`);
          const { serve } = await import("../web/server.js");
          const s = await serve({ dir, port: argv.port, host: argv.host, allowHost: argv["allow-host"].map(String) }).catch((e: NodeJS.ErrnoException) => {
            if (e?.code === "EADDRINUSE")
              throw inputError(
                "port_in_use",
                "port",
                `--port ${argv.port}: the port is in use (another armwind serve?); give another with --port N, or --port 0 for any free one`,
              );
            if (e?.code === "EADDRNOTAVAIL")
              throw inputError(
                "host_unavailable",
                "host",
                `--host ${argv.host}: not an address of this machine; give one of its own, or 0.0.0.0 for all of them`,
              );
            throw e;
          });
          io.out(`listening on ${s.url}`);
          if (s.token) {
            const { linkHost } = await import("../web/guard.js");
            const port = new URL(s.url).port;
            io.out(`serving the network: open http://${linkHost(argv.host)}:${port}/?token=${s.token}`);
            io.out("  the link carries this start's token: share it only with the shop's own tablets; it changes at every start");
          }
          io.err(`armwind: serving ${dir}; Ctrl+C stops`);
          await new Promise<void>((done) => {
            const stop = () => {
              s.close().then(done, done);
            };
            process.once("SIGINT", stop);
            process.once("SIGTERM", stop);
          });
          return 0;
        }),
      );
    },
  );
}
