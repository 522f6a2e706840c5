/**
 * What the plan predicts for the winding actually laid: the planned one, or the turns, wire and
 * strands the measured file says were wound instead. Pure: the full evaluation of that winding
 * (src/design/evaluate.ts) on the same armature (the logbook's correction applied as the plan
 * applied it) with the plan's calibration; nothing is copied from the plan, so a test comparing
 * the two compares two computations.
 *
 * Units: SI (Ω, m, V, A, rad/s, N·m); temperatures °C.
 */
import type { Job } from "../job/schema.js";
import type { Plan } from "../design/types.js";
import type { PlanOptions } from "../design/plan.js";
import { buildContext, type ArmatureContext } from "../design/context.js";
import { evaluateWinding, type FullEvaluation } from "../design/evaluate.js";
import { motorPhysicsFor } from "../design/motor.js";
import { resolveWire } from "../wire/catalogue.js";
import type { Wire, WireSpec } from "../wire/types.js";
import { copperFactor } from "../wire/copper.js";
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
  terminal: { single: number; bridged: number; min: number | null; max: number };
  /** Ke of the wound winding, V·s/rad, null when nothing calibrates it. */
  ke: number | null;
  brush_drop: number;
  loss: { tc: number; b: number };
  series: boolean;
  /** The original's turns per coil (Ke scales from it). */
  original_turns: number;
  /** The full evaluation this prediction reads (the plan's own when nothing differs). */
  evaluation: FullEvaluation;
  /** The job (for the motor model of its field). */
  job: Job;
  calibration: Plan["calibration"];
}

/** The armature as `planJob` builds it for these options (the logbook's turn-length factor applied). */
export function contextFor(job: Job, options: PlanOptions = {}): ArmatureContext {
  return buildContext(job, { mltFactor: options.logbook?.mltFactor });
}

/**
 * Predict the readings of the winding laid: `wound` overrides the plan's turns, wire and strands
 * where given; the full evaluation of that winding (each coil R = ρ20·N·MLT/(k·A) with its own
 * turn length, the ring network, Ke scaled by turns) with the plan's calibration.
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
  const ctx = contextFor(job, options);
  const cal = plan.calibration;
  const e = evaluateWinding(ctx, cal, { turns, wire, strands }, "full");
  return {
    turns,
    strands,
    wire,
    differs: differences.length > 0,
    differences,
    layout: ctx.layout,
    coil_ohm: e.coil_ohms,
    coil_mlt: e.coil_mlt,
    mlt: e.mlt,
    bar_to_bar: e.ring.bar_to_bar,
    terminal: { single: e.ring.single, bridged: e.ring.bridged, min: e.ring.min, max: e.ring.max },
    ke: e.ke,
    brush_drop: cal.brush_drop,
    loss: cal.loss,
    series: job.armature.field === "series",
    original_turns: ctx.original.turns,
    evaluation: e,
    job,
    calibration: cal,
  };
}

/**
 * Predicted no-load speed (rad/s) and current (A) at supply V (V), winding at tC °C (the job's motor
 * model); null when it cannot predict one: no Ke, a series DC motor (never run unloaded), a series
 * field the job does not describe. A universal motor's is its brief run in its housing (the card's).
 */
export function predictNoLoad(p: Prediction, V: number, tC: number): { speed: number; current: number | null } | null {
  const physics = motorPhysicsFor(p.job, p.calibration, p.original_turns);
  if (!physics.canPredict(p.ke)) return null;
  return physics.noLoad(p.ke, p.turns, p.terminal.single, copperFactor(tC), V);
}

/**
 * Predicted current with the rotor held (A) at supply V (V), winding at tC °C, from the job's motor
 * model (src/design/motor.ts `lockedRotor`): (V − V_brush)/R for a constant field; a series motor's
 * through armature and field (and on AC their reactance) at the card's check frequency; null when the
 * model cannot say (a series field the job does not describe).
 */
export function predictStall(p: Prediction, V: number, tC: number): number | null {
  return motorPhysicsFor(p.job, p.calibration, p.original_turns).lockedRotor(p.turns, p.terminal.single, copperFactor(tC), V);
}
