/**
 * The shop folder's jobs for the list page: every YAML file in the folder and in its jobs/
 * subfolder that looks like a job file (it has an `armature:`), with its last plan verdict (what
 * `check --json` says; the list page leaves that to its script, one job at a time, so that it
 * shows at once) and its last logbook record (what `history --json` lists).
 */
import { readdirSync, statSync } from "node:fs";
import { join } from "node:path";
import { runCli } from "./cli-run.js";
import { readUserFile } from "../files.js";

export interface JobEntry {
  file: string;
  id: string | null;
  title: string | null;
  family: string | null;
  /** The plan's verdict: "meets the goal", "no winding meets the goal", or the first error's code. */
  verdict: "feasible" | "infeasible" | "invalid" | "unknown";
  verdict_detail: string;
  warnings: number;
  last_record: { file: string; date: string; checks_ok: boolean } | null;
}

interface HistoryRow {
  file: string;
  job_id: string;
  date: string;
  checks_ok: boolean;
}

/** Job files in the folder and its jobs/ subfolder (relative paths, sorted). */
export function jobFiles(dir: string): string[] {
  const found: string[] = [];
  for (const sub of ["", "jobs"]) {
    let names: string[] = [];
    try {
      names = readdirSync(join(dir, sub));
    } catch {
      continue;
    }
    for (const n of names.sort()) {
      if (!/\.ya?ml$/.test(n) || n === "armwind.yaml") continue;
      const rel = sub ? `${sub}/${n}` : n;
      try {
        const abs = join(dir, rel);
        if (!statSync(abs).isFile() || statSync(abs).size > 1 << 20) continue;
        if (/^armature:/m.test(readUserFile(abs))) found.push(rel);
      } catch {
        // unreadable: not listed
      }
    }
  }
  return found;
}

const field = (text: string, key: string): string | null => {
  const m = new RegExp(`^\\s*${key}:\\s*(.+?)\\s*(#.*)?$`, "m").exec(text);
  return m ? m[1].replace(/^["']|["']$/g, "") : null;
};

/** The list page's data, one `check --json` per job and one `history --json`. */
export async function listJobs(dir: string, opts: { verdicts?: boolean } = {}): Promise<{ ok: true; jobs: JobEntry[] }> {
  const hist = await runCli(dir, ["history", "--json"]);
  let records: HistoryRow[] = [];
  try {
    records = (JSON.parse(hist.stdout) as { records?: HistoryRow[] }).records ?? [];
  } catch {
    // no logbook yet
  }
  const jobs: JobEntry[] = [];
  for (const file of jobFiles(dir)) {
    let text = "";
    try {
      text = readUserFile(join(dir, file));
    } catch {
      // changed since listed: check says what is wrong
    }
    const run = opts.verdicts === false ? { status: -1, stdout: "{}", stderr: "" } : await runCli(dir, ["check", file, "--json"]);
    let out: { feasible?: boolean; warnings?: unknown[]; errors?: { code: string; message: string }[]; job_id?: string } = {};
    try {
      out = JSON.parse(run.stdout);
    } catch {
      // an internal fault: shown as invalid
    }
    const id = out.job_id ?? field(text, "id");
    const verdict = run.status === -1 ? "unknown" : run.status === 0 ? "feasible" : run.status === 2 ? "infeasible" : "invalid";
    const mine = records.filter((r) => r.job_id === id).sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : a.file < b.file ? -1 : 1));
    const last = mine[mine.length - 1];
    jobs.push({
      file,
      id,
      title: field(text, "title"),
      family: field(text, "family"),
      verdict,
      verdict_detail:
        verdict === "feasible"
          ? "a winding meets the goal"
          : verdict === "infeasible"
            ? "no winding meets the goal (closest shown)"
            : verdict === "unknown"
              ? ""
              : out.errors?.[0]
                ? `${out.errors[0].message} [${out.errors[0].code}]`
                : "cannot be planned",
      warnings: out.warnings?.length ?? 0,
      last_record: last ? { file: last.file, date: last.date, checks_ok: last.checks_ok } : null,
    });
  }
  return { ok: true, jobs };
}
