/**
 * SI until the edge (docs/contracts.md, "--json keys"): every number of `plan --json` carries its
 * unit in its key, the goal's figures are in `goal.unit` wherever they appear (the goal, the
 * candidates, the sensitivity rows), and a tolerance prints with the digits it was given.
 */
import { describe, expect, it } from "vitest";
import { planJob } from "../src/design/plan.js";
import { planJson } from "../src/cli/plan-json.js";
import { planText } from "../src/cli/plan-text.js";
import { demoJobFiles, loadJobFile, loadJobText } from "./helpers/cli.js";
import { readFileSync } from "node:fs";

/** Key endings that name a unit (docs/contracts.md). */
const UNIT_SUFFIX = /_(mm|mm2|m|g|ohm|a|v|w|rpm|rpm_per_v|v_s_per_rad|v_s_per_a_rad|hz|n_m|n_m_per_a|n_m_s_per_rad|a_per_mm2|c|fraction)$/;
/** Keys exempt from a unit suffix: fractions, counts, bar and slot numbers, and `*_value` in a sibling or the goal's `unit`. */
const EXEMPT = new Set([
  "copper_fill",
  "space_fill",
  "copper_fill_limit",
  "efficiency",
  "peak_efficiency",
  "tolerance",
  "spare_margin",
  "turns_per_coil",
  "strands_in_hand",
  "layers",
  "turns_per_layer",
  "paths",
  "index",
  "turns",
  "slots",
  "bars",
  "poles",
  "span",
  "coils_per_slot",
  "lead_throw",
  "commutator_pitch",
  "back_pitch",
  "front_pitch",
  "coil_sides_per_slot",
  "go_slot",
  "return_slot",
  "start_bar",
  "end_bar",
  "candidates_total",
  "records",
  "target_value",
  "achieved_value",
  "from_value",
  "to_value",
  // series motors: the power factor is a fraction like efficiency; the conversion's turns ratio and field turns are counts
  "power_factor",
  "turns_ratio",
  "field_turns_per_pole",
]);

function numericKeys(x: unknown, path: string, out: string[]): void {
  if (Array.isArray(x)) x.forEach((v, i) => numericKeys(v, `${path}[${i}]`, out));
  else if (x !== null && typeof x === "object") for (const [k, v] of Object.entries(x)) numericKeys(v, path ? `${path}.${k}` : k, out);
  else if (typeof x === "number") out.push(path);
}

describe("plan --json: every number's key names its unit", () => {
  for (const file of demoJobFiles()) {
    it(file.split("/").pop()!, () => {
      const j = planJson(planJob(loadJobFile(file)));
      const bad: string[] = [];
      numericKeys(j, "", bad);
      const offenders = bad.filter((p) => {
        const key = p
          .replace(/\[\d+\]$/, "")
          .split(".")
          .pop()!
          .replace(/\[\d+\]/g, "");
        if (p.startsWith("rejections.") || p.startsWith("winding.equalizer_groups")) return false; // counts, bar numbers
        return !UNIT_SUFFIX.test(key) && !EXEMPT.has(key);
      });
      expect(offenders).toEqual([]);
    });
  }
});

describe("goal figures in goal.unit everywhere", () => {
  for (const file of demoJobFiles()) {
    it(`${file.split("/").pop()}: the chosen candidate's achieved_value is the goal's, sensitivity rows near it`, () => {
      const j = planJson(planJob(loadJobFile(file)));
      if (j.goal.achieved_value === null) return;
      const same = j.candidates.find(
        (c) => c.turns_per_coil === j.design.turns_per_coil && c.wire === j.design.wire.label && c.strands_in_hand === j.design.strands_in_hand,
      );
      expect(same, "the chosen winding is listed").toBeDefined();
      expect(same!.achieved_value!).toBeCloseTo(j.goal.achieved_value, 6);
      for (const s of j.sensitivity) if (s.achieved_value !== null) expect(Math.abs(s.achieved_value / j.goal.achieved_value - 1)).toBeLessThan(0.6);
    });
  }
});

describe("tolerances print with the digits given", () => {
  it("0.006 prints ±0.6 %, not ±1 %", () => {
    const text = readFileSync(demoJobFiles().find((f) => f.includes("boat"))!, "utf8").replace(/tolerance: [0-9.]+/, "tolerance: 0.006");
    expect(text).toContain("tolerance: 0.006");
    const plan = planJob(loadJobText(text));
    const j = planJson(plan);
    expect(j.goal.summary).toContain("±0.6 %");
    expect(planText(plan)).toContain("±0.6 %");
  });
});
