/**
 * The motor curves as a display list: speed, current, efficiency and output power against
 * torque, original dashed and new solid on the same axes, the duty point marked. Drawn on the
 * card and written as an SVG image beside it.
 */
import type { CurvePoint, Plan } from "../design/types.js";
import { sig } from "../format/number.js";
import { toRpm } from "../format/units.js";
import { ticksFromZero } from "./ticks.js";
import type { Drawing, Shape } from "./drawing.js";

/** Axis labels: the tick value without trailing zeros. */
const tick = (v: number) => String(Number(v.toPrecision(6)));

export type CurveKey = "speed" | "current" | "efficiency" | "output";
export const CURVES: Record<CurveKey, { title: string; unit: string; value: (p: CurvePoint) => number | null }> = {
  speed: { title: "Speed", unit: "rpm", value: (p) => toRpm(p.speed) },
  current: { title: "Current", unit: "A", value: (p) => p.current },
  efficiency: { title: "Efficiency", unit: "%", value: (p) => (p.efficiency === null ? null : p.efficiency * 100) },
  output: { title: "Output power", unit: "W", value: (p) => p.outputW },
};

/** Torque axis unit: mN·m below 1 N·m. */
export function torqueUnit(maxNm: number): { unit: string; k: number } {
  return maxNm < 1 ? { unit: "mN·m", k: 1e3 } : { unit: "N·m", k: 1 };
}

/**
 * The curves to draw, original and new: a series motor's from light load to rated (design/series.ts),
 * any other motor's from no load to stall. A series motor whose field the job does not describe has none.
 */
export function curveSets(plan: Plan): { o: CurvePoint[]; n: CurvePoint[] } {
  if (plan.job.armature.field === "series") return { o: plan.series?.original.curve ?? [], n: plan.series?.rewound.curve ?? [] };
  return { o: plan.original_motor.curve, n: plan.motor.curve };
}

/** Whether the plan has curves to draw (not for an uncalibrated motor, nor a series motor without its field data). */
export function hasCurves(plan: Plan): boolean {
  const { o, n } = curveSets(plan);
  return o.length > 1 && n.length > 1;
}

export interface CurvesOptions {
  width: number;
  height: number;
  keys?: CurveKey[];
  /** Legend line and title at the top (the image has them; the card writes its own paragraph). */
  legend?: boolean;
  /** Base type size, pt. */
  size?: number;
}

/** Whether the efficiency curve can be drawn: the losses are known (docs "Unknown is null": a curve that needs unknown data is not drawn). */
export function hasEfficiency(plan: Plan): boolean {
  // a series motor's curves are the series model's (design/series.ts): its losses come from its own readings
  return plan.job.armature.field === "series" ? (plan.calibration.series?.cal?.lossKnown ?? false) : plan.calibration.loss_known;
}

/** Four charts in a 2 × 2 grid filling width × height (points); the efficiency chart left out when the losses are unknown. */
export function curvesDrawing(plan: Plan, opts: CurvesOptions): Drawing {
  const shapes: Shape[] = [];
  const keys = (opts.keys ?? (["speed", "current", "efficiency", "output"] as CurveKey[])).filter((k) => k !== "efficiency" || hasEfficiency(plan));
  const size = opts.size ?? 8;
  const { o, n } = curveSets(plan);
  const maxT = Math.max(...o.map((p) => p.torque), ...n.map((p) => p.torque), plan.duty?.torque ?? 0);
  const tu = torqueUnit(maxT);
  let top = 0;
  if (opts.legend) {
    shapes.push({
      kind: "text",
      x: 0,
      y: size + 4,
      text: `${plan.job.id}: motor curves at ${sig(plan.supply)} V ${plan.supply_kind.toUpperCase()}, winding hot (${sig(plan.resistance.hot_temperature)} °C)${plan.series ? ", light load to rated" : ""}`,
      size: size + 2,
      anchor: "start",
      bold: true,
    });
    const ly = size * 2 + 14;
    shapes.push({
      kind: "polyline",
      points: [
        [0, ly],
        [36, ly],
      ],
      width: 1.2,
      dash: 5,
    });
    shapes.push({ kind: "text", x: 42, y: ly + 3, text: "original winding", size, anchor: "start" });
    shapes.push({
      kind: "polyline",
      points: [
        [160, ly],
        [196, ly],
      ],
      width: 2,
    });
    shapes.push({
      kind: "text",
      x: 202,
      y: ly + 3,
      text: `new winding (${plan.design.turns} × ${plan.design.wire.label}${plan.design.strands > 1 ? ` × ${plan.design.strands}` : ""})`,
      size,
      anchor: "start",
      bold: true,
    });
    if (plan.duty) shapes.push({ kind: "text", x: 0, y: ly + size + 10, text: "● duty point of the new winding, ○ of the original", size, anchor: "start" });
    top = ly + size + (plan.duty ? 20 : 8);
  }
  const gap = 22;
  const rows = Math.ceil(keys.length / 2);
  const cw = (opts.width - gap) / 2;
  const ch = (opts.height - top - gap * (rows - 1)) / rows;
  keys.forEach((k, i) => {
    chart(shapes, plan, k, (i % 2) * (cw + gap), top + Math.floor(i / 2) * (ch + gap), cw, ch, o, n, tu, size);
  });
  return { width: opts.width, height: opts.height, shapes };
}

