/**
 * Reading a wire as the job file writes it (docs/contracts.md, "The job file"):
 * "0.25 mm", "0.25 mm grade 2", "0.25 mm G2", "10 mil", "0.010 in", "33 AWG", "AWG 33",
 * "33 AWG heavy", "36 SWG", "36 SWG grade 1", "0.250/0.282 mm", or { bare: 0.25 mm, overall: 0.282 mm }.
 * Lengths go through parseQuantity(…, "length"): a bare number is mm.
 *
 * In stock, a gauge or size with no build or grade is read as the common motor-winding wire
 * (from memory): AWG as heavy build, metric and SWG as grade 2; a metric diameter that is no
 * IEC 60317-0-1 nominal size is a measured bare diameter with no known overall diameter. Each of
 * these is recorded in `spec.assumed`. For the original winding only the bare copper matters, so
 * nothing is assumed there.
 */

import { AWG_MAX_N, AWG_MIN_N, awgName, awgNumber } from "./awg.js";
import { formatMm } from "./catalogue.js";
import { findNominalMetric, metricName, nearestNominals } from "./metric.js";
import { swgName } from "./swg.js";
import { parseQuantity } from "../job/units.js";
import type { FilmBuild, WireSpec } from "./types.js";

export type WireRole = "stock" | "original";
export type ParseWireResult = { ok: true; spec: WireSpec } | { ok: false; message: string };

const HOW = `write it like "33 AWG heavy", "36 SWG", "0.25 mm grade 2" or { bare: 0.25 mm, overall: 0.282 mm }`;
/** Thickest bare diameter accepted, m: thicker than any round winding wire (IEC 60317 stops at 5 mm). */
const MAX_BARE = 10e-3;

const fail = (message: string): ParseWireResult => ({ ok: false, message });
const ok = (spec: WireSpec): ParseWireResult => ({ ok: true, spec });

function show(input: unknown): string {
  return typeof input === "string" ? `"${input}"` : (JSON.stringify(input) ?? String(input));
}

/** Parse a wire name or a measured { bare, overall } into a WireSpec; never throws. */
export function parseWireSpec(input: unknown, role: WireRole): ParseWireResult {
  if (typeof input === "number") {
    if (!Number.isFinite(input)) return fail(`unknown wire ${input}; ${HOW}`);
    return parseText(`${input} mm`, String(input), role);
  }
  if (typeof input === "string") return parseText(input.trim().replace(/\s+/g, " "), input, role);
  if (input !== null && typeof input === "object" && !Array.isArray(input)) {
    return parseMeasured(input as Record<string, unknown>, role);
  }
  return fail(`unknown wire ${show(input)}; ${HOW}`);
}

function parseMeasured(obj: Record<string, unknown>, role: WireRole): ParseWireResult {
  const extra = Object.keys(obj).filter((k) => k !== "bare" && k !== "overall");
  if (extra.length > 0) {
    return fail(`a measured wire takes only "bare" and "overall", not "${extra.join('", "')}"; write it like { bare: 0.25 mm, overall: 0.282 mm }`);
  }
  if (obj.bare === undefined) return fail(`a measured wire needs "bare" (the copper diameter); write it like { bare: 0.25 mm, overall: 0.282 mm }`);
  const bare = parseQuantity(obj.bare, "length");
  if (!bare.ok) return fail(`bare: ${bare.message}`);
  const bad = checkBare(bare.value);
  if (bad) return fail(bad);
  const spec: WireSpec = { system: "measured", size: "", bare: bare.value };
  if (obj.overall !== undefined) {
    const overall = parseQuantity(obj.overall, "length");
    if (!overall.ok) return fail(`overall: ${overall.message}`);
    const bad2 = checkOverall(bare.value, overall.value);
    if (bad2) return fail(bad2);
    spec.overall = overall.value;
  } else if (role === "stock") {
    spec.assumed = `measured wire ${formatMm(bare.value)} mm with no overall diameter: its space fill cannot be checked; measure the enamelled diameter and give it as overall`;
  }
  return ok(spec);
}

