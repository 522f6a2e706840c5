/**
 * The logbook record (docs/contracts.md "The measured file and the logbook record"): the measured file,
 * what the plan predicted for the winding laid, the comparison, what the readings say about the
 * armature (for the next plan of the same family), and the bits of the job that history and
 * learning need. Numbers in the `--json` contract's units (unit as the last part of each key).
 * Pure: building a record and reading one back from parsed YAML; the store writes the files.
 */
import { z } from "zod";
import type { ArmatureField, Job, WindingStyle } from "../job/schema.js";
import type { Plan } from "../design/types.js";
import { toRpm } from "../format/units.js";
import { kvFromKe } from "../motor/emf.js";
import { jobId } from "../job/schema.js";
import { COUNTS, ID_MAX_LENGTH, RECORD_RANGES } from "../job/ranges.js";
import { turnLengthCalibrated, type MeterResolution } from "../bench/rules.js";
import { compareReadings, type Comparison, type Derived } from "./compare.js";
import type { Measured } from "./measured.js";
import { predictNoLoad, predictStall, type Prediction } from "./predict.js";

export const RECORD_KIND = "armwind logbook record";

export interface RecordJob {
  id: string;
  title: string;
  family: string | null;
  style: WindingStyle;
  slots: number;
  bars: number;
  poles: number;
  field: ArmatureField;
  /** Turns per coil of the original winding (Ke of a family is scaled by turns from it). */
  original_turns: number;
}

export interface RecordWinding {
  turns: number;
  strands: number;
  wire: { label: string; bare_diameter_mm: number; overall_diameter_mm: number | null };
  /** Predicted mean turn length of the winding laid, mm. */
  mean_turn_length_mm: number;
  differs_from_plan: boolean;
  differences: string[];
}

export interface RecordMeasured {
  temperature_c: number;
  meter_resolution_ohm: number | null;
  /** r1 … rC as read, Ω; null for a reading written OL or open. */
  bar_to_bar_ohm: (number | null)[];
  terminal_ohm: number | null;
  no_load: { supply_v: number; current_a: number; speed_rpm: number } | null;
  stall: { supply_v: number; current_a: number } | null;
  insulation: { test_volts_v: number | null; megohm: number | null; pass: boolean | null } | null;
  notes: string | null;
}

export interface RecordPredicted {
  /** The plan's own choice (the winding laid may differ: see `winding`). */
  plan: { turns: number; wire: string; strands: number };
  coil_ohm: number[];
  bar_to_bar_ohm: number[];
  terminal_ohm: number;
  terminal_min_ohm: number | null;
  terminal_max_ohm: number;
  /** At the job's supply, winding at 20 °C. */
  supply_v: number;
  ke_v_s_per_rad: number | null;
  kv_rpm_per_v: number | null;
  no_load_speed_rpm: number | null;
  no_load_current_a: number | null;
  /** Hot stall current at the job's supply and hot temperature, A. */
  stall_current_a: number | null;
  brush_drop_v: number;
  loss_torque_n_m: number;
  loss_viscous_n_m_s_per_rad: number;
  calibration: string;
  mean_turn_length_source: string;
  /** Logbook records that corrected the plan (0 when none). */
  learning_records: number;
}

export interface LogRecord {
  version: 1;
  kind: typeof RECORD_KIND;
  date: string;
  logged_at: string;
  job: RecordJob;
  winding: RecordWinding;
  measured: RecordMeasured;
  predicted: RecordPredicted;
  comparison: Comparison;
  derived: Derived;
}

const nn = (x: number | null | undefined): number | null => (x === null || x === undefined || !Number.isFinite(x) ? null : x);

