/**
 * The candidate sweep: every turns count that could fit × every stock wire × 1 … max_in_hand
 * strands, each evaluated, and ranked as DESIGN.md's "choosing among candidates" says:
 * those within tolerance of the goal meet it; among them the least resistance (most copper) wins,
 * then fewer strands, then less copper mass (restore: the copper area closest to the original's;
 * duty: the least input power); when none meets it the nearest wins.
 */
import { maxConductorsForFill } from "../armature/fill.js";
import type { Wire } from "../wire/types.js";
import type { Evaluator } from "./evaluate.js";
import type { Candidate, RejectCode } from "./types.js";

/** Turns beyond the fill limit that are still swept, so that near misses show: 15 % (armwind's own choice). */
const OVERSHOOT = 0.15;
/** The most turns per coil swept, whatever the slot. */
export const MAX_TURNS = 5000;

export interface SweepOptions {
  wires: Wire[];
  maxInHand: number;
  /** Restore: only these turns. */
  fixedTurns?: number;
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

/** Compare two candidates that both meet the goal: negative when `a` is better. */
export function compareMeeting(goal: Evaluator["goal"], a: Candidate, b: Candidate): number {
  if (goal === "restore" || goal === "convert") {
    const d = Math.abs(a.error!) - Math.abs(b.error!);
    if (Math.abs(d) > 1e-9) return d;
  } else if (goal === "duty" && a.duty_input_w !== null && b.duty_input_w !== null) {
    const d = a.duty_input_w - b.duty_input_w;
    if (Math.abs(d) > 1e-9 * Math.max(1, a.duty_input_w)) return d;
  }
  const r = a.terminal_ohm - b.terminal_ohm;
  if (Math.abs(r) > 1e-12 * Math.max(1, a.terminal_ohm)) return r;
  if (a.strands !== b.strands) return a.strands - b.strands;
  return a.copper_mass - b.copper_mass;
}

/** Compare two candidates that miss: the nearer to the goal first, then fewer rejections. */
export function compareMissing(a: Candidate, b: Candidate): number {
  const ea = a.error === null ? Infinity : Math.abs(a.error);
  const eb = b.error === null ? Infinity : Math.abs(b.error);
  const fa = a.rejected_because.length === 0 ? 0 : 1;
  const fb = b.rejected_because.length === 0 ? 0 : 1;
  if (fa !== fb) return fa - fb;
  if (ea !== eb) return ea - eb;
  return a.terminal_ohm - b.terminal_ohm;
}

/** A best-first list of at most `size` items under `cmp`, kept by insertion (the sweep keeps only what it shows). */
class TopList<T> {
  readonly items: T[] = [];
  constructor(
    private readonly size: number,
    private readonly cmp: (a: T, b: T) => number,
  ) {}
  offer(x: T): void {
    const items = this.items;
    if (items.length >= this.size && this.cmp(x, items[items.length - 1]) >= 0) return;
    let i = items.length;
    while (i > 0 && this.cmp(x, items[i - 1]) < 0) i--;
    items.splice(i, 0, x);
    if (items.length > this.size) items.pop();
  }
}

export function sweep(ev: Evaluator, opts: SweepOptions, keep = 20): SweepResult {
  const meeting = new TopList<Candidate>(keep, (a, b) => compareMeeting(ev.goal, a, b));
  const nearest = new TopList<Candidate>(keep, compareMissing);
  const nearFit = new TopList<Candidate>(5, compareMissing);
  const nearOver = new TopList<Candidate>(5, compareMissing);
  const rejections: Partial<Record<RejectCode, number>> = {};
  let total = 0;
  let meetingCount = 0;
  for (const wire of opts.wires) {
    for (let k = 1; k <= opts.maxInHand; k++) {
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
          meetingCount++;
        } else {
          nearest.offer(c);
          (c.rejected_because.length === 0 ? nearFit : nearOver).offer(c);
        }
      }
    }
  }
  const best = meeting.items[0] ?? nearest.items[0] ?? null;
  const shown = meetingCount === 0 ? nearest.items : [...meeting.items, ...nearFit.items, ...nearOver.items];
  return { best, shown: dedupe(shown), total, rejections, meeting: meetingCount };
}

function dedupe(cs: Candidate[]): Candidate[] {
  const seen = new Set<Candidate>();
  return cs.filter((c) => (seen.has(c) ? false : (seen.add(c), true)));
}
