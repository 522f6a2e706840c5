import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  calibrate,
  disagreement,
  fitKeFromGenerator,
  fitKeFromNameplate,
  fitKeFromNoLoad,
  fitKeFromNoLoadTests,
  fitLossTorque,
  type NoLoadTest,
} from "../src/motor/calibrate.js";
import { noLoad, type MotorModel } from "../src/motor/model.js";
import { ArmwindError } from "../src/errors.js";

const RPM = (2 * Math.PI) / 60;

function problem(fn: () => unknown) {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(ArmwindError);
    return (e as ArmwindError).problems[0];
  }
  throw new Error("expected an ArmwindError");
}

describe("DESIGN.md demo numbers (invented scenario, stated there to agree)", () => {
  const test: NoLoadTest = { supply: 12, current: 0.18, speed: 9800 * RPM };

  it("no-load test 12 V, 0.18 A, 9800 rpm, 1.57 Ω, metal brushes 0.2 V gives Ke ≈ 0.0112 V·s/rad", () => {
    // Ke = (12 − 0.2 − 0.18·1.57)/(9800·2π/60) = 11.5174/1026.25 (hand calculation)
    const fit = fitKeFromNoLoad(test, 1.57, 0.2);
    expect(fit.value).toBeCloseTo(0.011223, 6);
    expect(fit.uncertainty).toBeGreaterThan(0.01);
    expect(fit.uncertainty).toBeLessThan(0.1);
    expect(fit.basis).toContain("9800 rpm");
  });

  it("the generator test 3.52 V at 3000 rpm repeats it", () => {
    const gen = fitKeFromGenerator(3000 * RPM, 3.52);
    expect(gen.value).toBeCloseTo(0.011205, 6);
    expect(disagreement(gen.value, fitKeFromNoLoad(test, 1.57, 0.2).value)).toBeLessThan(0.005);
  });

  it("calibrate picks the generator test, no warning, loss torque from the no-load test", () => {
    const c = calibrate({
      brushDrop: 0.2,
      generator: { speed: 3000 * RPM, volts: 3.52 },
      noLoad: [{ ...test, terminalOhm: 1.57 }],
    });
    expect(c.source).toBe("generator");
    expect(c.ke).toBeCloseTo(0.011205, 6);
    expect(c.warnings).toEqual([]);
    expect(c.loss?.tc).toBeCloseTo(c.ke! * 0.18, 12); // T_c = Kt·I0 from one test (DESIGN.md)
    expect(c.loss?.b).toBe(0);
    expect(c.reasons.join(" ")).toMatch(/generator/);
  });
});

