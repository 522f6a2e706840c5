/**
 * Choosing among candidates (docs/contracts.md "Choosing among candidates"), one rule for every goal:
 *
 *  1. a candidate meets the goal when its error lies within the tolerance band
 *     [−below, +above] (a bare tolerance t is ±t; for `stall_current`, a limit, { below: t, above: 0 });
 *  2. among those that meet it, the turns count whose best candidate comes nearest the goal wins
 *     (the best at a count being the one with the most copper, i.e. the least resistance);
 *  3. at that count: the least resistance (most copper), then fewer strands, then less copper mass.
 *
 * Why nearest first: with the slot full, copper loss at a fixed torque hardly changes with turns,
 * so "least resistance" or "most efficient" alone always takes the fast edge of the band.
 * `restore` and `fixed` keep their own rule: the turns are given, and at that count the copper
 * area closest to the target comes first (restore: not below 97 % of the original's).
 * When none meets the goal the nearest miss wins (the plan then exits 2).
 *
 * Pure; no physics here: the figures come from the evaluation of each candidate.
 */
import type { Tolerance } from "../job/schema.js";
import type { Candidate, GoalKind } from "./types.js";

/** Relative slack on the tolerance band's edges, against rounding in the model (1e-12). */
const EDGE = 1e-12;

/** Does a signed relative error (achieved − target)/target lie within the tolerance band? */
export function withinTolerance(error: number, tol: Tolerance): boolean {
  return error >= -tol.below - EDGE && error <= tol.above + EDGE;
}

/** How far (a fraction) an error lies outside the tolerance band; 0 inside it. */
export function outsideBand(error: number | null, tol: Tolerance): number {
  if (error === null || !Number.isFinite(error)) return Infinity;
  return Math.max(0, -error - tol.below, error - tol.above);
}

/** Goals whose turns are given (the sweep runs one count): the copper area nearest the target wins. */
function turnsGiven(goal: GoalKind): boolean {
  return goal === "restore" || goal === "fixed" || goal === "convert";
}

/** What ranking reads of a candidate: the sweep compares a winding's figures with the lists before making it a Candidate. */
export type RankKey = Pick<Candidate, "turns" | "strands" | "terminal_ohm" | "copper_mass" | "error" | "rejected_because">;

/** Within one turns count: least resistance (most copper), then fewer strands, then less copper mass. Negative when `a` is better. */
export function compareAtCount(a: RankKey, b: RankKey): number {
  const r = a.terminal_ohm - b.terminal_ohm;
  if (Math.abs(r) > 1e-12 * Math.max(1, a.terminal_ohm)) return r;
  if (a.strands !== b.strands) return a.strands - b.strands;
  return a.copper_mass - b.copper_mass;
}

/** Two candidates that both meet a goal with given turns (restore, fixed): the copper area nearest the target, then `compareAtCount`. */
export function compareGivenTurns(a: RankKey, b: RankKey): number {
  const d = Math.abs(a.error ?? Infinity) - Math.abs(b.error ?? Infinity);
  if (Math.abs(d) > 1e-9) return d;
  return compareAtCount(a, b);
}

/** Two candidates that miss: those that fit first, then the nearer to the tolerance band, then less resistance. */
export function compareMissing(tol: Tolerance): (a: RankKey, b: RankKey) => number {
  return (a, b) => {
    const fa = a.rejected_because.length === 0 ? 0 : 1;
    const fb = b.rejected_because.length === 0 ? 0 : 1;
    if (fa !== fb) return fa - fb;
    const ea = outsideBand(a.error, tol);
    const eb = outsideBand(b.error, tol);
    if (ea !== eb) return ea - eb;
    const da = Math.abs(a.error ?? Infinity);
    const db = Math.abs(b.error ?? Infinity);
    if (da !== db) return da - db;
    return a.terminal_ohm - b.terminal_ohm;
  };
}

/**
 * A best-first list of at most `size` items under `cmp`, kept by insertion. `K` is what `cmp` reads
 * of an item, so that `keeps` can tell from a key alone whether the item would be kept.
 */
export class TopList<T extends K, K = T> {
  readonly items: T[] = [];
  constructor(
    private readonly size: number,
    private readonly cmp: (a: K, b: K) => number,
  ) {}
  /** Would `offer` keep an item that compares as `x` does? (`offer`'s own test: one rule for both.) */
  keeps(x: K): boolean {
    const items = this.items;
    return items.length < this.size || this.cmp(x, items[items.length - 1]) < 0;
  }
  offer(x: T): void {
    if (!this.keeps(x)) return;
    const items = this.items;
    let i = items.length;
    while (i > 0 && this.cmp(x, items[i - 1]) < 0) i--;
    items.splice(i, 0, x);
    if (items.length > this.size) items.pop();
  }
}

/**
 * The candidates that meet the goal, ranked by the rule above while the sweep offers them one by
 * one: a best-first list per turns count, then the counts ordered by how near their best comes.
 */
export class MeetingRank {
  private readonly byTurns = new Map<number, TopList<Candidate, RankKey>>();
  private readonly within: (a: RankKey, b: RankKey) => number;
  count = 0;

  constructor(
    goal: GoalKind,
    private readonly keep: number,
  ) {
    this.within = turnsGiven(goal) ? compareGivenTurns : compareAtCount;
  }

  offer(c: Candidate): void {
    this.count++;
    this.listOf(c.turns).offer(c);
  }

  /**
   * `offer` for a meeting winding whose ranking figures are `key`: the candidate `make` returns is
   * made only when its turns count's list would keep it (the sweep makes few Candidates this way).
   */
  offerLazily(key: RankKey, make: () => Candidate): void {
    this.count++;
    const list = this.listOf(key.turns);
    if (list.keeps(key)) list.offer(make());
  }

  private listOf(turns: number): TopList<Candidate, RankKey> {
    let list = this.byTurns.get(turns);
    if (!list) {
      list = new TopList(this.keep, this.within);
      this.byTurns.set(turns, list);
    }
    return list;
  }

  /** At most `keep` candidates, best first. */
  ranked(): Candidate[] {
    const counts = [...this.byTurns.values()].map((l) => l.items);
    counts.sort((a, b) => {
      const d = Math.abs(a[0].error ?? Infinity) - Math.abs(b[0].error ?? Infinity);
      if (Math.abs(d) > 1e-12) return d;
      return this.within(a[0], b[0]);
    });
    return counts.flat().slice(0, this.keep);
  }
}
