import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { activeConductors, fluxFromGap, keFromEmfEquation, keFromKv, keScaledByTurns, kvFromKe, pitchFactor } from "../src/motor/emf.js";
import { brushDrop, DEFAULT_BRUSH_DROP } from "../src/motor/brush.js";
import { ArmwindError } from "../src/errors.js";

const RPM = (2 * Math.PI) / 60;

describe("EMF equation", () => {
  it("4-pole lap armature, 720 conductors, 25 mWb per pole generates 300 V at 1000 rpm", () => {
    // Textbook worked example of the DC generator EMF equation, E = PZΦN/(60a): B. L. Theraja,
    // "A Textbook of Electrical Technology" Vol. II, DC generator EMF examples (from memory).
    const ke = keFromEmfEquation({ poles: 4, conductors: 720, paths: 4, fluxPerPole: 0.025 });
    expect(ke * 1000 * RPM).toBeCloseTo(300, 9);
  });

  it("the same armature wave-wound (a = 2) generates twice as much, 600 V", () => {
    // Same textbook example family, wave variant (from memory); a = 2 instead of a = P.
    const ke = keFromEmfEquation({ poles: 4, conductors: 720, paths: 2, fluxPerPole: 0.025 });
    expect(ke * 1000 * RPM).toBeCloseTo(600, 9);
  });

  it("the pitch factor multiplies Ke", () => {
    const full = keFromEmfEquation({ poles: 2, conductors: 600, paths: 2, fluxPerPole: 2e-4 });
    const short = keFromEmfEquation({ poles: 2, conductors: 600, paths: 2, fluxPerPole: 2e-4, pitchFactor: 0.5 });
    expect(short).toBeCloseTo(full / 2, 15);
  });

  it("Z = 2·N·C", () => {
    // Definition used with the EMF equation (any machine-design textbook).
    expect(activeConductors(60, 5)).toBe(600);
  });
});

describe("pitch factor (sinusoidal field assumed)", () => {
  it("one-tooth coils on 2 poles: 3 slots 0.87, 5 slots 0.59, 7 slots 0.43 (DESIGN.md)", () => {
    expect(pitchFactor(1, 3, 2)).toBeCloseTo(0.866, 3);
    expect(pitchFactor(1, 5, 2)).toBeCloseTo(0.588, 3);
    expect(pitchFactor(1, 7, 2)).toBeCloseTo(0.434, 3);
  });

  it("full pitch gives 1", () => {
    expect(pitchFactor(6, 12, 2)).toBeCloseTo(1, 12);
    expect(pitchFactor(9, 36, 4)).toBeCloseTo(1, 12);
  });

  it("agrees with the textbook chording factor cos(α/2), α the short-pitch angle", () => {
    // Independent form of the same factor (AC winding chapters of machine textbooks):
    // 36 slots, 4 poles, pole pitch 9 slots; a coil spanning s slots is short by (9 − s) slots,
    // α = (9 − s) · 20° electrical.
    for (let s = 5; s <= 9; s++) {
      const alpha = ((9 - s) * 20 * Math.PI) / 180;
      expect(pitchFactor(s, 36, 4)).toBeCloseTo(Math.cos(alpha / 2), 12);
    }
  });
});

describe("flux per pole from the gap", () => {
  it("Φ = B · arc · πD/P · L", () => {
    // 0.3 T, 70 % arc, 20 mm rotor, 12 mm stack, 2 poles: 0.3 · 0.7 · (π·0.02/2) · 0.012 (hand calculation)
    expect(fluxFromGap(0.3, 0.7, 0.02, 0.012, 2)).toBeCloseTo(0.3 * 0.7 * 0.0314159265 * 0.012, 12);
  });
});

describe("Kv and Ke", () => {
  it("Ke 0.0112 V·s/rad is about 853 rpm/V (60/(2π·Ke), unit conversion)", () => {
    expect(kvFromKe(0.0112)).toBeCloseTo(852.6, 1);
  });

  it("round-trips for every Ke", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-4, max: 10, noNaN: true }), (ke) => {
        expect(keFromKv(kvFromKe(ke))).toBeCloseTo(ke, 12);
      }),
    );
  });

  it("Ke scales with turns per coil", () => {
    expect(keScaledByTurns(0.0112, 60, 90)).toBeCloseTo(0.0168, 12);
  });

  it("rejects a zero Ke as bad input", () => {
    expect(() => kvFromKe(0)).toThrow(ArmwindError);
  });
});

describe("brush drop", () => {
  it("defaults: carbon 2 V (machine textbooks), metal 0.2 V (from memory)", () => {
    expect(DEFAULT_BRUSH_DROP.carbon).toBe(2);
    expect(brushDrop("metal").volts).toBe(0.2);
    expect(brushDrop("carbon").source).toBe("default");
  });

  it("a stated drop wins", () => {
    expect(brushDrop("carbon", 1.4)).toMatchObject({ volts: 1.4, source: "given" });
  });

  it("a negative drop is bad input", () => {
    try {
      brushDrop("metal", -1);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ArmwindError);
      expect((e as ArmwindError).problems[0]).toMatchObject({ code: "invalid_value", path: "winding.brush_drop" });
    }
  });
});
