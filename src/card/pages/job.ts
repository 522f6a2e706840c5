/** Page 1 of the card, the job (src/card/render.ts draws the sections in the layout file's order). */
import { KV_DEFINITIONS, kvRows } from "../../format/kv.js";
import type { MotorReport, Plan } from "../../design/types.js";
import type { Sheet } from "../sheet.js";
import { calibrationText, fieldText, goalName, goalSummary, mltSourceText, mm, ohm, pct, rpm, sig, strandsText, torqueUnit, wireSizes } from "../text.js";
import { seriesMotorRows, supplyText } from "./series.js";
import { spoolMassNeeded } from "../../shop/merge.js";
import { hasShuntField } from "../../format/shunt.js";

/**
 * Page 1, the job: who and what, THE WINDING in large type, the lead throw to copy, the armature,
 * the cut list (or the spool for a continuous winding), what it will read, the warnings and notes,
 * then what the motor will do. The warnings come before the motor table: they are what the winder
 * must see on the first page, and the table, kept whole, fills the next page when it does not fit.
 */
export function jobPage(s: Sheet, plan: Plan): void {
  jobHeader(s, plan);
  if (!plan.feasible) infeasibleBox(s, plan);
  windingBox(s, plan);
  const sp = plan.layout.spec;
  if (sp.style !== "tooth" || sp.lead_throw !== 0) leadThrowBox(s, plan);
  armatureAndWinding(s, plan);
  cutList(s, plan);
  expectedResults(s, plan);
  warningsAndNotes(s, plan);
  motorTable(s, plan);
  motorBasis(s, plan);
}

/** The card's header (with the shop and bench from the profile), the job id, title, customer and notes. */
function jobHeader(s: Sheet, plan: Plan): void {
  const j = plan.job;
  const T = s.L.type;
  s.newPage();
  const where = [s.context.shop, s.context.bench ? `bench ${s.context.bench}` : undefined].filter(Boolean).join("  ·  ");
  s.at(`ARMATURE REWIND — JOB CARD${where ? `  ·  ${where}` : ""}`, s.left, s.y, { size: T.small, bold: true, grey: 0.35, width: s.width });
  s.y += T.small * 1.6;
  s.para(j.id, { size: T.title, bold: true, after: 2 });
  s.para(j.title, { size: T.subheading, after: 2 });
  if (j.customer) s.para(`Customer: ${j.customer}`, { size: T.body, after: 2 });
  if (j.notes) s.para(`Notes: ${j.notes}`, { size: T.body, grey: 0.3, after: 2 });
  s.y += 4;
}

/** A heavy box saying the winding shown is the closest, not one that meets the goal, and why. */
function infeasibleBox(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  s.framed(
    (x, y, w) => {
      const h1 = s.at("CLOSEST WINDING — DOES NOT MEET THE GOAL", x, y, { size: 15, bold: true, width: w });
      const why = plan.binding ?? "no candidate within the limits reaches the goal";
      const text = `${why.charAt(0).toUpperCase()}${why.slice(1)}. Goal ${goalName(plan)}: ${goalSummary(plan.goal)}. Decide with the customer before winding.`;
      const h2 = s.at(text, x, y + h1 + 3, { size: T.body, width: w });
      return h1 + 3 + h2;
    },
    { heavy: true, estimate: 60 },
  );
}

/** THE WINDING: turns, wire and strands in large type, with the wire's sizes, the fill and build, and the goal. */
function windingBox(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  const d = plan.design;
  s.framed(
    (x, y, w) => {
      s.at(plan.feasible ? "WIND" : "CLOSEST WINDING", x, y, { size: T.label, bold: true });
      let cy = y + T.label * 1.4;
      const big = `${d.turns} turns`;
      s.at(big, x, cy, { size: T.hero, bold: true });
      const bw = s.widthOf(big, { size: T.hero, bold: true });
      s.at("per coil", x + bw + 8, cy + T.hero * 0.45, { size: T.subheading });
      cy += T.hero * 1.25;
      const wire = `× ${d.wire.label}${d.strands > 1 ? `   × ${d.strands} in hand` : ""}`;
      s.at(wire, x, cy, { size: T.hero * 0.8, bold: true });
      cy += T.hero * 0.8 * 1.3;
      const lines = [
        `${wireSizes(d.wire)}; ${strandsText(d.strands)}${d.strands > 1 ? " (wind them side by side as one conductor)" : ""}.`,
        `Copper fill ${pct(d.copper_fill)} (limit ${pct(plan.fill_limit)}), space fill ${pct(d.space_fill)}` +
          (d.build
            ? `; ${d.build.layers} layer${d.build.layers === 1 ? "" : "s"} of ${d.build.turnsPerLayer} turns, build ${mm(d.build.build)} of ${mm(d.build.room)} mm room.`
            : "; layer build not known (slot dimensions not given)."),
        `Goal ${goalName(plan)}: ${goalSummary(plan.goal)}.`,
      ];
      for (const l of lines) {
        const h = s.at(l, x, cy, { size: T.body + 1, width: w });
        cy += h + 2;
      }
      return cy - y;
    },
    { heavy: true, pad: 10, estimate: 150 },
  );
}

