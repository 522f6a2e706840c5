import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { layoutWinding } from "../src/winding/layout.js";
import { barToBar, equalizedLapBarToBar, lapBrushesResistance, ringBarToBar, ringSplit, terminalResistance, waveBarToBar } from "../src/winding/ring.js";
import type { WindingLayout } from "../src/winding/types.js";
import { spec } from "./helpers/winding.js";
import { nodal } from "./helpers/nodal.js";

const close = (a: number, b: number, rel = 1e-9) => expect(Math.abs(a - b)).toBeLessThanOrEqual(rel * Math.max(1, Math.abs(b)));

describe("closed forms against the network (equal coils)", () => {
  // DESIGN.md "The models" (ring of C equal coils; wave p coils between adjacent bars; two brushes m / C − m)
  it("tooth and simplex lap: R·(C−1)/C", () => {
    for (const C of [3, 5, 7, 12, 24]) {
      const l = layoutWinding(spec({ style: "tooth", slots: C, bars: C, span: 1 }));
      const r = barToBar(l, new Array(C).fill(2.5));
      for (const x of r) close(x, ringBarToBar(2.5, C));
      close(r[0], nodal(l, new Array(C).fill(2.5), [1], [2]));
    }
    const lap = layoutWinding(spec({ slots: 12, bars: 36, coils_per_slot: 3, span: 6, progression: "retrogressive" }));
    for (const x of barToBar(lap, new Array(36).fill(1))) close(x, (1 * 35) / 36);
  });

  it("simplex wave: R·p·(C−p)/C", () => {
    for (const [S, P, prog] of [
      [15, 4, "progressive"],
      [20, 6, "progressive"],
      [25, 8, "retrogressive"],
    ] as const) {
      const l = layoutWinding(spec({ style: "wave", slots: S, bars: S, poles: P, span: Math.floor(S / P), progression: prog }));
      const p = P / 2;
      const r = barToBar(l, new Array(S).fill(1.7));
      for (const x of r) close(x, waveBarToBar(1.7, S, p));
      close(r[3], nodal(l, new Array(S).fill(1.7), [4], [5]));
    }
  });

  it("two brushes splitting the ring: R·m·(C−m)/C, single/bridged on even and odd C", () => {
    // even C = 12, brushes on bars 1 and 7: 6/6; bridged (1,2) and (7,8): 5/5 with two coils shorted
    const even = layoutWinding(spec({}));
    const t = terminalResistance(even, new Array(12).fill(1));
    close(t.single, ringSplit(1, 12, 6));
    close(t.bridged, ringSplit(1, 10, 5));
    close(t.min!, t.bridged);
    close(t.max, t.single);
    // odd C = 5 (tooth): single 2/3 split = 1.2 R; one brush bridging: 2 R ∥ 2 R = R; both bridging:
    // 1 R ∥ 2 R = 2/3 R. Brushes a bar wide 180° apart: one is on a single bar only at alignment, the
    // other then bridges, so the reading swings 2/3 R … R.
    const odd = layoutWinding(spec({ style: "tooth", slots: 5, bars: 5, span: 1 }));
    const to = terminalResistance(odd, new Array(5).fill(1));
    close(to.single, ringSplit(1, 5, 2));
    close(to.bridged, 2 / 3);
    close(to.min!, 2 / 3);
    close(to.max, 1);
    // narrow (metal finger) brushes: both on single bars at some positions, so the reading swings R … 1.2 R
    const narrow = layoutWinding(spec({ style: "tooth", slots: 5, bars: 5, span: 1, brushes: { count: 2, width_bars: 0.3 } }));
    const tn = terminalResistance(narrow, new Array(5).fill(1));
    close(tn.min!, 1);
    close(tn.max, 1.2);
    close(to.bridged, nodal(odd, new Array(5).fill(1), [1, 2], [3, 4]));
  });

  it("lap with P brushes: P paths of C/P coils, R·C/P²", () => {
    const l = layoutWinding(spec({ slots: 24, bars: 24, poles: 4, span: 6, brushes: { count: 4, width_bars: 1 } }));
    const t = terminalResistance(l, new Array(24).fill(0.8));
    close(t.single, lapBrushesResistance(0.8, 24, 4));
    close(t.single, nodal(l, new Array(24).fill(0.8), [1, 13], [7, 19]));
  });

  it("equalizers fitted break the ring formula; the folded ring gives (R/p)·(n−1)/n", () => {
    const l = layoutWinding(spec({ slots: 24, bars: 24, poles: 4, span: 6, equalizers: true, brushes: { count: 4, width_bars: 1 } }));
    const R = new Array(24).fill(1);
    const r = barToBar(l, R);
    close(r[0], nodal(l, R, [1], [2]));
    close(r[0], equalizedLapBarToBar(1, 24, 2));
    expect(Math.abs(r[0] - ringBarToBar(1, 24))).toBeGreaterThan(0.4);
    expect(terminalResistance(l, R).validity).toMatch(/equalizers fitted/);
  });
});

