// The yardstick for `armwind card`: a whole Node process that loads pdfkit and writes a one-page PDF.
import PDFDocument from "pdfkit";
import { createWriteStream } from "node:fs";

const out = process.argv[2];
const doc = new PDFDocument({ size: "A4" });
const done = new Promise((resolve) => doc.pipe(createWriteStream(out)).on("finish", resolve));
doc.fontSize(24).text("one page", 72, 72);
doc.end();
await done;
