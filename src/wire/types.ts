/** Types of the wire catalogue. Every length in metres, every area in m², resistance at 20 °C. */

export type WireSystem = "awg" | "swg" | "metric" | "measured";
export type FilmBuild = "single" | "heavy" | "triple";
export type OverallSource = "published" | "interpolated" | "from memory" | "measured" | "none";

/** A wire as the job file names it, before it is looked up. */
export interface WireSpec {
  system: WireSystem;
  /** The size, canonical as parseWireSpec gives it: "33" or "4/0" (AWG), "36" or "7/0" (SWG), "0.250" (mm, metric, three decimals), "" for measured. */
  size: string;
  /** AWG film build, when given or assumed. */
  build?: FilmBuild;
  /** IEC 60317 grade (metric and SWG), when given or assumed. */
  grade?: 1 | 2 | 3;
  /** Measured bare diameter, m (system "measured", or a metric size). */
  bare?: number;
  /** Measured overall diameter, m. */
  overall?: number;
  /** What was assumed, e.g. "33 AWG with no build read as heavy build (common motor wire, from memory)". */
  assumed?: string;
}

/** A wire resolved against the catalogue: what the design sweeps over. */
export interface Wire {
  /** Stable label, e.g. "33 AWG heavy", "0.250 mm grade 2", "36 SWG grade 2", "0.250/0.282 mm measured". */
  label: string;
  system: WireSystem;
  size: string;
  /** "heavy", "grade 2", … or null for a measured wire. */
  insulation: string | null;
  /** Bare copper diameter, m. */
  bare_diameter: number;
  /** Overall (enamelled) diameter, m; null where no standard value is known and none was measured. */
  overall_diameter: number | null;
  overall_source: OverallSource;
  /** Copper cross-section, m². */
  area: number;
  /** Resistance per metre at 20 °C, Ω/m. */
  ohm_per_m: number;
  /** Copper mass per metre, kg/m. */
  kg_per_m: number;
  /** What was assumed to read the name, or null. */
  assumed: string | null;
}

/** One catalogue row with every insulation build or grade: what `armwind wires` lists. */
export interface CatalogueEntry {
  label: string;
  system: WireSystem;
  size: string;
  bare_diameter: number;
  area: number;
  ohm_per_m: number;
  kg_per_m: number;
  /** Keys "single" | "heavy" | "triple" for AWG; "grade 1" | "grade 2" | "grade 3" for metric and SWG. m or null. */
  overall: Record<string, number | null>;
  overall_source: Record<string, OverallSource>;
}
