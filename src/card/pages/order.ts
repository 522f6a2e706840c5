/**
 * The order of work, as a checklist in its real sequence: get the wire (the spool mass to have,
 * copper plus enamel), wind, the bench checks before varnish, varnish and cure, skim and undercut
 * then bar to bar again, balance, the run, and the record. A continuous winding
 * (`winding.continuous: true`) is wound off the spool instead of cut coil by coil.
 */
import type { Plan } from "../../design/types.js";
import type { Sheet } from "../sheet.js";
import { command, sig } from "../text.js";
import { pageBreaks } from "../layout.js";
import { spoolMassNeeded } from "../../shop/merge.js";

const g = (kg: number) => `${sig(kg * 1e3)} g`;

/** The checklist's steps: a title and what to do, in order (also what tests read back). */
export function orderSteps(plan: Plan, spoolMass?: number): [string, string][] {
  const d = plan.design;
  const w = plan.wire;
  const need = spoolMassNeeded(plan);
  const continuous = plan.job.winding.continuous === true;
  const spool =
    spoolMass === undefined
      ? ""
      : spoolMass >= need
        ? ` The shelf's spool holds ${g(spoolMass)}: enough.`
        : ` The shelf's spool holds only ${g(spoolMass)}: get more before starting.`;
  const strands = d.strands > 1 ? ` (${d.strands} strands: ${sig(w.cut_per_strand)} m from each of ${d.strands} spools)` : "";
  const series = plan.job.armature.field === "series";
  return [
    [
      "Wire",
      `Have at least ${g(need)} of ${d.wire.label} on the spool (copper ${g(w.copper_mass)} and its enamel) for ${sig(w.cut)} m${strands}.${spool} ` +
        (continuous
          ? "Wind off the spool: one wire through all the coils, no cut per coil — loop each coil's finish onto its bar and carry straight on to the next coil."
          : `Cut one length per coil as the cut list on the first page says, or wind off the spool and cut at each finish bar.`),
    ],
    ["Wind", `Coil by coil in the order of the coil table, ticking the tally as the turns go on and each coil as it is hooked.`],
    [
      "Bench checks before varnish",
      `Bar to bar (every pair), terminal resistance, ground, growler, polarity: the bench sheet, sections 1 and 2. Put right anything out of its window now: after varnish it is too late.`,
    ],
    [
      "Varnish and cure",
      `As the varnish maker's data sheet says (dip or trickle, then oven or air cure). Ventilation, no flames near solvents, gloves and eye protection.`,
    ],
    [
      "Skim and undercut, then bar to bar again",
      `Skim the commutator true, undercut the mica, clean the slots; then read bar to bar again (bench sheet, section 3).`,
    ],
    ["Balance", `Balance the armature (common practice for anything that runs fast); then assemble with the brushes bedded.`],
    [
      "The run",
      series
        ? `A locked-rotor check at a reduced voltage, then a run under load: a series (universal) motor must never race unloaded (bench sheet, section 3).`
        : `No-load current and speed, then a brief stall at a reduced supply (bench sheet, section 3). Guard the shaft.`,
    ],
    [
      "Record it",
      `${command("armwind new measured <job file>")} writes the readings file to fill in; ${command("armwind log <job file> --measured <that file>")} keeps it in the logbook.`,
    ],
  ];
}

/**
 * The order of work as a checklist: a tick box, the step's title and what to do. It starts below
 * what comes before it when the heading and its first two steps fit there, and breaks between
 * steps, never leaving one step alone on a page (layout.ts `pageBreaks`).
 */
export function orderPage(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  const steps = orderSteps(plan, s.context.spoolMass);
  const bodies = steps.map(([, body]) => s.layout(body, { size: T.body, width: s.width - 28 }));
  const heights = bodies.map((b) => T.subheading * 1.45 + b.height + 8);
  s.startSection("Order of work", { needed: heights[0] + heights[1] });
  const breaks = new Set(pageBreaks(heights, s.room(), s.fullRoom()));
  steps.forEach(([title], i) => {
    if (breaks.has(i)) s.need(s.bottom);
    s.tickBox(s.left, s.y + 1, s.L.tick_box, true);
    s.at(`${i + 1}. ${title}`, s.left + 28, s.y + 2, { size: T.subheading, bold: true, width: s.width - 28 });
    s.y += T.subheading * 1.45;
    s.draw(bodies[i], s.left + 28, s.y);
    s.y += heights[i] - T.subheading * 1.45;
  });
}
