/**
 * The history scatter as a PDF page (pdfkit, DejaVu Sans as the card uses it, so Ω and ° print).
 * A shell over the display list of history.ts painted by plot/drawing.ts; returns the file's bytes.
 */
import PDFDocument from "pdfkit";
import { cardFonts } from "../card/fonts.js";
import { paintDrawing, type PdfCanvas } from "../plot/drawing.js";
import type { Drawing } from "./history.js";

export function drawingPdf(d: Drawing, info: { title: string; date?: Date }): Promise<Buffer> {
  const doc = new PDFDocument({
    size: [d.width, d.height],
    autoFirstPage: false,
    info: { Title: info.title, Creator: "armwind", ...(info.date ? { CreationDate: info.date } : {}) },
    lang: "en",
  });
  const fonts = cardFonts();
  doc.registerFont("DejaVu", fonts.regular);
  doc.registerFont("DejaVu-Bold", fonts.bold);
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("data", (c: Buffer) => chunks.push(c));
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });
  doc.addPage({ size: [d.width, d.height], margins: { top: 0, bottom: 0, left: 0, right: 0 } });
  paintDrawing(doc as unknown as PdfCanvas, d, 0, 0, { regular: "DejaVu", bold: "DejaVu-Bold" });
  doc.end();
  return done;
}
