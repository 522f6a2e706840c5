/** An in-memory Io for running the CLI in-process: what it prints is kept, the environment is given. */
import type { Io } from "../../src/cli/io.js";

export function fakeIo(cwd: string, env: Record<string, string> = {}): Io & { stdout: string[]; stderr: string[] } {
  const stdout: string[] = [];
  const stderr: string[] = [];
  return { out: (s) => stdout.push(s), err: (s) => stderr.push(s), stdin: () => "", env, cwd, stdout, stderr };
}
