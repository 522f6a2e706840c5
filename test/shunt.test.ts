/**
 * Shunt fields: the constant-field model (docs/contracts.md, "Steady state") with the field across
 * the supply, so the no-load test's current is the armature's plus the field's, I_f = V/R_f, and Ke
 * is fitted on the armature's alone (docs "Calibration of Ke": "less a shunt field's current").
 * Source: the shunt DC machine of any electrical-machines textbook (I_L = I_A + I_F, I_F = V_T/R_F;
 * e.g. S. J. Chapman, Electric Machinery Fundamentals, 4th ed. (2005), ch. 9, from memory), worked
 * by hand below. The motor is the blind demo's armature with an invented shunt field.
 */
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { planJob } from "../src/design/plan.js";
import { atSpeed, noLoad, peakEfficiency, summarize, type MotorModel } from "../src/motor/model.js";
import { ROOT, loadJobText, runMain } from "./helpers/cli.js";

const blind = readFileSync(join(ROOT, "jobs/blind-motor-0031.yaml"), "utf8");
const RPM = (2 * Math.PI) / 60;

/** The blind armature as a shunt motor: one no-load test of 0.28 A in all at 12 V, everything read at 20 °C, no generator test. */
function shunt(field: string, test = "{ supply: 12 V, no_load_current: 0.28 A, no_load_speed: 9800 rpm, temperature: 20 C }", kind = "shunt"): string {
  return blind
    .replace("field: permanent_magnet", `field: ${kind}`)
    .replace("winding:\n  style: tooth", `${field}winding:\n  style: tooth`)
    .replace(/    - \{ supply: 12 V, no_load_current: 0.18 A.*\n/, `    - ${test}\n`)
    .replace(/  generator: .*\n/, "")
    .replace("terminal_resistance: { value: 1.57 ohm, at: 21 C }", "terminal_resistance: { value: 1.57 ohm, at: 20 C }")
    .replace("goal: no_load_speed\n  no_load_speed: 9000 rpm", "goal: restore");
}

// By hand: R_f = 120 Ω, I_f = 12/120 = 0.1 A, I_a = 0.28 − 0.1 = 0.18 A;
//   E = 12 − 0.2 − 0.18 × 1.57 = 11.5174 V, ω = 9800 rpm = 1026.254 rad/s, Ke = 11.5174/1026.254 = 0.0112228 V·s/rad.
// On the whole 0.28 A (a permanent-magnet motor): E = 12 − 0.2 − 0.28 × 1.57 = 11.3604 V, Ke = 0.0110698 V·s/rad.
const KE_SHUNT = (12 - 0.2 - 0.18 * 1.57) / (9800 * RPM);
const KE_WHOLE = (12 - 0.2 - 0.28 * 1.57) / (9800 * RPM);

describe("a shunt field is taken off the no-load test before Ke is fitted (worked by hand)", () => {
  it("from field_winding's resistance: I_f = V/R_f", () => {
    const plan = planJob(loadJobText(shunt("field_winding:\n  resistance: { value: 120 ohm, at: 20 C }\n")));
    expect(plan.calibration.ke).toBeCloseTo(KE_SHUNT, 10);
    expect(plan.calibration.shunt_field_ohm).toBe(120);
    // the original's predicted no-load current is what the meter at the terminals read: armature 0.18 A + field 0.1 A
    expect(plan.original_motor.noLoadCurrent).toBeCloseTo(0.28, 9);
    expect(plan.original_motor.noLoadSpeed! / RPM).toBeCloseTo(9800, 6);
    const w = plan.warnings.find((x) => x.code === "shunt_field")!;
    expect(w.message).toMatch(/120\.0 Ω at 20 °C takes 0\.100 A at 12 V/);
    expect(plan.warnings.map((x) => x.code)).not.toContain("field_current_missing");
  });

  it("from the test's field_current: the same Ke, and the field's resistance V/I_f", () => {
    const plan = planJob(loadJobText(shunt("", "{ supply: 12 V, no_load_current: 0.28 A, field_current: 0.1 A, no_load_speed: 9800 rpm, temperature: 20 C }")));
    expect(plan.calibration.ke).toBeCloseTo(KE_SHUNT, 10);
    expect(plan.calibration.shunt_field_ohm).toBeCloseTo(120, 9);
    expect(plan.original_motor.noLoadCurrent).toBeCloseTo(0.28, 9);
  });

  it("with neither, the whole current is the armature's and the plan says so; never silently a permanent magnet's figures", () => {
    const plan = planJob(loadJobText(shunt("")));
    expect(plan.calibration.ke).toBeCloseTo(KE_WHOLE, 10);
    const codes = plan.warnings.map((x) => x.code);
    expect(codes).toContain("field_current_missing");
    expect(codes).toContain("shunt_field");
    // the permanent-magnet motor with the same readings has neither warning
    const pm = planJob(loadJobText(shunt("", undefined, "permanent_magnet")));
    expect(pm.calibration.ke).toBeCloseTo(KE_WHOLE, 10);
    expect(pm.warnings.map((x) => x.code)).not.toContain("shunt_field");
  });
});

/**
 * A shunt field's copper loss is a loss: the input at the terminals is V·(I_a + I_f) and every
 * efficiency is the shaft output over it. Source: the shunt DC motor's power flow (I_L = I_A + I_F,
 * P_in = V_T·I_L, the field's copper loss V_F·I_F among the electrical losses, η = P_out/P_in;
 * S. J. Chapman, Electric Machinery Fundamentals, 4th ed. (2005), ch. 9, "DC motor power flow and
 * losses", from memory). Numbers worked by hand below.
 */
describe("a shunt field's loss is in every efficiency and input (worked by hand)", () => {
  // A round-number motor: Ke 0.01 V·s/rad, R 1 Ω, no brush drop, T_c 1 mN·m, B 0, at 10 V, field 100 Ω.
  //   I_f = 10/100 = 0.1 A. No load: ω0 = (0.01·10 − 0.001·1)/0.01² = 990 rad/s, I_a0 = T_c/Ke = 0.1 A,
  //   at the terminals 0.1 + 0.1 = 0.2 A.
  //   Peak efficiency with x = I_a·R, c = I_f·R = 0.1 V, α = Ke/R = 0.01, β = T_c = 0.001, β/α = 0.1:
  //   (x + c)² = (V' + c)(β/α + c) = 10.1 × 0.2 = 2.02, x + c = 1.4212670, x = 1.3212670 → I_a = 1.3212670 A;
  //   ω = (10 − 1.3212670)/0.01 = 867.87330 rad/s, T = 0.01 × 1.3212670 − 0.001 = 0.012212670 N·m,
  //   P_out = 0.012212670 × 867.87330 = 10.599051 W, P_in = 10 × (1.3212670 + 0.1) = 14.212670 W,
  //   η = 10.599051 / 14.212670 = 0.745747.
  //   Without the field (a permanent magnet): I = √(I0·I_stall) = √(0.1 × 10) = 1 A, ω = 900 rad/s,
  //   T = 0.009 N·m, P_out = 8.1 W, P_in = 10 W, η = 0.81; with the field at that same 1 A: 8.1/11 = 0.7364,
  //   below 0.7457, as the peak must be.
  const m: MotorModel = { ke: 0.01, resistance: 1, brushDrop: 0, loss: { tc: 0.001, b: 0 }, field: "constant", fieldOhm: 100 };

  it("the model: no-load current at the terminals, peak efficiency and its current", () => {
    const nl = noLoad(m, 10);
    expect(nl.speed).toBeCloseTo(990, 9);
    expect(nl.current).toBeCloseTo(0.1, 12);
    expect(nl.terminalCurrent).toBeCloseTo(0.2, 12);
    const pe = peakEfficiency(m, 10);
    expect(pe.current).toBeCloseTo(1.321267, 6);
    expect(pe.speed).toBeCloseTo(867.8733, 4);
    expect(pe.efficiency).toBeCloseTo(0.745747, 6);
    const p = atSpeed(m, 10, 900);
    expect(p.inputW).toBeCloseTo(11, 9);
    expect(p.efficiency).toBeCloseTo(8.1 / 11, 9);
    const pm = peakEfficiency({ ...m, fieldOhm: null }, 10);
    expect(pm.current).toBeCloseTo(1, 9);
    expect(pm.efficiency).toBeCloseTo(0.81, 9);
    expect(summarize(m, 10).noLoadCurrent).toBeCloseTo(0.2, 12);
  });

  // The blind armature as a shunt motor (field 120 Ω at 20 °C) at a duty of 4 mN·m, the original
  // winding at its measured 1.57 Ω (20 °C), hot at 80 °C: factor 1 + 0.00393 × 60 = 1.2358 (IEC 60028).
  //   Ke = 0.011222762 V·s/rad (above), T_c = Ke × 0.18 A = 0.0020201 N·m, B = 0, R_hot = 1.940206 Ω.
  //   I_a = (T + T_c)/Ke = 0.004/0.011222762 + 0.18 = 0.536418 A;
  //   ω = (12 − 0.2 − 0.536418 × 1.940206)/Ke = 958.698 rad/s; P_out = 0.004 × 958.698 = 3.834791 W.
  //   The field hot: 120 × 1.2358 = 148.296 Ω, I_f = 12/148.296 = 0.0809192 A; at the terminals
  //   0.536418 + 0.0809192 = 0.617338 A, P_in = 12 × 0.617338 = 7.408053 W, η = 3.834791/7.408053 = 0.517652
  //   (the armature's alone: 3.834791/(12 × 0.536418) = 0.595740, what was printed before).
  const duty = (text: string) => text.replace("goal: restore", "goal: duty\n  duty: { torque: 4 mN m, speed: 9000 rpm }");
  const job = duty(shunt("field_winding:\n  resistance: { value: 120 ohm, at: 20 C }\n"));

  it("the plan's duty point: armature current, terminal current, input and efficiency", () => {
    const d = planJob(loadJobText(job)).original_duty!;
    expect(d.current).toBeCloseTo(0.536418, 6);
    expect(d.terminal_current!).toBeCloseTo(0.617338, 6);
    expect(d.input_w).toBeCloseTo(7.408053, 5);
    expect(d.output_w).toBeCloseTo(3.834791, 5);
    expect(d.efficiency!).toBeCloseTo(0.517652, 6);
  });

  it("every curve point and the peak count the hot field's current; text, JSON and warning say so", async () => {
    const plan = planJob(loadJobText(job));
    const If = 12 / (120 * 1.2358);
    for (const p of plan.original_motor.curve) {
      expect(p.inputW).toBeCloseTo(12 * (p.current + If), 9);
      expect(p.efficiency!).toBeCloseTo(p.outputW / p.inputW, 12);
    }
    // the peak is the curve's best or better, and below the same motor's without the field's loss
    const best = Math.max(...plan.original_motor.curve.map((p) => p.efficiency!));
    expect(plan.original_motor.peakEfficiency!).toBeGreaterThanOrEqual(best - 1e-12);
    const pm = planJob(
      loadJobText(duty(shunt("", "{ supply: 12 V, no_load_current: 0.18 A, no_load_speed: 9800 rpm, temperature: 20 C }", "permanent_magnet"))),
    );
    expect(pm.calibration.ke).toBeCloseTo(KE_SHUNT, 10);
    expect(plan.original_motor.peakEfficiency!).toBeLessThan(pm.original_motor.peakEfficiency! - 0.01);
    expect(pm.original_duty!.efficiency!).toBeCloseTo(0.59574, 5);
    expect(pm.original_duty!.terminal_current).toBeCloseTo(pm.original_duty!.current, 12);
    const w = plan.warnings.find((x) => x.code === "shunt_field")!;
    expect(w.message).toMatch(/0\.100 A at 12 V \(0\.0809 A hot\)/);
    expect(w.message).toMatch(/every efficiency include it/);
    const dir = mkdtempSync(join(tmpdir(), "armwind-shunt-"));
    writeFileSync(join(dir, "job.yaml"), job);
    const json = JSON.parse((await runMain(["plan", join(dir, "job.yaml"), "--json", "--no-learn"])).stdout);
    expect(json.duty.terminal_current_a).toBeCloseTo(json.duty.current_a + 12 / (120 * 1.2358), 9);
    const text = (await runMain(["plan", join(dir, "job.yaml"), "--no-learn"])).stdout;
    expect(text).toMatch(/armature current A/);
    expect(text).toMatch(/terminal current A\s+0\.617/);
  });
});

/**
 * The stall figures are the armature's (V − V_brush)/R: the card says the ammeter goes in the
 * armature lead, and what the field adds in the supply lead, I_f = V/R_f (here 12 V / 120 Ω = 0.1 A,
 * by hand); a permanent-magnet card says nothing of a field.
 */
describe("a shunt motor's stall check says where the ammeter goes", () => {
  async function cardText(jobText: string): Promise<string> {
    const { renderCard } = await import("../src/card/render.js");
    const { getDocument } = await import("pdfjs-dist/legacy/build/pdf.mjs");
    const buf = await renderCard(planJob(loadJobText(jobText)), { paper: "a4", date: "2026-12-01", version: "9.9.9-test" });
    const pdf = await getDocument({ data: new Uint8Array(buf), useSystemFonts: false, isEvalSupported: false }).promise;
    let text = "";
    for (let i = 1; i <= pdf.numPages; i++) {
      const tc = await (await pdf.getPage(i)).getTextContent();
      text += tc.items.map((it) => ("str" in it ? it.str + (it.hasEOL ? " " : "") : "")).join("");
    }
    await pdf.destroy();
    return text.replace(/\s+/g, " ");
  }

  it("on the card: in the armature lead; the supply lead reads 0.1 A more at 12 V", async () => {
    const text = await cardText(shunt("field_winding:\n  resistance: { value: 120 ohm, at: 20 C }\n"));
    expect(text).toContain("put the ammeter in the armature lead");
    expect(text).toContain("V ÷ 120.0 Ω besides (0.100 A at 12.0 V, cold)");
    expect(await cardText(shunt("", undefined, "permanent_magnet"))).not.toContain("armature lead");
  });

  it("in log's stall check: the note says the reading is the armature's", async () => {
    const dir = mkdtempSync(join(tmpdir(), "armwind-shunt-stall-"));
    const job = join(dir, "shunt.yaml");
    writeFileSync(job, shunt("field_winding:\n  resistance: { value: 120 ohm, at: 20 C }\n"));
    const measured = join(dir, "m.yaml");
    writeFileSync(
      measured,
      "version: 1\njob: blind-motor-0031\ndate: 2026-12-01\ntemperature: 20 C\nbar_to_bar: [1.02, 1.02, 1.02, 1.02, 1.02]\nstall: { supply: 3 V, current: 1.8 A }\n",
    );
    const r = await runMain(["log", job, "--measured", measured, "--logbook", join(dir, "book"), "--json", "--no-learn"]);
    const stall = (JSON.parse(r.stdout) as { logged: { comparison: { checks: { check: string; note: string }[] } } }).logged.comparison.checks.find(
      (c) => c.check === "stall.current",
    )!;
    expect(stall.note).toContain("the armature's current (in the armature lead");
  });
});
