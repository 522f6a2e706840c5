/**
 * The process's own `Io` (standard streams, environment, working folder), apart from `io.ts` so
 * that start-up (main.ts) evaluates nothing more than this: `io.ts` pulls in the job schema.
 */
import { readStdin, TEXT_FILE_LIMIT } from "../files.js";
import { writeStream } from "./output.js";

export interface Io {
  out: (s: string) => void;
  err: (s: string) => void;
  /** Standard input, read whole, for "-". */
  stdin: () => string;
  env: NodeJS.ProcessEnv;
  cwd: string;
  /** The shop profile named by --shop (docs/contracts.md "The shop profile"), when given. */
  shop?: string;
}

export const processIo = (): Io => ({
  out: (s) => writeStream(1, s.endsWith("\n") ? s : s + "\n"),
  err: (s) => writeStream(2, s.endsWith("\n") ? s : s + "\n"),
  stdin: () => readStdin(TEXT_FILE_LIMIT),
  env: process.env,
  cwd: process.cwd(),
});
