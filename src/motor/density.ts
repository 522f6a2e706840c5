/**
 * Current density in the copper, A/m² (the job file writes A/mm²: 1 A/mm² = 1e6 A/m²).
 */
import { requireNonNegative, requirePositive } from "./check.js";

/**
 * Current density in each strand: J = I / (a · k · A), A/m². I terminal current (A), a parallel
 * paths, k strands in hand, A bare area of one strand (m²). The terminal current divides equally
 * among the paths and the strands. Source: definition of current density; DESIGN.md.
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
 * Source: derived from Ohm's law and the definition above (DESIGN.md).
 */
export function stallCurrentDensity(supply: number, brushDrop: number, resistivity: number, pathWireLength: number): number {
  requireNonNegative(supply, "supply voltage", "target.supply");
  requireNonNegative(brushDrop, "brush drop", "winding.brush_drop");
  requirePositive(resistivity, "resistivity", "wire");
  requirePositive(pathWireLength, "wire length of one path", "wire");
  return Math.max(0, supply - brushDrop) / (resistivity * pathWireLength);
}
