/**
 * The motor model as one pluggable piece of the evaluation of a winding. The evaluation
 * (src/design/evaluate.ts) asks the model for the figures a goal needs (no-load speed, stall
 * current, the point at a load torque) and for the full report of a chosen winding; it never
 * works a motor figure out itself. The sweep and the plan call the same functions here, and these
 * call the scalar functions of src/motor/model.ts (constant field) or src/motor/series.ts (series).
 *
 * Two models: the constant field (permanent magnet; a shunt field at constant field current, its
 * current taken off the no-load test's before Ke is fitted, src/motor/calibrate.ts) and the series
 * field (src/design/series.ts `seriesPhysics`, for `field: series` jobs whose field the job
 * describes). A series job with no `field_winding` gets the armature-only model: Ke and the
 * resistance, every other figure unknown (null). docs/contracts.md, "The models".
 *
 * A winding is given to the model by its Ke (the constant field's, V·s/rad, scaled by turns; null
 * when nothing calibrates it), its turns per coil (the series model scales from the original's),
 * its terminal resistance at 20 °C (Ω) and the factor R(T)/R(20 °C) of the temperature meant
 * (IEC 60028), so that a series model can heat its field with it.
 *
 * Units: SI (V·s/rad, Ω, V, A, rad/s, N·m, W, A/m²).
 */
import type { Job } from "../job/schema.js";
import { curve, fieldCurrent, noLoad, pointAtTorque, stallCurrent, summarize, unknownSummary, type MotorModel, type OperatingPoint } from "../motor/model.js";
import type { Warning } from "../errors.js";
import { seriesPhysics, type SeriesJobFigures, type SeriesSide } from "./series.js";
import type { Calibration, MotorReport } from "./types.js";

/** Which report a full evaluation asks for: the rewound winding's, or the original's (a conversion's original runs on its own supply). */
export type ReportSide = "new" | "original";

/** What the evaluation asks of a motor model for one winding (see the module's note for the arguments). */
export interface MotorPhysics {
  readonly field: "constant" | "series";
  /** True when the losses are known, so that efficiencies and no-load currents can be given (docs "Unknown is null"). */
  readonly lossKnown: boolean;
  /** The series model's job-wide figures (rated torque, the locked-rotor check voltage, a conversion's ratio); null for the others. */
  readonly series: SeriesJobFigures | null;
  /** Can this model predict a running figure of a winding of Ke `ke` (constant field: a calibrated Ke; series: a calibrated field)? */
  canPredict(ke: number | null): boolean;
  /** No-load speed (rad/s) and current (A) at supply V, winding at R(T)/R20 = `factor`; null when the model cannot say; the
   * current is null when no loss data calibrates it. */
  noLoad(ke: number | null, turns: number, r20: number, factor: number, V: number): { speed: number; current: number | null } | null;
  /** Stall current (A) at supply V, winding at R(T)/R20 = `factor`; null when the model cannot say (never for a series motor at its supply). */
  stallCurrent(ke: number | null, turns: number, r20: number, factor: number, V: number): number | null;
  /**
   * The current (A) with the rotor held at supply V (a bench's locked-rotor or brief stall check at a
   * reduced voltage), winding at R(T)/R20 = `factor`; null when the model cannot say. Needs no Ke:
   * with the rotor still there is no back-EMF.
   */
  lockedRotor(turns: number, r20: number, factor: number, V: number): number | null;
  /**
   * The current a shunt field takes across supply V (A), its winding at R(T)/R20 = `factor` (heated as
   * the armature is): V/R_f, 0 for a permanent magnet, null for a series field (it carries the armature's).
   */
  fieldCurrent(factor: number, V: number): number | null;
  /**
   * The steady point at load torque T (N·m), winding at R(T)/R20 = `factor`; null beyond stall or when
   * the model cannot say. Its current is the armature's, its input and efficiency at the terminals.
   */
  atTorque(ke: number | null, turns: number, r20: number, factor: number, V: number, T: number): OperatingPoint | null;
  /** Every figure of the report for a winding, hot where the figure is hot (`hotFactor`). */
  report(ke: number | null, turns: number, r20: number, hotFactor: number, V: number, side: ReportSide): MotorReport;
}

/**
 * A shunt field's resistance at R(T)/R20 = `factor` (Ω; IEC 60028 through the factor, the field heated
 * as the armature is, as a series field is: DEVELOPERS.md "Shunt fields"); null without one.
 */
function shuntOhm(cal: Calibration, factor: number): number | null {
  return cal.shunt_field_ohm === null ? null : cal.shunt_field_ohm * factor;
}

