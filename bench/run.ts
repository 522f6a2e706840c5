/**
 * `npm run bench`: speed figures, printed, never asserted in tests.
 *  1. the candidate sweep over the whole catalogue with 4 strands in hand (≥ 100 000 candidates);
 *  2. a whole `armwind card` process against a whole Node process writing a one-page PDF with bare pdfkit;
 *  3. reading a logbook of a thousand records for `history` (when bench/history.ts exists);
 *  4. a 400-bar lap plan and diagnose on 400 bars, in-process (bench/ring.ts);
 *  5. the workbench: a form change to its new plan, and the first page from a cold `armwind serve` (bench/web.ts).
 * Run after `npm run build` (the npm script does it): the card process is the built CLI.
 */
import { spawnSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { loadYaml } from "../src/job/load.js";
import { jobSchema } from "../src/job/schema.js";
import { buildContext } from "../src/design/context.js";
import { calibrateOriginal } from "../src/design/calibration.js";
import { makeEvaluator } from "../src/design/evaluate.js";
import { stockWires, supplyOf } from "../src/design/plan.js";
import { sweep } from "../src/design/sweep.js";
import { benchRing } from "./ring.js";

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

function benchSweep() {
  const job = loadYaml(readFileSync("jobs/boat-7slot-0020.yaml", "utf8"), "boat", jobSchema).value;
  job.max_in_hand = 4;
  delete job.wire_stock;
  const ctx = buildContext(job);
  const cal = calibrateOriginal(ctx).calibration;
  const ev = makeEvaluator(ctx, cal, supplyOf(job).volts);
  const wires = stockWires(job).wires;
  const opts = { wires, maxInHand: 4, sides: ctx.sides, freeArea: ctx.slot.free_area };
  sweep(ev, opts); // warm up
  const times: number[] = [];
  let total = 0;
  for (let i = 0; i < 7; i++) {
    const t0 = performance.now();
    const r = sweep(ev, opts);
    times.push(performance.now() - t0);
    total = r.total;
  }
  const t = median(times);
  console.log(`sweep: ${wires.length} catalogue wires × 1…4 strands × turns = ${total} candidates`);
  console.log(`  median of 7 runs ${t.toFixed(1)} ms in all, ${((t * 1e6) / total).toFixed(0)} ns per candidate (aim: under 100 ms)`);
}

function timeProcess(args: string[], runs: number): number {
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    const r = spawnSync(process.execPath, args, { encoding: "utf8" });
    times.push(performance.now() - t0);
    if (r.status !== 0) throw new Error(`${args.join(" ")} exited ${r.status}: ${r.stderr}`);
  }
  return median(times);
}

function benchCard() {
  const dir = mkdtempSync(join(tmpdir(), "armwind-bench-"));
  const runs = 7;
  timeProcess(["bench/bare-pdfkit.mjs", join(dir, "bare.pdf")], 1);
  const bare = timeProcess(["bench/bare-pdfkit.mjs", join(dir, "bare.pdf")], runs);
  const card = timeProcess(["dist/cli/main.js", "card", "jobs/blind-motor-0031.yaml", "-o", dir], runs);
  console.log(`card: whole 'armwind card' process ${card.toFixed(0)} ms; bare pdfkit one-page process ${bare.toFixed(0)} ms (medians of ${runs})`);
  console.log(`  ratio ${(card / bare).toFixed(2)} (aim: within 1.5)`);
}

async function benchHistory() {
  if (!existsSync("bench/history.ts")) {
    console.log("history: bench/history.ts not present");
    return;
  }
  await import("./history.js");
}

console.log(`armwind bench, ${new Date().toISOString().slice(0, 10)}, Node ${process.version}`);
benchSweep();
benchCard();
await benchHistory();
benchRing();
await import("./web.js");