/** Build the record of a finished rewind: pure (the time of logging is given; the meter's resolution as the bench rules resolve it, else the file's). */
export function buildRecord(job: Job, plan: Plan, prediction: Prediction, m: Measured, loggedAt: string, meter?: MeterResolution): LogRecord {
  const { comparison, derived } = compareReadings(prediction, m, turnLengthCalibrated(plan.wire.mlt_source), meter);
  const p = prediction;
  const supply = plan.supply;
  const nl = predictNoLoad(p, supply, 20);
  const hot = job.target.hot_temperature;
  const ins = m.insulation;
  return {
    version: 1,
    kind: RECORD_KIND,
    date: m.date,
    logged_at: loggedAt,
    job: {
      id: job.id,
      title: job.title,
      family: job.armature.family ?? null,
      style: job.winding.style,
      slots: job.armature.slots,
      bars: job.armature.bars,
      poles: job.armature.field_poles,
      field: job.armature.field,
      original_turns: job.original.turns,
    },
    winding: {
      turns: p.turns,
      strands: p.strands,
      wire: {
        label: p.wire.label,
        bare_diameter_mm: p.wire.bare_diameter * 1e3,
        overall_diameter_mm: p.wire.overall_diameter === null ? null : p.wire.overall_diameter * 1e3,
      },
      mean_turn_length_mm: p.mlt * 1e3,
      differs_from_plan: p.differs,
      differences: p.differences,
    },
    measured: {
      temperature_c: m.temperature,
      meter_resolution_ohm: m.meter_resolution ?? null,
      bar_to_bar_ohm: m.bar_to_bar.map((r) => (Number.isFinite(r) ? r : null)),
      terminal_ohm: m.terminal_resistance ?? null,
      no_load: m.no_load ? { supply_v: m.no_load.supply, current_a: m.no_load.current, speed_rpm: toRpm(m.no_load.speed) } : null,
      stall: m.stall ? { supply_v: m.stall.supply, current_a: m.stall.current } : null,
      insulation: ins
        ? "megohm" in ins
          ? { test_volts_v: ins.test_volts, megohm: ins.megohm / 1e6, pass: null }
          : { test_volts_v: ins.test_volts ?? null, megohm: null, pass: ins.pass }
        : null,
      notes: m.notes ?? null,
    },
    predicted: {
      plan: { turns: plan.design.turns, wire: plan.design.wire.label, strands: plan.design.strands },
      coil_ohm: p.coil_ohm,
      bar_to_bar_ohm: p.bar_to_bar,
      terminal_ohm: p.terminal.single,
      terminal_min_ohm: p.terminal.min,
      terminal_max_ohm: p.terminal.max,
      supply_v: supply,
      ke_v_s_per_rad: nn(p.ke),
      kv_rpm_per_v: p.ke === null ? null : kvFromKe(p.ke),
      no_load_speed_rpm: nl ? toRpm(nl.speed) : null,
      no_load_current_a: nl ? nl.current : null,
      // never a stall figure at a series motor's supply (docs "Series and universal motors")
      stall_current_a: p.ke === null || p.series ? null : predictStall(p, supply, hot),
      brush_drop_v: p.brush_drop,
      loss_torque_n_m: p.loss.tc,
      loss_viscous_n_m_s_per_rad: p.loss.b,
      calibration: plan.calibration.source,
      mean_turn_length_source: plan.wire.mlt_source,
      learning_records: plan.learning?.records ?? 0,
    },
    comparison,
    derived,
  };
}

// ---------------------------------------------------------------------------------------------
// reading a record back: what history and learning rely on must be there, of the right kind, and
// within its physical range (src/job/ranges.ts): a record outside it is damaged, not learned from

const num = z.number().refine(Number.isFinite, "must be a finite number");
/** A finite number within a range of RECORD_RANGES (the unit is the key's last part). */
const within = (r: { min: number; max: number }) => num.min(r.min).max(r.max);
const R = RECORD_RANGES;
/** Values of the comparison table, in the unit its row names: finite and not absurd. */
const value = within({ min: -1e12, max: 1e12 }).nullable();
const checkRow = z.looseObject({
  check: z.string().max(200),
  unit: z.string().max(40),
  predicted_value: value,
  measured_value: value,
  measured_20c_value: value,
  deviation_fraction: within(R.fraction).nullable(),
  verdict: z.enum(["ok", "high", "low", "fail", "not_checked"]),
});

/** A calendar date YYYY-MM-DD that exists (not 2026-13-45). */
export const isCalendarDate = (s: string): boolean => {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(s);
  return m !== null && new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]))).toISOString().slice(0, 10) === s;
};

const count = (c: { min: number; max: number }) => z.int().min(c.min).max(c.max);