/**
 * The model object of src/motor/model.ts for a winding of Ke `ke` (V·s/rad) and terminal resistance
 * R20·factor (Ω), a shunt field at the same factor: the one place the field enters the figures.
 */
function modelOf(ke: number, r20: number, factor: number, cal: Calibration): MotorModel {
  return { ke, resistance: r20 * factor, brushDrop: cal.brush_drop, loss: cal.loss, field: "constant", fieldOhm: shuntOhm(cal, factor) };
}

/**
 * A report with nothing known but Ke (null: uncalibrated) and the hot resistance (Ω), and the series
 * model's figures when it has them: the one "unknown" report (src/motor/model.ts `unknownSummary`).
 */
export function unknownReport(ke: number | null, rHot: number, series: SeriesSide | null = null, warnings: Warning[] = []): MotorReport {
  return { ...unknownSummary(ke, rHot, warnings), stallCurrentCold: null, model: null, curve: [], series };
}

/**
 * With no loss data (nameplate only, magnet estimate) the loss torque is taken as zero for the
 * speeds, but what it decides is unknown, not zero: the no-load current, the efficiencies and the
 * point of peak efficiency are null, and the curve's efficiencies too (docs "Unknown is null").
 */
function lossesUnknown(r: MotorReport): MotorReport {
  return { ...r, noLoadCurrent: null, peakEfficiency: null, peakEfficiencyCurrent: null, curve: r.curve.map((p) => ({ ...p, efficiency: null })) };
}

/**
 * Constant field: V = Ke·ω + I·R + V_b, T = Kt·I − T_f(ω) (src/motor/model.ts, the linear DC motor
 * model), for the calibration `cal`.
 */
export function constantField(cal: Calibration): MotorPhysics {
  return {
    field: "constant",
    lossKnown: cal.loss_known,
    series: null,
    canPredict: (ke) => ke !== null,
    noLoad(ke, _turns, r20, factor, V) {
      if (ke === null) return null;
      const nl = noLoad(modelOf(ke, r20, factor, cal), V);
      return { speed: nl.speed, current: cal.loss_known ? nl.terminalCurrent : null };
    },
    stallCurrent: (ke, _turns, r20, factor, V) => (ke === null ? null : stallCurrent(r20 * factor, cal.brush_drop, V)),
    lockedRotor: (_turns, r20, factor, V) => stallCurrent(r20 * factor, cal.brush_drop, V),
    fieldCurrent: (factor, V) => fieldCurrent(shuntOhm(cal, factor), V),
    atTorque: (ke, _turns, r20, factor, V, T) => (ke === null ? null : pointAtTorque(modelOf(ke, r20, factor, cal), V, T)),
    report(ke, _turns, r20, hotFactor, V) {
      if (ke === null) return unknownReport(null, r20 * hotFactor);
      const hot = modelOf(ke, r20, hotFactor, cal);
      const nl = noLoad(modelOf(ke, r20, 1, cal), V);
      const report: MotorReport = {
        ...summarize(hot, V),
        noLoadSpeed: nl.speed,
        noLoadPerVolt: V > 0 ? nl.speed / V : null,
        noLoadCurrent: nl.terminalCurrent,
        stallCurrentCold: stallCurrent(r20, cal.brush_drop, V),
        model: hot,
        curve: curve(hot, V, 41),
        series: null,
      };
      return cal.loss_known ? report : lossesUnknown(report);
    },
  };
}

/**
 * Series field the job does not describe (no `field_winding`): only what the armature alone
 * determines (Ke scaled by turns, the resistance); no stall figure (the field is in the circuit)
 * and no operating point.
 */
export const SERIES_ARMATURE_ONLY: MotorPhysics = {
  field: "series",
  lossKnown: false,
  series: null,
  canPredict: () => false,
  noLoad: () => null,
  stallCurrent: () => null,
  lockedRotor: () => null,
  fieldCurrent: () => null,
  atTorque: () => null,
  report: (ke, _turns, r20, hotFactor) => unknownReport(ke, r20 * hotFactor),
};

/**
 * The motor model for a job's field and its calibration: the series model when the job describes
 * a series field (`cal.series`), the armature-only model for a series job that does not, else
 * the constant field (permanent magnet, shunt). `originalTurns`: the original's turns per coil.
 */
export function motorPhysicsFor(job: Job, cal: Calibration, originalTurns: number = job.original.turns): MotorPhysics {
  if (job.armature.field !== "series") return constantField(cal);
  return cal.series ? seriesPhysics(job, cal.series, originalTurns) : SERIES_ARMATURE_ONLY;
}
