/**
 * The bench rules: every tolerance and rule that judges a reading on a finished or suspect
 * armature, in one place, each with its source (docs/contracts.md "Bench rules"). The card prints these
 * words, `log` and `diagnose` apply these functions; nothing else holds a bench tolerance.
 *
 * Units: resistances in Ω; deviations, windows and tolerances as fractions.
 */

/** A tolerance as a fraction, with where it comes from. */
export interface Tolerance {
  fraction: number;
  source: string;
}

export const SOURCE_COMMON = "common practice, no published source";
export const SOURCE_TM = "US Army TM 55-2210-223-34, armature bar-to-bar test";

/** Bar to bar, spread: each reading within ±5 % of the median of the set, widened by one meter count (common practice, no published source). */
export const SPREAD: Tolerance = { fraction: 0.05, source: SOURCE_COMMON };
/** A reading this far or more above the median points to a poor coil-to-riser connection (US Army TM 55-2210-223-34). */
export const RISER: Tolerance = { fraction: 0.1, source: SOURCE_TM };
/** Below this fraction of the median a reading is "near zero": bars bridged or the coil between them shorted (TM 55-2210-223-34 "down to near zero"; the 10 % threshold is common practice). */
export const NEAR_ZERO_FRACTION = 0.1;
/** Bar to bar, level: the median against the plan, when the turn length is measured or calibrated (common practice, no published source). */
export const LEVEL_CALIBRATED: Tolerance = { fraction: 0.05, source: SOURCE_COMMON };
/** Bar to bar, level: the median against the plan, from the end-turn model alone (common practice, no published source). */
export const LEVEL_MODEL: Tolerance = { fraction: 0.15, source: SOURCE_COMMON };
/** A coil this far below its reference is "well below": shorted turns rather than a miscount (common practice, no published source). */
export const WELL_BELOW_FRACTION = 0.25;
/** A solved coil this many times its reference or more is open: it carries no current a meter can read (common practice, no published source). */
export const OPEN_FACTOR = 100;

/** Terminal resistance against the plan (common practice, no published source). */
export const TERMINAL: Tolerance = { fraction: 0.1, source: `${SOURCE_COMMON}: terminal resistance within ±10 % of predicted` };
export const NO_LOAD_SPEED: Tolerance = { fraction: 0.1, source: `${SOURCE_COMMON}: no-load speed within ±10 % of predicted` };
export const NO_LOAD_CURRENT: Tolerance = {
  fraction: 0.3,
  source: `${SOURCE_COMMON}: no-load current within ±30 % of predicted (friction and brush seating vary)`,
};
export const STALL_CURRENT: Tolerance = {
  fraction: 0.2,
  source: `${SOURCE_COMMON}: brief stall current within ±20 % of predicted (brush contact varies at stall)`,
};
/** Least insulation resistance taken as a pass, Ω: 1 MΩ (common practice, no published source: the "one megohm" rule of thumb for small low-voltage windings). */
export const INSULATION_MIN_OHM = 1e6;
export const INSULATION_SOURCE = `${SOURCE_COMMON}: at least 1 MΩ to the shaft and core`;

/** The meter's resolution when neither the measured file nor the shop profile gives one: a handheld meter's lowest range, Ω (common practice). */
export const DEFAULT_METER_RESOLUTION_OHM = 0.1;
/** Where a meter resolution came from, in the order it is looked for. */
export type ResolutionSource = "option" | "environment" | "measured file" | "shop profile" | "default";

/** The bench meter's resolution, Ω, and where it came from. */
export interface MeterResolution {
  ohm: number;
  source: ResolutionSource;
}

/** The environment variable that sets the meter's resolution for every command (a resistance: "0.01 ohm"). */
export const METER_RESOLUTION_ENV = "ARMWIND_METER_RESOLUTION";

/**
 * The bench meter's resolution, Ω: the one place `log`, `diagnose` and the card take it from, in
 * docs/contracts.md's order (the command-line option, the environment `ARMWIND_METER_RESOLUTION`,
 * the measured file or record, the shop profile, the built-in default of 0.1 Ω, a handheld meter's
 * lowest range: common practice). Values in Ω; a value that is not positive is passed over.
 */
