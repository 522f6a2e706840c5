import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { ArmwindError } from "../src/errors.js";
import { checkInvariants, layoutWinding } from "../src/winding/layout.js";
import type { WindingLayout, WindingSpec } from "../src/winding/types.js";
import { spec } from "./helpers/winding.js";

const arbSpec: fc.Arbitrary<WindingSpec> = fc
  .record({
    style: fc.constantFrom("tooth", "lap", "wave") as fc.Arbitrary<WindingSpec["style"]>,
    slots: fc.integer({ min: 2, max: 60 }),
    u: fc.integer({ min: 1, max: 4 }),
    barsShift: fc.constantFrom(0, 0, 0, -1, 1, 7),
    poles: fc.constantFrom(2, 2, 4, 4, 6, 8, 3, 10),
    spanFrac: fc.oneof(fc.double({ min: 0.5, max: 1.1, noNaN: true }), fc.constantFrom(0, 0.2, 1.25, 1.6)),
    dead_coil: fc.constantFrom(false, false, false, true),
    equalizers: fc.boolean(),
    progression: fc.constantFrom("progressive", "retrogressive") as fc.Arbitrary<WindingSpec["progression"]>,
    lead_throw: fc.integer({ min: -5, max: 5 }),
    count: fc.constantFrom(-1, -1, -1, 0, 0, 0, 1, 3),
    width: fc.constantFrom(0.5, 1, 1.5, 2, 3),
  })
  .map((r) => {
    const span =
      r.style === "tooth" ? 1 : r.spanFrac === 0 ? 0 : Math.max(1, Math.round((r.spanFrac * r.slots) / Math.max(1, r.poles))) + (r.spanFrac > 1.2 ? 2 : 0);
    const u = r.style === "tooth" ? 1 : r.u;
    return {
      style: r.style,
      slots: r.slots,
      bars: Math.max(2, u * r.slots + r.barsShift),
      poles: r.poles,
      span,
      coils_per_slot: u,
      dead_coil: r.dead_coil,
      equalizers: r.equalizers,
      progression: r.progression,
      lead_throw: r.lead_throw,
      direction: "cw" as const,
      brushes: { count: r.count === -1 ? 2 : r.count === 0 ? r.poles : r.count, width_bars: r.width },
    };
  });

/** The invariants checked again here, independently of checkInvariants. */
function ownChecks(l: WindingLayout): void {
  const s = l.spec;
  const C = l.bars;
  const live = l.coils.filter((c) => !c.dead);
  // each bar takes two coil ends, one start and one finish
  const starts = new Map<number, number>();
  const ends = new Map<number, number>();
  for (const c of live) {
    starts.set(c.start_bar!, (starts.get(c.start_bar!) ?? 0) + 1);
    ends.set(c.end_bar!, (ends.get(c.end_bar!) ?? 0) + 1);
  }
  for (let b = 1; b <= C; b++) {
    expect(starts.get(b)).toBe(1);
    expect(ends.get(b)).toBe(1);
  }
  // closure from bar 1
  let bar = 1;
  const seen = new Set<number>();
  for (let i = 0; i < live.length; i++) {
    const c = live.find((x) => x.start_bar === bar)!;
    expect(seen.has(c.index)).toBe(false);
    seen.add(c.index);
    bar = c.end_bar!;
  }
  expect(bar).toBe(1);
  expect(seen.size).toBe(live.length);
  // slot positions: each used once, each slot full
  const keys = new Set<string>();
  for (const c of l.coils) {
    keys.add(`${c.go_slot}${c.go_layer}${c.go_position}`);
    keys.add(`${c.return_slot}${c.return_layer}${c.return_position}`);
  }
  expect(keys.size).toBe(2 * l.coils.length);
  expect(2 * l.coils.length).toBe(s.slots * l.coil_sides_per_slot);
  // textbook rules (Say; Theraja; from memory): lap a = P, y_c = ±1; wave a = 2, y_c = (C ± 1)/p
  if (s.style === "lap") {
    expect(l.paths).toBe(s.poles);
    expect(Math.abs(l.commutator_pitch)).toBe(1);
    expect(C).toBe(s.coils_per_slot * s.slots);
  }
  if (s.style === "wave") {
    expect(l.paths).toBe(2);
    expect(l.commutator_pitch * (s.poles / 2)).toBe(s.progression === "progressive" ? C + 1 : C - 1);
    expect((l.back_pitch ?? 0) + (l.front_pitch ?? 0)).toBe(2 * l.commutator_pitch);
  }
  if (s.style !== "tooth") {
    expect(s.span).toBeGreaterThanOrEqual(1);
    expect(s.span).toBeLessThanOrEqual(s.slots / s.poles + 1); // pole pitch + 1 (common practice, no published source)
  }
  expect(s.poles % 2).toBe(0);
}

