/** The plan for the terminal: the chosen winding first, then what it will read and do, then the rest. */
import type { Plan } from "../design/types.js";
import { KV_DEFINITIONS, kvRows } from "../format/kv.js";
import { reasonText } from "../design/plan.js";
import { mm, ohm, pct, rpm, sig, table } from "../format/number.js";
import { goalSummary } from "../format/goal.js";
import { GOAL_UNIT, goalValue, toGrams } from "../format/units.js";
import { seriesMotorRows, supplyText } from "../format/series.js";
import { torqueUnit } from "../plot/curves.js";
import { hasShuntField } from "../format/shunt.js";

/** The job, the layout and its notes; the winding to wind (or the closest), its goal and fills. */
function headText(plan: Plan, L: string[]): void {
  const j = plan.job;
  const d = plan.design;
  L.push(`${j.id}: ${j.title}`);
  const sp = plan.layout.spec;
  L.push(
    `${sp.style} winding, ${sp.slots} slots, ${plan.layout.bars} bars, ${sp.poles} poles` +
      (sp.style !== "tooth"
        ? `, span ${sp.span} (slot 1 to ${1 + sp.span}), ${sp.coils_per_slot} coil${sp.coils_per_slot > 1 ? "s" : ""} per slot, ${sp.progression}`
        : "") +
      `, ${plan.paths} parallel paths`,
  );
  for (const n of plan.layout.notes) L.push(`  note: ${n}`);
  L.push("");
  L.push(
    `${plan.feasible ? "WIND" : "CLOSEST (does not meet the goal)"}: ${d.turns} turns per coil of ${d.wire.label}${d.strands > 1 ? `, ${d.strands} strands in hand` : ""}`,
  );
  L.push(`  goal ${plan.goal.kind.replace(/_/g, " ")}: ${goalSummary(plan.goal)}`);
  if (plan.binding) L.push(`  ${plan.binding}`);
  L.push(
    `  copper fill ${pct(d.copper_fill)} (limit ${pct(plan.fill_limit)}), space fill ${pct(d.space_fill)}` +
      (d.build ? `, ${d.build.layers} layers of ${d.build.turnsPerLayer}, build ${mm(d.build.build)} of ${mm(d.build.room)} mm` : ""),
  );
}

/** The cut list (mm, m, g) and the expected readings at 20 °C (Ω, 4 figures). */
function cutAndReadingsText(plan: Plan, L: string[]): void {
  const d = plan.design;
  L.push("");
  L.push("Cut list");
  L.push(
    `  mean turn ${mm(plan.wire.mlt)} mm (${plan.wire.mlt_source.replace(/_/g, " ")}); one coil ${sig(plan.wire.per_coil)} m; winding ${sig(plan.wire.winding)} m`,
  );
  L.push(`  old wire ${plan.original.overall_basis}`);
  L.push(
    `  CUT ${sig(plan.wire.cut)} m${d.strands > 1 ? ` in all (${sig(plan.wire.cut_per_strand)} m from each of ${d.strands} spools)` : ""} with ${mm(plan.wire.lead_allowance)} mm leads and ${pct(plan.wire.spare_margin)} spare; copper ${sig(toGrams(plan.wire.copper_mass))} g`,
  );
  L.push("");
  L.push("Expected readings at 20 °C");
  L.push(`  coil ${ohm(plan.resistance.coil_ohm)} Ω, bar to bar ${ohm(plan.resistance.bar_to_bar_ohm)} Ω`);
  L.push(
    `  terminal ${ohm(plan.resistance.terminal_ohm)} Ω (${ohm(plan.resistance.terminal_min_ohm)} to ${ohm(plan.resistance.terminal_max_ohm)} Ω as the rotor turns), ${ohm(plan.resistance.terminal_hot_ohm)} Ω at ${sig(plan.resistance.hot_temperature)} °C`,
  );
  for (const v of plan.resistance.validity) L.push(`  note: ${v}`);
}

