/** `armwind schema [-o FILE]`: the job file's JSON Schema, for editors (printed, or written atomically). */
import type { Argv } from "yargs";
import { dirname, resolve } from "node:path";
import { shownPath, writeFailure } from "./new.js";
import { jobJsonSchemaText } from "../job/json-schema.js";
import { measuredJsonSchemaText, shopJsonSchemaText } from "../shop/json-schemas.js";
import { guarded, type Io } from "./io.js";
import { makeFolders, writeAtomic } from "./write.js";
import { COMMAND_TEXT } from "./commands.js";

/** Print the schema, or write it to `output` (temporary file, then renamed); returns the exit status. */
export async function runSchema(io: Io, output?: string, of: "job" | "measured" | "shop" = "job"): Promise<number> {
  const text = of === "job" ? jobJsonSchemaText() : of === "shop" ? shopJsonSchemaText() : measuredJsonSchemaText();
  if (output === undefined || output === "-") {
    io.out(text);
    return 0;
  }
  const file = resolve(io.cwd, output);
  const shown = shownPath(io.cwd, file);
  try {
    // made here one by one: writeAtomic's recursive mkdir can spin for ever under /proc (Node 20)
    makeFolders(dirname(file));
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw writeFailure(code === "EEXIST" ? "MKDIR_EEXIST" : code, shown);
  }
  await writeAtomic(file, text);
  io.out(`schema written: ${shown}`);
  return 0;
}

export function schemaCommand(yargs: Argv, io: Io, setStatus: (n: number) => void) {
  return yargs.command(
    COMMAND_TEXT.schema.command,
    COMMAND_TEXT.schema.describe,
    (y) =>
      y.option("output", { alias: "o", type: "string", describe: "write it to this file instead (replaced whole, never half-written)" }).option("of", {
        choices: ["job", "measured", "shop"] as const,
        default: "job" as const,
        describe: "which file's schema: the job file, the measured file or the shop profile",
      }),
    async (argv) => {
      setStatus(await guarded(io, false, () => runSchema(io, argv.output, argv.of)));
    },
  );
}
