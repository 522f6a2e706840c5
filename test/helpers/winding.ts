/** A winding spec for tests: a 12-slot, 12-bar, 2-pole simplex lap, span 5, changed by `over`. */
import type { WindingSpec } from "../../src/winding/types.js";

export function spec(over: Partial<WindingSpec> = {}): WindingSpec {
  return {
    style: "lap",
    slots: 12,
    bars: 12,
    poles: 2,
    span: 5,
    coils_per_slot: 1,
    dead_coil: false,
    equalizers: false,
    progression: "progressive",
    lead_throw: 0,
    direction: "cw",
    brushes: { count: 2, width_bars: 1 },
    ...over,
  };
}
