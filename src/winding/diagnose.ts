/**
 * From bar-to-bar readings back to the coils, and what a deviating coil or reading suggests.
 *
 * Inversion (derived here from the ring formula of docs/contracts.md "The models"): in a closed ring of
 * total resistance S, the reading across a stretch of X Ω in series is r = X·(S − X)/S. Between
 * adjacent bars lies one coil (tooth, simplex lap) or a chain of p coils (simplex wave), so each
 * reading gives its stretch X_i = S/2 − √(S²/4 − S·r_i) (the root below S/2) once S is known, and S
 * follows from Σ X_i = (coils per stretch)·S. For a wave the stretches are windows of p consecutive
 * coils in circuit order: a circulant system, solvable because gcd(p, C) = 1 for a simplex wave
 * (p·y_c = C ± 1).
 *
 * Units: resistances in Ω; deviations and tolerances as fractions.
 */
import { inputError, type Warning } from "../errors.js";
import { barToBar, solveDense } from "./ring.js";
import {
  DEFAULT_METER_RESOLUTION_OHM,
  FOUR_WIRE_FACTOR,
  NEAR_ZERO_FRACTION,
  OPEN_FACTOR,
  SOURCE_TM,
  SPREAD,
  SUGGESTS,
  WELL_BELOW_FRACTION,
  judgeLevel,
  judgeSpread,
  median,
  readingName,
  spreadRuleText,
  type Level,
  type Spread,
} from "../bench/rules.js";
import type { WindingLayout } from "./types.js";

const mod1 = (n: number, m: number) => ((((n - 1) % m) + m) % m) + 1;

/** Default tolerance on a coil's resistance against its reference: the spread rule's ±5 % (src/bench/rules.ts; common practice, no published source). */
export const DEFAULT_TOLERANCE = SPREAD.fraction;
export const TOLERANCE_SOURCE = `bench rules: ${spreadRuleText()}`;

/** The sentence every diagnosis carries (common practice). */
export const POLARITY_NOTE =
  "A reversed coil or a wrong lead throw reads normal bar to bar: the polarity check (a compass or a growler along the slots) finds it (common practice).";

export interface CoilSolution {
  /** Coil resistances (Ω), coil index order; Infinity for an open coil, NaN where the readings cannot tell (and for a dead coil). */
  coil_ohm: number[];
  /** Sum of the live coils' resistances (Ω) as solved; Infinity with an open coil. */
  ring_ohm: number;
  /** Largest difference (Ω) between a reading and what the solved coils give back (finite readings only). */
  residual_ohm: number;
  /** residual_ohm over the mean finite reading. */
  residual_fraction: number;
  /** Coils taken as open (index). */
  open_coils: number[];
  notes: string[];
}

function checkReadings(layout: WindingLayout, readings: number[]): void {
  const C = layout.bars;
  if (readings.length !== C) {
    throw inputError(
      "readings_count",
      "bar_to_bar",
      `${readings.length} bar-to-bar readings for ${C} bars; give r1 … r${C}, r_i between bar i and bar i+1, r${C} between bar ${C} and bar 1`,
    );
  }
  readings.forEach((r, i) => {
    if (!(r >= 0)) throw inputError("reading_invalid", `bar_to_bar[${i}]`, `reading r${i + 1} must be 0 Ω or more, or infinite for an open circuit (got ${r})`);
  });
}

/** Chain position of each bar along the closed circuit, and the coil on each chain step. */
function chain(layout: WindingLayout): { pos: Map<number, number>; coilAt: number[] } {
  const pos = new Map<number, number>();
  const coilAt: number[] = [];
  layout.circuit_order.forEach((k, n) => {
    pos.set(layout.coils[k - 1].start_bar!, n);
    coilAt.push(k);
  });
  return { pos, coilAt };
}

/** For reading i (bars i, i+1): the chain steps (0-based) of the coils in series between the two bars, the short way. */
function windows(layout: WindingLayout): number[][] {
  const C = layout.bars;
  const k = layout.coils_between_adjacent_bars;
  const { pos } = chain(layout);
  const out: number[][] = [];
  for (let i = 1; i <= C; i++) {
    const a = pos.get(i)!;
    const b = pos.get(mod1(i + 1, C))!;
    let first: number;
    if ((((b - a) % C) + C) % C === k) first = a;
    else if ((((a - b) % C) + C) % C === k) first = b;
    else throw new Error(`internal error: bars ${i} and ${mod1(i + 1, C)} are not ${k} coils apart`);
    const w: number[] = [];
    for (let j = 0; j < k; j++) w.push((first + j) % C);
    out.push(w);
  }
  return out;
}

