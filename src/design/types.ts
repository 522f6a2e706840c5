/** The plan: everything the core computes for one job, in SI. The CLI and the card only format it. */
import type { Warning } from "../errors.js";
import type { Job, SupplyKind } from "../job/schema.js";
import type { Wire } from "../wire/types.js";
import type { Coil, WindingLayout } from "../winding/types.js";
import type { SlotGeometry } from "../armature/slot.js";
import type { LayerBuild } from "../armature/build.js";
import type { MotorModel, MotorSummary, OperatingPoint } from "../motor/model.js";
import type { SeriesPlan, SeriesSetup, SeriesSide } from "./series.js";

export type GoalKind = Job["target"]["goal"];

/** Reasons a candidate is rejected: stable codes, listed in the README. */
export type RejectCode =
  | "copper_fill"
  | "space_fill"
  | "layer_build"
  | "slot_opening"
  | "overall_unknown"
  | "current_density"
  | "hot_stall_current"
  | "below_original_copper";

export interface Candidate {
  turns: number;
  strands: number;
  wire: Wire;
  copper_fill: number;
  space_fill: number | null;
  build: LayerBuild | null;
  /** Mean turn length over all coils, m. */
  mlt: number;
  /** Mean coil resistance at 20 °C, Ω. */
  coil_ohm: number;
  /** Terminal resistance at 20 °C (brushes each on one bar), Ω. */
  terminal_ohm: number;
  terminal_hot_ohm: number;
  /** V·s/rad; null when nothing calibrates Ke. */
  ke: number | null;
  /** Goal figure in SI (rad/s, rad/s/V, A, W or copper area m²), null when unknowable. */
  achieved: number | null;
  /** (achieved − target)/target, signed; null when unknowable. */
  error: number | null;
  meets_goal: boolean;
  rejected_because: RejectCode[];
  /** Copper mass of the whole winding (no leads), kg. */
  copper_mass: number;
  /** Current density in each strand at the duty point or the rated current, A/m²; null when neither is given. */
  current_density: number | null;
  /** Hot stall current at the supply, A; null for series motors or without Ke. */
  stall_current_hot: number | null;
  stall_current_cold: number | null;
  /** Input power at the terminals at the duty point, W (duty goal; a shunt field's V²/R_f included). */
  duty_input_w: number | null;
}

/** The goal and how close the chosen winding comes, in SI (src/format/goal.ts words it, src/format/units.ts converts it). */
export interface GoalReport {
  kind: GoalKind;
  /** Target in SI: copper area m² (restore), rad/s (speeds), rad/s per V (kv), A (stall current). */
  target: number;
  /** The chosen winding's figure, same unit as `target`; null when unknowable. */
  achieved: number | null;
  /** (achieved − target)/target, signed; null when unknowable. */
  error_fraction: number | null;
  /** The tolerance band, fractions below and above the target (a bare t in the job is ±t; stall_current: −t, never above). */
  tolerance: Job["target"]["tolerance"];
  /** Goal fixed: the winding the user chose; else null. */
  fixed: { turns: number; wire: string; strands: number } | null;
}

export interface CoilPlan extends Coil {
  turns: number;
  /** This coil's mean turn length, m. */
  mlt: number;
  /** Coil resistance at 20 °C, Ω. */
  ohm: number;
}

export interface ResistancePlan {
  /** Mean coil resistance at 20 °C, Ω. */
  coil_ohm: number;
  /** Expected reading of each adjacent bar pair r1 … rC at 20 °C, Ω. */
  bar_to_bar: number[];
  /** Their mean, Ω. */
  bar_to_bar_ohm: number;
  terminal_ohm: number;
  /** Least over a turn of the rotor, Ω; null when the brushes can short the supply through one bar (brush_short). */
  terminal_min_ohm: number | null;
  terminal_max_ohm: number;
  terminal_hot_ohm: number;
  /** Hot temperature, °C. */
  hot_temperature: number;
  /** Sentences on where these figures stop being valid (equalizers …). */
  validity: string[];
  /** How the brushes were placed for the terminal figures (technical; in the JSON, not on the card). */
  terminal_basis: string;
}

export interface WirePlan {
  /** Mean turn length over all coils, m. */
  mlt: number;
  /** How the turn length was found. */
  mlt_source: "measured" | "wire_length" | "wire_mass" | "terminal_resistance" | "logbook" | "model";
  /** One coil, all strands, m. */
  per_coil: number;
  /** The whole winding, all strands, m. */
  winding: number;
  /** Leads for the whole winding (two per coil, all strands), m. */
  leads: number;
  /** Everything to cut, all strands, leads and spare margin, m. */
  cut: number;
  /** Per strand spool: what to cut from each spool when strands come off separate spools, m. */
  cut_per_strand: number;
  /** Copper mass of the cut, kg. */
  copper_mass: number;
  spare_margin: number;
  lead_allowance: number;
}

