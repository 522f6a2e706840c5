/** Page 6, cautions in plain words (local codes and licensed practice first), the finishing checklist and how to terminate the enamel at the hooks. */
import type { Plan } from "../../design/types.js";
import type { Sheet } from "../sheet.js";
import { sig } from "../text.js";

/** The cautions for a plan, as [title, text] pairs; the mains and series ones only when they apply. */
export function cautions(plan: Plan): [string, string][] {
  const out: [string, string][] = [
    [
      "Local codes first",
      "Local electrical codes, the shop's procedures and licensed practice come before anything on this card. These cautions are reminders, not a method statement.",
    ],
    [
      "Stall tests: seconds only",
      "A stalled armature draws its full stall current and the winding heats fast: apply the supply for a few seconds at most, at a reduced voltage where you can. Hold the rotor with a clamp or a lever arm, never by hand on the shaft or pulley.",
    ],
    [
      "Rotating parts",
      "Guard the shaft, pulley or gear; tie back loose clothing, hair and sleeves; clamp the motor to the bench before any run. Keep hands clear until it has stopped.",
    ],
    [
      "Soldering",
      "Solder fumes (flux) irritate the lungs: work with ventilation or fume extraction. The iron, the bars and fresh joints burn; park the iron in its stand.",
    ],
    [
      "Stripping enamel and varnish",
      "Burning off or chemically stripping enamel and varnish gives off harmful fumes and can catch fire: ventilate, keep a fire extinguisher at hand, wear gloves and eye protection with solvents or strippers, and follow the product's safety data sheet.",
    ],
    [
      "Insulation test at high voltage",
      "Only trained people with proper equipment run insulation (megger, hipot) tests. Take the test voltage from the standard the shop follows (e.g. IEC 60034-1); this card does not set one. Discharge the winding to the core after the test.",
    ],
  ];
  if (plan.mains) {
    out.push([
      `Mains voltage: ${sig(plan.supply)} V ${plan.supply_kind.toUpperCase()}`,
      "This supply is above extra-low voltage (IEC 60449 band I: 50 V AC, 120 V ripple-free DC) and can kill. Test from an isolated, switched supply through an RCD (residual-current device); isolate and prove dead before touching terminals or brushes; keep live parts covered during runs. Where local rules require, a licensed electrician does or supervises mains work.",
    ]);
  }
  if (plan.job.armature.field === "series") {
    out.push([
      "Series field (universal motor): never run it unloaded, except as below",
      "Its speed has no limit without load: unloaded it races and can burst the armature or fling the commutator. Run it coupled to its load, briefly, and stand clear of the plane of rotation. A small universal motor assembled in its housing with its own fan may run unloaded for a few seconds (the fan holds its speed); a large series DC motor never; a vehicle starter only as its service data say (common practice). Hold the rotor for a locked-rotor check only at the reduced voltage the bench page gives, never at mains.",
    ]);
  }
  return out;
}

export const FINISHING: string[] = [
  "Slot wedges (or banding) in every slot, wire below the slot opening",
  "Varnish / impregnation applied, and cured to the varnish maker's schedule",
  "Commutator skimmed true, and the mica undercut below the bars",
  "Brushes seated to the commutator curve (abrasive under the brush), free in their holders",
  "Armature dynamically balanced",
  "Leads dressed and tied down clear of the bearing and the fan",
];

export function cautionsPage(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  s.startSection("Cautions", { share: 0.25 });
  for (const [title, text] of cautions(plan)) {
    const mark = title.startsWith("Mains") || title.startsWith("Series") ? "▲ " : "";
    const body = s.layout(text, { size: T.body + 0.5 });
    s.need(body.height + T.subheading * 1.6);
    s.para(`${mark}${title}`, { size: T.subheading, bold: true, after: 2 });
    s.para(body, { size: T.body + 0.5, after: 7 });
  }
  s.subheading("Finishing");
  for (const item of FINISHING) {
    s.need(s.L.tick_box + 8);
    s.tickBox(s.left, s.y, s.L.tick_box, true);
    s.at(item, s.left + s.L.tick_box + 8, s.y + 2, { size: T.body + 1, width: s.width - s.L.tick_box - 8 });
    s.y += s.L.tick_box + 8;
  }
  s.subheading("Terminating at the hooks: which enamel is on the wire?", "from memory, common practice");
  s.para(
    `The plan knows the wire's size and build (${plan.design.wire.label}), not its enamel chemistry: read the spool label or the supplier's sheet. How the wire ends are made off at the bar hooks follows from the enamel:`,
    { size: T.body },
  );
  const w = s.width;
  s.table(
    [
      { head: "enamel (base coat)", width: w * 0.3 },
      { head: "thermal class", width: w * 0.15 },
      { head: "solders through?", width: w * 0.17 },
      { head: "at the hook", width: w * 0.38 },
    ],
    [
      ["polyurethane (often sold as solderable)", "130, 155 or 180", "yes, with a hot iron", "solder directly; the enamel burns off in the joint"],
      ["polyester-imide", "180", "no", "strip first (mechanically or with a stripper), or fuse / hot-stake at the hook"],
      ["polyester-imide + polyamide-imide overcoat", "200 to 220", "no", "strip first, or fuse / hot-stake at the hook"],
      ["polyimide", "220 and above", "no", "strip first; fuse / hot-stake"],
    ],
    { size: T.table },
  );
  s.para(
    "Classes as IEC 60085 names them (130 B, 155 F, 180 H, 200, 220), values from memory. Fusing (hot-staking) melts the enamel under heat and pressure at the hook; soldering needs enamel that burns off. Check each joint bar to bar afterwards.",
    { size: T.small, grey: 0.25 },
  );
}
