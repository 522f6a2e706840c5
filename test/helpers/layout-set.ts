/**
 * The generated set of jobs the card's layout must survive (issue 11): lap, wave and tooth
 * windings with 1 to 4 coils per slot, 3 to 200 turns, a continuous winding, a 300-character title
 * and notes, on A4 and Letter. Each is a demo job with its winding replaced (invented values, for layout tests only).
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { parse } from "yaml";
import { ROOT } from "./cli.js";

export interface LayoutCase {
  name: string;
  paper: "a4" | "letter";
  raw: Record<string, unknown>;
}

const demo = (f: string) => parse(readFileSync(join(ROOT, "jobs", f), "utf8")) as Record<string, any>;

const LONG_TITLE =
  "Invented 300-character title for layout tests: a long description of the motor, its maker, its model, the shop's job reference, the customer's own words about what it did before it stopped, " +
  "and more words again so that the heading wraps over several lines on A4 and on Letter paper xx";
const LONG_NOTES =
  "Invented notes of 300 characters: came in with a burnt smell; two bars blackened; the bearings were dry and one brush was worn to its shunt; the customer wants it back by Friday; the commutator needs a skim; " +
  "the old wire was brittle and counted twice at each coil to be sure of the turns count.";

function withWinding(
  base: Record<string, any>,
  id: string,
  winding: Record<string, unknown>,
  turns: number,
  extra: Record<string, unknown> = {},
): Record<string, unknown> {
  const j = JSON.parse(JSON.stringify(base));
  j.id = id;
  Object.assign(j.armature, extra);
  j.winding = { ...j.winding, ...winding };
  j.original.turns = turns;
  delete j.original.wire_length;
  delete j.original.wire_mass;
  delete j.original.terminal_resistance;
  delete j.original.tests;
  delete j.original.generator;
  delete j.armature.family;
  j.target = { ...j.target, goal: "restore" };
  delete j.target.no_load_speed;
  delete j.target.kv;
  delete j.target.stall_current;
  delete j.target.duty;
  return j;
}

export function layoutCases(): LayoutCase[] {
  const lap = demo("drill-lap-0112.yaml");
  const wave = demo("chair-wave-0045.yaml");
  const tooth = demo("blind-motor-0031.yaml");
  const cases: LayoutCase[] = [
    { name: "lap-u2-40t", paper: "a4", raw: withWinding(lap, "t-lap-u2", { coils_per_slot: 2 }, 40) },
    // wound off the spool: page 1 gives the spool length and mass instead of a cut
    { name: "lap-u2-continuous", paper: "letter", raw: withWinding(lap, "t-lap-cont", { coils_per_slot: 2, continuous: true }, 18) },
    { name: "lap-u3-7t", paper: "letter", raw: withWinding(lap, "t-lap-u3", { coils_per_slot: 3 }, 7, { bars: 36 }) },
    { name: "lap-u4-3t", paper: "a4", raw: withWinding(lap, "t-lap-u4", { coils_per_slot: 4 }, 3, { bars: 48 }) },
    { name: "wave-u2-9t", paper: "letter", raw: withWinding(wave, "t-wave-u2", { coils_per_slot: 2, dead_coil: true }, 9, { bars: 41 }) },
    { name: "wave-u3-25t", paper: "a4", raw: withWinding(wave, "t-wave-u3", { coils_per_slot: 3 }, 25, { bars: 63 }) },
    { name: "tooth-200t", paper: "letter", raw: withWinding(tooth, "t-tooth-200", {}, 200) },
    { name: "tooth-13t", paper: "a4", raw: withWinding(tooth, "t-tooth-13", {}, 13) },
  ];
  const long = withWinding(lap, "t-long-text", { coils_per_slot: 2 }, 64) as Record<string, any>;
  long.title = LONG_TITLE;
  long.notes = LONG_NOTES;
  cases.push({ name: "long-title-letter", paper: "letter", raw: long }, { name: "long-title-a4", paper: "a4", raw: JSON.parse(JSON.stringify(long)) });
  return cases;
}
