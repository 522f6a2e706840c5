/**
 * The commutator ring as a resistor network: bars are nodes, each live coil an edge from its
 * start bar to its end bar, fitted equalizers ideal (0 Ω) links between the bars of a group.
 *
 * A simplex tooth, lap or wave winding without equalizers closes into ONE cycle through every bar
 * (lap: in winding order; wave: in circuit order). On a cycle, Kirchhoff's laws give every reading
 * in closed form: with the + bars joined and the − bars joined, the arcs between consecutive
 * marked bars whose ends differ in sign are independent paths in parallel, each the series sum of
 * its coils (an arc between two bars of the same sign carries no current). With prefix sums of
 * the coil resistances along the cycle, a reading costs O(marked bars), so the C bar-to-bar
 * readings and a full turn of the rotor are linear in C (`CycleNetwork`). Equalizers add chords
 * of 0 Ω and break the cycle: that network is solved from the nodal equations (Kirchhoff's current
 * law on the weighted graph Laplacian, a dense solve; `Network`).
 *
 * Units: resistances in Ω; bar numbers 1 … C.
 */
import { inputError, type Warning } from "../errors.js";
import type { WindingLayout } from "./types.js";

const mod1 = (n: number, m: number) => ((((n - 1) % m) + m) % m) + 1;

// ---------------------------------------------------------------------------------------------
// closed forms for equal coils (docs/contracts.md "The models": any DC-machine text on armature
// resistance; the ring formula is the parallel combination of the two arcs of the ring)

/**
 * Bar-to-bar resistance (Ω) of a closed ring of C equal coils of R Ω (tooth and simplex lap):
 * one coil in parallel with the other C − 1: R·(C − 1)/C.
 */
export function ringBarToBar(coilOhm: number, bars: number): number {
  return (coilOhm * (bars - 1)) / bars;
}

/**
 * Bar-to-bar resistance (Ω) of a simplex wave of C equal coils of R Ω on P = 2p poles: p coils lie
 * in series between adjacent bars, in parallel with the other C − p: R·p·(C − p)/C.
 */
export function waveBarToBar(coilOhm: number, bars: number, polePairs: number): number {
  return (coilOhm * polePairs * (bars - polePairs)) / bars;
}

/** Resistance (Ω) between two brushes that split a ring of C equal coils of R Ω into m and C − m coils: R·m·(C − m)/C. */
export function ringSplit(coilOhm: number, bars: number, m: number): number {
  return (coilOhm * m * (bars - m)) / bars;
}

/** Terminal resistance (Ω) of a simplex lap of C equal coils on P poles with P brushes (P | C): P paths of C/P coils in parallel, R·C/P². */
export function lapBrushesResistance(coilOhm: number, bars: number, poles: number): number {
  return (coilOhm * bars) / (poles * poles);
}

/**
 * Bar-to-bar resistance (Ω) of a simplex lap of C equal coils on P = 2p poles with every equalizer
 * group fitted (ideal links): the ring folds into n = C/p nodes, p coils in parallel between
 * neighbours, so (R/p)·(n − 1)/n. (Derived here from the ring formula; independent nodal check in the tests.)
 */
export function equalizedLapBarToBar(coilOhm: number, bars: number, polePairs: number): number {
  const n = bars / polePairs;
  return ((coilOhm / polePairs) * (n - 1)) / n;
}

// ---------------------------------------------------------------------------------------------
// linear algebra

/** Solve A x = b in place by Gaussian elimination with partial pivoting; null when A is singular. */
export function solveDense(A: number[][], b: number[]): number[] | null {
  const n = b.length;
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(A[r][c]) > Math.abs(A[piv][c])) piv = r;
    if (!(Math.abs(A[piv][c]) > 1e-300)) return null;
    if (piv !== c) {
      [A[piv], A[c]] = [A[c], A[piv]];
      [b[piv], b[c]] = [b[c], b[piv]];
    }
    const d = A[c][c];
    for (let r = c + 1; r < n; r++) {
      const f = A[r][c] / d;
      if (f === 0) continue;
      const Ar = A[r];
      const Ac = A[c];
      for (let k = c; k < n; k++) Ar[k] -= f * Ac[k];
      b[r] -= f * b[c];
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = b[r];
    for (let k = r + 1; k < n; k++) s -= A[r][k] * x[k];
    x[r] = s / A[r][r];
  }
  return x;
}