describe("unequal coils: barToBar and terminalResistance against the test's own nodal solution", () => {
  const layouts: WindingLayout[] = [
    layoutWinding(spec({ style: "tooth", slots: 7, bars: 7, span: 1 })),
    layoutWinding(spec({ slots: 10, bars: 20, coils_per_slot: 2, span: 5 })),
    layoutWinding(spec({ slots: 18, bars: 18, poles: 6, span: 3, progression: "retrogressive", brushes: { count: 6, width_bars: 1 } })),
    layoutWinding(spec({ slots: 12, bars: 24, coils_per_slot: 2, poles: 4, span: 3, equalizers: true, brushes: { count: 4, width_bars: 1 } })),
    layoutWinding(spec({ style: "wave", slots: 17, bars: 17, poles: 4, span: 4 })),
    layoutWinding(spec({ style: "wave", slots: 12, bars: 11, poles: 4, span: 3, dead_coil: true })),
  ];
  it.each(layouts.map((l, i) => [i, l] as const))("layout %i", (_i, l) => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0.1, max: 10, noNaN: true }), { minLength: l.coils.length, maxLength: l.coils.length }), (R) => {
        const r = barToBar(l, R);
        const C = l.bars;
        for (let i = 1; i <= C; i++) close(r[i - 1], nodal(l, R, [i], [(i % C) + 1]), 1e-8);
        const t = terminalResistance(l, R);
        expect(t.min).toBeLessThanOrEqual(t.max);
        if (l.spec.style !== "wave") {
          const P = l.spec.poles;
          const n = l.spec.brushes.count;
          const pos = (j: number) => 1 + Math.floor((j * C) / P);
          const plus: number[] = [];
          const minus: number[] = [];
          const plusB: number[] = [];
          const minusB: number[] = [];
          for (let j = 0; j < n; j++) {
            (j % 2 ? minus : plus).push(pos(j));
            (j % 2 ? minusB : plusB).push(pos(j), (pos(j) % C) + 1);
          }
          close(t.single, nodal(l, R, plus, minus), 1e-8);
          close(t.bridged, nodal(l, R, plusB, minusB), 1e-8);
        }
      }),
      { numRuns: 40, seed: 7 },
    );
  });
});

describe("open and shorted coils in the network", () => {
  it("an open coil: the bars across it read the rest in series, the others read their own coil", () => {
    const l = layoutWinding(spec({ style: "tooth", slots: 5, bars: 5, span: 1 }));
    const r = barToBar(l, [1, 2, Infinity, 1, 1]);
    close(r[2], 5);
    close(r[0], 1);
    close(r[1], 2);
  });
  it("a 0 Ω coil reads 0 across its bars", () => {
    const l = layoutWinding(spec({ style: "tooth", slots: 5, bars: 5, span: 1 }));
    expect(barToBar(l, [1, 0, 1, 1, 1])[1]).toBe(0);
  });
});
