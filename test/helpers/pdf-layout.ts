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
