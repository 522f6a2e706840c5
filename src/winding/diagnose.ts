/**
 * From bar-to-bar readings back to the coils, and what a deviating coil or reading suggests.
 *
 * Inversion (derived here from the ring formula of DESIGN.md "The models"): in a closed ring of
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
import { barToBar } from "./ring.js";
import type { WindingLayout } from "./types.js";

const mod1 = (n: number, m: number) => ((((n - 1) % m) + m) % m) + 1;

/**
 * Default tolerance on a coil's resistance: ±5 % of the expected value. Common practice, no
 * published source: it allows for the resistance tolerance of magnet wire (a ±1 to 2 % diameter
 * tolerance is ±2 to 4 % in resistance, IEC 60317-0-1 / NEMA MW 1000 tables, from memory) and
 * uneven end turns, and still catches one turn in twenty.
 */
export const DEFAULT_TOLERANCE = 0.05;
export const TOLERANCE_SOURCE =
  "±5 % on each coil: common practice, no published source (magnet-wire resistance tolerance plus uneven end turns); the 10 % bar-to-bar rule is from US Army TM 55-2210-223-34";

/** A reading this far above the average points to a poor coil-to-riser connection (US Army TM 55-2210-223-34, armature bar-to-bar test). */
export const RISER_RULE_FRACTION = 0.1;

/** A reading or coil below this fraction of its expected value counts as near zero: bars bridged or the coil shorted (common practice, no published source). */
export const NEAR_ZERO_FRACTION = 0.1;

/** A coil this far below its expected value is "well below": shorted turns rather than a miscount (common practice, no published source). */
export const WELL_BELOW_FRACTION = 0.25;

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
    throw inputError("readings_count", "bar_to_bar", `${readings.length} bar-to-bar readings for ${C} bars; give r1 … r${C}, r_i between bar i and bar i+1, r${C} between bar ${C} and bar 1`);
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

/** Solve M x = b by Gaussian elimination with partial pivoting (small dense systems); null when singular. */
function solve(M: number[][], b: number[]): number[] | null {
  const n = b.length;
  const A = M.map((r) => [...r]);
  const y = [...b];
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(A[r][c]) > Math.abs(A[piv][c])) piv = r;
    if (Math.abs(A[piv][c]) < 1e-12) return null;
    [A[piv], A[c]] = [A[c], A[piv]];
    [y[piv], y[c]] = [y[c], y[piv]];
    for (let r = c + 1; r < n; r++) {
      const f = A[r][c] / A[c][c];
      if (f === 0) continue;
      for (let k = c; k < n; k++) A[r][k] -= f * A[c][k];
      y[r] -= f * y[c];
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = y[r];
    for (let k = r + 1; k < n; k++) s -= A[r][k] * x[k];
    x[r] = s / A[r][r];
  }
  return x;
}

/** Least squares min ‖A x − b‖ by the normal equations (A: rows × n, n small). */
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
  return solve(N, v);
}

