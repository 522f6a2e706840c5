/**
 * The linear ring solver (src/winding/ring.ts `CycleNetwork`, the inversion's `stepsFromWindows`)
 * against the tests' own nodal solution (Kirchhoff's current law, dense elimination,
 * test/helpers/nodal.ts) over random tooth, lap and wave rings up to 400 bars. No timing here:
 * speed is in `npm run bench` (bench/ring.ts).
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { barToBar, ringNetwork, terminalResistance } from "../src/winding/ring.js";
import { solveCoils } from "../src/winding/diagnose.js";
import { layoutWinding } from "../src/winding/layout.js";
import type { WindingLayout, WindingSpec } from "../src/winding/types.js";
import { nodal, nodalReadings } from "./helpers/nodal.js";
import { spec } from "./helpers/winding.js";

/** A random simplex winding up to 400 bars that the layout accepts (wave counts that do not close are skipped). */
const anySpec = fc.oneof(
  fc.record({ n: fc.integer({ min: 3, max: 400 }) }).map(({ n }) => spec({ style: "tooth", slots: n, bars: n, span: 1 })),
  fc
    .record({ S: fc.integer({ min: 3, max: 200 }), u: fc.integer({ min: 1, max: 2 }), f: fc.double({ min: 0.2, max: 0.9, noNaN: true }), retro: fc.boolean() })
    .map(({ S, u, f, retro }) =>
      spec({ slots: S, bars: S * u, coils_per_slot: u, span: Math.max(1, Math.floor(f * S)), progression: retro ? "retrogressive" : "progressive" }),
    ),
  fc.record({ m: fc.integer({ min: 3, max: 199 }), p: fc.constantFrom(2, 3, 4), retro: fc.boolean() }).map(({ m, p, retro }) => {
    // C = p·m ± 1 closes a simplex wave: y_c = (C ∓ 1)/p whole
    const C = Math.min(400, p * m + (retro ? 1 : -1));
    return spec({
      style: "wave",
      slots: C,
      bars: C,
      poles: 2 * p,
      span: Math.max(1, Math.floor(C / (2 * p))),
      progression: retro ? "retrogressive" : "progressive",
    });
  }),
);

function layoutOrNull(s: WindingSpec): WindingLayout | null {
  try {
    return layoutWinding(s);
  } catch {
    return null;
  }
}

describe("forward readings: the cycle solver equals the nodal solution (Kirchhoff)", () => {
  it("random rings up to 400 bars, random coils, a few random bar pairs and brush sets", () => {
    fc.assert(
      fc.property(anySpec, fc.integer({ min: 0, max: 1e9 }), (s, seed) => {
        const l = layoutOrNull(s);
        fc.pre(l !== null);
        const rnd = mulberry(seed);
        const R = l!.coils.map(() => 0.2 + 4.8 * rnd());
        const net = ringNetwork(l!, R);
        const C = l!.bars;
        const pairs = C > 120 ? 1 : 4; // the oracle's dense elimination is cubic: one pair on the big rings
        for (let t = 0; t < pairs; t++) {
          const a = 1 + Math.floor(rnd() * C);
          const b = 1 + Math.floor(rnd() * C);
          const got = net.between([a], [b]);
          const want = a === b ? 0 : nodal(l!, R, [a], [b]);
          expect(Math.abs(got - want)).toBeLessThanOrEqual(1e-9 * Math.max(1, want));
        }
        // two brushes, each on two adjacent bars
        const a = 1 + Math.floor(rnd() * C);
        const b = ((a + Math.floor(C / 2) - 1) % C) + 1;
        const plus = [a, (a % C) + 1];
        const minus = [b, (b % C) + 1];
        if (C <= 120 && !plus.some((x) => minus.includes(x))) {
          expect(net.between(plus, minus)).toBeCloseTo(nodal(l!, R, plus, minus), 9);
        }
      }),
      { numRuns: 30, seed: 4242 },
    );
  });

  it("every bar-to-bar reading of small rings, with one open coil", () => {
    fc.assert(
      fc.property(anySpec, fc.integer({ min: 0, max: 1e9 }), (s, seed) => {
        const l = layoutOrNull(s);
        fc.pre(l !== null && l.bars <= 40);
        const rnd = mulberry(seed);
        const R = l!.coils.map(() => 0.2 + 4.8 * rnd());
        R[Math.floor(rnd() * R.length)] = Infinity;
        const got = barToBar(l!, R);
        const want = nodalReadings(
          l!,
          R.map((x) => (Number.isFinite(x) ? x : 1e300)),
        );
        got.forEach((g, i) => expect(Math.abs(g - want[i])).toBeLessThanOrEqual(1e-9 * Math.max(1, want[i])));
      }),
      { numRuns: 40, seed: 99 },
    );
  });

  it("the 3-bar ring by hand: R_coil·2/3 bar to bar, R_coil/2 at best over a turn with brushes at most half a bar wide (Kirchhoff)", () => {
    const l = layoutWinding(spec({ style: "tooth", slots: 3, bars: 3, span: 1, brushes: { count: 2, width_bars: 0.4 } }));
    expect(barToBar(l, [3, 3, 3])).toEqual([2, 2, 2].map((x) => expect.closeTo(x, 12)));
    expect(terminalResistance(l, [3, 3, 3]).min).toBeCloseTo(1.5, 12);
  });
});

