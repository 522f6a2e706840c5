/**
 * The series model behind the one evaluation of a winding (src/design/evaluate.ts with
 * src/design/series.ts `seriesPhysics`): the sweep ranks series windings with series figures, so
 * `goal: duty` and `goal: convert` on a series motor are solved by the sweep, and the figures of a
 * winding come out of `evaluateWinding` like any other motor's.
 *
 * Hand-worked checks name their source: S. J. Chapman, Electric Machinery Fundamentals, 4th ed.
 * (McGraw-Hill, 2005), §9.6 "The series DC motor" (E = K·φ·ω, φ = c·I in the linear range,
 * V = E + I·(R_A + R_S), τ = K·c·I²) — section number from memory. Every motor here is invented.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { buildContext } from "../src/design/context.js";
import { calibrateOriginal } from "../src/design/calibration.js";
import { evaluateWinding, makeEvaluator } from "../src/design/evaluate.js";
import { planJob } from "../src/design/plan.js";
import { sig } from "../src/format/number.js";
import { loadYaml } from "../src/job/load.js";
import { compareReadings } from "../src/logbook/compare.js";
import { measuredSchema } from "../src/logbook/measured.js";
import { buildRecord } from "../src/logbook/record.js";
import { predictWound } from "../src/logbook/predict.js";
import { ROOT, loadJobText, runMain } from "./helpers/cli.js";
import { drillConvertText, drillText } from "./helpers/drill.js";

const RPM = (2 * Math.PI) / 60;

// Invented 24 V series DC motor on the drill's armature, wound 7 turns of 0.53 mm: armature 0.5 Ω (measured;
// with no old wire weighed it calibrates the turn length, so the plan's own resistance of the original winding is 0.5 Ω) and field 0.3 Ω, at 20 °C and used at 20 °C
// (hot_temperature 20 C: hot = cold), brush drop 2 V as given, one no-load test.
function dcSeries(target: string): string {
  return drillText
    .replace(/field_winding:[\s\S]*?turns_per_pole: 110\n/, "field_winding:\n  resistance: { value: 0.3 ohm, at: 20 C }\n  turns_per_pole: 110\n")
    .replace("  brushes: { count: 2, width_bars: 1.5, material: carbon }", "  brushes: { count: 2, width_bars: 1.5, material: carbon }\n  brush_drop: 2 V")
    .replace("terminal_resistance: { value: 7.5 ohm, at: 22 C }", "terminal_resistance: { value: 0.5 ohm, at: 20 C }")
    .replace(/  wire_mass: .*\n/, "")
    .replace("  turns: 30\n  wire: 0.28 mm\n", "  turns: 7\n  wire: 0.53 mm\n")
    .replace("wire_stock:\n", "wire_stock:\n  - 0.53 mm grade 2\n  - 0.56 mm grade 2\n  - 0.50 mm grade 2\n")
    .replace(
      /  tests:\n[\s\S]*?gear_ratio: 8.5 }\n/,
      "  tests:\n    - { supply: 24 V, no_load_current: 2 A, no_load_speed: 2864.7889756541163 rpm, temperature: 20 C }\n",
    )
    .replace("supply: { value: 230 V, kind: ac, frequency: 50 Hz }\n  goal: restore", target)
    .replace("hot_temperature: 100 C", "hot_temperature: 20 C")
    .replace("    space_fill: 0.70\n", "    space_fill: 0.70\n    current_density: none\n");
}

describe("a DC series motor through evaluateWinding, worked by hand (Chapman 4th ed. §9.6)", () => {
  // No-load 24 V, 2 A at 300 rad/s (2864.79 rpm) through R = 0.5 + 0.3 = 0.8 Ω, V_b = 2 V:
  //   E = 24 − 2 × 0.8 − 2 = 20.4 V, ψ = 20.4/300 = 0.068 V·s/rad, k = ψ/I = 0.034 V·s/(A·rad);
  //   loss torque (one test, held constant) ψ·I = 0.136 N·m.
  // At 4.76 N·m: I = √((4.76 + 0.136)/0.034) = √144 = 12 A, ω = (24 − 2 − 12 × 0.8)/(0.034 × 12) = 12.4/0.408
  //   = 30.392 rad/s (290.22 rpm); input 24 × 12 = 288 W, output 4.76 × 30.392 = 144.67 W.
  const job = loadJobText(dcSeries("supply: 24 V\n  goal: duty\n  duty: { torque: 4.76 N m, speed: 290 rpm }"));
  const ctx = buildContext(job);
  const { calibration } = calibrateOriginal(ctx);
  const original = { turns: 7, wire: ctx.original.wire, strands: 1 };

  it("the sweep's figure for the original winding is the hand-worked duty speed", () => {
    const ev = makeEvaluator(ctx, calibration);
    // the original winding's own resistance is the measured 0.5 Ω (the turn length is calibrated on it)
    const c = ev.evaluate(original.turns, original.wire, original.strands);
    expect(c.terminal_ohm).toBeCloseTo(0.5, 3);
    const full = evaluateWinding(ctx, calibration, original, "full", { measuredTerminal20: 0.5 });
    expect(full.duty!.current).toBeCloseTo(12, 6);
    expect(full.duty!.speed).toBeCloseTo(12.4 / 0.408, 6);
    expect(full.duty!.input_w).toBeCloseTo(288, 6);
    expect(full.duty!.output_w).toBeCloseTo(4.76 * (12.4 / 0.408), 6);
    expect(full.motor.series!.k).toBeCloseTo(0.034, 9);
    expect(full.stall_current_hot).toBeNull();
  });

  it("1.2 × the armature turns scales k by 1.2 with the field unchanged (the EMF equation: k ∝ armature conductors)", () => {
    // 10 → 12 turns a coil: k 0.034 × 10/7 → 0.034 × 12/7, a ratio of 1.2
    const a = evaluateWinding(ctx, calibration, { ...original, turns: 10 }, "full");
    const b = evaluateWinding(ctx, calibration, { ...original, turns: 12 }, "full");
    expect(a.motor.series!.k).toBeCloseTo((0.034 * 10) / 7, 9);
    expect(b.motor.series!.k! / a.motor.series!.k!).toBeCloseTo(1.2, 12);
    expect(b.motor.series!.fieldOhm).toBe(a.motor.series!.fieldOhm);
    expect(b.motor.series!.fieldOhm).toBeCloseTo(0.3, 12);
  });

  it("goal duty is solved by the sweep: the turns count whose best winding comes nearest 290 rpm, not the most copper", () => {
    const plan = planJob(job);
    expect(plan.warnings.map((w) => w.code)).not.toContain("goal_uncalibrated");
    expect(plan.goal.achieved).toBe(plan.duty!.speed);
    // within the ±3 % band, and every listed candidate that meets it lies in the band too
    expect(Math.abs(plan.goal.error_fraction!)).toBeLessThanOrEqual(0.03 + 1e-12);
    for (const c of plan.candidates.filter((c) => c.meets_goal)) expect(Math.abs(c.error!)).toBeLessThanOrEqual(0.03 + 1e-12);
    // the series section shows the same winding's figures at the duty torque (the rated torque here)
    expect(plan.series!.ratedSource).toBe("duty");
    expect(plan.series!.rewound.rated!.speed).toBeCloseTo(plan.duty!.speed, 9);
  });
});

describe("goal duty on the drill (a universal motor): the sweep ranks by the series model's speed at the torque", () => {
  it("a faster duty than the original's rated point takes fewer turns", () => {
    const plan = planJob(loadJobText(drillText.replace("goal: restore", "goal: duty\n  duty: { torque: 0.26 N m, speed: 16000 rpm }")));
    expect(plan.feasible).toBe(true);
    expect(plan.goal.kind).toBe("duty");
    expect(plan.design.turns).toBeLessThan(30);
    expect(plan.duty!.speed / RPM).toBeGreaterThan(16000 * 0.97);
    expect(plan.duty!.speed / RPM).toBeLessThan(16000 * 1.03);
    // the original at 30 turns runs slower at about that torque (its nameplate: 13 600 rpm at 0.262 N·m)
    expect(plan.original_duty!.speed / RPM).toBeLessThan(15000);
  });
});

describe("goal convert is solved by the sweep: the original's rated speed at its rated torque on the new supply", () => {
  const plan = planJob(loadJobText(drillConvertText));
  it("the goal is the speed in rpm, and the chosen winding's speed at the rated torque is the report's", () => {
    expect(plan.goal.kind).toBe("convert");
    expect(plan.goal.target).toBeCloseTo(1600 * 8.5 * RPM, 9); // the nameplate's motor speed
    expect(plan.goal.achieved).toBeCloseTo(plan.series!.rewound.rated!.speed, 9);
    expect(plan.series!.rewound.supply).toEqual({ volts: 120, frequency: 60 });
    expect(plan.series!.original.supply).toEqual({ volts: 230, frequency: 50 });
  });
  it("the turns count nearest the goal is chosen: one turn more or less comes no nearer", () => {
    const err = (turns: number) => {
      const ev = makeEvaluator(buildContext(plan.job), plan.calibration);
      return Math.abs(ev.evaluate(turns, plan.design.wire, plan.design.strands).error ?? Infinity);
    };
    const here = Math.abs(plan.goal.error_fraction!);
    expect(here).toBeLessThanOrEqual(err(plan.design.turns - 1) + 1e-12);
    expect(here).toBeLessThanOrEqual(err(plan.design.turns + 1) + 1e-12);
    // about 120/230 of the turns (a little fewer: the 2 V brush drop is a larger share of 120 V)
    expect(plan.design.turns).toBeGreaterThanOrEqual(14);
    expect(plan.design.turns).toBeLessThanOrEqual(16);
  });
});

describe("the terminal plan text has a series block: original against new, '—' for unknowns, no stall figure at mains", () => {
  it("the drill demo: k, the rated-load point, efficiency and the locked-rotor current at the reduced voltage", async () => {
    const r = await runMain(["plan", join(ROOT, "jobs/drill-lap-0112.yaml")]);
    expect(r.status).toBe(0);
    const plan = planJob(loadJobText(drillText));
    const sp = plan.series!;
    const block = r.stdout.slice(r.stdout.indexOf("Series motor at 230 V 50 Hz AC"), r.stdout.indexOf("Candidates:"));
    expect(block).toMatch(/the rated torque from the nameplate/);
    // the same numbers as the plan, as the card prints them (3 significant figures)
    expect(block).toMatch(new RegExp(`k \\(series field\\), mV·s/\\(A·rad\\) +${sig(sp.original.k! * 1e3)} +${sig(sp.rewound.k! * 1e3)}`));
    expect(block).toMatch(new RegExp(`at rated load ${sig(sp.ratedTorque! * 1e3)} mN·m: speed, rpm`));
    expect(block).toMatch(new RegExp(`current, A +${sig(sp.original.rated!.current)} +${sig(sp.rewound.rated!.current)}`));
    expect(block).toMatch(/efficiency +\d+\.\d %/);
    expect(block).toMatch(
      new RegExp(`locked rotor at 40 V 50 Hz AC, cold, A +${sig(sp.original.lockedRotorCurrent!)} +${sig(sp.rewound.lockedRotorCurrent!)}`),
    );
    expect(block).toMatch(/locked-rotor check at 40 V 50 Hz AC, never at mains/);
    expect(r.stdout).not.toMatch(/stall current|stall torque|no-load speed rpm/);
  });

  it("a series job with its field but nothing running: k and the rated point are '—', the locked-rotor check stays", async () => {
    const text = drillText.replace(/  nameplate: .*\n/, "").replace(/  tests:\n(    - .*\n)+/, "");
    const r = await runMain(["plan", "-"], { input: text });
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/the rated torque not known/);
    expect(r.stdout).toMatch(/k \(series field\), mV·s\/\(A·rad\) +— +—/);
    expect(r.stdout).toMatch(/rated load \(not known\): speed, rpm +— +—/);
    expect(r.stdout).toMatch(/locked rotor at 40 V 50 Hz AC, cold, A +\d/);
    expect(r.stdout).not.toMatch(/stall current/);
  });

  it("a series job with no field_winding: no running figures, and says why", async () => {
    const r = await runMain(["plan", "-"], { input: drillText.replace(/field_winding:[\s\S]*?turns_per_pole: 110\n/, "") });
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/Series motor at 230 V AC: no running figures \(the job does not describe the field: field_winding\)/);
    expect(r.stdout).not.toMatch(/stall current/);
  });
});

describe("unknown is null: a series motor calibrated on its nameplate alone has no known losses", () => {
  it("its rated point and curve carry no efficiency (null in the plan, '—' on the terminal), the speeds and currents stay", async () => {
    const text = drillText.replace(/  tests:\n(    - .*\n)+/, "");
    const plan = planJob(loadJobText(text));
    const sp = plan.series!;
    expect(sp.original.rated!.current).toBeGreaterThan(2);
    expect(sp.original.rated!.efficiency).toBeNull();
    expect(sp.rewound.curve.every((p) => p.efficiency === null)).toBe(true);
    expect(sp.noLoad?.efficiency ?? null).toBeNull();
    const r = await runMain(["plan", "-"], { input: text });
    expect(r.stdout).toMatch(/ {3}efficiency +— +—/);
    const j = JSON.parse((await runMain(["plan", "-", "--json"], { input: text })).stdout);
    expect(j.motor.series.rated.efficiency).toBeNull();
    expect(j.motor.series.rated.current_a).toBeGreaterThan(2);
  });
});

describe("log judges a series motor's locked-rotor reading against the card's figure, not (V − V_b)/R_a", () => {
  const job = loadJobText(drillText);
  const plan = planJob(job);
  const p = predictWound(job, plan, undefined);
  const readings = readFileSync(join(ROOT, "jobs/measured/drill-lap-0112.yaml"), "utf8");
  const measured = (extra: string) => loadYaml(`${readings}${extra}`, "m.yaml", measuredSchema).value;
  it("at the check voltage and 20 °C the expected current is the card's (the series model through armature and field with their reactance)", () => {
    const m = measured("stall: { supply: 40 V, current: 0.98 A }\n");
    const cold = compareReadings(p, { ...m, temperature: 20 }, true).comparison.checks.find((c) => c.check === "stall.current")!;
    expect(cold.predicted_value).toBeCloseTo(plan.series!.rewound.lockedRotorCurrent!, 12);
    expect(cold.verdict).toBe("ok");
    // the armature alone would have said (40 − 2)/7.45 ≈ 5.1 A
    expect(cold.predicted_value!).toBeLessThan(1.2);
  });
  it("a universal motor's brief no-load run is judged against the card's figure", () => {
    const nl = plan.series!.noLoad!;
    const m = measured(`no_load: { supply: 230 V, current: ${nl.current} A, speed: ${(nl.speed * 60) / (2 * Math.PI)} rpm }\n`);
    const checks = compareReadings(p, { ...m, temperature: 20 }, true).comparison.checks;
    const speed = checks.find((c) => c.check === "no_load.speed")!;
    expect(speed.predicted_value).toBeCloseTo((nl.speed * 60) / (2 * Math.PI), 6);
    expect(speed.verdict).toBe("ok");
    expect(checks.find((c) => c.check === "no_load.current")!.predicted_value).toBeCloseTo(nl.current, 9);
  });
  it("the logbook record holds no stall figure at the mains supply", () => {
    const rec = buildRecord(job, plan, p, measured(""), "2026-12-02T00:00:00.000Z");
    expect(rec.predicted.stall_current_a).toBeNull();
  });
});