function checkBare(d: number): string | undefined {
  if (!(d > 0)) return `a bare diameter must be more than 0, got ${formatMm(d)} mm`;
  if (d > MAX_BARE) {
    return `${formatMm(d)} mm is too thick for a round winding wire; for a gauge write "33 AWG" or "36 SWG", for a diameter something like "0.25 mm"`;
  }
  return undefined;
}

function checkOverall(bare: number, overall: number): string | undefined {
  if (!(overall > bare)) {
    return `the overall diameter ${formatMm(overall)} mm must be more than the bare ${formatMm(bare)} mm (overall is over the enamel)`;
  }
  if (overall > 2 * bare + 0.2e-3) {
    return `the overall diameter ${formatMm(overall)} mm is far more than the bare ${formatMm(bare)} mm could carry in enamel; check the two readings`;
  }
  return undefined;
}

const BUILDS: readonly FilmBuild[] = ["single", "heavy", "triple"];

function parseText(text: string, original: string, role: WireRole): ParseWireResult {
  const unknown = () => fail(`unknown wire "${original}"; ${HOW}`);
  if (text === "") return unknown();

  // Gauges: "33 AWG heavy", "AWG 33", "#33 AWG", "36 SWG grade 1", "SWG 36 G1".
  const gauge = /^#?\s*([0-9][0-9/]*)\s*(awg|swg)\b\s*(.*)$/i.exec(text) ?? swap(/^(awg|swg)\s*#?\s*([0-9][0-9/]*)\b\s*(.*)$/i.exec(text));
  if (gauge) {
    const [, size, sys, rest] = gauge;
    return sys.toLowerCase() === "awg" ? parseAwg(size, rest.trim(), original, role) : parseSwg(size, rest.trim(), original, role);
  }

  // Metric or other length: "0.25 mm", "0.25 mm grade 2", "0.25mm G2", "10 mil", "0.250/0.282 mm measured".
  let rest = text;
  let measured = false;
  let grade: number | undefined;
  const mWord = /\s*\b(measured|bare)$/i.exec(rest);
  if (mWord) {
    measured = true;
    rest = rest.slice(0, mWord.index);
  }
  const gWord = /\s*(?:\bgrade\s*|(?<=\d|[a-z"]|\s)g)(\d+)$/i.exec(rest);
  if (gWord) {
    grade = Number(gWord[1]);
    rest = rest.slice(0, gWord.index);
    if (grade < 1 || grade > 3) return fail(`"${original}": IEC 60317 has grades 1, 2 and 3, not ${grade}; e.g. "0.25 mm grade 2"`);
  }
  if (!/^[+-]?[.\d]/.test(rest)) return unknown();
  const b = /\b(awg|swg)\b/i.exec(rest);
  if (b) return fail(`"${original}": AWG and SWG wires are written "33 AWG heavy" or "36 SWG grade 2"`);

  // Measured pair "0.250/0.282 mm".
  const pair = /^([+-]?(?:\d+\.?\d*|\.\d+))\s*\/\s*([+-]?(?:\d+\.?\d*|\.\d+))\s*(.*)$/.exec(rest);
  if (pair) {
    if (grade !== undefined) return fail(`"${original}": a measured wire has no grade; write { bare: 0.25 mm, overall: 0.282 mm }`);
    return parseMeasured({ bare: `${pair[1]} ${pair[3]}`, overall: `${pair[2]} ${pair[3]}` }, role);
  }

  const q = parseQuantity(rest, "length");
  if (!q.ok) return unknown();
  const bad = checkBare(q.value);
  if (bad) return fail(bad);
  const d = q.value;

  if (measured) {
    if (grade !== undefined) return fail(`"${original}": a measured wire has no grade; write { bare: 0.25 mm, overall: 0.282 mm }`);
    return parseMeasured({ bare: `${d * 1e3} mm` }, role);
  }

  const nominal = findNominalMetric(d);
  if (nominal === null) {
    const near = nearestNominals(d)
      .map((x) => `${metricName(x)} mm`)
      .join(" or ");
    if (grade !== undefined) {
      return fail(
        `${formatMm(d)} mm is not an IEC 60317 nominal size, so it has no grade ${grade}; the nearest are ${near}, or give a measured wire { bare: ${formatMm(d)} mm, overall: … }`,
      );
    }
    const spec: WireSpec = { system: "measured", size: "", bare: d };
    if (role === "stock") {
      spec.assumed =
        `${formatMm(d)} mm is not an IEC 60317 nominal size (nearest ${near}): read as a measured bare diameter ` +
        `with no known overall diameter; measure the enamelled diameter and write { bare: ${formatMm(d)} mm, overall: … }`;
    }
    return ok(spec);
  }
  const size = metricName(nominal);
  if (grade !== undefined) return ok({ system: "metric", size, grade: grade as 1 | 2 | 3 });
  if (role === "original") return ok({ system: "metric", size });
  return ok({
    system: "metric",
    size,
    grade: 2,
    assumed: `${size} mm with no grade read as grade 2 (the common motor-winding wire, from memory)`,
  });
}

/** Put "AWG 33 heavy" into the order of "33 AWG heavy". */
function swap(m: RegExpExecArray | null): [string, string, string, string] | null {
  return m ? [m[0], m[2], m[1], m[3]] : null;
}

function parseAwg(sizeText: string, rest: string, original: string, role: WireRole): ParseWireResult {
  const n = awgNumber(sizeText);
  if (n === undefined) {
    return fail(`"${original}": AWG ${sizeText} is not in the catalogue; AWG runs from ${awgName(AWG_MIN_N)} (0000) to ${AWG_MAX_N}, e.g. "33 AWG heavy"`);
  }
  const size = awgName(n);
  const r = rest.toLowerCase().replace(/\s*build$/, "");
  if (r === "") {
    if (role === "original") return ok({ system: "awg", size });
    return ok({
      system: "awg",
      size,
      build: "heavy",
      assumed: `${size} AWG with no build read as heavy build (the common motor-winding wire, from memory)`,
    });
  }
  if ((BUILDS as readonly string[]).includes(r)) return ok({ system: "awg", size, build: r as FilmBuild });
  if (/^(grade|g)\s*\d/.test(r)) {
    return fail(`"${original}": AWG magnet wire comes in film builds single, heavy or triple, not grades; write e.g. "${size} AWG heavy"`);
  }
  return fail(`"${original}": unknown film build "${rest}"; AWG builds are single, heavy or triple, e.g. "${size} AWG heavy"`);
}

function parseSwg(sizeText: string, rest: string, original: string, role: WireRole): ParseWireResult {
  const size = swgName(sizeText);
  if (size === undefined) {
    return fail(`"${original}": SWG ${sizeText} is not in the catalogue; SWG runs from 7/0 to 50, e.g. "36 SWG grade 2"`);
  }
  const r = rest.toLowerCase();
  if (r === "") {
    if (role === "original") return ok({ system: "swg", size });
    return ok({
      system: "swg",
      size,
      grade: 2,
      assumed: `${size} SWG with no grade read as grade 2 (the common motor-winding wire, from memory)`,
    });
  }
  const g = /^(?:grade\s*|g)(\d+)$/.exec(r);
  if (g) {
    const grade = Number(g[1]);
    if (grade < 1 || grade > 3) return fail(`"${original}": IEC 60317 has grades 1, 2 and 3, not ${grade}; e.g. "${size} SWG grade 2"`);
    return ok({ system: "swg", size, grade: grade as 1 | 2 | 3 });
  }
  if ((BUILDS as readonly string[]).includes(r.replace(/\s*build$/, ""))) {
    return fail(`"${original}": SWG wire is graded 1, 2 or 3 (IEC 60317), not in film builds; write e.g. "${size} SWG grade 2"`);
  }
  return fail(`"${original}": unknown grade "${rest}"; write e.g. "${size} SWG grade 2"`);
}
