/**
 * SI to the units people read, in one place: the core computes in SI (m, m², Ω, A, V, rad/s,
 * N·m, W, A/m²) and only the shells (terminal text, `--json`, the card, SVG pictures) convert,
 * through these functions. 1 rpm = 2π/60 rad/s exactly (SI brochure, the minute and the radian).
 */
import type { GoalKind } from "../design/types.js";

/** rpm per rad/s: 60/(2π). */
export const RPM_PER_RAD_S = 60 / (2 * Math.PI);

/** rad/s → rpm. */
export const toRpm = (w: number): number => w * RPM_PER_RAD_S;
/** rpm → rad/s. */
export const fromRpm = (n: number): number => n / RPM_PER_RAD_S;
/** m → mm. */
export const toMm = (m: number): number => m * 1e3;
/** m² → mm². */
export const toMm2 = (a: number): number => a * 1e6;
/** kg → g. */
export const toGrams = (kg: number): number => kg * 1e3;
/** A/m² → A/mm². */
export const toAPerMm2 = (j: number): number => j / 1e6;
/** N·m → mN·m. */
export const toMilliNm = (t: number): number => t * 1e3;

/** A number or null through a conversion; null, undefined and non-finite values give null. */
export function convert(x: number | null | undefined, f: (x: number) => number): number | null {
  if (x === null || x === undefined || !Number.isFinite(x)) return null;
  const y = f(x);
  return Number.isFinite(y) ? y : null;
}

/** The unit a goal's target and achieved values are given in, outside the core (the `--json` key `goal.unit`). */
export const GOAL_UNIT: Record<GoalKind, string> = {
  restore: "mm2",
  fixed: "mm2",
  no_load_speed: "rpm",
  kv: "rpm/V",
  stall_current: "A",
  duty: "rpm",
  convert: "rpm",
};

/**
 * A goal figure from SI (copper area m², speed rad/s, Kv in rad/s per V, current A) to `GOAL_UNIT`:
 * mm², rpm, rpm/V, A. Null stays null.
 */
export function goalValue(kind: GoalKind, si: number | null | undefined): number | null {
  switch (kind) {
    case "restore":
    case "fixed":
      return convert(si, toMm2);
    case "no_load_speed":
    case "kv":
    case "duty":
    case "convert":
      return convert(si, toRpm);
    case "stall_current":
      return convert(si, (x) => x);
  }
}
