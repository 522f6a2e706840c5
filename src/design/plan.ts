/**
 * A job in, a plan out: the armature context, the calibrated original, the sweep, and the chosen
 * winding worked out coil by coil. Pure: no files, no terminal.
 */
import type { Warning } from "../errors.js";
import type { Job } from "../job/schema.js";
import { kvFromKe } from "../motor/emf.js";
import { atTorque, curve, noLoad, stall, summarize, type MotorModel } from "../motor/model.js";
import { copperFactor, COPPER_DENSITY } from "../wire/copper.js";
import { defaultStock, resolveWire } from "../wire/catalogue.js";
import type { Wire } from "../wire/types.js";
import { barToBar, terminalResistance } from "../winding/ring.js";
import { buildContext, coilResistance, coilTurnLengths, meanOf, type ArmatureContext } from "./context.js";
import { calibrateOriginal, type LogbookCalibration } from "./calibration.js";
import { makeEvaluator, type Evaluator } from "./evaluate.js";
import { sweep } from "./sweep.js";
import { conversionRatio, planSeries, setupSeries, type SeriesPlan } from "./series.js";
import { inputError } from "../errors.js";
import { toleranceText } from "../format/goal.js";
import type { Calibration, Candidate, CoilPlan, DutyReport, GoalReport, MotorReport, Plan, RejectCode, Sensitivity } from "./types.js";

/** Extra-low voltage limits, IEC 60449 band I: 50 V AC r.m.s., 120 V ripple-free DC. */
export const ELV_AC = 50;
export const ELV_DC = 120;

export interface PlanOptions {
  /** What the logbook of the same family contributes (the CLI reads it; the core only uses it). */
  logbook?: LogbookCalibration & { mltFactor?: number; moves?: { figure: string; from: number; to: number; unit: string }[] };
}

const REASON_TEXT: Record<RejectCode, string> = {
  copper_fill: "copper fill above the limit",
  space_fill: "the wires' overall circles fill more of the slot than round wire packs",
  layer_build: "the layers build deeper than the slot allows where it narrows",
  slot_opening: "the wire (with its strands side by side) does not pass the slot opening with clearance",
  overall_unknown: "no overall diameter is known for this wire: measure one",
  current_density: "current density in each strand above the limit",
  hot_stall_current: "hot stall current above the limit",
  below_original_copper: "less than 97 % of the original's copper area",
};

export function reasonText(code: RejectCode): string {
  return REASON_TEXT[code];
}

export function supplyOf(job: Job): { volts: number; kind: "dc" | "ac" } {
  const s = job.target.supply;
  return typeof s === "number" ? { volts: s, kind: "dc" } : { volts: s.value, kind: s.kind };
}

export function stockWires(job: Job): { wires: Wire[]; warnings: Warning[] } {
  const warnings: Warning[] = [];
  if (!job.wire_stock) return { wires: defaultStock(), warnings };
  const wires = job.wire_stock.map((spec, i) => {
    const w = resolveWire(spec);
    if (spec.assumed) warnings.push({ code: "wire_assumed", path: `wire_stock[${i}]`, message: spec.assumed });
    if (w.overall_diameter === null) {
      warnings.push({
        code: "overall_unknown",
        path: `wire_stock[${i}]`,
        message: `${w.label}: no overall diameter is known for this size and insulation; measure one and write { bare: …, overall: … }`,
      });
    }
    return w;
  });
  return { wires, warnings };
}

function motorModel(ke: number, resistance: number, cal: Calibration, series: boolean): MotorModel {
  return { ke, resistance, brushDrop: cal.brush_drop, loss: cal.loss, field: series ? "series" : "constant" };
}