/** Inverse of A (n×n) by Gauss–Jordan with partial pivoting; null when singular. */
function invertDense(M: number[][]): number[][] | null {
  const n = M.length;
  const A = M.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(A[r][c]) > Math.abs(A[piv][c])) piv = r;
    if (!(Math.abs(A[piv][c]) > 1e-300)) return null;
    [A[piv], A[c]] = [A[c], A[piv]];
    const d = A[c][c];
    for (let k = 0; k < 2 * n; k++) A[c][k] /= d;
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = A[r][c];
      if (f === 0) continue;
      for (let k = 0; k < 2 * n; k++) A[r][k] -= f * A[c][k];
    }
  }
  return A.map((row) => row.slice(n));
}

// ---------------------------------------------------------------------------------------------
// the network

/** One resistor between two bars (Ω; 0 an ideal link, Infinity an open coil). */
export interface RingEdge {
  a: number;
  b: number;
  ohm: number;
  /** The coil it stands for, or null for an equalizer link. */
  coil: number | null;
}

/**
 * The bar graph of a layout: each live coil an edge start_bar–end_bar of `coilOhm[index − 1]` Ω,
 * and, when equalizers are fitted, 0 Ω links joining the bars of each equalizer group.
 * `coilOhm` is in coil index order, one entry per coil (a dead coil's entry is ignored).
 */
export function ringEdges(layout: WindingLayout, coilOhm: number[]): RingEdge[] {
  if (coilOhm.length !== layout.coils.length) {
    throw inputError("coil_ohm_count", "coil_ohm", `${coilOhm.length} coil resistances given for ${layout.coils.length} coils`);
  }
  const edges: RingEdge[] = [];
  layout.coils.forEach((c, i) => {
    if (c.dead || c.start_bar === null || c.end_bar === null) return;
    const r = coilOhm[i];
    if (!(r >= 0)) throw inputError("coil_ohm_invalid", `coil_ohm[${i}]`, `coil ${c.index} resistance must be 0 Ω or more (got ${r})`);
    edges.push({ a: c.start_bar, b: c.end_bar, ohm: r, coil: c.index });
  });
  if (layout.equalizers) {
    for (const g of layout.equalizer_groups) for (let j = 1; j < g.length; j++) edges.push({ a: g[0], b: g[j], ohm: 0, coil: null });
  }
  return edges;
}

/**
 * A resistor network on nodes 1 … n. Ideal (0 Ω) edges merge nodes; open (∞ Ω) edges are left
 * out. When the rest is connected, the grounded Laplacian is inverted once and every query is a
 * small system over the brush nodes; otherwise each query is solved directly.
 */
export class Network implements RingSolver {
  private readonly n: number;
  private readonly parent: number[];
  /** Finite, positive edges between merged classes (class ids 0 … m−1). */
  private readonly edges: { a: number; b: number; g: number }[] = [];
  private readonly cls: number[];
  private readonly m: number;
  private G: number[][] | null = null;
  private connected = false;

  constructor(n: number, edges: { a: number; b: number; ohm: number }[]) {
    this.n = n;
    this.parent = Array.from({ length: n + 1 }, (_, i) => i);
    for (const e of edges) if (e.ohm === 0) this.union(e.a, e.b);
    const id = new Map<number, number>();
    this.cls = new Array<number>(n + 1).fill(-1);
    for (let v = 1; v <= n; v++) {
      const r = this.find(v);
      if (!id.has(r)) id.set(r, id.size);
      this.cls[v] = id.get(r)!;
    }
    this.m = id.size;
    for (const e of edges) {
      if (e.ohm === 0 || !Number.isFinite(e.ohm)) continue;
      const a = this.cls[e.a];
      const b = this.cls[e.b];
      if (a !== b) this.edges.push({ a, b, g: 1 / e.ohm });
    }
    this.connected = this.components(this.m, this.edges).every((c) => c === 0);
    if (this.connected && this.m > 1) {
      const L = this.laplacian(this.m, this.edges);
      const red = L.slice(1).map((row) => row.slice(1));
      const inv = invertDense(red);
      if (inv) {
        this.G = Array.from({ length: this.m }, (_, i) => Array.from({ length: this.m }, (_, j) => (i === 0 || j === 0 ? 0 : inv[i - 1][j - 1])));
      } else this.connected = false;
    }
  }

