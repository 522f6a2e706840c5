/**
 * The wire catalogue: AWG, SWG and metric sizes with every film build or grade, measured wires,
 * and the lookup from a WireSpec to a Wire. Lengths in m, areas in m², resistance at 20 °C.
 * Area, Ω/m and kg/m always come from copper.ts (IEC 60028 constants), never from a table.
 */

import { inputError } from "../errors.js";
import { AWG_MAX_N, AWG_MIN_N, FILM_BUILDS, awgDiameter, awgName, awgNumber, awgNumbers, awgOverall } from "./awg.js";
import { kgPerMetre, ohmPerMetre, roundArea } from "./copper.js";
import { findNominalMetric, metricName, metricNominals, metricOverall } from "./metric.js";
import { GRADES, METRIC_ANCHORS, overallFromAnchors, type Grade } from "./overall.js";
import { swgDiameter, swgName, swgNames, swgOverall } from "./swg.js";
import type { CatalogueEntry, FilmBuild, OverallSource, Wire, WireSpec, WireSystem } from "./types.js";

export { findNominalMetric } from "./metric.js";

/** A diameter in mm for a label: three decimals, four when three would lose the value. m → text. */
export function formatMm(d: number): string {
  const mm = d * 1e3;
  const s3 = mm.toFixed(3);
  return Math.abs(Number(s3) - mm) < 1e-9 ? s3 : mm.toFixed(4);
}

function makeWire(
  label: string,
  system: WireSystem,
  size: string,
  insulation: string | null,
  bare: number,
  overall: { value: number | null; source: OverallSource },
  assumed: string | null,
): Wire {
  return {
    label,
    system,
    size,
    insulation,
    bare_diameter: bare,
    overall_diameter: overall.value,
    overall_source: overall.value === null ? "none" : overall.source,
    area: roundArea(bare),
    ohm_per_m: ohmPerMetre(bare),
    kg_per_m: kgPerMetre(bare),
    assumed,
  };
}

const NO_OVERALL = { value: null, source: "none" as OverallSource };

/**
 * Look a wire up in the catalogue. Labels are stable: "33 AWG heavy", "0.250 mm grade 2",
 * "36 SWG grade 2", "0.250/0.282 mm measured"; a gauge or metric size with no build or grade
 * (an original wire, bare copper only) is "33 AWG", "36 SWG", "0.250 mm", with no overall diameter;
 * a measured bare diameter alone is "0.220 mm measured".
 * Throws ArmwindError `unknown_wire` for a size the catalogue does not hold.
 */
export function resolveWire(spec: WireSpec): Wire {
  const assumed = spec.assumed ?? null;
  switch (spec.system) {
    case "awg": {
      const n = awgNumber(spec.size);
      if (n === undefined) {
        throw inputError("unknown_wire", "", `AWG ${spec.size} is not in the catalogue; AWG runs from ${awgName(AWG_MIN_N)} to ${AWG_MAX_N}`);
      }
      const name = awgName(n);
      const bare = awgDiameter(n);
      if (!spec.build) return makeWire(`${name} AWG`, "awg", name, null, bare, NO_OVERALL, assumed);
      return makeWire(`${name} AWG ${spec.build}`, "awg", name, spec.build, bare, awgOverall(n, spec.build), assumed);
    }
    case "swg": {
      const name = swgName(spec.size);
      if (name === undefined) {
        throw inputError("unknown_wire", "", `SWG ${spec.size} is not in the catalogue; SWG runs from 7/0 to 50`);
      }
      const bare = swgDiameter(name);
      if (!spec.grade) return makeWire(`${name} SWG`, "swg", name, null, bare, NO_OVERALL, assumed);
      return makeWire(`${name} SWG grade ${spec.grade}`, "swg", name, `grade ${spec.grade}`, bare, swgOverall(name, spec.grade), assumed);
    }
    case "metric": {
      const d = spec.bare ?? Number(spec.size) * 1e-3;
      const nominal = Number.isFinite(d) ? findNominalMetric(d) : null;
      if (nominal === null) {
        if (!(d > 0)) throw inputError("unknown_wire", "", `"${spec.size} mm" is not a wire diameter; write it like "0.25 mm grade 2"`);
        return resolveWire({ system: "measured", size: "", bare: d, overall: spec.overall, assumed: spec.assumed });
      }
      const name = metricName(nominal);
      if (!spec.grade) return makeWire(`${name} mm`, "metric", name, null, nominal, NO_OVERALL, assumed);
      return makeWire(`${name} mm grade ${spec.grade}`, "metric", name, `grade ${spec.grade}`, nominal, metricOverall(nominal, spec.grade), assumed);
    }
    case "measured": {
      const bare = spec.bare;
      if (bare === undefined || !(bare > 0)) {
        throw inputError("unknown_wire", "", "a measured wire needs its bare copper diameter, e.g. { bare: 0.25 mm, overall: 0.282 mm }");
      }
      if (spec.overall === undefined) return makeWire(`${formatMm(bare)} mm measured`, "measured", "", null, bare, NO_OVERALL, assumed);
      return makeWire(
        `${formatMm(bare)}/${formatMm(spec.overall)} mm measured`,
        "measured",
        "",
        null,
        bare,
        { value: spec.overall, source: "measured" },
        assumed,
      );
    }
  }
}

