/**
 * The JSON Schema of the job file (draft 2020-12), for editors: generated from the zod schema in
 * ./schema.ts (the single source of truth), then given an `$id`, a title, and for every field a
 * description that says what to measure, where and with what; quantity fields also get examples
 * and a `pattern` (a number, then a unit) so an editor flags "twelve mm" as you type.
 *
 * What JSON Schema cannot say stays with zod: rules that compare two fields (a goal needs its
 * value, a lap or wave winding needs its span, slot area or its three dimensions, odd poles) and
 * whether a unit suits its quantity. `armwind check` says those.
 *
 * Pure: no files. `armwind schema` prints it; templates/job.schema.json is the committed copy.
 */
import { z } from "zod";
import { EDITOR_FORMS, jobSchema } from "./schema.js";
import { defaultUnit, example, unitNames, type QuantityKind } from "./units.js";

/** Stable identifier of the schema (a URN: nothing to fetch; editors find the file by path). */
export const JOB_SCHEMA_ID = "urn:armwind:job-file:1";

/** A number (optionally signed, decimal or exponent), then optionally a unit: "12 mm", "0.5in", "12". */
export const QUANTITY_PATTERN = "^\\s*[+-]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][+-]?\\d+)?(?:\\s*[^\\s\\d.].*)?$";
/** A fraction or a percentage: "0.40", "40 %". */
export const FRACTION_PATTERN = "^\\s*[+-]?(?:\\d+\\.?\\d*|\\.\\d+)\\s*%?\\s*$";

/**
 * What each field is and how to measure it, by dotted path (`[]` for list items). Tools named
 * are the usual workshop ones; the order of recording while stripping is in the templates.
 */
