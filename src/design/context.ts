/**
 * The armature as the evaluation sees it: everything that does not depend on the candidate winding
 * (slot geometry, the coil table, core dimensions for the turn-length model and the model's
 * calibration on the old winding, a logbook correction included). Built once per job and never
 * changed afterwards (frozen): a different correction is a different armature.
 */
import { inputError, type Warning } from "../errors.js";
import type { Job, SupplyKind } from "../job/schema.js";
import { slotGeometry, type SlotGeometry } from "../armature/slot.js";
import {
  bundleThickness,
  fitEndTurnFactor,
  lengthFromEnamelledMass,
  meanTurnLength,
  mltFromWireLength,
  ridingIncrement,
  type CoreDims,
} from "../armature/turn.js";
import { copperFill } from "../armature/fill.js";
import { layoutWinding } from "../winding/layout.js";
import { layoutJobSpec } from "../winding/spec.js";
import type { WindingLayout, WindingSpec } from "../winding/types.js";
import { commonOverall, resolveWire } from "../wire/catalogue.js";
import type { Wire } from "../wire/types.js";
import { COPPER_RESISTIVITY_20, copperFactor } from "../wire/copper.js";
import { terminalResistance } from "../winding/ring.js";
import type { WirePlan } from "./types.js";

type LaidWire = Pick<Wire, "label" | "system" | "size" | "bare_diameter" | "overall_diameter" | "overall_source">;

/** The overall diameter a wire is laid at, m: `layingOverall`'s figure without its wording (the sweep asks it of every candidate). */
export function layingDiameter(wire: LaidWire): number {
  return wire.overall_diameter ?? commonOverall(wire).value;
}

/**
 * The overall diameter (m) the turn-length model lays a wire at, and the sentence that says where it
 * came from: the wire's own (its IEC 60317 grade or NEMA film build in the catalogue, or measured)
 * when known; a wire named by its copper alone (an original "0.22 mm") is taken as the common
 * motor-winding wire of its size (src/wire/catalogue.ts `commonOverall`: grade 2, AWG heavy build).
 */
export function layingOverall(wire: LaidWire): {
  overall: number;
  basis: string;
} {
  if (wire.overall_diameter !== null)
    return { overall: wire.overall_diameter, basis: `${wire.label}: ${(wire.overall_diameter * 1e3).toFixed(4)} mm overall (${wire.overall_source})` };
  const c = commonOverall(wire);
  return {
    overall: c.value,
    basis: `${wire.label}: insulation not given, taken as ${c.insulation}, ${(c.value * 1e3).toFixed(4)} mm overall (${c.source}); give the grade or build, or { bare, overall } measured`,
  };
}

/** The turn-length model's calibration: factor on the end-turn part, where it came from, a measured turn. */
export interface TurnLengthCalibration {
  /** Calibration factor on the end-turn part of the turn-length model. */
  readonly mltFactor: number;
  readonly mltSource: WirePlan["mlt_source"];
  /** The measured turn length when given (used as is), m. */
  readonly mltMeasured: number | null;
}

/** What the turn-length model needs of the armature: layout, core, the length a coil side is laid along, its calibration. */
export interface TurnLengthGeometry extends TurnLengthCalibration {
  readonly layout: WindingLayout;
  readonly core: CoreDims;
  /** Length along which one coil side's turns are laid (for the bundle thickness), m. */
  readonly along: number;
}

/** The original winding as recorded, with its figures at 20 °C. */
export interface OriginalFigures {
  readonly wire: Wire;
  /** Overall diameter the old build is laid at, m, and which source gave it. */
  readonly overall: number;
  readonly overallBasis: string;
  readonly turns: number;
  readonly strands: number;
  readonly copperFill: number;
  /** Mean over live coils, m. */
  readonly mlt: number;
  readonly coilOhms: readonly number[];
  /** Terminal resistance at 20 °C, Ω: measured (corrected to 20 °C) when given, else computed. */
  readonly terminal20: number;
  readonly terminalComputed20: number;
  readonly terminalMeasured: boolean;
}