describe("terminal resistance over a turn (issue 10 item 1)", () => {
  it("3 bars: brushes at most half a bar wide never touch one bar together, least R_coil/2 (Kirchhoff); wider: brush_short, no least reading", () => {
    for (const w of [0.1, 0.3, 0.5]) {
      const l = layoutWinding(spec({ style: "tooth", slots: 3, bars: 3, span: 1, brushes: { count: 2, width_bars: w } }));
      const t = terminalResistance(l, [2, 2, 2]);
      expect(t.brush_short).toBe(false);
      expect(t.min).toBeCloseTo(1, 12);
      expect(l.warnings.some((x) => x.code === "brush_short")).toBe(false);
    }
    for (const w of [0.6, 0.9, 1]) {
      const l = layoutWinding(spec({ style: "tooth", slots: 3, bars: 3, span: 1, brushes: { count: 2, width_bars: w } }));
      const t = terminalResistance(l, [2, 2, 2]);
      expect(t.brush_short).toBe(true);
      expect(t.min).toBeNull();
      expect(t.max).toBeGreaterThan(0);
      expect(l.warnings.find((x) => x.code === "brush_short")?.path).toBe("winding.brushes.width_bars");
    }
  });

  it("5 bars with brushes a bar wide (the blind demo's) never short: the least reading stays", () => {
    const l = layoutWinding(spec({ style: "tooth", slots: 5, bars: 5, span: 1 }));
    expect(terminalResistance(l, [1, 1, 1, 1, 1]).min).toBeCloseTo(2 / 3, 12);
  });
});

describe("inversion: readings of up to 400 bars give their coils back", () => {
  it("random rings; readings from the forward solve, checked against the nodal solution on sampled pairs above", () => {
    fc.assert(
      fc.property(anySpec, fc.integer({ min: 0, max: 1e9 }), (s, seed) => {
        const l = layoutOrNull(s);
        fc.pre(l !== null);
        const rnd = mulberry(seed);
        // a wave's chains stay below half the ring with a 2× spread (see test/diagnose.test.ts)
        const wave = l!.spec.style === "wave";
        const R = l!.coils.map(() => (wave ? 0.7 + 0.7 * rnd() : 0.2 + 4.8 * rnd()));
        const sol = solveCoils(l!, barToBar(l!, R));
        l!.coils.forEach((c, i) => {
          if (!c.dead) expect(Math.abs(sol.coil_ohm[i] - R[i])).toBeLessThan(1e-6 * Math.max(1, R[i]));
        });
      }),
      { numRuns: 40, seed: 7 },
    );
  });
});

describe("riding counts: the windowed count equals the definition (arcs of span slots that share a slot)", () => {
  it("random laps", () => {
    fc.assert(
      fc.property(fc.integer({ min: 3, max: 60 }), fc.integer({ min: 1, max: 3 }), fc.double({ min: 0.05, max: 1, noNaN: true }), (S, u, f) => {
        const l = layoutOrNull(spec({ slots: S, bars: S * u, coils_per_slot: u, span: Math.max(1, Math.floor(f * (S - 1))) }));
        fc.pre(l !== null);
        const span = l!.spec.span;
        const arc = (g: number) => new Set(Array.from({ length: span }, (_, i) => ((g - 1 + i) % S) + 1));
        l!.coils.forEach((c, k) => {
          const mine = arc(c.go_slot);
          const n = l!.coils.slice(0, k).filter((o) => [...arc(o.go_slot)].some((x) => mine.has(x))).length;
          expect(c.rides_over).toBe(n);
        });
      }),
      { numRuns: 60, seed: 5 },
    );
  });
});

/** A small seeded generator (mulberry32), so each property run is repeatable. */
function mulberry(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
