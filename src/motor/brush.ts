/**
 * Brush drop: a voltage across the whole brush circuit (both brushes and their contact films),
 * not a resistance. It is roughly independent of current over the working range, which is why
 * the model subtracts it as a constant.
 */
import { requireNonNegative } from "./check.js";

export type { BrushMaterial } from "../job/schema.js";
import type { BrushMaterial } from "../job/schema.js";

/**
 * Default total brush drop by material, V.
 * - carbon: 2 V in total (machine textbooks take 1 V per brush, 2 V for the pair).
 * - metal (precious-metal or copper-graphite leaf brushes of small motors): 0.2 V, "a few
 *   tenths of a volt", from memory.
 */
export const DEFAULT_BRUSH_DROP: Readonly<Record<BrushMaterial, number>> = {
  carbon: 2.0,
  metal: 0.2,
};

/**
 * Total brush drop, V: the value the job states when it states one, else the material default
 * (`DEFAULT_BRUSH_DROP`, sources there). Returns the value and where it came from.
 */
export function brushDrop(material: BrushMaterial, given?: number): { volts: number; source: "given" | "default"; basis: string } {
  if (given !== undefined) {
    requireNonNegative(given, "brush drop", "winding.brush_drop");
    return { volts: given, source: "given", basis: `brush drop ${given} V as the job states` };
  }
  const volts = DEFAULT_BRUSH_DROP[material];
  const basis =
    material === "carbon"
      ? "carbon brushes: 2 V in total, as machine textbooks take it"
      : "metal brushes: 0.2 V in total, a few tenths of a volt (from memory)";
  return { volts, source: "default", basis };
}
