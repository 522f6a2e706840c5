/**
 * Page 3, the winding diagram, drawn as vectors. Tooth windings: the end view from the commutator
 * end (slots round the circle, bars in an inner ring placed by the lead throw with the layout's
 * angle helpers). Lap and wave windings: the developed (unrolled) diagram, slots as pairs of
 * conductors (top layer solid, bottom dashed), bars as a row of boxes beneath. Coil 1 is the
 * heaviest line; the first few coils are emphasised when the whole winding is too dense.
 */
import type { CoilPlan, Plan } from "../../design/types.js";
import { barAngle, slotAngle } from "../../winding/layout.js";
import { grey, type Sheet } from "../sheet.js";
import { isDead, sig } from "../text.js";

const TAU = 2 * Math.PI;
const num = (x: number) => (Number.isInteger(x) ? String(x).replace("-", "−") : sig(x));

/**
 * Where the brushes touch, as angles (rad, clockwise from slot 1, commutator end) with the rotor
 * drawn at the moment coil 1 commutates: the first brush bridges bar 1 and the next bar of the
 * circuit (bar 2 progressive, bar C retrogressive; a wave reaches it after p coils), the others
 * follow one pole pitch (2π/P) apart.
 */
export function brushAngles(plan: Plan): number[] {
  const lay = plan.layout;
  const C = lay.bars;
  const next = lay.spec.style === "tooth" || lay.spec.progression === "progressive" ? 2 : C;
  const a1 = barAngle(lay, 1);
  let a2 = barAngle(lay, next);
  if (a2 - a1 > Math.PI) a2 -= TAU;
  if (a1 - a2 > Math.PI) a2 += TAU;
  const first = (a1 + a2) / 2;
  const out: number[] = [];
  for (let i = 0; i < lay.spec.brushes.count; i++) out.push((((first + (i * TAU) / lay.spec.poles) % TAU) + TAU) % TAU);
  return out;
}

/** Which coils are drawn black (emphasised) and which faint: all when few, else the first few. */
export function emphasised(plan: Plan, n: number): (c: CoilPlan) => boolean {
  const all = plan.coils.length <= 12;
  return (c) => all || c.index <= n;
}

export function diagramPage(s: Sheet, plan: Plan): void {
  const sp = plan.layout.spec;
  s.startSection(sp.style === "tooth" ? "Winding diagram — end view" : "Winding diagram — developed", sp.style === "tooth" ? { share: 0.8 } : { needed: 500 });
  if (sp.style === "tooth") toothDiagram(s, plan);
  else developedDiagram(s, plan);
}

type Pt = [number, number];

function polar(cx: number, cy: number, r: number, a: number): Pt {
  return [cx + r * Math.sin(a), cy - r * Math.cos(a)];
}

function sector(s: Sheet, cx: number, cy: number, r0: number, r1: number, a0: number, a1: number): void {
  const n = 12;
  const pts: Pt[] = [];
  for (let i = 0; i <= n; i++) pts.push(polar(cx, cy, r1, a0 + ((a1 - a0) * i) / n));
  for (let i = n; i >= 0; i--) pts.push(polar(cx, cy, r0, a0 + ((a1 - a0) * i) / n));
  s.doc.polygon(...pts);
}

function arrowHead(s: Sheet, from: Pt, to: Pt, size: number): void {
  const a = Math.atan2(to[1] - from[1], to[0] - from[0]);
  const p1: Pt = [to[0] - size * Math.cos(a - 0.4), to[1] - size * Math.sin(a - 0.4)];
  const p2: Pt = [to[0] - size * Math.cos(a + 0.4), to[1] - size * Math.sin(a + 0.4)];
  s.doc.save().polygon(to, p1, p2).fill("#000000").restore();
}

/**
 * Centre angles of the field poles (rad, clockwise from slot 1): the brushes sit in the neutral
 * zone, so the poles lie half a pole pitch from them; N and S alternate.
 */
export function poleAngles(plan: Plan): { angle: number; north: boolean }[] {
  const P = plan.layout.spec.poles;
  const b = brushAngles(plan)[0] ?? 0;
  return Array.from({ length: P }, (_, i) => ({ angle: (((b + ((i + 0.5) * TAU) / P) % TAU) + TAU) % TAU, north: i % 2 === 0 }));
}