  private find(v: number): number {
    while (this.parent[v] !== v) {
      this.parent[v] = this.parent[this.parent[v]];
      v = this.parent[v];
    }
    return v;
  }
  private union(a: number, b: number) {
    const ra = this.find(a);
    const rb = this.find(b);
    if (ra !== rb) this.parent[ra] = rb;
  }

  private laplacian(m: number, edges: { a: number; b: number; g: number }[]): number[][] {
    const L = Array.from({ length: m }, () => new Array<number>(m).fill(0));
    for (const { a, b, g } of edges) {
      L[a][a] += g;
      L[b][b] += g;
      L[a][b] -= g;
      L[b][a] -= g;
    }
    return L;
  }

  private components(m: number, edges: { a: number; b: number }[]): number[] {
    const adj: number[][] = Array.from({ length: m }, () => []);
    for (const e of edges) {
      adj[e.a].push(e.b);
      adj[e.b].push(e.a);
    }
    const comp = new Array<number>(m).fill(-1);
    let c = 0;
    for (let s = 0; s < m; s++) {
      if (comp[s] >= 0) continue;
      const stack = [s];
      comp[s] = c;
      while (stack.length) {
        const v = stack.pop()!;
        for (const w of adj[v])
          if (comp[w] < 0) {
            comp[w] = c;
            stack.push(w);
          }
      }
      c++;
    }
    return comp;
  }

  /**
   * Effective resistance (Ω) between the node set `plus` (all joined, as one brush) and the set
   * `minus`: 0 when they touch or are linked by ideal links, Infinity when no path joins them.
   */
  between(plus: number[], minus: number[]): number {
    const A = [...new Set(plus.map((v) => this.cls[v]))];
    const B = [...new Set(minus.map((v) => this.cls[v]))];
    if (A.some((a) => B.includes(a))) return 0;
    if (this.G) return this.viaInverse(A, B);
    return this.direct(A, B);
  }

  private viaInverse(A: number[], B: number[]): number {
    const G = this.G!;
    const s = A.length;
    const t = B.length;
    const nodes = [...A, ...B];
    const N = s + t + 2;
    const M = Array.from({ length: N }, () => new Array<number>(N).fill(0));
    const rhs = new Array<number>(N).fill(0);
    // potentials: v_x = Σ G[x][y] I_y ; v at A nodes = vA (unknown s+t), at B nodes = vB (unknown s+t+1)
    for (let i = 0; i < s + t; i++) {
      for (let j = 0; j < s + t; j++) M[i][j] = G[nodes[i]][nodes[j]];
      M[i][i < s ? s + t : s + t + 1] = -1;
    }
    for (let j = 0; j < s; j++) M[s + t][j] = 1;
    rhs[s + t] = 1;
    for (let j = s; j < s + t; j++) M[s + t + 1][j] = 1;
    rhs[s + t + 1] = -1;
    const x = solveDense(M, rhs);
    if (!x) return this.direct(A, B);
    return x[s + t] - x[s + t + 1];
  }

  private direct(A: number[], B: number[]): number {
    // merge A into one node and B into another, ground B, solve the nodal equations on A's component
    const map = new Array<number>(this.m).fill(-1);
    let k = 2;
    for (let c = 0; c < this.m; c++) map[c] = A.includes(c) ? 0 : B.includes(c) ? 1 : k++;
    const edges = this.edges.map((e) => ({ a: map[e.a], b: map[e.b], g: e.g })).filter((e) => e.a !== e.b);
    const comp = this.components(k, edges);
    if (comp[0] !== comp[1]) return Infinity;
    const keep: number[] = [];
    for (let v = 0; v < k; v++) if (comp[v] === comp[0] && v !== 1) keep.push(v);
    const idx = new Map<number, number>(keep.map((v, i) => [v, i]));
    const L = this.laplacian(k, edges);
    const red = keep.map((r) => keep.map((c) => L[r][c]));
    const rhs = keep.map((v) => (v === 0 ? 1 : 0));
    const x = solveDense(red, rhs);
    if (!x) return Infinity;
    return x[idx.get(0)!];
  }

  get nodes(): number {
    return this.n;
  }
}

/** A reading between two sets of bars (Ω): all + bars joined as one brush, all − bars as the other. */
export interface RingSolver {
  between(plus: number[], minus: number[]): number;
}

