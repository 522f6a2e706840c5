/**
 * Reading a card back for its layout (pdfjs-dist 4.10, legacy build): every text item with its box
 * in page coordinates from the top (pt), and the checks the layout tests assert.
 */
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";

export interface TextBox {
  str: string;
  x: number;
  top: number;
  bottom: number;
  right: number;
  size: number;
}

export interface PageBoxes {
  width: number;
  height: number;
  items: TextBox[];
}

export async function readBoxes(buf: Buffer | Uint8Array): Promise<PageBoxes[]> {
  const pdf = await getDocument({ data: new Uint8Array(buf), useSystemFonts: false, isEvalSupported: false }).promise;
  const pages: PageBoxes[] = [];
  for (let i = 1; i <= pdf.numPages; i++) {
    const page = await pdf.getPage(i);
    const [, , w, h] = page.view;
    const tc = await page.getTextContent();
    const items: TextBox[] = [];
    for (const it of tc.items) {
      if (!("str" in it) || it.str.trim() === "") continue;
      const [a, b, , , e, f] = it.transform as number[];
      const size = Math.hypot(a, b);
      // baseline at f (from the bottom); DejaVu's ascent 0.93 and descent 0.24 of the size
      items.push({ str: it.str, x: e, right: e + it.width, top: h - f - size * 0.93, bottom: h - f + size * 0.24, size });
    }
    pages.push({ width: w, height: h, items });
  }
  await pdf.destroy();
  return pages;
}

/** Pairs of text items whose boxes overlap by more than `share` of the smaller box's area. */
export function overlaps(items: TextBox[], share = 0.04): [TextBox, TextBox][] {
  const out: [TextBox, TextBox][] = [];
  const sorted = [...items].sort((p, q) => p.top - q.top);
  for (let i = 0; i < sorted.length; i++) {
    const p = sorted[i];
    for (let j = i + 1; j < sorted.length && sorted[j].top < p.bottom; j++) {
      const q = sorted[j];
      const w = Math.min(p.right, q.right) - Math.max(p.x, q.x);
      const h = Math.min(p.bottom, q.bottom) - Math.max(p.top, q.top);
      if (w <= 0 || h <= 0) continue;
      const area = (t: TextBox) => (t.right - t.x) * (t.bottom - t.top);
      if (w * h > share * Math.min(area(p), area(q))) out.push([p, q]);
    }
  }
  return out;
}

/** A straight horizontal stroke (a row rule, a writing line), in page coordinates from the top (pt). */
export interface HRule {
  x0: number;
  x1: number;
  y: number;
}

/** A drawn rectangle (a framed box, a header band, a tick or tally box), from the top (pt). */
export interface Box {
  x: number;
  top: number;
  right: number;
  bottom: number;
}

export interface PageRules {
  rules: HRule[];
  boxes: Box[];
}

type Matrix = [number, number, number, number, number, number];
const mul = (m: Matrix, n: Matrix): Matrix => [
  m[0] * n[0] + m[2] * n[1],
  m[1] * n[0] + m[3] * n[1],
  m[0] * n[2] + m[2] * n[3],
  m[1] * n[2] + m[3] * n[3],
  m[0] * n[4] + m[2] * n[5] + m[4],
  m[1] * n[4] + m[3] * n[5] + m[5],
];
const apply = (m: Matrix, x: number, y: number): [number, number] => [m[0] * x + m[2] * y + m[4], m[1] * x + m[3] * y + m[5]];

/**
 * The ruled lines and boxes of every page, read from pdfjs's operator list (PDF 32000-1 §8.5: path
 * construction, then a painting operator; the current transformation matrix tracked through q, Q
 * and cm). Horizontal straight strokes become rules; rectangles that are stroked or filled become
 * boxes. Clipping paths and curves are left out.
 */
