/**
 * The plan's physics against published sources and DESIGN.md's agreeing demo figures.
 */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { planJob } from "../src/design/plan.js";
import { ArmwindError } from "../src/errors.js";
import { trapezoidArea, trapezoidPerimeter, freeArea } from "../src/armature/slot.js";
import { copperFill, HEX_PACKING, SQUARE_PACKING } from "../src/armature/fill.js";
import { lengthFromMass, mltFromWireLength } from "../src/armature/turn.js";
import { toothLayerBuild, slotLayerBuild, passesOpening, layersOf, type LayerTable } from "../src/armature/build.js";
import fc from "fast-check";
import { coilResistance } from "../src/design/context.js";
import { ROOT, loadJobFile, loadJobText } from "./helpers/cli.js";

const BLIND = join(ROOT, "jobs/blind-motor-0031.yaml");
const blindText = readFileSync(BLIND, "utf8");
const blind = () => loadJobFile(BLIND);

describe("DESIGN.md's agreeing demo figures (invented values that agree with each other)", () => {
  it("60 turns of 0.22 mm on a 48 mm turn give 1.306 Ω a coil and 1.57 Ω across the brushes at 21 °C", () => {
    const area = (Math.PI / 4) * 0.22e-3 ** 2;
    const coil = coilResistance(60, 0.048, 1, area);
    expect(coil).toBeCloseTo(1.306, 3);
    // tooth ring of 5 coils, brushes splitting it 2/3: R·2·3/5 (DESIGN.md ring formula); 21 °C by IEC 60028
    expect(((coil * 2 * 3) / 5) * (1 + 0.00393 * 1)).toBeCloseTo(1.57, 2);
  });
  it("14.4 m and 4.87 g of old wire mean a 48 mm turn (IEC 60028 density 8.89 g/cm³)", () => {
    expect(mltFromWireLength(14.4, 1, 60, 5)).toBeCloseTo(0.048, 6);
    expect(lengthFromMass(4.87e-3, 0.22e-3)).toBeCloseTo(14.41, 1);
  });
  it("the original's copper fill is 0.386 of the 11.8 mm² left after the liner", () => {
    const free = freeArea(13.5e-6, 14e-3, 0.12e-3);
    expect(free * 1e6).toBeCloseTo(11.82, 2);
    expect(copperFill(2 * 60, (Math.PI / 4) * 0.22e-3 ** 2, free)).toBeCloseTo(0.386, 3);
  });
  it("the plan of the demo reproduces them for the original winding", () => {
    const p = planJob(blind());
    expect(p.original.copper_fill).toBeCloseTo(0.386, 3);
    expect(p.original.mlt * 1e3).toBeCloseTo(48, 1);
    expect(p.slot.free_area * 1e6).toBeCloseTo(11.82, 2);
    // Ke from the generator test 3.52 V at 3000 rpm (DESIGN.md: 0.0112 V·s/rad, repeated by the no-load test)
    expect(p.calibration.source).toBe("generator");
    expect(p.calibration.ke!).toBeCloseTo(0.0112, 4);
    expect(p.calibration.disagreement!).toBeLessThan(0.01);
  });
});