export function meterResolution(given: { option?: number; environment?: number; measured?: number | null; profile?: number }): MeterResolution {
  const order: [ResolutionSource, number | null | undefined][] = [
    ["option", given.option],
    ["environment", given.environment],
    ["measured file", given.measured],
    ["shop profile", given.profile],
  ];
  for (const [source, ohm] of order) if (ohm !== undefined && ohm !== null && ohm > 0) return { ohm, source };
  return { ohm: DEFAULT_METER_RESOLUTION_OHM, source: "default" };
}

/** "a 0.01 Ω meter (shop profile)", "a 0.1 Ω meter (not given: a handheld meter's lowest range)". */
export function meterText(r: MeterResolution): string {
  const ohm = Number(r.ohm.toPrecision(4));
  return r.source === "default" ? `a ${ohm} Ω meter (none given: a handheld meter's lowest range)` : `a ${ohm} Ω meter (${r.source})`;
}

/** Below this many counts of the meter a four-wire or millivolt-drop reading is advised (±5 % then spans fewer than two counts; common practice). */
export const FOUR_WIRE_FACTOR = 40;
export const NULL_LEADS = "Null the test leads first (touch them together and subtract, or use the meter's relative mode; common practice).";

/**
 * The conductor resistance tolerance of a round enamelled copper wire, fraction: twice the
 * diameter tolerance over the diameter (R ∝ 1/d²). Diameter tolerance taken as
 * max(0.002 mm, 0.001 mm + 1 % of d), an approximation of the IEC 60317-0-1 and NEMA MW 1000
 * tables (from memory: about ±0.003 mm at 0.1-0.2 mm, ±0.005 mm at 0.5 mm, ±0.010 mm at 1 mm).
 */
export function conductorTolerance(bareDiameterM: number): Tolerance {
  const d = bareDiameterM * 1e3;
  const dd = Math.max(0.002, 0.001 + 0.01 * d);
  return {
    fraction: (2 * dd) / d,
    source: "conductor resistance tolerance from the IEC 60317-0-1 / NEMA MW 1000 diameter tolerance (from memory, approximated)",
  };
}

// ---------------------------------------------------------------------------------------------

/** Median of a list (Infinity counts as the largest; NaN left out); NaN for an empty list. */
export function median(xs: readonly number[]): number {
  const s = xs.filter((x) => !Number.isNaN(x)).sort((a, b) => a - b);
  if (!s.length) return NaN;
  const h = s.length >> 1;
  return s.length % 2 ? s[h] : s[h - 1] === s[h] ? s[h] : (s[h - 1] + s[h]) / 2;
}

/** The name people read for reading i (0-based): "r{i+1}", between bar i+1 and the next bar. */
export const readingName = (i: number) => `r${i + 1}`;

/** A check path ("bar_to_bar[6]", "terminal_resistance" …) as people read it: "r7", "terminal_resistance". */
export function checkLabel(check: string): string {
  const m = /^bar_to_bar\[(\d+)\]$/.exec(check);
  return m ? readingName(Number(m[1])) : check;
}

export type ReadingSide = "ok" | "open" | "riser" | "high" | "near_zero" | "low";

export interface SpreadRow {
  /** Reading index, 0-based (r{index+1}). */
  index: number;
  /** Reading at 20 °C, Ω; Infinity when open. */
  reading_ohm: number;
  /** The reading with the plan's coil-to-coil pattern divided out (scaled to the median expected reading), Ω. */
  normalised_ohm: number;
  /** normalised / median − 1; Infinity when open. */
  of_median_fraction: number;
  /** Half-width of the passing band for this reading: SPREAD + one count over the median. */
  window_fraction: number;
  side: ReadingSide;
  pass: boolean;
  /** What the side suggests, in words; null when it passes. */
  suggests: string | null;
}

export interface Spread {
  /** Median of the normalised readings, Ω. */
  median_ohm: number;
  rows: SpreadRow[];
  pass: boolean;
}