export interface ArmatureContext extends TurnLengthGeometry {
  readonly job: Job;
  readonly slot: SlotGeometry;
  /** Live coils (a dead coil excluded). */
  readonly liveCoils: number;
  /** Coils wound (a wave winding's dead coil included: it is wound and cut like the others). */
  readonly woundCoils: number;
  /** Coil sides per slot: tooth 2, lap/wave 2u. */
  readonly sides: number;
  readonly original: OriginalFigures;
  readonly warnings: readonly Warning[];
}

export interface ContextOptions {
  /** End-turn factor learnt from the logbook of the same family (src/logbook/learn.ts); wins unless the turn length is measured. */
  mltFactor?: number;
}

/** The supply of the job: volts (DC, or AC r.m.s.) and its kind. */
export function supplyOf(job: Job): { volts: number; kind: SupplyKind } {
  const s = job.target.supply;
  return typeof s === "number" ? { volts: s, kind: "dc" } : { volts: s.value, kind: s.kind };
}

/** The winding spec of a full job (src/winding/layout-job.ts reads it for full and layout-only jobs alike). */
export function windingSpec(job: Job): WindingSpec {
  return layoutJobSpec(job);
}

/** Riding increments (m) of each coil for a bundle b (m): 0 for a dead coil (src/armature/turn.ts `ridingIncrement`). */
function ridingIncrements(layout: WindingLayout, b: number): number[] {
  const spec = layout.spec;
  return layout.coils.map((c) => (c.dead ? 0 : ridingIncrement(c.rides_over, spec.coils_per_slot, spec.span, b)));
}

/**
 * Per-coil turn lengths (m) for a build of `turns` × `strands` wires of overall diameter `overall` (m):
 * the base model 2L + f·end turns (or the measured MLT) plus the riding increment in winding order
 * (src/armature/turn.ts; docs/contracts.md "Mean length of turn").
 */
export function coilTurnLengths(geo: TurnLengthGeometry, turns: number, strands: number, overall: number): number[] {
  const { layout, core } = geo;
  const spec = layout.spec;
  const b = bundleThickness(turns, strands, overall, geo.along);
  const inc = ridingIncrements(layout, b);
  if (geo.mltMeasured !== null) {
    // measured on an old turn: used as is for the mean, riding spread kept around it
    const mean = meanOf(inc, layout);
    return inc.map((x) => geo.mltMeasured! + x - mean);
  }
  const base = meanTurnLength(spec.style, core, spec.span, b, geo.mltFactor);
  return inc.map((x) => base + x);
}

/** Mean of a per-coil figure over the live coils. */
export function meanOf(xs: readonly number[], layout: WindingLayout): number {
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

/** Coil resistance at 20 °C (Ω): R = ρ20 · N · MLT / (k · A) (docs/contracts.md "Coil resistance"; IEC 60028 ρ). */
export function coilResistance(turns: number, mlt: number, strands: number, area: number): number {
  return (COPPER_RESISTIVITY_20 * turns * mlt) / (strands * area);
}

/** The slot's free area after the liner, refused when the liner takes it all; a warning when the perimeter was estimated. */
function checkedSlot(job: Job, warnings: Warning[]): SlotGeometry {
  const slot = slotGeometry(job);
  if (slot.free_area <= 0) {
    throw makeError(
      "armature.slot.liner",
      `the liner (${(slot.liner * 1e3).toFixed(3)} mm over a ${(slot.perimeter * 1e3).toFixed(1)} mm wall) takes all of the slot's ${(slot.gross_area * 1e6).toFixed(2)} mm²; check the liner thickness and the slot area`,
    );
  }
  if (slot.perimeter_estimated) {
    warnings.push({
      code: "perimeter_estimated",
      path: "armature.slot.perimeter",
      message: `slot perimeter not given: estimated as ${(slot.perimeter * 1e3).toFixed(1)} mm from the area for the liner; measure it for a better free area`,
    });
  }
  return slot;
}

/**
 * Core dimensions for the turn-length model (m): slot depth (√area when only the area is known),
 * tooth width (estimated from the rotor and slot when a tooth winding does not give it), and the
 * length a coil side is laid along (tooth: depth less two liners; lap/wave: depth less one).
 */
function coreGeometry(job: Job, slot: SlotGeometry, warnings: Warning[]): { core: CoreDims; along: number } {
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
    toothWidth = Math.max((Math.PI * (a.rotor_diameter - depth)) / a.slots - meanSlotWidth, (0.2 * (Math.PI * a.rotor_diameter)) / a.slots);
    warnings.push({
      code: "tooth_width_estimated",
      path: "armature.tooth_width",
      message: `tooth width not given: estimated as ${(toothWidth * 1e3).toFixed(2)} mm from the rotor diameter and slot size; measure it with calipers`,
    });
  }
  const core: CoreDims = { stack: a.stack_length, rotorDiameter: a.rotor_diameter, slots: a.slots, toothWidth, slotDepth: depth, liner: slot.liner };
  const along = job.winding.style === "tooth" ? Math.max(depth - 2 * slot.liner, depth * 0.5) : Math.max(depth - slot.liner, depth * 0.5);
  return { core, along };
}

