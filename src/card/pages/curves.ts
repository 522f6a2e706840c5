/**
 * Page 5, the curves (speed, current, efficiency and output against torque, original dashed and
 * new solid, vector-drawn) and the candidates with the sensitivity table.
 */
import type { OperatingPoint } from "../../motor/model.js";
import type { Plan } from "../../design/types.js";
import { reasonText } from "../../design/plan.js";
import { grey, type Sheet } from "../sheet.js";
import { goalFigure, goalName, goalUnit, ohm, pct, sig, torqueUnit } from "../text.js";
import { ticksFromZero } from "../../plot/ticks.js";

const RPM = 60 / (2 * Math.PI);
/** Axis labels: the tick value without trailing zeros. */
const tick = (v: number) => String(Number(v.toPrecision(6)));

type Key = "speed" | "current" | "efficiency" | "output";
const CHART: Record<Key, { title: string; unit: string; value: (p: OperatingPoint) => number }> = {
  speed: { title: "Speed", unit: "rpm", value: (p) => p.speed * RPM },
  current: { title: "Current", unit: "A", value: (p) => p.current },
  efficiency: { title: "Efficiency", unit: "%", value: (p) => p.efficiency * 100 },
  output: { title: "Output power", unit: "W", value: (p) => p.outputW },
};

export function curvesPage(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  s.newPage("Curves");
  if (plan.job.armature.field === "series" || plan.motor.curve.length === 0) {
    s.framed(
      (x, y, w) => {
        const head = plan.job.armature.field === "series" ? "No curves for a series (universal) motor" : "No curves: nothing calibrates this motor";
        s.at(head, x, y, { size: T.subheading + 2, bold: true, width: w });
        const text =
          plan.job.armature.field === "series"
            ? "Its field current is its armature current, so it has no constant speed–torque line and no safe no-load speed: unloaded it races until it bursts. Never run it unloaded; judge the rewind by the bench checks and a brief run under load. The armature figures on page 1 (resistances, Ke scaling with turns) still hold."
            : "Without a generator test, a no-load test, a nameplate, logbook records or magnet data the motor constant is unknown; the card shows resistances and the cut list only.";
        s.at(text, x, y + 22, { size: T.body + 1, width: w });
        return 22 + s.measure(text, { size: T.body + 1, width: w });
      },
      { heavy: true, estimate: 90 },
    );
    return;
  }
  const o = plan.original_motor.curve;
  const n = plan.motor.curve;
  const maxT = Math.max(...o.map((p) => p.torque), ...n.map((p) => p.torque), plan.duty?.torque ?? 0);
  const tu = torqueUnit(maxT);
  s.para(
    `${sig(plan.supply)} V ${plan.supply_kind.toUpperCase()}, winding hot (${sig(plan.resistance.hot_temperature)} °C), from no load to stall. Original dashed, new solid${plan.duty ? "; ● the duty point of the new winding, ○ of the original" : ""}.`,
    { size: T.body },
  );
  // legend
  const ly = s.y;
  s.doc.save().lineWidth(1.2).dash(5, { space: 3 }).moveTo(s.left, ly + 5).lineTo(s.left + 36, ly + 5).stroke().undash().restore();
  s.at("original winding", s.left + 42, ly, { size: T.label });
  s.doc.save().lineWidth(2).moveTo(s.left + 160, ly + 5).lineTo(s.left + 196, ly + 5).stroke().restore();
  s.at(`new winding (${plan.design.turns} × ${plan.design.wire.label}${plan.design.strands > 1 ? ` × ${plan.design.strands}` : ""})`, s.left + 202, ly, { size: T.label, bold: true });
  s.y += 18;
  const keys = s.L.curves.charts;
  const gap = 22;
  const cw = (s.width - gap) / 2;
  const ch = Math.min(s.L.curves.height, (s.room() - gap - 10) / Math.ceil(keys.length / 2));
  const top = s.y;
  keys.forEach((k, i) => {
    const x = s.left + (i % 2) * (cw + gap);
    const y = top + Math.floor(i / 2) * (ch + gap);
    chart(s, plan, CHART[k], k, x, y, cw, ch, o, n, tu);
  });
  s.y = top + Math.ceil(keys.length / 2) * (ch + gap);
}

