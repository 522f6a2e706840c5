/**
 * Series and universal motors (docs/contracts.md, "Series and universal motors"): the series model
 * as one more `MotorPhysics` behind the one evaluation of a winding (src/design/evaluate.ts).
 *
 *  - `setupSeries` calibrates `motor/series` on the original from what the job recorded about the
 *    field and the running motor (it is part of the plan's calibration, `Calibration.series`);
 *  - `seriesPhysics` gives the figures of any winding: the point at a load torque (the sweep's
 *    duty and convert goals), and for a full evaluation the rated-load point, curves from light
 *    load to rated, the locked-rotor current at a reduced voltage (never at mains) and, for
 *    universal motors, the brief no-load point;
 *  - `seriesPlanOf` puts the original's and the chosen winding's figures side by side for the
 *    plan, with the locked-rotor check and, for `goal: convert`, what the field must become.
 *
 * Pure: no files, no terminal. Units SI.
 */
import type { Warning } from "../errors.js";
import type { Job } from "../job/schema.js";
import {
  calibrateSeries,
  convertRatio,
  fitSeriesInductance,
  lockedRotorCurrent,
  lockedRotorVoltage,
  pointAtTorqueSeries,
  rescaleSeries,
  seriesCurve,
  type SeriesCalibration,
  type SeriesInputs,
  type SeriesMotor,
  type SeriesPoint,
  type SeriesReadingInput,
  type Supply,
} from "../motor/series.js";
import { copperFactor, to20C } from "../wire/copper.js";
import type { ArmatureContext } from "./context.js";
import { unknownReport, type MotorPhysics, type ReportSide } from "./motor.js";

/** Extra-low voltage limits, IEC 60449 band I: 50 V AC r.m.s., 120 V ripple-free DC. */
export const ELV_AC = 50;
export const ELV_DC = 120;

/** A series operating point as the plan gives it: its efficiency null when no reading gives the losses (docs "Unknown is null"). */
export type SeriesFigure = Omit<SeriesPoint, "efficiency"> & { efficiency: number | null };

/** The series model's figures of one winding (a full evaluation's `motor.series`). */
export interface SeriesSide {
  /** k of this winding, V·s/(A·rad); null when nothing running calibrates it. */
  k: number | null;
  /** The supply these figures are at (a conversion's original: its own). */
  supply: Supply;
  /** At the rated torque on `supply`, hot. */
  rated: SeriesFigure | null;
  /** Light load (0.1 × rated torque) to rated, hot. */
  curve: SeriesFigure[];
  /** Locked rotor at the check voltage, winding cold, A. */
  lockedRotorCurrent: number | null;
  /** Field resistance at 20 °C, Ω (× the field's turns ratio² when it is rewound in the same copper). */
  fieldOhm: number;
  /** No-load point, cold: universal motors only (briefly, in their housing); null otherwise. */
  noLoad: SeriesFigure | null;
}

/** The locked-rotor check: r.m.s. volts (or DC), frequency Hz (0: DC) and why this voltage. */
export interface LockedRotorCheck {
  supply: Supply;
  basis: string;
}

export interface SeriesPlan {
  /** What the plan and card need beside the armature: both sides at the plan's supply. */
  original: SeriesSide;
  rewound: SeriesSide;
  supply: Supply;
  /** The original's own supply (its nameplate's, for a conversion; else the plan's). */
  originalSupply: Supply;
  /** Rated shaft torque, N·m, and where it came from. */
  ratedTorque: number | null;
  ratedSource: "nameplate" | "load_test" | "duty" | null;
  lockedRotor: LockedRotorCheck | null;
  /** No-load run of the new winding: only for universal motors (briefly, in their housing); null otherwise. */
  noLoad: SeriesFigure | null;
  convert: SeriesConversion | null;
  /** How the model was calibrated: sentences. */
  basis: string[];
}

export interface SeriesConversion {
  /** Exact turns ratio for the new supply (armature and field) on the continuous model. */
  ratio: number;
  /** Armature turns per coil chosen. */
  turns: number;
  /** Field turns per pole, rounded; null when the original's are not recorded. */
  fieldTurnsPerPole: number | null;
  /** Field resistance of the rewound field at 20 °C (same copper, ratio² × the old), Ω. */
  fieldOhm: number;
  /** Field wire copper area ÷ the old field wire's. */
  fieldAreaFactor: number;
}

