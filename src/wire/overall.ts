/**
 * Maximum overall diameters of enamelled round copper wire by grade (IEC 60317-0-1 grades 1, 2, 3),
 * looked up in the reference rows (published) and, for metric sizes above them, in a short table
 * from memory. Between two neighbouring rows the value is interpolated linearly in the bare
 * diameter (a catalogue choice, no published source: both the bare size and the film increase
 * grow smoothly between neighbouring sizes); the value is marked "interpolated" when both
 * neighbours are published, "from memory" when either one is. Outside the rows nothing is
 * extrapolated: no value, source "none".
 */

import { REFERENCE_ROWS } from "./data/overall-reference.js";
import type { OverallSource } from "./types.js";

export type Grade = 1 | 2 | 3;
export const GRADES: readonly Grade[] = [1, 2, 3];

export interface Anchor {
  /** Bare diameter, mm (as the tables print it). */
  d_mm: number;
  /** Maximum overall diameter by grade 1, 2, 3, mm, or null where the table has none. */
  max_mm: readonly [number | null, number | null, number | null];
  source: "published" | "from memory";
  /** SWG number of a published row marked swg. */
  swg: string | null;
}

/** The reference CSV rows as anchors. */
export const PUBLISHED_ANCHORS: readonly Anchor[] = REFERENCE_ROWS.map((r) => ({
  d_mm: r[0],
  max_mm: [r[2], r[3], r[4]] as const,
  source: "published" as const,
  swg: r[1],
})).sort((a, b) => a.d_mm - b.d_mm);

/**
 * Maximum overall diameters of the large metric sizes above the published rows (IEC 60317-0-1,
 * FROM MEMORY; grades 1 and 2 only: this catalogue holds no grade 3 value above 2.946 mm).
 * Row: [nominal mm, grade 1 max mm, grade 2 max mm].
 */
const METRIC_FROM_MEMORY: readonly (readonly [number, number, number])[] = [
  [3.15, 3.233, 3.276],
  [3.55, 3.635, 3.679],
  [4.0, 4.088, 4.133],
  [4.5, 4.591, 4.637],
  [5.0, 5.093, 5.141],
];

export const METRIC_ANCHORS: readonly Anchor[] = [
  ...PUBLISHED_ANCHORS,
  ...METRIC_FROM_MEMORY.map((r) => ({
    d_mm: r[0],
    max_mm: [r[1], r[2], null] as const,
    source: "from memory" as const,
    swg: null,
  })),
].sort((a, b) => a.d_mm - b.d_mm);

/** Two diameters in mm are the same printed size (the tables print three decimals). */
const SAME_MM = 1e-6;

/**
 * Maximum overall diameter (m) of a wire of bare diameter `bare` (m) in `grade`, from `anchors`.
 * `exact` picks the anchor that is this very size (default: the same diameter in mm); a size that
 * is not an anchor is interpolated between its two neighbours, never extrapolated.
 */
export function overallFromAnchors(
  bare: number,
  grade: Grade,
  anchors: readonly Anchor[],
  exact?: (a: Anchor) => boolean,
): { value: number | null; source: OverallSource } {
  const d = bare * 1e3;
  const k = grade - 1;
  const hit = anchors.find(exact ?? ((a) => Math.abs(a.d_mm - d) < SAME_MM));
  if (hit) {
    const v = hit.max_mm[k];
    return v === null ? { value: null, source: "none" } : { value: v / 1e3, source: hit.source };
  }
  let lo: Anchor | undefined;
  let hi: Anchor | undefined;
  for (const a of anchors) {
    if (a.d_mm <= d) lo = a;
    else if (!hi) hi = a;
  }
  if (!lo || !hi) return { value: null, source: "none" };
  const vlo = lo.max_mm[k];
  const vhi = hi.max_mm[k];
  if (vlo === null || vhi === null) return { value: null, source: "none" };
  const t = (d - lo.d_mm) / (hi.d_mm - lo.d_mm);
  const v = vlo + t * (vhi - vlo);
  const source: OverallSource = lo.source === "published" && hi.source === "published" ? "interpolated" : "from memory";
  return { value: v / 1e3, source };
}