/**
 * The ring as a cycle of bars (no equalizers): `order[j]` is the j-th bar along the closed circuit and
 * `ohm[j]` the coil from order[j] to order[j+1] (Ω; Infinity open, 0 shorted). Kirchhoff on a cycle:
 * the arcs between consecutive marked bars of opposite sign are in parallel, each the series sum of
 * its coils; O(marked bars · log) per reading after O(C) prefix sums.
 */
export class CycleNetwork implements RingSolver {
  private readonly pos: Int32Array;
  /** prefix[j]: sum of the finite coil resistances before step j (Ω); opens[j]: open coils before step j. */
  private readonly prefix: Float64Array;
  private readonly opens: Int32Array;
  private readonly n: number;

  constructor(bars: number, order: number[], ohm: number[]) {
    this.n = order.length;
    this.pos = new Int32Array(bars + 1).fill(-1);
    order.forEach((b, j) => (this.pos[b] = j));
    this.prefix = new Float64Array(this.n + 1);
    this.opens = new Int32Array(this.n + 1);
    for (let j = 0; j < this.n; j++) {
      const open = !Number.isFinite(ohm[j]);
      this.prefix[j + 1] = this.prefix[j] + (open ? 0 : ohm[j]);
      this.opens[j + 1] = this.opens[j] + (open ? 1 : 0);
    }
  }

  /** Series resistance (Ω) along the cycle from position a forward to position b (a ≠ b); Infinity across an open coil. */
  private arc(a: number, b: number): number {
    if (b > a) return this.opens[b] - this.opens[a] > 0 ? Infinity : this.prefix[b] - this.prefix[a];
    const open = this.opens[this.n] - this.opens[a] + this.opens[b];
    return open > 0 ? Infinity : this.prefix[this.n] - this.prefix[a] + this.prefix[b];
  }

  between(plus: number[], minus: number[]): number {
    // each marked bar as 2·position + (1 for +, 0 for −), sorted: neighbours in the sort are neighbours on the cycle
    const m = plus.length + minus.length;
    const marks = new Int32Array(m);
    for (let i = 0; i < plus.length; i++) marks[i] = 2 * this.pos[plus[i]] + 1;
    for (let i = 0; i < minus.length; i++) marks[plus.length + i] = 2 * this.pos[minus[i]];
    marks.sort();
    let g = 0;
    let any = false;
    for (let i = 0; i < m; i++) {
      const a = marks[i];
      const b = marks[(i + 1) % m];
      if ((a & 1) === (b & 1)) continue;
      if (a >> 1 === b >> 1) return 0; // one bar under both brushes
      any = true;
      const r = this.arc(a >> 1, b >> 1);
      if (r === 0) return 0;
      g += 1 / r;
    }
    return any && g > 0 ? 1 / g : Infinity;
  }
}

/** The cycle of a layout without equalizers (bars in circuit order, each step's coil resistance), or null when its coils do not close one cycle through every bar. */
export function ringCycle(layout: WindingLayout, coilOhm: number[]): { order: number[]; ohm: number[] } | null {
  if (layout.equalizers) return null;
  const order: number[] = [];
  const ohm: number[] = [];
  const co = layout.circuit_order;
  for (let j = 0; j < co.length; j++) {
    const c = layout.coils[co[j] - 1];
    const next = layout.coils[co[(j + 1) % co.length] - 1];
    if (c.dead || c.start_bar === null || c.end_bar !== next.start_bar) return null;
    order.push(c.start_bar);
    ohm.push(coilOhm[c.index - 1]);
  }
  return order.length === layout.bars && new Set(order).size === layout.bars ? { order, ohm } : null;
}

/**
 * The network of a layout with the given coil resistances (Ω, coil index order): the linear cycle
 * solver when the coils close one cycle (tooth, simplex lap and wave without equalizers), else the
 * nodal solve. Both are Kirchhoff; the tests hold them to an independent nodal solution.
 */
export function ringNetwork(layout: WindingLayout, coilOhm: number[]): RingSolver {
  const edges = ringEdges(layout, coilOhm); // validates the resistances
  const cycle = ringCycle(layout, coilOhm);
  return cycle ? new CycleNetwork(layout.bars, cycle.order, cycle.ohm) : new Network(layout.bars, edges);
}