/** Calibration of the original series motor: the fitted model at 20 °C and the bits the plan needs. */
export interface SeriesSetup {
  cal: SeriesCalibration | null;
  ra20: number;
  rf20: number;
  /** Inductance parts when no running reading calibrates k (from the job or the locked-rotor reading), H. */
  la: number;
  lf: number;
  inductanceKnown: boolean;
  supply: Supply;
  originalSupply: Supply;
  brushDrop: number;
  ratedTorque: number | null;
  ratedSpeed: number | null;
  ratedSource: SeriesPlan["ratedSource"];
  warnings: Warning[];
}

/** What the series model knows of the job as a whole, the same for every winding. */
export interface SeriesJobFigures {
  setup: SeriesSetup;
  /** The locked-rotor check voltage, or null when nothing sets it. */
  check: LockedRotorCheck | null;
  /** Goal convert: the exact turns ratio on the continuous model (`convertRatio`); else null. */
  convertRatio: number | null;
  /** Goal convert: the original's rated speed (rad/s) at the rated torque, the target on the new supply; else null. */
  convertSpeed: number | null;
}

/** The target supply as volts and frequency (0 Hz for DC). */
export function supplyOfJob(job: Job): Supply {
  const s = job.target.supply;
  return typeof s === "number" ? { volts: s, frequency: 0 } : { volts: s.value, frequency: s.kind === "ac" ? (s.frequency ?? 50) : 0 };
}

/** Motor speed of a nameplate, rad/s: a spindle's speed times the gear ratio (motor ÷ spindle). */
export function nameplateMotorSpeed(np: NonNullable<Job["original"]["nameplate"]>): number {
  return np.speed_kind === "spindle" ? np.speed * (np.gear_ratio ?? 1) : np.speed;
}

function readingsOf(job: Job, r20: number, target: Supply): SeriesReadingInput[] {
  const freq = (f: number | undefined) => f ?? target.frequency;
  const out: SeriesReadingInput[] = [];
  (job.original.tests ?? []).forEach((t, i) => {
    const path = `original.tests[${i}]`;
    const resistance = r20 * copperFactor(t.temperature ?? 20);
    const supply = { volts: t.supply, frequency: freq(t.frequency) };
    if (t.kind === "load") {
      out.push({ supply, current: t.current!, speed: t.speed!, torque: t.torque ?? null, outputW: t.output_power, resistance, path, what: "the load test" });
    } else {
      out.push({ supply, current: t.no_load_current!, speed: t.no_load_speed!, torque: 0, resistance, path, what: "the no-load test" });
    }
  });
  const np = job.original.nameplate;
  if (np) {
    out.push({
      supply: { volts: np.supply, frequency: freq(np.frequency) },
      current: np.current ?? null,
      inputW: np.input_power,
      speed: nameplateMotorSpeed(np),
      torque: null,
      resistance: r20 * copperFactor(job.target.hot_temperature),
      path: "original.nameplate",
      what: "the nameplate",
      rated: true,
    });
  }
  return out;
}

/** Calibrate the original series motor from the job (resistances to each reading's temperature, IEC 60028). */
export function setupSeries(ctx: ArmatureContext, brushDrop: number): SeriesSetup | null {
  const job = ctx.job;
  const fw = job.field_winding;
  if (job.armature.field !== "series" || !fw) return null;
  const supply = supplyOfJob(job);
  const ra20 = ctx.original.terminal20;
  const rf20 = to20C(fw.resistance.value, fw.resistance.at);
  const lr = fw.locked_rotor;
  const lrFreq = lr ? (lr.frequency ?? supply.frequency) : 0;
  const cal = calibrateSeries({
    la: job.original.armature_inductance,
    lf: fw.inductance,
    brushDrop,
    lockedRotor: lockedRotorInput(job, ra20 + rf20, lrFreq),
    readings: readingsOf(job, ra20 + rf20, supply),
  });
  const np = job.original.nameplate;
  const originalSupply = job.target.goal === "convert" && np ? { volts: np.supply, frequency: np.frequency ?? supply.frequency } : supply;
  let ratedTorque = cal?.rated?.torque ?? null;
  let ratedSpeed = cal?.rated?.speed ?? null;
  let ratedSource: SeriesPlan["ratedSource"] = cal?.rated ? (np ? "nameplate" : "load_test") : null;
  if (ratedTorque === null && job.target.duty) {
    ratedTorque = job.target.duty.torque;
    ratedSpeed = job.target.duty.speed;
    ratedSource = "duty";
  }
  const warnings: Warning[] = [];
  for (const b of cal?.basis ?? []) {
    if (/optimistic|\brough\b|assumed|no published source/.test(b)) warnings.push({ code: "series_assumption", path: "field_winding", message: b });
  }
  const ind = cal ?? inductanceOnly(job, ra20 + rf20, brushDrop, lrFreq);
  return {
    cal,
    ra20,
    rf20,
    la: ind.la,
    lf: ind.lf,
    inductanceKnown: ind.inductanceKnown,
    supply,
    originalSupply,
    brushDrop,
    ratedTorque,
    ratedSpeed,
    ratedSource,
    warnings,
  };
}

