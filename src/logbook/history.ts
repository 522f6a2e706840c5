/**
 * History of finished rewinds: rows for the terminal, CSV for a spreadsheet, and the predicted
 * against measured scatter (one panel per figure, with the y = x line) as a display list that the
 * SVG writer here and the PDF writer (history-pdf.ts) both draw. Pure: records in, text out.
 */
import type { LogRecord } from "./record.js";
import { checkOf } from "./record.js";
import { NO_LOAD_CURRENT, NO_LOAD_SPEED, TERMINAL, checkLabel } from "../bench/rules.js";
import { niceTicks } from "../plot/ticks.js";

export interface HistoryRow {
  file: string;
  job_id: string;
  date: string;
  family: string | null;
  style: string;
  slots: number;
  bars: number;
  turns_per_coil: number;
  wire: string;
  strands_in_hand: number;
  /** Terminal resistance at 20 °C: predicted, and measured corrected to 20 °C (IEC 60028). */
  terminal_predicted_ohm: number | null;
  terminal_measured_ohm: number | null;
  no_load_current_predicted_a: number | null;
  no_load_current_measured_a: number | null;
  no_load_speed_predicted_rpm: number | null;
  no_load_speed_measured_rpm: number | null;
  /** Every check of the record within tolerance. */
  checks_ok: boolean;
  /** Checks out of tolerance, as people name them ("r7", "terminal_resistance", "bar_to_bar.spread" …). */
  checks_failed: string[];
}

/** One row per record (the order given). */
export function historyRows(records: { file: string; record: LogRecord }[]): HistoryRow[] {
  return records.map(({ file, record: r }) => {
    const term = checkOf(r, "terminal_resistance");
    const cur = checkOf(r, "no_load.current");
    const spd = checkOf(r, "no_load.speed");
    return {
      file,
      job_id: r.job.id,
      date: r.date,
      family: r.job.family,
      style: r.job.style,
      slots: r.job.slots,
      bars: r.job.bars,
      turns_per_coil: r.winding.turns,
      wire: r.winding.wire.label,
      strands_in_hand: r.winding.strands,
      terminal_predicted_ohm: term?.predicted_value ?? r.predicted.terminal_ohm ?? null,
      terminal_measured_ohm: term?.measured_20c_value ?? null,
      no_load_current_predicted_a: cur?.predicted_value ?? null,
      no_load_current_measured_a: cur?.measured_value ?? null,
      no_load_speed_predicted_rpm: spd?.predicted_value ?? null,
      no_load_speed_measured_rpm: spd?.measured_value ?? null,
      checks_ok: r.comparison.ok,
      checks_failed: r.comparison.checks.filter((c) => c.verdict !== "ok" && c.verdict !== "not_checked").map((c) => checkLabel(c.check)),
    };
  });
}

const CSV_COLUMNS: (keyof HistoryRow)[] = [
  "job_id",
  "date",
  "family",
  "style",
  "slots",
  "bars",
  "turns_per_coil",
  "wire",
  "strands_in_hand",
  "terminal_predicted_ohm",
  "terminal_measured_ohm",
  "no_load_current_predicted_a",
  "no_load_current_measured_a",
  "no_load_speed_predicted_rpm",
  "no_load_speed_measured_rpm",
  "checks_ok",
  "checks_failed",
  "file",
];