describe("calibrate: the order of sources (DESIGN.md)", () => {
  const nl = [{ supply: 12, current: 0.18, speed: 9800 * RPM, terminalOhm: 1.57 }];
  const nameplate = { supply: 12, current: 0.9, speed: 8500 * RPM, hotOhm: 1.9 };
  const magnet = { poles: 2, conductors: 600, paths: 2, fluxPerPole: 2e-4, pitchFactor: 0.588 };

  it("no-load before logbook, logbook before nameplate, nameplate before magnet, then none", () => {
    expect(calibrate({ brushDrop: 0.2, noLoad: nl, logbook: { ke: 0.02, records: 3 }, nameplate, magnet }).source).toBe("no_load");
    expect(calibrate({ brushDrop: 0.2, logbook: { ke: 0.02, records: 3 }, nameplate, magnet }).source).toBe("logbook");
    const np = calibrate({ brushDrop: 0.2, nameplate, magnet });
    expect(np.source).toBe("nameplate");
    // (12 − 0.2 − 0.9·1.9)/(8500·2π/60) (hand calculation)
    expect(np.ke).toBeCloseTo((12 - 0.2 - 0.9 * 1.9) / (8500 * RPM), 12);
    expect(np.loss).toBeNull();
    const mg = calibrate({ brushDrop: 0.2, magnet });
    expect(mg.source).toBe("magnet");
    expect(mg.ke).toBeCloseTo((0.588 * 2 * 600 * 2e-4) / (2 * Math.PI * 2), 12);
    const none = calibrate({ brushDrop: 0.2 });
    expect(none).toMatchObject({ source: "none", ke: null, loss: null });
    expect(none.warnings[0].code).toBe("uncalibrated");
  });

  it("generator and no-load more than 5 % apart: a warning with both numbers (threshold: common practice)", () => {
    const c = calibrate({ brushDrop: 0.2, generator: { speed: 3000 * RPM, volts: 3.9 }, noLoad: nl });
    expect(c.source).toBe("generator");
    const w = c.warnings.find((x) => x.code === "ke_sources_disagree");
    expect(w).toBeDefined();
    expect(w!.message).toContain("0.01241");
    expect(w!.message).toContain("0.01122");
  });

  it("a series motor tested unloaded gets the warning; a shunt test without field current too", () => {
    expect(calibrate({ brushDrop: 2, noLoad: nl, field: "series" }).warnings.map((w) => w.code)).toContain("series_field");
    expect(calibrate({ brushDrop: 2, noLoad: nl, field: "shunt" }).warnings.map((w) => w.code)).toContain("field_current_missing");
  });

  it("a shunt field's current is subtracted before the back-EMF", () => {
    const a = fitKeFromNoLoad({ supply: 24, current: 0.5, speed: 3000 * RPM, fieldCurrent: 0.2 }, 2, 2);
    expect(a.value).toBeCloseTo((24 - 2 - 0.3 * 2) / (3000 * RPM), 12);
  });
});

describe("fit back a simulated motor (fast-check over random parameters)", () => {
  it("Ke from no-load tests and the generator test, T_c and B from two no-load tests", () => {
    fc.assert(
      fc.property(
        fc.record({
          ke: fc.double({ min: 0.003, max: 0.5, noNaN: true }),
          resistance: fc.double({ min: 0.1, max: 20, noNaN: true }),
          brushDrop: fc.double({ min: 0, max: 2, noNaN: true }),
          tc: fc.double({ min: 1e-4, max: 0.05, noNaN: true }),
          bRel: fc.double({ min: 0, max: 2, noNaN: true }), // B·ω1 as a fraction of T_c
          w1: fc.double({ min: 200, max: 3000, noNaN: true }),
          ratio: fc.double({ min: 0.2, max: 0.7, noNaN: true }),
        }),
        (p) => {
          const model: MotorModel = {
            ke: p.ke,
            resistance: p.resistance,
            brushDrop: p.brushDrop,
            loss: { tc: p.tc, b: (p.bRel * p.tc) / p.w1 },
            field: "constant",
          };
          // Supplies that give the chosen speeds: V = Ke·ω + R·T_f(ω)/Kt + V_b.
          const supplyFor = (w: number) => p.ke * w + (p.resistance * (p.tc + model.loss.b * w)) / p.ke + p.brushDrop;
          const tests = [p.w1, p.w1 * p.ratio].map((w) => {
            const V = supplyFor(w);
            const nl = noLoad(model, V); // simulate the bench with the model
            expect(nl.speed).toBeCloseTo(w, 6);
            return { supply: V, current: nl.current, speed: nl.speed, terminalOhm: p.resistance };
          });
          const ke = fitKeFromNoLoadTests(tests, p.resistance, p.brushDrop);
          expect(ke.value / p.ke).toBeCloseTo(1, 9);
          const gen = fitKeFromGenerator(1000, p.ke * 1000);
          expect(gen.value / p.ke).toBeCloseTo(1, 12);
          const loss = fitLossTorque(tests, ke.value);
          expect(loss.value.tc / p.tc).toBeCloseTo(1, 6);
          expect(loss.value.b * p.w1).toBeCloseTo(model.loss.b * p.w1, 9);
          const c = calibrate({ brushDrop: p.brushDrop, noLoad: tests, generator: { speed: 1000, volts: p.ke * 1000 } });
          expect(c.source).toBe("generator");
          expect(c.warnings).toEqual([]);
          expect(c.loss!.tc / p.tc).toBeCloseTo(1, 6);
        },
      ),
      { numRuns: 200 },
    );
  });

  it("T_c alone from one test: Kt·I0", () => {
    const f = fitLossTorque([{ supply: 12, current: 0.18, speed: 1026 }], 0.0112);
    expect(f.value).toEqual({ tc: 0.0112 * 0.18, b: 0 });
  });

  it("a slightly negative slope within the readings' noise is set to zero, not refused", () => {
    // currents 0.180 and 0.178 A: 1 % apart, inside the ±3 % of the readings
    const f = fitLossTorque(
      [
        { supply: 6, current: 0.18, speed: 4700 * RPM },
        { supply: 12, current: 0.178, speed: 9800 * RPM },
      ],
      0.0112,
    );
    expect(f.value.b).toBe(0);
    expect(f.value.tc).toBeCloseTo(0.0112 * 0.179, 12);
    expect(f.basis).toMatch(/set to 0/);
  });
});

