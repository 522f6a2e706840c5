/**
 * Quantities with units, parsed once at the edge into SI (m, m², V, A, rad/s, Ω, Wb, N·m, kg, …;
 * temperatures stay in °C, as the core names them). A bare number is read in the default unit of
 * its kind, as docs/contracts.md's job file says (length mm, except wire lengths in m; area mm²; …).
 *
 * Conversion factors are exact definitions (1 in = 25.4 mm, 1 mil = 0.001 in, 1 rpm = 2π/60 rad/s,
 * °F → °C by (F − 32)·5/9): SI brochure and NIST SP 811.
 */

export type QuantityKind =
  | "length"
  | "wire_length"
  | "area"
  | "voltage"
  | "current"
  | "speed"
  | "temperature"
  | "resistance"
  | "flux"
  | "flux_density"
  | "torque"
  | "mass"
  | "frequency"
  | "inductance"
  | "power"
  | "current_density"
  | "speed_per_volt"
  | "resistance_large";

interface UnitDef {
  /** Spellings accepted, compared after removing spaces, dots and middle dots. */
  names: string[];
  /** Multiply by this to get SI (or °C), unless `convert` is given. */
  factor: number;
  convert?: (v: number) => number;
}

const RPM = (2 * Math.PI) / 60;

const UNITS: Record<QuantityKind, { default: string; units: UnitDef[] }> = {
  length: {
    default: "mm",
    units: [
      { names: ["mm"], factor: 1e-3 },
      { names: ["cm"], factor: 1e-2 },
      { names: ["m"], factor: 1 },
      { names: ["um", "µm", "μm", "micron", "microns"], factor: 1e-6 },
      { names: ["in", "inch", "inches", '"'], factor: 0.0254 },
      { names: ["mil", "mils", "thou"], factor: 0.0254e-3 },
    ],
  },
  wire_length: {
    default: "m",
    units: [
      { names: ["m"], factor: 1 },
      { names: ["mm"], factor: 1e-3 },
      { names: ["cm"], factor: 1e-2 },
      { names: ["km"], factor: 1e3 },
      { names: ["ft", "feet", "foot"], factor: 0.3048 },
      { names: ["in", "inch", "inches"], factor: 0.0254 },
      { names: ["yd", "yard", "yards"], factor: 0.9144 },
    ],
  },
  area: {
    default: "mm2",
    units: [
      { names: ["mm2", "mm^2", "mm²", "sqmm"], factor: 1e-6 },
      { names: ["cm2", "cm^2", "cm²"], factor: 1e-4 },
      { names: ["m2", "m^2", "m²"], factor: 1 },
      { names: ["in2", "in^2", "in²", "sqin"], factor: 0.0254 ** 2 },
      { names: ["cmil", "circularmil", "circularmils"], factor: (Math.PI / 4) * 0.0254e-3 ** 2 },
    ],
  },
  voltage: {
    default: "V",
    units: [
      { names: ["V", "v", "volt", "volts"], factor: 1 },
      { names: ["mV", "millivolt", "millivolts"], factor: 1e-3 },
      { names: ["kV", "kv"], factor: 1e3 },
    ],
  },
  current: {
    default: "A",
    units: [
      { names: ["A", "a", "amp", "amps", "ampere", "amperes"], factor: 1 },
      { names: ["mA", "ma", "milliamp", "milliamps"], factor: 1e-3 },
      { names: ["uA", "µA", "μA"], factor: 1e-6 },
    ],
  },
  speed: {
    default: "rpm",
    units: [
      { names: ["rpm", "RPM", "r/min", "rev/min", "min-1", "1/min"], factor: RPM },
      { names: ["krpm"], factor: 1000 * RPM },
      { names: ["rps", "r/s", "rev/s", "Hz"], factor: 2 * Math.PI },
      { names: ["rad/s"], factor: 1 },
    ],
  },
  temperature: {
    default: "C",
    units: [
      { names: ["C", "c", "°C", "degC", "celsius"], factor: 1 },
      { names: ["F", "f", "°F", "degF", "fahrenheit"], factor: 1, convert: (f) => ((f - 32) * 5) / 9 },
      { names: ["K", "kelvin"], factor: 1, convert: (k) => k - 273.15 },
    ],
  },
  resistance: {
    default: "ohm",
    units: [
      { names: ["ohm", "ohms", "Ω", "Ohm", "Ohms", "R"], factor: 1 },
      { names: ["mohm", "mΩ", "milliohm", "milliohms"], factor: 1e-3 },
      { names: ["kohm", "kΩ", "kilohm", "kilohms"], factor: 1e3 },
      { names: ["Mohm", "MΩ", "megohm", "megohms"], factor: 1e6 },
    ],
  },
  resistance_large: {
    default: "Mohm",
    units: [
      { names: ["Mohm", "MΩ", "megohm", "megohms", "Megohm", "Megohms"], factor: 1e6 },
      { names: ["Gohm", "GΩ", "gigohm", "gigohms"], factor: 1e9 },
      { names: ["kohm", "kΩ"], factor: 1e3 },
      { names: ["ohm", "ohms", "Ω"], factor: 1 },
    ],
  },
  flux: {
    default: "Wb",
    units: [
      { names: ["Wb", "wb", "weber", "webers"], factor: 1 },
      { names: ["mWb", "mwb"], factor: 1e-3 },
      { names: ["uWb", "µWb", "μWb"], factor: 1e-6 },
      { names: ["Mx", "maxwell", "maxwells"], factor: 1e-8 },
    ],
  },
  flux_density: {
    default: "T",
    units: [
      { names: ["T", "tesla"], factor: 1 },
      { names: ["mT"], factor: 1e-3 },
      { names: ["G", "gauss"], factor: 1e-4 },
    ],
  },
  torque: {
    default: "N m",
    units: [
      { names: ["Nm", "N m", "N·m", "N-m", "N.m"], factor: 1 },
      { names: ["mNm", "mN m", "mN·m", "mN-m", "mN.m"], factor: 1e-3 },
      { names: ["uNm", "µNm", "μNm", "uN m", "µN m"], factor: 1e-6 },
      { names: ["Ncm", "N cm", "N·cm", "N-cm"], factor: 1e-2 },
      { names: ["gcm", "g cm", "g·cm", "g-cm", "gfcm", "gf cm", "gf·cm"], factor: 9.80665e-5 },
      { names: ["ozin", "oz in", "oz-in", "oz·in", "ozfin"], factor: 7.0615518e-3 },
      { names: ["lbft", "lb ft", "lb-ft", "lbf ft", "lbf·ft"], factor: 1.3558179 },
      { names: ["lbin", "lb in", "lb-in", "lbf in", "lbf·in"], factor: 0.11298483 },
    ],
  },
  mass: {
    default: "g",
    units: [
      { names: ["g", "gram", "grams"], factor: 1e-3 },
      { names: ["kg"], factor: 1 },
      { names: ["mg"], factor: 1e-6 },
      { names: ["oz"], factor: 0.028349523125 },
      { names: ["lb", "lbs"], factor: 0.45359237 },
    ],
  },
  frequency: {
    default: "Hz",
    units: [{ names: ["Hz", "hz"], factor: 1 }],
  },
  inductance: {
    default: "mH",
    units: [
      { names: ["H", "henry"], factor: 1 },
      { names: ["mH"], factor: 1e-3 },
      { names: ["uH", "µH", "μH"], factor: 1e-6 },
    ],
  },
  power: {
    default: "W",
    units: [
      { names: ["W", "watt", "watts"], factor: 1 },
      { names: ["kW"], factor: 1e3 },
      // mechanical horsepower, 745.69987 W (NIST SP 811)
      { names: ["hp", "HP"], factor: 745.6998715822702 },
    ],
  },
  current_density: {
    default: "A/mm2",
    units: [
      { names: ["A/mm2", "A/mm^2", "A/mm²"], factor: 1e6 },
      { names: ["A/m2", "A/m^2", "A/m²"], factor: 1 },
      { names: ["A/cm2", "A/cm^2", "A/cm²"], factor: 1e4 },
      { names: ["A/in2", "A/in^2", "A/in²"], factor: 1 / 0.0254 ** 2 },
      { names: ["cmil/A"], factor: NaN, convert: (c) => 1 / (c * (Math.PI / 4) * 0.0254e-3 ** 2) },
    ],
  },
  speed_per_volt: {
    default: "rpm/V",
    units: [
      { names: ["rpm/V", "RPM/V", "rpm/v", "kv", "Kv", "KV"], factor: RPM },
      { names: ["rad/s/V", "rad/(V s)", "rad/V/s"], factor: 1 },
    ],
  },
};

