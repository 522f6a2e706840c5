/**
 * What the plan predicts for the winding actually laid: the planned one, or the turns, wire and
 * strands the measured file says were wound instead. Pure: built from the same pieces `planJob`
 * uses (the armature context, the plan's calibration, the ring network), so for the planned winding
 * the figures are the plan's own (a test holds them equal).
 *
 * Units: SI (Ω, m, V, A, rad/s, N·m); temperatures °C.
 */
import type { Job } from "../job/schema.js";
import type { Plan } from "../design/types.js";
import type { PlanOptions } from "../design/plan.js";
import { buildContext, coilResistance, coilTurnLengths, meanOf, type ArmatureContext } from "../design/context.js";
import { barToBar, terminalResistance } from "../winding/ring.js";
import { resolveWire } from "../wire/catalogue.js";
import type { Wire, WireSpec } from "../wire/types.js";
import { copperFactor } from "../wire/copper.js";
import { noLoad, type MotorModel } from "../motor/model.js";
import { OLD_WIRE_OVERALL_RATIO } from "../design/context.js";
import type { WindingLayout } from "../winding/types.js";

export interface WoundInput {
  turns?: number;
  wire?: WireSpec;
  strands?: number;
}

export interface Prediction {
  turns: number;
  strands: number;
  wire: Wire;
  /** True when the wound winding differs from the plan's. */
  differs: boolean;
  /** What differs, in words ("turns 64 → 58"). */
  differences: string[];
  layout: WindingLayout;
  /** Each coil's resistance at 20 °C, Ω (coil index order; a dead coil's is its wire's). */
  coil_ohm: number[];
  /** Each coil's mean turn length, m. */
  coil_mlt: number[];
  /** Mean turn length over the live coils, m. */
  mlt: number;
  /** Expected bar-to-bar readings r1 … rC at 20 °C, Ω. */
  bar_to_bar: number[];
  /** Terminal resistance at 20 °C, Ω: each brush on a single bar, both bridging, and the range over a turn. */
  terminal: { single: number; bridged: number; min: number; max: number };
  /** Ke of the wound winding, V·s/rad, null when nothing calibrates it. */
  ke: number | null;
  brush_drop: number;
  loss: { tc: number; b: number };
  series: boolean;
  /** The original's turns per coil (Ke scales from it). */
  original_turns: number;
}

/** The armature context as `planJob` sets it up for these options (the logbook's turn-length factor applied). */
export function contextFor(job: Job, options: PlanOptions = {}): ArmatureContext {
  const ctx = buildContext(job);
  if (options.logbook?.mltFactor !== undefined && ctx.mltSource !== "measured") {
    ctx.mltFactor = options.logbook.mltFactor;
    ctx.mltSource = "logbook";
  }
  return ctx;
}

/**
 * Predict the readings of the winding laid: `wound` overrides the plan's turns, wire and strands
 * where given. Coil resistance R = ρ20·N·MLT/(k·A) per coil with its own turn length (DESIGN.md
 * "Coil resistance"), the ring network for bar-to-bar and terminal figures, Ke scaled by turns
 * (Ke_new = Ke_orig·N_new/N_orig, DESIGN.md "Calibration of Ke").
 */
export function predictWound(job: Job, plan: Plan, wound: WoundInput | undefined, options: PlanOptions = {}): Prediction {
  const d = plan.design;
  const turns = wound?.turns ?? d.turns;
  const strands = wound?.strands ?? d.strands;
  const wire = wound?.wire ? resolveWire(wound.wire) : d.wire;
  const differences: string[] = [];
  if (turns !== d.turns) differences.push(`turns ${d.turns} → ${turns}`);
  if (wire.label !== d.wire.label) differences.push(`wire ${d.wire.label} → ${wire.label}`);
  if (strands !== d.strands) differences.push(`strands ${d.strands} → ${strands}`);
  const differs = differences.length > 0;
  let coilOhm: number[];
  let coilMlt: number[];
  let layout: WindingLayout;
  if (!differs) {
    coilOhm = plan.coils.map((c) => c.ohm);
    coilMlt = plan.coils.map((c) => c.mlt);
    layout = plan.layout;
  } else {
    const ctx = contextFor(job, options);
    layout = ctx.layout;
    const overall = wire.overall_diameter ?? wire.bare_diameter * OLD_WIRE_OVERALL_RATIO;
    coilMlt = coilTurnLengths(ctx, turns, strands, overall);
    coilOhm = coilMlt.map((m) => coilResistance(turns, m, strands, wire.area));
  }
  const t = terminalResistance(layout, coilOhm);
  const cal = plan.calibration;
  return {
    turns,
    strands,
    wire,
    differs,
    differences,
    layout,
    coil_ohm: coilOhm,
    coil_mlt: coilMlt,
    mlt: meanOf(coilMlt, layout),
    bar_to_bar: barToBar(layout, coilOhm),
    terminal: { single: t.single, bridged: t.bridged, min: Math.min(t.min, t.bridged, t.single), max: Math.max(t.max, t.single) },
    ke: cal.ke === null ? null : (cal.ke * turns) / plan.original.turns,
    brush_drop: cal.brush_drop,
    loss: cal.loss,
    series: job.armature.field === "series",
    original_turns: plan.original.turns,
  };
}

/** The constant-field motor model of a prediction with the winding at tC °C; null for series fields or without Ke. */
export function modelAt(p: Prediction, tC: number): MotorModel | null {
  if (p.ke === null || p.series) return null;
  return { ke: p.ke, resistance: p.terminal.single * copperFactor(tC), brushDrop: p.brush_drop, loss: p.loss, field: "constant" };
}

/** Predicted no-load speed (rad/s) and current (A) at supply V (V), winding at tC °C (the linear model, DESIGN.md "Steady state"). */
export function predictNoLoad(p: Prediction, V: number, tC: number): { speed: number; current: number } | null {
  const m = modelAt(p, tC);
  if (!m) return null;
  const r = noLoad(m, V);
  return { speed: r.speed, current: r.current };
}

/** Predicted brief stall current (A) at supply V (V), winding at tC °C: (V − V_brush)/R (DESIGN.md "Steady state"). */
export function predictStall(p: Prediction, V: number, tC: number): number {
  return Math.max(0, V - p.brush_drop) / (p.terminal.single * copperFactor(tC));
}
