/** Run the built CLI as a user would, and load demo jobs for in-process tests. */
import { spawnSync } from "node:child_process";
import { readdirSync, readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { loadYaml } from "../../src/job/load.js";
import { jobSchema, type Job } from "../../src/job/schema.js";

export const ROOT = resolve(import.meta.dirname, "../..");
export const CLI = join(ROOT, "dist/cli/main.js");

export interface CliResult {
  status: number;
  stdout: string;
  stderr: string;
}

export function runCli(args: string[], opts: { cwd?: string; input?: string; env?: Record<string, string> } = {}): CliResult {
  const r = spawnSync(process.execPath, [CLI, ...args], {
    cwd: opts.cwd ?? ROOT,
    input: opts.input,
    encoding: "utf8",
    env: { ...process.env, NO_COLOR: "1", ARMWIND_LOGBOOK: join(ROOT, "jobs/logbook"), ...opts.env },
  });
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

export function demoJobFiles(): string[] {
  return readdirSync(join(ROOT, "jobs"))
    .filter((f) => f.endsWith(".yaml"))
    .map((f) => join(ROOT, "jobs", f));
}

export function loadJobFile(file: string): Job {
  return loadYaml(readFileSync(file, "utf8"), file, jobSchema).value;
}

export function loadJobText(text: string, file = "job.yaml"): Job {
  return loadYaml(text, file, jobSchema).value;
}
