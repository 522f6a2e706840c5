/**
 * The measured-readings file for one job (docs/contracts.md "The measured file", version 1), as text with a
 * comment on every line: the bar-to-bar readings r1 … rC as empty placeholders (each with its bars
 * and the expected value, so a reading is never confused with the prediction), the temperature,
 * the meter's resolution, the `wound:` section, and how to take each reading. Pure: plan in, text out.
 */
import type { Plan } from "../design/types.js";
import { ohm, sig } from "../cli/format.js";

/** The commented measured file for `plan`, dated `date`, with `$schema` pointing at `schemaRef`. */
export function measuredTemplate(plan: Plan, date: string, schemaRef: string, meterResolution?: number): string {
  const C = plan.layout.bars;
  const r = plan.resistance;
  const d = plan.design;
  const L: string[] = [];
  L.push(`# yaml-language-server: $schema=${schemaRef}`);
  L.push(`#`);
  L.push(`# armwind measured file for job ${plan.job.id}: what the bench read on the finished rewind.`);
  L.push(`# Made by \`armwind new measured\`. Fill in every reading where it says ~ (the file is refused until`);
  L.push(`# each one is a number), then record it:   armwind log <job file> --measured <this file>`);
  L.push(`# or look for a faulty coil first:           armwind diagnose <job file> --measured <this file>`);
  L.push(`#`);
  L.push(`# HOW TO READ`);
  L.push(`#   Brushes lifted (or the armature out of the motor). Let the winding settle to room temperature`);
  L.push(`#   and write that temperature below: the readings are corrected to 20 °C with it (IEC 60028 copper).`);
  L.push(`#   Null the test leads first (touch them together and zero the meter, or subtract what it reads).`);
  L.push(`#   Bar to bar: probes on bar i and bar i+1, pressed on the bars' faces (not the risers), one pair`);
  L.push(`#   after the other round the commutator. Readings below about 40 counts of your meter's resolution`);
  L.push(`#   need a four-wire or millivolt-drop reading at a known current (common practice).`);
  L.push(`version: 1`);
  L.push(`job: ${plan.job.id}`);
  L.push(`date: ${date}                  # the day of the readings, YYYY-MM-DD`);
  L.push(`wound:                            # the winding actually laid: delete the lines that are as planned`);
  L.push(`  turns: ${d.turns}                       # per coil (planned: ${d.turns})`);
  L.push(`  wire: ${d.wire.label}`.padEnd(34) + `# planned: ${d.wire.label}`);
  L.push(`  strands: ${d.strands}                      # in hand (planned: ${d.strands})`);
  L.push(`temperature: ~                    # of the winding when the resistances were read, e.g. 21 C`);
  L.push(
    `meter_resolution: ${meterResolution !== undefined ? `${sig(meterResolution)} ohm` : "~"}`.padEnd(34) +
      `# the resolution of the range you read on, e.g. 0.01 ohm`,
  );
  L.push(`bar_to_bar:                       # r1 … r${C}, ohm unless a unit is written; r_i between bar i and bar i+1`);
  for (let i = 0; i < C; i++) {
    const a = i + 1;
    const b = i + 2 > C ? 1 : i + 2;
    L.push(`  - ~`.padEnd(34) + `# r${a}: bar ${a} to bar ${b} (expected ${ohm(r.bar_to_bar[i])} ohm at 20 C)`);
  }
  L.push(`terminal_resistance: ~            # across the brushes, or bar 1 to bar ${1 + Math.floor(C / 2)}: expected ${ohm(r.terminal_ohm)} ohm at 20 C`);
  L.push(`# Delete the tests you did not make. CAUTION: guard the turning shaft; stall only briefly at a reduced`);
  L.push(`# supply with the rotor clamped; a series (universal) motor must never run unloaded.`);
  if (plan.job.armature.field !== "series") L.push(`no_load: { supply: ~, current: ~, speed: ~ }   # e.g. { supply: 12 V, current: 0.17 A, speed: 9650 rpm }`);
  L.push(`stall: { supply: ~, current: ~ }  # brief, at a reduced supply, e.g. { supply: 3 V, current: 1.8 A }`);
  L.push(`insulation: { pass: ~ }           # true or false; or { test_volts: 500 V, megohm: 200 } (trained people only)`);
  L.push(`notes: ""                         # anything worth keeping: what you found, what you changed`);
  return L.join("\n") + "\n";
}
