/**
 * Mean length of turn (MLT): two active sides along the stack plus the end turns.
 *
 * The end-turn models here are common practice, no published source:
 *  - tooth coil round a rectangular tooth of width w, coil build b beside the tooth over a liner t:
 *    end turns = 2·w + π·(2t + b) (a rectangle with rounded corners at the coil's mean radius);
 *  - lap and wave coil spanning y slots on a core of mid-slot diameter D_m: each end crosses the
 *    face on the chord D_m·sin(π·y/S), stands off the core by a clearance x each way, and bends
 *    over its own bundle b: per end chord + 2x + b.
 * Calibration: the measured old turn length (from the wire pulled off: length or mass) fixes a
 * factor on the end-turn part for the old build, and the model carries it to the new build.
 */
import { COPPER_DENSITY, roundArea } from "../wire/copper.js";
import type { WindingStyle } from "../job/schema.js";

export interface CoreDims {
  /** Stack length L, m. */
  stack: number;
  /** Rotor (armature) outside diameter, m. */
  rotorDiameter: number;
  slots: number;
  /** Tooth width at mid-depth, m. */
  toothWidth: number;
  /** Slot depth, m (measured or estimated). */
  slotDepth: number;
  liner: number;
}

export type Style = WindingStyle;

/** Axial clearance of a lap or wave end turn from the core face, m (2 mm; common practice, no published source). */
export const END_CLEARANCE = 0.002;

/**
 * Thickness of a coil side's bundle (m): N·k conductors of overall diameter d (m), laid at square
 * packing (each takes d²), spread along a length h (m): b = N·k·d²/h.
 */
export function bundleThickness(turns: number, strands: number, overall: number, along: number): number {
  return (turns * strands * overall * overall) / along;
}

/** The end-turn part (m) of one turn by the model, before calibration. */
export function endTurnModel(style: Style, core: CoreDims, span: number, build: number): number {
  if (style === "tooth") return 2 * core.toothWidth + Math.PI * (2 * core.liner + build);
  const dm = core.rotorDiameter - core.slotDepth;
  const chord = dm * Math.sin((Math.PI * Math.min(span, core.slots / 2)) / core.slots);
  return 2 * (chord + 2 * END_CLEARANCE + build);
}

/** MLT by the model (m): 2·L + end turns × calibration factor. */
export function meanTurnLength(style: Style, core: CoreDims, span: number, build: number, factor = 1): number {
  return 2 * core.stack + factor * endTurnModel(style, core, span, build);
}

/**
 * Fit the end-turn factor from a measured old turn length (m): f = (MLT_measured − 2L) / end-turn model
 * of the old build. Returns the factor; the caller warns when it is far from 1.
 */
export function fitEndTurnFactor(measuredMlt: number, style: Style, core: CoreDims, span: number, oldBuild: number): number {
  return (measuredMlt - 2 * core.stack) / endTurnModel(style, core, span, oldBuild);
}

/** Old turn length from the wire pulled off (m): length / (strands · turns · live coils). */
export function mltFromWireLength(wireLength: number, strands: number, turns: number, coils: number): number {
  return wireLength / (strands * turns * coils);
}

/** Length (m) of copper wire of bare diameter d (m) that weighs `mass` (kg): m / (ρ_Cu · π/4 · d²) (IEC 60028 density). */
export function lengthFromMass(mass: number, bareDiameter: number): number {
  return mass / (COPPER_DENSITY * roundArea(bareDiameter));
}

/**
 * Density of the enamel film of magnet wire, kg/m³: 1300 (polyurethane and polyester-imide films
 * lie about 1.2 to 1.4 g/cm³; from memory).
 */
export const ENAMEL_DENSITY = 1300;

/**
 * Length (m) of enamelled wire of bare diameter d and overall diameter D (m) that weighs `mass` (kg),
 * enamel and all: m / (ρ_Cu · π/4 · d² + ρ_enamel · π/4 · (D² − d²)). The overall diameter of a
 * grade or build is the standard's maximum, so the enamel's share is an upper bound (a few per cent
 * of the mass for fine wire, well under one for thick).
 */
export function lengthFromEnamelledMass(mass: number, bareDiameter: number, overallDiameter: number): number {
  return mass / (COPPER_DENSITY * roundArea(bareDiameter) + ENAMEL_DENSITY * (roundArea(overallDiameter) - roundArea(bareDiameter)));
}

/**
 * Extra turn length (m) of a lap or wave coil laid over `ridesOver` earlier coils: its end turns
 * climb over their bundles, rising by b·ridesOver/(u·span) at each end (up and down, both ends):
 * ΔMLT = 4·b·ridesOver/(u·span), at most 8·b. Common practice, no published source.
 */
export function ridingIncrement(ridesOver: number, coilsPerSlot: number, span: number, bundle: number): number {
  if (ridesOver <= 0) return 0;
  return Math.min(8 * bundle, (4 * bundle * ridesOver) / (coilsPerSlot * Math.max(1, span)));
}