/** The lead throw, the one thing to copy from the old winding, in a box of its own. */
function leadThrowBox(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  const sp = plan.layout.spec;
  s.framed(
    (x, y, w) => {
      const head = `COPY FROM THE OLD WINDING — LEAD THROW ${String(sp.lead_throw).replace("-", "−")} BAR${Math.abs(sp.lead_throw) === 1 ? "" : "S"}`;
      const hh = s.at(head, x, y, { size: T.subheading + 1, bold: true, width: w });
      const text =
        `Bar 1 sits ${String(sp.lead_throw).replace("-", "−")} bar${Math.abs(sp.lead_throw) === 1 ? "" : "s"} clockwise (seen from the commutator end; negative = anticlockwise) from the bar on coil 1's centre line, midway between its slots ${plan.coils[0].go_slot} and ${plan.coils[0].return_slot}. ` +
        `It sets the brush neutral: copy it from the old armature (slots and bars marked before stripping), never guess it. A wrong lead throw reads normal bar to bar but sparks and runs poorly.`;
      const h = s.at(text, x, y + hh + 3, { size: T.body, width: w });
      return hh + 3 + h;
    },
    { heavy: false, estimate: 60 },
  );
}

/** The armature and the winding side by side as key–value pairs. */
function armatureAndWinding(s: Sheet, plan: Plan): void {
  const j = plan.job;
  const sp = plan.layout.spec;
  s.subheading("Armature and winding");
  const slotArea = `${sig(plan.slot.gross_area * 1e6)} mm² gross, ${sig(plan.slot.free_area * 1e6)} mm² free after the liner`;
  const arm: [string, string][] = [
    ["slots / bars / poles", `${sp.slots} / ${plan.layout.bars} / ${sp.poles}`],
    ["field", fieldText[j.armature.field] ?? j.armature.field],
    ["stack length", `${mm(j.armature.stack_length)} mm`],
    ["rotor Ø", `${mm(j.armature.rotor_diameter)} mm`],
    ["slot area", slotArea],
    ["slot opening", `${mm(plan.slot.opening)} mm`],
    ["liner", plan.slot.liner > 0 ? `${mm(plan.slot.liner)} mm` : "none"],
  ];
  const win: [string, string][] = [
    ["style", sp.style],
    ["span", sp.style === "tooth" ? "1 (round one tooth)" : `${sp.span} slots (slot 1 to ${1 + sp.span})`],
  ];
  if (sp.style !== "tooth") {
    win.push(["coils per slot u", String(sp.coils_per_slot)]);
    win.push(["progression", sp.progression]);
    win.push([
      "commutator pitch",
      `${Number.isInteger(plan.layout.commutator_pitch) ? plan.layout.commutator_pitch : sig(plan.layout.commutator_pitch)} bar${plan.layout.commutator_pitch === 1 ? "" : "s"}`,
    ]);
    if (sp.dead_coil) win.push(["dead coil", "yes (one coil wound, not connected)"]);
  } else win.push(["direction", `${sp.direction === "cw" ? "clockwise" : "anticlockwise"} round each tooth`]);
  win.push(["parallel paths", String(plan.paths)]);
  win.push(["lead throw", `${String(sp.lead_throw).replace("-", "−")} bars`]);
  win.push(["brushes", `${sp.brushes.count}, ${sig(sp.brushes.width_bars)} bar wide`]);
  s.need(120);
  const h1 = s.pairs(arm, s.left, s.y, s.width / 2 - 8, { keyWidth: 92 });
  const h2 = s.pairs(win, s.left + s.width / 2 + 8, s.y, s.width / 2 - 8, { keyWidth: 92 });
  s.y += Math.max(h1, h2) + 6;
}

