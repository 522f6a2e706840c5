import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { atSpeed, atTorque, curve, maxOutput, noLoad, peakEfficiency, rescaleForTurns, stall, summarize, type MotorModel } from "../src/motor/model.js";
import { dutyPoint } from "../src/motor/duty.js";
import { currentDensity, stallCurrentDensity } from "../src/motor/density.js";
import { ArmwindError } from "../src/errors.js";
import { copperResistivity, roundArea } from "../src/wire/copper.js";

// Invented demo motor (DESIGN.md's scenario): Ke 0.0112 V·s/rad, 1.57 Ω, metal brushes 0.2 V.
const demo: MotorModel = { ke: 0.0112, resistance: 1.57, brushDrop: 0.2, loss: { tc: 0.002, b: 0 }, field: "constant" };

const arbModel = fc.record({
  ke: fc.double({ min: 0.002, max: 0.5, noNaN: true }),
  resistance: fc.double({ min: 0.05, max: 30, noNaN: true }),
  brushDrop: fc.double({ min: 0, max: 2, noNaN: true }),
  tcFrac: fc.double({ min: 0, max: 0.3, noNaN: true }),
  bFrac: fc.double({ min: 0, max: 0.3, noNaN: true }),
  V: fc.double({ min: 3, max: 240, noNaN: true }),
});

/** Build a model whose losses are a fraction of its stall torque, so it starts. */
function build(p: { ke: number; resistance: number; brushDrop: number; tcFrac: number; bFrac: number; V: number }): MotorModel {
  const Ts = (p.ke * (p.V - p.brushDrop)) / p.resistance;
  const w0 = (p.V - p.brushDrop) / p.ke;
  return {
    ke: p.ke,
    resistance: p.resistance,
    brushDrop: p.brushDrop,
    loss: { tc: p.tcFrac * Ts, b: (p.bFrac * Ts) / w0 },
    field: "constant",
  };
}

/** Independent computation: efficiency at many speeds, the best one found by scanning. */
function scanBestEfficiency(m: MotorModel, V: number, steps = 20000) {
  const w0 = noLoad(m, V).speed;
  let best = { efficiency: -1, speed: 0 };
  for (let i = 0; i <= steps; i++) {
    const p = atSpeed(m, V, (w0 * i) / steps);
    if (p.efficiency > best.efficiency) best = { efficiency: p.efficiency, speed: p.speed };
  }
  return best;
}

