import { describe, expect, it } from "vitest";
import { ArmwindError } from "../src/errors.js";
import { barAngle, checkInvariants, diagramAngles, layoutWinding, slotAngle, viewingConvention } from "../src/winding/layout.js";
import type { WindingSpec } from "../src/winding/types.js";
import { spec } from "./helpers/winding.js";

function refusal(s: WindingSpec): { code: string; path: string; message: string } {
  try {
    layoutWinding(s);
  } catch (e) {
    expect(e).toBeInstanceOf(ArmwindError);
    return (e as ArmwindError).problems[0];
  }
  throw new Error("expected a refusal");
}

describe("textbook winding rules", () => {
  // Simplex lap: a = P, y_c = ±1; simplex wave: a = 2, y_c = (C ± 1)/p
  // (M. G. Say, "The Performance and Design of Direct Current Machines"; B. L. Theraja,
  // "A Textbook of Electrical Technology", ch. "Armature windings"; from memory).
  it("lap has P parallel paths, wave has 2", () => {
    for (const P of [2, 4, 6, 8]) {
      expect(layoutWinding(spec({ slots: 24, bars: 24, poles: P, span: Math.floor(24 / P), brushes: { count: P, width_bars: 1 } })).paths).toBe(P);
    }
    for (const [P, S] of [
      [4, 25],
      [6, 26],
    ]) {
      expect(layoutWinding(spec({ style: "wave", slots: S, bars: S, poles: P, span: Math.floor(S / P) })).paths).toBe(2);
    }
  });

  it("wave commutator pitch is (C ± 1)/p and coil k starts at bar 1 + (k−1)·y_c", () => {
    // 4 poles, 21 bars: (21+1)/2 = 11 progressive, (21−1)/2 = 10 retrogressive (textbook rule, from memory)
    const prog = layoutWinding(spec({ style: "wave", slots: 21, bars: 21, poles: 4, span: 5 }));
    expect(prog.commutator_pitch).toBe(11);
    expect(prog.coils.slice(0, 3).map((c) => [c.start_bar, c.end_bar])).toEqual([
      [1, 12],
      [12, 2],
      [2, 13],
    ]);
    const retro = layoutWinding(spec({ style: "wave", slots: 21, bars: 21, poles: 4, span: 5, progression: "retrogressive" }));
    expect(retro.commutator_pitch).toBe(10);
    // after p = 2 coils a progressive wave is one bar on, a retrogressive one bar back
    expect(prog.coils[1].end_bar).toBe(2);
    expect(retro.coils[1].end_bar).toBe(21);
    // 6 poles, 31 bars: (31+1)/3 is not whole, (31−1)/3 = 10
    const six = layoutWinding(spec({ style: "wave", slots: 31, bars: 31, poles: 6, span: 5, progression: "retrogressive" }));
    expect(six.commutator_pitch).toBe(10);
    expect(six.coils_between_adjacent_bars).toBe(3);
  });

  it("4-pole, 24-slot, 48-conductor simplex lap: y_b = 13, y_f = 11, y_c = 1 (textbook worked example, from memory)", () => {
    // Z = 48, pole pitch Z/P = 12 conductors; y_b odd and near it: 13; progressive y_f = y_b − 2 = 11.
    const l = layoutWinding(spec({ slots: 24, bars: 24, poles: 4, span: 6, brushes: { count: 4, width_bars: 1 } }));
    expect(l.back_pitch).toBe(13);
    expect(l.front_pitch).toBe(11);
    expect(l.commutator_pitch).toBe(1);
    expect(l.coil_sides_per_slot).toBe(2);
    // Conductor numbering check (top odd, bottom even): coil 1 = conductors 1 and 1 + y_b = 14 (bottom of slot 7),
    // coil 2 starts at 14 − y_f = 3 (top of slot 2)
    const c1 = l.coils[0];
    expect([c1.go_slot, c1.go_layer, c1.return_slot, c1.return_layer]).toEqual([1, "top", 7, "bottom"]);
    expect(l.coils[1].go_slot).toBe(2);
    const retro = layoutWinding(spec({ slots: 24, bars: 24, poles: 4, span: 6, progression: "retrogressive", brushes: { count: 4, width_bars: 1 } }));
    // retrogressive: y_f = y_b + 2 = 15, y_c = −1 (textbook rule, from memory)
    expect(retro.front_pitch).toBe(15);
    expect(retro.commutator_pitch).toBe(-1);
  });

  it("wave back and front pitch add to 2·y_c (y_A = (Z ± 2)/P, textbook rule, from memory)", () => {
    // 4-pole wave, 15 coils (Z = 30): y_A = (30 + 2)/4 = 8 = y_c; y_b = 7 for span 3, so y_f = 9
    const l = layoutWinding(spec({ style: "wave", slots: 15, bars: 15, poles: 4, span: 3 }));
    expect(l.commutator_pitch).toBe(8);
    expect(l.back_pitch).toBe(7);
    expect(l.front_pitch).toBe(9);
    expect(((l.back_pitch ?? 0) + (l.front_pitch ?? 0)) / 2).toBe((30 + 2) / 4);
  });
});

