/**
 * Imperial Standard Wire Gauge, SWG (BS 3737:1964, withdrawn; still what older motors and hobby
 * suppliers use). A table, not a formula. Diameters in inches as the standard prints them
 * (FROM MEMORY; checked against the SWG rows of the reference CSV, which print them in mm).
 *
 * Overall diameters by grade: the reference CSV rows marked swg (IS 13730-0-1, published). A size
 * without its own row (SWG 12, 14, 32 and the fine sizes 46–50) is interpolated between the
 * neighbouring published rows of the CSV, metric or SWG alike: the maximum overall diameter of a
 * grade depends only on the bare copper diameter (IEC 60317-0-1), not on the gauge it is named in.
 * Sizes above the largest published row (SWG 10 and coarser) have none.
 */

import { PUBLISHED_ANCHORS, overallFromAnchors, type Grade } from "./overall.js";
import type { OverallSource } from "./types.js";

const INCH = 0.0254;

/** [name, diameter in inches], coarse to fine. BS 3737:1964, from memory. */
const SWG_IN: readonly (readonly [string, number])[] = [
  ["7/0", 0.5],
  ["6/0", 0.464],
  ["5/0", 0.432],
  ["4/0", 0.4],
  ["3/0", 0.372],
  ["2/0", 0.348],
  ["0", 0.324],
  ["1", 0.3],
  ["2", 0.276],
  ["3", 0.252],
  ["4", 0.232],
  ["5", 0.212],
  ["6", 0.192],
  ["7", 0.176],
  ["8", 0.16],
  ["9", 0.144],
  ["10", 0.128],
  ["11", 0.116],
  ["12", 0.104],
  ["13", 0.092],
  ["14", 0.08],
  ["15", 0.072],
  ["16", 0.064],
  ["17", 0.056],
  ["18", 0.048],
  ["19", 0.04],
  ["20", 0.036],
  ["21", 0.032],
  ["22", 0.028],
  ["23", 0.024],
  ["24", 0.022],
  ["25", 0.02],
  ["26", 0.018],
  ["27", 0.0164],
  ["28", 0.0148],
  ["29", 0.0136],
  ["30", 0.0124],
  ["31", 0.0116],
  ["32", 0.0108],
  ["33", 0.01],
  ["34", 0.0092],
  ["35", 0.0084],
  ["36", 0.0076],
  ["37", 0.0068],
  ["38", 0.006],
  ["39", 0.0052],
  ["40", 0.0048],
  ["41", 0.0044],
  ["42", 0.004],
  ["43", 0.0036],
  ["44", 0.0032],
  ["45", 0.0028],
  ["46", 0.0024],
  ["47", 0.002],
  ["48", 0.0016],
  ["49", 0.0012],
  ["50", 0.001],
];

/** Every SWG size name, coarse to fine: "7/0" … "2/0", "0", "1" … "50". */
export function swgNames(): string[] {
  return SWG_IN.map((r) => r[0]);
}

/**
 * Canonical SWG name of a size as written: "7/0" or "0000000" → "7/0", "1/0" or "0" → "0",
 * "36" → "36". Undefined when SWG has no such size.
 */
export function swgName(size: string): string | undefined {
  const s = size.trim();
  let name: string | undefined;
  const m = /^([1-7])\/0$/.exec(s);
  if (m) name = m[1] === "1" ? "0" : `${m[1]}/0`;
  else if (/^0{1,7}$/.test(s)) name = s.length === 1 ? "0" : `${s.length}/0`;
  else if (/^[1-9]\d?$/.test(s)) name = s;
  return name !== undefined && SWG_IN.some((r) => r[0] === name) ? name : undefined;
}

/** Bare diameter of an SWG size (canonical name), m. BS 3737:1964 (from memory). */
export function swgDiameter(name: string): number {
  const row = SWG_IN.find((r) => r[0] === name);
  if (!row) throw new Error(`not an SWG size: ${name}`);
  return row[1] * INCH;
}

/** Maximum overall diameter (m) of an SWG size in a grade, and its source (see the module comment). */
export function swgOverall(name: string, grade: Grade): { value: number | null; source: OverallSource } {
  const bare = swgDiameter(name);
  const own = PUBLISHED_ANCHORS.find((a) => a.swg === name);
  if (own) return overallFromAnchors(bare, grade, PUBLISHED_ANCHORS, (a) => a === own);
  // No row of its own: interpolate between published rows, but never take a row of another
  // size as this one's (rows print 3 decimals; SWG sizes are exact inches).
  return overallFromAnchors(bare, grade, PUBLISHED_ANCHORS, () => false);
}
