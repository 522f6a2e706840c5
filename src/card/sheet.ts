/**
 * Drawing helpers shared by the card's page builders: a `Sheet` wraps the pdfkit document with a
 * running y position, page breaks that repeat the section heading, and the workshop furniture
 * (headings, wrapped text, key–value blocks, tables, tick boxes, blanks to write in).
 * Black and white only: meaning never rests on colour, greys only for fills and faint guides.
 */
import PDFDocument from "pdfkit";
import type { CardLayout, Paper } from "./layout.js";
import { cardFonts } from "./fonts.js";
import { breakLongWords } from "./wrap.js";
import type { MeterResolution } from "../bench/rules.js";
const REG = "DejaVu";
const BOLD = "DejaVu-Bold";
/** Names under which the card registers its regular and bold fonts. */
export const FONT_REGULAR = REG;
export const FONT_BOLD = BOLD;

export const BLACK = "#000000";
/** A grey as a hex colour: g = 0 black … 1 white. */
export function grey(g: number): string {
  const v = Math.max(0, Math.min(255, Math.round(g * 255)))
    .toString(16)
    .padStart(2, "0");
  return `#${v}${v}${v}`;
}

export interface TextStyle {
  size?: number;
  bold?: boolean;
  /** Grey level of the text (0 black); keep ≤ 0.45 so it still prints legibly. */
  grey?: number;
  align?: "left" | "center" | "right";
  width?: number;
  x?: number;
  /** Space after, pt (default a third of the line). */
  after?: number;
  lineGap?: number;
}

/** One line of a laid-out text: its characters and the options pdfkit's line wrapper gave it (width, alignment, measured width). */
export interface TextLine {
  text: string;
  options: object;
}

/** A text laid out once (`Sheet.layout`): its lines, the height of each, and the whole height, pt. */
export interface TextBlock {
  readonly style: TextStyle;
  readonly width: number;
  readonly lines: readonly TextLine[];
  /** Height of one line, pt: the font's line height plus the line gap. */
  readonly step: number;
  readonly height: number;
}

/**
 * The two steps of pdfkit 0.20's `text()` the card calls apart (pdfkit's own names; not in its
 * public API, so a test draws a block both ways and compares the page contents): `_text` runs the
 * line wrapper and calls back once a line, `_fragment` writes one line at a place.
 */
interface PdfkitText {
  x: number;
  y: number;
  currentLineHeight(includeGap?: boolean): number;
  _text(text: string, x: number, y: number, options: object, line: (text: string, options: object) => void): unknown;
  _fragment(text: string, x: number, y: number, options: object): void;
}

/** What the card knows besides the plan: the shop and bench (shop profile) and the bench meter. */
export interface CardContext {
  shop?: string;
  bench?: string;
  /** The bench meter's resolution and where it came from (src/bench/rules.ts `meterResolution`); absent: the rules' default. */
  meter?: MeterResolution;
  /** Net mass on the shelf's spool of the plan's wire, kg, when the profile says. */
  spoolMass?: number;
}

export class Sheet {
  readonly doc: PDFDocument;
  context: CardContext = {};
  readonly L: CardLayout;
  readonly paper: Paper;
  y = 0;
  /** Heading repeated (with "continued") when a section runs onto a new page. */
  private section = "";
  private pages = 0;

  constructor(L: CardLayout, paper: Paper, info: Record<string, string | Date>) {
    this.L = L;
    this.paper = paper;
    const size = L.paper[paper];
    this.doc = new PDFDocument({
      size: [size.width, size.height],
      margins: L.margin,
      autoFirstPage: false,
      bufferPages: true,
      info,
      lang: "en",
    });
    const f = cardFonts();
    this.doc.registerFont(REG, f.regular);
    this.doc.registerFont(BOLD, f.bold);
  }

  get left(): number {
    return this.L.margin.left;
  }
  get right(): number {
    return this.L.paper[this.paper].width - this.L.margin.right;
  }
  get width(): number {
    return this.right - this.left;
  }
  /** Lowest y content may reach (the footer sits below it). */
  get bottom(): number {
    return this.L.paper[this.paper].height - this.L.margin.bottom;
  }
  get top(): number {
    return this.L.margin.top;
  }
  get pageCount(): number {
    return this.pages;
  }