/** What the winding will read on the bench (coil, bar to bar, terminal cold and hot), with the notes on where those figures hold. */
function expectedResults(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  s.subheading("Expected results");
  const r = plan.resistance;
  const res: [string, string][] = [
    ["coil", `${ohm(r.coil_ohm)} Ω at 20 °C`],
    ["bar to bar", `${ohm(r.bar_to_bar_ohm)} Ω at 20 °C (every pair on the bench sheet)`],
    ["terminal", `${ohm(r.terminal_ohm)} Ω at 20 °C (${ohm(r.terminal_min_ohm)} to ${ohm(r.terminal_max_ohm)} Ω as the rotor turns)`],
    ["terminal hot", `${ohm(r.terminal_hot_ohm)} Ω at ${sig(r.hot_temperature)} °C`],
  ];
  s.need(60);
  s.y += s.pairs(res, s.left, s.y, s.width, { keyWidth: 100 }) + 6;
  for (const v of r.validity) s.para(`Note: ${v}`, { size: T.small });
}

/** Where the motor figures come from: the calibration and its uncertainty, or a series motor's basis; the brush drop. */
function motorBasis(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  const c = plan.calibration;
  if (plan.series) {
    const sp = plan.series;
    s.para(
      `Series motor figures at ${supplyText(sp.supply)}, rated load hot (${sig(plan.resistance.hot_temperature)} °C), locked rotor cold; the rated torque from the ${sp.ratedSource?.replace("_", " ") ?? "—"}. ${sp.basis.join("; ")}. Brush drop: ${c.brush_drop_basis}.`,
      { size: T.small, grey: 0.25 },
    );
  } else
    s.para(
      `Motor figures at ${sig(plan.supply)} V ${plan.supply_kind.toUpperCase()}, calibrated from the ${calibrationText[c.source] ?? c.source}` +
        `${c.uncertainty !== null ? `, uncertainty about ±${sig(c.uncertainty * 100, 2)} % in Ke` : ", uncertainty not known"}. ${c.basis}. Brush drop: ${c.brush_drop_basis}.`,
      { size: T.small, grey: 0.25 },
    );
}

/** The plan's warnings, the notes on this winding, and what the logbook corrected. */
function warningsAndNotes(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  if (plan.warnings.length) {
    s.subheading(`Warnings (${plan.warnings.length})`);
    for (const wn of plan.warnings) s.para(`▲ ${wn.path ? wn.path + ": " : ""}${wn.message} [${wn.code}]`, { size: T.body, after: 3 });
  }
  if (plan.layout.notes.length) {
    s.subheading("Notes on this winding");
    for (const n of plan.layout.notes) s.para(`• ${n}`, { size: T.small + 0.5, after: 2 });
  }
  if (plan.learning && plan.learning.records > 0) {
    s.para(
      `Logbook: ${plan.learning.records} finished rewind(s) of this armature family corrected the plan: ${plan.learning.moves.map((m) => `${m.figure} ${sig(m.from)} → ${sig(m.to)} ${m.unit}`).join("; ")}.`,
      { size: T.small },
    );
  }
}

/**
 * The motor, original against new: winding, terminal resistance, Kv in both senses (or a series
 * motor's rated-load and locked-rotor figures), no-load, stall, efficiency, output, and the duty
 * point when the job gives one; kept whole on one page.
 */
function motorTable(s: Sheet, plan: Plan): void {
  const o = plan.original_motor;
  const m = plan.motor;
  const maxT = Math.max(o.stallTorque ?? 0, m.stallTorque ?? 0, plan.duty?.torque ?? 0);
  const tu = torqueUnit(maxT || 0.001);
  const torque = (x: number | null) => (x === null ? "—" : sig(x * tu.k));
  const row = (label: string, f: (r: MotorReport) => string): string[] => [label, f(o), f(m)];
  const d = plan.design;
  const head: string[][] = [
    [
      "winding",
      `${plan.original.turns} × ${plan.original.wire.label}${plan.original.strands > 1 ? ` × ${plan.original.strands}` : ""}`,
      `${d.turns} × ${d.wire.label}${d.strands > 1 ? ` × ${d.strands}` : ""}`,
    ],
    ["terminal Ω at 20 °C", `${ohm(plan.original.terminal_ohm)}${plan.original.terminal_measured ? " (measured)" : ""}`, ohm(plan.resistance.terminal_ohm)],
  ];
  // a series motor: the series model's figures (card/pages/series.ts), no Kv, no stall figure at the supply
  const sp = plan.series;
  const seriesTu = torqueUnit(sp?.ratedTorque || 0.001);
  const seriesTorque = (x: number | null) => (x === null ? "—" : sig(x * seriesTu.k));
  const rows: string[][] = sp
    ? [...head, ...seriesMotorRows(sp, seriesTorque, seriesTu.unit)]
    : [
        ...head,
        ...kvRows(plan).map(([label, f]) => row(label, f)),
        row("no-load speed, rpm", (r) => rpm(r.noLoadSpeed)),
        row("no-load current, A", (r) => sig(r.noLoadCurrent)),
        row("stall current hot, A", (r) => sig(r.stallCurrent)),
        row("stall current cold, A", (r) => sig(r.stallCurrentCold)),
        row(`stall torque, ${tu.unit}`, (r) => torque(r.stallTorque)),
        row("peak efficiency", (r) => pct(r.peakEfficiency)),
        row("max output, W", (r) => sig(r.maxOutputW)),
      ];
  if (plan.duty && !sp) {
    const od = plan.original_duty;
    const du = plan.duty;
    rows.push([`at duty ${torque(du.torque)} ${tu.unit}: speed, rpm (target ${rpm(du.target_speed)})`, rpm(od?.speed), rpm(du.speed)]);
    if (hasShuntField(plan)) {
      // a shunt motor: the armature's current and what the meter at the terminals reads (the field's besides)
      rows.push(["   armature current, A", sig(od?.current), sig(du.current)]);
      rows.push(["   terminal current, A", sig(od?.terminal_current), sig(du.terminal_current)]);
    } else rows.push(["   current, A", sig(od?.current), sig(du.current)]);
    rows.push(["   efficiency", pct(od?.efficiency), pct(du.efficiency)]);
    rows.push(["   input, W", sig(od?.input_w), sig(du.input_w)]);
  }
  const w = s.width;
  s.table(
    [
      { head: "the motor", width: w * 0.44 },
      { head: "original", width: w * 0.28, align: "right" },
      { head: "new", width: w * 0.28, align: "right" },
    ],
    rows,
    { size: s.L.type.table + 0.5, boldCols: new Set([2]), keepTogether: true },
  );
  if (kvRows(plan).length) s.para(KV_DEFINITIONS, { size: s.L.type.body - 0.5 });
}

