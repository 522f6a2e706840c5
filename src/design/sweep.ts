/**
 * The candidate sweep: every turns count that could fit × every stock wire × 1 … max_in_hand
 * strands, each evaluated, and ranked as docs/contracts.md's "choosing among candidates" says (the rule
 * lives in ./rank.ts): the turns count nearest the goal, then the most copper at that count.
 */
import { maxConductorsForFill } from "../armature/fill.js";
import type { Wire } from "../wire/types.js";
import type { Evaluator } from "./evaluate.js";
import type { Candidate, RejectCode } from "./types.js";
import { compareMissing, MeetingRank, TopList, type RankKey } from "./rank.js";

/** Turns beyond the fill limit that are still swept, so that near misses show: 15 % (armwind's own choice). */
const OVERSHOOT = 0.15;
/** The most turns per coil swept, whatever the slot. */
export const MAX_TURNS = 5000;

export interface SweepOptions {
  wires: Wire[];
  maxInHand: number;
  /** Restore and fixed: only these turns. */
  fixedTurns?: number;
  /** Fixed: only this many strands in hand. */
  fixedStrands?: number;
  sides: number;
  freeArea: number;
}

export interface SweepResult {
  best: Candidate | null;
  /** The best candidates (meeting the goal, ranked) then the nearest misses. */
  shown: Candidate[];
  total: number;
  rejections: Partial<Record<RejectCode, number>>;
  meeting: number;
}

/**
 * Sweep the stock: each candidate is evaluated (`Evaluator.scan`, the cheap evaluation's figures),
 * counted, and made a Candidate only when a list would keep it; the result is exactly what offering
 * every candidate to every list gives (test/evaluate-properties.test.ts checks it against that).
 */
export function sweep(ev: Evaluator, opts: SweepOptions, keep = 20): SweepResult {
  const meeting = new MeetingRank(ev.goal, keep);
  const missing = compareMissing(ev.tolerance);
  const nearest = new TopList<Candidate, RankKey>(keep, missing);
  const nearFit = new TopList<Candidate, RankKey>(5, missing);
  const nearOver = new TopList<Candidate, RankKey>(5, missing);
  const counts = new Map<RejectCode, number>(); // in the order each reason first shows, as the plan lists them
  let total = 0;
  for (const wire of opts.wires) {
    for (let k = opts.fixedStrands ?? 1; k <= (opts.fixedStrands ?? opts.maxInHand); k++) {
      const [lo, hi] = turnsRange(ev, opts, wire, k);
      const scan = ev.scan(wire, k);
      for (let n = lo; n <= hi; n++) {
        const f = scan.figures(n);
        total++;
        const reasons = f.rejected_because;
        for (let i = 0; i < reasons.length; i++) counts.set(reasons[i], (counts.get(reasons[i]) ?? 0) + 1);
        if (f.meets_goal) {
          meeting.offerLazily(f, scan.candidate);
          continue;
        }
        const side = reasons.length === 0 ? nearFit : nearOver;
        // the nearest misses are shown only when nothing meets the goal: once something has, they no longer matter
        const toNearest = meeting.count === 0 && nearest.keeps(f);
        const toSide = side.keeps(f);
        if (!toNearest && !toSide) continue;
        const c = scan.candidate();
        if (toNearest) nearest.offer(c);
        if (toSide) side.offer(c);
      }
    }
  }
  const ranked = meeting.ranked();
  const best = ranked[0] ?? nearest.items[0] ?? null;
  const shown = meeting.count === 0 ? nearest.items : [...ranked, ...nearFit.items, ...nearOver.items];
  const rejections: Partial<Record<RejectCode, number>> = Object.fromEntries(counts);
  return { best, shown: dedupe(shown), total, rejections, meeting: meeting.count };
}

/** The turns counts swept for a wire and strands in hand: the fixed count, else 1 … the fill limit's count + 15 % (+1), at most MAX_TURNS. */
function turnsRange(ev: Evaluator, opts: SweepOptions, wire: Wire, k: number): [number, number] {
  if (opts.fixedTurns !== undefined) return [opts.fixedTurns, opts.fixedTurns];
  const nFit = Math.floor(maxConductorsForFill(ev.fillLimit, wire.area, opts.freeArea) / (opts.sides * k));
  return [1, Math.min(MAX_TURNS, Math.max(1, Math.ceil(nFit * (1 + OVERSHOOT)) + 1))];
}

function dedupe(cs: Candidate[]): Candidate[] {
  const seen = new Set<Candidate>();
  return cs.filter((c) => (seen.has(c) ? false : (seen.add(c), true)));
}