export const FIELD_HELP: Record<string, string> = {
  $schema: "Editor hint (the path of this schema); ignored by armwind.",
  version: "Job file version: always 1.",
  id: "Unique job id: letters, digits, '.', '_' or '-'. Names the card (<id>.pdf) and the logbook records.",
  title: "One line for the card's heading, e.g. the motor and its armature.",
  customer: "Free text, optional.",
  notes: "Free text, optional: what came in, what was found.",
  armature: "The stripped armature: core, slots, commutator and the stator field it runs in.",
  "armature.family": "Optional name shared by rewinds of the same armature model; finished rewinds of the family in the logbook calibrate new plans.",
  "armature.slots": "Number of slots (= teeth) in the core: count them on the core's face.",
  "armature.bars": "Number of commutator bars (segments): count them after marking bar 1 with a scribe.",
  "armature.field_poles": "Poles of the stator field: count the magnets or field coils (2, 4, 6 …).",
  "armature.field":
    "permanent_magnet: magnets in the housing; shunt: a field coil of many turns of fine wire across the supply; series: a field coil of few turns of thick wire in series with the armature (universal motors are series).",
  "armature.stack_length": "Length of the lamination stack along the shaft, iron only (not the end insulators): calipers.",
  "armature.rotor_diameter": "Outside diameter of the core over the tooth tips: calipers.",
  "armature.tooth_width": "Width of one tooth's body, below the tip: calipers. Optional.",
  "armature.slot": "One slot's free area before the liner: give area, or width_top, width_bottom and depth.",
  "armature.slot.area":
    "Free cross-section of one slot before the liner: trace the empty slot (a photo or a print of the lamination on squared paper) and count.",
  "armature.slot.width_top": "Slot width at the air-gap side, under the tooth tips: calipers (inside jaws) or feeler gauges.",
  "armature.slot.width_bottom": "Slot width at its root: calipers (inside jaws) or feeler gauges.",
  "armature.slot.depth": "Slot depth from under the tooth tips to the root: calipers (depth rod).",
  "armature.slot.perimeter": "Length of the slot's outline, for the liner. Optional: estimated otherwise, and the plan says so.",
  "armature.slot.opening": "Gap between neighbouring tooth tips that the wire must pass through: feeler gauges.",
  "armature.slot.liner": "Thickness of the slot insulation (paper or film): micrometer on an offcut. 0 if there is none.",
  "armature.magnet": "Permanent magnets only; used when no bench test calibrates the motor.",
  "armature.magnet.flux_per_pole": "Flux of one pole, if known from the maker.",
  "armature.magnet.gap_flux_density": "Flux density in the air gap: gaussmeter (Hall probe) on the magnet face. Give pole_arc with it.",
  "armature.magnet.pole_arc": "Fraction of the pole pitch the magnet covers (arc of the magnet ÷ 360° × poles).",
  field_winding: "Series (and shunt) motors: the stator's field coils, read with the armature out or its brushes lifted.",
  "field_winding.resistance": "All field coils of the circuit in series: four-wire ohmmeter across the field leads, with the temperature it was read at.",
  "field_winding.resistance.value": "The reading: four-wire (Kelvin) ohmmeter, or the millivolt drop at a known current.",
  "field_winding.resistance.at": "Temperature of the field coils when read (default 20 C).",
  "field_winding.inductance": "Field inductance alone, if measured: LCR meter across the field leads. Optional (or give locked_rotor).",
  "field_winding.locked_rotor":
    "Locked-rotor reading of the whole motor at a reduced voltage: rotor clamped, a variable transformer or bench supply, a few seconds only. On AC it gives the armature and field inductance together.",
  "field_winding.locked_rotor.supply": "The reduced voltage applied: voltmeter at the motor terminals. Never mains voltage.",
  "field_winding.locked_rotor.current": "The current that flowed: ammeter in series.",
  "field_winding.locked_rotor.frequency": "AC frequency of the reading; 0 Hz for a DC reading.",
  "field_winding.locked_rotor.temperature": "Temperature of the windings during the reading (default 20 C).",
  "field_winding.turns_per_pole": "Turns of one field coil: count them if the field is stripped. Optional.",
  "field_winding.rewound_turns_per_pole": "Only when the field is rewound to a new turn count: its new turns per coil.",
  winding: "How the old winding was laid: record it while stripping, before anything is cut.",
  "winding.style":
    "tooth: each coil round one tooth (small 3-, 5-, 7-slot motors); lap: a coil's ends on neighbouring bars; wave: a coil's ends about two pole pitches apart round the commutator.",
  "winding.span": "Coil span in slots, counted on the old winding from a coil's go slot to its return slot (slots 1 and 6: span 5). Tooth windings: 1.",
  "winding.coils_per_slot":
    "Coils whose sides share a slot (u): bars = u × slots (less 1 with a dead coil). Count the leads leaving each slot while stripping.",
  "winding.dead_coil": "Wave windings only: one coil wound but left unconnected.",
  "winding.equalizers": "Lap windings with more than 2 poles: equalizer connections fitted.",
  "winding.progression":
    "progressive: a coil ends on a bar after its start bar (clockwise from the commutator end); retrogressive: before it (its leads cross).",
  "winding.lead_throw":
    "Bars counted clockwise (seen from the commutator end) from the bar on coil 1's centre line (midway between its go and return slots) to the bar coil 1's start lead goes to. Copy it from the marked old winding; never guess it.",
  "winding.direction":
    "Tooth windings: the sense the wire goes round the tooth, looking at the tooth tip from outside the armature (cw or ccw). Note it while unwinding the first coil.",
  "winding.mean_turn_length": "Measured length of one old turn: cut one turn free, straighten it, measure. Optional.",
  "winding.lead_allowance": "Extra wire per coil end for the lead to its bar (default 50 mm, common practice).",
  "winding.spare_margin": "Spare added to the total cut (default 0.10, common practice).",
  "winding.continuous": "true: one wire through all coils, wound off the spool (no cut per coil); the card gives the spool mass to have. Default false.",
  "winding.brushes": "The brushes: count, width in bars, material.",
  "winding.brushes.count": "Number of brushes: 2, or one per pole on a lap winding with brushes at every pole.",
  "winding.brushes.width_bars": "Brush width in bars: brush width ÷ bar pitch at the commutator surface (calipers).",
  "winding.brushes.material": "carbon (about 2 V drop in total) or metal (a few tenths of a volt).",
  "winding.brush_drop": "Total voltage drop over the brushes, if measured; else taken from the material.",
  original: "The old winding, recorded before and while stripping.",
  "original.turns": "Turns per coil of the old winding: count them while unwinding a coil (count two coils and compare).",
  "original.wire":
    "Bare copper diameter of the old wire: micrometer on a stripped sample (burn or scrape the enamel off a short piece; burnt enamel gives off harmful fumes, ventilate and keep clear of flammables), or a gauge name.",
  "original.strands": "Wires wound together in hand (1 unless several strands run side by side).",
  "original.wire_length": "All the old wire pulled off the coils, leads trimmed, all strands, measured along a tape. Optional; calibrates the turn length.",
  "original.wire_mass": "The same wire weighed on a scale (grams). Optional; calibrates the turn length like wire_length.",
  "original.nameplate": "Rating plate figures, when bench tests are impossible.",
  "original.nameplate.supply": "Rated voltage from the plate.",
  "original.nameplate.current": "Rated current from the plate (or give input_power).",
  "original.nameplate.input_power": "Rated input watts from the plate, when it gives watts instead of amps.",
  "original.nameplate.speed": "Rated speed from the plate: at the motor, or at the geared spindle (speed_kind: spindle).",
  "original.nameplate.frequency": "AC frequency on the plate; 0 Hz for DC. Optional: else the target supply's kind.",
  "original.nameplate.speed_kind": "motor: the plate's speed is the armature's; spindle: it is the geared output's (give gear_ratio).",
  "original.nameplate.gear_ratio": "Motor speed ÷ spindle speed: count the gear teeth (a 4 : 1 reduction is 4).",
  "original.armature_inductance":
    "Armature inductance alone, if measured (an LCR meter across the brush bars, rotor out of the stator). Optional: it scales with the square of the turns.",
  "original.tests":
    "No-load bench tests of the old motor, at one or more voltages (before the rewind). Keep clear of the turning shaft; never run a series motor unloaded.",
  "original.tests[]":
    "One bench test: a no-load test (supply, current, speed) or, for series motors, a load test (supply, current, speed and torque or output power).",
  "original.tests[].kind":
    "no_load (default): nothing on the shaft. Small series motors only briefly, in their housing with their own fan; never run a large series DC motor unloaded. load: a known load (brake or dynamometer).",
  "original.tests[].frequency": "AC test: its frequency; 0 Hz for a DC test. Optional: else the target supply's kind.",
  "original.tests[].current": "Load test: current drawn under the load: ammeter in series.",
  "original.tests[].speed": "Load test: shaft speed under the load: tachometer.",
  "original.tests[].torque": "Load test: shaft torque: brake arm and spring balance, or a dynamometer.",
  "original.tests[].output_power": "Load test: shaft output power, instead of the torque (dynamometer).",
  "original.tests[].supply": "Voltage at the motor terminals during the test: voltmeter.",
  "original.tests[].no_load_current": "Current with nothing on the shaft: ammeter in series.",
  "original.tests[].no_load_speed": "Shaft speed with nothing on it: tachometer (optical, with a reflective mark).",
  "original.tests[].temperature": "Temperature of the winding during the test. Optional.",
  "original.tests[].field_current": "Shunt field only: the part of the current the field takes.",
  "original.generator": "Open-circuit spin test: drive the shaft at a known speed (tachometer) and read the terminal voltage (voltmeter).",
  "original.generator.speed": "Speed the shaft was driven at: tachometer.",
  "original.generator.volts": "Open-circuit terminal voltage at that speed: voltmeter.",
  "original.terminal_resistance":
    "Armature resistance across the brush bars, brushes excluded: ohmmeter, four-wire (Kelvin) for readings below a few ohms; with the temperature it was read at.",
  "original.terminal_resistance.value": "The reading: four-wire (Kelvin) ohmmeter, or the millivolt drop at a known current.",
  "original.terminal_resistance.at": "Temperature of the winding when it was read (default 20 C).",
  target: "What the new winding should do.",
  "target.supply": 'Supply voltage: DC as "12 V"; AC as { value: 230 V, kind: ac, frequency: 50 Hz }.',
  "target.supply.value": "Supply voltage.",
  "target.supply.kind": "dc or ac.",
  "target.supply.frequency": "AC supply frequency.",
  "target.goal":
    "restore: the old turns and the nearest wire; no_load_speed, kv, stall_current or duty: turns chosen to meet the value given under the key of the same name; convert (series motors): the armature re-planned for a new target.supply at the original's rated speed and torque; fixed: the winding given under fixed.",
  "target.no_load_speed": "Goal no_load_speed: the speed wanted with nothing on the shaft.",
  "target.kv": "Goal kv: the motor constant wanted, rpm per volt.",
  "target.stall_current": "Goal stall_current: the most current allowed with the shaft held (hot).",
  "target.duty": "Goal duty: the working point, torque at speed.",
  "target.duty.torque": "Shaft torque at the working point.",
  "target.duty.speed": "Shaft speed at the working point.",
  "target.tolerance":
    "A candidate within ± this fraction of the goal meets it (default 0.03); or { below: 0.02, above: 0.08 } for a one-sided or asymmetric band. For stall_current, a limit, a bare t means { below: t, above: 0 }.",
  "target.tolerance.below": "How far under the goal still meets it, a fraction (0: not at all).",
  "target.tolerance.above": "How far over the goal still meets it, a fraction (0: not at all).",
  "target.kv_basis":
    "Goal kv: constant (the motor constant 60/(2π·Ke), default) or no_load (no-load speed ÷ supply, what a tachometer and a bench supply measure).",
  "target.fixed": "Goal fixed: the winding you chose (from a candidate list), planned like a restore with a warning for any limit it breaks.",
  "target.fixed.turns": "Turns per coil of the chosen winding.",
  "target.fixed.wire": 'Wire of the chosen winding: "0.25 mm grade 2", "33 AWG heavy" …',
  "target.fixed.strands": "Strands in hand (default 1).",
  "target.rated_current": "Optional: current at which the current density is checked when no duty is given.",
  "target.limits": "Constraints on the solver's choice.",
  "target.limits.copper_fill": "Most copper area ÷ free slot area (default 0.40, common practice for hand winding).",
  "target.limits.space_fill": "Most area of the wires' overall circles ÷ free slot area (default 0.70).",
  "target.limits.current_density":
    "Most current density in each strand, at the duty point or rated_current. Default with a duty or rated_current: 10 A/mm2 (or the original's own density there when higher); none turns it off.",
  "target.limits.hot_stall_current": "Most stall current with the winding hot. Optional.",
  "target.hot_temperature": "Winding temperature for the hot figures (default 80 C).",
  wire_stock: "Wires on the shelf to choose from; leave the key out for the whole catalogue.",
  "wire_stock[]": 'A wire: "0.25 mm grade 2", "33 AWG heavy", "36 SWG", or measured { bare: 0.25 mm, overall: 0.282 mm }.',
  max_in_hand: "Most strands you are willing to wind together (default 1).",
};