describe("geometry (plane geometry)", () => {
  it("trapezoid slot area and liner perimeter", () => {
    expect(trapezoidArea(4e-3, 2e-3, 5e-3)).toBeCloseTo(15e-6, 12);
    expect(trapezoidPerimeter(4e-3, 2e-3, 5e-3)).toBeCloseTo(2e-3 + 2 * Math.hypot(5e-3, 1e-3), 12);
  });
  it("packing limits of round wire: square π/4, hexagonal π/(2√3)", () => {
    expect(SQUARE_PACKING).toBeCloseTo(0.7854, 4);
    expect(HEX_PACKING).toBeCloseTo(0.9069, 4);
  });
  it("layer build in a trapezoid slot: outer layers run where the slot is wide enough, not against the root width (geometry; common practice, no published source)", () => {
    // robot demo slot: depth 4.2, top 6.5, root 2.5, liner 0.1 mm; 0.3 mm wire along 4.2 − 0.2 = 4.0 mm → 13 a layer.
    // Layer j needs a slot width 2·((j+1)·0.3 + 0.1): 0.8, 1.4, 2.0 mm (all below the 2.5 mm root: 13 each),
    // layer 4 needs 2.6 mm, reached at y = 4.2·(2.6 − 2.5)/4.0 = 0.105 mm: length 4.1 − 0.105 = 3.995 → 13.
    const b = toothLayerBuild(45, 1, 0.3e-3, 4.2e-3, 6.5e-3, 2.5e-3, 0.1e-3);
    expect(b.perLayer).toEqual([13, 13, 13, 6]);
    expect(b.fits).toBe(true);
    // the old model (every layer against half the root width less the liner, 1.15 mm) refused this: 4 × 0.3 = 1.2 mm
    expect(b.layers * 0.3e-3).toBeGreaterThan(1.25e-3 - 0.1e-3);
    // a parallel slot 2.5 mm wide holds three layers of 0.3 mm (half width 1.25 − 0.1 = 1.15 mm): 39 turns, not 45
    const narrow = toothLayerBuild(45, 1, 0.3e-3, 4.2e-3, 2.5e-3, 2.5e-3, 0.1e-3);
    expect(narrow.perLayer).toEqual([13, 13, 13]);
    expect(narrow.fits).toBe(false);
    expect(passesOpening(0.3e-3, 3, 1.0e-3)).toBe(true);
    expect(passesOpening(0.3e-3, 4, 1.0e-3)).toBe(false);
  });
  it("lap slot rows take the width where each row is narrowest (geometry)", () => {
    // depth 6.5, top 4.2, root 2.6, liner 0.2 mm; 0.5 mm wire. Row j spans y = 0.2 + 0.5j … +0.5;
    // width at its lower edge 2.6 + 1.6·y/6.5 − 0.4 (the slot widens upward): row 0 at y 0.2 → 2.249 mm → 4 a row;
    // row 3 at y 1.7 → 2.618 → 5; row 7 at y 3.7 → 3.111 → 6; row 11 at y 5.7 → 3.603 → 7; a 13th row (to 6.7 mm) leaves the 6.3 mm room
    const b = slotLayerBuild(60, 0.5e-3, 6.5e-3, 4.2e-3, 2.6e-3, 0.2e-3);
    expect(b.perLayer).toEqual([4, 4, 4, 5, 5, 5, 5, 6, 6, 6, 6, 4]); // the last row holds the 60 − 56 left
    expect(b.room).toBeCloseTo(6.3e-3, 12);
    expect(b.fits).toBe(true);
    // 4·3 + 5·4 + 6·4 + 7 = 63 conductors in 12 rows; 64 do not fit
    expect(slotLayerBuild(63, 0.5e-3, 6.5e-3, 4.2e-3, 2.6e-3, 0.2e-3).fits).toBe(true);
    expect(slotLayerBuild(64, 0.5e-3, 6.5e-3, 4.2e-3, 2.6e-3, 0.2e-3).fits).toBe(false);
  });
  it("laying any count on a layer table (by bisection on running sums) equals filling the layers one by one", () => {
    // The reference: fill each layer in turn until the items run out or the layers do.
    const naive = (items: number, capacity: number[]) => {
      const perLayer: number[] = [];
      let placed = 0;
      for (let j = 0; j < capacity.length && placed < items; j++) {
        const used = Math.min(capacity[j], items - placed);
        perLayer.push(used);
        placed += used;
      }
      return { perLayer, fits: placed >= items };
    };
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 40 }), { maxLength: 30 }), fc.integer({ min: 0, max: 900 }), (capacity, items) => {
        let sum = 0;
        const cumulative = capacity.map((c) => {
          sum += c;
          return sum;
        });
        const table: LayerTable = { capacity, cumulative, layer: 1e-3, room: 5e-3 };
        const got = layersOf(items, table);
        const want = naive(items, capacity);
        expect(got.perLayer).toEqual(want.perLayer);
        expect(got.fits).toBe(want.fits);
        expect(got.layers).toBe(want.perLayer.length);
        expect(got.build).toBeCloseTo(want.perLayer.length * 1e-3, 12);
      }),
      { numRuns: 500 },
    );
  });
});

