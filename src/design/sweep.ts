/**
 * The candidate sweep: every turns count that could fit × every stock wire × 1 … max_in_hand
 * strands, each evaluated, and ranked as docs/contracts.md's "choosing among candidates" says (the rule
 * lives in ./rank.ts): the turns count nearest the goal, then the most copper at that count.
 */
import { maxConductorsForFill } from "../armature/fill.js";
import type { Wire } from "../wire/types.js";
import type { Evaluator } from "./evaluate.js";
import type { Candidate, RejectCode } from "./types.js";
import { compareMissing, MeetingRank, TopList } from "./rank.js";

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

export function sweep(ev: Evaluator, opts: SweepOptions, keep = 20): SweepResult {
  const meeting = new MeetingRank(ev.goal, keep);
  const missing = compareMissing(ev.tolerance);
  const nearest = new TopList<Candidate>(keep, missing);
  const nearFit = new TopList<Candidate>(5, missing);
  const nearOver = new TopList<Candidate>(5, missing);
  const rejections: Partial<Record<RejectCode, number>> = {};
  let total = 0;
  for (const wire of opts.wires) {
    for (let k = opts.fixedStrands ?? 1; k <= (opts.fixedStrands ?? opts.maxInHand); k++) {
      let lo = 1;
      let hi: number;
      if (opts.fixedTurns !== undefined) {
        lo = hi = opts.fixedTurns;
      } else {
        const nFit = Math.floor(maxConductorsForFill(ev.fillLimit, wire.area, opts.freeArea) / (opts.sides * k));
        hi = Math.min(MAX_TURNS, Math.max(1, Math.ceil(nFit * (1 + OVERSHOOT)) + 1));
      }
      for (let n = lo; n <= hi; n++) {
        const c = ev.evaluate(n, wire, k);
        total++;
        for (const r of c.rejected_because) rejections[r] = (rejections[r] ?? 0) + 1;
        if (c.meets_goal) {
          meeting.offer(c);
        } else {
          nearest.offer(c);
          (c.rejected_because.length === 0 ? nearFit : nearOver).offer(c);
        }
      }
    }
  }
  const ranked = meeting.ranked();
  const best = ranked[0] ?? nearest.items[0] ?? null;
  const shown = meeting.count === 0 ? nearest.items : [...ranked, ...nearFit.items, ...nearOver.items];
  return { best, shown: dedupe(shown), total, rejections, meeting: meeting.count };
}

function dedupe(cs: Candidate[]): Candidate[] {
  const seen = new Set<Candidate>();
  return cs.filter((c) => (seen.has(c) ? false : (seen.add(c), true)));
}