/** The stator's poles round the rotor: an arc for each, two thirds of a pole pitch wide, marked N or S. */
function fieldPoles(s: Sheet, plan: Plan, cx: number, cy: number, r0: number, r1: number): void {
  const P = plan.layout.spec.poles;
  for (const { angle, north } of poleAngles(plan)) {
    const half = (TAU / P / 2) * 0.66;
    s.doc.save().lineWidth(0.9);
    sector(s, cx, cy, r0, r1, angle - half, angle + half);
    s.doc.fillAndStroke(north ? grey(0.72) : "#ffffff", "#000000").restore();
    const [lx, ly] = polar(cx, cy, r1 + 8, angle);
    s.at(north ? "N" : "S", lx - 8, ly - 6, { size: s.L.type.subheading, bold: true, width: 16, align: "center" });
  }
}

/** Where the end view sits on the page: centre, outer radius R, slot root and bar ring radii (pt). */
interface EndView {
  cx: number;
  cy: number;
  size: number;
  R: number;
  rootR: number;
  /** Inner and outer radius of the bar ring. */
  rb0: number;
  rb1: number;
  /** Slot pitch, rad. */
  pitch: number;
}

/**
 * The tooth winding's end view from the commutator end: the rotor with its slots and teeth, the bar
 * ring placed by the lead throw, the brushes on the bars, the field poles round it, the coils, and
 * the caption that states the viewing convention once.
 */
function toothDiagram(s: Sheet, plan: Plan): void {
  const size = Math.min(s.width, s.room() - 150);
  const R = size / 2 - 48;
  const v: EndView = {
    cx: s.left + s.width / 2,
    cy: s.y + size / 2 + 4,
    size,
    R,
    rootR: R * 0.66,
    rb0: R * 0.3,
    rb1: R * 0.42,
    pitch: TAU / plan.layout.spec.slots,
  };
  endViewRotor(s, plan, v);
  endViewBars(s, plan, v);
  endViewBrushes(s, plan, v);
  fieldPoles(s, plan, v.cx, v.cy, R + 26, R + 33);
  endViewCoils(s, plan, v);
  s.y = v.cy + size / 2 + 6;
  endViewCaption(s, plan);
}

/** The rotor core as a ring with the slots cut in as white sectors, each slot (S) and tooth (T) labelled. */
function endViewRotor(s: Sheet, plan: Plan, v: EndView): void {
  const T = s.L.type;
  const lay = plan.layout;
  const { cx, cy, R, rootR, pitch } = v;
  const d = s.doc;
  d.save().lineWidth(1.2).circle(cx, cy, R).fillAndStroke(grey(0.93), "#000000").restore();
  d.save()
    .lineWidth(0.8)
    .circle(cx, cy, rootR * 0.82)
    .stroke()
    .restore();
  for (let k = 1; k <= lay.spec.slots; k++) {
    const a = slotAngle(lay, k);
    const half = Math.min(pitch * 0.2, 0.3);
    d.save().lineWidth(0.8);
    sector(s, cx, cy, rootR, R + 0.5, a - half, a + half);
    d.fillAndStroke("#ffffff", "#000000").restore();
    const [lx, ly] = polar(cx, cy, R + 16, a);
    s.at(`S${k}`, lx - 14, ly - 5, { size: T.label, bold: true, width: 28, align: "center" });
    const [tx, ty] = polar(cx, cy, (R + rootR) / 2, a + pitch / 2);
    s.at(`T${k}`, tx - 14, ty - 5, { size: T.label, bold: true, width: 28, align: "center" });
  }
}

/** The commutator bars as an inner ring of numbered sectors, placed by the lead throw. */
function endViewBars(s: Sheet, plan: Plan, v: EndView): void {
  const lay = plan.layout;
  const C = lay.bars;
  const bw = Math.min(Math.PI / C, 0.6) * 0.85;
  for (let b = 1; b <= C; b++) {
    const a = barAngle(lay, b);
    s.doc.save().lineWidth(0.9);
    sector(s, v.cx, v.cy, v.rb0, v.rb1, a - bw, a + bw);
    s.doc.fillAndStroke("#ffffff", "#000000").restore();
    const [lx, ly] = polar(v.cx, v.cy, (v.rb0 + v.rb1) / 2, a);
    s.at(String(b), lx - 10, ly - 4.5, { size: s.L.type.label, bold: true, width: 20, align: "center" });
  }
}

