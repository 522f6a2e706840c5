/** Number formatting for the terminal and the card: 3 significant figures, resistance 4 (docs/contracts.md). */
import { toRpm } from "./units.js";

export function sig(x: number | null | undefined, digits = 3): string {
  if (x === null || x === undefined || Number.isNaN(x)) return "—";
  if (!Number.isFinite(x)) return x > 0 ? "∞" : "−∞";
  if (x === 0) return "0";
  const mag = Math.floor(Math.log10(Math.abs(x)));
  if (mag >= digits - 1) return String(Math.round(x)).replace("-", "−");
  const decimals = Math.min(12, digits - 1 - mag);
  const text = x.toFixed(decimals);
  // float noise (1e-16 of a deviation) rounds to nothing at 12 decimals: it is zero, not "−0.000000000000"
  return /^-?0\.0*$/.test(text) ? "0" : text.replace("-", "−");
}

/**
 * A signed fraction as a percentage: "+0.2 %", "−9.16 %", and "0 %" (no sign) when it rounds to
 * nothing. `decimals` fixes the decimals ("+0.6 %" with 1); without it, 3 significant figures.
 */
export function signedPct(fraction: number, decimals?: number): string {
  const x = fraction * 100;
  const text = decimals === undefined ? sig(Math.abs(x)) : Math.abs(x).toFixed(decimals);
  if (/^0(\.0*)?$/.test(text)) return `${text} %`;
  return `${x > 0 ? "+" : "−"}${text} %`;
}

/** Resistance, 4 significant figures. */
export const ohm = (x: number | null | undefined): string => sig(x, 4);

export const pct = (x: number | null | undefined, digits = 3): string => (x === null || x === undefined || Number.isNaN(x) ? "—" : `${sig(x * 100, digits)} %`);

export const mm = (m: number | null | undefined): string => (m === null || m === undefined ? "—" : sig(m * 1e3));
export const rpm = (w: number | null | undefined): string => (w === null || w === undefined ? "—" : sig(toRpm(w)));

/** A plain text table: columns padded, numbers right-aligned. */
export function table(headers: string[], rows: string[][], rightAlign?: boolean[]): string {
  const widths = headers.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? "").length)));
  const right = rightAlign ?? headers.map((_, i) => i > 0);
  const line = (cells: string[]) =>
    cells
      .map((c, i) => (right[i] ? (c ?? "").padStart(widths[i]) : (c ?? "").padEnd(widths[i])))
      .join("  ")
      .trimEnd();
  return [line(headers), widths.map((w) => "─".repeat(w)).join("  "), ...rows.map(line)].join("\n");
}

/**
 * A fraction as a percentage with the digits it was given: 0.006 → "0.6", 0.04 → "4", 0.025 → "2.5"
 * (the float noise of ×100 removed at 12 significant figures, nothing rounded away).
 */
export function pctGiven(fraction: number): string {
  return String(Number((fraction * 100).toPrecision(12))).replace("-", "−");
}