function gradeKey(g: Grade): string {
  return `grade ${g}`;
}

function entry(
  label: string,
  system: WireSystem,
  size: string,
  bare: number,
  overalls: [string, { value: number | null; source: OverallSource }][],
): CatalogueEntry {
  const overall: Record<string, number | null> = {};
  const overall_source: Record<string, OverallSource> = {};
  for (const [k, o] of overalls) {
    overall[k] = o.value;
    overall_source[k] = o.value === null ? "none" : o.source;
  }
  return {
    label,
    system,
    size,
    bare_diameter: bare,
    area: roundArea(bare),
    ohm_per_m: ohmPerMetre(bare),
    kg_per_m: kgPerMetre(bare),
    overall,
    overall_source,
  };
}

function awgEntries(): CatalogueEntry[] {
  return awgNumbers().map((n) =>
    entry(
      `${awgName(n)} AWG`,
      "awg",
      awgName(n),
      awgDiameter(n),
      FILM_BUILDS.map((b) => [b, awgOverall(n, b)]),
    ),
  );
}

function swgEntries(): CatalogueEntry[] {
  return swgNames().map((name) =>
    entry(
      `${name} SWG`,
      "swg",
      name,
      swgDiameter(name),
      GRADES.map((g) => [gradeKey(g), swgOverall(name, g)]),
    ),
  );
}

function metricEntries(): CatalogueEntry[] {
  return metricNominals().map((d) =>
    entry(
      `${metricName(d)} mm`,
      "metric",
      metricName(d),
      d,
      GRADES.map((g) => [gradeKey(g), metricOverall(d, g)]),
    ),
  );
}

export interface CatalogueFilter {
  system?: WireSystem;
  /** Smallest bare diameter to list, m (inclusive). */
  minBare?: number;
  /** Largest bare diameter to list, m (inclusive). */
  maxBare?: number;
}

/**
 * Every catalogue size with every film build (AWG) or grade (SWG, metric): AWG 4/0 … 56 and
 * SWG 7/0 … 50 coarse to fine, then metric sizes ascending. Filtered by system and bare diameter.
 */
export function catalogue(filter: CatalogueFilter = {}): CatalogueEntry[] {
  const all: CatalogueEntry[] = [];
  if (!filter.system || filter.system === "awg") all.push(...awgEntries());
  if (!filter.system || filter.system === "swg") all.push(...swgEntries());
  if (!filter.system || filter.system === "metric") all.push(...metricEntries());
  return all.filter(
    (e) => (filter.minBare === undefined || e.bare_diameter >= filter.minBare) && (filter.maxBare === undefined || e.bare_diameter <= filter.maxBare),
  );
}

/**
 * The stock the design sweeps when the job has no wire_stock: every AWG size in heavy build,
 * every metric size in grade 2, every SWG size in grade 2, leaving out the wires whose overall
 * diameter the catalogue does not know (they could not be checked for space fill).
 */
export function defaultStock(): Wire[] {
  const out: Wire[] = [];
  const keep = (w: Wire) => {
    if (w.overall_diameter !== null) out.push(w);
  };
  for (const n of awgNumbers()) keep(resolveWire({ system: "awg", size: awgName(n), build: "heavy" }));
  for (const d of metricNominals()) keep(resolveWire({ system: "metric", size: metricName(d), grade: 2 }));
  for (const name of swgNames()) keep(resolveWire({ system: "swg", size: name, grade: 2 }));
  return out;
}

/**
 * The overall diameter (m) of the common motor-winding wire of a size named by its copper alone (an
 * original "0.22 mm", "33 AWG"): the build or grade the stock reading assumes (src/wire/parse.ts:
 * AWG heavy build, metric and SWG grade 2), looked up in the catalogue; a measured bare diameter, or
 * an AWG size NEMA MW 1000 does not cover, takes grade 2 at its diameter between the IEC 60317-0-1
 * rows; beyond the rows, the nearest row's film thickness added to the bare diameter. Never a fixed ratio.
 */
export function commonOverall(wire: Pick<Wire, "system" | "size" | "bare_diameter">): { value: number; source: string; insulation: string } {
  const d = wire.bare_diameter;
  let hit: { value: number | null; source: OverallSource } = NO_OVERALL;
  let insulation = "grade 2";
  if (wire.system === "awg") {
    const n = awgNumber(wire.size);
    if (n !== undefined) {
      hit = awgOverall(n, "heavy");
      insulation = "heavy build";
    }
  } else if (wire.system === "swg" && swgName(wire.size) !== undefined) hit = swgOverall(wire.size, 2);
  if (hit.value === null) {
    hit = overallFromAnchors(d, 2, METRIC_ANCHORS);
    insulation = "grade 2";
  }
  if (hit.value !== null) return { value: hit.value, source: hit.source, insulation };
  const rows = METRIC_ANCHORS.filter((a) => a.max_mm[1] !== null);
  const near = rows.reduce((b, a) => (Math.abs(a.d_mm - d * 1e3) < Math.abs(b.d_mm - d * 1e3) ? a : b));
  return { value: d + (near.max_mm[1]! - near.d_mm) / 1e3, source: `film of the nearest grade 2 row, ${near.d_mm} mm`, insulation };
}

export type { FilmBuild, Grade };
