/**
 * Slot geometry: the free area of one slot, the slot liner, and the widths the wire must pass.
 * Lengths in m, areas in m².
 */
import type { Job } from "../job/schema.js";

export interface SlotGeometry {
  /** Slot area before the liner, m². */
  gross_area: number;
  /** Wall length the liner covers, m. */
  perimeter: number;
  /** True when the perimeter was estimated rather than given or derived from the three dimensions. */
  perimeter_estimated: boolean;
  /** Area the liner takes, m². */
  liner_area: number;
  /** Free area after the liner, m². */
  free_area: number;
  /** Slot opening between tooth tips, m (less two liner thicknesses when the liner wraps the tips? no: the opening as measured). */
  opening: number;
  liner: number;
  /** Trapezoid dimensions when known, m. */
  width_top: number | null;
  width_bottom: number | null;
  depth: number | null;
}

/**
 * Area of a trapezoid slot (m²) from its width at the air-gap side, at the root and its depth (m):
 * A = (w_top + w_bottom)/2 · depth (plane geometry).
 */
export function trapezoidArea(widthTop: number, widthBottom: number, depth: number): number {
  return ((widthTop + widthBottom) / 2) * depth;
}

/**
 * Wall length of a trapezoid slot that a liner covers (m): the root and both flanks,
 * w_bottom + 2·√(depth² + ((w_top − w_bottom)/2)²) (plane geometry; the opening side is left bare).
 */
export function trapezoidPerimeter(widthTop: number, widthBottom: number, depth: number): number {
  return widthBottom + 2 * Math.hypot(depth, (widthTop - widthBottom) / 2);
}

/**
 * Estimated liner perimeter when only the area is known (m): the walls of a square slot of that
 * area less one side, 3·√A. Common practice, no published source; the plan says it estimated.
 */
export function estimatedPerimeter(area: number): number {
  return 3 * Math.sqrt(area);
}

/**
 * Free slot area after the liner (m²): A_free = A − perimeter · liner thickness
 * (thin-liner approximation; common practice, no published source).
 */
export function freeArea(grossArea: number, perimeter: number, liner: number): number {
  return grossArea - perimeter * liner;
}

export function slotGeometry(job: Job): SlotGeometry {
  const s = job.armature.slot;
  const trapezoid = s.width_top !== undefined && s.width_bottom !== undefined && s.depth !== undefined;
  const gross = s.area ?? trapezoidArea(s.width_top!, s.width_bottom!, s.depth!);
  let perimeter: number;
  let estimated = false;
  if (s.perimeter !== undefined) perimeter = s.perimeter;
  else if (trapezoid) perimeter = trapezoidPerimeter(s.width_top!, s.width_bottom!, s.depth!);
  else {
    perimeter = estimatedPerimeter(gross);
    estimated = s.liner > 0;
  }
  const liner_area = perimeter * s.liner;
  return {
    gross_area: gross,
    perimeter,
    perimeter_estimated: estimated,
    liner_area,
    free_area: freeArea(gross, perimeter, s.liner),
    opening: s.opening,
    liner: s.liner,
    width_top: trapezoid ? s.width_top! : null,
    width_bottom: trapezoid ? s.width_bottom! : null,
    depth: trapezoid ? s.depth! : null,
  };
}
