/**
 * The physical range of every number armwind reads: job files, measured files, logbook records and
 * command-line options take their limits from here (one place, beside the schema). A value outside
 * its range is refused where it is read (`out_of_range`, exit status 1); in a logbook record it is
 * a `record_damaged` warning and the record is not learned from.
 *
 * The ranges are generous bounds on what a brushed DC or universal motor armature can be, from a
 * model-motor armature to an industrial DC machine (common practice, no published source): they
 * exist to catch a wrong unit or a corrupt file (a slot area of 1e300 mm², a speed of 1e308 rpm),
 * not to judge a design. SI units (°C for temperatures), as the core uses them.
 */
import type { QuantityKind } from "./units.js";

export interface Range {
  /** Least allowed value (SI). */
  min?: number;
  /** Largest allowed value (SI). */
  max: number;
  /** The bounds as a person writes them, for messages. */
  minText?: string;
  maxText: string;
}

const RPM = (2 * Math.PI) / 60;

/** The widest range of each kind of quantity; a field may narrow it (schema.ts). */
export const KIND_RANGES: Record<QuantityKind, Range> = {
  length: { max: 2, maxText: "2 m" },
  wire_length: { max: 100e3, maxText: "100 km" },
  area: { max: 0.1, maxText: "100000 mm2" },
  voltage: { max: 100e3, maxText: "100 kV" },
  current: { max: 100e3, maxText: "100 kA" },
  speed: { max: 1e6 * RPM, maxText: "1000000 rpm" },
  temperature: { min: -60, max: 250, minText: "-60 C", maxText: "250 C" },
  resistance: { max: 1e9, maxText: "1000 Mohm" },
  resistance_large: { max: 1e15, maxText: "1000000000 Mohm" },
  flux: { max: 10, maxText: "10 Wb" },
  flux_density: { max: 3, maxText: "3 T" },
  torque: { max: 100e3, maxText: "100 kN m" },
  mass: { max: 10e3, maxText: "10000 kg" },
  frequency: { max: 2000, maxText: "2000 Hz" },
  current_density: { max: 1e9, maxText: "1000 A/mm2" },
  speed_per_volt: { max: 1e6 * RPM, maxText: "1000000 rpm/V" },
  inductance: { max: 100, maxText: "100 H" },
  power: { max: 10e6, maxText: "10 MW" },
};

/** Winding temperatures where resistances are read or figures are wanted, °C. */
export const TEMPERATURE: Range = KIND_RANGES.temperature;

/** Counts and list lengths. */
export const COUNTS = {
  slots: { min: 2, max: 200 },
  bars: { min: 2, max: 400 },
  poles: { min: 2, max: 24 },
  turns: { min: 1, max: 100000 },
  strands: { min: 1, max: 20 },
  in_hand: { min: 1, max: 8 },
  coils_per_slot: { min: 1, max: 8 },
  /** Wires on a stock list or shelf. */
  wire_stock: { min: 1, max: 1000 },
  /** No-load tests of one original winding. */
  tests: { min: 1, max: 100 },
} as const;

/** Text fields: a job id names files (and must fit a file name with its suffixes on every common file system). */
export const ID_MAX_LENGTH = 80;
/** Free text (title, customer, notes): a page of notes is a few KiB. */
export const TEXT_MAX_LENGTH = 20_000;

/** Numbers in a logbook record, in the record's own units (the key's last part). */
export const RECORD_RANGES = {
  mean_turn_length_mm: { min: 1, max: 5000 },
  bare_diameter_mm: { min: 0.005, max: 20 },
  overall_diameter_mm: { min: 0.005, max: 25 },
  temperature_c: { min: TEMPERATURE.min!, max: TEMPERATURE.max },
  ohm: { min: 0, max: 1e9 },
  volts: { min: 0, max: 100e3 },
  /** Ke, V·s/rad (= Kt, N·m/A). */
  ke_v_s_per_rad: { min: 0, max: 1000 },
  torque_n_m: { min: 0, max: 100e3 },
  speed_rpm: { min: 0, max: 1e6 },
  current_a: { min: 0, max: 100e3 },
  fraction: { min: -1e6, max: 1e6 },
} as const;

/**
 * Windows keeps these names for devices, with any extension (`CON.pdf` is the console): a job id
 * that is one of them, before its first dot, cannot name a card or record on a shared drive.
 */
export const RESERVED_NAMES = /^(con|prn|aux|nul|com[0-9¹²³]|lpt[0-9¹²³])(\..*)?$/i;

/**
 * Why a value of a kind is outside its physical range ("must be at most 250 C"), or null when it
 * is inside. `min` narrows the kind's lower bound (a reading may be 0 Ω, a supply may not).
 */
export function rangeProblem(kind: QuantityKind, x: number, min?: number): string | null {
  const r = KIND_RANGES[kind];
  const lo = min ?? r.min;
  if (!Number.isFinite(x)) return "must be a finite number";
  if (lo !== undefined && x < lo) return `must be at least ${min !== undefined ? min : r.minText}`;
  if (x > r.max) return `must be at most ${r.maxText}`;
  return null;
}
