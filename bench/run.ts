/**
 * `npm run bench`: speed figures, printed, never asserted in tests.
 *  1. the candidate sweep over the whole catalogue with 4 strands in hand (≥ 100 000 candidates);
 *  2. start-up aims: plan and --help against `node -e ''`, card against a bare pdfkit page (bench/startup.ts);
 *     logbook aims over 10 000 records: learning's extra time, history (bench/logbook.ts);
 *  3. reading a logbook of a thousand records for `history` (when bench/history.ts exists);
 *  4. a 400-bar lap plan and diagnose on 400 bars, in-process (bench/ring.ts);
 *  5. the workbench: a form change to its new plan, and the first page from a cold `armwind serve` (bench/web.ts).
 * Run after `npm run build` (the npm script does it): the card process is the built CLI.
 */
import { existsSync, readFileSync } from "node:fs";
import { loadYaml } from "../src/job/load.js";
import { jobSchema } from "../src/job/schema.js";
import { buildContext } from "../src/design/context.js";
import { calibrateOriginal } from "../src/design/calibration.js";
import { makeEvaluator } from "../src/design/evaluate.js";
import { stockWires, supplyOf } from "../src/design/plan.js";
import { sweep } from "../src/design/sweep.js";
import { benchRing } from "./ring.js";
import { benchStartup } from "./startup.js";
import { benchLogbook } from "./logbook.js";

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

async function benchHistory() {
  if (!existsSync("bench/history.ts")) {
    console.log("history: bench/history.ts not present");
    return;
  }
  await import("./history.js");
}

console.log(`armwind bench, ${new Date().toISOString().slice(0, 10)}, Node ${process.version}`);
benchSweep();
const aims = [...benchStartup(), ...benchLogbook()];
await benchHistory();
console.log("\naims of issue 15 (whole processes; the ring aims follow):");
for (const l of aims) console.log(l);
benchRing();
await import("./web.js");
