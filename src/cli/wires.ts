/**
 * `armwind wires`: the wire catalogue as a table for the terminal or as JSON (docs/contracts.md, "Other
 * commands with --json"). Pure: takes the options as given on the command line, returns what to
 * print and the exit status; the yargs shell prints it.
 */

import { formatProblem, type Problem } from "../errors.js";
import { parseQuantity } from "../job/units.js";
import { awgDiameter, awgNumber } from "../wire/awg.js";
import { swgDiameter, swgName } from "../wire/swg.js";
import { catalogue, type CatalogueFilter } from "../wire/catalogue.js";
import type { CatalogueEntry, OverallSource, WireSystem } from "../wire/types.js";

export interface WiresArgs {
  /** awg | swg | metric (any case); absent: all three. */
  system?: string;
  /** Smallest bare diameter, a length ("0.1 mm", "0.004 in", bare number mm). */
  min?: string;
  /** Largest bare diameter, a length. */
  max?: string;
  json: boolean;
}

export interface WiresResult {
  stdout: string;
  stderr: string;
  status: 0 | 1;
}

const SYSTEMS = ["awg", "swg", "metric"] as const;

/** m → mm for JSON, without float noise (15 significant digits; not a rounding of the value). */
const mm = (m: number): number => Number((m * 1e3).toPrecision(15));
const clean = (x: number): number => Number(x.toPrecision(15));

/** `n` significant figures, no exponent: 0.0254 → "0.0254", 1126.3 → "1126" (whole digits kept). */
export function sig(x: number, n: number): string {
  if (x === 0) return "0";
  const digits = Math.floor(Math.log10(Math.abs(x))) + 1;
  if (digits >= n) return Math.round(x).toString();
  return x.toFixed(Math.min(20, n - digits));
}

/**
 * The bare diameter (m) a gauge stands for, when the text is one: "27 AWG", "36 swg", or a bare
 * gauge number with `--system awg` or `swg` (a bare number is mm otherwise). Undefined when the
 * text is not a gauge; null when it names a gauge that does not exist.
 */
export function gaugeDiameter(text: string, system?: WireSystem): number | null | undefined {
  const m = /^\s*(\d{1,2}|\d\/0|0{1,7})\s*(awg|swg)?\s*$/i.exec(text);
  if (!m) return undefined;
  const sys = m[2]?.toLowerCase() ?? (system === "awg" || system === "swg" ? system : undefined);
  if (!sys) return undefined;
  if (sys === "awg") {
    const n = awgNumber(m[1]);
    return n === undefined ? null : awgDiameter(n);
  }
  const name = swgName(m[1]);
  return name === undefined ? null : swgDiameter(name);
}

const MARK: Record<OverallSource, string> = {
  published: "",
  measured: "",
  interpolated: "*",
  "from memory": "~",
  none: "",
};

export function runWires(args: WiresArgs): WiresResult {
  const problems: Problem[] = [];
  const filter: CatalogueFilter = {};
  if (args.system !== undefined) {
    const s = args.system.trim().toLowerCase();
    if ((SYSTEMS as readonly string[]).includes(s)) filter.system = s as WireSystem;
    else {
      problems.push({
        code: "unknown_wire_system",
        path: "system",
        message: `unknown wire system "${args.system}"; use awg, swg or metric`,
      });
    }
  }
  const bounds: number[] = [];
  let gauges = 0;
  for (const key of ["min", "max"] as const) {
    const text = args[key];
    if (text === undefined) continue;
    const g = gaugeDiameter(text, filter.system);
    if (g !== undefined) {
      if (g === null) problems.push({ code: "bad_length", path: key, message: `--${key} "${text}": no such gauge; e.g. "27 AWG", "36 SWG"` });
      else {
        gauges++;
        bounds.push(g);
        if (key === "min") filter.minBare = g;
        else filter.maxBare = g;
      }
      continue;
    }
    const q = parseQuantity(text, "length");
    if (!q.ok) problems.push({ code: "bad_length", path: key, message: `--${key} "${text}": ${q.message}` });
    else if (!(q.value > 0)) {
      problems.push({ code: "bad_length", path: key, message: `--${key}: a bare diameter must be more than 0, like "0.1 mm"` });
    } else if (key === "min") filter.minBare = q.value;
    else filter.maxBare = q.value;
  }
  // gauge numbers run the other way from diameters (27 AWG is thinner than 25 AWG): two gauges are a range of sizes
  if (gauges === 2 && bounds.length === 2) {
    filter.minBare = Math.min(...bounds);
    filter.maxBare = Math.max(...bounds);
  }
  if (filter.minBare !== undefined && filter.maxBare !== undefined && filter.minBare > filter.maxBare) {
    problems.push({
      code: "empty_range",
      path: "min",
      message: `--min ${args.min} is more than --max ${args.max}; swap them`,
    });
  }
  if (problems.length > 0) {
    return {
      stdout: args.json ? JSON.stringify({ ok: false, errors: problems }, null, 2) + "\n" : "",
      stderr: problems.map(formatProblem).join("\n") + "\n",
      status: 1,
    };
  }

  const entries = catalogue(filter);
  if (args.json) {
    return { stdout: JSON.stringify({ ok: true, errors: [], wires: entries.map(toJson) }, null, 2) + "\n", stderr: "", status: 0 };
  }
  return { stdout: table(entries, filter), stderr: "", status: 0 };
}

