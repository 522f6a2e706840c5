/**
 * Metric enamelled round copper wire: the nominal conductor diameters of IEC 60317-0-1 (the R20
 * series from 0.020 to 5.000 mm and the R40 intermediate sizes from 0.075 mm up, as the standard
 * lists them; FROM MEMORY), plus the sizes of the reference CSV that are not in them (0.018 mm),
 * with maximum overall diameters by grade 1, 2, 3 (see overall.ts for where each comes from).
 */

import { REFERENCE_ROWS } from "./data/overall-reference.js";
import { METRIC_ANCHORS, overallFromAnchors, type Grade } from "./overall.js";
import type { OverallSource } from "./types.js";

/** R20 preferred sizes, mm (ISO 3, IEC 60317-0-1). */
const R20_MM = [
  0.02, 0.022, 0.025, 0.028, 0.032, 0.036, 0.04, 0.045, 0.05, 0.056, 0.063, 0.071, 0.08, 0.09, 0.1, 0.112, 0.125, 0.14, 0.16, 0.18, 0.2, 0.224, 0.25, 0.28,
  0.315, 0.355, 0.4, 0.45, 0.5, 0.56, 0.63, 0.71, 0.8, 0.9, 1.0, 1.12, 1.25, 1.4, 1.6, 1.8, 2.0, 2.24, 2.5, 2.8, 3.15, 3.55, 4.0, 4.5, 5.0,
];

/** R40 intermediate sizes, mm (ISO 3, IEC 60317-0-1). */
const R40_MM = [
  0.075, 0.085, 0.095, 0.106, 0.118, 0.132, 0.15, 0.17, 0.19, 0.212, 0.236, 0.265, 0.3, 0.335, 0.375, 0.425, 0.475, 0.53, 0.6, 0.67, 0.75, 0.85, 0.95, 1.06,
  1.18, 1.32, 1.5, 1.7, 1.9, 2.12, 2.36, 2.65, 3.0, 3.35, 3.75, 4.25, 4.75,
];

/** Sizes of the reference CSV that are metric (no SWG mark) and in neither series. */
const CSV_METRIC_MM = REFERENCE_ROWS.filter((r) => r[1] === null).map((r) => r[0]);

const NOMINAL_MM: readonly number[] = [...new Set([...R20_MM, ...R40_MM, ...CSV_METRIC_MM])].sort((a, b) => a - b);

/** Every metric nominal diameter in the catalogue, ascending, m. */
export function metricNominals(): number[] {
  return NOMINAL_MM.map((mm) => mm / 1e3);
}

/** A written diameter is taken as a nominal size when it is within this of one (float noise only: nominal sizes are 1 µm or more apart). */
const SAME = 0.5e-9;

/** The IEC 60317-0-1 nominal diameter (m) that `d` (m) names, or null when it is not one. */
export function findNominalMetric(d: number): number | null {
  for (const mm of NOMINAL_MM) if (Math.abs(mm / 1e3 - d) < SAME) return mm / 1e3;
  return null;
}

/** The nominal diameters (m) nearest to `d` (m) below and above, for "what would be right" messages. */
export function nearestNominals(d: number): number[] {
  const all = metricNominals();
  const above = all.find((x) => x > d);
  const below = [...all].reverse().find((x) => x < d);
  return [below, above].filter((x): x is number => x !== undefined);
}

/** "0.250": a metric size in mm, three decimals (the way IEC 60317 tables print it). */
export function metricName(d: number): string {
  return (d * 1e3).toFixed(3);
}

/** Maximum overall diameter (m) of a metric nominal size `d` (m) in a grade, and its source. */
export function metricOverall(d: number, grade: Grade): { value: number | null; source: OverallSource } {
  return overallFromAnchors(d, grade, METRIC_ANCHORS);
}