/** Effective resistance (Ω) between two bars of a layout's ring. */
export function resistanceBetweenBars(layout: WindingLayout, coilOhm: number[], a: number, b: number): number {
  return ringNetwork(layout, coilOhm).between([a], [b]);
}

/**
 * Bar-to-bar readings r1 … rC (Ω) of the network (brushes lifted): r_i between bar i and bar i+1,
 * rC between bar C and bar 1 (docs/contracts.md numbering). Equal coils give the closed forms above.
 */
export function barToBar(layout: WindingLayout, coilOhm: number[]): number[] {
  const net = ringNetwork(layout, coilOhm);
  const C = layout.bars;
  const out: number[] = [];
  for (let i = 1; i <= C; i++) out.push(net.between([i], [mod1(i + 1, C)]));
  return out;
}

export interface TerminalResistance {
  /** Each brush on a single bar, the ring split ⌊C/2⌋ / ⌈C/2⌉ coils (P brushes on a lap: P arcs in parallel), Ω. */
  single: number;
  /** Every brush bridging two adjacent bars, Ω. */
  bridged: number;
  /**
   * Least and greatest over a turn of the rotor (steps of 1/8 bar), brushes of the spec's width, Ω.
   * `min` is null when at some position a + and a − brush touch the same bar (`brush_short`): the
   * supply is then shorted through that bar, and no least reading exists (never 0 Ω on the card).
   */
  min: number | null;
  max: number;
  /** True when a + and a − brush touch one bar together at some rotor position (see `brushesShort`). */
  brush_short: boolean;
  /** How the brushes were placed, and when the closed forms do not hold. */
  validity: string;
}

/** Rotor positions per bar pitch for the min/max search. */
export const ROTOR_STEPS_PER_BAR = 8;

/**
 * The bars under each brush at each rotor position of a full turn (steps of 1/8 bar): brush j
 * centred j·C/P bars from the first, touching every bar it overlaps for the spec's `width_bars`.
 */
export function* rotorPositions(layout: WindingLayout): Generator<number[][]> {
  const C = layout.bars;
  const P = layout.spec.poles;
  const count = layout.spec.brushes.count;
  const w = layout.spec.brushes.width_bars;
  for (let x8 = 0; x8 < ROTOR_STEPS_PER_BAR * C; x8++) {
    const x = x8 / ROTOR_STEPS_PER_BAR;
    const brushes: number[][] = [];
    for (let j = 0; j < count; j++) brushes.push(barsUnderBrush(C, 1 + x + (j * C) / P, w));
    yield brushes;
  }
}

/**
 * True when, at some rotor position, a + brush and a − brush touch the same bar: the supply is
 * shorted through it (docs/contracts.md: on a 3-bar ring, brushes half a turn apart wider than half a bar).
 * Two neighbouring brushes C/P bars apart can both reach one bar when wider than C/P − 1 bars.
 */
export function brushesShort(layout: WindingLayout): boolean {
  for (const brushes of rotorPositions(layout)) if (sharesBar(brushes)) return true;
  return false;
}

/** The `brush_short` warning of a layout whose brushes can short the supply through one bar, or null. */
export function brushShortWarning(layout: WindingLayout): Warning | null {
  if (!brushesShort(layout)) return null;
  const C = layout.bars;
  const limit = C / layout.spec.poles - 1;
  return {
    code: "brush_short",
    path: "winding.brushes.width_bars",
    message: `brushes ${fmtBars(layout.spec.brushes.width_bars)} bars wide on ${C} bars: at some rotor position a + and a − brush touch the same bar and short the supply through it, so the terminal reading has no least value (brushes at most ${fmtBars(limit)} bar${limit === 1 ? "" : "s"} wide never do; Kirchhoff); read the terminal resistance with each brush on a single bar`,
  };
}

/** Bars (1 … C) that a brush of width w bars centred at position c (bar n centred at n, bars 1 wide, gaps ignored) touches. */
export function barsUnderBrush(C: number, centre: number, width: number): number[] {
  const lo = centre - width / 2;
  const hi = centre + width / 2;
  const out = new Set<number>();
  for (let n = Math.floor(lo) - 1; n <= Math.ceil(hi) + 1; n++) {
    const overlap = Math.min(hi, n + 0.5) - Math.max(lo, n - 0.5);
    if (overlap > 1e-9) out.add(mod1(n, C));
  }
  return [...out];
}