/** What the kind's default unit is called in messages. */
export function defaultUnit(kind: QuantityKind): string {
  return UNITS[kind].default;
}

/** The spellings a kind accepts, for "what would be right" in error messages. */
export function unitNames(kind: QuantityKind): string[] {
  return UNITS[kind].units.map((u) => u.names[0]);
}

function squash(s: string): string {
  return s.replace(/[\s·]/g, "").replace(/\^/g, "^");
}

export type ParseResult = { ok: true; value: number } | { ok: false; message: string };

const NUMBER = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*)$/;

/**
 * Parse `"12 mm"`, `"0.5 in"`, `"70 F"`, `12` … into SI (°C for temperatures).
 * Returns a message naming what would be right when the text is not a quantity of this kind.
 */
export function parseQuantity(input: unknown, kind: QuantityKind): ParseResult {
  const table = UNITS[kind];
  if (typeof input === "number") {
    if (!Number.isFinite(input)) return { ok: false, message: `expected a finite number, got ${input}` };
    return parseQuantity(`${input} ${table.default}`, kind);
  }
  if (typeof input !== "string") {
    return { ok: false, message: `expected a number or a text like "${example(kind)}", got ${describe(input)}` };
  }
  const text = input.trim();
  const m = NUMBER.exec(text);
  if (!m) return { ok: false, message: `"${input}" is not a number with a unit; write it like "${example(kind)}"` };
  const value = Number(m[1]);
  const unitText = m[2].trim() === "" ? table.default : m[2].trim();
  const unit = findUnit(kind, unitText);
  if (!unit) {
    const other = otherKind(unitText, kind);
    const hint = other ? ` ("${unitText}" is a unit of ${other.replace(/_/g, " ")})` : "";
    return {
      ok: false,
      message: `unknown unit "${unitText}" for a ${kind.replace(/_/g, " ")}${hint}; use one of ${unitNames(kind).join(", ")}`,
    };
  }
  const si = unit.convert ? unit.convert(value) * (Number.isNaN(unit.factor) ? 1 : unit.factor) : value * unit.factor;
  if (!Number.isFinite(si)) return { ok: false, message: `"${input}" does not give a finite value` };
  return { ok: true, value: si };
}