function lockedRotorInput(job: Job, r20: number, lrFreq: number): SeriesInputs["lockedRotor"] {
  const lr = job.field_winding?.locked_rotor;
  if (!lr) return undefined;
  const resistance = r20 * copperFactor(lr.temperature ?? 20);
  return { volts: lr.supply, current: lr.current, frequency: lrFreq > 0 ? lrFreq : null, resistance, path: "field_winding.locked_rotor" };
}

/** Inductance when no running reading exists (calibrateSeries returns null then). */
function inductanceOnly(job: Job, r20: number, brushDrop: number, lrFreq: number): { la: number; lf: number; inductanceKnown: boolean } {
  const fw = job.field_winding!;
  const ind = fitSeriesInductance(
    {
      la: job.original.armature_inductance,
      lf: fw.inductance,
      brushDrop,
      lockedRotor: lockedRotorInput(job, r20, lrFreq),
    },
    supplyOfJob(job).frequency > 0,
  );
  return { la: ind.la, lf: ind.lf, inductanceKnown: ind.known };
}

/**
 * Goal convert: the turns ratio (armature and field) that keeps the original's rated speed at its
 * rated torque on the new supply (`convertRatio`, hot), or null without a calibrated rated point.
 */
export function conversionRatio(setup: SeriesSetup, hotTemperature: number): number | null {
  if (!setup.cal || setup.ratedTorque === null || setup.ratedSpeed === null) return null;
  return convertRatio(modelAt(setup, copperFactor(hotTemperature)), setup.supply, setup.ratedTorque, setup.ratedSpeed).ratio;
}

/** The original motor with its resistances at R(T)/R(20 °C) = `factor` (IEC 60028). */
function modelAt(setup: SeriesSetup, factor: number): SeriesMotor {
  const c = setup.cal;
  return {
    mag: c ? c.mag : { k: NaN, iSat: null },
    ra: setup.ra20 * factor,
    rf: setup.rf20 * factor,
    la: setup.la,
    lf: setup.lf,
    brushDrop: setup.brushDrop,
    loss: c ? c.loss : { tc: 0, c2: 0 },
  };
}

/** Round down to two significant figures (a voltage a bench supply is set to). */
function roundDown2(v: number): number {
  const p = 10 ** (Math.floor(Math.log10(v)) - 1);
  return Math.floor(v / p + 1e-9) * p;
}

/** The rated point and the curve from light load to rated of motor `m` on `supply`, or why it cannot carry the rated torque. */
function ratedOf(m: SeriesMotor, supply: Supply, torque: number | null): { rated: SeriesPoint | null; curve: SeriesPoint[]; warning: string | null } {
  if (torque === null) return { rated: null, curve: [], warning: null };
  const rated = pointAtTorqueSeries(m, supply, torque);
  if (rated === null) return { rated: null, curve: [], warning: `cannot carry the rated torque ${(torque * 1e3).toPrecision(3)} mN·m at ${supply.volts} V` };
  return { rated, curve: seriesCurve(m, supply, torque, 21), warning: null };
}

/**
 * The locked-rotor check voltage: the original's locked-rotor reading's voltage when the job gives
 * one within extra-low voltage; else the voltage that drives about the rated current with E = 0,
 * capped at extra-low voltage (IEC 60449 band I: 50 V AC, 120 V DC) and at the supply, rounded down
 * to two significant figures. Null when neither a reading nor a rated current is known, or when an
 * AC motor's inductance is unknown (the reactance sets the current).
 */