/**
 * The bar under each brush for the `single` terminal figure, + and − alternately (see
 * `terminalResistance`): tooth and lap, brush j on bar 1 + ⌊j·C/P⌋; wave, + on bar 1 and − on the
 * bar ⌊C/2⌋ coils on along the circuit.
 */
export function singleBrushBars(layout: WindingLayout): number[] {
  const C = layout.bars;
  if (layout.spec.style === "wave") {
    const chainBars = layout.circuit_order.map((k) => layout.coils[k - 1].start_bar!);
    return [1, chainBars[Math.floor(chainBars.length / 2)]];
  }
  const P = layout.spec.poles;
  return Array.from({ length: layout.spec.brushes.count }, (_, j) => 1 + Math.floor((j * C) / P));
}

/**
 * Terminal resistance between the brush leads (Ω), brushes excluded.
 *
 * Brush placement (docs/contracts.md "The `plan --json` output"; neutral-axis placement, from memory of
 * any DC-machine text): brushes alternate + and − and sit 180° electrical apart, i.e. C/P bars
 * apart on the commutator (any odd multiple is an equivalent position).
 *  - `single`: tooth and lap: brush j on bar 1 + ⌊j·C/P⌋ (2 brushes on 2 poles: bars 1 and
 *    1 + ⌊C/2⌋, the ring split ⌊C/2⌋ / ⌈C/2⌉ coils; P brushes on a lap: P arcs in parallel).
 *    Wave: + on bar 1, − on the bar ⌊C/2⌋ coils on along the circuit (the two paths of a wave
 *    split ⌊C/2⌋ / ⌈C/2⌉); extra brushes on a wave share the current but add no path and are left out.
 *  - `bridged`: the same brushes each on its bar and the next one.
 *  - `min`/`max`: the rotor turned a full turn in steps of 1/8 bar (so the half-bar positions and,
 *    for brushes narrower than a bar, the positions where every brush sits on one bar are met),
 *    brush j centred j·C/P bars from the first, each touching every bar it overlaps for the spec's
 *    `width_bars` (bars one bar pitch wide, the mica gaps ignored). A brush a bar wide or wider
 *    sits on a single bar only at exact alignment; on an odd C it is then the other brush that
 *    bridges, so `max` is below `single` there.
 */
export function terminalResistance(layout: WindingLayout, coilOhm: number[]): TerminalResistance {
  const net = ringNetwork(layout, coilOhm);
  const C = layout.bars;
  const P = layout.spec.poles;
  const count = layout.spec.brushes.count;
  const validity: string[] = [];

  const measure = (brushes: number[][]) => {
    const plus: number[] = [];
    const minus: number[] = [];
    brushes.forEach((bars, j) => {
      (j % 2 === 0 ? plus : minus).push(...bars);
    });
    return net.between(plus, minus);
  };

  let single: number;
  let bridged: number;
  if (layout.spec.style === "wave") {
    const b2 = singleBrushBars(layout)[1];
    single = measure([[1], [b2]]);
    bridged = measure([
      [1, 2],
      [b2, mod1(b2 + 1, C)],
    ]);
    validity.push(
      `wave: single/bridged with + on bar 1 and − on bar ${b2}, ⌊C/2⌋ coils on along the circuit; min/max with ${count} brushes ${fmtBars(C / P)} bars apart`,
    );
    if (!Number.isInteger(C / P)) {
      validity.push(`C/P = ${fmtBars(C / P)} is not whole: turning the rotor, the brushes are never both on single bars, so max may be below single`);
    }
  } else {
    const brushesSingle = singleBrushBars(layout).map((b) => [b]);
    const brushesBridged = brushesSingle.map(([b]) => [b, mod1(b + 1, C)]);
    single = measure(brushesSingle);
    bridged = measure(brushesBridged);
    validity.push(`${count} brushes on bars ${brushesSingle.map((b) => b[0]).join(", ")} (+ and − alternately), ${fmtBars(C / P)} bars apart`);
    if (count === 2 && P === 2 && C % 2 === 1) {
      validity.push(
        "odd C: brushes 180° apart are both on single bars only when narrower than about half a bar, and both bridge only when at least about half a bar wide; min/max are what this brush width gives over a turn, so `single` may lie above max and `bridged` below min",
      );
    }
  }
  let min = Infinity;
  let max = -Infinity;
  let short = false;
  for (const brushes of rotorPositions(layout)) {
    const r = measure(brushes);
    if (r === 0 && sharesBar(brushes)) short = true;
    if (r < min) min = r;
    if (r > max) max = r;
  }
  if (layout.equalizers) {
    validity.push("equalizers fitted: the ring closed forms R·(C−1)/C and R·m·(C−m)/C do not apply (values from the network with ideal equalizer links)");
  } else if (layout.spec.style === "lap" && P > 2 && count < P) {
    validity.push(`${count} brushes on a ${P}-pole lap without equalizers: the ring splits into unequal arcs, not ${P} paths`);
  } else {
    validity.push("equal coils follow the closed forms (ring R·(C−1)/C, wave R·p·(C−p)/C, split R·m·(C−m)/C)");
  }
  if (short) validity.push("a + and a − brush touch one bar at some rotor position (brush_short): no least terminal reading");
  return { single, bridged, min: short ? null : min, max, brush_short: short, validity: validity.join("; ") };
}