/** The brushes on the bars, at their real width (width_bars × the bar pitch) and position. */
function endViewBrushes(s: Sheet, plan: Plan, v: EndView): void {
  const lay = plan.layout;
  const barPitch = TAU / lay.bars;
  brushAngles(plan).forEach((a, i) => {
    const half = (lay.spec.brushes.width_bars * barPitch) / 2;
    s.doc.save().lineWidth(0.9);
    sector(s, v.cx, v.cy, v.rb0 - 16, v.rb0, a - half, a + half);
    s.doc.fillAndStroke(grey(0.55), "#000000").restore();
    const [lx, ly] = polar(v.cx, v.cy, v.rb0 - 26, a);
    s.at(`B${i + 1}`, lx - 10, ly - 4.5, { size: s.L.type.label, bold: true, width: 20, align: "center" });
  });
}

/**
 * The coils round their teeth, coil 1 last and heaviest: each an arc from its first slot to its
 * second, a solid lead from its start bar into the slot and a dashed one back to its finish bar;
 * emphasised coils carry arrows, their number and their sense (cw/ccw) outside the tooth.
 */
function endViewCoils(s: Sheet, plan: Plan, v: EndView): void {
  const T = s.L.type;
  const lay = plan.layout;
  const { cx, cy, R, rootR, pitch } = v;
  const d = s.doc;
  const emph = emphasised(plan, s.L.diagram.emphasise_coils);
  const order = [...plan.coils].sort((x, y) => (x.index === 1 ? 1 : y.index === 1 ? -1 : 0));
  for (const c of order) {
    const inset = Math.min(pitch * 0.2, 0.3) * 0.5;
    // the coil's arc runs clockwise from its first slot to its second; a ccw tooth coil goes in at the second
    const reversed = lay.spec.style === "tooth" && c.direction === "ccw";
    const a0 = slotAngle(lay, reversed ? c.return_slot : c.go_slot) + inset;
    let a1 = slotAngle(lay, reversed ? c.go_slot : c.return_slot) - inset;
    if (a1 < a0) a1 += TAU;
    const heavy = c.index === 1;
    const w = heavy ? s.L.line_width.heavy + 0.6 : emph(c) ? 1.3 : 0.5;
    const col = emph(c) ? "#000000" : grey(s.L.grey.faint);
    d.save().lineWidth(w).strokeColor(col).lineJoin("round");
    sector(s, cx, cy, rootR + 4, R - 3, a0, a1);
    d.stroke().restore();
    if (isDead(c)) continue;
    const goIn = polar(cx, cy, rootR + 4, reversed ? a1 : a0);
    const retOut = polar(cx, cy, rootR + 4, reversed ? a0 : a1);
    const sb = polar(cx, cy, v.rb1, barAngle(lay, c.start_bar!));
    const eb = polar(cx, cy, v.rb1, barAngle(lay, c.end_bar!));
    d.save().lineWidth(w).strokeColor(col).moveTo(sb[0], sb[1]).lineTo(goIn[0], goIn[1]).stroke().restore();
    d.save().lineWidth(w).strokeColor(col).dash(3, { space: 2 }).moveTo(retOut[0], retOut[1]).lineTo(eb[0], eb[1]).stroke().restore();
    if (emph(c)) {
      arrowHead(s, sb, goIn, heavy ? 9 : 6);
      arrowHead(s, retOut, eb, heavy ? 9 : 6);
      const [lx, ly] = polar(cx, cy, R - 12, (a0 + a1) / 2);
      d.save().circle(lx, ly, 7).fillAndStroke("#ffffff", "#000000").restore();
      s.at(String(c.index), lx - 7, ly - 4, { size: T.small, bold: true, width: 14, align: "center" });
      const [dx, dy] = polar(cx, cy, R + 12, (a0 + a1) / 2);
      s.at(c.direction ?? "", dx - 12, dy - 4.5, { size: T.label, bold: true, width: 24, align: "center" });
    }
  }
}