/**
 * Bar to bar, spread (docs/contracts.md "Bench rules"): each reading against the median of the set, not
 * the mean (one bridged pair must not make the good pairs look high). A reading passes within
 * ±(5 % + one meter count / median) (common practice, no published source); outside, 10 % or more
 * above the median suggests a poor coil-to-riser connection, below it shorted turns, a miscount
 * or bridged bars (US Army TM 55-2210-223-34). Where the plan expects unequal readings (lap coils
 * laid later are longer) the pattern is divided out first: `expected` (Ω, one per reading; equal
 * values, or all 1, when the plan is not known).
 */
export function judgeSpread(readings: readonly number[], expected: readonly number[], resolutionOhm: number): Spread {
  const mE = median(expected);
  const norm = readings.map((r, i) => (Number.isFinite(r) ? (r * mE) / expected[i] : r));
  const med = median(norm);
  const window = SPREAD.fraction + (med > 0 && Number.isFinite(med) ? resolutionOhm / med : 0);
  const rows = norm.map((n, i): SpreadRow => {
    const dev = !Number.isFinite(n) ? Infinity : med > 0 ? n / med - 1 : n > 0 ? Infinity : 0;
    const pass = Number.isFinite(dev) && Math.abs(dev) <= window;
    const side = sideOf(n, dev, pass);
    return {
      index: i,
      reading_ohm: readings[i],
      normalised_ohm: n,
      of_median_fraction: dev,
      window_fraction: window,
      side,
      pass,
      suggests: pass ? null : SUGGESTS[side],
    };
  });
  return { median_ohm: med, rows, pass: rows.every((r) => r.pass) };
}

function sideOf(n: number, dev: number, pass: boolean): ReadingSide {
  if (pass) return "ok";
  if (n === Infinity) return "open";
  if (dev >= RISER.fraction) return "riser";
  if (dev > 0) return "high";
  if (dev <= NEAR_ZERO_FRACTION - 1) return "near_zero";
  return "low";
}

export const SUGGESTS: Record<ReadingSide, string> = {
  ok: "",
  open: "open: a broken coil or a lead off its riser between these bars",
  riser: `a poor coil-to-riser connection (${SOURCE_TM}: 10 % or more above)`,
  high: "above the others: turns too many or a poor joint inside the coil",
  near_zero: `near zero: bars bridged (solder, copper dust, a burr across the mica) or the coil between them shorted (${SOURCE_TM})`,
  low: `below the others: shorted turns or a miscount (${SOURCE_TM})`,
};

export interface Level {
  /** Median of the readings, Ω, and of the plan's expected readings, Ω. */
  median_ohm: number;
  expected_median_ohm: number;
  /** median / expected median − 1. */
  deviation_fraction: number;
  /** The passing band's half-width: model uncertainty + conductor tolerance + one count. */
  window_fraction: number;
  pass: boolean;
  source: string;
}

/**
 * Bar to bar, level (docs/contracts.md "Bench rules"): the median of the readings against the plan's
 * expected reading, within ±5 % when the turn length was measured or calibrated (±15 % from the
 * end-turn model alone; common practice), plus the wire's conductor tolerance, plus one count.
 * Outside fails: the wire or the turn length was not what the plan assumed, and the coils are
 * then judged against the armature's own median.
 */
export function judgeLevel(readings: readonly number[], expected: readonly number[], calibrated: boolean, bareDiameterM: number, resolutionOhm: number): Level {
  const mE = median(expected);
  const norm = readings.map((r, i) => (Number.isFinite(r) ? (r * mE) / expected[i] : r));
  const med = median(norm);
  const window = levelWindow(calibrated, bareDiameterM, resolutionOhm, mE);
  const dev = med / mE - 1;
  return {
    median_ohm: med,
    expected_median_ohm: mE,
    deviation_fraction: dev,
    window_fraction: window,
    pass: Math.abs(dev) <= window,
    source: levelSource(calibrated, bareDiameterM),
  };
}