type Json = Record<string, unknown>;

const QTY_DESC = /^an? ([a-z ]+): a number with a unit such as "([^"]+)", or a bare number in (.+)$/;
const FRACTION_DESC = /^a fraction such as/;

function isObject(x: unknown): x is Json {
  return x !== null && typeof x === "object" && !Array.isArray(x);
}

/**
 * Give a quantity node its unit list, an example and a pattern, a fraction node its pattern;
 * returns how to write the value (also left as the node's description), or undefined.
 */
function decorateValue(node: Json): string | undefined {
  const d = typeof node.description === "string" ? node.description : "";
  const q = QTY_DESC.exec(d);
  if (q) {
    const kind = q[1].replace(/ /g, "_") as QuantityKind;
    const how = `Write ${q[0].startsWith("an ") ? "an" : "a"} ${q[1]} with its unit (${unitNames(kind).join(", ")}), e.g. "${example(kind)}"; a bare number is in ${defaultUnit(kind)}.`;
    node.description = how;
    node.pattern = QUANTITY_PATTERN;
    node.examples = [example(kind)];
    return how;
  }
  if (FRACTION_DESC.test(d)) {
    const how = 'Write a fraction such as 0.40, or a percentage such as "40 %".';
    node.description = how;
    node.pattern = FRACTION_PATTERN;
    node.examples = [0.4, "40 %"];
    return how;
  }
  return undefined;
}

