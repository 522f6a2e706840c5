/**
 * Everything about the armature that does not depend on the candidate: slot geometry, the coil
 * table, core dimensions for the turn-length model and its calibration on the old winding.
 */
import { inputError, type Warning } from "../errors.js";
import type { Job } from "../job/schema.js";
import { slotGeometry, type SlotGeometry } from "../armature/slot.js";
import { bundleThickness, fitEndTurnFactor, lengthFromMass, meanTurnLength, mltFromWireLength, ridingIncrement, type CoreDims } from "../armature/turn.js";
import { copperFill } from "../armature/fill.js";
import { layoutWinding } from "../winding/layout.js";
import type { WindingLayout, WindingSpec } from "../winding/types.js";
import { resolveWire } from "../wire/catalogue.js";
import type { Wire } from "../wire/types.js";
import { COPPER_RESISTIVITY_20, copperFactor } from "../wire/copper.js";
import { terminalResistance } from "../winding/ring.js";
import type { WirePlan } from "./types.js";

/** Overall/bare ratio assumed for the old wire when its insulation is unknown: 1.08 (typical grade 2 of small sizes, from memory). */
export const OLD_WIRE_OVERALL_RATIO = 1.08;

export interface ArmatureContext {
  job: Job;
  slot: SlotGeometry;
  layout: WindingLayout;
  core: CoreDims;
  /** Live coils (a dead coil excluded). */
  liveCoils: number;
  /** Coil sides per slot: tooth 2, lap/wave 2u. */
  sides: number;
  /** Length along which one coil side's turns are laid (for the bundle thickness), m. */
  along: number;
  /** Calibration factor on the end-turn part of the turn-length model. */
  mltFactor: number;
  mltSource: WirePlan["mlt_source"];
  /** The measured turn length when given (used as is), m. */
  mltMeasured: number | null;
  original: {
    wire: Wire;
    turns: number;
    strands: number;
    copperFill: number;
    /** Mean over coils, m. */
    mlt: number;
    coilOhms: number[];
    /** Terminal resistance at 20 °C, Ω: measured (corrected to 20 °C) when given, else computed. */
    terminal20: number;
    terminalComputed20: number;
    terminalMeasured: boolean;
  };
  warnings: Warning[];
}

export function windingSpec(job: Job): WindingSpec {
  const w = job.winding;
  return {
    style: w.style,
    slots: job.armature.slots,
    bars: job.armature.bars,
    poles: job.armature.field_poles,
    span: w.span ?? 1,
    coils_per_slot: w.coils_per_slot,
    dead_coil: w.dead_coil,
    equalizers: w.equalizers,
    progression: w.progression,
    lead_throw: w.lead_throw,
    direction: w.direction,
    brushes: { count: w.brushes.count, width_bars: w.brushes.width_bars },
  };
}

/** Per-coil turn lengths (m) for a build: the base model (or the measured MLT) plus the riding increment in winding order. */
export function coilTurnLengths(ctx: Pick<ArmatureContext, "layout" | "core" | "mltFactor" | "mltMeasured" | "along">, turns: number, strands: number, overall: number): number[] {
  const { layout, core } = ctx;
  const spec = layout.spec;
  const b = bundleThickness(turns, strands, overall, ctx.along);
  if (ctx.mltMeasured !== null) {
    // measured on an old turn: used as is for the mean, riding spread kept around it
    const inc = layout.coils.map((c) => (c.dead ? 0 : ridingIncrement(c.rides_over, spec.coils_per_slot, spec.span, b)));
    const live = layout.coils.filter((c) => !c.dead).length;
    const mean = inc.reduce((s, x) => s + x, 0) / live;
    return inc.map((x) => ctx.mltMeasured! + x - mean);
  }
  const base = meanTurnLength(spec.style, core, spec.span, b, ctx.mltFactor);
  return layout.coils.map((c) => base + (c.dead ? 0 : ridingIncrement(c.rides_over, spec.coils_per_slot, spec.span, b)));
}

export function meanOf(xs: number[], layout: WindingLayout): number {
  let s = 0;
  let n = 0;
  layout.coils.forEach((c, i) => {
    if (!c.dead) {
      s += xs[i];
      n++;
    }
  });
  return s / n;
}

