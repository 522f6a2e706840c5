/**
 * One candidate winding (turns × wire × strands in hand): does it fit, what does it measure,
 * what will it do, and how close does it come to the goal. Pure and fast: the sweep calls it
 * hundreds of thousands of times.
 */
import { HEX_PACKING, copperFill, spaceFill } from "../armature/fill.js";
import { passesOpening, slotLayerBuild, toothLayerBuild, type LayerBuild } from "../armature/build.js";
import { bundleThickness, meanTurnLength, ridingIncrement } from "../armature/turn.js";
import { copperFactor, COPPER_DENSITY } from "../wire/copper.js";
import type { Wire } from "../wire/types.js";
import { terminalResistance } from "../winding/ring.js";
import type { ArmatureContext } from "./context.js";
import { coilResistance } from "./context.js";
import type { Calibration, Candidate, GoalKind, RejectCode } from "./types.js";

/** Share of the target copper area a restore may fall short by: 3 % (DESIGN.md, "Choosing among candidates"). */
export const RESTORE_MIN_AREA = 0.97;

export interface Evaluator {
  evaluate(turns: number, wire: Wire, strands: number): Candidate;
  /** Copper fill limit in force. */
  fillLimit: number;
  goal: GoalKind;
  /** Target in SI (rad/s, rad/s per V as Kv rpm/V converted, A, rad/s for duty speed, m² for restore). */
  target: number;
  /** Terminal resistance of a ring of equal coils of 1 Ω (brushes each on one bar). */
  ringFactor: number;
  supply: number;
}

/**
 * `convertRatio`: goal convert's turns ratio (design/series.ts): the copper area aimed at is the
 * original's ÷ the ratio (the same copper in the slot), judged as a restore is.
 */