export type CalibrationSource = "generator" | "no_load" | "nameplate" | "logbook" | "magnet" | "none";

export interface Calibration {
  source: CalibrationSource;
  /** Ke of the original winding, V·s/rad; null when nothing calibrates it. */
  ke: number | null;
  /** Rough relative uncertainty of Ke (fraction), null when unknown. */
  uncertainty: number | null;
  basis: string;
  loss: { tc: number; b: number };
  loss_basis: string;
  /** False when no test, record or model gives the loss torque (taken as zero): no-load current and efficiencies are then unknown (null). */
  loss_known: boolean;
  /** Generator against no-load Ke disagreement (fraction), when both exist. */
  disagreement: number | null;
  brush_drop: number;
  brush_drop_basis: string;
  /** A series motor whose field the job describes: the series model calibrated on the original (design/series.ts); else null. */
  series: SeriesSetup | null;
  /** A shunt motor: its field's resistance at 20 °C (Ω), from field_winding or a test's field current; else null (design/calibration.ts). */
  shunt_field_ohm: number | null;
}

/** A point of the motor's curve; its efficiency null when the losses are unknown. */
export type CurvePoint = Omit<OperatingPoint, "efficiency"> & { efficiency: number | null };

export interface MotorReport extends MotorSummary {
  /** Cold stall current (winding at 20 °C), A. */
  stallCurrentCold: number | null;
  model: MotorModel | null;
  curve: CurvePoint[];
  /** A series motor whose field the job describes: the series model's figures of this winding; else null. */
  series: SeriesSide | null;
}

export interface DutyReport {
  torque: number;
  target_speed: number;
  /** The armature's current, A (through the brushes: the current density's). */
  current: number;
  /**
   * What a meter on the supply reads, A: the armature's current and a shunt field's (V/R_f, hot); the
   * armature's alone for a permanent magnet; null for a series motor (its `current` is the terminals').
   */
  terminal_current: number | null;
  speed: number;
  /** Shaft output over the input at the terminals (a shunt field's loss included); null when the losses are unknown (docs "Unknown is null"). */
  efficiency: number | null;
  /** Input at the terminals, W: V·(armature current + a shunt field's). */
  input_w: number;
  output_w: number;
  current_density: number | null;
}

export interface Sensitivity {
  label: string;
  turns: number;
  wire: string;
  strands: number;
  terminal_ohm: number;
  copper_fill: number;
  /** Goal figure in SI, as `Candidate.achieved`. */
  achieved: number | null;
  meets_goal: boolean;
  rejected_because: RejectCode[];
}

export interface Plan {
  job: Job;
  feasible: boolean;
  goal: GoalReport;
  layout: WindingLayout;
  slot: SlotGeometry;
  design: Candidate;
  /** Copper fill limit in force (restore: the larger of the limit and the original's own). */
  fill_limit: number;
  coils: CoilPlan[];
  paths: number;
  resistance: ResistancePlan;
  wire: WirePlan;
  calibration: Calibration;
  /** Series and universal motors with a described field: the series model's figures (design/series.ts); else null. */
  series: SeriesPlan | null;
  motor: MotorReport;
  original_motor: MotorReport;
  original: {
    wire: Wire;
    turns: number;
    strands: number;
    copper_fill: number;
    mlt: number;
    terminal_ohm: number;
    terminal_measured: boolean;
    /** Overall diameter the old build is laid at for the turn-length model, m, and where it came from. */
    overall: number;
    overall_basis: string;
  };
  duty: DutyReport | null;
  original_duty: DutyReport | null;
  /** The best candidates and the nearest misses, best first. */
  candidates: Candidate[];
  candidates_total: number;
  /** Counts of rejection reasons over the whole sweep. */
  rejections: Partial<Record<RejectCode, number>>;
  /** What binds when nothing meets the goal. */
  binding: string | null;
  sensitivity: Sensitivity[];
  /** Supply voltage, V (DC, or AC r.m.s.). */
  supply: number;
  supply_kind: SupplyKind;
  /** Above extra-low voltage (IEC 60449 band I). */
  mains: boolean;
  warnings: Warning[];
  /** Records from the logbook that corrected this plan. */
  learning: { records: number; moves: { figure: string; from: number; to: number; unit: string }[] } | null;
}