export async function readRules(buf: Buffer | Uint8Array): Promise<PageRules[]> {
  const { OPS } = await import("pdfjs-dist/legacy/build/pdf.mjs");
  const pdf = await getDocument({ data: new Uint8Array(buf), useSystemFonts: false, isEvalSupported: false }).promise;
  const out: PageRules[] = [];
  const paint = new Set<number>([
    OPS.stroke,
    OPS.closeStroke,
    OPS.fill,
    OPS.eoFill,
    OPS.fillStroke,
    OPS.eoFillStroke,
    OPS.closeFillStroke,
    OPS.closeEOFillStroke,
  ]);
  for (let i = 1; i <= pdf.numPages; i++) {
    const page = await pdf.getPage(i);
    const h = page.view[3];
    const ops = await page.getOperatorList();
    const rules: HRule[] = [];
    const boxes: Box[] = [];
    let ctm: Matrix = [1, 0, 0, 1, 0, 0];
    const stack: Matrix[] = [];
    let segs: [number, number, number, number][] = [];
    let rects: Box[] = [];
    const toTop = (x: number, y: number): [number, number] => {
      const [px, py] = apply(ctm, x, y);
      return [px, h - py];
    };
    for (let k = 0; k < ops.fnArray.length; k++) {
      const fn = ops.fnArray[k];
      const args = ops.argsArray[k] as unknown[];
      if (fn === OPS.save) stack.push(ctm);
      else if (fn === OPS.restore) ctm = stack.pop() ?? [1, 0, 0, 1, 0, 0];
      else if (fn === OPS.transform) ctm = mul(ctm, args as Matrix);
      else if (fn === OPS.constructPath) {
        const [pops, pargs] = args as [number[], number[]];
        let j = 0;
        let cur: [number, number] = [0, 0];
        for (const op of pops) {
          if (op === OPS.rectangle) {
            const [x, y, w, hh] = pargs.slice(j, j + 4);
            j += 4;
            const [ax, ay] = toTop(x, y);
            const [bx, by] = toTop(x + w, y + hh);
            rects.push({ x: Math.min(ax, bx), top: Math.min(ay, by), right: Math.max(ax, bx), bottom: Math.max(ay, by) });
          } else if (op === OPS.moveTo) {
            cur = toTop(pargs[j], pargs[j + 1]);
            j += 2;
          } else if (op === OPS.lineTo) {
            const next = toTop(pargs[j], pargs[j + 1]);
            j += 2;
            segs.push([cur[0], cur[1], next[0], next[1]]);
            cur = next;
          } else if (op === OPS.curveTo) j += 6;
          else if (op === OPS.curveTo2 || op === OPS.curveTo3) j += 4;
        }
      } else if (paint.has(fn)) {
        const stroked = fn !== OPS.fill && fn !== OPS.eoFill;
        if (stroked)
          for (const [x0, y0, x1, y1] of segs)
            if (Math.abs(y0 - y1) < 0.01 && Math.abs(x1 - x0) > 0.5) rules.push({ x0: Math.min(x0, x1), x1: Math.max(x0, x1), y: y0 });
        boxes.push(...rects);
        segs = [];
        rects = [];
      } else if (fn === OPS.endPath) {
        segs = [];
        rects = [];
      }
    }
    out.push({ rules, boxes });
  }
  await pdf.destroy();
  return out;
}

/** Slack for the checks below, pt: a text's box is its line's full height (ascent to descent), wider than its ink. */
const SLACK = 0.75;

/**
 * Text against the ruled lines and boxes of one page: no text crosses a horizontal rule it lies
 * across (the rule runs through the text's line box, not along its edge), and a text that starts
 * inside a box (its left end at mid-height) stays inside it. Returns one sentence per problem.
 */
export function ruleProblems(items: TextBox[], rules: PageRules, page: string): string[] {
  const out: string[] = [];
  for (const t of items) {
    for (const r of rules.rules) {
      const across = Math.min(t.right, r.x1) - Math.max(t.x, r.x0) > 1;
      if (across && r.y > t.top + SLACK && r.y < t.bottom - SLACK)
        out.push(`${page}: "${t.str}" is crossed by a rule at y ${r.y.toFixed(1)} (text ${t.top.toFixed(1)}–${t.bottom.toFixed(1)})`);
    }
    const mid = (t.top + t.bottom) / 2;
    for (const b of rules.boxes) {
      const starts = t.x + 0.5 >= b.x && t.x + 0.5 <= b.right && mid >= b.top && mid <= b.bottom;
      if (!starts) continue;
      if (t.right > b.right + SLACK || t.top < b.top - SLACK || t.bottom > b.bottom + SLACK)
        out.push(
          `${page}: "${t.str}" leaves its box (${b.x.toFixed(0)}, ${b.top.toFixed(0)})–(${b.right.toFixed(0)}, ${b.bottom.toFixed(0)}) at (${t.x.toFixed(0)}, ${t.top.toFixed(0)})–(${t.right.toFixed(0)}, ${t.bottom.toFixed(0)})`,
        );
    }
  }
  return out;
}
