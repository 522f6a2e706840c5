/**
 * Guards shared by the motor model: a quantity the user supplied that cannot be right
 * (not a number, zero or negative where only a positive value makes sense) becomes an
 * `ArmwindError` with code `invalid_value`, naming the value and what would be right.
 */
import { inputError } from "../errors.js";

/** Format a number to 4 significant figures for messages. */
export function fmt(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return "0";
  return Number(x.toPrecision(4)).toString();
}

/** Throw `invalid_value` unless `x` is a finite number greater than zero. */
export function requirePositive(x: number, what: string, path: string): number {
  if (!Number.isFinite(x) || x <= 0) {
    throw inputError("invalid_value", path, `${what} must be a finite number above zero, got ${fmt(x)}`);
  }
  return x;
}

/** Throw `invalid_value` unless `x` is a finite number at or above zero. */
export function requireNonNegative(x: number, what: string, path: string): number {
  if (!Number.isFinite(x) || x < 0) {
    throw inputError("invalid_value", path, `${what} must be a finite number at or above zero, got ${fmt(x)}`);
  }
  return x;
}

/** rad/s → rpm, for messages only: the conversion of src/format/units.ts. */
export { toRpm as rpm } from "../format/units.js";
