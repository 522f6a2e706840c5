/**
 * Calibrate the motor from the original winding (docs/contracts.md "Calibration of Ke"): gather what the
 * job recorded, correct resistances to each test's temperature, and hand it to `motor/calibrate`.
 */
import type { Job } from "../job/schema.js";
import { brushDrop as brushDropFor, type BrushMaterial } from "../motor/brush.js";
import { calibrate, type CalibrationInputs, type KeCalibration } from "../motor/calibrate.js";
import { activeConductors, fluxFromGap, pitchFactor } from "../motor/emf.js";
import { copperFactor, to20C } from "../wire/copper.js";
import type { Warning } from "../errors.js";
import type { ArmatureContext } from "./context.js";
import type { Calibration } from "./types.js";
import { nameplateMotorSpeed, setupSeries, type SeriesSetup } from "./series.js";

/** Default brush material when the job does not say: metal for small permanent-magnet motors (rotor under 30 mm), else carbon (common practice, no published source). */
export function defaultBrushMaterial(job: Job): BrushMaterial {
  return job.armature.field === "permanent_magnet" && job.armature.rotor_diameter < 0.03 ? "metal" : "carbon";
}

export interface LogbookCalibration {
  /** Ke scaled to the original's turns, V·s/rad. */
  ke?: number;
  loss?: { tc: number; b: number };
  records: number;
}

/**
 * A shunt field's resistance at 20 °C (Ω): `field_winding.resistance` corrected to 20 °C (IEC 60028),
 * else the first no-load test that gives its `field_current`, R = V/I_f at the test's temperature;
 * null for other fields or when neither is given. The field sits across the supply, so it takes
 * I_f = V/R_f whatever the armature does (the constant-field model, docs "Steady state").
 */
export function shuntFieldOhm(job: Job): number | null {
  if (job.armature.field !== "shunt") return null;
  const fw = job.field_winding;
  if (fw) return to20C(fw.resistance.value, fw.resistance.at);
  const t = (job.original.tests ?? []).find((x) => x.kind === "no_load" && x.field_current !== undefined && x.field_current > 0);
  return t ? to20C(t.supply / t.field_current!, t.temperature ?? 20) : null;
}

/** The shunt field's current in a no-load test that does not give it (A): the supply over the field's resistance at the test's temperature. */
function shuntFieldCurrent(ohm20: number | null, t: { supply: number; temperature?: number }): number | undefined {
  return ohm20 === null ? undefined : t.supply / (ohm20 * copperFactor(t.temperature ?? 20));
}

/**
 * The brush drop in force (V, with its basis: src/motor/brush.ts, machine textbooks for carbon, from
 * memory for metal): the job's, else its brush material's, else the default material's, and then a
 * `brush_assumed` warning.
 */
function brushDropOf(job: Job, warnings: Warning[]): { volts: number; basis: string } {
  const material = job.winding.brushes.material ?? defaultBrushMaterial(job);
  const bd = brushDropFor(material, job.winding.brush_drop);
  if (job.winding.brushes.material === undefined && job.winding.brush_drop === undefined) {
    warnings.push({
      code: "brush_assumed",
      path: "winding.brushes.material",
      message: `brush material not given: taken as ${material} (${bd.volts} V drop in total); say carbon or metal for better figures`,
    });
  }
  return bd;
}

/**
 * The no-load tests as the Ke fit reads them (V, A, rad/s, Ω): each with the shunt field's current
 * (given, else V/R_f at the test's temperature) and the terminal resistance at the test's temperature
 * (IEC 60028). None for a series motor: the series model calibrates it (design/series.ts), and its
 * running readings say nothing about a constant-field Ke (readings at two currents disagree on it).
 */
function noLoadInputs(ctx: ArmatureContext, shuntOhm: number | null): CalibrationInputs["noLoad"] {
  if (ctx.job.armature.field === "series") return undefined;
  const tests = (ctx.job.original.tests ?? []).filter((t) => t.kind === "no_load");
  if (tests.length === 0) return undefined;
  return tests.map((t) => ({
    supply: t.supply,
    current: t.no_load_current!,
    speed: t.no_load_speed!,
    fieldCurrent: t.field_current ?? shuntFieldCurrent(shuntOhm, t),
    terminalOhm: ctx.original.terminal20 * copperFactor(t.temperature ?? 20),
  }));
}

/**
 * The nameplate as the rough Ke fit reads it (V, A, rad/s, Ω hot at `hot_temperature`): the current,
 * or on DC the input watts over the supply (I = P/V); the motor's speed behind any gearbox. None for a
 * series motor (design/series.ts reads its nameplate).
 */
function nameplateInput(ctx: ArmatureContext): CalibrationInputs["nameplate"] {
  const { job } = ctx;
  const np = job.original.nameplate;
  if (!np || job.armature.field === "series") return undefined;
  return {
    supply: np.supply,
    current: np.current ?? np.input_power! / np.supply,
    speed: nameplateMotorSpeed(np),
    hotOhm: ctx.original.terminal20 * copperFactor(job.target.hot_temperature),
  };
}

/**
 * The magnet estimate's inputs (Wb per pole, from the job or B·pole arc·pole area, src/motor/emf.ts
 * `fluxFromGap`; active conductors, paths, pitch factor for the EMF equation); a pole arc taken as 0.7
 * of the pole pitch (common practice) is warned of.
 */