export function makeEvaluator(ctx: ArmatureContext, cal: Calibration, supply: number, convertRatio: number | null = null): Evaluator {
  const job = ctx.job;
  const t = job.target;
  const lim = t.limits;
  const goal = t.goal;
  const likeRestore = goal === "restore" || goal === "convert";
  const fillLimit = likeRestore ? Math.max(lim.copper_fill, ctx.original.copperFill) : lim.copper_fill;
  const spaceLimit = Math.min(lim.space_fill, HEX_PACKING);
  const spec = ctx.layout.spec;
  const layout = ctx.layout;
  const ones = layout.coils.map(() => 1);
  const ringFactor = terminalResistance(layout, ones).single;
  const rides = layout.coils.filter((c) => !c.dead).map((c) => c.rides_over);
  const hotFactor = copperFactor(t.hot_temperature);
  const slot = ctx.slot;
  const trapezoid = slot.depth !== null && slot.width_top !== null && slot.width_bottom !== null;
  const series = job.armature.field === "series";
  const keOrig = cal.ke;
  const nOrig = ctx.original.turns;
  const origArea = ctx.original.strands * ctx.original.wire.area;
  const paths = layout.paths;
  const densityCurrent = t.rated_current ?? null;
  const tol = t.tolerance;

  let target: number;
  switch (goal) {
    case "restore":
      target = origArea;
      break;
    case "convert":
      target = origArea / (convertRatio ?? 1);
      break;
    case "no_load_speed":
      target = t.no_load_speed!;
      break;
    case "kv":
      target = t.kv!;
      break;
    case "stall_current":
      target = t.stall_current!;
      break;
    case "duty":
      target = t.duty!.speed;
      break;
  }

  // the riding increment is linear in the bundle thickness b (below its cap): precompute its mean factor
  let ridingPerBundle = 0;
  for (const r of rides) ridingPerBundle += ridingIncrement(r, spec.coils_per_slot, spec.span, 1);
  ridingPerBundle /= rides.length;
  const brushDrop = cal.brush_drop;
  const Vd = Math.max(0, supply - brushDrop);
  const tc = cal.loss.tc;
  const bLoss = cal.loss.b;

  function meanMlt(turns: number, strands: number, overall: number): number {
    if (ctx.mltMeasured !== null) return ctx.mltMeasured;
    const b = bundleThickness(turns, strands, overall, ctx.along);
    return meanTurnLength(spec.style, ctx.core, spec.span, b, ctx.mltFactor) + ridingPerBundle * b;
  }

  function evaluate(turns: number, wire: Wire, strands: number): Candidate {
    const reasons: RejectCode[] = [];
    const conductors = ctx.sides * turns * strands;
    const cf = copperFill(conductors, wire.area, slot.free_area);
    if (cf > fillLimit + 1e-12) reasons.push("copper_fill");
    const overall = wire.overall_diameter;
    let sf: number | null = null;
    let build: LayerBuild | null = null;
    if (overall === null) {
      reasons.push("overall_unknown");
    } else {
      sf = spaceFill(conductors, overall, slot.free_area);
      if (sf > spaceLimit + 1e-12) reasons.push("space_fill");
      if (!passesOpening(overall, strands, slot.opening)) reasons.push("slot_opening");
      if (trapezoid) {
        build =
          spec.style === "tooth"
            ? toothLayerBuild(turns, strands, overall, slot.depth!, slot.width_bottom!, slot.liner)
            : slotLayerBuild(conductors, overall, slot.depth!, slot.width_top!, slot.width_bottom!, slot.liner);
        if (!build.fits) reasons.push("layer_build");
      }
    }
    const mlt = meanMlt(turns, strands, overall ?? wire.bare_diameter * 1.08);
    const coilOhm = coilResistance(turns, mlt, strands, wire.area);
    const terminal = coilOhm * ringFactor;
    const terminalHot = terminal * hotFactor;
    const copperMass = COPPER_DENSITY * wire.area * strands * turns * mlt * ctx.liveCoils;

    let ke: number | null = null;
    let achieved: number | null = null;
    let stallHot: number | null = null;
    let stallCold: number | null = null;
    let density: number | null = null;
    let dutyInput: number | null = null;
    if (keOrig !== null) ke = (keOrig * turns) / nOrig;
    // steady state of the linear model (DESIGN.md; motor/model.ts): stall I = (V − V_b)/R;
    // no load: V_d = Ke·ω + I·R with Kt·I = T_c + B·ω  →  ω0 = (Ke·V_d − R·T_c)/(Ke² + R·B)
    // a series motor has no stall figure from the armature alone (the field is in the circuit): design/series.ts
    if (ke !== null && !series) {
      stallHot = Vd / terminalHot;
      stallCold = Vd / terminal;
    }
    let dutyCurrent: number | null = null;
    switch (goal) {
      case "restore":
      case "convert":
        achieved = strands * wire.area;
        break;
      case "no_load_speed":
        if (ke !== null && !series) achieved = Math.max(0, (ke * Vd - terminal * tc) / (ke * ke + terminal * bLoss));
        break;
      case "kv":
        if (ke !== null) achieved = 1 / ke; // Kv in rad/s per volt (60/(2π·Ke) rpm/V)
        break;
      case "stall_current":
        achieved = stallCold;
        break;
      case "duty": {
        if (ke !== null && !series) {
          const T = t.duty!.torque;
          // at load torque T: Kt·I = T + T_c + B·ω and V_d = Ke·ω + I·R_hot
          const speed = (ke * Vd - terminalHot * (T + tc)) / (ke * ke + terminalHot * bLoss);
          if (speed > 0) {
            const current = (T + tc + bLoss * speed) / ke;
            achieved = speed;
            dutyCurrent = current;
            dutyInput = supply * current;
          } else {
            achieved = 0;
          }
        }
        break;
      }
    }
    const dc = dutyCurrent ?? densityCurrent;
    if (dc !== null) density = dc / (paths * strands * wire.area);
    if (lim.current_density !== undefined && density !== null && density > lim.current_density) reasons.push("current_density");
    if (lim.hot_stall_current !== undefined && stallHot !== null && stallHot > lim.hot_stall_current) reasons.push("hot_stall_current");
    let error: number | null = achieved === null ? null : (achieved - target) / target;
    let meets = false;
    if (error !== null) {
      if (likeRestore) {
        if (achieved! < RESTORE_MIN_AREA * target) reasons.push("below_original_copper");
        meets = achieved! >= RESTORE_MIN_AREA * target;
      } else if (goal === "stall_current") {
        // "at most this much", hot and cold: the cold (larger) stall current within the tolerance below the limit, never above it
        meets = error <= 1e-12 && error >= -tol;
      } else meets = Math.abs(error) <= tol;
    }
    if (error !== null && !Number.isFinite(error)) error = null;
    return {
      turns,
      strands,
      wire,
      copper_fill: cf,
      space_fill: sf,
      build,
      mlt,
      coil_ohm: coilOhm,
      terminal_ohm: terminal,
      terminal_hot_ohm: terminalHot,
      ke,
      achieved,
      error,
      meets_goal: meets && reasons.length === 0,
      rejected_because: reasons,
      copper_mass: copperMass,
      current_density: density,
      stall_current_hot: stallHot,
      stall_current_cold: stallCold,
      duty_input_w: dutyInput,
    };
  }

  return { evaluate, fillLimit, goal, target, ringFactor, supply };
}
