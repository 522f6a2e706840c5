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
  /** Turns (tooth) or conductors (lap/wave) in the first layer, the one against the tooth flank or the slot root. */
  turnsPerLayer: number;
  /** What each layer used holds, first to last. */
  perLayer: number[];
  layers: number;
  /** Build depth of the coil from the tooth flank (tooth) or height of the conductors in the slot (lap/wave), m. */
  build: number;
  /** What the build may reach, m. */
  room: number;
  fits: boolean;
}

/** Slot width (m) at height y (m) above the root of a trapezoid slot of depth h, root width wb, top width wt. */
function widthAt(y: number, h: number, wt: number, wb: number): number {
  return wb + ((wt - wb) * y) / h;
}

/**
 * How many items (tooth: turns; lap/wave: conductors) each layer takes, first to last, until a
 * layer takes none or `maxLayers` are laid. It depends on the wire and the slot, not on how many
 * items there are, so a sweep works it out once per wire and strands and lays any count on it
 * (`layersOf`).
 */
function capacities(capacity: (j: number) => number, maxLayers: number): number[] {
  const out: number[] = [];
  for (let j = 0; j < maxLayers; j++) {
    const c = capacity(j);
    if (c <= 0) break;
    out.push(c);
  }
  return out;
}

/** A layer table: each layer's capacity, the overall diameter a layer adds (m) and the room the build may reach (m). */
export interface LayerTable {
  capacity: number[];
  /** Items the first j + 1 layers hold together. */
  cumulative: number[];
  /** Radial thickness of one layer (the overall diameter), m. */
  layer: number;
  room: number;
}

function tableOf(capacity: number[], layer: number, room: number): LayerTable {
  const cumulative: number[] = [];
  let sum = 0;
  for (const c of capacity) {
    sum += c;
    cumulative.push(sum);
  }
  return { capacity, cumulative, layer, room };
}

/**
 * Lay `items` on a layer table, filling each layer before the next: the build and whether it fits.
 * The layers used are the fewest whose capacities sum to `items` (all of them when they do not fit),
 * found by bisection on the running sums.
 */
export function layersOf(items: number, table: LayerTable): LayerBuild {
  const cum = table.cumulative;
  const n = cum.length;
  const fits = fitsLayers(items, table);
  let layers = n;
  if (fits) {
    let lo = 0;
    let hi = n - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (cum[mid] >= items) hi = mid;
      else lo = mid + 1;
    }
    layers = items > 0 ? lo + 1 : 0;
  }
  const perLayer = table.capacity.slice(0, layers);
  if (fits && layers > 0) perLayer[layers - 1] = items - (layers > 1 ? cum[layers - 2] : 0);
  return { turnsPerLayer: perLayer[0] ?? 0, perLayer, layers, build: layers * table.layer, room: table.room, fits };
}

/** Do `items` fit on a layer table (`layersOf(items, table).fits`, without laying them)? None always fit. */
export function fitsLayers(items: number, table: LayerTable): boolean {
  const cum = table.cumulative;
  return items <= 0 || (cum.length > 0 && cum[cum.length - 1] >= items);
}

/**
 * Tooth coil in a trapezoid slot (depth h, width wt at the air-gap side, wb at the root, liner t; m):
 * turns of k strands of overall diameter d are laid along the tooth flank (its radial length h − 2t);
 * layers build out from the flank into the slot, and the coil may take half the slot's width at
 * each height, less the liner (the neighbouring coil takes the other half). Layer j (its outer
 * edge (j + 1)·d from the flank) runs only along the heights where w(y)/2 − t ≥ (j + 1)·d, so in a
 * slot that widens towards the gap the outer layers are shorter, not absent.
 * Geometry of the trapezoid; common practice, no published source.
 */
export function toothLayerTable(strands: number, overall: number, slotDepth: number, widthTop: number, widthBottom: number, liner: number): LayerTable {
  const h = slotDepth;
  const lo = liner;
  const hi = h - liner;
  const pitch = strands * overall;
  const capacity = (j: number) => {
    const need = 2 * ((j + 1) * overall + liner); // slot width the layer needs
    let a = lo;
    let b = hi;
    if (widthTop === widthBottom) {
      if (widthTop < need) return 0;
    } else {
      const y = (h * (need - widthBottom)) / (widthTop - widthBottom); // where w(y) = need
      if (widthTop > widthBottom) a = Math.max(a, y);
      else b = Math.min(b, y);
    }
    return b > a ? Math.max(0, Math.floor((b - a) / pitch + 1e-9)) : 0;
  };
  const room = Math.max(widthTop, widthBottom) / 2 - liner;
  return tableOf(capacities(capacity, Math.ceil(room / overall) + 1), overall, room);
}

/** The tooth coil's layers for `turns` (m; see `toothLayerTable`). */
export function toothLayerBuild(
  turns: number,
  strands: number,
  overall: number,
  slotDepth: number,
  widthTop: number,
  widthBottom: number,
  liner: number,
): LayerBuild {
  return layersOf(turns, toothLayerTable(strands, overall, slotDepth, widthTop, widthBottom, liner));
}

/**
 * Lap/wave slot (trapezoid, as above): conductors of overall diameter d laid in rows across the slot,
 * from the root towards the opening; each row takes the slot's width where the row is narrowest,
 * less a liner on each side; the rows must stay within the slot depth less the liner.
 * Geometry of the trapezoid; common practice, no published source.
 */
export function slotLayerTable(overall: number, slotDepth: number, widthTop: number, widthBottom: number, liner: number): LayerTable {
  const room = slotDepth - liner;
  const capacity = (j: number) => {
    const y0 = liner + j * overall;
    const y1 = y0 + overall;
    if (y1 > room + 1e-12) return 0;
    const w = Math.min(widthAt(y0, slotDepth, widthTop, widthBottom), widthAt(y1, slotDepth, widthTop, widthBottom)) - 2 * liner;
    return Math.max(0, Math.floor(w / overall + 1e-9));
  };
  return tableOf(capacities(capacity, Math.ceil(room / overall) + 1), overall, room);
}

/** The lap/wave slot's rows for `conductors` (m; see `slotLayerTable`). */
export function slotLayerBuild(conductors: number, overall: number, slotDepth: number, widthTop: number, widthBottom: number, liner: number): LayerBuild {
  return layersOf(conductors, slotLayerTable(overall, slotDepth, widthTop, widthBottom, liner));
}