function motorReport(ke: number | null, r20: number, hotFactor: number, cal: Calibration, series: boolean, supply: number): MotorReport {
  const nullReport: MotorReport = {
    ke: ke ?? NaN,
    kt: ke ?? NaN,
    kv: ke ? kvFromKe(ke) : NaN,
    resistance: r20 * hotFactor,
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
  if (ke === null) return nullReport;
  const hot = motorModel(ke, r20 * hotFactor, cal, series);
  const s = summarize(hot, supply);
  if (series) return { ...nullReport, ...s, stallCurrent: nullReport.stallCurrent, stallCurrentCold: nullReport.stallCurrentCold, model: hot, curve: [] };
  const cold = motorModel(ke, r20, cal, false);
  const nl = noLoad(cold, supply);
  return {
    ...s,
    noLoadSpeed: nl.speed,
    noLoadCurrent: nl.current,
    stallCurrentCold: stall(cold, supply).current,
    model: hot,
    curve: curve(hot, supply, 41),
  };
}

function dutyReport(model: MotorModel | null, supply: number, job: Job, density: (i: number) => number | null): DutyReport | null {
  const d = job.target.duty;
  if (!d || !model || model.field === "series") return null;
  try {
    const p = atTorque(model, supply, d.torque);
    return {
      torque: d.torque,
      target_speed: d.speed,
      current: p.current,
      speed: p.speed,
      efficiency: p.efficiency,
      input_w: p.inputW,
      output_w: p.outputW,
      current_density: density(p.current),
    };
  } catch {
    // the load torque is beyond this motor's stall torque: no operating point (planJob warns)
    return null;
  }
}

function goalReport(ev: Evaluator, c: Candidate, tolerance: Job["target"]["tolerance"]): GoalReport {
  return { kind: ev.goal, target: ev.target, achieved: c.achieved, error_fraction: c.error, tolerance };
}

export function planJob(job: Job, options: PlanOptions = {}): Plan {
  const ctx: ArmatureContext = buildContext(job);
  const warnings: Warning[] = [...ctx.warnings];
  if (job.original.wire.assumed) warnings.push({ code: "wire_assumed", path: "original.wire", message: job.original.wire.assumed });
  if (options.logbook?.mltFactor !== undefined && ctx.mltSource !== "measured") {
    ctx.mltFactor = options.logbook.mltFactor;
    ctx.mltSource = "logbook";
  }
  const { calibration: cal, warnings: calWarnings } = calibrateOriginal(ctx, options.logbook);
  warnings.push(...calWarnings);
  const { volts: supply, kind: supplyKind } = supplyOf(job);
  const series = job.armature.field === "series";
  const seriesSetup = series ? setupSeries(ctx, cal.brush_drop) : null;
  const ratio = seriesSetup && job.target.goal === "convert" ? conversionRatio(seriesSetup, job.target.hot_temperature) : null;
  if (job.target.goal === "convert" && ratio === null) {
    throw inputError(
      "goal_uncalibrated",
      "original.nameplate",
      "goal convert needs the original's rated point: field_winding (resistance, and inductance on AC) with a nameplate or load test that leaves the motor a load torque",
    );
  }
  const ev = makeEvaluator(ctx, cal, supply, ratio);
  const stock = stockWires(job);
  warnings.push(...stock.warnings);
  if (ev.goal !== "restore" && ev.goal !== "convert" && cal.ke === null) {
    warnings.push({ code: "goal_uncalibrated", path: "target.goal", message: `the ${ev.goal.replace(/_/g, " ")} cannot be predicted without a calibrated Ke; the plan falls back to the most copper that fits` });
  }
  const result = sweep(ev, {
    wires: stock.wires,
    maxInHand: job.max_in_hand,
    fixedTurns: ev.goal === "restore" ? job.original.turns : ratio !== null ? Math.max(1, Math.round(job.original.turns * ratio)) : undefined,
    sides: ctx.sides,
    freeArea: ctx.slot.free_area,
  });
  if (!result.best) {
    // no wire in stock at all can be evaluated (cannot happen with a non-empty stock)
    throw new Error("empty sweep");
  }
  const chosen = result.best;
  const feasible = chosen.meets_goal;
  let binding: string | null = null;
  if (!feasible) {
    const reasons = chosen.rejected_because.map(reasonText);
    const top = Object.entries(result.rejections).sort((a, b) => b[1] - a[1])[0];
    binding = reasons.length
      ? `the closest candidate is held back by: ${reasons.join("; ")}`
      : `no candidate within the limits comes within ${toleranceText(ev.goal, job.target.tolerance)} of the goal${top ? `; the limit that rejects most candidates: ${reasonText(top[0] as RejectCode)} (${top[1]} of ${result.total})` : ""}`;
    warnings.push({ code: "goal_not_met", path: "target.goal", message: `no winding meets the goal within the limits: ${binding}` });
  }

  // the chosen winding, coil by coil
  const overall = chosen.wire.overall_diameter ?? chosen.wire.bare_diameter * 1.08;
  const mlts = coilTurnLengths(ctx, chosen.turns, chosen.strands, overall);
  const coilOhms = mlts.map((m) => coilResistance(chosen.turns, m, chosen.strands, chosen.wire.area));
  const coils: CoilPlan[] = ctx.layout.coils.map((c, i) => ({ ...c, turns: c.dead ? chosen.turns : chosen.turns, mlt: mlts[i], ohm: coilOhms[i] }));
  const term = terminalResistance(ctx.layout, coilOhms);
  const hotFactor = copperFactor(job.target.hot_temperature);
  // the sweep used the mean coil; the chosen winding's terminal figure comes from the network of its own coils
  chosen.terminal_ohm = term.single;
  chosen.terminal_hot_ohm = term.single * hotFactor;
  const b2b = barToBar(ctx.layout, coilOhms);
  const liveMean = meanOf(coilOhms, ctx.layout);
  const validity: string[] = [];
  if (job.winding.equalizers) validity.push("equalizer connections are fitted: they tie bars together, so the bar-to-bar and terminal figures from the plain ring do not hold; the figures here include the equalizers as near-zero links");
  const mltMean = meanOf(mlts, ctx.layout);
  const perCoil = chosen.turns * chosen.strands * mltMean;
  const windingLen = perCoil * ctx.liveCoils;
  const leads = 2 * job.winding.lead_allowance * ctx.liveCoils * chosen.strands;
  const cut = (windingLen + leads) * (1 + job.winding.spare_margin);

  // motors
  const newKe = cal.ke === null ? null : (cal.ke * chosen.turns) / ctx.original.turns;
  const motor = motorReport(newKe, term.single, hotFactor, cal, series, supply);
  const original_motor = motorReport(cal.ke, ctx.original.terminal20, hotFactor, cal, series, supply);
  let seriesPlan: SeriesPlan | null = null;
  if (seriesSetup) {
    const sp = planSeries(job, seriesSetup, {
      turns: chosen.turns,
      originalTurns: ctx.original.turns,
      armature20: term.single,
      hotTemperature: job.target.hot_temperature,
      convertRatio: ratio,
    });
    seriesPlan = sp.plan;
    warnings.push(...sp.warnings);
  }
  if (series && !warnings.some((w) => w.code === "series_field")) {
    warnings.push({
      code: "series_field",
      path: seriesSetup ? "armature.field" : "field_winding",
      message: seriesSetup
        ? "series (universal) motor: its figures are the series model's (motor.series), not the constant-field ones; locked-rotor figures only at a reduced voltage, never at mains; never run a large series motor unloaded"
        : "series (universal) motor: only what the armature alone determines is predicted (resistance, Ke scaled by turns); give field_winding (the field's resistance, and its inductance or a locked-rotor reading on AC) with a no-load test or the nameplate for the motor's figures; never run a series motor unloaded, it races",
    });
  }
  for (const w of [...motor.warnings]) if (!warnings.some((x) => x.code === w.code)) warnings.push(w);
  const densityNew = (i: number) => i / (ctx.layout.paths * chosen.strands * chosen.wire.area);
  const densityOld = (i: number) => i / (ctx.layout.paths * ctx.original.strands * ctx.original.wire.area);
  const duty = dutyReport(motor.model, supply, job, densityNew);
  const original_duty = dutyReport(original_motor.model, supply, job, densityOld);
  if (job.target.duty && !series) {
    for (const [which, report, m] of [["new", duty, motor], ["original", original_duty, original_motor]] as const) {
      if (report === null && m.model) {
        warnings.push({
          code: "duty_beyond_stall",
          path: "target.duty.torque",
          message: `the ${which} winding cannot carry the ${(job.target.duty.torque * 1e3).toPrecision(3)} mN·m load at ${supply} V: it is beyond its stall torque${m.stallTorque !== null ? ` (${(m.stallTorque * 1e3).toPrecision(3)} mN·m)` : ""}`,
        });
      }
    }
  }

  if (ev.goal === "restore" && ctx.original.copperFill > job.target.limits.copper_fill) {
    warnings.push({
      code: "original_over_limit",
      path: "target.limits.copper_fill",
      message: `the original winding filled ${(ctx.original.copperFill * 100).toFixed(1)} % of the slot with copper, above the ${(job.target.limits.copper_fill * 100).toFixed(0)} % limit; since it fitted, the restore allows up to its own fill`,
    });
  }
  if (ctx.original.copperFill > 0.65) {
    warnings.push({
      code: "original_fill_unusual",
      path: "original",
      message: `the recorded original would fill ${(ctx.original.copperFill * 100).toFixed(0)} % of the free slot area with copper, more than hand winding reaches: check the turns, the wire and the slot size`,
    });
  }

  // sensitivity: one turn more and less, the next wire up and down
  const sens: Sensitivity[] = [];
  const sorted = [...stock.wires].sort((a, b) => a.bare_diameter - b.bare_diameter);
  const idx = sorted.findIndex((w) => w.label === chosen.wire.label);
  const row = (label: string, c: Candidate): Sensitivity => ({
    label,
    turns: c.turns,
    wire: c.wire.label,
    strands: c.strands,
    terminal_ohm: c.terminal_ohm,
    copper_fill: c.copper_fill,
    achieved: c.achieved,
    meets_goal: c.meets_goal,
    rejected_because: c.rejected_because,
  });
  if (chosen.turns > 1) sens.push(row("one turn less", ev.evaluate(chosen.turns - 1, chosen.wire, chosen.strands)));
  sens.push(row("one turn more", ev.evaluate(chosen.turns + 1, chosen.wire, chosen.strands)));
  if (idx > 0) sens.push(row("next wire down", ev.evaluate(chosen.turns, sorted[idx - 1], chosen.strands)));
  if (idx >= 0 && idx < sorted.length - 1) sens.push(row("next wire up", ev.evaluate(chosen.turns, sorted[idx + 1], chosen.strands)));

  const mains = supplyKind === "ac" ? supply > ELV_AC : supply > ELV_DC;
  return {
    job,
    feasible,
    goal: goalReport(ev, chosen, job.target.tolerance),
    layout: ctx.layout,
    slot: ctx.slot,
    design: chosen,
    fill_limit: ev.fillLimit,
    coils,
    paths: ctx.layout.paths,
    resistance: {
      coil_ohm: liveMean,
      bar_to_bar: b2b,
      bar_to_bar_ohm: b2b.reduce((s: number, x: number) => s + x, 0) / b2b.length,
      terminal_ohm: term.single,
      terminal_min_ohm: Math.min(term.min, term.bridged, term.single),
      terminal_max_ohm: Math.max(term.max, term.single),
      terminal_hot_ohm: term.single * hotFactor,
      hot_temperature: job.target.hot_temperature,
      validity,
      terminal_basis: term.validity,
    },
    wire: {
      mlt: mltMean,
      mlt_source: ctx.mltSource,
      per_coil: perCoil,
      winding: windingLen,
      leads,
      cut,
      cut_per_strand: cut / chosen.strands,
      copper_mass: COPPER_DENSITY * chosen.wire.area * cut,
      spare_margin: job.winding.spare_margin,
      lead_allowance: job.winding.lead_allowance,
    },
    calibration: cal,
    series: seriesPlan,
    motor,
    original_motor,
    original: {
      wire: ctx.original.wire,
      turns: ctx.original.turns,
      strands: ctx.original.strands,
      copper_fill: ctx.original.copperFill,
      mlt: ctx.original.mlt,
      terminal_ohm: ctx.original.terminal20,
      terminal_measured: ctx.original.terminalMeasured,
    },
    duty,
    original_duty,
    candidates: result.shown,
    candidates_total: result.total,
    rejections: result.rejections,
    binding,
    sensitivity: sens,
    supply,
    supply_kind: supplyKind,
    mains,
    warnings: dedupeWarnings(warnings),
    learning: options.logbook ? { records: options.logbook.records, moves: options.logbook.moves ?? [] } : null,
  };
}

function dedupeWarnings(ws: Warning[]): Warning[] {
  const seen = new Set<string>();
  return ws.filter((w) => {
    const k = `${w.code}|${w.path}|${w.message}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}
