/**
 * Page 5, the curves (speed, current, efficiency and output against torque, original dashed and
 * new solid, vector-drawn) and the candidates with the sensitivity table.
 */
import type { Plan } from "../../design/types.js";
import { reasonText } from "../../design/plan.js";
import { FONT_BOLD, FONT_REGULAR, type Sheet } from "../sheet.js";
import { kvFromKe } from "../../motor/emf.js";
import { goalFigure, goalName, goalSummary, goalUnit, ohm, pct, sig } from "../text.js";
import { curvesDrawing, hasCurves, hasEfficiency } from "../../plot/curves.js";
import { paintDrawing } from "../../plot/drawing.js";

export function curvesPage(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  if (!hasCurves(plan)) {
    // no empty curves page: the reason flows after the bench checks
    s.startSection("Curves", { needed: 90 });
    s.framed(
      (x, y, w) => {
        const head = plan.job.armature.field === "series" ? "No curves for a series (universal) motor" : "No curves: nothing calibrates this motor";
        s.at(head, x, y, { size: T.subheading + 2, bold: true, width: w });
        const text =
          plan.job.armature.field === "series"
            ? "Its field current is its armature current, so its curves need the field: give field_winding (the field's resistance, and on AC its inductance or a locked-rotor reading) with a no-load test or the nameplate. Never run it unloaded; judge the rewind by the bench checks and a brief run under load. The armature figures on page 1 (resistances, Ke scaling with turns) still hold."
            : "Without a generator test, a no-load test, a nameplate, logbook records or magnet data the motor constant is unknown; the card shows resistances and the cut list only.";
        return 22 + s.at(text, x, y + 22, { size: T.body + 1, width: w });
      },
      { heavy: true, estimate: 90 },
    );
    return;
  }
  s.startSection("Curves", { share: 0.7 });
  s.para(
    `${sig(plan.supply)} V ${plan.supply_kind.toUpperCase()}, winding hot (${sig(plan.resistance.hot_temperature)} °C), ${plan.series ? `from light load (a tenth of the rated torque) to rated: a series motor has no safe no-load end, and its stall is checked only at a reduced voltage (bench page)${plan.series.convert ? `; the original at its own ${sig(plan.series.originalSupply.volts)} V` : ""}` : "from no load to stall"}. Original dashed, new solid${plan.duty ? "; ● the duty point of the new winding, ○ of the original" : ""}.${hasEfficiency(plan) ? "" : " Efficiency is not drawn: with no no-load test the losses are unknown (a no-load test at the supply and one at about half of it give them)."}`,
    { size: T.body },
  );
  // legend
  const ly = s.y;
  s.doc
    .save()
    .lineWidth(1.2)
    .dash(5, { space: 3 })
    .moveTo(s.left, ly + 5)
    .lineTo(s.left + 36, ly + 5)
    .stroke()
    .undash()
    .restore();
  s.at("original winding", s.left + 42, ly, { size: T.label });
  s.doc
    .save()
    .lineWidth(2)
    .moveTo(s.left + 160, ly + 5)
    .lineTo(s.left + 196, ly + 5)
    .stroke()
    .restore();
  s.at(`new winding (${plan.design.turns} × ${plan.design.wire.label}${plan.design.strands > 1 ? ` × ${plan.design.strands}` : ""})`, s.left + 202, ly, {
    size: T.label,
    bold: true,
  });
  s.y += 18;
  const keys = s.L.curves.charts;
  const rows = Math.ceil(keys.length / 2);
  const gap = 22;
  const height = Math.min(s.L.curves.height * rows + gap * (rows - 1), s.room() - 10);
  // a little narrower than the text: the right-hand axis labels stay inside the margin
  const drawing = curvesDrawing(plan, { width: s.width - 24, height, keys, size: T.label + 1 });
  paintDrawing(s.doc, drawing, s.left, s.y, { regular: FONT_REGULAR, bold: FONT_BOLD });
  s.y += height + gap;
}

export function candidatesPage(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  s.startSection("Candidates", { share: 0.3 });
  const rej = Object.entries(plan.rejections).filter(([, v]) => (v ?? 0) > 0);
  s.para(
    `${plan.candidates_total} windings looked at (turns × stock wire × strands in hand); the best and the nearest misses below, best first. Goal ${goalName(plan)}: ${goalSummary(plan.goal)}.` +
      (rej.length ? ` Rejected over the whole sweep: ${rej.map(([k, v]) => `${k} ${v}`).join(", ")}.` : ""),
    { size: T.body },
  );
  const u = goalUnit(plan);
  const w = s.width;
  const cols = [
    { head: "turns", width: w * 0.07, align: "right" as const },
    { head: "wire", width: w * 0.2 },
    { head: "in hand", width: w * 0.07, align: "right" as const },
    { head: "Cu fill", width: w * 0.09, align: "right" as const },
    { head: "terminal Ω", width: w * 0.1, align: "right" as const },
    { head: "Kv rpm/V", width: w * 0.09, align: "right" as const },
    { head: `${goalName(plan)}, ${u}`, width: w * 0.12, align: "right" as const },
    { head: "verdict", width: w * 0.26 },
  ];
  const chosen = new Set<number>();
  const rows = plan.candidates.slice(0, s.L.candidates.rows).map((c, i) => {
    if (c === plan.design || (c.turns === plan.design.turns && c.wire.label === plan.design.wire.label && c.strands === plan.design.strands)) chosen.add(i);
    return [
      String(c.turns),
      c.wire.label,
      String(c.strands),
      pct(c.copper_fill),
      ohm(c.terminal_ohm),
      c.ke === null ? "—" : sig(kvFromKe(c.ke)),
      goalFigure(plan, c.achieved),
      (chosen.has(i) ? "CHOSEN — " : "") +
        (c.meets_goal ? "meets the goal" : c.rejected_because.length ? `rejected: ${c.rejected_because.join(", ")}` : "misses the goal"),
    ];
  });
  s.table(cols, rows, { boldRows: chosen, size: T.table });
  const codes = new Set(plan.candidates.flatMap((c) => c.rejected_because));
  if (codes.size) {
    s.para("Rejection codes:", { size: T.small, bold: true, after: 1 });
    for (const c of codes) s.para(`${c}: ${reasonText(c)}`, { size: T.small, after: 1 });
    s.y += 4;
  }
  if (plan.sensitivity.length) {
    s.subheading("Sensitivity", "what one step either way does");
    s.table(
      [
        { head: "change", width: w * 0.18 },
        { head: "winding", width: w * 0.26 },
        { head: "terminal Ω", width: w * 0.11, align: "right" },
        { head: "Cu fill", width: w * 0.1, align: "right" },
        { head: `${goalName(plan)}, ${u}`, width: w * 0.13, align: "right" },
        { head: "note", width: w * 0.22 },
      ],
      plan.sensitivity.map((x) => [
        x.label,
        `${x.turns} × ${x.wire}${x.strands > 1 ? ` × ${x.strands}` : ""}`,
        ohm(x.terminal_ohm),
        pct(x.copper_fill),
        goalFigure(plan, x.achieved), // SI in the plan: the goal's unit here
        x.rejected_because.length ? x.rejected_because.map(reasonText).join("; ") : x.meets_goal ? "meets the goal" : "",
      ]),
      { size: T.table },
    );
  }
}
