/**
 * Current density in the copper, A/m² (the job file writes A/mm²: 1 A/mm² = 1e6 A/m²).
 */
import { requireNonNegative, requirePositive } from "./check.js";

/**
 * Current density in each strand: J = I / (a · k · A), A/m². I terminal current (A), a parallel
 * paths, k strands in hand, A bare area of one strand (m²). The terminal current divides equally
 * among the paths and the strands. Source: definition of current density; docs/contracts.md.
 */
export function currentDensity(current: number, paths: number, strands: number, strandArea: number): number {
  requireNonNegative(current, "current", "target.rated_current");
  requirePositive(paths, "parallel paths", "winding");
  requirePositive(strands, "strands in hand", "design.strands_in_hand");
  requirePositive(strandArea, "strand area", "design.wire");
  return current / (paths * strands * strandArea);
}

/**
 * Current density at stall, A/m²: J = (V − V_b) / (ρ · L), V supply (V), V_b brush drop (V),
 * ρ resistivity of the copper at the winding's temperature (Ω·m), L the length of one strand
 * along one path between the brushes (m). Follows from I_stall = (V − V_b)/R with
 * R = ρ·L/(a·k·A): the wire size cancels, so the stall density is set by the wire's length only.
 * Each path sees the same V − V_b, so with paths of unequal length (an odd number of coils split
 * ⌊C/2⌋ and ⌈C/2⌉) give each path's own length: the shorter path runs at the higher density.
 * REPORT ONLY, never a limit: a stall lasts seconds and no choice of wire size changes it.
 * Source: derived from Ohm's law and the definition above (docs/contracts.md).
 */
export function stallCurrentDensity(supply: number, brushDrop: number, resistivity: number, pathWireLength: number): number {
  requireNonNegative(supply, "supply voltage", "target.supply");
  requireNonNegative(brushDrop, "brush drop", "winding.brush_drop");
  requirePositive(resistivity, "resistivity", "wire");
  requirePositive(pathWireLength, "wire length of one path", "wire");
  return Math.max(0, supply - brushDrop) / (resistivity * pathWireLength);
}

/**
 * Current density in each strand from the share of the terminal current one coil carries
 * (`coilCurrentShare` of the ring: 1/a for equal paths): J = I · share / (k · A), A/m².
 * I terminal current (A), k strands in hand, A bare area of one strand (m²). With equal paths this
 * is `currentDensity(I, a, k, A)`. Source: definition of current density; docs/contracts.md.
 */
export function currentDensityByShare(current: number, share: number, strands: number, strandArea: number): number {
  requirePositive(share, "share of the current", "winding");
  return currentDensity(current, 1 / share, strands, strandArea);
}

/** Default limit on the current density in each strand: 10 A/mm² (common practice for small fan-cooled motors, no published source). */
export const DEFAULT_DENSITY_LIMIT = 10e6;

export interface DensityLimit {
  /** A/m², or null when no limit applies. */
  limit: number | null;
  /** given: the job's; default: 10 A/mm²; original: the original winding's own (higher) density; none: turned off; no_point: no duty or rated current to check at. */
  basis: "given" | "default" | "original" | "none" | "no_point";
}

/**
 * The current-density limit in force (docs/contracts.md `target.limits.current_density`): the job's value
 * when given; `none` turns it off; with no duty or rated current there is nothing to check it at;
 * else 10 A/mm², or the original winding's own density at that point when higher (it survived).
 * `originalDensity` in A/m² (null when it cannot be known).
 */
export function densityLimit(given: number | "none" | undefined, atPoint: boolean, originalDensity: number | null): DensityLimit {
  if (typeof given === "number") return { limit: given, basis: "given" };
  if (given === "none") return { limit: null, basis: "none" };
  if (!atPoint) return { limit: null, basis: "no_point" };
  if (originalDensity !== null && originalDensity > DEFAULT_DENSITY_LIMIT) return { limit: originalDensity, basis: "original" };
  return { limit: DEFAULT_DENSITY_LIMIT, basis: "default" };
}