function magnetInput(ctx: ArmatureContext, warnings: Warning[]): CalibrationInputs["magnet"] {
  const { job } = ctx;
  const m = job.armature.magnet;
  if (!m) return undefined;
  const a = job.armature;
  const flux = m.flux_per_pole ?? fluxFromGap(m.gap_flux_density!, m.pole_arc ?? 0.7, a.rotor_diameter, a.stack_length, a.field_poles);
  if (m.flux_per_pole === undefined && m.pole_arc === undefined) {
    warnings.push({
      code: "pole_arc_assumed",
      path: "armature.magnet.pole_arc",
      message: "pole arc not given: taken as 0.7 of the pole pitch (common practice)",
    });
  }
  return {
    poles: a.field_poles,
    conductors: activeConductors(job.original.turns, ctx.liveCoils),
    paths: ctx.layout.paths,
    fluxPerPole: flux,
    pitchFactor: pitchFactor(ctx.layout.spec.span, a.slots, a.field_poles),
  };
}

/** Everything the job (and the logbook) records that calibrates Ke, as `motor/calibrate` reads it (SI); absent sources left out. */
function calibrationInputs(
  ctx: ArmatureContext,
  brushDrop: number,
  shuntOhm: number | null,
  warnings: Warning[],
  logbook?: LogbookCalibration,
): CalibrationInputs {
  const o = ctx.job.original;
  const inputs: CalibrationInputs = { brushDrop, field: ctx.job.armature.field };
  if (o.generator) inputs.generator = { speed: o.generator.speed, volts: o.generator.volts };
  const noLoad = noLoadInputs(ctx, shuntOhm);
  if (noLoad) inputs.noLoad = noLoad;
  if (logbook?.ke !== undefined) inputs.logbook = { ke: logbook.ke, records: logbook.records, loss: logbook.loss };
  const nameplate = nameplateInput(ctx);
  if (nameplate) inputs.nameplate = nameplate;
  const magnet = magnetInput(ctx, warnings);
  if (magnet) inputs.magnet = magnet;
  return inputs;
}

/**
 * What the fit warns of (a series motor's "nothing calibrates Ke" left out: its series model is in
 * charge), and `loss_unknown` when Ke is known but nothing gives the loss torque.
 */
function fitWarnings(job: Job, c: KeCalibration, logbook?: LogbookCalibration): Warning[] {
  const seriesModel = job.armature.field === "series";
  const out = c.warnings.filter((w) => !(seriesModel && w.code === "uncalibrated"));
  if (c.loss === null && c.ke !== null && !logbook?.loss) {
    out.push({
      code: "loss_unknown",
      path: "original.tests",
      message: "no no-load test: the loss torque is unknown and taken as zero, so no-load speeds read high and no-load currents read zero",
    });
  }
  return out;
}

/**
 * The plan's calibration record from the fit: Ke (V·s/rad) and its source, the loss torque (the fit's,
 * else the logbook's, else zero and unknown), the generator/no-load disagreement |Ke_g − Ke_n|/Ke_g,
 * the brush drop (V), the series model's setup and the shunt field's resistance at 20 °C (Ω).
 */
function calibrationOf(
  c: KeCalibration,
  bd: { volts: number; basis: string },
  series: SeriesSetup | null,
  shuntOhm: number | null,
  logbook?: LogbookCalibration,
): Calibration {
  const g = c.fits.generator;
  const n = c.fits.noLoad;
  return {
    source: c.source,
    ke: c.ke,
    uncertainty: c.uncertainty,
    basis: [c.basis, ...c.reasons].join("; "),
    loss: c.loss ?? logbook?.loss ?? { tc: 0, b: 0 },
    loss_basis: c.lossBasis ?? (logbook?.loss ? "from the logbook" : "unknown: taken as zero"),
    loss_known: c.loss !== null || logbook?.loss !== undefined,
    disagreement: g && n ? Math.abs(g.value - n.value) / g.value : null,
    brush_drop: bd.volts,
    brush_drop_basis: bd.basis,
    series,
    shunt_field_ohm: shuntOhm,
  };
}

/**
 * Calibrate the motor from the original winding (docs/contracts.md "Calibration of Ke": generator,
 * no-load tests, logbook, nameplate, magnet, best first; src/motor/calibrate.ts): the brush drop, the
 * recorded sources as the fit reads them, the fit, its warnings, and for a series field the series
 * model's own calibration (design/series.ts). Units SI.
 */
export function calibrateOriginal(ctx: ArmatureContext, logbook?: LogbookCalibration): { calibration: Calibration; warnings: Warning[] } {
  const warnings: Warning[] = [];
  const bd = brushDropOf(ctx.job, warnings);
  const shuntOhm = shuntFieldOhm(ctx.job);
  const c = calibrate(calibrationInputs(ctx, bd.volts, shuntOhm, warnings, logbook));
  warnings.push(...fitWarnings(ctx.job, c, logbook));
  const series = ctx.job.armature.field === "series" ? setupSeries(ctx, bd.volts) : null;
  if (series) warnings.push(...series.warnings);
  return { calibration: calibrationOf(c, bd, series, shuntOhm, logbook), warnings };
}