describe("derivable results of the linear motor model", () => {
  it("no-load speed with zero loss is (V − V_b)/Ke", () => {
    // Linear model with T_f = 0: no current flows at no load, so V − V_b = Ke·ω0.
    const m = { ...demo, loss: { tc: 0, b: 0 } };
    expect(noLoad(m, 12).speed).toBeCloseTo(11.8 / 0.0112, 9);
    expect(noLoad(m, 12).current).toBeCloseTo(0, 12);
  });

  it("with constant loss torque (B = 0) peak efficiency lies at I = √(I0 · I_stall)", () => {
    // Textbook result for the PM DC motor with Coulomb friction only (derived from the linear model).
    fc.assert(
      fc.property(arbModel, (p) => {
        const m = build({ ...p, bFrac: 0, tcFrac: Math.max(p.tcFrac, 0.01) });
        const I0 = noLoad(m, p.V).current;
        const Is = stall(m, p.V).current;
        const pe = peakEfficiency(m, p.V);
        expect(pe.current).toBeCloseTo(Math.sqrt(I0 * Is), 9);
        // independent check: no scanned point beats it
        expect(scanBestEfficiency(m, p.V, 2000).efficiency).toBeLessThanOrEqual(pe.efficiency + 1e-12);
      }),
      { numRuns: 50 },
    );
  });

  it("with viscous loss too, the closed-form peak efficiency matches a numeric scan", () => {
    // Independent computation: brute-force scan of efficiency over speed.
    fc.assert(
      fc.property(arbModel, (p) => {
        // some loss, so the peak is inside the range (with none it is the limit I → 0)
        const m = build({ ...p, bFrac: Math.max(p.bFrac, 0.01) });
        const pe = peakEfficiency(m, p.V);
        const scan = scanBestEfficiency(m, p.V);
        expect(scan.efficiency).toBeLessThanOrEqual(pe.efficiency + 1e-12);
        expect(pe.efficiency - scan.efficiency).toBeLessThan(1e-6);
      }),
      { numRuns: 30 },
    );
  });

  it("with a shunt field across the supply the closed-form peak is the scanned peak (input V·(I + V/R_f))", () => {
    // Independent computation: brute-force scan of efficiency over speed; the field's resistance a
    // multiple of the armature's (shunt fields take a few per cent of the rated current, from memory).
    fc.assert(
      fc.property(arbModel, fc.double({ min: 5, max: 2000, noNaN: true }), (p, k) => {
        const pm = build({ ...p, bFrac: Math.max(p.bFrac, 0.01) }); // some loss, as above
        const m = { ...pm, fieldOhm: k * p.resistance };
        const pe = peakEfficiency(m, p.V);
        const scan = scanBestEfficiency(m, p.V);
        expect(scan.efficiency).toBeLessThanOrEqual(pe.efficiency + 1e-12);
        expect(pe.efficiency - scan.efficiency).toBeLessThan(1e-6);
        // the field's loss only lowers it
        expect(pe.efficiency).toBeLessThanOrEqual(peakEfficiency(pm, p.V).efficiency + 1e-12);
      }),
      { numRuns: 30 },
    );
  });

  it("with no loss, output power peaks at half the stall torque and half the no-load speed", () => {
    // Textbook result for the ideal DC motor (linear torque-speed line, P = T·ω a parabola).
    const m = { ...demo, loss: { tc: 0, b: 0 } };
    const mo = maxOutput(m, 12);
    const st = stall(m, 12);
    const nl = noLoad(m, 12);
    expect(mo.torque).toBeCloseTo(st.torque / 2, 12);
    expect(mo.speed).toBeCloseTo(nl.speed / 2, 9);
    expect(mo.power).toBeCloseTo((st.torque * nl.speed) / 4, 9);
  });

  it("maximum output beats every point of the curve", () => {
    fc.assert(
      fc.property(arbModel, (p) => {
        const m = build(p);
        const mo = maxOutput(m, p.V);
        for (const pt of curve(m, p.V, 101)) expect(pt.outputW).toBeLessThanOrEqual(mo.power * (1 + 1e-12));
      }),
      { numRuns: 50 },
    );
  });

  it("energy balance: V·I = shaft power + I²R + V_b·I + loss torque · ω at every point", () => {
    // Conservation of energy, an independent check of the torque and current equations.
    fc.assert(
      fc.property(arbModel, fc.double({ min: 0, max: 1, noNaN: true }), (p, f) => {
        const m = build(p);
        const T = f * stall(m, p.V).torque;
        const op = atTorque(m, p.V, T);
        const losses = op.current ** 2 * m.resistance + m.brushDrop * op.current + (m.loss.tc + m.loss.b * op.speed) * op.speed;
        expect(op.inputW).toBeCloseTo(op.outputW + losses, 6);
        // and atSpeed at that speed gives back the torque
        expect(atSpeed(m, p.V, op.speed).torque).toBeCloseTo(T, 9);
      }),
    );
  });

  it("the curve runs from no load to stall", () => {
    const pts = curve(demo, 12, 11);
    expect(pts).toHaveLength(11);
    expect(pts[0].speed).toBeCloseTo(noLoad(demo, 12).speed, 9);
    expect(pts[0].torque).toBeCloseTo(0, 12);
    expect(pts[10].speed).toBe(0);
    expect(pts[10].current).toBeCloseTo(11.8 / 1.57, 12);
    expect(pts[10].torque).toBeCloseTo(stall(demo, 12).torque, 12);
  });

  it("stall: (V − V_b)/R and Kt·I − T_c", () => {
    expect(stall(demo, 12).current).toBeCloseTo(7.5159, 4);
    expect(stall(demo, 12).torque).toBeCloseTo(0.0112 * (11.8 / 1.57) - 0.002, 12);
  });
});

