/** Wording shared by the card's pages: numbers as the card prints them, and the phrases for slots, bars and the winding. */
import type { CoilPlan, Plan } from "../design/types.js";
import type { Wire } from "../wire/types.js";
import { mm, ohm, pct, rpm, sig } from "../format/number.js";
import { GOAL_UNIT, goalValue } from "../format/units.js";

export { mm, ohm, pct, rpm, sig };
export { goalSummary } from "../format/goal.js";

/** "0.202 mm bare, 0.234 mm overall (from memory)". */
export function wireSizes(w: Wire): string {
  const overall = w.overall_diameter === null ? "overall not known" : `${mm(w.overall_diameter)} mm overall (${w.overall_source})`;
  return `${mm(w.bare_diameter)} mm bare, ${overall}`;
}

export const strandsText = (k: number) => (k === 1 ? "1 strand (single wire)" : `${k} strands in hand`);

/** Turns × wire × strands, as the winder reads it. */
export function windingLine(turns: number, wire: Wire | string, strands: number): string {
  const label = typeof wire === "string" ? wire : wire.label;
  return `${turns} × ${label}${strands > 1 ? ` × ${strands} in hand` : ""}`;
}

/** Slot side of a coil: "slot 3 top", "slot 3 (cw half)". */
export function sideText(slot: number, layer: string, position: number, u: number): string {
  const pos = u > 1 ? ` pos ${position}` : "";
  if (layer === "right") return `slot ${slot} (cw half)`;
  if (layer === "left") return `slot ${slot} (ccw half)`;
  return `slot ${slot} ${layer}${pos}`;
}

/** The goal figure of a candidate (SI in) in the goal's unit, as printed. */
export function goalFigure(plan: Plan, achieved: number | null): string {
  return sig(goalValue(plan.goal.kind, achieved));
}

export function goalUnit(plan: Plan): string {
  const u = GOAL_UNIT[plan.goal.kind];
  return u === "mm2" ? "mm²" : u;
}

export const goalName = (plan: Plan) => plan.goal.kind.replace(/_/g, " ");

export { torqueUnit } from "../plot/curves.js";

export const fieldText: Record<string, string> = {
  permanent_magnet: "permanent magnet",
  shunt: "shunt (separate field winding)",
  series: "series (universal motor)",
};

export const mltSourceText: Record<string, string> = {
  measured: "measured on an old turn",
  wire_length: "from the length of the old wire",
  wire_mass: "from the mass of the old wire",
  terminal_resistance: "from the old terminal resistance",
  logbook: "corrected from the logbook",
  model: "end-turn model alone (no measurement)",
};

export const calibrationText: Record<string, string> = {
  generator: "generator test (open-circuit volts at a known speed)",
  no_load: "no-load test of the old winding",
  nameplate: "nameplate (rough)",
  logbook: "finished rewinds in the logbook",
  magnet: "magnet estimate (rough)",
  none: "nothing: speed and torque figures unknown",
};

/**
 * A command as printed on the card: a word joiner (U+2060, zero width) after each option's dashes
 * and inside each `<placeholder>`, so a line never breaks between "--" and the option's name, nor
 * inside a placeholder (Unicode UAX #14: no break before or after WJ). It prints as the plain command.
 */
export function command(text: string): string {
  return text.replace(/--(?=\w)/g, "--\u2060").replace(/<([^<>]*)>/g, (_, inner: string) => `<${inner.replace(/ /g, "\u2060 \u2060")}>`);
}

/** A dead coil's instruction, as the trade does it. */
export const DEAD_COIL = "dead coil: wind, cut and insulate both ends, hook to nothing";

export const isDead = (c: CoilPlan) => c.dead || c.start_bar === null || c.end_bar === null;