/**
 * The coil resistances (Ω) that produce the C bar-to-bar readings `readings` (Ω, r1 … rC).
 * Tooth and simplex lap: r_i = R_i(S − R_i)/S, S the ring total; simplex wave: the same for the
 * chain sums X_i of p coils, then the circulant system of chain sums (gcd(p, C) = 1 makes it
 * solvable). Slightly inconsistent readings (noise) still solve: negative coils are clamped to 0
 * and the residual reported. A reading near 0 gives a coil near 0 (bars bridged); an infinite
 * reading, or one as large as all the others together, is an open coil (Infinity), the others then
 * read directly. Limit: a ring (p = 1) lets one coil hold more than half the ring (upper root); a
 * wave's chains are all taken on the lower root, so a chain of p coils holding more than half the
 * ring (only a nearly open coil does that) is treated as an open coil, with its residual reported. Lap windings with equalizers fitted cannot be inverted coil by coil: an
 * `ArmwindError` (code `inversion_not_possible`) says so.
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
  const C = layout.bars;
  const k = layout.coils_between_adjacent_bars;
  const wins = windows(layout);
  const { coilAt } = chain(layout);
  const notes: string[] = [];
  const coil = new Array<number>(layout.coils.length).fill(NaN);
  const open: number[] = [];
  const finite = readings.filter((r) => Number.isFinite(r));
  const meanR = finite.length ? finite.reduce((s, x) => s + x, 0) / finite.length : NaN;
  const inf = readings.map((r, i) => (Number.isFinite(r) ? -1 : i)).filter((i) => i >= 0);

  // steps: chain-step resistances (0-based chain positions) once solved
  let steps: number[] | null = null;

  const openSolve = (e: number) => {
    // coil on chain step e open: a window without e reads its own sum, a window with e reads the rest in series
    const rows: number[][] = [];
    const rhs: number[] = [];
    const idx = (s: number) => (s < e ? s : s - 1);
    wins.forEach((w, i) => {
      if (!Number.isFinite(readings[i])) return;
      const row = new Array<number>(C - 1).fill(0);
      if (w.includes(e)) {
        for (let s = 0; s < C; s++) if (!w.includes(s)) row[idx(s)] = 1;
      } else for (const s of w) row[idx(s)] = 1;
      rows.push(row);
      rhs.push(readings[i]);
    });
    const x = leastSquares(rows, rhs, C - 1);
    const out = new Array<number>(C).fill(NaN);
    if (x) for (let s = 0; s < C; s++) if (s !== e) out[s] = x[idx(s)];
    out[e] = Infinity;
    return out;
  };

  if (inf.length > 0) {
    if (k === 1) {
      steps = wins.map((_w, i) => (Number.isFinite(readings[i]) ? readings[i] : Infinity));
      if (inf.length === 1) {
        notes.push(
          `only r${inf[0] + 1} reads open: a single open coil would read the sum of the others across its bars, so check the meter contact and the lead on bars ${inf[0] + 1} and ${mod1(inf[0] + 2, C)}`,
        );
      } else notes.push(`${inf.length} readings open: the ring is broken in ${inf.length} places; the other coils read directly`);
    } else {
      notes.push(`open readings on a wave winding (${inf.map((i) => `r${i + 1}`).join(", ")}): the circuit is broken in more than one place and the coils cannot be told apart from these readings`);
    }
  } else {
    const rmax = Math.max(...readings);
    if (rmax === 0) {
      steps = new Array<number>(C).fill(0);
      notes.push("every reading is 0: the bars are shorted together (or the meter leads touch each other)");
    } else {
      const h = (S: number) => readings.reduce((s, r) => s + smallRoot(S, r), 0) - k * S;
      const lo = 4 * rmax;
      let X: number[] | null = null;
      let S = NaN;
      if (h(lo) >= 0) {
        let hi = lo * 2;
        for (let i = 0; i < 200 && h(hi) >= 0; i++) hi *= 2;
        S = bisect(h, lo, hi);
        X = readings.map((r) => smallRoot(S, r));
      } else if (k === 1) {
        // one coil above half the ring: its reading takes the upper root, unless it is open
        const imax = readings.indexOf(rmax);
        const hb = (s: number) => bigRoot(s, rmax) + readings.reduce((a, r, i) => (i === imax ? a : a + smallRoot(s, r)), 0) - s;
        let hi = lo * 2;
        for (let i = 0; i < 60 && hb(hi) <= 0; i++) hi *= 2;
        if (hb(hi) > 0) {
          // hb < 0 at lo, > 0 at hi
          S = bisect((s) => -hb(s), lo, hi);
          X = readings.map((r, i) => (i === imax ? bigRoot(S, r) : smallRoot(S, r)));
        }
      }
      if (X) {
        const A = wins.map((w) => {
          const row = new Array<number>(C).fill(0);
          for (const s of w) row[s] = 1;
          return row;
        });
        steps = solve(A, X);
        if (!steps) throw new Error(`internal error: singular chain-sum system (p = ${k}, C = ${C})`);
      } else {
        // the readings fit no closed ring of finite coils: the coil common to the highest readings is open
        let best = 0;
        let bestScore = -Infinity;
        for (let e = 0; e < C; e++) {
          let m = Infinity;
          wins.forEach((w, i) => {
            if (w.includes(e)) m = Math.min(m, readings[i]);
          });
          if (m > bestScore) {
            bestScore = m;
            best = e;
          }
        }
        steps = openSolve(best);
        notes.push(`the readings fit a ring only with coil ${coilAt[best]} open (the reading across it is the rest of the ring in series)`);
      }
    }
  }
  if (steps) {
    let clamped = 0;
    steps.forEach((r, s) => {
      let v = r;
      if (v < 0) {
        clamped++;
        v = 0;
      }
      coil[coilAt[s] - 1] = v;
      if (v === Infinity) open.push(coilAt[s]);
    });
    if (clamped) notes.push(`${clamped} coil${clamped > 1 ? "s" : ""} came out below 0 Ω from inconsistent readings and ${clamped > 1 ? "were" : "was"} set to 0`);
  }
  open.sort((a, b) => a - b);
  const live = layout.coils.filter((c) => !c.dead).map((c) => coil[c.index - 1]);
  const ring = live.reduce((s, x) => s + x, 0);
  let resid = NaN;
  if (live.every((x) => !Number.isNaN(x))) {
    const back = barToBar(layout, coil.map((x, i) => (layout.coils[i].dead ? 0 : x)));
    resid = 0;
    readings.forEach((r, i) => {
      if (Number.isFinite(r) && Number.isFinite(back[i])) resid = Math.max(resid, Math.abs(back[i] - r));
    });
  }
  return {
    coil_ohm: coil,
    ring_ohm: ring,
    residual_ohm: resid,
    residual_fraction: resid / meanR,
    open_coils: open,
    notes,
  };
}

// ---------------------------------------------------------------------------------------------

export type Verdict = "ok" | "high" | "low" | "open" | "shorted" | "dead" | "unknown";

export interface CoilFinding {
  index: number;
  start_bar: number | null;
  end_bar: number | null;
  go_slot: number;
  return_slot: number;
  /** Solved resistance (Ω); null when open, dead, or not resolvable (equalizers fitted). */
  resistance_ohm: number | null;
  expected_ohm: number;
  /** (resistance − expected)/expected; null when the resistance is null. */
  deviation_fraction: number | null;
  verdict: Verdict;
}

