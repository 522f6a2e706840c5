/**
 * One truth from plan to bench (issue 9): for every demo job, the figures `plan --json` prints and
 * the ones `log` predicts for the planned winding (src/logbook/predict.ts, an evaluation of its own,
 * not a copy of the plan) are the same numbers, and so are the ones the logbook record stores.
 */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { planJob } from "../src/design/plan.js";
import { planJson } from "../src/cli/plan-json.js";
import { predictNoLoad, predictWound } from "../src/logbook/predict.js";
import { buildRecord } from "../src/logbook/record.js";
import { measuredSchema } from "../src/logbook/measured.js";
import { loadYaml } from "../src/job/load.js";
import { toRpm } from "../src/format/units.js";
import { ROOT, demoJobFiles, loadJobFile } from "./helpers/cli.js";

const same = (a: number | null, b: number | null) => {
  if (a === null || b === null) return expect(a).toBe(b);
  expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-9 * Math.max(Math.abs(a), Math.abs(b)));
};

describe("plan --json and log give the same number for every figure they share", () => {
  for (const file of demoJobFiles()) {
    it(file.split("/").pop()!, () => {
      const job = loadJobFile(file);
      const plan = planJob(job);
      const j = planJson(plan);
      const p = predictWound(job, plan, undefined);
      expect(p.differs).toBe(false);
      same(p.terminal.single, j.resistance.terminal_ohm);
      same(p.terminal.min, j.resistance.terminal_min_ohm);
      same(p.terminal.max, j.resistance.terminal_max_ohm);
      expect(p.bar_to_bar.length).toBe(j.resistance.bar_to_bar_each_ohm.length);
      p.bar_to_bar.forEach((r, i) => same(r, j.resistance.bar_to_bar_each_ohm[i]));
      j.coils.forEach((c, i) => {
        same(p.coil_mlt[i] * 1e3, c.mean_turn_length_mm);
        if (c.resistance_ohm !== null) same(p.coil_ohm[i], c.resistance_ohm);
      });
      same(p.mlt * 1e3, j.wire.mean_turn_length_mm);
      same(p.ke, j.motor.ke_v_s_per_rad);
      const nl = predictNoLoad(p, plan.supply, 20);
      same(nl === null ? null : toRpm(nl.speed), j.motor.no_load_speed_rpm);
      same(nl === null ? null : nl.current, j.motor.no_load_current_a);
      // the logbook record stores the same predictions
      const mfile = join(ROOT, "jobs/measured", `${job.id}.yaml`);
      const m = loadYaml(readFileSync(mfile, "utf8"), mfile, measuredSchema).value;
      const rec = buildRecord(job, plan, p, m, "2026-12-02T00:00:00.000Z");
      same(rec.predicted.terminal_ohm, j.resistance.terminal_ohm);
      rec.predicted.bar_to_bar_ohm.forEach((r, i) => same(r, j.resistance.bar_to_bar_each_ohm[i]));
    });
  }
});
