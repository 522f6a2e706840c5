/**
 * American Wire Gauge (ASTM B258) and the overall diameters of film-insulated AWG magnet wire
 * (NEMA MW 1000).
 *
 * Diameters come from the ASTM B258 formula d(n) = 0.127 mm × 92^((36 − n)/39), UNROUNDED: the
 * printed tables round the diameter (AWG 30: 0.0100 in) and derive their resistance from the
 * rounded value (103.7 Ω/1000 ft), while the formula gives 0.01003 in and 103.2 Ω/1000 ft. The
 * catalogue uses the formula, so its Ω/m for fine gauges sits a little below the printed tables
 * (AWG 40: about 3 %). Sizes 0, 00, 000, 0000 (written 0, 2/0, 3/0, 4/0) are n = 0, −1, −2, −3.
 */

import type { FilmBuild, OverallSource } from "./types.js";

/** Gauge numbers the catalogue holds: 4/0 (n = −3) … 56. */
export const AWG_MIN_N = -3;
export const AWG_MAX_N = 56;

const INCH = 0.0254;

/** Bare diameter of AWG gauge number n (n = −3 for 4/0 … 56), m. ASTM B258 formula, unrounded. */
export function awgDiameter(n: number): number {
  return 0.127e-3 * 92 ** ((36 - n) / 39);
}

/** Canonical name of gauge number n: "4/0", "3/0", "2/0", "0", "1" … "56". */
export function awgName(n: number): string {
  return n < 0 ? `${1 - n}/0` : String(n);
}

/**
 * Gauge number of an AWG size as written: "4/0" or "0000" → −3, "2/0" or "00" → −1, "1/0" or "0" → 0,
 * "33" → 33. Undefined when it is not a size the catalogue holds.
 */
export function awgNumber(size: string): number | undefined {
  const s = size.trim();
  let n: number | undefined;
  const m = /^([1-4])\/0$/.exec(s);
  if (m) n = 1 - Number(m[1]);
  else if (/^0{1,4}$/.test(s)) n = 1 - s.length;
  else if (/^[1-9]\d?$/.test(s)) n = Number(s);
  if (n === undefined || n < AWG_MIN_N || n > AWG_MAX_N) return undefined;
  return n;
}

/** Every AWG gauge number in the catalogue, coarse to fine. */
export function awgNumbers(): number[] {
  const out: number[] = [];
  for (let n = AWG_MIN_N; n <= AWG_MAX_N; n++) out.push(n);
  return out;
}

export const FILM_BUILDS: readonly FilmBuild[] = ["single", "heavy", "triple"];

/**
 * Maximum overall diameter (inches) of film-insulated round copper magnet wire by build,
 * NEMA MW 1000. FROM MEMORY (the standard was not at hand): treat each figure as good to about
 * ±0.0002 in. Row: [AWG, single, heavy, triple]. Sizes outside AWG 4 … 44 are not held here
 * (either the standard gives no film build for them or they are not remembered well enough):
 * the catalogue gives no overall diameter for them and asks for a measured one.
 */
const NEMA_MAX_OVERALL_IN: readonly (readonly [number, number, number, number])[] = [
  [4, 0.2067, 0.2083, 0.2098],
  [5, 0.1842, 0.1857, 0.1872],
  [6, 0.1643, 0.1658, 0.1671],
  [7, 0.1465, 0.148, 0.1491],
  [8, 0.1306, 0.132, 0.1332],
  [9, 0.1165, 0.1178, 0.1189],
  [10, 0.1039, 0.1051, 0.1061],
  [11, 0.0927, 0.0938, 0.0948],
  [12, 0.0827, 0.0837, 0.0847],
  [13, 0.0738, 0.0748, 0.0757],
  [14, 0.0659, 0.067, 0.0682],
  [15, 0.0588, 0.0599, 0.0609],
  [16, 0.0524, 0.0535, 0.0545],
  [17, 0.0469, 0.0479, 0.0488],
  [18, 0.0418, 0.0428, 0.0437],
  [19, 0.0373, 0.0382, 0.0391],
  [20, 0.0334, 0.0342, 0.0351],
  [21, 0.0298, 0.0306, 0.0314],
  [22, 0.0266, 0.0273, 0.0281],
  [23, 0.0238, 0.0244, 0.0253],
  [24, 0.0213, 0.0219, 0.0227],
  [25, 0.019, 0.0196, 0.0203],
  [26, 0.0169, 0.0175, 0.0182],
  [27, 0.0152, 0.0158, 0.0164],
  [28, 0.0135, 0.0141, 0.0147],
  [29, 0.0122, 0.0127, 0.0133],
  [30, 0.0108, 0.0114, 0.0119],
  [31, 0.0097, 0.0102, 0.0108],
  [32, 0.0088, 0.0092, 0.0098],
  [33, 0.0078, 0.0082, 0.0088],
  [34, 0.0069, 0.0073, 0.0078],
  [35, 0.0062, 0.0065, 0.007],
  [36, 0.0055, 0.0058, 0.0063],
  [37, 0.0049, 0.0052, 0.0057],
  [38, 0.0044, 0.0047, 0.0051],
  [39, 0.0038, 0.0041, 0.0045],
  [40, 0.0034, 0.0037, 0.004],
  [41, 0.003, 0.0033, 0.0036],
  [42, 0.0027, 0.0029, 0.0032],
  [43, 0.0024, 0.0026, 0.0029],
  [44, 0.0021, 0.0023, 0.0025],
];

/** The NEMA rows as held (inches), for tests and listings. */
export function nemaRows(): readonly (readonly [number, number, number, number])[] {
  return NEMA_MAX_OVERALL_IN;
}

/** Maximum overall diameter (m) of AWG gauge n in a film build, and where it comes from (NEMA MW 1000, from memory). */
export function awgOverall(n: number, build: FilmBuild): { value: number | null; source: OverallSource } {
  const row = NEMA_MAX_OVERALL_IN.find((r) => r[0] === n);
  if (!row) return { value: null, source: "none" };
  const v = row[1 + FILM_BUILDS.indexOf(build)];
  return { value: v * INCH, source: "from memory" };
}
