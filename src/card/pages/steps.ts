/** Page 2, coil by coil in winding order: hook, go slot → return slot, turns with tally boxes, finish hook, a tick per coil. */
import type { CoilPlan, Plan } from "../../design/types.js";
import { tallyBoxes, tallyGroups, type CardLayout, type TallyBox } from "../layout.js";
import type { Sheet, TextBlock } from "../sheet.js";
import { DEAD_COIL, isDead, sideText } from "../text.js";
import { viewingConvention } from "../../winding/layout.js";

/** The instruction for one coil as plain words (also what tests read back). */
export function coilRoute(plan: Plan, c: CoilPlan): string {
  const sp = plan.layout.spec;
  if (sp.style === "tooth") return `round tooth ${c.index}: slot ${c.go_slot} → slot ${c.return_slot}, ${c.direction ?? sp.direction}`;
  const u = sp.coils_per_slot;
  return `${sideText(c.go_slot, c.go_layer, c.go_position, u)} → ${sideText(c.return_slot, c.return_layer, c.return_position, u)}`;
}

/** The route on two lines for the table: what to do in large type, the detail below. */
function routeLines(plan: Plan, c: CoilPlan): [string, string] {
  const sp = plan.layout.spec;
  if (sp.style === "tooth") return [`round tooth ${c.index}`, `slot ${c.go_slot} → slot ${c.return_slot}, ${c.direction ?? sp.direction}`];
  const u = sp.coils_per_slot;
  return [
    `${c.go_slot} → ${c.return_slot}`,
    `${sideText(c.go_slot, c.go_layer, c.go_position, u)} → ${sideText(c.return_slot, c.return_layer, c.return_position, u)}`,
  ];
}

interface RowText {
  /** The route in large type and its detail below, or the dead coil's line; laid out once. */
  main: TextBlock;
  detail?: TextBlock;
  /** Height of the route text (main and detail, or the dead coil's line), pt. */
  height: number;
  dead: boolean;
}

/** A coil row's text, laid out at the widths it will be drawn at. */
function coilRow(s: Sheet, plan: Plan, c: CoilPlan, width: number, deadWidth: number): RowText {
  const T = s.L.type;
  if (isDead(c)) {
    const main = s.layout(`${coilRoute(plan, c)} — ${DEAD_COIL}`, { size: T.step - 1, bold: true, width: deadWidth });
    return { main, height: main.height, dead: true };
  }
  const [route, more] = routeLines(plan, c);
  const main = s.layout(route, { size: T.step, bold: true, width });
  const detail = more ? s.layout(more, { size: T.step - 3, width }) : undefined;
  return { main, detail, height: main.height + (detail ? detail.height + 1 : 0), dead: false };
}

interface TallyGeometry {
  step: number;
  groups: TallyBox[][];
  groupsPerLine: number;
  lineH: number;
  height: number;
}

/** Where the tally boxes go in a column `width` pt wide (one rule for every turn count: layout.ts). */
function tallyGeometry(turns: number, tl: CardLayout["tally"], width: number): TallyGeometry {
  const { step, boxes } = tallyBoxes(turns, tl);
  const groups = tallyGroups(boxes, tl.group_size);
  const groupW = tl.group_size * (tl.box + tl.gap) - tl.gap;
  const groupsPerLine = Math.max(1, Math.floor((width + tl.group_gap) / (groupW + tl.group_gap)));
  const lineH = tl.box + tl.label_size * 1.25 + 3;
  return { step, groups, groupsPerLine, lineH, height: Math.ceil(groups.length / groupsPerLine) * lineH };
}

/** Draw the tally: boxes in groups with a gap, the running count under each box in bold. */
function drawTally(s: Sheet, g: TallyGeometry, x0: number, y0: number): void {
  const tl = s.L.tally;
  const groupW = tl.group_size * (tl.box + tl.gap) - tl.gap;
  g.groups.forEach((grp, gi) => {
    const ty = y0 + Math.floor(gi / g.groupsPerLine) * g.lineH;
    const gx = x0 + (gi % g.groupsPerLine) * (groupW + tl.group_gap);
    grp.forEach((b, bi) => {
      const bx = gx + bi * (tl.box + tl.gap);
      s.doc.save().lineWidth(1).rect(bx, ty, tl.box, tl.box).stroke().restore();
      const label = String(b.upTo);
      const w = s.widthOf(label, { size: tl.label_size, bold: true });
      s.at(label, bx + tl.box / 2 - w / 2, ty + tl.box + 1.5, { size: tl.label_size, bold: true });
    });
  });
}

export function stepsPage(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  const sp = plan.layout.spec;
  s.startSection("Coil by coil", { share: 0.4 });
  const intro =
    sp.style === "tooth"
      ? `Wind in this order. Hook the start on the start bar, wind the turns ${sp.direction === "cw" ? "clockwise" : "anticlockwise"} round the tooth (looking at the tooth tip from outside), going in at the first slot and back through the second; hook the finish on the finish bar. Tick a tally box each time the count reaches the number under it, and the coil's box when it is hooked.`
      : `Wind in this order. Hook the start on the start bar, lay the go side in the first slot (top layer) and the return side in the second (bottom layer), ${sp.coils_per_slot > 1 ? "at the position given when a slot holds several coils, " : ""}and hook the finish on the finish bar. Tick a tally box each time the count reaches the number under it, and the coil's box when it is hooked. Lead throw ${String(sp.lead_throw).replace("-", "−")} bars, copied from the old winding.`;
  const continuous =
    plan.job.winding.continuous === true
      ? " Continuous winding, off the spool: do not cut at a finish bar — loop the wire round its hook and carry straight on into the next coil, whose start is that bar; cut only after the last coil."
      : "";
  s.para(`${intro}${continuous} ${viewingConvention(plan.layout)}`, { size: T.body });
  s.para(
    `${plan.coils.length} coils of ${plan.design.turns} turns of ${plan.design.wire.label}${plan.design.strands > 1 ? `, ${plan.design.strands} strands in hand (count a turn of all strands as one)` : ""}. When all are wound, every bar holds two leads${plan.coils.some(isDead) ? " (the dead coil's ends go to none)" : ""}: check them against the bench sheet before soldering.`,
    { size: T.body + 1, bold: true },
  );

  coilTable(s, plan);
}

