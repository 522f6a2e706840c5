/**
 * Slot fill of round wire. Copper fill = conductors × bare area / free slot area; space fill =
 * conductors × π/4 · overall² / free slot area (docs/contracts.md "Fill"; common definitions of the
 * winding trade). A tooth slot holds two coil sides, a lap or wave slot 2·u.
 */

/** Densest packing of equal circles in a square lattice, π/4 ≈ 0.785 (geometry). */
export const SQUARE_PACKING = Math.PI / 4;
/** Densest packing of equal circles in the plane, hexagonal, π/(2√3) ≈ 0.907 (Lagrange, Thue; geometry). */
export const HEX_PACKING = Math.PI / (2 * Math.sqrt(3));

/** Conductors in one slot: coil sides per slot × turns × strands in hand. */
export function conductorsPerSlot(coilSidesPerSlot: number, turns: number, strands: number): number {
  return coilSidesPerSlot * turns * strands;
}

/** Copper fill (fraction): conductors × bare area (m²) / free slot area (m²). */
export function copperFill(conductors: number, bareArea: number, freeArea: number): number {
  return (conductors * bareArea) / freeArea;
}

/** Space fill (fraction): conductors × π/4 · overall diameter² (m²) / free slot area (m²). */
export function spaceFill(conductors: number, overallDiameter: number, freeArea: number): number {
  return (conductors * (Math.PI / 4) * overallDiameter * overallDiameter) / freeArea;
}

/** The most conductors that keep the copper fill at or below `limit`. */
export function maxConductorsForFill(limit: number, bareArea: number, freeArea: number): number {
  return Math.floor((limit * freeArea) / bareArea + 1e-9);
}