describe("the plan", () => {
  it("bar-to-bar of a tooth ring of C equal coils is R·(C−1)/C (textbook ring formula)", () => {
    const p = planJob(blind());
    const R = p.resistance.coil_ohm;
    for (const r of p.resistance.bar_to_bar) expect(r).toBeCloseTo((R * 4) / 5, 9);
    expect(p.resistance.terminal_ohm).toBeCloseTo((R * 2 * 3) / 5, 9);
    expect(p.resistance.terminal_hot_ohm).toBeCloseTo(p.resistance.terminal_ohm * (1 + 0.00393 * 60), 9);
  });
  it("Ke scales with turns at the same layout (EMF equation, Z = 2NC)", () => {
    const p = planJob(blind());
    expect(p.motor.ke).toBeCloseTo((p.calibration.ke! * p.design.turns) / p.original.turns, 12);
    expect(p.motor.kv).toBeCloseTo(60 / (2 * Math.PI * p.motor.ke), 9);
  });
  it("the chosen candidate meets the goal and no shown candidate at its turns count has less resistance (DESIGN.md ranking)", () => {
    const p = planJob(blind());
    expect(p.feasible).toBe(true);
    expect(Math.abs(p.goal.error_fraction!)).toBeLessThanOrEqual(p.job.target.tolerance.above);
    for (const c of p.candidates.filter((c) => c.meets_goal && c.turns === p.design.turns))
      expect(c.terminal_ohm).toBeGreaterThanOrEqual(p.design.terminal_ohm - 1e-12);
    expect(p.design.copper_fill).toBeLessThanOrEqual(p.fill_limit + 1e-12);
  });
  it("cut length is the winding plus two leads a coil, plus the spare margin", () => {
    const p = planJob(blind());
    const w = p.wire;
    expect(w.cut).toBeCloseTo((w.winding + 2 * 0.05 * 5 * p.design.strands) * 1.1, 9);
    expect(w.copper_mass).toBeCloseTo(8890 * p.design.wire.area * w.cut, 12);
  });
  it("restore keeps the original turns and takes the copper area closest to the original's, not below 97 %", () => {
    const p = planJob(loadJobFile(join(ROOT, "jobs/drill-lap-0112.yaml")));
    expect(p.design.turns).toBe(p.original.turns);
    const ratio = (p.design.strands * p.design.wire.area) / (p.original.strands * p.original.wire.area);
    expect(ratio).toBeGreaterThanOrEqual(0.97);
    expect(p.warnings.some((w) => w.code === "series_field")).toBe(true);
    expect(p.motor.noLoadSpeed).toBeNull();
    expect(p.mains).toBe(true);
  });
  it("a goal the armature cannot reach is not an error: the closest winding, feasible false, and what binds", () => {
    const p = planJob(loadJobText(blindText.replace("no_load_speed: 9000 rpm", "no_load_speed: 90000 rpm")));
    expect(p.feasible).toBe(false);
    expect(p.binding).toMatch(/limit|tolerance/);
    expect(p.warnings.some((w) => w.code === "goal_not_met")).toBe(true);
  });
  it("no stock wire passing the slot opening leaves no feasible winding and names the opening", () => {
    const p = planJob(loadJobText(blindText.replace("opening: 1.2 mm", "opening: 0.1 mm")));
    expect(p.feasible).toBe(false);
    expect(p.design.rejected_because).toContain("slot_opening");
  });
  it("a no-load test that implies negative back-EMF is named with its numbers", () => {
    const bad = blindText.replace("no_load_current: 0.18 A", "no_load_current: 9 A").replace(/  generator:.*\n/, "");
    try {
      planJob(loadJobText(bad));
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ArmwindError);
      const p = (e as ArmwindError).problems[0];
      expect(p.code).toBe("inconsistent_tests");
      expect(p.message).toMatch(/9/);
    }
  });
  it("a stall-current limit is never exceeded: the cold stall current lies at or below it, within the tolerance", () => {
    const p = planJob(loadJobFile(join(ROOT, "jobs/robot-3slot-0007.yaml")), {});
    const limit = p.job.target.stall_current!;
    expect(p.feasible).toBe(true);
    expect(p.motor.stallCurrentCold!).toBeLessThanOrEqual(limit + 1e-9);
    expect(p.motor.stallCurrentCold!).toBeGreaterThanOrEqual(limit * (1 - p.job.target.tolerance.below));
    // hot is lower still (IEC 60028: resistance rises with temperature)
    expect(p.motor.stallCurrent!).toBeLessThan(p.motor.stallCurrentCold!);
    for (const c of p.candidates.filter((c) => c.meets_goal)) expect(c.stall_current_cold!).toBeLessThanOrEqual(limit + 1e-9);
  });
  it("every demo job plans and meets its goal", () => {
    for (const f of ["blind-motor-0031", "drill-lap-0112", "chair-wave-0045", "robot-3slot-0007", "boat-7slot-0020"]) {
      const p = planJob(loadJobFile(join(ROOT, `jobs/${f}.yaml`)));
      expect(p.feasible, f).toBe(true);
    }
  });
});
