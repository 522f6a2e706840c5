/**
 * A small display list for charts (points, origin top left), and its two painters: SVG text and
 * a pdfkit document. The card's curves, the curves image and the logbook's history plot are all
 * drawn as one of these, so the page and the image show the same thing.
 * Black and white: greys only (0 black … 1 white), dashes for a second series.
 */

export type Shape =
  | { kind: "line"; x1: number; y1: number; x2: number; y2: number; width: number; grey: number; dash?: number }
  | { kind: "polyline"; points: [number, number][]; width: number; dash?: number }
  | { kind: "circle"; cx: number; cy: number; r: number; filled: boolean }
  | { kind: "rect"; x: number; y: number; w: number; h: number; grey: number; width?: number }
  | { kind: "text"; x: number; y: number; text: string; size: number; anchor: "start" | "middle" | "end"; bold?: boolean; rotate?: boolean };

export interface Drawing {
  width: number;
  height: number;
  shapes: Shape[];
}

const esc = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
const f2 = (x: number) => String(Math.round(x * 100) / 100);

/** A grey as a hex colour: g = 0 black … 1 white. */
export function hexGrey(g: number): string {
  const v = Math.max(0, Math.min(255, Math.round(g * 255)))
    .toString(16)
    .padStart(2, "0");
  return `#${v}${v}${v}`;
}

/** The drawing as an SVG document (text, written by hand; no native dependencies). */
export function drawingSvg(d: Drawing): string {
  const out: string[] = [];
  out.push(`<?xml version="1.0" encoding="UTF-8"?>`);
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${d.width}pt" height="${d.height}pt" viewBox="0 0 ${d.width} ${d.height}" font-family="DejaVu Sans, Verdana, sans-serif">`,
  );
  out.push(`<rect x="0" y="0" width="${d.width}" height="${d.height}" fill="#ffffff"/>`);
  for (const s of d.shapes) {
    switch (s.kind) {
      case "line":
        out.push(
          `<line x1="${f2(s.x1)}" y1="${f2(s.y1)}" x2="${f2(s.x2)}" y2="${f2(s.y2)}" stroke="${hexGrey(s.grey)}" stroke-width="${s.width}"${s.dash ? ` stroke-dasharray="${s.dash} ${s.dash}"` : ""}/>`,
        );
        break;
      case "polyline":
        out.push(
          `<polyline points="${s.points.map((p) => `${f2(p[0])},${f2(p[1])}`).join(" ")}" fill="none" stroke="#000000" stroke-width="${s.width}" stroke-linejoin="round"${s.dash ? ` stroke-dasharray="${s.dash} ${s.dash * 0.6}"` : ""}/>`,
        );
        break;
      case "circle":
        out.push(
          `<circle class="point" cx="${f2(s.cx)}" cy="${f2(s.cy)}" r="${s.r}" fill="${s.filled ? "#000000" : "#ffffff"}" stroke="#000000" stroke-width="0.8"/>`,
        );
        break;
      case "rect":
        out.push(
          `<rect x="${f2(s.x)}" y="${f2(s.y)}" width="${f2(s.w)}" height="${f2(s.h)}" fill="none" stroke="${hexGrey(s.grey)}" stroke-width="${s.width ?? 0.8}"/>`,
        );
        break;
      case "text":
        out.push(
          `<text x="${f2(s.x)}" y="${f2(s.y)}" font-size="${s.size}" text-anchor="${s.anchor}"${s.bold ? ' font-weight="bold"' : ""}${s.rotate ? ` transform="rotate(-90 ${f2(s.x)} ${f2(s.y)})"` : ""}>${esc(s.text)}</text>`,
        );
        break;
    }
  }
  out.push(`</svg>`);
  return out.join("\n") + "\n";
}

/** The part of a pdfkit document the painter uses. */
export interface PdfCanvas {
  save(): this;
  restore(): this;
  lineWidth(w: number): this;
  strokeColor(c: string): this;
  dash(len: number, opts: { space: number }): this;
  moveTo(x: number, y: number): this;
  lineTo(x: number, y: number): this;
  stroke(color?: string): this;
  circle(x: number, y: number, r: number): this;
  rect(x: number, y: number, w: number, h: number): this;
  fillAndStroke(fill: string, stroke: string): this;
  lineJoin(j: string): this;
  font(name: string): this;
  fontSize(size: number): this;
  fillColor(c: string): this;
  widthOfString(s: string): number;
  rotate(deg: number, opts: { origin: [number, number] }): this;
  text(s: string, x: number, y: number, opts: { lineBreak: boolean }): this;
}

/** Paint the drawing onto a pdfkit page with its top left at (x0, y0); `fonts` names the registered regular and bold fonts. */
export function paintDrawing(doc: PdfCanvas, d: Drawing, x0: number, y0: number, fonts: { regular: string; bold: string }): void {
  for (const s of d.shapes) {
    switch (s.kind) {
      case "line":
        doc.save().lineWidth(s.width).strokeColor(hexGrey(s.grey));
        if (s.dash) doc.dash(s.dash, { space: s.dash });
        doc
          .moveTo(x0 + s.x1, y0 + s.y1)
          .lineTo(x0 + s.x2, y0 + s.y2)
          .stroke();
        doc.restore();
        break;
      case "polyline": {
        if (s.points.length < 2) break;
        doc.save().lineWidth(s.width).lineJoin("round").strokeColor("#000000");
        if (s.dash) doc.dash(s.dash, { space: s.dash * 0.6 });
        doc.moveTo(x0 + s.points[0][0], y0 + s.points[0][1]);
        for (const p of s.points.slice(1)) doc.lineTo(x0 + p[0], y0 + p[1]);
        doc.stroke();
        doc.restore();
        break;
      }
      case "circle":
        doc
          .save()
          .lineWidth(0.8)
          .circle(x0 + s.cx, y0 + s.cy, s.r);
        doc.fillAndStroke(s.filled ? "#000000" : "#ffffff", "#000000");
        doc.restore();
        break;
      case "rect":
        doc
          .save()
          .lineWidth(s.width ?? 0.8)
          .rect(x0 + s.x, y0 + s.y, s.w, s.h)
          .stroke(hexGrey(s.grey));
        doc.restore();
        break;
      case "text": {
        doc
          .save()
          .font(s.bold ? fonts.bold : fonts.regular)
          .fontSize(s.size)
          .fillColor("#000000");
        const w = doc.widthOfString(s.text);
        const dx = s.anchor === "middle" ? -w / 2 : s.anchor === "end" ? -w : 0;
        // SVG puts y on the baseline; pdfkit on the top of the line: lift by the ascent (about 0.8 em)
        const x = x0 + s.x;
        const y = y0 + s.y;
        if (s.rotate) doc.rotate(-90, { origin: [x, y] });
        doc.text(s.text, x + dx, y - 0.8 * s.size, { lineBreak: false });
        doc.restore();
        break;
      }
    }
  }
}