function checkSupply(job: Job, setup: SeriesSetup, cold: SeriesMotor, ratedCurrent: number | null): LockedRotorCheck | null {
  const lr = job.field_winding?.locked_rotor;
  const f = setup.supply.frequency;
  if (f > 0 && !setup.inductanceKnown && !(lr && (lr.frequency ?? f) > 0)) return null;
  const elv = (freq: number) => (freq > 0 ? ELV_AC : ELV_DC);
  if (lr) {
    const lf = lr.frequency ?? f;
    if (lr.supply <= elv(lf)) return { supply: { volts: lr.supply, frequency: lf }, basis: "the voltage of the locked-rotor reading in the job" };
  }
  if (ratedCurrent === null) return null;
  const atRated = lockedRotorVoltage(cold, f, ratedCurrent);
  const cap = Math.min(elv(f), setup.supply.volts);
  const volts = roundDown2(Math.min(atRated, cap));
  const why =
    atRated > cap
      ? `capped at ${cap} V (extra-low voltage, IEC 60449); about rated current would need ${atRated.toPrecision(3)} V`
      : "about the rated current with the rotor held (E = 0)";
  return { supply: { volts, frequency: f }, basis: `${volts} V ${f > 0 ? `${f} Hz AC` : "DC"}: ${why}` };
}

/** The field's turns ratio of a job whose field is rewound to a new count (`rewound_turns_per_pole`), else 1. */
function rewoundFieldRatio(job: Job): number {
  const fw = job.field_winding;
  return fw?.rewound_turns_per_pole && fw.turns_per_pole ? fw.rewound_turns_per_pole / fw.turns_per_pole : 1;
}

/**
 * The job-wide figures: the locked-rotor check drives about the rated current, the original's
 * through the circuit a rewind restores, or for a conversion the converted motor's (both windings
 * × the exact ratio, resistances × ratio² in the same copper) on its new supply.
 */
function jobFigures(job: Job, setup: SeriesSetup): SeriesJobFigures {
  const hot = copperFactor(job.target.hot_temperature);
  const T = setup.ratedTorque;
  if (job.target.goal === "convert") {
    const n = conversionRatio(setup, job.target.hot_temperature);
    const conv = (f: number) =>
      rescaleSeries(modelAt(setup, f), { armature: n ?? 1, field: n ?? 1 }, setup.ra20 * f * (n ?? 1) ** 2, setup.rf20 * f * (n ?? 1) ** 2);
    const rated = n !== null && T !== null ? pointAtTorqueSeries(conv(hot), setup.supply, T) : null;
    return { setup, check: checkSupply(job, setup, conv(1), rated?.current ?? null), convertRatio: n, convertSpeed: setup.ratedSpeed };
  }
  const rated = setup.cal && T !== null ? pointAtTorqueSeries(modelAt(setup, hot), setup.originalSupply, T) : null;
  return { setup, check: checkSupply(job, setup, modelAt(setup, 1), rated?.current ?? null), convertRatio: null, convertSpeed: null };
}

/**
 * The series model as the evaluation's motor model (src/design/motor.ts `MotorPhysics`). A winding of
 * `turns` per coil is the original rescaled (`rescaleSeries`): k × the armature's turns ratio × the
 * field's, L_a × its square, R_a the winding's own terminal resistance; the field stays, or is
 * rewound to `rewound_turns_per_pole`, or for `goal: convert` follows the armature's ratio in the
 * same copper (R_f × ratio²). Resistances at R(T)/R20 = `factor` (IEC 60028), both armature and
 * field. No stall figure at the supply; a no-load point only for a universal motor (AC), run
 * briefly in its housing with its own fan; a series DC motor's running figures are at a load
 * torque only. Sources: src/motor/series.ts.
 */
