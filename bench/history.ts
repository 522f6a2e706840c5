/**
 * Bench (not a test): reading a logbook of a thousand records for `armwind history`.
 * The records are copies of the demo records under a thousand names, in a temporary folder.
 * Prints the time to read and validate them, to build the rows, CSV and SVG, and a whole
 * `armwind history --json` process of the built CLI when dist/ exists. Aim: well under a second.
 */
import { spawnSync } from "node:child_process";
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { readLogbook } from "../src/logbook/store.js";
import { drawingSvg, historyCsv, historyDrawing, historyRows } from "../src/logbook/history.js";

const N = 1000;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

const dir = mkdtempSync(join(tmpdir(), "armwind-bench-logbook-"));
const demos = readdirSync("jobs/logbook")
  .filter((f) => f.endsWith(".yaml"))
  .map((f) => readFileSync(join("jobs/logbook", f), "utf8"));
for (let i = 0; i < N; i++) {
  const text = demos[i % demos.length];
  const id = /"id": "([^"]+)"/.exec(text)![1];
  const date = `2027-${String((i % 12) + 1).padStart(2, "0")}-${String((i % 28) + 1).padStart(2, "0")}`;
  writeFileSync(join(dir, `${id}-${date}-${i + 1}.yaml`), text.replace(/"date": "[^"]*"/, `"date": "${date}"`));
}
const bytes = readdirSync(dir).reduce((s, f) => s + readFileSync(join(dir, f)).length, 0);

const times: number[] = [];
let count = 0;
for (let run = 0; run < 5; run++) {
  const t0 = performance.now();
  const book = readLogbook(dir);
  const rows = historyRows(book.records);
  historyCsv(rows);
  drawingSvg(historyDrawing(rows, "bench"));
  times.push(performance.now() - t0);
  count = book.records.length;
}
console.log(`history: ${count} records (${(bytes / 1024).toFixed(0)} KiB) read, validated, tabled, CSV and SVG`);
console.log(`  median of 5 runs ${median(times).toFixed(0)} ms (aim: well under 1000 ms)`);
if (existsSync("bin/armwind.mjs")) {
  const p: number[] = [];
  for (let run = 0; run < 3; run++) {
    const t0 = performance.now();
    const r = spawnSync(process.execPath, ["bin/armwind.mjs", "history", "--json", "--logbook", dir], { encoding: "utf8", maxBuffer: 1 << 28 });
    p.push(performance.now() - t0);
    if (r.status !== 0) throw new Error(`history exited ${r.status}: ${r.stderr}`);
  }
  console.log(`  whole 'armwind history --json' process: ${median(p).toFixed(0)} ms (median of 3)`);
}
rmSync(dir, { recursive: true, force: true });
