/**
 * Logbook aims (issue 15), whole processes over a logbook of 10 000 records (copies of the demo
 * records, dated apart, spread over 500 invented families; 20 of them of the blind motor's family):
 *  - `plan` with learning ≤ 50 ms more than `plan --no-learn` (the family index built by a first run);
 *  - `history` over the 10 000 records ≤ 1 s.
 * The logbook is written to a temporary folder and removed afterwards; the cache folder too.
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { aim, alternate, timeOnce } from "./proc.js";

const N = 10_000;

export function makeLogbook(dir: string): void {
  const demos = readdirSync("jobs/logbook")
    .filter((f) => f.endsWith(".yaml"))
    .map((f) => readFileSync(join("jobs/logbook", f), "utf8"));
  const blind = demos.find((t) => t.includes('"family": "blind-5slot"'))!;
  for (let i = 0; i < N; i++) {
    const own = i % 500 === 0;
    const text = own ? blind : demos[i % demos.length];
    const id = /"id": "([^"]+)"/.exec(text)![1];
    const date = `20${String(10 + (i % 17)).padStart(2, "0")}-${String((i % 12) + 1).padStart(2, "0")}-${String((i % 28) + 1).padStart(2, "0")}`;
    const body = text.replace(/"date": "[^"]*"/, `"date": "${date}"`).replace(/"family": (null|"[^"]*")/, own ? "$&" : `"family": "bench-family-${i % 500}"`);
    writeFileSync(join(dir, `${id}-${date}-${i + 1}.yaml`), body);
  }
}

export function benchLogbook(runs = 7): string[] {
  const dir = mkdtempSync(join(tmpdir(), "armwind-bench-logbook-"));
  const cache = mkdtempSync(join(tmpdir(), "armwind-bench-cache-"));
  makeLogbook(dir);
  const env = { ARMWIND_CACHE_DIR: cache };
  const plan = ["bin/armwind.mjs", "plan", "jobs/blind-motor-0031.yaml", "--logbook", dir];
  // the first plan reads every record once and builds the family index in the cache folder
  const cold = timeOnce(plan, env, 3);
  const t = alternate({ learn: { args: plan, env, okBelow: 3 }, noLearn: { args: [...plan, "--no-learn"], env, okBelow: 3 } }, runs);
  const hist = alternate({ history: { args: ["bin/armwind.mjs", "history", "--logbook", dir], env } }, 3);
  rmSync(dir, { recursive: true, force: true });
  rmSync(cache, { recursive: true, force: true });
  const ms = (x: number) => `${x.toFixed(0)} ms`;
  console.log(
    `logbook of ${N} records (medians of ${runs} alternating runs; history of 3): plan --no-learn ${ms(t.noLearn)}; the first plan with learning, building the family index, ${ms(cold)}`,
  );
  const lines = [
    aim("plan with learning − plan --no-learn", `${ms(t.learn)} − ${ms(t.noLearn)} = ${ms(t.learn - t.noLearn)}`, t.learn - t.noLearn <= 50, "≤ 50 ms"),
    aim(`history over ${N} records`, ms(hist.history), hist.history <= 1000, "≤ 1000 ms"),
  ];
  for (const l of lines) console.log(l);
  return lines;
}