  /** Start a new page; with a section name, draw its heading. */
  newPage(section?: string): void {
    const size = this.L.paper[this.paper];
    this.doc.addPage({ size: [size.width, size.height], margins: this.L.margin });
    this.pages++;
    this.y = this.top;
    if (section !== undefined) {
      this.section = section;
      this.heading(section);
    }
  }

  /**
   * Start a section: on this page when at least `needed` pt (or `share` of a page, whichever is
   * more) is left below the heading, else on a new page. Sections flow one after another, so no
   * page is left holding a sentence; what must stay together asks for its room here.
   */
  startSection(name: string, opts: { needed?: number; share?: number } = {}): void {
    const full = this.bottom - this.top;
    const want = Math.max(opts.needed ?? 0, (opts.share ?? 0) * full) + this.L.type.heading * 2.2;
    if (this.pages === 0 || this.y + want + 18 > this.bottom) {
      this.newPage(name);
      return;
    }
    this.y += 18;
    this.section = name;
    this.heading(name);
  }

  /** Make room for h points: a new page (with the section heading marked "continued") when the rest of this one is too short. */
  need(h: number): void {
    if (this.y + h > this.bottom) {
      this.newPage();
      if (this.section) this.heading(`${this.section} (continued)`);
    }
  }

  room(): number {
    return this.bottom - this.y;
  }

  /** Room on a new page below a section's "continued" heading, pt (what `need` opens). */
  fullRoom(): number {
    return this.bottom - this.top - this.L.type.heading * 1.7;
  }

  /** Set the font and size of a style, and its colour unless `colour` is false (laying out needs no colour). */
  font(style: TextStyle = {}, colour = true): PDFDocument {
    const d = this.doc;
    d.font(style.bold ? BOLD : REG).fontSize(style.size ?? this.L.type.body);
    if (colour) d.fillColor(style.grey ? grey(style.grey) : BLACK);
    return d;
  }

  /**
   * Lay a text out once at a width and style: pdfkit's own line wrapper breaks it into lines (the
   * same breaks `doc.text` would make), and the block keeps those lines and its height, so what is
   * measured is what is drawn (`draw`), with no second wrapping pass. Long unbroken words are cut
   * first (src/card/wrap.ts). The height is pdfkit's `heightOfString`: each line
   * `currentLineHeight(true) + lineGap`.
   */
  layout(text: string, style: TextStyle = {}): TextBlock {
    const width = style.width ?? this.width;
    const lineGap = style.lineGap ?? 1;
    this.font(style, false);
    const d = this.doc as unknown as PdfkitText;
    const step = d.currentLineHeight(true) + lineGap;
    const lines: TextLine[] = [];
    const { x, y } = d;
    // height: Infinity, as heightOfString does: laying out never opens a page
    const options = { width, align: style.align ?? "left", lineGap, height: Infinity };
    d._text(this.breakable(text, width), 0, 0, options, (line, opts) => {
      lines.push({ text: line, options: { ...opts } });
      d.y += step;
    });
    d.x = x;
    d.y = y;
    let height = 0;
    for (let i = 0; i < lines.length; i++) height += step;
    return { style, width, lines, step, height };
  }

  /** Draw a laid-out block with its top-left at (x, y): each line where `doc.text` would have put it. */
  draw(block: TextBlock, x: number, y: number): void {
    this.font(block.style);
    const d = this.doc as unknown as PdfkitText;
    let ly = y;
    for (const line of block.lines) {
      d._fragment(line.text, x, ly, line.options);
      ly += block.step;
    }
    d.x = x;
    d.y = ly;
  }

  /** Text whose long unbroken words are cut to `width` in the current font (linear cost: src/card/wrap.ts). */
  private breakable(text: string, width: number): string {
    return breakLongWords(text, width, (s) => this.doc.widthOfString(s));
  }

  widthOf(text: string, style: TextStyle = {}): number {
    this.font(style, false);
    return this.doc.widthOfString(text);
  }

  /** Wrapped text (or a block laid out before) at the running y, page break first when it does not fit; returns its height. */
  para(text: string | TextBlock, style: TextStyle = {}): number {
    const width = style.width ?? this.width - ((style.x ?? this.left) - this.left);
    const block = typeof text === "string" ? this.layout(text, { ...style, width }) : text;
    this.need(block.height);
    this.draw(block, style.x ?? this.left, this.y);
    this.y += block.height + (style.after ?? (block.style.size ?? this.L.type.body) / 3);
    return block.height;
  }