/** The level window, fraction: LEVEL_CALIBRATED or LEVEL_MODEL + conductor tolerance + one count over the expected median (Ω). */
export function levelWindow(calibrated: boolean, bareDiameterM: number, resolutionOhm: number, expectedMedianOhm: number): number {
  const model = calibrated ? LEVEL_CALIBRATED : LEVEL_MODEL;
  return model.fraction + conductorTolerance(bareDiameterM).fraction + resolutionOhm / expectedMedianOhm;
}

/**
 * The readings (Ω) the level rule accepts around an expected reading `expectedOhm` (Ω) for a window
 * of ±`window` (fraction): expected × (1 ± window), never below 0 Ω (a window wider than 100 %, an
 * expected reading under one count of the meter, reaches down to zero, not to a negative resistance).
 */
export function levelBounds(expectedOhm: number, window: number): { low: number; high: number } {
  return { low: Math.max(0, expectedOhm * (1 - window)), high: expectedOhm * (1 + window) };
}

/**
 * Whether the level rule takes the ±5 % of a measured or calibrated turn length (true) or the ±15 %
 * of the end-turn model alone (false), from the plan's `mlt_source` (docs/contracts.md "Bench rules").
 */
export function turnLengthCalibrated(mltSource: string): boolean {
  return mltSource !== "model";
}

function levelSource(calibrated: boolean, bareDiameterM: number): string {
  const model = calibrated ? "±5 % with the turn length measured or calibrated" : "±15 % from the end-turn model alone";
  return `${SOURCE_COMMON}: ${model}, plus ±${pctText(conductorTolerance(bareDiameterM).fraction)} ${conductorTolerance(bareDiameterM).source}, plus one meter count`;
}

// ---------------------------------------------------------------------------------------------
// the rules in words (the card prints these; `log` and `diagnose` say the same)

const pctText = (x: number) => `${Number((x * 100).toPrecision(3))} %`;

/** The spread rule as the card, `log` and `diagnose` state it. */
export function spreadRuleText(): string {
  return (
    `Each reading within ±${pctText(SPREAD.fraction)} of your median, widened by one count of the meter (${SOURCE_COMMON}). ` +
    `A reading ${pctText(RISER.fraction)} or more above the median points to a poor coil-to-riser connection; one below it to shorted turns, a miscount or, near zero, bridged bars (${SOURCE_TM}). ` +
    `An open reading (OL) is an open coil.`
  );
}

/** The level rule in words, with its window (fraction) for this plan. */
export function levelRuleText(window: number, calibrated: boolean): string {
  return (
    `Your median within ±${pctText(window)} of the expected reading (${calibrated ? "turn length measured or calibrated: ±5 %" : "turn length from the end-turn model alone: ±15 %"}, ` +
    `plus the wire's conductor tolerance, plus one meter count; ${SOURCE_COMMON}). Outside, the wire or turn length was not what the plan assumed: judge the coils against your own median.`
  );
}

/** True when a reading this small (Ω) needs a four-wire or millivolt-drop reading: below FOUR_WIRE_FACTOR counts of the meter (common practice). */
export function needsFourWire(expectedOhm: number, resolutionOhm: number): boolean {
  return expectedOhm < FOUR_WIRE_FACTOR * resolutionOhm;
}

/** The four-wire advice for readings of `minOhm` Ω on a meter of `resolutionOhm` Ω, or null when the meter will do; always followed by NULL_LEADS where printed. */
export function fourWireAdvice(minOhm: number, resolutionOhm: number): string | null {
  if (!needsFourWire(minOhm, resolutionOhm)) return null;
  return (
    `The expected readings (from ${Number(minOhm.toPrecision(4))} Ω) are below ${FOUR_WIRE_FACTOR} counts of a ${Number(resolutionOhm.toPrecision(4))} Ω meter, where ±5 % spans fewer than two counts: ` +
    `use a four-wire or millivolt-drop reading (Kelvin clips) at a known current (e.g. 1 A from a bench supply, volts across the two bars ÷ amps) (common practice).`
  );
}

/** True for a reading written as an open circuit: `OL` (the meter's overload) or `open`, any case. */
export function isOpenText(v: unknown): boolean {
  return typeof v === "string" && /^\s*(ol|open)\s*$/i.test(v);
}