describe("refusals", () => {
  it("a torque beyond stall throws beyond_stall with both torques", () => {
    try {
      atTorque(demo, 12, 1);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ArmwindError);
      const p = (e as ArmwindError).problems[0];
      expect(p.code).toBe("beyond_stall");
      expect(p.message).toContain("1 N·m");
      expect(p.message).toContain("0.08218");
    }
  });

  it("a motor whose loss exceeds its stall torque does not start, and says so", () => {
    const m = { ...demo, loss: { tc: 1, b: 0 } };
    expect(noLoad(m, 12)).toMatchObject({ speed: 0, starts: false });
    expect(summarize(m, 12).warnings.map((w) => w.code)).toContain("does_not_start");
  });

  it("series motors: only armature figures, a warning against running unloaded, no operating points", () => {
    const m: MotorModel = { ...demo, field: "series" };
    const s = summarize(m, 230);
    expect(s.ke).toBe(0.0112);
    expect(s.resistance).toBe(1.57);
    expect(s.noLoadSpeed).toBeNull();
    expect(s.stallCurrent).toBeNull();
    expect(s.peakEfficiency).toBeNull();
    expect(s.maxOutputW).toBeNull();
    expect(s.warnings[0].code).toBe("series_field");
    expect(s.warnings[0].message).toMatch(/never run/);
    expect(() => noLoad(m, 230)).toThrow(ArmwindError);
    expect(() => curve(m, 230)).toThrow(/series/);
  });

  it("impossible model numbers are bad input", () => {
    expect(() => noLoad({ ...demo, resistance: 0 }, 12)).toThrow(ArmwindError);
    expect(() => noLoad({ ...demo, loss: { tc: -1, b: 0 } }, 12)).toThrow(ArmwindError);
  });
});

describe("summary, duty and density", () => {
  it("summary of the demo motor agrees with the separate functions", () => {
    const s = summarize(demo, 12);
    expect(s.kv).toBeCloseTo(60 / (2 * Math.PI * 0.0112), 9);
    expect(s.noLoadSpeed).toBeCloseTo(noLoad(demo, 12).speed, 12);
    // no-load current = T_c/Kt with B = 0 (DESIGN.md)
    expect(s.noLoadCurrent).toBeCloseTo(0.002 / 0.0112, 12);
    expect(s.peakEfficiencyCurrent).toBeCloseTo(Math.sqrt((0.002 / 0.0112) * (11.8 / 1.57)), 12);
    expect(s.warnings).toEqual([]);
  });

  it("duty point: speed at the load torque, and the current density in each strand", () => {
    const area = roundArea(0.22e-3);
    const d = dutyPoint(demo, 12, 0.02, { paths: 2, strands: 1, strandArea: area });
    const I = (0.02 + 0.002) / 0.0112; // B = 0: Kt·I = T + T_c
    expect(d.current).toBeCloseTo(I, 12);
    expect(d.speed).toBeCloseTo((11.8 - I * 1.57) / 0.0112, 9);
    expect(d.inputW).toBeCloseTo(12 * I, 12);
    expect(d.efficiency).toBeCloseTo((0.02 * d.speed) / (12 * I), 12);
    expect(d.currentDensity).toBeCloseTo(I / (2 * area), 3);
    expect(() => dutyPoint(demo, 12, 0.5)).toThrow(/beyond the stall torque/);
  });

  it("stall current density (V − V_b)/(ρL) equals I_stall/(a·k·A) for a winding of equal paths", () => {
    // Independent computation through the resistance: R = ρ·L/(a·k·A), I = (V − V_b)/R.
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 100, noNaN: true }),
        fc.integer({ min: 1, max: 3 }),
        fc.integer({ min: 1, max: 4 }),
        fc.double({ min: 0.05e-3, max: 1e-3, noNaN: true }),
        fc.double({ min: 1, max: 200, noNaN: true }),
        (V, pairs, k, d, L) => {
          const a = 2 * pairs;
          const A = roundArea(d);
          const rho = copperResistivity(80);
          const R = (rho * L) / (a * k * A);
          const I = (V - 0.2) / R;
          expect(stallCurrentDensity(V, 0.2, rho, L) / currentDensity(I, a, k, A)).toBeCloseTo(1, 9);
        },
      ),
    );
  });
});

describe("rewinding the model", () => {
  it("keeps the loss torque, scales Ke, takes the new resistance", () => {
    const m = rescaleForTurns(demo, 60, 30, 0.4);
    expect(m.ke).toBeCloseTo(0.0056, 12);
    expect(m.resistance).toBe(0.4);
    expect(m.loss).toEqual(demo.loss);
  });
});
