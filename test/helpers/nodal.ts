/**
 * The tests' own solution of a commutator's resistor network, sharing no code with src/winding:
 * bars are nodes, each live coil a conductance between its start and end bar.
 */
import type { WindingLayout } from "../../src/winding/types.js";

/**
 * Independent nodal solution written here (not the code under test): Kirchhoff's current law at
 * every node, G·v = i, with 1 A injected at the + supernode and the − supernode grounded; the
 * bars of one brush (or of one equalizer group) form one supernode. Plain Gaussian elimination.
 */
export function nodal(layout: WindingLayout, coilOhm: number[], plus: number[], minus: number[]): number {
  const C = layout.bars;
  const group = Array.from({ length: C + 1 }, (_, i) => i);
  const join = (a: number, b: number) => {
    const ga = group[a];
    const gb = group[b];
    for (let i = 1; i <= C; i++) if (group[i] === gb) group[i] = ga;
  };
  for (const b of plus) join(plus[0], b);
  for (const b of minus) join(minus[0], b);
  if (layout.equalizers) for (const g of layout.equalizer_groups) for (const b of g) join(g[0], b);
  const ids = [...new Set(group.slice(1))];
  const gp = group[plus[0]];
  const gm = group[minus[0]];
  if (gp === gm) return 0;
  const unknown = ids.filter((g) => g !== gm);
  const at = new Map(unknown.map((g, i) => [g, i]));
  const n = unknown.length;
  const G = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const I = new Array<number>(n).fill(0);
  I[at.get(gp)!] = 1;
  layout.coils.forEach((c, k) => {
    if (c.dead) return;
    const a = group[c.start_bar!];
    const b = group[c.end_bar!];
    if (a === b) return;
    const g = 1 / coilOhm[k];
    const ia = at.get(a);
    const ib = at.get(b);
    if (ia !== undefined) G[ia][ia] += g;
    if (ib !== undefined) G[ib][ib] += g;
    if (ia !== undefined && ib !== undefined) {
      G[ia][ib] -= g;
      G[ib][ia] -= g;
    }
  });
  // elimination
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(G[r][c]) > Math.abs(G[p][c])) p = r;
    [G[p], G[c]] = [G[c], G[p]];
    [I[p], I[c]] = [I[c], I[p]];
    for (let r = c + 1; r < n; r++) {
      const f = G[r][c] / G[c][c];
      for (let k = c; k < n; k++) G[r][k] -= f * G[c][k];
      I[r] -= f * I[c];
    }
  }
  const v = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = I[r];
    for (let k = r + 1; k < n; k++) s -= G[r][k] * v[k];
    v[r] = s / G[r][r];
  }
  return v[at.get(gp)!];
}

/** Bar-to-bar readings r1 … rC by the nodal solution: r_i between bar i and bar i+1 (rC: C and 1). */
export function nodalReadings(layout: WindingLayout, coilOhm: number[]): number[] {
  const C = layout.bars;
  return Array.from({ length: C }, (_, k) => nodal(layout, coilOhm, [k + 1], [((k + 1) % C) + 1]));
}