/** The end view's caption: the viewing convention (once, for the whole page), what each mark is, the lead throw and where the rotor is drawn. */
function endViewCaption(s: Sheet, plan: Plan): void {
  const lay = plan.layout;
  s.para(
    `Seen from the commutator end (this whole page), clockwise numbering: S = slot, T = tooth, numbers in the inner ring are bars; grey blocks B on the bars are the brushes at their width; the outer arcs are the ${plan.job.armature.field === "permanent_magnet" ? "magnets" : "field poles"}, N grey, S white (which is which depends on the supply's polarity). Coil k goes round tooth k from its start bar (solid lead, arrow into the slot) to its finish bar (dashed lead); coil 1 is the heavy line. ` +
      `Sense round each tooth (cw/ccw, shown outside the tooth) is as seen looking at the tooth tip from outside. Lead throw ${num(lay.spec.lead_throw)} bars. ` +
      `The rotor is drawn where coil 1 commutates: brush B1 bridges bars 1 and 2${lay.spec.brushes.count > 1 ? `, the other brush${lay.spec.brushes.count > 2 ? "es" : ""} one pole pitch on` : ""}.`,
    { size: s.L.type.body },
  );
}

/**
 * Where the developed diagram sits (pt): the strip of width W from x0, one slot every dx; the rows
 * from the top (poles, slot labels, the back-end apexes, the slot bodies from yTop to yBot, the
 * bars at yBars), and the x of an angle (rad, clockwise from slot 1) and of a coil side.
 */
interface Developed {
  x0: number;
  W: number;
  dx: number;
  yPoles: number;
  yLabel: number;
  backH: number;
  yTop: number;
  yBot: number;
  yBars: number;
  barH: number;
  barPitch: number;
  xAt: (a: number) => number;
  sideX: (slot: number, layer: string, pos: number) => number;
  /** x, or x ± W, whichever lies nearest ref (coils that wrap round the strip). */
  nearest: (x: number, ref: number) => number;
}

/** A coil's path on the developed diagram: its go and return conductors, the apex of its back end, and its two front ends (to the bars). */
interface CoilPath {
  xg: number;
  xr: number;
  apex: Pt;
  front1: Pt[];
  front2: Pt[];
}

/**
 * The lap or wave winding unrolled, seen from outside with the commutator at the bottom: poles
 * across the top, slots and their conductors, the coils' back ends, the bars with the brushes, the
 * lead throw from coil 1's centre line to bar 1, a legend and the caption.
 */
function developedDiagram(s: Sheet, plan: Plan): void {
  const g = developedGeometry(s, plan);
  developedSlots(s, plan, g);
  developedBars(s, plan, g);
  const p1 = developedCoils(s, plan, g);
  coilTags(s, plan, g);
  const yLt = leadThrow(s, plan, g, p1);
  developedBrushes(s, plan, g);
  developedPoles(s, plan, g);
  s.y = yLt + 22;
  developedLegend(s);
  developedCaption(s, plan);
}

/** The strip's geometry; the slot bodies take what the page has left (within reason), so the diagram shares a page rather than leave one near-empty. */
function developedGeometry(s: Sheet, plan: Plan): Developed {
  const lay = plan.layout;
  const S = lay.spec.slots;
  const u = lay.spec.coils_per_slot;
  const x0 = s.left + 6;
  const W = s.width - 12;
  const dx = W / S;
  const xAt = (a: number) => x0 + dx / 2 + (a / TAU) * W;
  const yLabel = s.y + 26;
  const backH = Math.min(90, 18 + lay.spec.span * dx * 0.35);
  const yTop = yLabel + 30 + backH;
  const yBot = yTop + Math.max(110, Math.min(170, s.room() - (yTop - s.y) - 330));
  return {
    x0,
    W,
    dx,
    yPoles: s.y + 2,
    yLabel,
    backH,
    yTop,
    yBot,
    yBars: yBot + Math.min(120, 30 + W * 0.12),
    barH: 16,
    barPitch: W / lay.bars,
    xAt,
    // conductor x of a coil side: top layer left of the slot's centre, bottom right, positions across each half
    sideX: (slot, layer, pos) => {
      const xs = xAt(slotAngle(lay, slot));
      const half = dx * 0.36;
      const step = half / u;
      return layer === "top" ? xs - half + (pos - 0.5) * step : xs + (pos - 0.5) * step;
    },
    nearest: (x, ref) => {
      let best = x;
      for (const k of [-1, 1]) if (Math.abs(x + k * W - ref) < Math.abs(best - ref)) best = x + k * W;
      return best;
    },
  };
}

