/**
 * The logbook record (DESIGN.md "The measured file and the logbook record"): the measured file,
 * what the plan predicted for the winding laid, the comparison, what the readings say about the
 * armature (for the next plan of the same family), and the bits of the job that history and
 * learning need. Numbers in the `--json` contract's units (unit as the last part of each key).
 * Pure: building a record and reading one back from parsed YAML; the store writes the files.
 */
import { z } from "zod";
import type { Job } from "../job/schema.js";
import type { Plan } from "../design/types.js";
import { toRpm } from "../format/units.js";
import { kvFromKe } from "../motor/emf.js";
import { compareReadings, type Comparison, type Derived } from "./compare.js";
import type { Measured } from "./measured.js";
import { predictNoLoad, predictStall, type Prediction } from "./predict.js";

export const RECORD_KIND = "armwind logbook record";

export interface RecordJob {
  id: string;
  title: string;
  family: string | null;
  style: "tooth" | "lap" | "wave";
  slots: number;
  bars: number;
  poles: number;
  field: "permanent_magnet" | "shunt" | "series";
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
  terminal_min_ohm: number;
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

/** Build the record of a finished rewind: pure (the time of logging is given). */
export function buildRecord(job: Job, plan: Plan, prediction: Prediction, m: Measured, loggedAt: string): LogRecord {
  const { comparison, derived } = compareReadings(prediction, m, plan.wire.mlt_source !== "model");
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
      wire: { label: p.wire.label, bare_diameter_mm: p.wire.bare_diameter * 1e3, overall_diameter_mm: p.wire.overall_diameter === null ? null : p.wire.overall_diameter * 1e3 },
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
      no_load_current_a: nl && plan.calibration.loss_known ? nl.current : null,
      stall_current_a: p.ke === null && !p.series ? null : predictStall(p, supply, hot),
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
// reading a record back: what history and learning rely on must be there and of the right kind

const num = z.number().refine(Number.isFinite, "must be a finite number");
const numOrNull = num.nullable();
const checkRow = z.looseObject({
  check: z.string(),
  unit: z.string(),
  predicted_value: numOrNull,
  measured_value: numOrNull,
  measured_20c_value: numOrNull,
  deviation_fraction: numOrNull,
  verdict: z.enum(["ok", "high", "low", "fail", "not_checked"]),
});

export const recordSchema = z.looseObject({
  version: z.literal(1),
  kind: z.literal(RECORD_KIND),
  date: z.string().regex(/^\d{4}-\d{2}-\d{2}$/),
  logged_at: z.string(),
  job: z.looseObject({
    id: z.string().min(1),
    family: z.string().nullable(),
    style: z.enum(["tooth", "lap", "wave"]),
    slots: z.int().min(1),
    bars: z.int().min(1),
    original_turns: z.int().min(1),
  }),
  winding: z.looseObject({
    turns: z.int().min(1),
    strands: z.int().min(1),
    wire: z.looseObject({ label: z.string(), bare_diameter_mm: num.positive(), overall_diameter_mm: numOrNull }),
    mean_turn_length_mm: num.positive(),
  }),
  measured: z.looseObject({ temperature_c: num, bar_to_bar_ohm: z.array(numOrNull).min(1) }),
  predicted: z.looseObject({ terminal_ohm: num, brush_drop_v: num }),
  comparison: z.looseObject({ ok: z.boolean(), checks: z.array(checkRow) }),
  derived: z.looseObject({
    mean_turn_length_mm: num.positive(),
    ke_v_s_per_rad: numOrNull,
    loss_torque_n_m: numOrNull,
    loss_speed_rpm: numOrNull,
    readings_sound: z.boolean(),
  }),
});

/** A record as read back (validated where history and learning look; the rest as written). */
export type ReadRecord = z.output<typeof recordSchema> & LogRecord;

/** The check of a record by its path ("terminal_resistance", "no_load.speed" …), if present. */
export function checkOf(r: Pick<LogRecord, "comparison">, check: string) {
  return r.comparison.checks.find((c) => c.check === check);
}

