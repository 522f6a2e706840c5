/**
 * The history scatter as a PDF page (pdfkit, DejaVu Sans as the card uses it, so Ω and ° print).
 * A drawing shell over the display list of history.ts; returns the file's bytes.
 */
import PDFDocument from "pdfkit";
import { FONT_FILES } from "../card/sheet.js";
import type { Drawing } from "./history.js";

const hexGrey = (g: number) => {
  const v = Math.round(g * 255)
    .toString(16)
    .padStart(2, "0");
  return `#${v}${v}${v}`;
};

export function drawingPdf(d: Drawing, info: { title: string; date?: Date }): Promise<Buffer> {
  const doc = new PDFDocument({ size: [d.width, d.height], autoFirstPage: false, info: { Title: info.title, Creator: "armwind", ...(info.date ? { CreationDate: info.date } : {}) }, lang: "en" });
  doc.registerFont("DejaVu", FONT_FILES.regular);
  doc.registerFont("DejaVu-Bold", FONT_FILES.bold);
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("data", (c: Buffer) => chunks.push(c));
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });
  doc.addPage({ size: [d.width, d.height], margins: { top: 0, bottom: 0, left: 0, right: 0 } });
  for (const s of d.shapes) {
    switch (s.kind) {
      case "line":
        doc.save();
        doc.lineWidth(s.width).strokeColor(hexGrey(s.grey));
        if (s.dash) doc.dash(s.dash, { space: s.dash });
        doc.moveTo(s.x1, s.y1).lineTo(s.x2, s.y2).stroke();
        doc.restore();
        break;
      case "circle":
        doc.save();
        doc.lineWidth(0.8).circle(s.cx, s.cy, s.r);
        if (s.filled) doc.fillAndStroke("#000000", "#000000");
        else doc.fillAndStroke("#ffffff", "#000000");
        doc.restore();
        break;
      case "rect":
        doc.save();
        doc.lineWidth(0.8).rect(s.x, s.y, s.w, s.h).stroke(hexGrey(s.grey));
        doc.restore();
        break;
      case "text": {
        doc.save();
        doc.font(s.bold ? "DejaVu-Bold" : "DejaVu").fontSize(s.size).fillColor("#000000");
        const w = doc.widthOfString(s.text);
        const dx = s.anchor === "middle" ? -w / 2 : s.anchor === "end" ? -w : 0;
        // SVG puts y on the baseline; pdfkit on the top of the line: lift by the ascent (about 0.8 em)
        const baseline = 0.8 * s.size;
        if (s.rotate) {
          doc.rotate(-90, { origin: [s.x, s.y] });
          doc.text(s.text, s.x + dx, s.y - baseline, { lineBreak: false });
        } else {
          doc.text(s.text, s.x + dx, s.y - baseline, { lineBreak: false });
        }
        doc.restore();
        break;
      }
    }
  }
  doc.end();
  return done;
}