export function seriesPhysics(job: Job, setup: SeriesSetup, originalTurns: number): MotorPhysics {
  const convert = job.target.goal === "convert";
  const fixedField = rewoundFieldRatio(job);
  const base = modelAt(setup, 1);
  const calibrated = setup.cal !== null;
  const frequency = setup.supply.frequency;
  const figures = jobFigures(job, setup);
  const fieldRatio = (turns: number) => (convert ? turns / originalTurns : fixedField);
  const motorOf = (turns: number, r20: number, factor: number): SeriesMotor => {
    const field = fieldRatio(turns);
    return rescaleSeries(base, { armature: turns / originalTurns, field }, r20 * factor, setup.rf20 * field * field * factor);
  };
  const lossKnown = setup.cal?.lossKnown ?? false;
  const checkFrequency = figures.check?.supply.frequency ?? frequency;
  return {
    field: "series",
    lossKnown,
    series: figures,
    canPredict: () => calibrated,
    // a universal motor's brief no-load run in its housing (the card's figure, log's check); never a series DC motor's
    noLoad(_ke, turns, r20, factor, V) {
      if (!calibrated || frequency === 0) return null;
      const p = pointAtTorqueSeries(motorOf(turns, r20, factor), { volts: V, frequency }, 0);
      return p === null ? null : { speed: p.speed, current: lossKnown ? p.current : null };
    },
    stallCurrent: () => null,
    // the field carries the armature's current: no separate field current (its points' current is the terminals')
    fieldCurrent: () => null,
    // at the check's frequency (a bench's variable transformer, or DC); on AC only when the inductance is known
    lockedRotor: (turns, r20, factor, V) =>
      checkFrequency > 0 && !setup.inductanceKnown ? null : lockedRotorCurrent(motorOf(turns, r20, factor), { volts: V, frequency: checkFrequency }),
    atTorque: (_ke, turns, r20, factor, V, T) => (calibrated ? pointAtTorqueSeries(motorOf(turns, r20, factor), { volts: V, frequency }, T) : null),
    report(ke, turns, r20, hotFactor, V, side: ReportSide) {
      const supply = side === "original" ? setup.originalSupply : { volts: V, frequency };
      const hot = motorOf(turns, r20, hotFactor);
      const cold = motorOf(turns, r20, 1);
      const r = calibrated ? ratedOf(hot, supply, setup.ratedTorque) : { rated: null, curve: [], warning: null };
      const field = fieldRatio(turns);
      // with no reading that gives the losses the loss torque is taken as zero: efficiencies are unknown, not 100 % of it
      const known = <P extends SeriesPoint | null>(p: P): SeriesFigure | null => (p === null ? null : lossKnown ? p : { ...p, efficiency: null });
      const series: SeriesSide = {
        k: calibrated ? hot.mag.k : null,
        supply,
        rated: known(r.rated),
        curve: r.curve.map((p) => known(p)!),
        lockedRotorCurrent: figures.check ? lockedRotorCurrent(cold, figures.check.supply) : null,
        fieldOhm: setup.rf20 * field * field,
        noLoad: calibrated && supply.frequency > 0 ? known(pointAtTorqueSeries(cold, supply, 0)) : null,
      };
      const which = side === "original" ? "original" : "new";
      const warnings = r.warning ? [{ code: "duty_beyond_stall", path: "original.nameplate", message: `the ${which} winding ${r.warning}` }] : [];
      return unknownReport(ke, r20 * hotFactor, series, warnings);
    },
  };
}

/**
 * The plan's series section: the original's and the chosen winding's figures from their full
 * evaluations side by side, the job's locked-rotor check, the new winding's no-load run (universal
 * motors only), and for a conversion what the field must become: its turns per pole × the
 * armature's ratio, its resistance × ratio² and its wire's copper area ÷ ratio in the same copper
 * (R ∝ N² at constant copper volume).
 */
export function seriesPlanOf(job: Job, figures: SeriesJobFigures, original: SeriesSide, rewound: SeriesSide, turns: number, originalTurns: number): SeriesPlan {
  const setup = figures.setup;
  const fw = job.field_winding!;
  const ratio = turns / originalTurns;
  const convert: SeriesConversion | null =
    job.target.goal === "convert"
      ? {
          ratio: figures.convertRatio ?? ratio,
          turns,
          fieldTurnsPerPole: fw.turns_per_pole ? Math.round(fw.turns_per_pole * ratio) : null,
          fieldOhm: rewound.fieldOhm,
          fieldAreaFactor: 1 / ratio,
        }
      : null;
  return {
    original,
    rewound,
    supply: setup.supply,
    originalSupply: setup.originalSupply,
    ratedTorque: setup.ratedTorque,
    ratedSource: setup.ratedSource,
    lockedRotor: figures.check,
    noLoad: rewound.noLoad,
    convert,
    basis: setup.cal?.basis ?? [],
  };
}