/** The x of each column of the coil table, pt. */
interface Columns {
  tick: number;
  coil: number;
  start: number;
  slots: number;
  finish: number;
  tally: number;
}

/**
 * The coil table: one row per coil in winding order (tick box, coil, start bar, route, finish bar,
 * tally), each row laid out whole before it is placed and never split across pages; the header
 * repeats on each page; widow control breaks early so the last page holds a useful share of rows.
 * What to do when all are wound is said above the table, so no line trails after it onto a page
 * of its own.
 */
function coilTable(s: Sheet, plan: Plan): void {
  const cw = s.L.steps.columns;
  const x: Columns = {
    tick: s.left,
    coil: s.left + cw.tick,
    start: s.left + cw.tick + cw.coil,
    slots: s.left + cw.tick + cw.coil + cw.start,
    finish: s.left + cw.tick + cw.coil + cw.start + cw.slots,
    tally: s.left + cw.tick + cw.coil + cw.start + cw.slots + cw.finish,
  };
  const tally = tallyGeometry(plan.design.turns, s.L.tally, s.right - x.tally);
  const rows = plan.coils.map((c) => coilRow(s, plan, c, cw.slots - 4, x.tally - x.start - 6));
  const heights = rows.map((t) => Math.max(s.L.steps.row_min_height, tally.height + 6, t.height + 8));
  // the rows that would end the table on a page of their own must fill a useful share of it:
  // break early (widow control) so the last page holds at least minTail of rows
  const minTail = 0.3 * (s.bottom - s.top);
  const tailFrom = heights.map((_, i) => heights.slice(i).reduce((a, b) => a + b, 0));
  let onPage = 0;
  coilHeader(s, plan, x, tally.step);
  plan.coils.forEach((c, ci) => {
    let fitsHere = s.y;
    let last = ci - 1;
    while (last + 1 < heights.length && fitsHere + heights[last + 1] <= s.bottom) fitsHere += heights[++last];
    const breaksLater = last < heights.length - 1;
    const widow = breaksLater && onPage > 0 && tailFrom[last + 1] < minTail && tailFrom[ci] >= minTail && tailFrom[ci + 1] < minTail;
    if (s.y + heights[ci] > s.bottom || widow) {
      s.need(s.bottom);
      coilHeader(s, plan, x, tally.step);
      onPage = 0;
    }
    onPage++;
    drawCoilRow(s, c, rows[ci], heights[ci], x, tally);
  });
  s.y += 8;
}

/** The coil table's header band. */
function coilHeader(s: Sheet, plan: Plan, x: Columns, step: number): void {
  const T = s.L.type;
  const y = s.y;
  s.doc.save().rect(s.left, y, s.width, 16).fill("#e6e6e6").restore();
  const o = { size: T.small, bold: true };
  s.at("done", x.tick + 1, y + 4, o);
  s.at("coil", x.coil, y + 4, o);
  s.at("start", x.start, y + 4, o);
  s.at(plan.layout.spec.style === "tooth" ? "tooth, slots, sense" : "go slot → return slot", x.slots, y + 4, o);
  s.at("finish", x.finish, y + 4, o);
  s.at(step === 1 ? "tally: 1 box = 1 turn" : `tally: 1 box = ${step} turns, groups of ${step * s.L.tally.group_size}`, x.tally, y + 4, o);
  s.y += 18;
}

/** One coil's row, `rowH` pt high at the running y, closed by a thin rule. */
function drawCoilRow(s: Sheet, c: CoilPlan, text: RowText, rowH: number, x: Columns, tally: TallyGeometry): void {
  const T = s.L.type;
  const y = s.y;
  const mid = y + rowH / 2;
  s.tickBox(x.tick + 2, mid - s.L.tick_box / 2, s.L.tick_box, true);
  s.at(String(c.index), x.coil, mid - T.step * 0.6, { size: T.step + 2, bold: true });
  const ty = y + (rowH - text.height) / 2;
  if (text.dead) {
    s.draw(text.main, x.start, ty);
  } else {
    s.at(String(c.start_bar), x.start + 4, mid - T.step * 0.6, { size: T.step + 2, bold: true });
    s.draw(text.main, x.slots, ty);
    if (text.detail) s.draw(text.detail, x.slots, ty + text.main.height + 1);
    s.at(String(c.end_bar), x.finish + 4, mid - T.step * 0.6, { size: T.step + 2, bold: true });
  }
  drawTally(s, tally, x.tally, y + (rowH - tally.height) / 2);
  s.y = y + rowH;
  s.doc.save().lineWidth(s.L.line_width.thin).strokeColor("#8c8c8c").moveTo(s.left, s.y).lineTo(s.right, s.y).stroke().restore();
}
