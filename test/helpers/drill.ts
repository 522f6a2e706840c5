import { readFileSync } from "node:fs";
import { join } from "node:path";
import { ROOT } from "./cli.js";

/** The drill demo's job file (a universal motor, 230 V 50 Hz). */
export const drillText = readFileSync(join(ROOT, "jobs/drill-lap-0112.yaml"), "utf8");

/**
 * The drill for a 120 V 60 Hz supply (`goal: convert`), invented for the tests: its tests and
 * nameplate marked as read at 50 Hz, and three heavier wires added to its stock.
 */
export const drillConvertText = drillText
  .replace("supply: { value: 230 V, kind: ac, frequency: 50 Hz }\n  goal: restore", "supply: { value: 120 V, kind: ac, frequency: 60 Hz }\n  goal: convert")
  .replace("input_power: 580 W,", "frequency: 50 Hz, input_power: 580 W,")
  .replace(/rpm, temperature: 22 C \}/g, "rpm, temperature: 22 C, frequency: 50 Hz }")
  .replace("wire_stock:\n", "wire_stock:\n  - 0.40 mm grade 2\n  - 0.375 mm grade 2\n  - 0.355 mm grade 2\n");