function walk(node: unknown, path: string): void {
  if (!isObject(node)) return;
  const how = decorateValue(node);
  const help = FIELD_HELP[path];
  // the field's help replaces zod's short description; how to write a quantity follows it
  if (help) node.description = how ? `${help} ${how}` : help;
  if (isObject(node.properties)) {
    for (const [k, v] of Object.entries(node.properties)) walk(v, path ? `${path}.${k}` : k);
  }
  if (node.items !== undefined) walk(node.items, `${path}[]`);
  if (Array.isArray(node.anyOf)) {
    // branches of a union share the field's path: the help goes on the union, not on each branch
    for (const b of node.anyOf) walkBranch(b, path);
  }
}

function walkBranch(node: unknown, path: string): void {
  if (!isObject(node)) return;
  decorateValue(node);
  if (node.type === "string" && typeof node.description === "string" && node.description.startsWith("a wire")) {
    node.examples = ["0.25 mm grade 2", "33 AWG heavy", "36 SWG"];
  }
  if (isObject(node.properties)) {
    for (const [k, v] of Object.entries(node.properties)) {
      // measured wire { bare, overall }: lengths, written like any length
      if ((k === "bare" || k === "overall") && isObject(v)) {
        v.pattern = QUANTITY_PATTERN;
        v.examples = [k === "bare" ? "0.25 mm" : "0.282 mm"];
      }
      walk(v, `${path}.${k}`);
    }
  }
}

