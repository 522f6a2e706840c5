/**
 * SI until the edge (docs/contracts.md, "--json keys"): every number of `plan --json`, `log --json`,
 * `diagnose --json` and `history --json` carries its unit in its key, the goal's figures are in `goal.unit` wherever they appear (the goal, the
 * candidates, the sensitivity rows), and a tolerance prints with the digits it was given.
 */
import { describe, expect, it } from "vitest";
import { planJob } from "../src/design/plan.js";
import { planJson } from "../src/cli/plan-json.js";
import { planText } from "../src/cli/plan-text.js";
import { ROOT, demoJobFiles, loadJobFile, loadJobText, runMain } from "./helpers/cli.js";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

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
  // log, diagnose and history (docs/contracts.md "--json keys"): counts, bar and coil numbers, the record's format version,
  // the insulation reading in MΩ as the measured file names it, and the temperature correction 1 + α(t − 20), a ratio
  "strands",
  "original_turns",
  "learning_records",
  "bar",
  "next_bar",
  "coils",
  "version",
  "megohm",
  "correction_factor",
]);

/** The numeric paths of a JSON value whose last key names no unit and is not exempt (`*_value` keys carry a sibling `unit`). */
function offendersOf(j: unknown): string[] {
  const all: string[] = [];
  numericKeys(j, "", all);
  return all.filter((p) => {
    const key = p
      .replace(/\[\d+\]$/, "")
      .split(".")
      .pop()!
      .replace(/\[\d+\]/g, "");
    if (p.startsWith("rejections.") || p.startsWith("winding.equalizer_groups")) return false; // counts, bar numbers
    return !UNIT_SUFFIX.test(key) && !EXEMPT.has(key) && !key.endsWith("_value");
  });
}

function numericKeys(x: unknown, path: string, out: string[]): void {
  if (Array.isArray(x)) x.forEach((v, i) => numericKeys(v, `${path}[${i}]`, out));
  else if (x !== null && typeof x === "object") for (const [k, v] of Object.entries(x)) numericKeys(v, path ? `${path}.${k}` : k, out);
  else if (typeof x === "number") out.push(path);
}

describe("plan --json: every number's key names its unit", () => {
  for (const file of demoJobFiles()) {
    it(file.split("/").pop()!, () => {
      const offenders = offendersOf(planJson(planJob(loadJobFile(file))));
      expect(offenders).toEqual([]);
    });
  }
});

describe("log, diagnose and history --json: every number's key names its unit too", () => {
  for (const file of demoJobFiles()) {
    it(file.split("/").pop()!, async () => {
      const id = file
        .split("/")
        .pop()!
        .replace(/\.yaml$/, "");
      const measured = join(ROOT, "jobs/measured", `${id}.yaml`);
      const logbook = mkdtempSync(join(tmpdir(), "armwind-units-"));
      const outputs = [
        await runMain(["diagnose", file, "--measured", measured, "--json", "--no-learn"], { cwd: ROOT }),
        await runMain(["log", file, "--measured", measured, "--json", "--no-learn", "--logbook", logbook], { cwd: ROOT }),
        await runMain(["history", "--json", "--logbook", logbook], { cwd: ROOT }),
        await runMain(["history", "--json"], { cwd: ROOT }),
      ];
      for (const o of outputs) {
        const j = JSON.parse(o.stdout);
        expect(j.errors).toEqual([]);
        expect(offendersOf(j)).toEqual([]);
      }
    });
  }
});

describe("every --json output has ok and errors, ok exactly when the exit status is 0 (docs/contracts.md)", () => {
  it("plan, check, card, wires, new, log, diagnose and history, on a job that meets its goal and one that does not", async () => {
    const dir = mkdtempSync(join(tmpdir(), "armwind-shape-"));
    const boat = join(ROOT, "jobs/boat-7slot-0020.yaml");
    // the same boat asked for a no-load speed no stock wire reaches: exit 2, ok false
    const far = join(dir, "far.yaml");
    writeFileSync(
      far,
      readFileSync(boat, "utf8")
        .replace(/^id: .*$/m, "id: boat-far")
        .replace(/^(\s+)goal: .*$/m, "$1goal: no_load_speed\n$1no_load_speed: 900000 rpm"),
    );
    const runs: [string[], number][] = [
      [["plan", boat, "--json"], 0],
      [["plan", far, "--json"], 2],
      [["check", far, "--json"], 2],
      [["card", far, "--json", "-o", join(dir, "far.pdf")], 2],
      [["wires", "--json"], 0],
      [["new", "job", "--style", "lap", "--json", "-o", join(dir, "new.yaml")], 0],
      [["new", "measured", boat, "--json", "-o", join(dir, "m.yaml")], 0],
      [["log", boat, "--measured", join(ROOT, "jobs/measured/blind-motor-0031-coil3-short.yaml"), "--json", "--logbook", dir], 1],
      [
        [
          "diagnose",
          join(ROOT, "jobs/blind-motor-0031.yaml"),
          "--measured",
          join(ROOT, "jobs/measured/blind-motor-0031-coil3-short.yaml"),
          "--json",
          "--no-learn",
        ],
        4,
      ],
      [["history", "--json", "--logbook", dir], 0],
    ];
    for (const [args, status] of runs) {
      const r = await runMain(args, { cwd: dir });
      expect(r.status, args.join(" ")).toBe(status);
      const j = JSON.parse(r.stdout);
      expect(j.ok, args.join(" ")).toBe(status === 0);
      expect(Array.isArray(j.errors), args.join(" ")).toBe(true);
      expect(j.errors.length > 0, args.join(" ")).toBe([1, 3, 70].includes(status));
      if (status === 4) expect(j.failures.length).toBeGreaterThan(0);
    }
  });
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