/** The rows every motor table starts with: the windings and their terminal resistance at 20 °C. */
function windingRows(plan: Plan): [string, string, string][] {
  const d = plan.design;
  return [
    [
      "turns × wire",
      `${plan.original.turns} × ${plan.original.wire.label}${plan.original.strands > 1 ? ` ×${plan.original.strands}` : ""}`,
      `${d.turns} × ${d.wire.label}${d.strands > 1 ? ` ×${d.strands}` : ""}`,
    ],
    ["terminal Ω (20 °C)", ohm(plan.original.terminal_ohm) + (plan.original.terminal_measured ? " meas." : ""), ohm(plan.resistance.terminal_ohm)],
  ];
}

/** The figures at the duty point, original and new (rpm, A), when the job gives a duty. */
function dutyRows(plan: Plan): [string, string, string][] {
  if (!plan.duty || !plan.original_duty) return [];
  const o = plan.original_duty;
  const n = plan.duty;
  // a shunt motor: the armature's current and the terminals' (the field's besides) apart
  const current: [string, string, string][] = hasShuntField(plan)
    ? [
        ["  armature current A", sig(o.current), sig(n.current)],
        ["  terminal current A", sig(o.terminal_current), sig(n.terminal_current)],
      ]
    : [["  current A", sig(o.current), sig(n.current)]];
  return [[`at ${sig(n.torque * 1e3)} mN·m: speed rpm`, rpm(o.speed), rpm(n.speed)], ...current, ["  efficiency", pct(o.efficiency), pct(n.efficiency)]];
}

/** A table of [label, original, new] rows, indented. */
function sideBySide(rows: string[][]): string {
  return table(["", "original", "new"], rows)
    .split("\n")
    .map((s) => "  " + s)
    .join("\n");
}

/**
 * A series (universal) motor: the series model's figures side by side (src/format/series.ts, the
 * card's rows), the brief no-load run only for a universal motor, the locked-rotor check at its
 * reduced voltage, and how the model was calibrated; never a stall figure at the supply.
 */
function seriesMotorText(plan: Plan, L: string[]): void {
  const sp = plan.series;
  L.push("");
  if (!sp) {
    L.push(`Series motor at ${sig(plan.supply)} V ${plan.supply_kind.toUpperCase()}: no running figures (the job does not describe the field: field_winding)`);
    L.push(sideBySide(windingRows(plan)));
    return;
  }
  L.push(
    `Series motor at ${supplyText(sp.supply)}: rated load hot (${sig(plan.resistance.hot_temperature)} °C), locked rotor cold; ${sp.ratedSource ? `the rated torque from the ${sp.ratedSource.replace("_", " ")}` : "the rated torque not known (give the nameplate or a load test)"}`,
  );
  const tu = torqueUnit(sp.ratedTorque || 0.001);
  const torque = (x: number | null) => (x === null ? "—" : sig(x * tu.k));
  L.push(sideBySide([...windingRows(plan), ...seriesMotorRows(sp, torque, tu.unit), ...dutyRows(plan)]));
  if (sp.noLoad) {
    L.push(`  no-load run, briefly, in its housing with its own fan: ${sig(sp.noLoad.current)} A at ${rpm(sp.noLoad.speed)} rpm (new winding)`);
  } else if (sp.supply.frequency > 0) {
    L.push("  no-load run: no expected figure (nothing running calibrates the field); never longer than a few seconds, in its housing");
  } else {
    L.push("  no-load run: not for this motor (a series DC motor races unloaded)");
  }
  L.push(
    sp.lockedRotor
      ? `  locked-rotor check at ${supplyText(sp.lockedRotor.supply)}, never at mains: ${sp.lockedRotor.basis}`
      : "  locked-rotor check: no expected figure (the field's resistance, on AC its inductance or a locked-rotor reading, and a rated current are needed); never at mains",
  );
  for (const b of sp.basis) L.push(`  model: ${b}`);
}