/** Coil resistance at 20 °C (Ω): R = ρ20 · N · MLT / (k · A) (DESIGN.md "Coil resistance"; IEC 60028 ρ). */
export function coilResistance(turns: number, mlt: number, strands: number, area: number): number {
  return (COPPER_RESISTIVITY_20 * turns * mlt) / (strands * area);
}

export function buildContext(job: Job): ArmatureContext {
  const warnings: Warning[] = [];
  const slot = slotGeometry(job);
  if (slot.free_area <= 0) {
    throw makeError("armature.slot.liner", `the liner (${(slot.liner * 1e3).toFixed(3)} mm over a ${(slot.perimeter * 1e3).toFixed(1)} mm wall) takes all of the slot's ${(slot.gross_area * 1e6).toFixed(2)} mm²; check the liner thickness and the slot area`);
  }
  if (slot.perimeter_estimated) {
    warnings.push({
      code: "perimeter_estimated",
      path: "armature.slot.perimeter",
      message: `slot perimeter not given: estimated as ${(slot.perimeter * 1e3).toFixed(1)} mm from the area for the liner; measure it for a better free area`,
    });
  }
  const layout = layoutWinding(windingSpec(job));
  warnings.push(...layout.warnings);
  const a = job.armature;
  const depth = slot.depth ?? Math.sqrt(slot.gross_area);
  if (slot.depth === null) {
    warnings.push({
      code: "slot_depth_estimated",
      path: "armature.slot",
      message: `slot depth not known (area only): taken as ${(depth * 1e3).toFixed(2)} mm (√area) for the coil build; the layer-build check is skipped`,
    });
  }
  let toothWidth = a.tooth_width;
  if (toothWidth === undefined && job.winding.style !== "tooth") {
    toothWidth = 0; // the lap and wave end-turn model does not use the tooth width
  } else if (toothWidth === undefined) {
    const meanSlotWidth = slot.width_top !== null && slot.width_bottom !== null ? (slot.width_top + slot.width_bottom) / 2 : slot.gross_area / depth;
    toothWidth = Math.max((Math.PI * (a.rotor_diameter - depth)) / a.slots - meanSlotWidth, 0.2 * (Math.PI * a.rotor_diameter) / a.slots);
    warnings.push({
      code: "tooth_width_estimated",
      path: "armature.tooth_width",
      message: `tooth width not given: estimated as ${(toothWidth * 1e3).toFixed(2)} mm from the rotor diameter and slot size; measure it with calipers`,
    });
  }
  const core: CoreDims = { stack: a.stack_length, rotorDiameter: a.rotor_diameter, slots: a.slots, toothWidth, slotDepth: depth, liner: slot.liner };
  const liveCoils = layout.coils.filter((c) => !c.dead).length;
  const sides = layout.coil_sides_per_slot;
  const along = job.winding.style === "tooth" ? Math.max(depth - 2 * slot.liner, depth * 0.5) : Math.max(depth - slot.liner, depth * 0.5);

  // the original winding
  const o = job.original;
  const oWire = resolveWire(o.wire);
  const oOverall = oWire.overall_diameter ?? oWire.bare_diameter * OLD_WIRE_OVERALL_RATIO;
  const oFill = copperFill(sides * o.turns * o.strands, oWire.area, slot.free_area);
  const oBuild = bundleThickness(o.turns, o.strands, oOverall, along);

  // calibration of the turn length: measured MLT, else wire pulled off (length, mass), else model
  let mltFactor = 1;
  let mltSource: WirePlan["mlt_source"] = "model";
  let mltMeasured: number | null = null;
  const partial = { layout, core, mltFactor: 1, mltMeasured: null as number | null, along };
  const riding = (b: number) => meanOf(layout.coils.map((c) => (c.dead ? 0 : ridingIncrement(c.rides_over, layout.spec.coils_per_slot, layout.spec.span, b))), layout);
  let oldMlt: number | null = null;
  if (job.winding.mean_turn_length !== undefined) {
    mltMeasured = job.winding.mean_turn_length;
    mltSource = "measured";
  } else if (o.wire_length !== undefined) {
    oldMlt = mltFromWireLength(o.wire_length, o.strands, o.turns, liveCoils);
    mltSource = "wire_length";
  } else if (o.wire_mass !== undefined) {
    oldMlt = mltFromWireLength(lengthFromMass(o.wire_mass, oWire.bare_diameter), o.strands, o.turns, liveCoils);
    mltSource = "wire_mass";
  }
  if (oldMlt !== null) {
    mltFactor = fitEndTurnFactor(oldMlt - riding(oBuild), layout.spec.style, core, layout.spec.span, oBuild);
    if (!(mltFactor > 0)) {
      throw makeError(
        mltSource === "wire_length" ? "original.wire_length" : "original.wire_mass",
        `the old wire gives ${(oldMlt * 1e3).toFixed(1)} mm a turn, less than the two sides along the ${(core.stack * 1e3).toFixed(1)} mm stack (${(2 * core.stack * 1e3).toFixed(1)} mm); check the wire ${mltSource === "wire_length" ? "length" : "mass"}, the turns and the stack length`,
      );
    }
    if (mltFactor < 0.4 || mltFactor > 2.5) {
      warnings.push({
        code: "turn_length_unusual",
        path: mltSource === "wire_length" ? "original.wire_length" : "original.wire_mass",
        message: `the old wire implies end turns ${mltFactor.toFixed(2)} × the model's; check the recorded ${mltSource === "wire_length" ? "length" : "mass"} and turns`,
      });
    }
  }
  partial.mltFactor = mltFactor;
  partial.mltMeasured = mltMeasured;
  let oMlts = coilTurnLengths(partial, o.turns, o.strands, oOverall);
  let oCoilOhms = oMlts.map((m) => coilResistance(o.turns, m, o.strands, oWire.area));
  let terminalComputed20 = terminalResistance(layout, oCoilOhms).single;
  let terminal20 = terminalComputed20;
  let terminalMeasured = false;
  if (o.terminal_resistance) {
    terminalMeasured = true;
    terminal20 = o.terminal_resistance.value / copperFactor(o.terminal_resistance.at);
    if (mltSource === "model") {
      // no wire pulled off: the measured resistance gives the effective turn length
      const scale = terminal20 / terminalComputed20;
      const effMlt = meanOf(oMlts, layout) * scale;
      mltFactor = fitEndTurnFactor(effMlt - riding(oBuild), layout.spec.style, core, layout.spec.span, oBuild);
      if (mltFactor > 0) {
        mltSource = "terminal_resistance";
        partial.mltFactor = mltFactor;
        oMlts = coilTurnLengths(partial, o.turns, o.strands, oOverall);
        oCoilOhms = oMlts.map((m) => coilResistance(o.turns, m, o.strands, oWire.area));
        terminalComputed20 = terminalResistance(layout, oCoilOhms).single;
      } else {
        mltFactor = 1;
      }
    }
    const dev = terminal20 / terminalComputed20 - 1;
    if (Math.abs(dev) > 0.1) {
      warnings.push({
        code: "resistance_disagrees",
        path: "original.terminal_resistance",
        message: `the measured terminal resistance (${terminal20.toFixed(4)} Ω at 20 °C) is ${(dev * 100).toFixed(0)} % from the ${terminalComputed20.toFixed(4)} Ω the recorded turns, wire and turn length give; the measured value is used for the original motor`,
      });
    }
  }
  if (mltSource === "model") {
    warnings.push({
      code: "turn_length_model",
      path: "winding.mean_turn_length",
      message: "turn length from the end-turn model alone (no measured turn, old wire length or mass, or terminal resistance): wire lengths and resistances may be off by 10 to 20 %",
    });
  }
  return {
    job,
    slot,
    layout,
    core,
    liveCoils,
    sides,
    along,
    mltFactor,
    mltSource,
    mltMeasured,
    original: {
      wire: oWire,
      turns: o.turns,
      strands: o.strands,
      copperFill: oFill,
      mlt: meanOf(oMlts, layout),
      coilOhms: oCoilOhms,
      terminal20,
      terminalComputed20,
      terminalMeasured,
    },
    warnings,
  };
}

function makeError(path: string, message: string) {
  return inputError("inconsistent_geometry", path, message);
}

