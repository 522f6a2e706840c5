/**
 * Shunt fields: the constant-field model (docs/contracts.md, "Steady state") with the field across
 * the supply, so the no-load test's current is the armature's plus the field's, I_f = V/R_f, and Ke
 * is fitted on the armature's alone (docs "Calibration of Ke": "less a shunt field's current").
 * Source: the shunt DC machine of any electrical-machines textbook (I_L = I_A + I_F, I_F = V_T/R_F;
 * e.g. S. J. Chapman, Electric Machinery Fundamentals, 4th ed. (2005), ch. 9, from memory), worked
 * by hand below. The motor is the blind demo's armature with an invented shunt field.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { planJob } from "../src/design/plan.js";
import { ROOT, loadJobText } from "./helpers/cli.js";

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
