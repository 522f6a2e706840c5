/** The winding spec read from a job file: one place for full and layout-only jobs alike. */
import type { WindingSpec } from "./types.js";

/** The fields a winding spec is read from: a full job and a layout-only job both carry them. */
export interface LayoutFields {
  armature: { slots: number; bars: number; field_poles: number };
  winding: Omit<WindingSpec, "slots" | "bars" | "poles" | "span" | "brushes"> & {
    span?: number;
    brushes: { count: number; width_bars: number };
  };
}

/** The winding spec of a job, full or layout-only: the one place the spec is read from a job file. */
export function layoutJobSpec(job: LayoutFields): WindingSpec {
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
