/**
 * The part of pdfkit 0.20's API the card uses. pdfkit 0.20 ships no type declarations and
 * @types/pdfkit is not installed, so the card declares what it calls, and nothing more.
 */
declare module "pdfkit" {
  export interface TextOptions {
    width?: number;
    height?: number;
    align?: "left" | "center" | "right" | "justify";
    lineBreak?: boolean;
    lineGap?: number;
    characterSpacing?: number;
    underline?: boolean;
    continued?: boolean;
    ellipsis?: boolean | string;
    paragraphGap?: number;
    indent?: number;
  }
  export interface PageOptions {
    size?: [number, number] | string;
    margins?: { top: number; bottom: number; left: number; right: number };
    layout?: "portrait" | "landscape";
  }
  export interface DocumentOptions extends PageOptions {
    autoFirstPage?: boolean;
    bufferPages?: boolean;
    compress?: boolean;
    info?: Record<string, string | Date>;
    pdfVersion?: string;
    lang?: string;
    displayTitle?: boolean;
  }
  export interface Page {
    width: number;
    height: number;
    margins: { top: number; bottom: number; left: number; right: number };
  }
  export default class PDFDocument {
    constructor(options?: DocumentOptions);
    page: Page;
    x: number;
    y: number;
    info: Record<string, string | Date>;
    on(event: "data", cb: (chunk: Buffer) => void): this;
    on(event: "end", cb: () => void): this;
    on(event: "error", cb: (err: Error) => void): this;
    addPage(options?: PageOptions): this;
    end(): void;
    bufferedPageRange(): { start: number; count: number };
    switchToPage(n: number): this;
    registerFont(name: string, src: string | Buffer): this;
    font(name: string): this;
    fontSize(size: number): this;
    text(text: string, x?: number, y?: number, options?: TextOptions): this;
    text(text: string, options?: TextOptions): this;
    widthOfString(text: string, options?: TextOptions): number;
    heightOfString(text: string, options?: TextOptions): number;
    currentLineHeight(includeGap?: boolean): number;
    moveTo(x: number, y: number): this;
    lineTo(x: number, y: number): this;
    bezierCurveTo(c1x: number, c1y: number, c2x: number, c2y: number, x: number, y: number): this;
    quadraticCurveTo(cx: number, cy: number, x: number, y: number): this;
    rect(x: number, y: number, w: number, h: number): this;
    roundedRect(x: number, y: number, w: number, h: number, r: number): this;
    circle(x: number, y: number, r: number): this;
    ellipse(x: number, y: number, rx: number, ry?: number): this;
    polygon(...points: [number, number][]): this;
    path(svg: string): this;
    closePath(): this;
    stroke(color?: string | number[]): this;
    fill(color?: string | number[]): this;
    fillAndStroke(fill?: string | number[], stroke?: string | number[]): this;
    clip(): this;
    lineWidth(w: number): this;
    lineCap(c: "butt" | "round" | "square"): this;
    lineJoin(j: "miter" | "round" | "bevel"): this;
    dash(length: number, options?: { space?: number; phase?: number }): this;
    undash(): this;
    strokeColor(color: string | number[], opacity?: number): this;
    fillColor(color: string | number[], opacity?: number): this;
    save(): this;
    restore(): this;
    rotate(angle: number, options?: { origin?: [number, number] }): this;
    translate(x: number, y: number): this;
  }
}