/** One wire as `wires --json` gives it (docs/contracts.md). */
function toJson(e: CatalogueEntry) {
  const overall_diameter_mm: Record<string, number | null> = {};
  for (const [k, v] of Object.entries(e.overall)) overall_diameter_mm[k] = v === null ? null : mm(v);
  return {
    label: e.label,
    system: e.system,
    size: e.size,
    bare_diameter_mm: mm(e.bare_diameter),
    area_mm2: clean(e.area * 1e6),
    ohm_per_m: e.ohm_per_m,
    g_per_m: clean(e.kg_per_m * 1e3),
    overall_diameter_mm,
    overall_source: { ...e.overall_source },
  };
}

const TITLES: Record<string, string> = {
  awg: "AWG (diameters by the ASTM B258 formula; overall: NEMA MW 1000 maximum by film build)",
  swg: "SWG (BS 3737:1964 diameters; overall: IEC 60317-0-1 maximum by grade, IS 13730-0-1 table)",
  metric: "Metric (IEC 60317-0-1 nominal diameters; overall: maximum by grade)",
};

function table(entries: CatalogueEntry[], filter: CatalogueFilter): string {
  if (entries.length === 0) {
    const range = [
      filter.minBare !== undefined ? `from ${sig(filter.minBare * 1e3, 3)} mm` : "",
      filter.maxBare !== undefined ? `up to ${sig(filter.maxBare * 1e3, 3)} mm` : "",
    ]
      .filter(Boolean)
      .join(" ");
    const big = (filter.minBare ?? 0) >= 2e-3;
    const hint = big ? ' A bare number is a diameter in mm; for a gauge write it with its system ("25 AWG", "36 SWG") or add --system awg or swg.' : "";
    return `No catalogue wire has a bare diameter ${range}.${hint}\n`;
  }
  const out: string[] = [];
  for (const system of SYSTEMS) {
    const group = entries.filter((e) => e.system === system);
    if (group.length === 0) continue;
    const keys = Object.keys(group[0].overall);
    const head = ["size", "bare mm", ...keys.map((k) => `${k} mm`), "area mm²", "Ω/m 20 °C", "g/m"];
    const rows = group.map((e) => [
      e.label,
      sig(e.bare_diameter * 1e3, 3),
      ...keys.map((k) => {
        const v = e.overall[k];
        return v === null ? "–" : sig(v * 1e3, 3) + MARK[e.overall_source[k]];
      }),
      sig(e.area * 1e6, 3),
      sig(e.ohm_per_m, 4),
      sig(e.kg_per_m * 1e3, 3),
    ]);
    const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
    const line = (cells: string[]) =>
      cells
        .map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i])))
        .join("  ")
        .trimEnd();
    if (out.length > 0) out.push("");
    out.push(TITLES[system]);
    out.push(line(head));
    for (const r of rows) out.push(line(r));
  }
  out.push("");
  out.push("Overall diameters are maxima. * interpolated between published sizes; ~ from memory; – none known.");
  out.push("Where no overall diameter is known you must measure one (micrometer over the enamel) and give it as { bare: 0.25 mm, overall: 0.282 mm }.");
  return out.join("\n") + "\n";
}