/** Slot bodies as grey bands, numbered above (every n-th slot where they are close). */
function developedSlots(s: Sheet, plan: Plan, g: Developed): void {
  const T = s.L.type;
  const lay = plan.layout;
  const every = Math.max(1, Math.ceil(s.L.diagram.label_every_min_pitch / g.dx));
  for (let k = 1; k <= lay.spec.slots; k++) {
    const xs = g.xAt(slotAngle(lay, k));
    s.doc
      .save()
      .rect(xs - g.dx * 0.42, g.yTop, g.dx * 0.84, g.yBot - g.yTop)
      .fill(grey(0.93))
      .restore();
    if ((k - 1) % every === 0) s.at(String(k), xs - 12, g.yLabel, { size: g.dx >= 14 ? T.label : T.small, bold: true, width: 24, align: "center" });
  }
  s.at("slots", g.x0, g.yLabel + 11, { size: T.small, grey: 0.3 });
}

/** The bars as a row of boxes, bar 1 shaded; numbered inside when there is room, else below. */
function developedBars(s: Sheet, plan: Plan, g: Developed): void {
  const T = s.L.type;
  const lay = plan.layout;
  const { x0, W, yBars, barH, barPitch } = g;
  const bevery = Math.max(1, Math.ceil(s.L.diagram.label_every_min_pitch / barPitch));
  for (let b = 1; b <= lay.bars; b++) {
    const xb = g.xAt(barAngle(lay, b));
    const x = ((((xb - x0) % W) + W) % W) + x0;
    s.doc
      .save()
      .lineWidth(0.7)
      .rect(x - barPitch * 0.42, yBars, barPitch * 0.84, barH)
      .fillAndStroke(b === 1 ? grey(0.8) : "#ffffff", "#000000")
      .restore();
    if ((b - 1) % bevery === 0 || b === 1)
      s.at(String(b), x - 12, barPitch >= 11 ? yBars + 4 : yBars + barH + 14, {
        size: barPitch >= 14 ? T.small + 0.5 : 6.5,
        bold: b === 1,
        width: 24,
        align: "center",
      });
  }
  s.at("bars", x0, yBars + barH + (barPitch >= 11 ? 3 : 23), { size: T.small, grey: 0.3 });
}

/** A coil's path: from its start bar up to its go conductor, over the back end, down its return conductor to its finish bar (a dead coil: loose ends). */
function coilPath(plan: Plan, g: Developed, c: CoilPlan): CoilPath {
  const lay = plan.layout;
  const { yBot, yBars } = g;
  const xg = g.sideX(c.go_slot, c.go_layer, c.go_position);
  let xr = g.sideX(c.return_slot, c.return_layer, c.return_position);
  while (xr < xg) xr += g.W;
  const apex: Pt = [(xg + xr) / 2, g.yTop - g.backH * 0.85];
  const front1: Pt[] = [];
  const front2: Pt[] = [];
  if (!isDead(c)) {
    const xs = g.nearest(g.xAt(barAngle(lay, c.start_bar!)), xg);
    const xe = g.nearest(g.xAt(barAngle(lay, c.end_bar!)), xr);
    front1.push([xs, yBars], [xs, yBars - 8], [xg, yBot + 6], [xg, yBot]);
    front2.push([xr, yBot], [xr, yBot + 6], [xe, yBars - 8], [xe, yBars]);
  } else {
    front1.push([xg - 4, yBot + 12], [xg, yBot]);
    front2.push([xr, yBot], [xr + 4, yBot + 12]);
  }
  return { xg, xr, apex, front1, front2 };
}

