/**
 * Axis ticks at "nice" steps: 1, 2, 2.5 or 5 × 10^k (the usual choice of plotting libraries).
 * Ticks are whole multiples of the step, so float sums never drift past the ends.
 */

/** The smallest nice step at least `raw`. */
export function niceStep(raw: number, factors: readonly number[] = [1, 2, 2.5, 5, 10]): number {
  const mag = 10 ** Math.floor(Math.log10(raw));
  return factors.map((f) => f * mag).find((s) => s >= raw * (1 - 1e-12)) ?? 10 * mag;
}

/** Ticks lying within [lo, hi] at a nice step giving about `target` intervals. */
export function niceTicks(lo: number, hi: number, target = 5, factors?: readonly number[]): number[] {
  if (!(hi > lo) || !Number.isFinite(hi - lo)) return [lo];
  const step = niceStep((hi - lo) / target, factors);
  const out: number[] = [];
  for (let i = Math.ceil(lo / step - 1e-9); i * step <= hi + step * 1e-9; i++) out.push(Number((i * step).toPrecision(12)));
  return out;
}

/** Ticks from 0 to the first tick at or above `max` (an axis that starts at zero and holds everything). */
export function ticksFromZero(max: number, target = 5): number[] {
  if (!(max > 0) || !Number.isFinite(max)) return [0, 1];
  const step = niceStep(max / target);
  const n = Math.max(1, Math.ceil(max / step - 1e-9));
  return Array.from({ length: n + 1 }, (_, i) => Number((i * step).toPrecision(12)));
}
