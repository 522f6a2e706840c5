/**
 * Whether a plan's motor has a shunt field of known resistance, so that its duty figures print the
 * armature's current and the terminals' apart (the field's V/R_f besides; src/motor/model.ts).
 */
import type { Plan } from "../design/types.js";

export function hasShuntField(plan: Plan): boolean {
  return plan.job.armature.field === "shunt" && plan.calibration.shunt_field_ohm !== null;
}