/** Draw one coil as polylines at −W, 0 and +W under a clip, so a coil that wraps round shows at both edges; the return conductor dashed (bottom layer). */
function drawCoil(s: Sheet, plan: Plan, g: Developed, c: CoilPlan, w: number, col: string): CoilPath {
  const d = s.doc;
  const { x0, W, yTop, yBot } = g;
  const p = coilPath(plan, g, c);
  for (const off of [-W, 0, W]) {
    const sh = (q: Pt): Pt => [q[0] + off, q[1]];
    d.save();
    d.rect(x0 - 2, g.yLabel, W + 4, g.yBars + g.barH + 4 - g.yLabel).clip();
    d.lineWidth(w).strokeColor(col).lineJoin("round").lineCap("round");
    // front end to the go conductor, up it, over the back
    const a = p.front1.map(sh);
    d.moveTo(a[0][0], a[0][1]);
    for (const q of a.slice(1)) d.lineTo(q[0], q[1]);
    d.lineTo(p.xg + off, yTop)
      .lineTo(p.apex[0] + off, p.apex[1])
      .lineTo(p.xr + off, yTop)
      .stroke();
    // return conductor dashed (bottom layer), then the front end to the finish bar
    d.dash(4, { space: 3 })
      .moveTo(p.xr + off, yTop)
      .lineTo(p.xr + off, yBot)
      .stroke()
      .undash();
    const b = p.front2.map(sh);
    d.moveTo(b[0][0], b[0][1]);
    for (const q of b.slice(1)) d.lineTo(q[0], q[1]);
    d.stroke();
    d.restore();
  }
  return p;
}

/** All the coils: the faint ones first, then the emphasised ones, coil 1 last and heaviest; returns coil 1's path. */
function developedCoils(s: Sheet, plan: Plan, g: Developed): CoilPath {
  const emph = emphasised(plan, s.L.diagram.emphasise_coils);
  const few = plan.coils.length <= 12;
  for (const c of plan.coils) if (!emph(c)) drawCoil(s, plan, g, c, 0.35, grey(s.L.grey.faint));
  for (const c of plan.coils) if (emph(c) && c.index !== 1) drawCoil(s, plan, g, c, few ? 0.8 : 1.1, "#000000");
  return drawCoil(s, plan, g, plan.coils[0], s.L.line_width.heavy, "#000000");
}

/** Number tags on the first coils' back ends (and "dead" on an emphasised dead coil), moved apart where they would touch. */
function coilTags(s: Sheet, plan: Plan, g: Developed): void {
  const emph = emphasised(plan, s.L.diagram.emphasise_coils);
  const tagged = plan.coils.filter((c) => c.index <= s.L.diagram.emphasise_coils || (isDead(c) && emph(c)));
  const used: number[] = [];
  for (const c of tagged) {
    const p = coilPath(plan, g, c);
    let ax = ((((p.apex[0] - g.x0) % g.W) + g.W) % g.W) + g.x0;
    while (used.some((u) => Math.abs(u - ax) < 15)) ax += 15;
    used.push(ax);
    s.doc
      .save()
      .circle(ax, p.apex[1] - 9, 7)
      .fillAndStroke("#ffffff", "#000000")
      .restore();
    s.at(String(c.index), ax - 8, p.apex[1] - 13, { size: 6.5, bold: true, width: 16, align: "center" });
    if (isDead(c)) s.at("dead", ax - 14, p.apex[1] - 25, { size: 6.5, bold: true, width: 28, align: "center" });
  }
}

/** Coil 1's centre line down to the bars and an arrow from it to bar 1, labelled with the lead throw; returns the arrow's y. */
function leadThrow(s: Sheet, plan: Plan, g: Developed, p1: CoilPath): number {
  const d = s.doc;
  const { yBars, barH, barPitch } = g;
  const xc = (p1.xg + p1.xr) / 2;
  d.save()
    .lineWidth(0.6)
    .dash(1.5, { space: 2 })
    .moveTo(xc, p1.apex[1])
    .lineTo(xc, yBars - 2)
    .stroke()
    .undash()
    .restore();
  const xb1 = g.nearest(g.xAt(barAngle(plan.layout, 1)), xc);
  const yLt = yBars + barH + (barPitch >= 11 ? 34 : 40);
  if (Math.abs(xb1 - xc) > 0.5) {
    d.save().lineWidth(1).moveTo(xc, yLt).lineTo(xb1, yLt).stroke().restore();
    arrowHead(s, [xc, yLt], [xb1, yLt], 6);
  }
  d.save()
    .lineWidth(0.6)
    .moveTo(xc, yBars + barH)
    .lineTo(xc, yLt + 4)
    .stroke()
    .restore();
  s.at(`lead throw ${num(plan.layout.spec.lead_throw)} bars (coil 1 centre line → bar 1)`, Math.min(xc, xb1) - 4, yLt + 5, {
    size: s.L.type.small,
    bold: true,
  });
  return yLt;
}

