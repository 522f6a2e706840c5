/**
 * The card's layout data: page sizes, margins, type sizes, section order and tally grouping, read
 * from templates/card-layout.json (the shop can change the card's look without touching code),
 * and the pure helpers that turn it into drawing decisions (tally boxes, page boxes).
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";

export type Paper = "a4" | "letter";
export type SectionName = "job" | "order" | "steps" | "diagram" | "bench" | "curves" | "candidates" | "cautions";
export const SECTIONS: readonly SectionName[] = ["job", "order", "steps", "diagram", "bench", "curves", "candidates", "cautions"];

export interface CardLayout {
  paper: Record<Paper, { width: number; height: number }>;
  margin: { top: number; bottom: number; left: number; right: number };
  footer: { size: number; offset: number };
  type: { small: number; body: number; table: number; label: number; heading: number; subheading: number; title: number; hero: number; step: number };
  line_width: { rule: number; box: number; heavy: number; thin: number };
  grey: { fill: number; rule: number; faint: number };
  sections: SectionName[];
  tally: { turns_per_box: number[]; max_boxes: number; group_size: number; box: number; gap: number; group_gap: number; label_size: number };
  tick_box: number;
  blank: { height: number };
  steps: { row_min_height: number; columns: { tick: number; coil: number; start: number; slots: number; finish: number } };
  /** The bench sheet's look only: its tolerances live in src/bench/rules.ts, the one place `log` and `diagnose` take them from. */
  bench: { row_height: number; column_sets: number };
  diagram: { emphasise_coils: number; label_every_min_pitch: number };
  curves: { charts: ("speed" | "current" | "efficiency" | "output")[]; height: number };
  candidates: { rows: number };
}

/** Where the layout file lives: templates/card-layout.json at the project root (two levels above src/card and dist/card). */
export const LAYOUT_FILE = fileURLToPath(new URL("../../templates/card-layout.json", import.meta.url));

let cached: CardLayout | null = null;

/** Read and check the layout file once; a broken file is a programming error of the project, not user input. */
export function cardLayout(): CardLayout {
  if (cached) return cached;
  const raw = JSON.parse(readFileSync(LAYOUT_FILE, "utf8")) as CardLayout;
  const bad = layoutProblems(raw);
  if (bad.length) throw new Error(`internal error: ${LAYOUT_FILE}: ${bad.join("; ")}`);
  cached = raw;
  return raw;
}

/** Sentences naming what is wrong with a layout (empty when it is usable). */
export function layoutProblems(l: CardLayout): string[] {
  const out: string[] = [];
  for (const p of ["a4", "letter"] as const) {
    const s = l.paper?.[p];
    if (!s || !(s.width > 0) || !(s.height > 0)) out.push(`paper.${p} needs a positive width and height`);
  }
  for (const s of l.sections ?? []) if (!SECTIONS.includes(s)) out.push(`sections: unknown section "${s}" (known: ${SECTIONS.join(", ")})`);
  if (!Array.isArray(l.sections) || l.sections.length === 0) out.push("sections must list at least one section");
  const t = l.tally;
  if (!t || !Array.isArray(t.turns_per_box) || t.turns_per_box.length === 0 || t.turns_per_box.some((n) => !Number.isInteger(n) || n < 1))
    out.push("tally.turns_per_box must list whole numbers from 1");
  else if (t.turns_per_box.some((n, i) => i > 0 && n <= t.turns_per_box[i - 1])) out.push("tally.turns_per_box must increase");
  if (!t || !Number.isInteger(t.max_boxes) || t.max_boxes < 1) out.push("tally.max_boxes must be a whole number from 1");
  if (!t || !Number.isInteger(t.group_size) || t.group_size < 1) out.push("tally.group_size must be a whole number from 1");
  return out;
}

export interface TallyBox {
  /** Turns this box stands for. */
  turns: number;
  /** Running count when this box is ticked. */
  upTo: number;
}

/**
 * Tally boxes for one coil: one box per `step` turns, `step` the smallest of `turns_per_box` that
 * keeps the coil within `max_boxes` boxes (the largest step if none does); the last box takes the
 * remainder. With the shipped layout: 5 turns a box up to 60 turns, 10 turns a box above (one rule for every count).
 */
export function tallyBoxes(turns: number, tally: CardLayout["tally"]): { step: number; boxes: TallyBox[] } {
  const steps = tally.turns_per_box;
  const step = steps.find((s) => Math.ceil(turns / s) <= tally.max_boxes) ?? steps[steps.length - 1];
  const boxes: TallyBox[] = [];
  for (let done = 0; done < turns; ) {
    const n = Math.min(step, turns - done);
    done += n;
    boxes.push({ turns: n, upTo: done });
  }
  return { step, boxes };
}

/** Split the tally boxes into groups of `group_size`. */
export function tallyGroups<T>(boxes: T[], groupSize: number): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < boxes.length; i += groupSize) out.push(boxes.slice(i, i + groupSize));
  return out;
}

/**
 * Where a list of blocks that must each stay whole breaks across pages: the indices of the blocks
 * that start a new page (0: the list starts on a new page). `room` is what the current page has
 * left, `full` what a new page holds below its "continued" heading (pt). Greedy, then widow and
 * orphan control: no page holds fewer than `minRun` of the blocks when moving a break avoids it
 * (a first run too short moves to the next page; a last run too short takes blocks from the page
 * before, as long as they fit and leave that page `minRun`).
 */
export function pageBreaks(heights: readonly number[], room: number, full: number, minRun = 2): number[] {
  const breaks: number[] = [];
  let left = room;
  heights.forEach((h, i) => {
    if (h > left && !(breaks.length && breaks[breaks.length - 1] === i)) {
      breaks.push(i);
      left = full;
    }
    left -= h;
  });
  const n = heights.length;
  // orphan: a first run of fewer than minRun blocks goes to the next page with the rest
  if (breaks.length && breaks[0] > 0 && breaks[0] < Math.min(minRun, n)) {
    return pageBreaks(heights, -1, full, minRun);
  }
  // widow: a last run too short takes blocks from the run before it
  const last = breaks.length ? breaks[breaks.length - 1] : 0;
  const prev = breaks.length > 1 ? breaks[breaks.length - 2] : 0;
  if (breaks.length && last > 0 && n - last < minRun) {
    let b = last;
    const sum = (from: number) => heights.slice(from).reduce((a, x) => a + x, 0);
    while (n - b < minRun && b - 1 - prev >= minRun && sum(b - 1) <= full) b--;
    breaks[breaks.length - 1] = b;
  }
  return breaks;
}
