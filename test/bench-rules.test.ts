/**
 * One set of bench rules (src/bench/rules.ts) applied by `diagnose` and `log`: the spread of the
 * bar-to-bar set against its median (±5 % widened by one meter count: common practice, no
 * published source; 10 % or more above: poor riser connection, below: shorted turns, a miscount or
 * bridged bars: US Army TM 55-2210-223-34), the level of the median against the plan, a diagnosis
 * that trusts the armature over the plan, OL/open readings, layout-only jobs.
 * Readings are made by the tests' own nodal solution (Kirchhoff), not the code under test.
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../src/cli/main.js";
import type { Io } from "../src/cli/io.js";
import {
  DEFAULT_METER_RESOLUTION_OHM,
  FOUR_WIRE_FACTOR,
  SPREAD,
  checkLabel,
  judgeLevel,
  judgeSpread,
  levelBounds,
  median,
  needsFourWire,
} from "../src/bench/rules.js";
import { diagnose } from "../src/winding/diagnose.js";
import { layoutWinding } from "../src/winding/layout.js";
import { loadYaml } from "../src/job/load.js";
import { measuredSchema } from "../src/logbook/measured.js";
import { ROOT } from "./helpers/cli.js";
import { nodalReadings } from "./helpers/nodal.js";
import { spec } from "./helpers/winding.js";

function fakeIo(cwd = ROOT): Io & { stdout: string[]; stderr: string[] } {
  const stdout: string[] = [];
  const stderr: string[] = [];
  return { out: (s) => stdout.push(s), err: (s) => stderr.push(s), stdin: () => "", env: {}, cwd, stdout, stderr };
}

const lap12 = layoutWinding(spec({}));

describe("the rules themselves", () => {
  it("the level window's readings: expected × (1 ± window), floored at 0 Ω when one meter count exceeds the expected reading", () => {
    // 1.355 Ω expected, ±15.4 %: 1.1463 … 1.5637 Ω (arithmetic)
    const b = levelBounds(1.355, 0.154);
    expect(b.low).toBeCloseTo(1.14633, 5);
    expect(b.high).toBeCloseTo(1.56367, 5);
    // 0.09 Ω expected on a 0.1 Ω meter: 5 % + 3 % + 0.1/0.09 = 119 %: from 0 Ω, never a negative resistance
    const w = judgeLevel([0.1], [0.09], true, 0.5e-3, 0.1).window_fraction;
    expect(w).toBeGreaterThan(1);
    expect(levelBounds(0.09, w).low).toBe(0);
    expect(levelBounds(0.09, w).high).toBeCloseTo(0.09 * (1 + w), 12);
  });
  it("the median, not the mean: one bridged pair among 1.33 Ω readings leaves the good pairs passing", () => {
    const r = new Array(12).fill(1.33);
    r[4] = 0.02;
    const s = judgeSpread(r, new Array(12).fill(1), 0.001);
    expect(s.median_ohm).toBe(1.33);
    expect(s.rows.filter((x) => !x.pass).map((x) => x.index)).toEqual([4]);
    expect(s.rows[4].side).toBe("near_zero");
    // the mean (1.22 Ω) would have put every good pair 9 % "above the average"
    expect(median([3, 1, 2])).toBe(2);
    expect(median([4, 1, 2, 3])).toBe(2.5);
  });

  it("±5 % of the median widened by one count; 10 % or more above is a riser, below a short or miscount (TM 55-2210-223-34)", () => {
    const res = 0.01;
    const s = judgeSpread([1, 1, 1, 1.059, 0.941, 1.1, 0.93, 1], new Array(8).fill(1), res);
    expect(s.rows[0].window_fraction).toBeCloseTo(SPREAD.fraction + res / 1, 12);
    expect(s.rows.map((x) => x.pass)).toEqual([true, true, true, true, true, false, false, true]);
    expect(s.rows[5].side).toBe("riser");
    expect(s.rows[5].suggests).toMatch(/poor coil-to-riser connection.*TM 55-2210-223-34/);
    expect(s.rows[6].side).toBe("low");
    expect(s.rows[6].suggests).toMatch(/shorted turns or a miscount/);
  });

  it("an open reading fails as open", () => {
    const s = judgeSpread([1, 1, Infinity, 1], [1, 1, 1, 1], 0.001);
    expect(s.rows[2]).toMatchObject({ pass: false, side: "open" });
  });

  it("the level: ±5 % calibrated, ±15 % from the model, plus the conductor tolerance and one count", () => {
    const E = new Array(5).fill(1);
    const cal = judgeLevel(
      E.map(() => 1.1),
      E,
      true,
      0.5e-3,
      0.001,
    );
    const mod = judgeLevel(
      E.map(() => 1.1),
      E,
      false,
      0.5e-3,
      0.001,
    );
    // 0.5 mm wire: diameter tolerance max(0.002, 0.001 + 0.005) = 0.006 mm → 2·0.006/0.5 = 2.4 % in resistance (from memory)
    expect(cal.window_fraction).toBeCloseTo(0.05 + 0.024 + 0.001, 12);
    expect(mod.window_fraction).toBeCloseTo(0.15 + 0.024 + 0.001, 12);
    expect(cal.pass).toBe(false);
    expect(mod.pass).toBe(true);
  });

  it("four-wire advice below forty counts of the meter (common practice); 0.1 Ω when nothing says", () => {
    expect(FOUR_WIRE_FACTOR).toBe(40);
    expect(DEFAULT_METER_RESOLUTION_OHM).toBe(0.1);
    expect(needsFourWire(3.9, 0.1)).toBe(true);
    expect(needsFourWire(4.1, 0.1)).toBe(false);
  });

  it("readings are named r1 … rC for people; JSON paths count from 0", () => {
    expect(checkLabel("bar_to_bar[6]")).toBe("r7");
    expect(checkLabel("terminal_resistance")).toBe("terminal_resistance");
  });
});

describe("diagnosis that trusts the armature (issue 10 item 9)", () => {
  it("(a) every coil 7× the plan and one at 80 % of the others: the factor is said once, the one coil is found, none is OPEN", () => {
    const E = new Array(12).fill(1);
    const R = E.map((x) => 7 * x);
    R[4] = 0.8 * 7;
    const d = diagnose(lap12, nodalReadings(lap12, R), E, 40, undefined, { resolutionOhm: 0.001 });
    expect(d.coils.some((c) => c.verdict === "open")).toBe(false);
    expect(d.suspects.filter((s) => s.kind === "level_off_plan")).toHaveLength(1);
    const off = d.coils.filter((c) => c.verdict !== "ok").map((c) => c.index);
    expect(off).toEqual([5]);
    expect(d.coils[4].deviation_fraction).toBeCloseTo(-0.2, 9);
    expect(d.ok).toBe(false);
    expect(d.failures.map((f) => f.check)).toContain("bar_to_bar.level");
  });

  it("(b) one bridged pair (0.02 Ω among 1.33 Ω readings) makes no good pair a poor riser", () => {
    const r = new Array(12).fill(1.33);
    r[6] = 0.02;
    const d = diagnose(lap12, r, new Array(12).fill(1.33 * (12 / 11)), 30, undefined, { resolutionOhm: 0.001 });
    expect(d.suspects.some((s) => s.kind === "poor_riser_connection")).toBe(false);
    const b = d.suspects.filter((s) => s.kind === "bridged_bars");
    expect(b).toHaveLength(1);
    expect(b[0]).toMatchObject({ bars: [7, 8], coils: [7], readings: ["r7"] });
    expect(d.failures.map((f) => f.reading)).toEqual(["r7"]);
    expect(d.failures[0].coils).toEqual([7]);
  });

  it("(c) an open coil is open with no resistance, and not also a poor riser", () => {
    const E = new Array(12).fill(1);
    // coil 10 open: r10 reads the other eleven in series, the rest one coil each (Kirchhoff)
    const r = E.map((_, i) => (i === 9 ? 11 : 1));
    const d = diagnose(lap12, r, E, 30, undefined, { resolutionOhm: 0.001 });
    expect(d.coils[9]).toMatchObject({ verdict: "open", resistance_ohm: null, deviation_fraction: null });
    expect(d.suspects.some((s) => s.kind === "poor_riser_connection")).toBe(false);
    expect(d.suspects.filter((s) => s.kind === "open_coil").map((s) => s.coils)).toEqual([[10]]);
    expect(d.failures.map((f) => f.reading)).toEqual(["r10"]);
  });

  it("(e) an OL reading is an open circuit: coil named, status from the reading", () => {
    const E = new Array(12).fill(1);
    const r = nodalReadings(lap12, E);
    r[2] = Infinity;
    const d = diagnose(lap12, r, E, 30, undefined, { resolutionOhm: 0.001 });
    expect(d.ok).toBe(false);
    expect(d.failures[0]).toMatchObject({ check: "bar_to_bar[2]", reading: "r3", reading_ohm: null, coils: [3] });
  });
});

describe("diagnose and plan from the command line", () => {
  const dir = mkdtempSync(join(tmpdir(), "armwind-bench-"));
  const layoutOnly = join(dir, "triage.yaml");
  writeFileSync(layoutOnly, "version: 1\nid: triage-0001\narmature: { slots: 12, bars: 12, field_poles: 2 }\nwinding: { style: lap, span: 5 }\n");

  it("(d) a layout-only job: readings judged against their own median, the coil behind the outlier named, exit 4", async () => {
    const R = new Array(12).fill(2);
    R[8] = 1.6; // coil 9 at 80 %
    const bars = nodalReadings(lap12, R)
      .map((x) => x.toPrecision(12))
      .join(",");
    const io = fakeIo();
    const status = await main(["diagnose", layoutOnly, "--bars", bars, "--resolution", "0.001 ohm", "--json"], io);
    const out = JSON.parse(io.stdout.join(""));
    expect(status).toBe(4);
    expect(out.ok).toBe(false);
    expect(out.errors).toEqual([]);
    expect(out.turns_per_coil).toBeNull();
    expect(out.coils.filter((c: { verdict: string }) => c.verdict !== "ok").map((c: { index: number }) => c.index)).toEqual([9]);
    expect(out.coils[8].expected_ohm).toBeNull();
    expect(out.failures.some((f: { coils: number[] }) => f.coils.includes(9))).toBe(true);
  });

  it("(d) plan given a layout-only job: one located line, exit 1", async () => {
    const io = fakeIo();
    expect(await main(["plan", layoutOnly], io)).toBe(1);
    expect(io.stderr).toHaveLength(1);
    expect(io.stderr[0]).toMatch(/triage\.yaml:1:1: .*only the layout.*\[layout_only_job\]/);
  });

  it("a diagnose run with no readings: one line, exit 1", async () => {
    const io = fakeIo();
    expect(await main(["diagnose", layoutOnly], io)).toBe(1);
    expect(io.stderr).toHaveLength(1);
    expect(io.stderr[0]).toMatch(/give the readings one way/);
  });

  it("(e) OL and open in --bars and in a measured file", async () => {
    const io = fakeIo();
    const status = await main(["diagnose", layoutOnly, "--bars", "2,2,2,OL,2,2,2,2,2,2,2,2", "--json"], io);
    expect(status).toBe(4);
    const out = JSON.parse(io.stdout.join(""));
    expect(out.readings[3].reading_ohm).toBeNull();
    expect(out.failures[0].reading).toBe("r4");
    const m = loadYaml("version: 1\njob: x\ndate: 2026-12-02\ntemperature: 20 C\nbar_to_bar: [1.3, OL, open, 1.3 ohm]\n", "m.yaml", measuredSchema).value;
    expect(m.bar_to_bar).toEqual([1.3, Infinity, Infinity, 1.3]);
  });
});

describe("the robot demo's 1-bar brushes on 3 bars (issue 10 item 1)", () => {
  it("plan --json: terminal_min_ohm null and a brush_short warning; never 0 Ω", async () => {
    const io = fakeIo();
    await main(["plan", join(ROOT, "jobs/robot-3slot-0007.yaml"), "--no-learn", "--json"], io);
    const out = JSON.parse(io.stdout.join(""));
    expect(out.resistance.terminal_min_ohm).toBeNull();
    expect(out.warnings.map((w: { code: string }) => w.code)).toContain("brush_short");
  });
});
