/**
 * Whether a plan's motor has a shunt field of known resistance, so that its duty figures print the
 * armature's current and the terminals' apart (the field's V/R_f besides; src/motor/model.ts), and
 * the stall check says the ammeter goes in the armature lead. Takes a plan or a prediction.
 */
import type { Plan } from "../design/types.js";

export function hasShuntField(plan: Pick<Plan, "job" | "calibration">): boolean {
  return plan.job.armature.field === "shunt" && plan.calibration.shunt_field_ohm !== null;
}
