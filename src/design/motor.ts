/**
 * The motor model as one pluggable piece of the evaluation of a winding. The evaluation
 * (src/design/evaluate.ts) asks the model for the figures a goal needs (no-load speed, stall
 * current, the point at a load torque) and for the full report of a chosen winding; it never
 * works a motor figure out itself. The sweep and the plan call the same functions here, and these
 * call the scalar functions of src/motor/model.ts.
 *
 * Today: the constant-field model (permanent magnet, shunt at constant field current). A series or
 * universal motor is planned with the same object for now (armature figures only, src/motor/model.ts
 * `summarize`); a series model plugs in by implementing `MotorPhysics` and being returned by
 * `motorPhysicsFor` for `field: series` jobs (docs/contracts.md, "The models").
 *
 * Units: SI (V·s/rad, Ω, V, A, rad/s, N·m, W, A/m²).
 */
import type { Job } from "../job/schema.js";
import { curve, noLoad, pointAtTorque, stallCurrent, summarize, type MotorModel, type OperatingPoint } from "../motor/model.js";
import { kvFromKe } from "../motor/emf.js";
import type { Calibration, MotorReport } from "./types.js";

/** What the evaluation asks of a motor model, for a winding of constant `ke` (V·s/rad) and terminal resistance (Ω). */
export interface MotorPhysics {
  readonly field: "constant" | "series";
  /** No-load speed (rad/s) and current (A) at supply V through resistance `r` (Ω); null when the model cannot say; the
   * current is null when no loss data calibrates it (docs "Unknown is null"). */
  noLoad(ke: number, r: number, cal: Calibration, V: number): { speed: number; current: number | null } | null;
  /** Stall current (A) at supply V through resistance `r` (Ω, at the temperature meant); null when the model cannot say. */
  stallCurrent(ke: number | null, r: number, cal: Calibration, V: number): number | null;
  /** The steady point at load torque T (N·m), hot resistance `rHot` (Ω); null beyond stall or when the model cannot say. */
  atTorque(ke: number, rHot: number, cal: Calibration, V: number, T: number): OperatingPoint | null;
  /** Every figure of the report for a winding of Ke `ke` (null: uncalibrated) and terminal `r20` (Ω at 20 °C). */
  report(ke: number | null, r20: number, hotFactor: number, cal: Calibration, V: number): MotorReport;
}

/** The model object of src/motor/model.ts for a winding. */
function modelOf(ke: number, resistance: number, cal: Calibration, field: MotorModel["field"]): MotorModel {
  return { ke, resistance, brushDrop: cal.brush_drop, loss: cal.loss, field };
}

/** A report with nothing known but Ke and the resistance. */
function emptyReport(ke: number | null, rHot: number): MotorReport {
  return {
    ke: ke ?? NaN,
    kt: ke ?? NaN,
    kv: ke ? kvFromKe(ke) : NaN,
    noLoadPerVolt: null,
    resistance: rHot,
    noLoadSpeed: null,
    noLoadCurrent: null,
    stallCurrent: null,
    stallTorque: null,
    peakEfficiency: null,
    peakEfficiencyCurrent: null,
    maxOutputW: null,
    warnings: [],
    stallCurrentCold: null,
    model: null,
    curve: [],
  };
}

/**
 * With no loss data (nameplate only, magnet estimate) the loss torque is taken as zero for the
 * speeds, but what it decides is unknown, not zero: the no-load current, the efficiencies and the
 * point of peak efficiency are null, and the curve's efficiencies too (docs "Unknown is null").
 */
function lossesUnknown(r: MotorReport): MotorReport {
  return { ...r, noLoadCurrent: null, peakEfficiency: null, peakEfficiencyCurrent: null, curve: r.curve.map((p) => ({ ...p, efficiency: null })) };
}

/** Constant field: V = Ke·ω + I·R + V_b, T = Kt·I − T_f(ω) (src/motor/model.ts, the linear DC motor model). */
export const CONSTANT_FIELD: MotorPhysics = {
  field: "constant",
  noLoad(ke, r, cal, V) {
    const nl = noLoad(modelOf(ke, r, cal, "constant"), V);
    return cal.loss_known ? nl : { speed: nl.speed, current: null };
  },
  stallCurrent: (ke, r, cal, V) => (ke === null ? null : stallCurrent(r, cal.brush_drop, V)),
  atTorque: (ke, rHot, cal, V, T) => pointAtTorque(modelOf(ke, rHot, cal, "constant"), V, T),
  report(ke, r20, hotFactor, cal, V) {
    const rHot = r20 * hotFactor;
    if (ke === null) return emptyReport(null, rHot);
    const hot = modelOf(ke, rHot, cal, "constant");
    const cold = modelOf(ke, r20, cal, "constant");
    const nl = noLoad(cold, V);
    const report: MotorReport = {
      ...summarize(hot, V),
      noLoadSpeed: nl.speed,
      noLoadPerVolt: V > 0 ? nl.speed / V : null,
      noLoadCurrent: nl.current,
      stallCurrentCold: stallCurrent(r20, cal.brush_drop, V),
      model: hot,
      curve: curve(hot, V, 41),
    };
    return cal.loss_known ? report : lossesUnknown(report);
  },
};

/**
 * Series field, armature only: Ke scaled by turns and the resistance; no stall figure (the field is
 * in the circuit) and no operating point. The series model's own figures come from
 * src/design/series.ts (`planSeries`, the plan's `series` section).
 */
export const SERIES_ARMATURE_ONLY: MotorPhysics = {
  field: "series",
  noLoad: () => null,
  stallCurrent: () => null,
  atTorque: () => null,
  report(ke, r20, hotFactor, _cal, V) {
    const rHot = r20 * hotFactor;
    const base = emptyReport(ke, rHot);
    if (ke === null) return base;
    const hot = modelOf(ke, rHot, _cal, "series");
    return { ...base, ...summarize(hot, V), stallCurrent: null, stallCurrentCold: null, model: hot, curve: [] };
  },
};

/** The motor model for a job's field. */
export function motorPhysicsFor(job: Job): MotorPhysics {
  return job.armature.field === "series" ? SERIES_ARMATURE_ONLY : CONSTANT_FIELD;
}
