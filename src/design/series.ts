/**
 * Series and universal motors in a plan (docs/contracts.md, "Series and universal motors"): gather what
 * the job recorded about the field and the running motor, calibrate `motor/series`, and report
 * the original and the rewound motor side by side: rated-load figures, curves from light load to
 * rated, a locked-rotor check at a reduced voltage (never at mains) and, for `goal: convert`,
 * the turns ratio and what the field must become.
 *
 * It plugs in behind the plan as the motor model for `field: series`; it takes the armature
 * context and the brush drop and returns plain data. Pure: no files, no terminal.
 */
import type { Warning } from "../errors.js";
import type { Job } from "../job/schema.js";
import {
  atTorqueSeries,
  calibrateSeries,
  convertRatio,
  fitSeriesInductance,
  lockedRotorCurrent,
  lockedRotorVoltage,
  noLoadSeries,
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

/** Extra-low voltage limits, IEC 60449 band I: 50 V AC r.m.s., 120 V ripple-free DC. */
export const ELV_AC = 50;
export const ELV_DC = 120;

export interface SeriesSide {
  /** k of this winding, V·s/(A·rad); null when nothing running calibrates it. */
  k: number | null;
  /** At the rated torque on `supply`, hot. */
  rated: SeriesPoint | null;
  /** Light load (0.1 × rated torque) to rated, hot. */
  curve: SeriesPoint[];
  /** Locked rotor at the check voltage, winding cold, A. */
  lockedRotorCurrent: number | null;
  /** Field resistance at 20 °C, Ω. */
  fieldOhm: number;
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
  /** The locked-rotor check: r.m.s. volts (or DC), frequency Hz (0: DC) and why this voltage. */
  lockedRotor: { supply: Supply; basis: string } | null;
  /** No-load run: only for universal motors (briefly, in their housing); null otherwise. */
  noLoad: SeriesPoint | null;
  convert: SeriesConversion | null;
  /** How the model was calibrated: sentences. */
  basis: string[];
}

export interface SeriesConversion {
  /** Exact turns ratio for the new supply (armature and field). */
  ratio: number;
  /** Armature turns per coil, rounded. */
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

function sideOf(
  m: SeriesMotor,
  supply: Supply,
  torque: number | null,
  calibrated: boolean,
): { rated: SeriesPoint | null; curve: SeriesPoint[]; warning: string | null } {
  if (!calibrated || torque === null) return { rated: null, curve: [], warning: null };
  try {
    return { rated: atTorqueSeries(m, supply, torque), curve: seriesCurve(m, supply, torque, 21), warning: null };
  } catch {
    return { rated: null, curve: [], warning: `cannot carry the rated torque ${(torque * 1e3).toPrecision(3)} mN·m at ${supply.volts} V` };
  }
}

/**
 * The locked-rotor check voltage: the original's locked-rotor reading's voltage when the job gives
 * one within extra-low voltage; else the voltage that drives about the rated current with E = 0,
 * capped at extra-low voltage (IEC 60449 band I: 50 V AC, 120 V DC) and at the supply, rounded down
 * to two significant figures. Null when neither a reading nor a rated current is known, or when an
 * AC motor's inductance is unknown (the reactance sets the current).
 */
function checkSupply(job: Job, setup: SeriesSetup, cold: SeriesMotor, ratedCurrent: number | null): { supply: Supply; basis: string } | null {
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

/** The rewound winding as the plan chose it. */
export interface SeriesRewind {
  /** Turns per coil, new and original. */
  turns: number;
  originalTurns: number;
  /** Armature terminal resistance of the new winding at 20 °C, brushes excluded, Ω. */
  armature20: number;
  hotTemperature: number;
  /** Goal convert: the exact ratio found before the sweep. */
  convertRatio: number | null;
}

/**
 * Original and rewound series motor side by side (SI): rated-load figures and curves hot on their
 * supplies, the locked-rotor current cold at the check voltage, the no-load point for universal
 * motors only, and for a conversion what the field must become. Sources: `motor/series.ts`;
 * resistance with temperature IEC 60028; field resistance × ratio² for a field rewound in the same
 * copper (R ∝ N² at constant copper volume).
 */
export function planSeries(job: Job, setup: SeriesSetup, w: SeriesRewind): { plan: SeriesPlan; warnings: Warning[] } {
  const warnings: Warning[] = [...setup.warnings];
  const fw = job.field_winding!;
  const armRatio = w.turns / w.originalTurns;
  const fieldRatio =
    job.target.goal === "convert" ? armRatio : fw.rewound_turns_per_pole && fw.turns_per_pole ? fw.rewound_turns_per_pole / fw.turns_per_pole : 1;
  const rf20New = setup.rf20 * fieldRatio * fieldRatio;
  const hot = copperFactor(w.hotTemperature);
  const origHot = modelAt(setup, hot);
  const origCold = modelAt(setup, 1);
  const rewound = (m: SeriesMotor, f: number) => rescaleSeries(m, { armature: armRatio, field: fieldRatio }, w.armature20 * f, rf20New * f);
  const newHot = rewound(origHot, hot);
  const newCold = rewound(origCold, 1);
  const calibrated = setup.cal !== null;
  const o = sideOf(origHot, setup.originalSupply, setup.ratedTorque, calibrated);
  const n = sideOf(newHot, setup.supply, setup.ratedTorque, calibrated);
  for (const [which, s] of [
    ["original", o],
    ["new", n],
  ] as const) {
    if (s.warning) warnings.push({ code: "duty_beyond_stall", path: "original.nameplate", message: `the ${which} winding ${s.warning}` });
  }
  // the check drives about the rated current: the original's through the circuit the rewind restores,
  // or for a conversion the new winding's on its new supply
  const check =
    job.target.goal === "convert" ? checkSupply(job, setup, newCold, n.rated?.current ?? null) : checkSupply(job, setup, origCold, o.rated?.current ?? null);
  const lrOf = (m: SeriesMotor) => (check ? lockedRotorCurrent(m, check.supply) : null);
  const universal = setup.supply.frequency > 0;
  let noLoad: SeriesPoint | null = null;
  if (universal && calibrated) noLoad = noLoadSeries(newCold, setup.supply);
  let convert: SeriesConversion | null = null;
  if (job.target.goal === "convert") {
    convert = {
      ratio: w.convertRatio ?? armRatio,
      turns: w.turns,
      fieldTurnsPerPole: fw.turns_per_pole ? Math.round(fw.turns_per_pole * fieldRatio) : null,
      fieldOhm: rf20New,
      fieldAreaFactor: 1 / fieldRatio,
    };
  }
  const plan: SeriesPlan = {
    original: { k: calibrated ? origHot.mag.k : null, rated: o.rated, curve: o.curve, lockedRotorCurrent: lrOf(origCold), fieldOhm: setup.rf20 },
    rewound: { k: calibrated ? newHot.mag.k : null, rated: n.rated, curve: n.curve, lockedRotorCurrent: lrOf(newCold), fieldOhm: rf20New },
    supply: setup.supply,
    originalSupply: setup.originalSupply,
    ratedTorque: setup.ratedTorque,
    ratedSource: setup.ratedSource,
    lockedRotor: check,
    noLoad,
    convert,
    basis: setup.cal?.basis ?? [],
  };
  return { plan, warnings };
}
