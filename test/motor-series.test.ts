/**
 * The series / universal motor model (src/motor/series.ts) against hand-worked figures.
 * Source of the equations: S. J. Chapman, Electric Machinery Fundamentals, 4th ed. (2005), §9.6
 * "The series DC motor" (E = K·φ·ω, φ = c·I, τ = K·c·I², ω = V/√(K·c·τ) − R/(K·c)) and the
 * universal motor (ch. 10; reactance in quadrature with the resistive drop) — section numbers from
 * memory; the Frölich curve φ = a·I/(b + I) from memory. Every motor here is invented.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  atCurrent,
  atTorqueSeries,
  calibrateSeries,
  convertRatio,
  currentFromInputWatts,
  fitFluxLinkage,
  fitInductanceFromLockedRotor,
  fitMagnetisation,
  fitSeriesLoss,
  fluxLinkage,
  lockedRotorCurrent,
  lockedRotorVoltage,
  noLoadSeries,
  rescaleSeries,
  seriesCurve,
  splitInductance,
  type SeriesMotor,
} from "../src/motor/series.js";
import { ArmwindError } from "../src/errors.js";

const RPM = (2 * Math.PI) / 60;
const DC = (volts: number) => ({ volts, frequency: 0 });
const AC = (volts: number, frequency = 50) => ({ volts, frequency });

function code(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    if (e instanceof ArmwindError) return e.problems[0].code;
    throw e;
  }
  return "no error";
}

describe("DC series motor in the linear range (Chapman 4th ed. §9.6, worked by hand)", () => {
  // Invented 24 V series DC motor: R_a 0.5 Ω + R_f 0.3 Ω = 0.8 Ω, carbon brushes 2 V in all.
  // No-load test 24 V, 2.0 A, 300 rad/s:
  //   E = 24 − 2.0 × 0.8 − 2 = 20.4 V;  ψ = E/ω = 20.4/300 = 0.068 V·s/rad;  k = ψ/I = 0.034 V·s/(A·rad)
  //   loss torque (one test, held constant) T_c = ψ·I = 0.068 × 2 = 0.136 N·m
  // At a shaft torque of 4.760 N·m: T_e = 4.760 + 0.136 = 4.896 N·m, I = √(T_e/k) = √144 = 12 A,
  //   ω = (V − V_b)/√(k·T_e) − R/k = 22/√0.166464 − 0.8/0.034 = 53.922 − 23.529 = 30.392 rad/s
  //   (the same as (24 − 2 − 12 × 0.8)/(0.034 × 12) = 12.4/0.408).
  const cal = calibrateSeries({
    brushDrop: 2,
    readings: [{ supply: DC(24), current: 2, speed: 300, torque: 0, resistance: 0.8, path: "original.tests[0]", what: "the no-load test" }],
  })!;
  const motor: SeriesMotor = { mag: cal.mag, ra: 0.5, rf: 0.3, la: 0, lf: 0, brushDrop: 2, loss: cal.loss };

  it("calibrates k from one no-load test, linear, with the loss torque held constant", () => {
    expect(cal.mag.k).toBeCloseTo(0.034, 12);
    expect(cal.mag.iSat).toBeNull();
    expect(cal.loss.tc).toBeCloseTo(0.136, 12);
    expect(cal.loss.c2).toBe(0);
    expect(cal.basis.join(" ")).toMatch(/optimistic/);
    expect(cal.basis.join(" ")).toMatch(/rough/);
  });

  it("predicts 12 A and 30.39 rad/s at 4.760 N·m", () => {
    const p = atTorqueSeries(motor, DC(24), 4.76);
    expect(p.current).toBeCloseTo(12, 9);
    expect(p.speed).toBeCloseTo(12.4 / 0.408, 9);
    expect(p.powerFactor).toBeCloseTo(1, 12);
    // output 4.760 × 30.392 = 144.67 W of 24 × 12 = 288 W input
    expect(p.efficiency).toBeCloseTo((4.76 * (12.4 / 0.408)) / 288, 9);
  });

  it("locked-rotor current on DC is (V − V_b)/R: at 6 V, 4/0.8 = 5 A", () => {
    expect(lockedRotorCurrent(motor, DC(6))).toBeCloseTo(5, 12);
    expect(lockedRotorCurrent(motor, DC(1.5))).toBe(0);
  });

  it("refuses a torque beyond the locked-rotor torque, naming it", () => {
    // at 24 V: I_lock = 22/0.8 = 27.5 A, T = 0.034 × 27.5² − 0.136 = 25.58 N·m
    expect(code(() => atTorqueSeries(motor, DC(24), 26))).toBe("beyond_stall");
    expect(() => atTorqueSeries(motor, DC(24), 25.5)).not.toThrow();
  });
});

describe("AC universal motor (Chapman 4th ed., universal motor: X in quadrature; worked by hand)", () => {
  // Invented 230 V 50 Hz universal motor: R = R_a + R_f = 6 + 4 = 10 Ω, L_a + L_f = 0.1 H,
  // carbon brushes 2 V. X = 2π × 50 × 0.1 = 31.416 Ω.
  const base: SeriesMotor = { mag: { k: 0.14, iSat: null }, ra: 6, rf: 4, la: 0.05, lf: 0.05, brushDrop: 2, loss: { tc: 0.01, c2: 0 } };

  it("locked-rotor current at a reduced 40 V with E = 0, brush drop included", () => {
    // (10·I + 2)² + (31.416·I)² = 40²  →  1086.96·I² + 40·I − 1596 = 0
    // I = (−40 + √(40² + 4 × 1086.96 × 1596)) / (2 × 1086.96) = (−40 + 2634.53)/2173.92 = 1.1935 A
    expect(lockedRotorCurrent(base, AC(40))).toBeCloseTo(1.19348, 4);
    // without the brush drop it would be 40/√(10² + 31.416²) = 40/32.969 = 1.2133 A: the drop matters
    expect(lockedRotorCurrent({ ...base, brushDrop: 0 }, AC(40))).toBeCloseTo(40 / Math.hypot(10, 2 * Math.PI * 5), 9);
    // and back: 1.2 A needs √((12 + 2)² + (37.70)²) = 40.21 V
    expect(lockedRotorVoltage(base, 50, 1.2)).toBeCloseTo(40.2147, 3);
  });

  it("calibrates ψ from an AC no-load test with the reactance in quadrature", () => {
    // 230 V, 0.5 A at 30 000 rpm (3141.59 rad/s): in phase √(230² − (0.5 × 31.416)²) = 229.463 V,
    // E = 229.463 − 0.5 × 10 − 2 = 222.463 V, ψ = 0.0708122 V·s/rad, k = 0.141624, T_c = ψ·I = 0.035406 N·m
    const cal = calibrateSeries({
      la: 0.05,
      lf: 0.05,
      brushDrop: 2,
      readings: [{ supply: AC(230), current: 0.5, speed: 30000 * RPM, torque: 0, resistance: 10, path: "original.tests[0]", what: "the no-load test" }],
    })!;
    expect(cal.mag.k).toBeCloseTo(0.141624, 5);
    expect(cal.loss.tc).toBeCloseTo(0.035406, 5);
    const m: SeriesMotor = { ...base, mag: cal.mag, loss: cal.loss };
    const nl = noLoadSeries(m, AC(230))!;
    expect(nl.current).toBeCloseTo(0.5, 6);
    expect(nl.speed / RPM).toBeCloseTo(30000, 2);
    // the real input is I·(E + I·R + V_b) = 0.5 × 229.463 W, power factor 229.463/230
    expect(nl.powerFactor).toBeCloseTo(229.463 / 230, 5);
  });

  it("the locked-rotor AC reading gives L_a + L_f, and the plan says the split", () => {
    // 40 V, 1.19348 A at 50 Hz through 10 Ω and 2 V: X = √(40² − 13.9348²)/1.19348 = 31.416 Ω → 0.1 H
    const L = fitInductanceFromLockedRotor({ volts: 40, current: 1.1934801199784086, frequency: 50 }, 10, 2);
    expect(L).toBeCloseTo(0.1, 9);
    expect(splitInductance(L).basis).toMatch(/half/);
    expect(splitInductance(L, 0.03).lf).toBeCloseTo(0.07, 9);
    expect(splitInductance(L, undefined, 0.06).la).toBeCloseTo(0.04, 9);
    // a reading the resistances alone would exceed contradicts them
    expect(code(() => fitInductanceFromLockedRotor({ volts: 10, current: 1.2, frequency: 50 }, 10, 2))).toBe("inconsistent_tests");
  });

  it("a no-load current the stated resistances and supply cannot carry is refused (inconsistent_tests)", () => {
    // 24 V, 3 A through 10 Ω: 30 V drop alone
    const r = { supply: DC(24), current: 3, speed: 1000, torque: 0, resistance: 10, path: "original.tests[0]", what: "the no-load test" };
    expect(code(() => fitFluxLinkage(r, 0, 2))).toBe("inconsistent_tests");
  });

  it("nameplate input watts give the current: I²V² = P² + I⁴X²", () => {
    // 230 V, 500 W, X = 31.416 Ω: I² = (230² − √(230⁴ − 4 × 31.416² × 500²))/(2 × 31.416²)
    const i = currentFromInputWatts(500, AC(230), 2 * Math.PI * 5);
    const x = 2 * Math.PI * 5;
    expect(i * i * 230 * 230).toBeCloseTo(500 * 500 + i ** 4 * x * x, 6);
    expect(i).toBeGreaterThan(500 / 230);
    expect(currentFromInputWatts(240, DC(24), 0)).toBe(10);
  });
});

describe("rewinding the armature (the EMF equation: k ∝ conductors; inductance ∝ turns²)", () => {
  const m: SeriesMotor = { mag: { k: 0.1, iSat: 3 }, ra: 5, rf: 4, la: 0.04, lf: 0.06, brushDrop: 2, loss: { tc: 0.01, c2: 1e-9 } };
  it("1.2 × the armature turns scales k by 1.2 with the field unchanged", () => {
    const r = rescaleSeries(m, { armature: 1.2, field: 1 }, 5 * 1.44, 4);
    expect(r.mag.k).toBeCloseTo(0.12, 12);
    expect(r.mag.iSat).toBe(3); // the field saturates at the same current when its turns stay
    expect(r.la).toBeCloseTo(0.04 * 1.44, 12);
    expect(r.lf).toBe(0.06);
    expect(r.rf).toBe(4);
    expect(r.loss).toEqual(m.loss);
  });
  it("a rewound field scales its part: k with its turns, saturation current inversely", () => {
    const r = rescaleSeries(m, { armature: 1, field: 2 }, 5, 16);
    expect(r.mag.k).toBeCloseTo(0.2, 12);
    expect(r.mag.iSat).toBeCloseTo(1.5, 12);
    expect(r.lf).toBeCloseTo(0.24, 12);
  });
  it("a voltage conversion with no brush drop scales both windings by exactly V_new/V_old", () => {
    // With V_b = 0 every voltage term scales by n, so n = 230/120 = 1.91667 exactly.
    const m0 = { ...m, brushDrop: 0 };
    const rated = atTorqueSeries(m0, AC(120, 60), 0.3);
    const c = convertRatio(m0, AC(230, 60), 0.3, rated.speed);
    expect(c.ratio).toBeCloseTo(230 / 120, 6);
    expect(atTorqueSeries(c.motor, AC(230, 60), 0.3).current).toBeCloseTo((rated.current * 120) / 230, 6);
    // with the brush drop, a little less than the voltage ratio is enough (2 V is a smaller part of 230 V)
    const withDrop = convertRatio(m, AC(230, 60), 0.3, atTorqueSeries(m, AC(120, 60), 0.3).speed);
    expect(withDrop.ratio).toBeGreaterThan(230 / 120);
  });
});

describe("saturation and fan loss from two readings", () => {
  it("the Frölich curve through two points passes through both; one point is linear and says so", () => {
    const m = fitMagnetisation([
      { current: 0.5, psi: 0.07 },
      { current: 2.5, psi: 0.25 },
    ]);
    expect(m.mag.iSat).not.toBeNull();
    expect(fluxLinkage(m.mag, 0.5)).toBeCloseTo(0.07, 12);
    expect(fluxLinkage(m.mag, 2.5)).toBeCloseTo(0.25, 12);
    expect(m.basis).toMatch(/bending/);
    // ψ/I rising with current: no bend to fit, linear from the lower point
    expect(
      fitMagnetisation([
        { current: 1, psi: 0.1 },
        { current: 2, psi: 0.25 },
      ]).mag,
    ).toEqual({ k: 0.1, iSat: null });
  });
  it("two no-load tests at different speeds separate the fan (∝ ω²) from friction", () => {
    // invented: T_c 0.01 N·m, C₂ 2e-9 N·m·s²: at 1000 rad/s 0.012, at 3000 rad/s 0.028
    const f = fitSeriesLoss([
      { speed: 1000, lossTorque: 0.012, path: "a" },
      { speed: 3000, lossTorque: 0.028, path: "b" },
    ]);
    expect(f.loss.tc).toBeCloseTo(0.01, 12);
    expect(f.loss.c2).toBeCloseTo(2e-9, 18);
  });
  it("calibration from no-load and nameplate readings gives back the motor that made them", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.05, max: 0.3, noNaN: true }),
        fc.double({ min: 1, max: 5, noNaN: true }),
        fc.double({ min: 0, max: 0.2, noNaN: true }),
        (k, iSat, L) => {
          const m: SeriesMotor = { mag: { k, iSat }, ra: 5, rf: 4, la: L / 2, lf: L / 2, brushDrop: 2, loss: { tc: 0.02, c2: 3e-9 } };
          const s = AC(230);
          const nl1 = noLoadSeries(m, s)!;
          const nl2 = noLoadSeries(m, AC(160))!;
          const rated = atTorqueSeries(m, s, 0.5 * (fluxLinkage(m.mag, 2) * 2));
          const read = (p: typeof nl1, v: number, torque: number | null, path: string, rated?: boolean) => ({
            supply: AC(v),
            current: p.current,
            speed: p.speed,
            torque,
            resistance: 9,
            path,
            what: path,
            rated,
          });
          const cal = calibrateSeries({
            la: L / 2,
            lf: L / 2,
            brushDrop: 2,
            readings: [read(nl1, 230, 0, "t0"), read(nl2, 160, 0, "t1"), read(rated, 230, null, "np", true)],
          })!;
          const back: SeriesMotor = { ...m, mag: cal.mag, loss: cal.loss };
          // the readings themselves are reproduced: the rated point's torque and speed
          expect(cal.rated!.torque).toBeCloseTo(rated.torque, 6);
          expect(atTorqueSeries(back, s, rated.torque).speed / rated.speed).toBeCloseTo(1, 6);
          expect(atCurrent(back, s, rated.current).torque / rated.torque).toBeCloseTo(1, 6);
        },
      ),
      { numRuns: 50 },
    );
  });
  it("curves run from light load to rated, speed falling and current rising", () => {
    const m: SeriesMotor = { mag: { k: 0.14, iSat: 3 }, ra: 6, rf: 4, la: 0.05, lf: 0.05, brushDrop: 2, loss: { tc: 0.01, c2: 2e-9 } };
    const c = seriesCurve(m, AC(230), 0.6, 11);
    expect(c).toHaveLength(11);
    expect(c[0].torque).toBeCloseTo(0.06, 9);
    expect(c[10].torque).toBeCloseTo(0.6, 9);
    for (let i = 1; i < c.length; i++) {
      expect(c[i].speed).toBeLessThan(c[i - 1].speed);
      expect(c[i].current).toBeGreaterThan(c[i - 1].current);
    }
    expect(noLoadSeries({ ...m, loss: { tc: 0, c2: 0 } }, AC(230))).toBeNull();
  });
});
