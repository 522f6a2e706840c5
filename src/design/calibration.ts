/**
 * Calibrate the motor from the original winding (docs/contracts.md "Calibration of Ke"): gather what the
 * job recorded, correct resistances to each test's temperature, and hand it to `motor/calibrate`.
 */
import type { Job } from "../job/schema.js";
import { brushDrop as brushDropFor, type BrushMaterial } from "../motor/brush.js";
import { calibrate, type CalibrationInputs } from "../motor/calibrate.js";
import { activeConductors, fluxFromGap, pitchFactor } from "../motor/emf.js";
import { copperFactor, to20C } from "../wire/copper.js";
import type { Warning } from "../errors.js";
import type { ArmatureContext } from "./context.js";
import type { Calibration } from "./types.js";
import { nameplateMotorSpeed, setupSeries } from "./series.js";

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

export function calibrateOriginal(ctx: ArmatureContext, logbook?: LogbookCalibration): { calibration: Calibration; warnings: Warning[] } {
  const job = ctx.job;
  const warnings: Warning[] = [];
  const material = job.winding.brushes.material ?? defaultBrushMaterial(job);
  const bd = brushDropFor(material, job.winding.brush_drop);
  if (job.winding.brushes.material === undefined && job.winding.brush_drop === undefined) {
    warnings.push({
      code: "brush_assumed",
      path: "winding.brushes.material",
      message: `brush material not given: taken as ${material} (${bd.volts} V drop in total); say carbon or metal for better figures`,
    });
  }
  const o = job.original;
  const r20 = ctx.original.terminal20;
  const inputs: CalibrationInputs = { brushDrop: bd.volts, field: job.armature.field };
  if (o.generator) inputs.generator = { speed: o.generator.speed, volts: o.generator.volts };
  // a series motor is calibrated by the series model (design/series.ts, given its field_winding): its
  // running readings say nothing about a constant-field Ke, and readings at two currents disagree on it
  const seriesModel = job.armature.field === "series";
  const noLoadTests = seriesModel ? [] : (o.tests ?? []).filter((t) => t.kind === "no_load");
  const shuntOhm = shuntFieldOhm(job);
  if (noLoadTests.length > 0) {
    inputs.noLoad = noLoadTests.map((t) => ({
      supply: t.supply,
      current: t.no_load_current!,
      speed: t.no_load_speed!,
      fieldCurrent: t.field_current ?? shuntFieldCurrent(shuntOhm, t),
      terminalOhm: r20 * copperFactor(t.temperature ?? 20),
    }));
  }
  if (logbook?.ke !== undefined) inputs.logbook = { ke: logbook.ke, records: logbook.records, loss: logbook.loss };
  if (o.nameplate && !seriesModel) {
    inputs.nameplate = {
      supply: o.nameplate.supply,
      // input watts on DC: I = P/V (a series motor's AC nameplate is read by design/series.ts)
      current: o.nameplate.current ?? o.nameplate.input_power! / o.nameplate.supply,
      speed: nameplateMotorSpeed(o.nameplate),
      hotOhm: r20 * copperFactor(job.target.hot_temperature),
    };
  }
  const m = job.armature.magnet;
  if (m) {
    const flux =
      m.flux_per_pole ?? fluxFromGap(m.gap_flux_density!, m.pole_arc ?? 0.7, job.armature.rotor_diameter, job.armature.stack_length, job.armature.field_poles);
    inputs.magnet = {
      poles: job.armature.field_poles,
      conductors: activeConductors(o.turns, ctx.liveCoils),
      paths: ctx.layout.paths,
      fluxPerPole: flux,
      pitchFactor: pitchFactor(ctx.layout.spec.span, job.armature.slots, job.armature.field_poles),
    };
    if (m.flux_per_pole === undefined && m.pole_arc === undefined) {
      warnings.push({
        code: "pole_arc_assumed",
        path: "armature.magnet.pole_arc",
        message: "pole arc not given: taken as 0.7 of the pole pitch (common practice)",
      });
    }
  }
  const c = calibrate(inputs);
  // with the series model in charge, "nothing calibrates Ke" is no news
  warnings.push(...c.warnings.filter((w) => !(seriesModel && w.code === "uncalibrated")));
  if (c.loss === null && c.ke !== null && !logbook?.loss) {
    warnings.push({
      code: "loss_unknown",
      path: "original.tests",
      message: "no no-load test: the loss torque is unknown and taken as zero, so no-load speeds read high and no-load currents read zero",
    });
  }
  // the series model's calibration, when the job describes the field (design/series.ts)
  const series = seriesModel ? setupSeries(ctx, bd.volts) : null;
  if (series) warnings.push(...series.warnings);
  let disagreementValue: number | null = null;
  if (c.fits.generator && c.fits.noLoad) disagreementValue = Math.abs(c.fits.generator.value - c.fits.noLoad.value) / c.fits.generator.value;
  return {
    calibration: {
      source: c.source,
      ke: c.ke,
      uncertainty: c.uncertainty,
      basis: [c.basis, ...c.reasons].join("; "),
      loss: c.loss ?? logbook?.loss ?? { tc: 0, b: 0 },
      loss_basis: c.lossBasis ?? (logbook?.loss ? "from the logbook" : "unknown: taken as zero"),
      loss_known: c.loss !== null || logbook?.loss !== undefined,
      disagreement: disagreementValue,
      brush_drop: bd.volts,
      brush_drop_basis: bd.basis,
      series,
      shunt_field_ohm: shuntOhm,
    },
    warnings,
  };
}