describe("every table layoutWinding accepts holds its invariants; every refusal is an ArmwindError", () => {
  it("over many slot, bar, pole, span and u counts", () => {
    let accepted = 0;
    const styles = new Map<string, number>();
    let refused = 0;
    fc.assert(
      fc.property(arbSpec, (s) => {
        let l: WindingLayout;
        try {
          l = layoutWinding(s);
        } catch (e) {
          expect(e).toBeInstanceOf(ArmwindError);
          const p = (e as ArmwindError).problems[0];
          expect(p.code).toMatch(/^[a-z]+(_[a-z]+)*$/);
          expect(p.path).toMatch(/^(winding|armature)\.[a-z_.]+$/);
          expect(p.message.length).toBeGreaterThan(20);
          expect((e as ArmwindError).status).toBe(1);
          refused++;
          return;
        }
        accepted++;
        styles.set(s.style, (styles.get(s.style) ?? 0) + 1);
        expect(checkInvariants(l)).toEqual([]);
        ownChecks(l);
      }),
      { numRuns: 10000, seed: 20261201 },
    );
    // the generator must exercise both branches
    expect(accepted).toBeGreaterThan(800);
    for (const st of ["tooth", "lap", "wave"]) expect(styles.get(st) ?? 0).toBeGreaterThan(80);
    expect(refused).toBeGreaterThan(300);
  });

  it("wave tables with a dead coil are accepted across counts that need one", () => {
    let n = 0;
    for (let S = 5; S <= 40; S++) {
      for (const P of [4, 6, 8]) {
        const p = P / 2;
        const C = S - 1;
        if ((S + 1) % p === 0 || (S - 1) % p === 0) continue; // no dead coil needed
        for (const prog of ["progressive", "retrogressive"] as const) {
          if ((prog === "progressive" ? (C + 1) % p : (C - 1) % p) !== 0) continue;
          const l = layoutWinding({
            style: "wave",
            slots: S,
            bars: C,
            poles: P,
            span: Math.max(1, Math.floor(S / P)),
            coils_per_slot: 1,
            dead_coil: true,
            equalizers: false,
            progression: prog,
            lead_throw: 0,
            direction: "cw",
            brushes: { count: 2, width_bars: 1 },
          });
          expect(l.coils.filter((c) => c.dead).length).toBe(1);
          expect(l.coils[l.coils.length - 1].dead).toBe(true);
          ownChecks(l);
          n++;
        }
      }
    }
    expect(n).toBeGreaterThan(10);
  });

  it("checkInvariants catches broken tables", () => {
    const base: WindingSpec = spec();
    const l = layoutWinding(base);
    const twoInOne = structuredClone(l);
    twoInOne.coils[1].go_slot = 1; // two go sides at slot 1 top
    expect(checkInvariants(twoInOne).join(" ")).toMatch(/share slot 1 top/);
    const badBar = structuredClone(l);
    badBar.coils[3].end_bar = 7;
    expect(checkInvariants(badBar).join(" ")).toMatch(/bar 7 takes 3 coil ends/);
    const twoRings = structuredClone(l);
    // coils 1..6 close on bars 1..6 and 7..12 on the rest: every bar still takes two ends
    twoRings.coils[5].end_bar = 1;
    twoRings.coils[11].end_bar = 7;
    expect(checkInvariants(twoRings).join(" ")).toMatch(/passes 6 of 12 live coils/);
  });
});
