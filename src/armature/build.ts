/**
 * Whether the turns fit physically, beyond the fill by area: turns per layer, layers, and the
 * build against the slot where it is narrowest; and the wire through the slot opening.
 * Common practice, no published source.
 */

/** Clearance a wire needs to pass the slot opening: 10 % of what passes (common practice, no published source). */
export const OPENING_CLEARANCE = 0.1;

/**
 * Does a bundle of `strands` wires of overall diameter d (m) pass the slot opening (m)?
 * Strands in hand are fed side by side: k·d·(1 + clearance) ≤ opening.
 */
export function passesOpening(overall: number, strands: number, opening: number): boolean {
  return strands * overall * (1 + OPENING_CLEARANCE) <= opening;
}

export interface LayerBuild {
  turnsPerLayer: number;
  layers: number;
  /** Build depth of the coil from the tooth flank (tooth) or height of the conductors in the slot (lap/wave), m. */
  build: number;
  /** What the build may reach, m. */
  room: number;
  fits: boolean;
}

/**
 * Tooth coil: turns are laid along the tooth's radial length h (m, slot depth less liner); each turn
 * of k strands takes k·d; layers build out into the slot, where half the narrowest width (the root,
 * less the liner) is the room, as the neighbouring coil takes the other half.
 */
export function toothLayerBuild(turns: number, strands: number, overall: number, slotDepth: number, widthRoot: number, liner: number): LayerBuild {
  const along = slotDepth - 2 * liner;
  const turnsPerLayer = Math.max(0, Math.floor(along / (strands * overall) + 1e-9));
  const layers = turnsPerLayer > 0 ? Math.ceil(turns / turnsPerLayer) : Infinity;
  const build = layers * overall;
  const room = widthRoot / 2 - liner;
  return { turnsPerLayer, layers, build, room, fits: Number.isFinite(layers) && build <= room + 1e-12 };
}

/**
 * Lap/wave slot: conductors laid in rows across the mean slot width (less the liners); rows stack
 * towards the opening and must stay within the slot depth less the liner.
 */
export function slotLayerBuild(conductors: number, overall: number, slotDepth: number, widthTop: number, widthBottom: number, liner: number): LayerBuild {
  const width = (widthTop + widthBottom) / 2 - 2 * liner;
  const perRow = Math.max(0, Math.floor(width / overall + 1e-9));
  const layers = perRow > 0 ? Math.ceil(conductors / perRow) : Infinity;
  const build = layers * overall;
  const room = slotDepth - liner;
  return { turnsPerLayer: perRow, layers, build, room, fits: Number.isFinite(layers) && build <= room + 1e-12 };
}