/**
 * The end-turn factor that makes the model's mean turn of the old build (bundle `oldBuild`, m) equal
 * `oldMlt` (m): f = (MLT − riding − 2L) / end-turn model (src/armature/turn.ts `fitEndTurnFactor`).
 */
export function fitToOldTurn(geo: Omit<TurnLengthGeometry, keyof TurnLengthCalibration>, oldMlt: number, oldBuild: number): number {
  const spec = geo.layout.spec;
  return fitEndTurnFactor(oldMlt - meanOf(ridingIncrements(geo.layout, oldBuild), geo.layout), spec.style, geo.core, spec.span, oldBuild);
}

/**
 * Calibration of the turn length from the job alone: the measured turn, else the old wire pulled
 * off (its length, or its weighed mass, enamel and all, over the mass of a metre of the enamelled
 * wire), else the model (factor 1). The old wire is all the coils wound, a dead coil included.
 */
function turnLengthFromJob(
  job: Job,
  geo: Omit<TurnLengthGeometry, keyof TurnLengthCalibration>,
  woundCoils: number,
  oWire: Wire,
  oldOverall: number,
  oldBuild: number,
  warnings: Warning[],
): TurnLengthCalibration {
  const o = job.original;
  if (job.winding.mean_turn_length !== undefined) return { mltFactor: 1, mltSource: "measured", mltMeasured: job.winding.mean_turn_length };
  let oldMlt: number;
  let source: "wire_length" | "wire_mass";
  if (o.wire_length !== undefined) {
    oldMlt = mltFromWireLength(o.wire_length, o.strands, o.turns, woundCoils);
    source = "wire_length";
  } else if (o.wire_mass !== undefined) {
    oldMlt = mltFromWireLength(lengthFromEnamelledMass(o.wire_mass, oWire.bare_diameter, oldOverall), o.strands, o.turns, woundCoils);
    source = "wire_mass";
  } else return { mltFactor: 1, mltSource: "model", mltMeasured: null };
  const path = source === "wire_length" ? "original.wire_length" : "original.wire_mass";
  const what = source === "wire_length" ? "length" : "mass";
  const f = fitToOldTurn(geo, oldMlt, oldBuild);
  if (!(f > 0)) {
    throw makeError(
      path,
      `the old wire gives ${(oldMlt * 1e3).toFixed(1)} mm a turn, less than the two sides along the ${(geo.core.stack * 1e3).toFixed(1)} mm stack (${(2 * geo.core.stack * 1e3).toFixed(1)} mm); check the wire ${what}, the turns and the stack length`,
    );
  }
  if (f < 0.4 || f > 2.5) {
    warnings.push({
      code: "turn_length_unusual",
      path,
      message: `the old wire implies end turns ${f.toFixed(2)} × the model's; check the recorded ${what} and turns`,
    });
  }
  return { mltFactor: f, mltSource: source, mltMeasured: null };
}

/** The original's coil turn lengths (m), coil resistances (Ω, 20 °C) and computed terminal resistance (Ω, 20 °C). */
function originalChain(geo: TurnLengthGeometry, job: Job, overall: number, oWire: Wire) {
  const o = job.original;
  const mlts = coilTurnLengths(geo, o.turns, o.strands, overall);
  const ohms = mlts.map((m) => coilResistance(o.turns, m, o.strands, oWire.area));
  return { mlts, ohms, terminal: terminalResistance(geo.layout, ohms).single };
}

/**
 * With no wire pulled off and no measured turn, a measured terminal resistance calibrates the turn
 * length: the effective mean turn is the model's scaled by measured/computed resistance (R ∝ MLT).
 */