function findUnit(kind: QuantityKind, unitText: string): UnitDef | undefined {
  const units = UNITS[kind].units;
  const sq = squash(unitText);
  for (const u of units) if (u.names.some((n) => squash(n) === sq)) return u;
  const lower = sq.toLowerCase();
  const hits = units.filter((u) => u.names.some((n) => squash(n).toLowerCase() === lower));
  return hits.length === 1 ? hits[0] : undefined;
}

function otherKind(unitText: string, kind: QuantityKind): QuantityKind | undefined {
  for (const k of Object.keys(UNITS) as QuantityKind[]) {
    if (k !== kind && k !== "wire_length" && k !== "resistance_large" && findUnit(k, unitText)) return k;
  }
  return undefined;
}

export function example(kind: QuantityKind): string {
  const ex: Record<QuantityKind, string> = {
    length: "12 mm",
    wire_length: "14.4 m",
    area: "13.5 mm2",
    voltage: "12 V",
    current: "0.18 A",
    speed: "9800 rpm",
    temperature: "21 C",
    resistance: "1.57 ohm",
    resistance_large: "200 Mohm",
    flux: "0.20 mWb",
    flux_density: "0.35 T",
    torque: "4 mN m",
    mass: "4.87 g",
    frequency: "50 Hz",
    inductance: "60 mH",
    power: "500 W",
    current_density: "8 A/mm2",
    speed_per_volt: "600 rpm/V",
  };
  return ex[kind];
}

function describe(v: unknown): string {
  if (v === null) return "nothing";
  if (Array.isArray(v)) return "a list";
  if (typeof v === "object") return "a mapping";
  return `${typeof v} ${JSON.stringify(v)}`;
}

/** rad/s ↔ rpm: the one conversion, in src/format/units.ts. */
export { toRpm, fromRpm } from "../format/units.js";