function csvCell(v: unknown): string {
  if (v === null || v === undefined) return "";
  const s = Array.isArray(v) ? v.join(" ") : String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** CSV (RFC 4180: comma-separated, quoted where needed, CRLF line ends), numbers unrounded, a header row. */
export function historyCsv(rows: HistoryRow[]): string {
  const lines = [CSV_COLUMNS.join(","), ...rows.map((r) => CSV_COLUMNS.map((c) => csvCell(r[c])).join(","))];
  return lines.join("\r\n") + "\r\n";
}

// ---------------------------------------------------------------------------------------------
// the scatter plot as a display list (points, origin top left)

import type { Drawing, Shape } from "../plot/drawing.js";
export type { Drawing, Shape } from "../plot/drawing.js";
export { drawingSvg } from "../plot/drawing.js";

interface Panel {
  title: string;
  unit: string;
  tolerance: number;
  points: { x: number; y: number; ok: boolean }[];
}

function tickText(v: number, step: number): string {
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  return v.toFixed(decimals);
}

/** The three panels of the history plot, each with the bench rule's tolerance (src/bench/rules.ts). */
function historyPanels(rows: HistoryRow[]): Panel[] {
  return [
    {
      title: "Terminal resistance at 20 °C",
      unit: "Ω",
      tolerance: TERMINAL.fraction,
      points: rows
        .filter((r) => r.terminal_predicted_ohm !== null && r.terminal_measured_ohm !== null)
        .map((r) => ({ x: r.terminal_predicted_ohm!, y: r.terminal_measured_ohm!, ok: r.checks_ok })),
    },
    {
      title: "No-load current",
      unit: "A",
      tolerance: NO_LOAD_CURRENT.fraction,
      points: rows
        .filter((r) => r.no_load_current_predicted_a !== null && r.no_load_current_measured_a !== null)
        .map((r) => ({ x: r.no_load_current_predicted_a!, y: r.no_load_current_measured_a!, ok: r.checks_ok })),
    },
    {
      title: "No-load speed",
      unit: "rpm",
      tolerance: NO_LOAD_SPEED.fraction,
      points: rows
        .filter((r) => r.no_load_speed_predicted_rpm !== null && r.no_load_speed_measured_rpm !== null)
        .map((r) => ({ x: r.no_load_speed_predicted_rpm!, y: r.no_load_speed_measured_rpm!, ok: r.checks_ok })),
    },
  ];
}

/** Predicted against measured, one panel per figure (terminal Ω at 20 °C, no-load current, no-load speed). */
export function historyDrawing(rows: HistoryRow[], title: string): Drawing {
  const panels = historyPanels(rows);
  const W = 842;
  const H = 595;
  const shapes: Shape[] = [];
  shapes.push({ kind: "text", x: 40, y: 40, text: title, size: 14, anchor: "start", bold: true });
  shapes.push({
    kind: "text",
    x: 40,
    y: 58,
    text: `Predicted against measured, ${rows.length} record${rows.length === 1 ? "" : "s"}. Solid line: measured = predicted; dashed: the check's tolerance. Filled dots: every check within tolerance; open: a check out of it.`,
    size: 8,
    anchor: "start",
  });
  const size = 212;
  const streets = 56;
  const top = 150;
  panels.forEach((p, i) => {
    const left = 66 + i * (size + streets);
    drawPanel(shapes, p, left, top, size);
  });
  shapes.push({
    kind: "text",
    x: 40,
    y: H - 40,
    text: `Tolerances (bench rules; common practice, no published source): terminal resistance ±${TERMINAL.fraction * 100} %, no-load current ±${NO_LOAD_CURRENT.fraction * 100} %, no-load speed ±${NO_LOAD_SPEED.fraction * 100} %.`,
    size: 7,
    anchor: "start",
  });
  return { width: W, height: H, shapes };
}

function drawPanel(shapes: Shape[], p: Panel, left: number, top: number, size: number) {
  shapes.push({ kind: "text", x: left + size / 2, y: top - 14, text: `${p.title} (${p.unit})`, size: 10, anchor: "middle", bold: true });
  shapes.push({ kind: "rect", x: left, y: top, w: size, h: size, grey: 0 });
  if (p.points.length === 0) {
    shapes.push({ kind: "text", x: left + size / 2, y: top + size / 2, text: "no records with this figure", size: 8, anchor: "middle" });
    return;
  }
  // the same scale on both axes, wide enough to show the tolerance band round every point
  const vals = p.points.flatMap((q) => [q.x, q.y]);
  const lo = Math.max(0, Math.min(...vals) * (1 - 1.6 * p.tolerance));
  const hi = Math.max(...vals) * (1 + 1.6 * p.tolerance) || 1;
  const sx = (v: number) => left + ((v - lo) / (hi - lo)) * size;
  const sy = (v: number) => top + size - ((v - lo) / (hi - lo)) * size;
  const ticks = niceTicks(lo, hi, 5, [1, 2, 5, 10]);
  const step = ticks.length > 1 ? ticks[1] - ticks[0] : hi - lo;
  for (const t of ticks) {
    if (t < lo || t > hi) continue;
    shapes.push({ kind: "line", x1: sx(t), y1: top + size, x2: sx(t), y2: top + size + 4, width: 0.5, grey: 0 });
    shapes.push({ kind: "text", x: sx(t), y: top + size + 13, text: tickText(t, step), size: 7, anchor: "middle" });
    shapes.push({ kind: "line", x1: left - 4, y1: sy(t), x2: left, y2: sy(t), width: 0.5, grey: 0 });
    shapes.push({ kind: "text", x: left - 6, y: sy(t) + 2.5, text: tickText(t, step), size: 7, anchor: "end" });
    shapes.push({ kind: "line", x1: left, y1: sy(t), x2: left + size, y2: sy(t), width: 0.3, grey: 0.85 });
    shapes.push({ kind: "line", x1: sx(t), y1: top, x2: sx(t), y2: top + size, width: 0.3, grey: 0.85 });
  }
  // y = x and the tolerance lines y = (1 ± tol)·x, clipped to the square
  // y = k·x from x where k·x ≥ lo
  const seg = (k: number, dash?: number) => {
    const xa = Math.max(lo, lo / k);
    const xb = Math.min(hi, hi / k);
    if (xb <= xa) return;
    shapes.push({ kind: "line", x1: sx(xa), y1: sy(k * xa), x2: sx(xb), y2: sy(k * xb), width: dash ? 0.5 : 0.8, grey: dash ? 0.4 : 0, dash });
  };
  seg(1);
  seg(1 + p.tolerance, 3);
  seg(1 - p.tolerance, 3);
  for (const q of p.points) shapes.push({ kind: "circle", cx: sx(q.x), cy: sy(q.y), r: 2.6, filled: q.ok });
  shapes.push({ kind: "text", x: left + size / 2, y: top + size + 28, text: `predicted (${p.unit})`, size: 8, anchor: "middle" });
  shapes.push({ kind: "text", x: left - 38, y: top + size / 2, text: `measured (${p.unit})`, size: 8, anchor: "middle", rotate: true });
}