function fitToTerminal(geo: TurnLengthGeometry, job: Job, overall: number, oWire: Wire, oldBuild: number, terminal20: number): TurnLengthCalibration | null {
  const first = originalChain(geo, job, overall, oWire);
  const effMlt = meanOf(first.mlts, geo.layout) * (terminal20 / first.terminal);
  const f = fitToOldTurn(geo, effMlt, oldBuild);
  return f > 0 ? { mltFactor: f, mltSource: "terminal_resistance", mltMeasured: null } : null;
}

/**
 * Build the armature for a job: slot, coil table, core, the turn-length calibration (the job's own,
 * replaced by the logbook's factor when given and the turn is not measured) and the original
 * winding's figures with that calibration. Pure; frozen.
 */
export function buildContext(job: Job, options: ContextOptions = {}): ArmatureContext {
  const warnings: Warning[] = [];
  const slot = checkedSlot(job, warnings);
  const layout = layoutWinding(windingSpec(job));
  warnings.push(...layout.warnings);
  const { core, along } = coreGeometry(job, slot, warnings);
  const liveCoils = layout.coils.filter((c) => !c.dead).length;
  const woundCoils = layout.coils.length;
  const sides = layout.coil_sides_per_slot;
  const o = job.original;
  const oWire = resolveWire(o.wire);
  const { overall: oOverall, basis: overallBasis } = layingOverall(oWire);
  const oldBuild = bundleThickness(o.turns, o.strands, oOverall, along);
  const shape = { layout, core, along };
  let cal = turnLengthFromJob(job, shape, woundCoils, oWire, oOverall, oldBuild, warnings);
  const terminalMeasured = o.terminal_resistance !== undefined;
  const measured20 = o.terminal_resistance ? o.terminal_resistance.value / copperFactor(o.terminal_resistance.at) : null;
  if (measured20 !== null && cal.mltSource === "model") cal = fitToTerminal({ ...shape, ...cal }, job, oOverall, oWire, oldBuild, measured20) ?? cal;
  if (options.mltFactor !== undefined && cal.mltSource !== "measured") cal = { mltFactor: options.mltFactor, mltSource: "logbook", mltMeasured: null };
  const geo: TurnLengthGeometry = { ...shape, ...cal };
  const chain = originalChain(geo, job, oOverall, oWire);
  const terminal20 = measured20 ?? chain.terminal;
  turnLengthWarnings(cal, measured20, chain.terminal, warnings);
  const original: OriginalFigures = Object.freeze({
    wire: oWire,
    overall: oOverall,
    overallBasis,
    turns: o.turns,
    strands: o.strands,
    copperFill: copperFill(sides * o.turns * o.strands, oWire.area, slot.free_area),
    mlt: meanOf(chain.mlts, layout),
    coilOhms: Object.freeze(chain.ohms),
    terminal20,
    terminalComputed20: chain.terminal,
    terminalMeasured,
  });
  return Object.freeze({ job, slot, layout, core, along, liveCoils, woundCoils, sides, ...cal, original, warnings: Object.freeze(warnings) });
}

/** Warnings on the turn length: a measured terminal resistance far from the computed one; the model alone. */
function turnLengthWarnings(cal: TurnLengthCalibration, measured20: number | null, computed20: number, warnings: Warning[]): void {
  if (measured20 !== null) {
    const dev = measured20 / computed20 - 1;
    if (Math.abs(dev) > 0.1) {
      warnings.push({
        code: "resistance_disagrees",
        path: "original.terminal_resistance",
        message: `the measured terminal resistance (${measured20.toFixed(4)} Ω at 20 °C) is ${(dev * 100).toFixed(0)} % from the ${computed20.toFixed(4)} Ω the recorded turns, wire and turn length give; the measured value is used for the original motor`,
      });
    }
  }
  if (cal.mltSource === "model") {
    warnings.push({
      code: "turn_length_model",
      path: "winding.mean_turn_length",
      message:
        "turn length from the end-turn model alone (no measured turn, old wire length or mass, or terminal resistance): wire lengths and resistances may be off by 10 to 20 %",
    });
  }
}

function makeError(path: string, message: string) {
  return inputError("inconsistent_geometry", path, message);
}