export const recordSchema = z.looseObject({
  version: z.literal(1),
  kind: z.literal(RECORD_KIND),
  date: z.string().refine(isCalendarDate, "must be a date YYYY-MM-DD"),
  logged_at: z.string().max(100),
  job: z.looseObject({
    id: jobId,
    family: z
      .string()
      .max(ID_MAX_LENGTH * 4)
      .nullable(),
    style: z.enum(["tooth", "lap", "wave"]),
    slots: count(COUNTS.slots),
    bars: count(COUNTS.bars),
    original_turns: count(COUNTS.turns),
  }),
  winding: z.looseObject({
    turns: count(COUNTS.turns),
    strands: count(COUNTS.strands),
    wire: z.looseObject({
      label: z.string().max(200),
      bare_diameter_mm: within(R.bare_diameter_mm),
      overall_diameter_mm: within(R.overall_diameter_mm).nullable(),
    }),
    mean_turn_length_mm: within(R.mean_turn_length_mm),
  }),
  // a reading may be null: OL or open on the meter
  measured: z.looseObject({ temperature_c: within(R.temperature_c), bar_to_bar_ohm: z.array(within(R.ohm).nullable()).min(1).max(COUNTS.bars.max) }),
  predicted: z.looseObject({ terminal_ohm: within(R.ohm), brush_drop_v: within(R.volts) }),
  comparison: z.looseObject({ ok: z.boolean(), checks: z.array(checkRow).max(COUNTS.bars.max + 100) }),
  derived: z.looseObject({
    mean_turn_length_mm: within(R.mean_turn_length_mm),
    ke_v_s_per_rad: within(R.ke_v_s_per_rad).nullable(),
    loss_torque_n_m: within(R.torque_n_m).nullable(),
    loss_speed_rpm: within(R.speed_rpm).nullable(),
    readings_sound: z.boolean(),
  }),
});

/** One line for the first thing wrong with a record: "winding.mean_turn_length_mm: 1e+300 is above 5000". */
export function recordIssue(issue: z.core.$ZodIssue): string {
  const path = issue.path.map((p, i) => (typeof p === "number" ? `[${p}]` : `${i ? "." : ""}${String(p)}`)).join("") || "the record";
  if (issue.code === "too_big" || issue.code === "too_small") {
    const bound = issue.code === "too_big" ? `above ${String(issue.maximum)}` : `below ${String(issue.minimum)}`;
    const what = issue.origin === "array" ? "the list is too long" : issue.origin === "string" ? "the text is too long" : `out of range (${bound})`;
    return `${path}: ${what}`;
  }
  return `${path}: ${issue.message}`;
}

/** A record as read back (validated where history and learning look; the rest as written). */
export type ReadRecord = z.output<typeof recordSchema> & LogRecord;

/** The check of a record by its path ("terminal_resistance", "no_load.speed" …), if present. */
export function checkOf(r: Pick<LogRecord, "comparison">, check: string) {
  return r.comparison.checks.find((c) => c.check === check);
}

/**
 * What makes two records the same rewind: the job, the date and the readings (temperature,
 * bar to bar, terminal). A measured file logged twice gives two records with the same key; learning
 * and the duplicate check count it once.
 */
export function rewindKey(r: Pick<LogRecord, "date" | "job" | "measured">): string {
  const m = r.measured;
  return JSON.stringify([r.job.id, r.date, m.temperature_c, m.bar_to_bar_ohm, m.terminal_ohm ?? null]);
}

/** The records that are the same rewind as `r` (its key), in the order given. */
export function sameRewind<T extends { record: Pick<LogRecord, "date" | "job" | "measured"> }>(
  records: T[],
  r: Pick<LogRecord, "date" | "job" | "measured">,
): T[] {
  const key = rewindKey(r);
  return records.filter((x) => rewindKey(x.record) === key);
}

/** Records with each rewind once (the first of each key kept). */
export function oncePerRewind<T extends { record: Pick<LogRecord, "date" | "job" | "measured"> }>(records: T[]): T[] {
  const seen = new Set<string>();
  return records.filter((x) => {
    const k = rewindKey(x.record);
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}