describe("coil tables (DESIGN.md numbering)", () => {
  it("tooth: coil k round tooth k, bar k to k+1, two sides a slot", () => {
    const l = layoutWinding(spec({ style: "tooth", slots: 5, bars: 5, span: 1, direction: "ccw" }));
    // DESIGN.md "Numbering and directions": a ccw coil k goes into slot k+1 and returns through slot k
    // (its go and return slots follow the sense; tooth k lies between slots k and k+1 either way)
    expect(l.coils.map((c) => [c.go_slot, c.return_slot, c.start_bar, c.end_bar, c.direction])).toEqual([
      [2, 1, 1, 2, "ccw"],
      [3, 2, 2, 3, "ccw"],
      [4, 3, 3, 4, "ccw"],
      [5, 4, 4, 5, "ccw"],
      [1, 5, 5, 1, "ccw"],
    ]);
    expect(l.coils.map((c) => [c.go_layer, c.return_layer])[0]).toEqual(["left", "right"]);
    // cw: into slot k, back through slot k+1
    const cw = layoutWinding(spec({ style: "tooth", slots: 5, bars: 5, span: 1, direction: "cw" }));
    expect(cw.coils.map((c) => [c.go_slot, c.return_slot])).toEqual([
      [1, 2],
      [2, 3],
      [3, 4],
      [4, 5],
      [5, 1],
    ]);
    expect(viewingConvention(l)).toMatch(/commutator end/);
    expect(l.paths).toBe(2);
    expect(l.coil_sides_per_slot).toBe(2);
    expect(l.back_pitch).toBeNull();
    expect(l.coils.every((c) => c.rides_over === 0)).toBe(true);
  });

  it("lap with u = 2: go slot ⌈k/u⌉, positions 1 and 2, retrogressive ends at bar k−1", () => {
    const l = layoutWinding(spec({ slots: 12, bars: 24, span: 5, coils_per_slot: 2, progression: "retrogressive" }));
    expect(l.coils.slice(0, 4).map((c) => [c.go_slot, c.go_position, c.return_slot, c.start_bar, c.end_bar])).toEqual([
      [1, 1, 6, 1, 24],
      [1, 2, 6, 2, 1],
      [2, 1, 7, 3, 2],
      [2, 2, 7, 4, 3],
    ]);
    expect(l.coil_sides_per_slot).toBe(4);
    expect(l.back_pitch).toBe(2 * 2 * 5 + 1);
    expect(l.circuit_order.slice(0, 3)).toEqual([1, 24, 23]);
  });

  it("lap P > 2: equalizer groups of bars 2C/P apart, warning when not fitted", () => {
    const l = layoutWinding(spec({ slots: 24, bars: 24, poles: 4, span: 6, brushes: { count: 4, width_bars: 1 } }));
    expect(l.equalizer_groups.length).toBe(12);
    expect(l.equalizer_groups[0]).toEqual([1, 13]);
    expect(l.warnings.map((w) => w.code)).toContain("lap_without_equalizers");
    const six = layoutWinding(spec({ slots: 18, bars: 18, poles: 6, span: 3, equalizers: true, brushes: { count: 6, width_bars: 1 } }));
    expect(six.equalizer_groups[1]).toEqual([2, 8, 14]);
    expect(six.equalizers).toBe(true);
    expect(six.warnings.map((w) => w.code)).not.toContain("lap_without_equalizers");
  });

  it("wave with a dead coil: C = uS − 1 bars, the dead coil last with no bars", () => {
    // 4 poles, 12 slots: (12 ± 1)/2 not whole, the trade leaves one coil dead: 11 bars, y_c = 6 (textbook practice, from memory)
    const l = layoutWinding(spec({ style: "wave", slots: 12, bars: 11, poles: 4, span: 3, dead_coil: true }));
    expect(l.coils.length).toBe(12);
    const dead = l.coils[11];
    expect(dead).toMatchObject({ index: 12, dead: true, start_bar: null, end_bar: null, go_slot: 12 });
    expect(l.commutator_pitch).toBe(6);
    expect(checkInvariants(l)).toEqual([]);
  });

  it("rides_over counts earlier coils whose slot arc overlaps (lap)", () => {
    const l = layoutWinding(spec({ slots: 12, bars: 12, span: 3 }));
    // coil k (k ≥ 3) overlaps coils k−2, k−1; coil 12 also overlaps coils 1 and 2 (arc 12→3)
    expect(l.coils.map((c) => c.rides_over)).toEqual([0, 1, 2, 2, 2, 2, 2, 2, 2, 2, 3, 4]);
  });
});