/** True when a + brush and a − brush (alternate brushes) share a bar. */
function sharesBar(brushes: number[][]): boolean {
  const plus = new Set<number>();
  brushes.forEach((bars, j) => {
    if (j % 2 === 0) for (const b of bars) plus.add(b);
  });
  return brushes.some((bars, j) => j % 2 === 1 && bars.some((b) => plus.has(b)));
}

function fmtBars(x: number): string {
  return Number.isInteger(x) ? String(x) : x.toFixed(2);
}

/** How the terminal current divides among the coils (fractions of it), for the current density. */
export interface CurrentShare {
  /** Root mean square over a turn of the rotor of one coil's share of the terminal current: what heats it. */
  rms: number;
  /** The largest share any coil carries at some rotor position (the shortest arc between brushes). */
  peak: number;
  /** True when the paths are unequal (a lap with fewer brushes than poles and no equalizers). */
  unequal: boolean;
}

/**
 * The share of the terminal current in each coil. Equal paths (tooth and 2-pole lap rings, wave,
 * lap with P brushes or with equalizers): 1/a of it in every coil. A P-pole lap with fewer brushes
 * than poles and no equalizers: brush j on bar 1 + ⌊j·C/P⌋ (as `terminalResistance`), + and −
 * alternately; each arc between a + and a − brush has the same EMF (it spans an odd number of pole
 * pitches, the inner ones cancelling in pairs) and the same voltage across it, so the arcs carry
 * currents inversely as their coil counts m_i: share_i = (1/m_i) / Σ(1/m_j) (Kirchhoff, equal
 * coils); an arc between like brushes carries none. A coil spends m_i/C of a turn in arc i, so the
 * share that heats it is √(Σ m_i/C · share_i²). Two brushes on four poles: arcs C/4 and 3C/4 carry
 * ¾ and ¼; the heating share √(¼·(¾)² + ¾·(¼)²) = √3/4 ≈ 0.433, against ¼ with four paths.
 * Source: Kirchhoff's laws on the ring of equal coils; the RMS over a turn is armwind's own step.
 */
export function coilCurrentShare(layout: WindingLayout): CurrentShare {
  const C = layout.bars;
  const P = layout.spec.poles;
  const count = layout.spec.brushes.count;
  if (layout.spec.style !== "lap" || layout.equalizers || count >= P) {
    return { rms: 1 / layout.paths, peak: 1 / layout.paths, unequal: false };
  }
  const pos: number[] = [];
  for (let j = 0; j < count; j++) pos.push(1 + Math.floor((j * C) / P));
  const arcs = pos.map((p, j) => {
    const next = j + 1 < count ? pos[j + 1] : pos[0] + C;
    const live = j + 1 < count || count % 2 === 0; // the closing arc joins unlike brushes only for an even count
    return { m: next - p, live };
  });
  const g = arcs.reduce((s, a) => s + (a.live && a.m > 0 ? 1 / a.m : 0), 0);
  let ms = 0;
  let peak = 0;
  for (const a of arcs) {
    if (!a.live || a.m <= 0) continue;
    const share = 1 / a.m / g;
    ms += (a.m / C) * share * share;
    peak = Math.max(peak, share);
  }
  return { rms: Math.sqrt(ms), peak, unequal: true };
}