/**
 * The cut list: the wire's lengths (mean turn length, one coil, the whole winding, leads, spare
 * margin) and its copper mass, beside the figure to take to the spool in large type. Cut coil by
 * coil, that figure is the cut (m); a continuous winding (`winding.continuous: true`) is wound off
 * the spool with no cut per coil, so the box gives the length to wind off and the spool mass to
 * have, copper plus enamel (src/shop/merge.ts `spoolMassNeeded`).
 */
function cutList(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  const d = plan.design;
  const w = plan.wire;
  const continuous = plan.job.winding.continuous === true;
  s.subheading(
    continuous ? "Wire off the spool" : "Cut list",
    continuous ? "one wire through all the coils, no cut per coil" : "strands counted together unless said",
  );
  const need = spoolMassNeeded(plan);
  const rows: [string, string][] = [
    ["mean turn length", `${mm(w.mlt)} mm — ${mltSourceText[w.mlt_source] ?? w.mlt_source}`],
    [continuous ? "in each coil" : "one coil", `${sig(w.per_coil)} m`],
    ["whole winding", `${sig(w.winding)} m`],
    [continuous ? "loops to the bars" : "leads", `${sig(w.leads)} m (${mm(w.lead_allowance)} mm per coil end)`],
    ["spare margin", pct(w.spare_margin)],
    ["copper mass", `${sig(w.copper_mass * 1e3)} g`],
  ];
  if (continuous) rows.push(["with its enamel", `${sig(need * 1e3)} g`]);
  s.need(continuous ? 130 : 110);
  const hc = s.pairs(rows, s.left, s.y, s.width * 0.58, { keyWidth: 100 });
  const cx = s.left + s.width * 0.6;
  const cw = s.width * 0.4;
  const big = T.hero * 0.85;
  const lines: [string, number, boolean][] = continuous
    ? [
        ["WIND OFF THE SPOOL", T.label, true],
        [`${sig(w.cut)} m`, big, true],
        [
          `have ${sig(need * 1e3)} g on the spool (copper and enamel)${d.strands > 1 ? `: ${sig(w.cut_per_strand)} m from each of ${d.strands} spools` : ""}`,
          T.body,
          true,
        ],
      ]
    : [
        ["CUT", T.label, true],
        [`${sig(w.cut)} m`, big, true],
        d.strands > 1 ? [`${sig(w.cut_per_strand)} m from each of ${d.strands} spools`, T.body, true] : ["leads and spare included", T.body, false],
      ];
  let y = s.y + 4;
  for (const [text, size, bold] of lines) {
    y += s.at(text, cx + 8, y, { size, bold, width: cw - 16 }) + (size === big ? 0 : 2);
  }
  const boxH = Math.max(hc + 2, y - s.y + 4);
  s.doc
    .save()
    .lineWidth(s.L.line_width.heavy)
    .rect(cx, s.y - 2, cw, boxH)
    .stroke()
    .restore();
  s.y += Math.max(hc, boxH - 2) + 8;
}