export type SuspectKind = "turns_miscounted" | "shorted_turns" | "open_coil" | "bridged_bars" | "poor_riser_connection" | "reading_deviates" | "readings_inconsistent";

export interface Suspect {
  kind: SuspectKind;
  /** Coils concerned (index). */
  coils: number[];
  /** Bars concerned. */
  bars: number[];
  /** Estimated turns too many (+) or too few (−), for turns_miscounted. */
  turns_estimate: number | null;
  message: string;
}

export interface ReadingFinding {
  /** Reading number i: between bar i and the next bar. */
  index: number;
  bar: number;
  next_bar: number;
  reading_ohm: number | null;
  expected_ohm: number;
  /** Reading over the average of the finite readings. */
  of_average: number | null;
}

export interface Diagnosis {
  /** True when no coil and no reading is out of tolerance. */
  ok: boolean;
  coils: CoilFinding[];
  readings: ReadingFinding[];
  suspects: Suspect[];
  tolerance: number;
  tolerance_source: string;
  residual_fraction: number | null;
  notes: string[];
  warnings: Warning[];
}

const pct = (x: number) => `${(x * 100).toFixed(1)} %`;

/**
 * Read the bench: bar-to-bar readings (Ω, r1 … rC) against the coil resistances the plan expects
 * (Ω, coil index order), for coils of `turns` turns. Each coil gets a verdict against `tolerance`
 * (fraction, default DEFAULT_TOLERANCE); suspects say what a deviation suggests:
 *  - a coil high by ΔR/R: turns miscounted, about round(ΔR/R·N) turns too many;
 *  - low: turns short, or shorted turns; well below (more than 25 %): shorted turns;
 *  - an infinite reading, or a coil as large as the rest of the ring: an open coil (every other
 *    reading then rises by C/(C−1) on a ring);
 *  - a reading near zero: two bars bridged (or the coil between them shorted);
 *  - a reading 10 % or more above the average: a poor coil-to-riser connection (US Army
 *    TM 55-2210-223-34, armature bar-to-bar test).
 * Lap windings with equalizers: only the deviating bar pairs are reported.
 */