describe("refusals name the field and the nearest valid choice", () => {
  it("span 0 and span beyond pole pitch + 1", () => {
    expect(refusal(spec({ span: 0 }))).toMatchObject({ code: "span_zero", path: "winding.span" });
    const long = refusal(spec({ span: 8 })); // pole pitch 6: 7 is the longest (common practice, no published source)
    expect(long).toMatchObject({ code: "span_too_long", path: "winding.span" });
    expect(long.message).toContain("nearest valid span is 7");
    expect(() => layoutWinding(spec({ span: 7 }))).not.toThrow();
  });
  it("odd poles", () => {
    expect(refusal(spec({ poles: 3 }))).toMatchObject({ code: "odd_poles", path: "armature.field_poles" });
  });
  it("bars neither a multiple of slots nor one less with a dead coil", () => {
    const r = refusal(spec({ bars: 13 }));
    expect(r).toMatchObject({ code: "bars_mismatch", path: "armature.bars" });
    expect(r.message).toContain("12");
    expect(refusal(spec({ bars: 24 })).message).toContain("coils_per_slot: 2");
    expect(refusal(spec({ style: "wave", poles: 4, slots: 13, bars: 12, span: 3 })).message).toContain("dead_coil: true");
    expect(refusal(spec({ style: "tooth", slots: 5, bars: 10, span: 1 }))).toMatchObject({ code: "bars_mismatch" });
  });
  it("wave without a whole pitch and no dead coil says what the trade does", () => {
    const r = refusal(spec({ style: "wave", poles: 4, slots: 12, bars: 12, span: 3 }));
    expect(r).toMatchObject({ code: "wave_no_pitch", path: "armature.bars" });
    expect(r.message).toMatch(/dead_coil: true with 11 bars/);
  });
  it("wave on 2 poles points to lap", () => {
    expect(refusal(spec({ style: "wave", poles: 2 }))).toMatchObject({ code: "wave_two_poles", path: "winding.style" });
  });
  it("lap P > 2 with slots not divisible by p names the nearest counts", () => {
    const r = refusal(spec({ poles: 6, slots: 26, bars: 26, span: 4, brushes: { count: 6, width_bars: 1 } }));
    expect(r).toMatchObject({ code: "lap_not_divisible", path: "armature.slots" });
    expect(r.message).toContain("24 or 27");
    const b = refusal(spec({ poles: 4, slots: 9, bars: 18, coils_per_slot: 2, span: 2 }));
    expect(b).toMatchObject({ code: "lap_not_divisible", path: "armature.slots" });
  });
});

describe("diagram angles and lead throw", () => {
  it("slot k at (k−1)·2π/S; bar 1 lead_throw bars clockwise from coil 1's centre line", () => {
    const l0 = layoutWinding(spec({ slots: 12, bars: 12, span: 5 }));
    expect(slotAngle(l0, 4)).toBeCloseTo((3 * 2 * Math.PI) / 12, 12);
    // coil 1 from slot 1 to slot 6: centre line at 2.5 slot pitches = 2.5·30° = 75°
    expect(barAngle(l0, 1)).toBeCloseTo((75 * Math.PI) / 180, 12);
    const l2 = layoutWinding(spec({ slots: 12, bars: 12, span: 5, lead_throw: 2 }));
    expect(barAngle(l2, 1)).toBeCloseTo(((75 + 60) * Math.PI) / 180, 12);
    // the lead throw never renumbers the table
    expect(l2.coils.map((c) => c.start_bar)).toEqual(l0.coils.map((c) => c.start_bar));
    const d = diagramAngles(l2);
    expect(d.bar_angle_rad[1] - d.bar_angle_rad[0]).toBeCloseTo((2 * Math.PI) / 12, 12);
    expect(d.slot_angle_rad.length).toBe(12);
    // tooth, 5 slots, lead throw −1: bar 1 on tooth 1's centre (36°) less one bar (72°) → 324°
    const t = layoutWinding(spec({ style: "tooth", slots: 5, bars: 5, span: 1, lead_throw: -1 }));
    expect(barAngle(t, 1)).toBeCloseTo((324 * Math.PI) / 180, 12);
  });
});

describe("brush notes", () => {
  it("a brush wider than a bar shorts coils and says so", () => {
    const l = layoutWinding(spec({ brushes: { count: 2, width_bars: 2 } }));
    const n = l.notes.join(" ");
    expect(n).toMatch(/up to 3 adjacent bars/);
    expect(n).toMatch(/from bar b\+0 to b\+1, from bar b\+1 to b\+2/);
  });
});