  /** Text at a fixed place, no page logic; wrapped (laid out once) when a width is given, else one line. Returns its height. */
  at(text: string, x: number, y: number, style: TextStyle = {}): number {
    if (style.width !== undefined) {
      const block = this.layout(text, style);
      this.draw(block, x, y);
      return block.height;
    }
    this.font(style);
    this.doc.text(text, x, y, { align: style.align ?? "left", lineBreak: false, lineGap: style.lineGap ?? 1 });
    return this.doc.currentLineHeight(true) + (style.lineGap ?? 1);
  }

  heading(text: string): void {
    const s = this.L.type.heading;
    this.need(s * 2.2);
    this.font({ size: s, bold: true });
    this.doc.text(text.toUpperCase(), this.left, this.y, { lineBreak: false });
    this.y += s * 1.25;
    this.rule(this.L.line_width.heavy / 1.5);
    this.y += s * 0.45;
  }

  subheading(text: string, note?: string): void {
    const s = this.L.type.subheading;
    this.need(s * 3 + 40); // never leave a subheading alone at the foot of a page
    this.y += s * 0.3;
    this.font({ size: s, bold: true });
    this.doc.text(text, this.left, this.y, { lineBreak: false });
    if (note) {
      const w = this.doc.widthOfString(text);
      this.at(note, this.left + w + 8, this.y + (s - this.L.type.small) * 0.8, { size: this.L.type.small, grey: 0.3 });
    }
    this.y += s * 1.35;
  }

  rule(width = this.L.line_width.rule, x0 = this.left, x1 = this.right): void {
    this.doc.save().lineWidth(width).strokeColor(BLACK).moveTo(x0, this.y).lineTo(x1, this.y).stroke().restore();
  }

  /** An empty square to tick, top-left at (x, y). */
  tickBox(x: number, y: number, size = this.L.tick_box, heavy = false): void {
    this.doc
      .save()
      .lineWidth(heavy ? this.L.line_width.box * 1.6 : this.L.line_width.box)
      .strokeColor(BLACK)
      .rect(x, y, size, size)
      .stroke()
      .restore();
  }

  /** A line to write on, with an optional label before it and unit after; baseline at y + height. */
  blank(x: number, y: number, width: number, label = "", unit = "", size = this.L.type.label): number {
    const h = this.L.blank.height;
    let cx = x;
    if (label) {
      this.at(label, cx, y + h - size * 1.05, { size });
      cx += this.widthOf(label, { size }) + 4;
    }
    const uw = unit ? this.widthOf(unit, { size }) + 4 : 0;
    const lineEnd = x + width - uw;
    this.doc
      .save()
      .lineWidth(this.L.line_width.rule)
      .strokeColor(BLACK)
      .moveTo(cx, y + h)
      .lineTo(lineEnd, y + h)
      .stroke()
      .restore();
    if (unit) this.at(unit, lineEnd + 3, y + h - size * 1.05, { size });
    return h;
  }

  /** A box with a border (heavy or normal) around content drawn by `body`, which gets the inner x, y and width and returns the height it used. */
  framed(body: (x: number, y: number, w: number) => number, opts: { heavy?: boolean; pad?: number; fill?: number; estimate?: number } = {}): void {
    const pad = opts.pad ?? 8;
    if (opts.estimate) this.need(opts.estimate + 2 * pad);
    const y0 = this.y;
    const h = body(this.left + pad, y0 + pad, this.width - 2 * pad) + 2 * pad;
    this.doc
      .save()
      .lineWidth(opts.heavy ? this.L.line_width.heavy : this.L.line_width.box)
      .strokeColor(BLACK)
      .rect(this.left, y0, this.width, h)
      .stroke()
      .restore();
    this.y = y0 + h + 8;
  }

