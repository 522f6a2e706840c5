import { describe, expect, it } from "vitest";
import { kvFromKe, keScaledByTurns } from "../src/motor/emf.js";
import { noLoad, rescaleForTurns, stall, type MotorModel } from "../src/motor/model.js";
import { ohmPerMetre } from "../src/wire/copper.js";

/** AWG diameter, m: d(n) = 0.127 mm × 92^((36 − n)/39) (ASTM B258). */
const awg = (n: number) => 0.127e-3 * 92 ** ((36 - n) / 39);

// Rules of thumb from the trade: common practice, no published source.
// "At the same copper fill, doubling the turns about quadruples the resistance and quarters the
// stall current, halves Kv, and lowers the no-load current."
describe("doubling the turns at the same copper fill (common practice, no published source)", () => {
  // Invented demo armature: 60 turns of AWG 30 on a 48 mm mean turn, 5 tooth coils, brushes
  // splitting the ring 2 + 3 coils: terminal R = R_coil · 2·3/5 (DESIGN.md ring formula).
  const mlt = 0.048;
  const terminal = (turns: number, d: number) => (ohmPerMetre(d) * turns * mlt * (2 * 3)) / 5;
  // Same fill: twice the turns in half the copper area, three AWG steps finer (AWG 30 → 33).
  const r60 = terminal(60, awg(30));
  const r120 = terminal(120, awg(33));
  const orig: MotorModel = { ke: 0.0112, resistance: r60, brushDrop: 0.2, loss: { tc: 0.002, b: 2e-7 }, field: "constant" };
  const rewound = rescaleForTurns(orig, 60, 120, r120);

  it("about quadruples the resistance", () => {
    // three AWG steps halve the area to within 0.3 % (ASTM B258 formula: 92^(6/39) = 2.005)
    expect(r120 / r60).toBeGreaterThan(3.9);
    expect(r120 / r60).toBeLessThan(4.1);
  });

  it("about quarters the stall current", () => {
    const ratio = stall(rewound, 12).current / stall(orig, 12).current;
    expect(ratio).toBeGreaterThan(0.24);
    expect(ratio).toBeLessThan(0.26);
  });

  it("halves Kv", () => {
    expect(kvFromKe(keScaledByTurns(0.0112, 60, 120)) / kvFromKe(0.0112)).toBeCloseTo(0.5, 12);
    expect(kvFromKe(rewound.ke) / kvFromKe(orig.ke)).toBeCloseTo(0.5, 12);
  });

  it("lowers the no-load current (the same loss torque over twice the Kt)", () => {
    const before = noLoad(orig, 12);
    const after = noLoad(rewound, 12);
    expect(after.current).toBeLessThan(before.current);
    // and the no-load speed about halves
    expect(after.speed / before.speed).toBeGreaterThan(0.45);
    expect(after.speed / before.speed).toBeLessThan(0.55);
  });
});