function chart(
  shapes: Shape[],
  plan: Plan,
  key: CurveKey,
  x: number,
  y: number,
  w: number,
  h: number,
  o: CurvePoint[],
  n: CurvePoint[],
  tu: { unit: string; k: number },
  size: number,
): void {
  const def = CURVES[key];
  const padL = 40;
  const padB = 30;
  const padT = Math.max(16, size * 2.2); // the title clear of the top tick label
  const px = x + padL;
  const pw = w - padL - 6;
  const py = y + padT;
  const ph = h - padT - padB;
  const all = [...o, ...n];
  const maxT = Math.max(...all.map((p) => p.torque), plan.duty?.torque ?? 0) * tu.k;
  const maxV = Math.max(...all.map((p) => def.value(p) ?? 0), key === "speed" && plan.duty ? toRpm(plan.duty.target_speed) : 0);
  const xt = ticksFromZero(maxT);
  const yt = ticksFromZero(key === "efficiency" ? Math.min(100, maxV) : maxV);
  const xMax = xt[xt.length - 1];
  const yMax = yt[yt.length - 1];
  const X = (t: number) => px + (Math.min(t, xMax) / xMax) * pw;
  const Y = (v: number) => py + ph - (Math.min(Math.max(0, v), yMax) / yMax) * ph;
  shapes.push({ kind: "text", x, y: y + size, text: `${def.title}, ${def.unit}`, size: size + 1, anchor: "start", bold: true });
  for (const t of xt) shapes.push({ kind: "line", x1: X(t), y1: py, x2: X(t), y2: py + ph, width: 0.3, grey: 0.75 });
  for (const v of yt) shapes.push({ kind: "line", x1: px, y1: Y(v), x2: px + pw, y2: Y(v), width: 0.3, grey: 0.75 });
  shapes.push({ kind: "rect", x: px, y: py, w: pw, h: ph, grey: 0, width: 0.9 });
  for (const t of xt) shapes.push({ kind: "text", x: X(t), y: py + ph + 3 + size * 0.8, text: tick(t), size: size - 1, anchor: "middle" });
  for (const v of yt) shapes.push({ kind: "text", x: px - 4, y: Y(v) + size * 0.35, text: tick(v), size: size - 1, anchor: "end" });
  shapes.push({ kind: "text", x: px + pw / 2, y: py + ph + 15 + size * 0.8, text: `torque, ${tu.unit}`, size: size - 1, anchor: "middle" });
  const series = (pts: CurvePoint[]) =>
    pts.flatMap((p) => {
      const v = def.value(p);
      return v !== null && Number.isFinite(v) && Number.isFinite(p.torque) ? [[X(p.torque * tu.k), Y(v)] as [number, number]] : [];
    });
  shapes.push({ kind: "polyline", points: series(o), width: 1.2, dash: 5 });
  shapes.push({ kind: "polyline", points: series(n), width: 2 });
  if (plan.duty) {
    const du = plan.duty;
    const val = (d: NonNullable<Plan["duty"]>): Record<CurveKey, number | null> => ({
      speed: toRpm(d.speed),
      current: d.current,
      efficiency: d.efficiency === null ? null : d.efficiency * 100,
      output: d.output_w,
    });
    const cx = X(du.torque * tu.k);
    shapes.push({ kind: "line", x1: cx, y1: py, x2: cx, y2: py + ph, width: 0.5, grey: 0, dash: 2 });
    const ov = plan.original_duty ? val(plan.original_duty)[key] : null;
    if (plan.original_duty && ov !== null) shapes.push({ kind: "circle", cx: X(plan.original_duty.torque * tu.k), cy: Y(ov), r: 3.6, filled: false });
    const nv = val(du)[key];
    if (nv !== null) shapes.push({ kind: "circle", cx, cy: Y(nv), r: 3.6, filled: true });
    if (key === "speed") {
      const ty = Y(toRpm(du.target_speed));
      shapes.push({ kind: "line", x1: cx - 7, y1: ty, x2: cx + 7, y2: ty, width: 0.8, grey: 0 });
      shapes.push({ kind: "line", x1: cx, y1: ty - 7, x2: cx, y2: ty + 7, width: 0.8, grey: 0 });
      shapes.push({
        kind: "text",
        x: Math.min(cx + 9, px + pw - 90),
        y: ty - 12 + size,
        text: `duty target ${sig(toRpm(du.target_speed))} rpm`,
        size: size - 1,
        anchor: "start",
        bold: true,
      });
    }
  }
}