  /**
   * A table: header row in bold on a grey band, rows with hairlines; columns get widths (pt) and
   * alignment. Breaks across pages, repeating the header. Returns nothing; advances y.
   */
  table(
    cols: { head: string; width: number; align?: "left" | "right" | "center" }[],
    rows: string[][],
    opts: { size?: number; rowHeight?: number; x?: number; boldRows?: Set<number>; boldCols?: Set<number>; keepTogether?: boolean } = {},
  ): void {
    const size = opts.size ?? this.L.type.table;
    const x0 = opts.x ?? this.left;
    const totalW = cols.reduce((a, c) => a + c.width, 0);
    const pad = 3;
    const cell = (text: string, i: number, bold: boolean | undefined) =>
      this.layout(text, { size, bold, width: cols[i].width - 2 * pad, align: cols[i].align ?? "left" });
    // every cell laid out once: its height places the row, its lines are what is drawn
    const heads = cols.map((c, i) => cell(c.head, i, true));
    const headH = Math.max(...heads.map((b) => b.height)) + 2 * pad;
    const drawHead = () => {
      this.doc.save().rect(x0, this.y, totalW, headH).fill(grey(this.L.grey.fill)).restore();
      let x = x0;
      cols.forEach((c, i) => {
        this.draw(heads[i], x + pad, this.y + pad);
        x += c.width;
      });
      this.y += headH;
    };
    const cells = rows.map((r, ri) => cols.map((_, i) => cell(r[i] ?? "", i, opts.boldRows?.has(ri) || opts.boldCols?.has(i))));
    const rowHeights = cells.map((r) => Math.max(opts.rowHeight ?? 0, ...r.map((b) => b.height + 2 * pad)));
    const whole = headH + rowHeights.reduce((a, b) => a + b, 0);
    this.need(opts.keepTogether && whole < this.bottom - this.top - 40 ? whole : headH + rowHeights.slice(0, 2).reduce((a, b) => a + b, 0));
    drawHead();
    cells.forEach((r, ri) => {
      const h = rowHeights[ri];
      if (this.y + h > this.bottom) {
        this.need(this.bottom); // forces a page
        drawHead();
      }
      let x = x0;
      cols.forEach((c, i) => {
        this.draw(r[i], x + pad, this.y + pad);
        x += c.width;
      });
      this.y += h;
      this.doc
        .save()
        .lineWidth(this.L.line_width.thin)
        .strokeColor(grey(this.L.grey.rule))
        .moveTo(x0, this.y)
        .lineTo(x0 + totalW, this.y)
        .stroke()
        .restore();
    });
    this.y += 6;
  }

  /** Key–value lines in columns: [[key, value], …] laid out in `columns` side by side. Returns the height used. */
  pairs(items: [string, string][], x: number, y: number, width: number, opts: { size?: number; keyWidth?: number; columns?: number } = {}): number {
    const size = opts.size ?? this.L.type.body;
    const cols = opts.columns ?? 1;
    const colW = width / cols;
    const keyW = opts.keyWidth ?? colW * 0.42;
    const perCol = Math.ceil(items.length / cols);
    let maxH = 0;
    for (let c = 0; c < cols; c++) {
      let cy = y;
      for (const [k, v] of items.slice(c * perCol, (c + 1) * perCol)) {
        const cx = x + c * colW;
        const hk = this.at(k, cx, cy, { size, grey: 0.3, width: keyW - 4 });
        const hv = this.at(v, cx + keyW, cy, { size, width: colW - keyW - 6 });
        cy += Math.max(hv, hk) + 2;
      }
      maxH = Math.max(maxH, cy - y);
    }
    return maxH;
  }

  /** Footers on every page: job id, "page x of y", date, "armwind <version>". */
  footers(jobId: string, date: string, version: string): void {
    const range = this.doc.bufferedPageRange();
    const total = range.count;
    const size = this.L.footer.size;
    for (let i = 0; i < total; i++) {
      this.doc.switchToPage(range.start + i);
      const page = this.doc.page;
      const saved = page.margins.bottom;
      page.margins.bottom = 0; // writing below the bottom margin must not open a page
      const y = page.height - this.L.footer.offset;
      this.doc
        .save()
        .lineWidth(this.L.line_width.thin)
        .strokeColor(BLACK)
        .moveTo(this.left, y - 4)
        .lineTo(this.right, y - 4)
        .stroke()
        .restore();
      this.at(jobId, this.left, y, { size, bold: true });
      this.at(`page ${i + 1} of ${total}`, this.left, y, { size, bold: true, width: this.width, align: "center" });
      this.at(`${date}  ·  armwind ${version}`, this.left, y, { size, width: this.width, align: "right" });
      page.margins.bottom = saved;
    }
  }

  /** The finished PDF. */
  finish(): Promise<Buffer> {
    return new Promise((resolve, reject) => {
      const chunks: Buffer[] = [];
      this.doc.on("data", (c) => chunks.push(c));
      this.doc.on("end", () => resolve(Buffer.concat(chunks)));
      this.doc.on("error", reject);
      this.doc.end();
    });
  }
}