const smallRoot = (S: number, r: number) => (2 * r) / (1 + Math.sqrt(Math.max(0, 1 - (4 * r) / S)));
const bigRoot = (S: number, r: number) => (S / 2) * (1 + Math.sqrt(Math.max(0, 1 - (4 * r) / S)));

function bisect(f: (S: number) => number, lo: number, hi: number): number {
  for (let it = 0; it < 300; it++) {
    const mid = (lo + hi) / 2;
    if (mid === lo || mid === hi) break;
    if (f(mid) > 0) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/** Least squares min ‖A x − b‖ by the normal equations (A: rows × n), solved by the ring's one dense solver. */
function leastSquares(A: number[][], b: number[], n: number): number[] | null {
  const N = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const v = new Array<number>(n).fill(0);
  A.forEach((row, r) => {
    for (let i = 0; i < n; i++) {
      if (row[i] === 0) continue;
      v[i] += row[i] * b[r];
      for (let j = 0; j < n; j++) N[i][j] += row[i] * row[j];
    }
  });
  return solveDense(N, v);
}

/**
 * The chain steps s (Ω, chain positions 0 … C−1) from their window sums: X[i] is the sum of the k
 * consecutive steps of window i. Differences of neighbouring windows give s[f+k] − s[f]; walking
 * f = 0, k, 2k … (mod C) reaches every step because gcd(k, C) = 1 for a simplex wave (p·y_c = C ± 1),
 * and the total Σs = ΣX/k fixes the constant. Linear in C; the unique solution of the circulant system.
 */
export function stepsFromWindows(wins: number[][], X: number[], C: number): number[] {
  const k = wins[0].length;
  const W = new Float64Array(C);
  wins.forEach((w, i) => (W[w[0]] = X[i]));
  if (k === 1) return Array.from(W);
  const d = new Float64Array(C).fill(NaN);
  d[0] = 0;
  let q = 0;
  for (let t = 1; t < C; t++) {
    const next = (q + k) % C;
    d[next] = d[q] + W[(q + 1) % C] - W[q];
    q = next;
  }
  if (d.some((x) => Number.isNaN(x))) throw new Error(`internal error: windows of ${k} do not reach every one of ${C} steps (gcd ≠ 1)`);
  const total = X.reduce((a, x) => a + x, 0) / k;
  const shift = (total - d.reduce((a, x) => a + x, 0)) / C;
  return Array.from(d, (x) => x + shift);
}

/**
 * Chain steps with the step at position e open: a window without e reads its own sum, a window with
 * e reads the rest of the ring in series. One coil between adjacent bars: the least-squares
 * solution in closed form, s_j = r_j − (Σr − r_e)/C; a wave (k > 1): the normal equations.
 */
function openSteps(wins: number[][], readings: number[], e: number): number[] {
  const C = wins.length;
  const out = new Array<number>(C).fill(NaN);
  out[e] = Infinity;
  if (wins[0].length === 1) {
    let sum = 0;
    let re = NaN;
    wins.forEach((w, i) => {
      if (w[0] === e) re = readings[i];
      else sum += readings[i];
    });
    const shift = (sum - re) / C;
    wins.forEach((w, i) => {
      if (w[0] !== e) out[w[0]] = readings[i] - shift;
    });
    return out;
  }
  const idx = (s: number) => (s < e ? s : s - 1);
  const rows: number[][] = [];
  const rhs: number[] = [];
  wins.forEach((w, i) => {
    const row = new Array<number>(C - 1).fill(0);
    if (w.includes(e)) {
      for (let s = 0; s < C; s++) if (!w.includes(s)) row[idx(s)] = 1;
    } else for (const s of w) row[idx(s)] = 1;
    rows.push(row);
    rhs.push(readings[i]);
  });
  const x = leastSquares(rows, rhs, C - 1);
  if (x) for (let s = 0; s < C; s++) if (s !== e) out[s] = x[idx(s)];
  return out;
}

/** The step that the highest readings share: the open coil when the readings fit no closed ring. */
function likeliestOpen(wins: number[][], readings: number[]): number {
  const C = wins.length;
  const least = new Array<number>(C).fill(Infinity);
  wins.forEach((w, i) => {
    for (const s of w) least[s] = Math.min(least[s], readings[i]);
  });
  let best = 0;
  for (let e = 1; e < C; e++) if (least[e] > least[best]) best = e;
  return best;
}

/**
 * The ring total S (Ω) and the window sums X_i (Ω) from finite readings: X_i = S/2 − √(S²/4 − S·r_i)
 * (the root below S/2), S where Σ X_i = k·S (bisection); on a ring (k = 1) one coil may hold more
 * than half the ring (its reading on the upper root). Null when no closed ring of finite coils fits.
 */
function windowSums(readings: number[], k: number): number[] | null {
  const rmax = Math.max(...readings);
  const h = (S: number) => readings.reduce((s, r) => s + smallRoot(S, r), 0) - k * S;
  const lo = 4 * rmax;
  if (h(lo) >= 0) {
    let hi = lo * 2;
    for (let i = 0; i < 200 && h(hi) >= 0; i++) hi *= 2;
    const S = bisect(h, lo, hi);
    return readings.map((r) => smallRoot(S, r));
  }
  if (k !== 1) return null;
  const imax = readings.indexOf(rmax);
  const hb = (s: number) => bigRoot(s, rmax) + readings.reduce((a, r, i) => (i === imax ? a : a + smallRoot(s, r)), 0) - s;
  let hi = lo * 2;
  for (let i = 0; i < 60 && hb(hi) <= 0; i++) hi *= 2;
  if (!(hb(hi) > 0)) return null;
  const S = bisect((x) => -hb(x), lo, hi);
  return readings.map((r, i) => (i === imax ? bigRoot(S, r) : smallRoot(S, r)));
}

/** Chain steps when some readings are open: on a ring each finite reading is its coil; on a wave they cannot be told apart. */
function stepsWithOpenReadings(layout: WindingLayout, wins: number[][], readings: number[], inf: number[], notes: string[]): number[] | null {
  const C = layout.bars;
  if (layout.coils_between_adjacent_bars !== 1) {
    notes.push(
      `open readings on a wave winding (${inf.map((i) => `r${i + 1}`).join(", ")}): the circuit is broken in more than one place and the coils cannot be told apart from these readings`,
    );
    return null;
  }
  const steps = new Array<number>(C);
  wins.forEach((w, i) => (steps[w[0]] = Number.isFinite(readings[i]) ? readings[i] : Infinity));
  if (inf.length === 1) {
    notes.push(
      `only r${inf[0] + 1} reads open: a single open coil would read the sum of the others across its bars, so check the meter contact and the lead on bars ${inf[0] + 1} and ${mod1(inf[0] + 2, C)}`,
    );
  } else notes.push(`${inf.length} readings open: the ring is broken in ${inf.length} places; the other coils read directly`);
  return steps;
}

/** Chain steps from finite readings: the closed ring's window sums, else the ring with one coil open. */
function stepsFromFinite(layout: WindingLayout, wins: number[][], readings: number[], coilAt: number[], notes: string[]): number[] {
  const C = layout.bars;
  if (Math.max(...readings) === 0) {
    notes.push("every reading is 0: the bars are shorted together (or the meter leads touch each other)");
    return new Array<number>(C).fill(0);
  }
  const X = windowSums(readings, layout.coils_between_adjacent_bars);
  if (X) return stepsFromWindows(wins, X, C);
  const e = likeliestOpen(wins, readings);
  notes.push(`the readings fit a ring only with coil ${coilAt[e]} open (the reading across it is the rest of the ring in series)`);
  return openSteps(wins, readings, e);
}

/**
 * The coil resistances (Ω) that produce the C bar-to-bar readings `readings` (Ω, r1 … rC).
 * Tooth and simplex lap: r_i = R_i(S − R_i)/S, S the ring total; simplex wave: the same for the
 * chain sums X_i of p coils, then the circulant system of chain sums (gcd(p, C) = 1 makes it
 * solvable; `stepsFromWindows`, linear in C). Slightly inconsistent readings (noise) still solve:
 * negative coils are clamped to 0 and the residual reported. A reading near 0 gives a coil near 0
 * (bars bridged); an infinite reading, or one as large as all the others together, is an open coil
 * (Infinity), the others then read directly. Limit: a ring (p = 1) lets one coil hold more than half
 * the ring (upper root); a wave's chains are all taken on the lower root, so a chain of p coils
 * holding more than half the ring (only a nearly open coil does that) is treated as an open coil,
 * with its residual reported. Lap windings with equalizers fitted cannot be inverted coil by coil:
 * an `ArmwindError` (code `inversion_not_possible`) says so.
 */
export function solveCoils(layout: WindingLayout, readings: number[]): CoilSolution {
  checkReadings(layout, readings);
  if (layout.equalizers) {
    throw inputError(
      "inversion_not_possible",
      "winding.equalizers",
      "with equalizers fitted the bar-to-bar readings do not determine each coil; compare the readings pair by pair with the expected ones instead",
    );
  }
  const wins = windows(layout);
  const { coilAt } = chain(layout);
  const notes: string[] = [];
  const inf = readings.map((r, i) => (Number.isFinite(r) ? -1 : i)).filter((i) => i >= 0);
  const steps = inf.length > 0 ? stepsWithOpenReadings(layout, wins, readings, inf, notes) : stepsFromFinite(layout, wins, readings, coilAt, notes);
  const coil = new Array<number>(layout.coils.length).fill(NaN);
  const open: number[] = [];
  if (steps) {
    let clamped = 0;
    steps.forEach((r, s) => {
      const v = Math.max(0, r);
      if (r < 0) clamped++;
      coil[coilAt[s] - 1] = v;
      if (v === Infinity) open.push(coilAt[s]);
    });
    if (clamped)
      notes.push(`${clamped} coil${clamped > 1 ? "s" : ""} came out below 0 Ω from inconsistent readings and ${clamped > 1 ? "were" : "was"} set to 0`);
  }
  open.sort((a, b) => a - b);
  const finite = readings.filter((r) => Number.isFinite(r));
  const meanR = finite.length ? finite.reduce((a, x) => a + x, 0) / finite.length : NaN;
  const resid = residual(layout, coil, readings);
  const ring = layout.coils.filter((c) => !c.dead).reduce((a, c) => a + coil[c.index - 1], 0);
  return { coil_ohm: coil, ring_ohm: ring, residual_ohm: resid, residual_fraction: resid / meanR, open_coils: open, notes };
}

/** Largest difference (Ω) between a finite reading and what the solved coils give back (the forward ring solve); NaN when a coil is unknown. */
function residual(layout: WindingLayout, coil: number[], readings: number[]): number {
  if (!layout.coils.every((c) => c.dead || !Number.isNaN(coil[c.index - 1]))) return NaN;
  const back = barToBar(
    layout,
    coil.map((x, i) => (layout.coils[i].dead ? 0 : x)),
  );
  let resid = 0;
  readings.forEach((r, i) => {
    if (Number.isFinite(r) && Number.isFinite(back[i])) resid = Math.max(resid, Math.abs(back[i] - r));
  });
  return resid;
}

// ---------------------------------------------------------------------------------------------
// the diagnosis: the bench rules (src/bench/rules.ts) on the readings, then the coils behind them

export type Verdict = "ok" | "high" | "low" | "open" | "shorted" | "dead" | "unknown";

export interface CoilFinding {
  index: number;
  start_bar: number | null;
  end_bar: number | null;
  go_slot: number;
  return_slot: number;
  /** Solved resistance (Ω); null when open, dead, or not resolvable (equalizers fitted). */
  resistance_ohm: number | null;
  /** What the plan expects (Ω), null for a layout-only diagnosis. */
  expected_ohm: number | null;
  /** What the coil is judged against (Ω): the plan's value, or the armature's own median when the level is off or there is no plan. */
  reference_ohm: number | null;
  /** (resistance − reference)/reference; null when the resistance is null. */
  deviation_fraction: number | null;
  verdict: Verdict;
}

export type SuspectKind =
  | "turns_miscounted"
  | "shorted_turns"
  | "open_coil"
  | "bridged_bars"
  | "poor_riser_connection"
  | "reading_deviates"
  | "readings_inconsistent"
  | "level_off_plan";

export interface Suspect {
  kind: SuspectKind;
  /** Coils concerned (index). */
  coils: number[];
  /** Bars concerned. */
  bars: number[];
  /** Readings concerned, as people name them ("r3"). */
  readings: string[];
  /** Estimated turns too many (+) or too few (−), for turns_miscounted; null when the turns are not known. */
  turns_estimate: number | null;
  message: string;
}

export interface ReadingFinding {
  /** Reading number i (1-based, r_i): between bar i and the next bar. */
  index: number;
  bar: number;
  next_bar: number;
  /** At 20 °C, Ω; null when open. */
  reading_ohm: number | null;
  /** What the plan expects, Ω; null for a layout-only diagnosis. */
  expected_ohm: number | null;
  /** The reading (plan pattern divided out) over the median of the set, minus 1; null when open. */
  of_median_fraction: number | null;
  pass: boolean;
  /** Coils in series between the two bars (the ones behind the reading). */
  coils: number[];
}

/** A failed bench check: the reading (or the set's level), the rule it broke, the coils behind it. */
export interface Failure {
  /** JSON path of the check: "bar_to_bar[2]" (r3) or "bar_to_bar.level". */
  check: string;
  /** As people name it: "r3", or "median" for the level. */
  reading: string;
  reading_ohm: number | null;
  reference_ohm: number;
  deviation_fraction: number | null;
  window_fraction: number;
  rule: string;
  coils: number[];
  message: string;
}

export interface Diagnosis {
  /** True when every reading passes the bench rules (the exit status comes from the readings). */
  ok: boolean;
  coils: CoilFinding[];
  readings: ReadingFinding[];
  failures: Failure[];
  suspects: Suspect[];
  /** Median of the readings at 20 °C (plan pattern divided out), Ω. */
  median_ohm: number;
  /** The level of the set against the plan; null for a layout-only diagnosis. */
  level: Level | null;
  tolerance: number;
  tolerance_source: string;
  residual_fraction: number | null;
  notes: string[];
  warnings: Warning[];
}

export interface DiagnoseOptions {
  /** Coil tolerance, fraction (default SPREAD.fraction). */
  tolerance?: number;
  /** Meter resolution, Ω (default DEFAULT_METER_RESOLUTION_OHM). */
  resolutionOhm?: number;
  /** Turn length measured or calibrated (level window ±5 %), else from the model (±15 %). */
  calibrated?: boolean;
  /** Bare diameter of the wire laid, m (conductor tolerance of the level); unknown: 0.25 mm. */
  bareDiameterM?: number;
}

const pct = (x: number) => `${(x * 100).toFixed(1)} %`;
const live = (layout: WindingLayout) => layout.coils.filter((c) => !c.dead);

/** For each reading (0-based), the coils (index) in series between its two bars. */
export function coilsBehindReadings(layout: WindingLayout): number[][] {
  const C = layout.bars;
  if (layout.equalizers) {
    return Array.from({ length: C }, (_, i) => {
      const a = i + 1;
      const b = mod1(i + 2, C);
      return live(layout)
        .filter((c) => (c.start_bar === a && c.end_bar === b) || (c.start_bar === b && c.end_bar === a))
        .map((c) => c.index);
    });
  }
  const { coilAt } = chain(layout);
  return windows(layout).map((w) => w.map((s) => coilAt[s]).sort((x, y) => x - y));
}

/**
 * Read the bench: bar-to-bar readings (Ω at 20 °C, r1 … rC; Infinity for OL/open) against the coil
 * resistances the plan expects (Ω, coil index order), or against the armature's own median when
 * `expectedCoilOhm` is null (a layout-only job: no plan, no turn count).
 *  1. The readings are judged by the bench rules (src/bench/rules.ts): the spread against their
 *     median, the level of the median against the plan. The exit status comes from these.
 *  2. The ring is solved for each coil (Kirchhoff; see solveCoils); each coil is judged against
 *     the plan's pattern scaled to the armature's own median (equal coils without a plan): a
 *     common factor off the plan is the level's, said once.
 *  3. Suspects say what a deviation suggests (US Army TM 55-2210-223-34 for the riser and
 *     near-zero rules; the rest common practice): turns miscounted, shorted turns, open coil,
 *     bridged bars, poor riser connection; each failing reading names the coils behind it.
 * Lap windings with equalizers: only the deviating readings are reported.
 */
export function diagnose(
  layout: WindingLayout,
  readings: number[],
  expectedCoilOhm: number[] | null,
  turns: number | null,
  tolerance: number = DEFAULT_TOLERANCE,
  options: DiagnoseOptions = {},
): Diagnosis {
  checkInputs(layout, readings, expectedCoilOhm, turns, tolerance);
  const res = options.resolutionOhm ?? DEFAULT_METER_RESOLUTION_OHM;
  const expectedReadings = expectedCoilOhm
    ? barToBar(
        layout,
        expectedCoilOhm.map((x, i) => (layout.coils[i].dead ? 0 : x)),
      )
    : readings.map(() => 1);
  const spread = judgeSpread(readings, expectedReadings, res);
  const level = expectedCoilOhm ? judgeLevel(readings, expectedReadings, options.calibrated ?? false, options.bareDiameterM ?? 0.25e-3, res) : null;
  const behind = coilsBehindReadings(layout);
  const notes: string[] = [];
  const suspects: Suspect[] = [];
  const failures = readingFailures(layout, spread, level, behind, expectedCoilOhm !== null);
  const solved = layout.equalizers ? null : solveCoils(layout, readings);
  if (solved) notes.push(...solved.notes);
  const coils = judgeCoils(layout, solved, expectedCoilOhm, tolerance);
  if (level && !level.pass) suspects.push(levelSuspect(level));
  if (!expectedCoilOhm)
    notes.push("No plan given: each coil is judged against the median of the armature's own coils, each reading against the median of the readings.");
  const fromReadings = readingSuspects(layout, spread, behind, coils);
  suspects.push(...fromReadings, ...coilSuspects(layout, coils, turns, fromReadings));
  if (layout.equalizers) suspects.push(...deviatingReadings(layout, spread));
  const residual = solved && Number.isFinite(solved.residual_fraction) ? solved.residual_fraction : null;
  if (residual !== null && residual > tolerance / 2) suspects.push(inconsistentSuspect(residual));
  notes.push(POLARITY_NOTE);
  const rf: ReadingFinding[] = spread.rows.map((row, i) => ({
    index: i + 1,
    bar: i + 1,
    next_bar: mod1(i + 2, layout.bars),
    reading_ohm: Number.isFinite(readings[i]) ? readings[i] : null,
    expected_ohm: expectedCoilOhm ? expectedReadings[i] : null,
    of_median_fraction: Number.isFinite(row.of_median_fraction) ? row.of_median_fraction : null,
    pass: row.pass,
    coils: behind[i],
  }));
  return {
    ok: failures.length === 0,
    coils,
    readings: rf,
    failures,
    suspects,
    median_ohm: spread.median_ohm,
    level,
    tolerance,
    tolerance_source: TOLERANCE_SOURCE,
    residual_fraction: residual,
    notes,
    warnings: [],
  };
}

function checkInputs(layout: WindingLayout, readings: number[], expectedCoilOhm: number[] | null, turns: number | null, tolerance: number): void {
  checkReadings(layout, readings);
  if (expectedCoilOhm && expectedCoilOhm.length !== layout.coils.length) {
    throw inputError("coil_ohm_count", "coil_ohm", `${expectedCoilOhm.length} expected coil resistances for ${layout.coils.length} coils`);
  }
  if (turns !== null && !(turns >= 1)) throw inputError("turns_invalid", "wound.turns", `turns per coil must be 1 or more (got ${turns})`);
  if (!(tolerance > 0 && tolerance < 1))
    throw inputError("tolerance_invalid", "tolerance", `tolerance must be a fraction between 0 and 1 (got ${tolerance}); the default is ${DEFAULT_TOLERANCE}`);
}

/** Each reading outside the spread band, and the level when it is off the plan: the failures behind exit status 4. */
export function readingFailures(layout: WindingLayout, spread: Spread, level: Level | null, behind: number[][], planned: boolean): Failure[] {
  const out: Failure[] = [];
  const C = layout.bars;
  for (const row of spread.rows) {
    if (row.pass) continue;
    const name = readingName(row.index);
    const coils = behind[row.index];
    const dev = Number.isFinite(row.of_median_fraction) ? row.of_median_fraction : null;
    const how =
      row.side === "open" ? "reads open" : `reads ${dev! >= 0 ? "+" : "−"}${pct(Math.abs(dev!))} from the median ${spread.median_ohm.toPrecision(4)} Ω`;
    out.push({
      check: `bar_to_bar[${row.index}]`,
      reading: name,
      reading_ohm: Number.isFinite(row.reading_ohm) ? row.reading_ohm : null,
      reference_ohm: spread.median_ohm,
      deviation_fraction: dev,
      window_fraction: row.window_fraction,
      rule: spreadRuleText(),
      coils,
      message: `${name} (bars ${row.index + 1}–${mod1(row.index + 2, C)}, coil${coils.length > 1 ? "s" : ""} ${coils.join(", ")}) ${how}, outside ±${pct(row.window_fraction)}: ${row.suggests}`,
    });
  }
  if (planned && level && !level.pass) {
    out.push({
      check: "bar_to_bar.level",
      reading: "median",
      reading_ohm: level.median_ohm,
      reference_ohm: level.expected_median_ohm,
      deviation_fraction: level.deviation_fraction,
      window_fraction: level.window_fraction,
      rule: level.source,
      coils: [],
      message: `the median reading ${level.median_ohm.toPrecision(4)} Ω is ${(level.median_ohm / level.expected_median_ohm).toPrecision(3)} × the expected ${level.expected_median_ohm.toPrecision(4)} Ω, outside ±${pct(level.window_fraction)}: the wire or the turn length was not what the plan assumed`,
    });
  }
  return out;
}

/**
 * Each coil's solved resistance against its reference: the plan's coil-to-coil pattern (equal
 * coils without a plan) scaled to the armature's own median coil, so a common factor off the plan
 * is judged once by the level rule and each coil by the spread rule's ±5 % (bench rules).
 */
function judgeCoils(layout: WindingLayout, solved: CoilSolution | null, expected: number[] | null, tolerance: number): CoilFinding[] {
  const E = expected ?? layout.coils.map(() => 1);
  // the plan's coil-to-coil pattern scaled to the armature's own median: a common factor (the
  // level) is judged once, by the level rule, not once per coil
  let scale = 1;
  if (solved)
    scale = median(
      live(layout)
        .map((c) => solved.coil_ohm[c.index - 1] / E[c.index - 1])
        .filter((x) => Number.isFinite(x)),
    );
  return layout.coils.map((c) => {
    const ref = solved && Number.isFinite(scale) ? E[c.index - 1] * scale : null;
    const R = solved ? solved.coil_ohm[c.index - 1] : NaN;
    const open = R === Infinity || (ref !== null && R >= OPEN_FACTOR * ref);
    const known = Number.isFinite(R) && !open;
    const row: CoilFinding = {
      index: c.index,
      start_bar: c.start_bar,
      end_bar: c.end_bar,
      go_slot: c.go_slot,
      return_slot: c.return_slot,
      resistance_ohm: known ? R : null,
      expected_ohm: expected ? expected[c.index - 1] : null,
      reference_ohm: ref,
      deviation_fraction: known && ref ? R / ref - 1 : null,
      verdict: "ok",
    };
    row.verdict = c.dead ? "dead" : !solved || Number.isNaN(R) || ref === null ? "unknown" : open ? "open" : coilVerdict(R, ref, tolerance);
    return row;
  });
}

function coilVerdict(R: number, ref: number, tolerance: number): Verdict {
  if (R < NEAR_ZERO_FRACTION * ref) return "shorted";
  const d = R / ref - 1;
  return d > tolerance ? "high" : d < -tolerance ? "low" : "ok";
}

function levelSuspect(level: Level): Suspect {
  const f = level.median_ohm / level.expected_median_ohm;
  return {
    kind: "level_off_plan",
    coils: [],
    bars: [],
    readings: [],
    turns_estimate: null,
    message: `every reading is about ${f.toPrecision(3)} × the plan's (median ${level.median_ohm.toPrecision(4)} Ω against ${level.expected_median_ohm.toPrecision(4)} Ω, outside ±${pct(level.window_fraction)}): the wire or the turn length was not what the plan assumed; each coil is judged against the armature's own median`,
  };
}

function inconsistentSuspect(residual: number): Suspect {
  return {
    kind: "readings_inconsistent",
    coils: [],
    bars: [],
    readings: [],
    turns_estimate: null,
    message: `the readings do not fit one ring of coils (worst misfit ${pct(residual)} of the mean reading): read again, four-wire if the readings are below ${FOUR_WIRE_FACTOR} counts of the meter (common practice)`,
  };
}

/** Suspects from the readings themselves: open readings, bridged bars, poor riser connections (US Army TM 55-2210-223-34); a reading across an open coil is the open coil, not a riser. */
export function readingSuspects(layout: WindingLayout, spread: Spread, behind: number[][], coils: CoilFinding[]): Suspect[] {
  const out: Suspect[] = [];
  const C = layout.bars;
  const verdictOf = (k: number) => coils[k - 1].verdict;
  for (const row of spread.rows) {
    if (row.pass) continue;
    const bars = [row.index + 1, mod1(row.index + 2, C)];
    const name = readingName(row.index);
    const cs = behind[row.index];
    const overOpen = cs.some((k) => verdictOf(k) === "open");
    if (row.side === "open" && !overOpen) {
      out.push({
        kind: "open_coil",
        coils: cs,
        bars,
        readings: [name],
        turns_estimate: null,
        message: `${name} (bars ${bars[0]}–${bars[1]}) reads open: a broken coil or a lead off its riser between these bars`,
      });
    } else if (row.side === "near_zero") {
      out.push({
        kind: "bridged_bars",
        coils: cs,
        bars,
        readings: [name],
        turns_estimate: null,
        message: `${name} reads ${row.reading_ohm.toPrecision(3)} Ω against a median of ${spread.median_ohm.toPrecision(3)} Ω: ${SUGGESTS.near_zero}`,
      });
    } else if (row.side === "riser" && !overOpen) {
      out.push({
        kind: "poor_riser_connection",
        coils: cs,
        bars,
        readings: [name],
        turns_estimate: null,
        message: `${name} (bars ${bars[0]}–${bars[1]}) reads ${pct(row.of_median_fraction)} above the median of ${spread.median_ohm.toPrecision(4)} Ω: a poor coil-to-riser connection at bar ${bars[0]} or ${bars[1]} (${SOURCE_TM}: 10 % or more above); resolder and read again`,
      });
    }
  }
  return out;
}

/** Suspects from the solved coils: open, near zero, high (turns too many), low (short or shorted turns). */
function coilSuspects(layout: WindingLayout, coils: CoilFinding[], turns: number | null, fromReadings: Suspect[]): Suspect[] {
  const out: Suspect[] = [];
  for (const f of coils) {
    const c = layout.coils[f.index - 1];
    const where = `coil ${c.index} (bars ${c.start_bar}–${c.end_bar}, slots ${c.go_slot}–${c.return_slot})`;
    const bars = [c.start_bar!, c.end_bar!];
    const base = { coils: [c.index], bars, readings: [] as string[] };
    if (f.verdict === "open") {
      out.push({
        ...base,
        kind: "open_coil",
        turns_estimate: null,
        message: `${where} is open: the bars across it read the rest of the ring in series and every other reading rises (by C/(C−1) on a ring); a broken wire or a lead off its riser`,
      });
    } else if (f.verdict === "shorted") {
      const already = fromReadings.find((s) => s.kind === "bridged_bars" && s.bars.includes(bars[0]) && s.bars.includes(bars[1]));
      if (!already)
        out.push({ ...base, kind: "bridged_bars", turns_estimate: null, message: `${where} reads near zero: its bars bridged or the whole coil shorted` });
    } else if (f.verdict === "high" || f.verdict === "low") {
      out.push(offCoilSuspect(where, base, f.deviation_fraction!, turns));
    }
  }
  return out;
}

function offCoilSuspect(where: string, base: { coils: number[]; bars: number[]; readings: string[] }, d: number, turns: number | null): Suspect {
  const dn = turns === null ? null : Math.round(d * turns);
  if (d > 0) {
    const message =
      dn === null
        ? `${where} reads ${pct(d)} above the others: turns too many, or a poor joint inside the coil`
        : dn >= 1
          ? `${where} reads ${pct(d)} high: about ${dn} turn${dn > 1 ? "s" : ""} too many (${turns! + dn} instead of ${turns}), or a poor joint inside the coil`
          : `${where} reads ${pct(d)} high, less than a turn in ${turns}: check the wire size and the coil's joints`;
    return { ...base, kind: "turns_miscounted", turns_estimate: dn, message };
  }
  if (d < -WELL_BELOW_FRACTION) {
    return {
      ...base,
      kind: "shorted_turns",
      turns_estimate: dn,
      message: `${where} reads ${pct(-d)} low, well below the others: shorted turns (damaged enamel); confirm with a growler (${SOURCE_TM}: readings well below the average)`,
    };
  }
  const message =
    dn === null
      ? `${where} reads ${pct(-d)} below the others: turns short, or shorted turns; a growler test tells them apart`
      : `${where} reads ${pct(-d)} low: about ${Math.max(1, -dn)} turn${-dn > 1 ? "s" : ""} short (${turns! + Math.min(-1, dn)} instead of ${turns}), or shorted turns; a growler test tells them apart`;
  return { ...base, kind: "turns_miscounted", turns_estimate: dn, message };
}

/** With equalizers fitted the coils cannot be solved one by one: each reading outside the spread band (and not named already) is reported as it stands. */
export function deviatingReadings(layout: WindingLayout, spread: Spread): Suspect[] {
  return spread.rows
    .filter((r) => !r.pass && (r.side === "high" || r.side === "low"))
    .map((r) => {
      const bars = [r.index + 1, mod1(r.index + 2, layout.bars)];
      const name = readingName(r.index);
      return {
        kind: "reading_deviates" as const,
        coils: [],
        bars,
        readings: [name],
        turns_estimate: null,
        message: `${name} (bars ${bars[0]}–${bars[1]}) reads ${pct(r.of_median_fraction)} from the median (band ±${pct(r.window_fraction)}): ${r.suggests}`,
      };
    });
}