export function diagnose(layout: WindingLayout, readings: number[], expectedCoilOhm: number[], turns: number, tolerance: number = DEFAULT_TOLERANCE): Diagnosis {
  checkReadings(layout, readings);
  if (expectedCoilOhm.length !== layout.coils.length) {
    throw inputError("coil_ohm_count", "coil_ohm", `${expectedCoilOhm.length} expected coil resistances for ${layout.coils.length} coils`);
  }
  if (!(turns >= 1)) throw inputError("turns_invalid", "wound.turns", `turns per coil must be 1 or more (got ${turns})`);
  if (!(tolerance > 0 && tolerance < 1)) throw inputError("tolerance_invalid", "tolerance", `tolerance must be a fraction between 0 and 1 (got ${tolerance}); the default is ${DEFAULT_TOLERANCE}`);
  const C = layout.bars;
  const expectedReadings = barToBar(layout, expectedCoilOhm.map((x, i) => (layout.coils[i].dead ? 0 : x)));
  const finite = readings.filter((r) => Number.isFinite(r));
  const avg = finite.length ? finite.reduce((s, x) => s + x, 0) / finite.length : NaN;
  const suspects: Suspect[] = [];
  const notes: string[] = [];
  const warnings: Warning[] = [];

  const rf: ReadingFinding[] = readings.map((r, i) => ({
    index: i + 1,
    bar: i + 1,
    next_bar: mod1(i + 2, C),
    reading_ohm: Number.isFinite(r) ? r : null,
    expected_ohm: expectedReadings[i],
    of_average: Number.isFinite(r) && avg > 0 ? r / avg : null,
  }));

  // reading-level checks
  const bridged: number[] = [];
  readings.forEach((r, i) => {
    const bars = [i + 1, mod1(i + 2, C)];
    if (!Number.isFinite(r)) {
      suspects.push({ kind: "open_coil", coils: [], bars, turns_estimate: null, message: `r${i + 1} (bars ${bars[0]}–${bars[1]}) reads open: a broken coil or a lead off its riser between these bars` });
    } else if (r < NEAR_ZERO_FRACTION * expectedReadings[i]) {
      bridged.push(i);
      suspects.push({
        kind: "bridged_bars",
        coils: [],
        bars,
        turns_estimate: null,
        message: `r${i + 1} reads ${r.toPrecision(3)} Ω, near zero against ${expectedReadings[i].toPrecision(3)} Ω expected: bars ${bars[0]} and ${bars[1]} bridged (solder, copper dust, a burr across the mica) or the coil between them shorted (US Army TM 55-2210-223-34)`,
      });
    } else if (avg > 0 && r >= (1 + RISER_RULE_FRACTION) * avg) {
      suspects.push({
        kind: "poor_riser_connection",
        coils: [],
        bars,
        turns_estimate: null,
        message: `r${i + 1} (bars ${bars[0]}–${bars[1]}) reads ${pct(r / avg - 1)} above the average of ${avg.toPrecision(4)} Ω: a poor coil-to-riser connection at bar ${bars[0]} or ${bars[1]} (US Army TM 55-2210-223-34: 10 % or more above the average); resolder and read again`,
      });
    }
  });

  const coilRows: CoilFinding[] = [];
  let residual: number | null = null;
  if (layout.equalizers) {
    notes.push("Equalizers fitted: the readings do not determine each coil; the bar pairs that deviate from the expected readings are reported instead.");
    readings.forEach((r, i) => {
      if (!Number.isFinite(r) || bridged.includes(i)) return;
      const d = r / expectedReadings[i] - 1;
      if (Math.abs(d) > tolerance) {
        suspects.push({
          kind: "reading_deviates",
          coils: [],
          bars: [i + 1, mod1(i + 2, C)],
          turns_estimate: null,
          message: `r${i + 1} (bars ${i + 1}–${mod1(i + 2, C)}) reads ${pct(d)} from the expected ${expectedReadings[i].toPrecision(4)} Ω (tolerance ±${pct(tolerance)})`,
        });
      }
    });
    for (const c of layout.coils) {
      coilRows.push({
        index: c.index,
        start_bar: c.start_bar,
        end_bar: c.end_bar,
        go_slot: c.go_slot,
        return_slot: c.return_slot,
        resistance_ohm: null,
        expected_ohm: expectedCoilOhm[c.index - 1],
        deviation_fraction: null,
        verdict: c.dead ? "dead" : "unknown",
      });
    }
  } else {
    const sol = solveCoils(layout, readings);
    notes.push(...sol.notes);
    residual = Number.isFinite(sol.residual_fraction) ? sol.residual_fraction : null;
    if (residual !== null && residual > tolerance / 2) {
      suspects.push({
        kind: "readings_inconsistent",
        coils: [],
        bars: [],
        turns_estimate: null,
        message: `the readings do not fit one ring of coils (worst misfit ${pct(residual)} of the mean reading): read again, four-wire if the readings are below about ten times the meter's resolution (common practice)`,
      });
    }
    for (const c of layout.coils) {
      const E = expectedCoilOhm[c.index - 1];
      const R = sol.coil_ohm[c.index - 1];
      const row: CoilFinding = {
        index: c.index,
        start_bar: c.start_bar,
        end_bar: c.end_bar,
        go_slot: c.go_slot,
        return_slot: c.return_slot,
        resistance_ohm: Number.isFinite(R) ? R : null,
        expected_ohm: E,
        deviation_fraction: Number.isFinite(R) ? R / E - 1 : null,
        verdict: "ok",
      };
      const where = `coil ${c.index} (bars ${c.start_bar}–${c.end_bar}, slots ${c.go_slot}–${c.return_slot})`;
      if (c.dead) row.verdict = "dead";
      else if (Number.isNaN(R)) row.verdict = "unknown";
      else if (R === Infinity || R / E - 1 > 1) {
        row.verdict = "open";
        suspects.push({
          kind: "open_coil",
          coils: [c.index],
          bars: [c.start_bar!, c.end_bar!],
          turns_estimate: null,
          message:
            R === Infinity
              ? `${where} is open: the bars across it read the rest of the ring in series and every other reading rises (by C/(C−1) on a ring); a broken wire or a lead off its riser`
              : `${where} reads ${(R / E).toFixed(1)} × its expected ${E.toPrecision(4)} Ω: nearly open (a broken strand or a cracked joint)`,
        });
      } else if (R < NEAR_ZERO_FRACTION * E) {
        row.verdict = "shorted";
        const already = suspects.find((s) => s.kind === "bridged_bars" && s.bars.includes(c.start_bar!) && s.bars.includes(c.end_bar!));
        if (already) already.coils.push(c.index);
        else {
          suspects.push({ kind: "bridged_bars", coils: [c.index], bars: [c.start_bar!, c.end_bar!], turns_estimate: null, message: `${where} reads near zero: its bars bridged or the whole coil shorted` });
        }
      } else {
        const d = R / E - 1;
        const dn = Math.round(d * turns);
        if (d > tolerance) {
          row.verdict = "high";
          suspects.push({
            kind: "turns_miscounted",
            coils: [c.index],
            bars: [c.start_bar!, c.end_bar!],
            turns_estimate: dn,
            message:
              dn >= 1
                ? `${where} reads ${pct(d)} high: about ${dn} turn${dn > 1 ? "s" : ""} too many (${turns + dn} instead of ${turns}), or a poor joint inside the coil`
                : `${where} reads ${pct(d)} high, less than a turn in ${turns}: check the wire size and the coil's joints`,
          });
        } else if (d < -tolerance) {
          row.verdict = "low";
          if (d < -WELL_BELOW_FRACTION) {
            suspects.push({
              kind: "shorted_turns",
              coils: [c.index],
              bars: [c.start_bar!, c.end_bar!],
              turns_estimate: dn,
              message: `${where} reads ${pct(-d)} low, well below the others: shorted turns (damaged enamel); confirm with a growler (US Army TM 55-2210-223-34: readings well below the average)`,
            });
          } else {
            suspects.push({
              kind: "turns_miscounted",
              coils: [c.index],
              bars: [c.start_bar!, c.end_bar!],
              turns_estimate: dn,
              message: `${where} reads ${pct(-d)} low: about ${Math.max(1, -dn)} turn${-dn > 1 ? "s" : ""} short (${turns + Math.min(-1, dn)} instead of ${turns}), or shorted turns; a growler test tells them apart`,
            });
          }
        }
      }
      coilRows.push(row);
    }
  }
  notes.push(POLARITY_NOTE);
  const problems = suspects.length > 0 || coilRows.some((c) => c.verdict === "high" || c.verdict === "low" || c.verdict === "open" || c.verdict === "shorted");
  return {
    ok: !problems,
    coils: coilRows,
    readings: rf,
    suspects,
    tolerance,
    tolerance_source: TOLERANCE_SOURCE,
    residual_fraction: residual,
    notes,
    warnings,
  };
}
