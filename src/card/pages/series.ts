/**
 * The series (universal) motor's figures on the card: the rows of the motor table (original and
 * new side by side) and the bench checks that suit a series motor — a load run at the rated
 * torque, a no-load run only for universal motors briefly in their housing, and the locked-rotor
 * check at its reduced voltage, never at mains. Figures come from the plan (design/series.ts).
 */
import type { Plan } from "../../design/types.js";
import { toRpm } from "../../format/units.js";
import { seriesMotorRows, supplyText } from "../../format/series.js";
import { rpm, sig } from "../text.js";

// the motor table's rows and the supply in words are shared with the terminal (src/format/series.ts)
export { seriesMotorRows, supplyText };

export interface BenchCheck {
  title: string;
  body: string;
  blanks: [string, string, number][];
}

/** The running checks for a series motor, in order: load run, no-load run (or why not), locked rotor. */
export function seriesBenchChecks(plan: Plan): BenchCheck[] {
  const sp = plan.series;
  const out: BenchCheck[] = [];
  const n = sp?.rewound.rated;
  if (sp && n && sp.ratedTorque !== null) {
    out.push({
      title: "Load run at rated torque",
      body: `Coupled to its load or a brake set to ${sig(sp.ratedTorque * 1e3)} mN·m, at ${supplyText(sp.supply)}: expected ${sig(n.current)} A and ${rpm(n.speed)} rpm (winding hot), ${sig(n.inputW)} W input. Guard the shaft.`,
      blanks: [
        ["current", "A", 110],
        ["speed", "rpm", 130],
      ],
    });
  }
  if (sp?.noLoad) {
    out.push({
      title: "No-load run: brief, in its housing",
      body: `Universal motor with its own fan, assembled in its housing: a few seconds at ${supplyText(sp.supply)}, expected about ${sig(sp.noLoad.current)} A and ${sig(toRpm(sp.noLoad.speed))} rpm. Stand clear of the plane of rotation; stop at once if it runs faster.`,
      blanks: [
        ["current", "A", 110],
        ["speed", "rpm", 130],
      ],
    });
  } else {
    out.push({
      title: "No-load run: NOT for this motor",
      body: "Series field: never run it unloaded — its speed has no limit without load and it can burst. Large series DC motors never run unloaded; vehicle starters only as their service data say. Check running only under a load, briefly.",
      blanks: [],
    });
  }
  if (sp?.lockedRotor) {
    const lr = sp.lockedRotor;
    out.push({
      title: `Locked-rotor check at ${supplyText(lr.supply)} (not at mains)`,
      body: `Rotor clamped, winding cold, from a variable transformer or bench supply, a few seconds only: expected ${sig(sp.rewound.lockedRotorCurrent)} A (the original: ${sig(sp.original.lockedRotorCurrent)} A). Why this voltage: ${lr.basis}.`,
      blanks: [
        ["supply", "V", 100],
        ["current", "A", 110],
      ],
    });
  } else {
    out.push({
      title: "Locked-rotor check: no expected figure",
      body: "Needs the field's resistance, and on AC its inductance or a locked-rotor reading of the original (field_winding), and a rated current. Never hold the rotor at mains voltage.",
      blanks: [],
    });
  }
  return out;
}
