/**
 * Large armatures (issue 15 aims, in-process): a 400-bar lap `plan` (aim ≤ 0.3 s) and `diagnose` on
 * 400 bars (aim ≤ 0.1 s). The job is the chair's permanent-magnet lap demo scaled to 200 slots,
 * 2 coils a slot, 400 bars (invented, for timing only; 3 turns a coil instead of 30 so that its
 * series field's tests still fit the resistances; the locked-rotor reading is left out). Printed, never asserted in a test.
 */
import { readFileSync } from "node:fs";
import { loadYaml } from "../src/job/load.js";
import { jobSchema, type Job } from "../src/job/schema.js";
import { planJob } from "../src/design/plan.js";
import { windingSpec } from "../src/design/context.js";
import { layoutWinding } from "../src/winding/layout.js";
import { barToBar } from "../src/winding/ring.js";
import { diagnose } from "../src/winding/diagnose.js";

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** A 400-bar simplex lap job: 200 slots, 2 coils a slot, 2 poles, span 99, on a 200 mm rotor. */
export function bigLapJob(): Job {
  const text = readFileSync("jobs/drill-lap-0112.yaml", "utf8")
    .replace(/id: drill-lap-0112/, "id: bench-lap-400")
    .replace(/slots: 12\n/, "slots: 200\n")
    .replace(/bars: 24\n/, "bars: 400\n")
    .replace(/rotor_diameter: 32 mm/, "rotor_diameter: 200 mm")
    .replace(/span: 5 /, "span: 99 ")
    .replace(/\n  wire_mass: .*\n/, "\n")
    .replace(/\n  terminal_resistance: .*\n/, "\n")
    .replace(/\n  locked_rotor: .*\n/, "\n")
    .replace(/\n  turns: 30\n/, "\n  turns: 3\n");
  return loadYaml(text, "bench-lap-400", jobSchema).value;
}

function time(label: string, runs: number, aimMs: number, f: () => void) {
  f(); // warm up
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    f();
    times.push(performance.now() - t0);
  }
  const t = median(times);
  console.log(`  ${label}: median of ${runs} ${t.toFixed(1)} ms (aim ≤ ${aimMs} ms: ${t <= aimMs ? "met" : "NOT met"})`);
}

export function benchRing() {
  const job = bigLapJob();
  console.log("large armature, 400-bar lap (in-process):");
  time("plan", 5, 300, () => planJob(job, {}));
  const layout = layoutWinding(windingSpec(job));
  const coils = layout.coils.map((_, i) => 1 + 0.001 * (i % 7));
  coils[123] *= 0.8;
  const readings = barToBar(layout, coils);
  time("diagnose", 5, 100, () =>
    diagnose(
      layout,
      readings,
      coils.map(() => 1),
      30,
      undefined,
      { resolutionOhm: 0.001 },
    ),
  );
}
