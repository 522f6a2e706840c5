/**
 * One truth from plan to bench (issue 9): for every demo job, the figures `plan --json` prints and
 * the ones `log` predicts for the planned winding (src/logbook/predict.ts, an evaluation of its own,
 * not a copy of the plan) are the same numbers, and so are the ones the logbook record stores; the card
 * prints those numbers (read back from the PDF) with the window the bench rules give, and `diagnose`
 * expects the same readings and judges them as `log` does.
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
import { ROOT, demoJobFiles, loadJobFile, runMain } from "./helpers/cli.js";
import { readBoxes } from "./helpers/pdf-layout.js";
import { renderCard } from "../src/card/render.js";
import { DEFAULT_METER_RESOLUTION_OHM, levelBounds, levelWindow, median, readingName } from "../src/bench/rules.js";
import { ohm } from "../src/format/number.js";

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
      // a series motor's no-load run is the series model's (a universal motor's, briefly in its housing), in `series`
      const planNl = j.series ? j.series.no_load : { speed_rpm: j.motor.no_load_speed_rpm, current_a: j.motor.no_load_current_a };
      same(nl === null ? null : toRpm(nl.speed), planNl?.speed_rpm ?? null);
      same(nl === null ? null : nl.current, planNl?.current_a ?? null);
      // the logbook record stores the same predictions
      const mfile = join(ROOT, "jobs/measured", `${job.id}.yaml`);
      const m = loadYaml(readFileSync(mfile, "utf8"), mfile, measuredSchema).value;
      const rec = buildRecord(job, plan, p, m, "2026-12-02T00:00:00.000Z");
      same(rec.predicted.terminal_ohm, j.resistance.terminal_ohm);
      rec.predicted.bar_to_bar_ohm.forEach((r, i) => same(r, j.resistance.bar_to_bar_each_ohm[i]));
    });
  }
});

/** The card's bar-to-bar rows as printed: name, expected (Ω) and window (Ω), read back from the PDF's text positions. */
async function cardRows(plan: ReturnType<typeof planJob>): Promise<{ rows: Map<string, { expected: string; window: string }>; text: string }> {
  const pages = await readBoxes(await renderCard(plan, { paper: "a4", date: "2026-12-01", version: "9.9.9-test" }));
  const rows = new Map<string, { expected: string; window: string }>();
  for (const p of pages) {
    for (const name of p.items.filter((i) => /^r\d+$/.test(i.str))) {
      // the cells to its right on its baseline, nearest first: bars, expected, window
      const line = p.items.filter((i) => i !== name && Math.abs(i.bottom - name.bottom) < 2 && i.x > name.x).sort((a, b) => a.x - b.x);
      if (line.length >= 3 && /^\d+–\d+$/.test(line[0].str)) rows.set(name.str, { expected: line[1].str, window: line[2].str });
    }
  }
  return {
    rows,
    text: pages
      .map((p) => p.items.map((i) => i.str).join(" "))
      .join("\n")
      .replace(/\s+/g, " "),
  };
}

describe("the card, plan --json, log and diagnose give the same number for every figure they share", () => {
  for (const file of demoJobFiles()) {
    const name = file.split("/").pop()!;
    it(`${name}: the card prints the plan's readings, the window the bench rules give, and diagnose expects the same`, async () => {
      const job = loadJobFile(file);
      const plan = planJob(job);
      const j = planJson(plan);
      const b2b = j.resistance.bar_to_bar_each_ohm;
      // the card: every pair's expected reading and its window (src/bench/rules.ts levelWindow at the default meter)
      const { rows, text } = await cardRows(plan);
      expect(rows.size).toBe(b2b.length);
      const level = levelWindow(plan.wire.mlt_source !== "model", plan.design.wire.bare_diameter, DEFAULT_METER_RESOLUTION_OHM, median(b2b));
      b2b.forEach((v, i) => {
        const row = rows.get(readingName(i))!;
        expect(row.expected).toBe(ohm(v));
        const b = levelBounds(v, level);
        expect(row.window).toBe(`${ohm(b.low)}–${ohm(b.high)}`);
        // a resistance window never reaches below zero (a 0.1 Ω meter on a 0.09 Ω reading once printed −0.016)
        expect(row.window.startsWith("−")).toBe(false);
      });
      expect(text).toContain(`expected ${ohm(j.resistance.terminal_ohm)} Ω at 20 °C`);
      // diagnose on the demo readings, without the logbook as the plan above: the same expected readings and coils
      const mfile = join(ROOT, "jobs/measured", `${job.id}.yaml`);
      const d = JSON.parse((await runMain(["diagnose", file, "--measured", mfile, "--json", "--no-learn"], { cwd: ROOT })).stdout);
      d.readings.forEach((r: { name: string; expected_ohm: number }, i: number) => {
        expect(r.name).toBe(readingName(i));
        same(r.expected_ohm, b2b[i]);
      });
      same(d.level.expected_median_ohm, median(b2b));
      // log judges the same readings with the same window as diagnose (same meter resolution, from the measured file)
      const m = loadYaml(readFileSync(mfile, "utf8"), mfile, measuredSchema).value;
      const rec = buildRecord(job, plan, predictWound(job, plan, undefined), m, "2026-12-02T00:00:00.000Z");
      const lv = rec.comparison.checks.find((c) => c.check === "bar_to_bar.level")!;
      same(lv.tolerance_fraction, d.level.window_fraction);
      same(lv.predicted_value, d.level.expected_median_ohm);
      d.readings.forEach((r: { pass: boolean }, i: number) => {
        const c = rec.comparison.checks.find((x) => x.check === `bar_to_bar[${i}]`)!;
        expect(c.verdict === "ok").toBe(r.pass);
      });
    });
  }
});