/**
 * A schema written in one of several forms (a bench test: the form of its kind, src/job/schema.ts
 * `EDITOR_FORMS`) is shown to editors as the choice of those forms (`anyOf`, each a map with its
 * fixed `kind`), so an editor and the workbench's form offer each kind's fields only.
 */
function formsOf(ctx: { zodSchema: unknown; jsonSchema: Json }): void {
  const forms = EDITOR_FORMS.get(ctx.zodSchema as z.ZodType);
  if (!forms) return;
  const { $schema: _, ...json } = z.toJSONSchema(forms, { io: "input", unrepresentable: "any" }) as Json;
  for (const k of Object.keys(ctx.jsonSchema)) delete ctx.jsonSchema[k];
  Object.assign(ctx.jsonSchema, json);
}

/** The job file's JSON Schema (draft 2020-12), as a plain object. */
export function jobJsonSchema(): Json {
  const generated = z.toJSONSchema(jobSchema, { io: "input", unrepresentable: "any", override: formsOf }) as Json;
  walk(generated, "");
  const { $schema, ...rest } = generated;
  return {
    $schema,
    $id: JOB_SCHEMA_ID,
    title: "armwind job file, version 1",
    description:
      "A job file for armwind: the stripped armature, the old winding as recorded while stripping, and what the new winding should do. Rules that compare two fields (a goal needs its value, a lap or wave winding its span, a slot its area or three dimensions) are checked by `armwind check`, not here.",
    ...rest,
  };
}

/** The schema as the committed file holds it: two-space JSON and a final newline. */
export function jobJsonSchemaText(): string {
  return JSON.stringify(jobJsonSchema(), null, 2) + "\n";
}