/** The brushes against the bars, at their real width and position, labelled B1 … */
function developedBrushes(s: Sheet, plan: Plan, g: Developed): void {
  const lay = plan.layout;
  const yBr = g.yBars + g.barH;
  brushAngles(plan).forEach((a, i) => {
    const xb = g.xAt(a);
    const x = xb > g.x0 + g.W ? xb - g.W : xb;
    const bwid = lay.spec.brushes.width_bars * g.barPitch;
    s.doc
      .save()
      .lineWidth(0.8)
      .rect(x - bwid / 2, yBr, bwid, 12)
      .fillAndStroke(grey(0.55), "#000000")
      .restore();
    s.at(`B${i + 1}`, x + bwid / 2 + 2, yBr + 2, { size: s.L.type.small, bold: true });
  });
}

/** The field poles above the slots, N shaded, S white, cut at the strip's edges. */
function developedPoles(s: Sheet, plan: Plan, g: Developed): void {
  const { x0, W } = g;
  for (const { angle, north } of poleAngles(plan)) {
    const pw = (W / plan.layout.spec.poles) * 0.66;
    for (const off of [-W, 0, W]) {
      const xc = g.xAt(angle) + off;
      if (xc + pw / 2 < x0 || xc - pw / 2 > x0 + W) continue;
      const xa = Math.max(x0, xc - pw / 2);
      const xb = Math.min(x0 + W, xc + pw / 2);
      s.doc
        .save()
        .lineWidth(0.8)
        .rect(xa, g.yPoles, xb - xa, 14)
        .fillAndStroke(north ? grey(0.72) : "#ffffff", "#000000")
        .restore();
      if (xc > x0 + 8 && xc < x0 + W - 8) s.at(north ? "N" : "S", xc - 8, g.yPoles + 2, { size: s.L.type.label + 1, bold: true, width: 16, align: "center" });
    }
  }
}

/** The legend: top layer solid, bottom layer dashed, coil 1 heavy. */
function developedLegend(s: Sheet): void {
  const T = s.L.type;
  const d = s.doc;
  const legendY = s.y;
  d.save()
    .lineWidth(1.2)
    .moveTo(s.left, legendY + 5)
    .lineTo(s.left + 30, legendY + 5)
    .stroke()
    .restore();
  s.at("top layer (go side)", s.left + 34, legendY, { size: T.small });
  d.save()
    .lineWidth(1.2)
    .dash(4, { space: 3 })
    .moveTo(s.left + 150, legendY + 5)
    .lineTo(s.left + 180, legendY + 5)
    .stroke()
    .undash()
    .restore();
  s.at("bottom layer (return side)", s.left + 184, legendY, { size: T.small });
  d.save()
    .lineWidth(s.L.line_width.heavy)
    .moveTo(s.left + 320, legendY + 5)
    .lineTo(s.left + 350, legendY + 5)
    .stroke()
    .restore();
  s.at("coil 1", s.left + 354, legendY, { size: T.small });
  s.y = legendY + 16;
}

/** The developed diagram's caption: the viewing convention (once, for the whole page), what each mark is, which coils are drawn, and where the rotor is drawn. */
function developedCaption(s: Sheet, plan: Plan): void {
  const lay = plan.layout;
  const few = plan.coils.length <= 12;
  const shown = few ? `all ${plan.coils.length} coils drawn` : `coils 1–${s.L.diagram.emphasise_coils} drawn black, the rest faint`;
  s.para(
    `Unrolled, seen from outside with the commutator at the bottom (this whole page); slots and bars numbered left to right, which is clockwise seen from the commutator end. Across the top, the ${plan.job.armature.field === "permanent_magnet" ? "magnets" : "field poles"} (N grey, S white; which is which depends on the supply's polarity); grey blocks B under the bars are the brushes at their width. ` +
      `Each coil runs from its start bar up to its go slot (top layer), over the back end to its return slot (bottom layer) and down to its finish bar; ${shown}; coil 1 is the heavy line. ` +
      `${lay.spec.style === "wave" ? `Wave: each coil's finish goes ${num(lay.commutator_pitch)} bars on from its start. ` : ""}` +
      `The rotor is drawn where coil 1 commutates: brush B1 bridges bars 1 and 2 (a brush always bridges two adjacent bars)${lay.spec.brushes.count > 1 ? ", the others one pole pitch apart" : ""}. Bar 1 is shaded.`,
    { size: s.L.type.body },
  );
}