/** The original and the new motor side by side (rpm, A, mN·m, W), and at the duty point. */
function motorText(plan: Plan, L: string[]): void {
  if (plan.job.armature.field === "series") {
    seriesMotorText(plan, L);
    return;
  }
  L.push("");
  L.push(
    `Motor at ${sig(plan.supply)} V ${plan.supply_kind.toUpperCase()} (Ke from ${plan.calibration.source.replace(/_/g, "-")}${plan.calibration.uncertainty !== null ? `, ±${sig(plan.calibration.uncertainty * 100, 2)} %` : ""})`,
  );
  const m = plan.motor;
  const o = plan.original_motor;
  const rows: [string, string, string][] = [
    ...windingRows(plan),
    ...kvRows(plan).map(([label, f]) => [label, f(o), f(m)] as [string, string, string]),
    ["no-load speed rpm", rpm(o.noLoadSpeed), rpm(m.noLoadSpeed)],
    ["no-load current A", sig(o.noLoadCurrent), sig(m.noLoadCurrent)],
    ["stall current A (hot)", sig(o.stallCurrent), sig(m.stallCurrent)],
    ["stall current A (cold)", sig(o.stallCurrentCold), sig(m.stallCurrentCold)],
    ["stall torque mN·m", o.stallTorque === null ? "—" : sig(o.stallTorque * 1e3), m.stallTorque === null ? "—" : sig(m.stallTorque * 1e3)],
    ["peak efficiency", pct(o.peakEfficiency), pct(m.peakEfficiency)],
    ["max output W", sig(o.maxOutputW), sig(m.maxOutputW)],
    ...dutyRows(plan),
  ];
  if (kvRows(plan).length) L.push(`  ${KV_DEFINITIONS}`);
  L.push(sideBySide(rows));
}

/** The best candidates and nearest misses (goal figure in goal.unit), rejections, sensitivity, learning, warnings. */
function candidatesText(plan: Plan, L: string[]): void {
  L.push("");
  L.push(`Candidates: ${plan.candidates_total} looked at; best and nearest misses:`);
  const crow = plan.candidates
    .slice(0, 12)
    .map((c) => [
      String(c.turns),
      c.wire.label,
      String(c.strands),
      pct(c.copper_fill),
      ohm(c.terminal_ohm),
      sig(goalValue(plan.goal.kind, c.achieved)),
      c.meets_goal ? "meets" : c.rejected_because.length ? c.rejected_because.join(",") : "misses goal",
    ]);
  L.push(
    table(["turns", "wire", "k", "Cu fill", "R Ω", GOAL_UNIT[plan.goal.kind], "verdict"], crow, [true, false, true, true, true, true, false])
      .split("\n")
      .map((s) => "  " + s)
      .join("\n"),
  );
  const rej = Object.entries(plan.rejections);
  if (rej.length) L.push(`  rejected: ${rej.map(([k, v]) => `${k} ${v}`).join(", ")}`);
  if (plan.sensitivity.length) {
    L.push("Sensitivity:");
    for (const s of plan.sensitivity)
      L.push(
        `  ${s.label.padEnd(15)} ${String(s.turns).padStart(5)} × ${s.wire}: R ${ohm(s.terminal_ohm)} Ω, ${GOAL_UNIT[plan.goal.kind]} ${sig(goalValue(plan.goal.kind, s.achieved))}, fill ${pct(s.copper_fill)}${s.rejected_because.length ? ` (${s.rejected_because.map(reasonText).join("; ")})` : ""}`,
      );
  }
  if (plan.learning) {
    L.push(`Logbook: ${plan.learning.records} record(s) of family ${plan.job.armature.family} corrected this plan`);
    for (const mv of plan.learning.moves) L.push(`  ${mv.figure}: ${sig(mv.from)} → ${sig(mv.to)} ${mv.unit}`);
  }
  if (plan.warnings.length) {
    L.push("");
    L.push("Warnings:");
    for (const w of plan.warnings) L.push(`  ! ${w.path ? w.path + ": " : ""}${w.message} [${w.code}]`);
  }
}

/** The plan for the terminal (units converted here, at the edge: src/format). */
export function planText(plan: Plan): string {
  const L: string[] = [];
  headText(plan, L);
  cutAndReadingsText(plan, L);
  motorText(plan, L);
  candidatesText(plan, L);
  return L.join("\n");
}