function chart(
  s: Sheet,
  plan: Plan,
  def: (typeof CHART)[Key],
  key: Key,
  x: number,
  y: number,
  w: number,
  h: number,
  o: OperatingPoint[],
  n: OperatingPoint[],
  tu: { unit: string; k: number },
): void {
  const T = s.L.type;
  const d = s.doc;
  const padL = 40;
  const padB = 30;
  const padT = 16;
  const px = x + padL;
  const pw = w - padL - 6;
  const py = y + padT;
  const ph = h - padT - padB;
  const all = [...o, ...n];
  const maxT = Math.max(...all.map((p) => p.torque)) * tu.k;
  const maxV = Math.max(...all.map(def.value), key === "speed" && plan.duty ? plan.duty.target_speed * RPM : 0);
  const xt = ticksFromZero(maxT);
  const yt = ticksFromZero(key === "efficiency" ? Math.min(100, maxV) : maxV);
  const xMax = xt[xt.length - 1];
  const yMax = yt[yt.length - 1];
  const X = (t: number) => px + (t / xMax) * pw;
  const Y = (v: number) => py + ph - (v / yMax) * ph;
  s.at(`${def.title}, ${def.unit}`, x, y, { size: T.label + 1, bold: true });
  d.save().lineWidth(0.3).strokeColor(grey(0.75));
  for (const t of xt) d.moveTo(X(t), py).lineTo(X(t), py + ph);
  for (const v of yt) d.moveTo(px, Y(v)).lineTo(px + pw, Y(v));
  d.stroke().restore();
  d.save().lineWidth(0.9).rect(px, py, pw, ph).stroke().restore();
  for (const t of xt) s.at(tick(t), X(t) - 15, py + ph + 3, { size: T.small, width: 30, align: "center" });
  for (const v of yt) s.at(tick(v), x, Y(v) - 4, { size: T.small, width: padL - 4, align: "right" });
  s.at(`torque, ${tu.unit}`, px, py + ph + 15, { size: T.small, width: pw, align: "center" });
  const line = (pts: OperatingPoint[], dashed: boolean, lw: number) => {
    const v = pts.map((p) => [X(p.torque * tu.k), Y(Math.max(0, def.value(p)))] as [number, number]);
    if (v.length < 2) return;
    d.save();
    d.rect(px, py, pw, ph).clip();
    d.lineWidth(lw).lineJoin("round");
    if (dashed) d.dash(5, { space: 3 });
    d.moveTo(v[0][0], v[0][1]);
    for (const q of v.slice(1)) d.lineTo(q[0], q[1]);
    d.stroke();
    d.restore();
  };
  line(o, true, 1.2);
  line(n, false, 2);
  if (plan.duty) {
    const du = plan.duty;
    const val: Record<Key, number> = { speed: du.speed * RPM, current: du.current, efficiency: du.efficiency * 100, output: du.output_w };
    const cx = X(du.torque * tu.k);
    const cy = Y(val[key]);
    d.save().circle(cx, cy, 3.6).fill("#000000").restore();
    if (plan.original_duty) {
      const od = plan.original_duty;
      const oval: Record<Key, number> = { speed: od.speed * RPM, current: od.current, efficiency: od.efficiency * 100, output: od.output_w };
      d.save().lineWidth(1).circle(X(od.torque * tu.k), Y(oval[key]), 3.6).fillAndStroke("#ffffff", "#000000").restore();
    }
    d.save().lineWidth(0.5).dash(2, { space: 2 }).moveTo(cx, py).lineTo(cx, py + ph).stroke().undash().restore();
    if (key === "speed") {
      const ty = Y(du.target_speed * RPM);
      d.save().lineWidth(0.8).moveTo(cx - 7, ty).lineTo(cx + 7, ty).moveTo(cx, ty - 7).lineTo(cx, ty + 7).stroke().restore();
      s.at(`duty target ${sig(du.target_speed * RPM)} rpm`, Math.min(cx + 9, px + pw - 90), ty - 12, { size: T.small, bold: true });
    }
  }
}

export function candidatesPage(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  s.newPage("Candidates");
  const rej = Object.entries(plan.rejections).filter(([, v]) => (v ?? 0) > 0);
  s.para(
    `${plan.candidates_total} windings looked at (turns × stock wire × strands in hand); the best and the nearest misses below, best first. Goal ${goalName(plan)}: ${plan.goal.summary}.` +
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
      c.ke === null ? "—" : sig(60 / (2 * Math.PI * c.ke)),
      goalFigure(plan, c.achieved),
      (chosen.has(i) ? "CHOSEN — " : "") + (c.meets_goal ? "meets the goal" : c.rejected_because.length ? `rejected: ${c.rejected_because.join(", ")}` : "misses the goal"),
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
        sig(x.achieved), // sensitivity figures come in the goal's unit already (as the terminal prints them)
        x.rejected_because.length ? x.rejected_because.map(reasonText).join("; ") : x.meets_goal ? "meets the goal" : "",
      ]),
      { size: T.table },
    );
  }
}