describe("inconsistent tests throw ArmwindError with the numbers", () => {
  it("a no-load test implying negative back-EMF", () => {
    // 12 − 0.2 − 8 × 1.57 = −0.76 V
    const p = problem(() => fitKeFromNoLoad({ supply: 12, current: 8, speed: 9800 * RPM }, 1.57, 0.2));
    expect(p.code).toBe("inconsistent_tests");
    expect(p.path).toBe("original.tests[0]");
    for (const s of ["12 V", "8 A", "1.57 Ω", "-0.76 V", "9800 rpm"]) expect(p.message).toContain(s);
  });

  it("a nameplate implying negative back-EMF", () => {
    const p = problem(() => fitKeFromNameplate(12, 9, 8500 * RPM, 1.5, 0.2));
    expect(p).toMatchObject({ code: "inconsistent_tests", path: "original.nameplate" });
    expect(p.message).toContain("9 A");
  });

  it("two tests implying negative friction", () => {
    const p = problem(() =>
      fitLossTorque(
        [
          { supply: 12, current: 0.18, speed: 9800 * RPM },
          { supply: 6, current: 0.3, speed: 4700 * RPM },
        ],
        0.0112,
      ),
    );
    expect(p.code).toBe("inconsistent_tests");
    for (const s of ["0.18 A", "0.3 A", "9800 rpm", "4700 rpm", "negative viscous friction"]) expect(p.message).toContain(s);
  });

  it("two tests implying a negative Coulomb loss torque", () => {
    const p = problem(() =>
      fitLossTorque(
        [
          { supply: 6, current: 0.05, speed: 5000 * RPM },
          { supply: 12, current: 0.2, speed: 10000 * RPM },
        ],
        0.0112,
      ),
    );
    expect(p.code).toBe("inconsistent_tests");
    for (const s of ["0.05 A", "0.2 A", "5000 rpm", "10000 rpm", "negative Coulomb"]) expect(p.message).toContain(s);
  });

  it("two no-load tests giving different Ke", () => {
    const p = problem(() =>
      fitKeFromNoLoadTests(
        [
          { supply: 12, current: 0.18, speed: 9800 * RPM },
          { supply: 6, current: 0.15, speed: 9800 * RPM },
        ],
        1.57,
        0.2,
      ),
    );
    expect(p).toMatchObject({ code: "inconsistent_tests", path: "original.tests[1]" });
    expect(p.message).toContain("6 V");
    expect(p.message).toContain("12 V");
  });

  it("a field current larger than the whole current", () => {
    const p = problem(() => fitKeFromNoLoad({ supply: 24, current: 0.2, speed: 300, fieldCurrent: 0.3 }, 2, 2));
    expect(p.code).toBe("inconsistent_tests");
    expect(p.message).toContain("0.3 A");
  });

  it("calibrate passes the error on", () => {
    expect(() => calibrate({ brushDrop: 0.2, noLoad: [{ supply: 12, current: 8, speed: 1000, terminalOhm: 1.57 }] })).toThrow(/no back-EMF/);
  });
});
