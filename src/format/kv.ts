/** Kv as people read it, on the terminal and the card alike. */
import type { MotorReport, Plan } from "../design/types.js";
import { rpm, sig } from "./number.js";

/**
 * Kv in both senses (docs "Kv"), each with its definition; none for a series motor (no constant
 * field) or an uncalibrated one.
 */
export const KV_DEFINITIONS =
  "Kv: the motor constant 60/(2π·Ke); no-load rpm/V: the predicted no-load speed ÷ the supply, what a tachometer on a bench supply reads (lower by the resistive and brush drops and the loss current).";
export function kvRows(plan: Plan): [string, (r: MotorReport) => string][] {
  if (plan.job.armature.field === "series" || plan.motor.noLoadPerVolt === null) return [];
  return [
    ["Kv rpm/V (60/(2π·Ke))", (r) => sig(r.kv)],
    ["no-load rpm/V (speed ÷ supply)", (r) => rpm(r.noLoadPerVolt)],
  ];
}
