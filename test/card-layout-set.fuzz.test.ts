/**
 * The card's layout over every demo job and a generated set (issue 11): lap, wave and tooth; 1 to
 * 4 coils per slot; 3 to 200 turns; A4 and Letter; a 300-character title and notes. Read back
 * with pdfjs-dist, from the text's positions: no text leaves the printable area, no two texts
 * overlap (a line run into the next row), no coil row is split across pages (each steps page
 * holds as many coil numbers as tally ends), and no page but the last is nearly empty. From the
 * page's drawing operators as well: no text crosses a row rule and no text leaves the box it starts
 * in (framed boxes, header bands; test/helpers/pdf-layout.ts `ruleProblems`).
 * Sized to run well within a third of its timeout on a busy 2-core machine (about 20 cards).
 */
import { describe, expect, it } from "vitest";
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { parse } from "yaml";
import { jobSchema } from "../src/job/schema.js";
import { planJob } from "../src/design/plan.js";
import type { Plan } from "../src/design/types.js";
import { renderCard } from "../src/card/render.js";
import { cardLayout } from "../src/card/layout.js";
import { ROOT } from "./helpers/cli.js";
import { layoutCases } from "./helpers/layout-set.js";
import { overlaps, readBoxes, readRules, ruleProblems, type PageBoxes, type PageRules } from "./helpers/pdf-layout.js";

const L = cardLayout();
/** A page whose text reaches less than this share of the content height is "nearly empty". */
const NEARLY_EMPTY = 0.25;

function problems(pages: PageBoxes[], plan: Plan, drawn: PageRules[]): string[] {
  const out: string[] = [];
  const turns = String(plan.design.turns);
  const coilsSeen: number[] = [];
  pages.forEach((p, i) => {
    const n = `page ${i + 1}`;
    const footerTop = p.height - L.footer.offset - 2;
    for (const t of p.items) {
      const inFooter = t.top >= footerTop && t.bottom <= p.height - 8;
      const inside =
        t.x >= L.margin.left - 0.5 &&
        t.right <= p.width - L.margin.right + 0.5 &&
        t.top >= L.margin.top - 4 &&
        (t.bottom <= p.height - L.margin.bottom + 3 || inFooter);
      if (!inside)
        out.push(`${n}: "${t.str}" leaves the printable area at (${t.x.toFixed(0)}, ${t.top.toFixed(0)})–(${t.right.toFixed(0)}, ${t.bottom.toFixed(0)})`);
    }
    for (const [a, b] of overlaps(p.items)) out.push(`${n}: "${a.str}" overlaps "${b.str}"`);
    out.push(...ruleProblems(p.items, drawn[i], n));
    const body = p.items.filter((t) => t.top < footerTop);
    const used = (Math.max(L.margin.top, ...body.map((t) => t.bottom)) - L.margin.top) / (p.height - L.margin.top - L.margin.bottom);
    if (i < pages.length - 1 && used < NEARLY_EMPTY) out.push(`${n}: nearly empty (${(used * 100).toFixed(0)} % of the page)`);
    // coil rows: the coil number (step size + 2, in the coil column) and the tally's last count come in pairs on a page
    if (body.some((t) => /^COIL BY COIL/.test(t.str))) {
      const coilX = L.margin.left + L.steps.columns.tick;
      const tallyX = coilX + L.steps.columns.coil + L.steps.columns.start + L.steps.columns.slots + L.steps.columns.finish;
      const numbers = body.filter((t) => Math.abs(t.x - coilX) < 1 && Math.abs(t.size - (L.type.step + 2)) < 0.1 && /^\d+$/.test(t.str));
      const ends = body.filter((t) => t.x >= tallyX - 1 && t.str === turns && Math.abs(t.size - L.tally.label_size) < 0.1);
      if (numbers.length !== ends.length) out.push(`${n}: ${numbers.length} coil numbers but ${ends.length} tally ends (a coil row split across pages)`);
      coilsSeen.push(...numbers.map((t) => Number(t.str)));
    }
  });
  const want = plan.coils.map((c) => c.index);
  if (JSON.stringify(coilsSeen) !== JSON.stringify(want)) out.push(`coil rows ${coilsSeen.join(",")} instead of ${want.join(",")}`);
  return out;
}

const demos = readdirSync(join(ROOT, "jobs"))
  .filter((f) => f.endsWith(".yaml"))
  .sort()
  .map((f, i) => ({ name: `demo ${f}`, paper: (i % 2 ? "letter" : "a4") as "a4" | "letter", raw: parse(readFileSync(join(ROOT, "jobs", f), "utf8")) }));

describe("the card's layout does not break", () => {
  for (const c of [...demos, ...layoutCases()]) {
    it(`${c.name} on ${c.paper}`, async () => {
      const plan = planJob(jobSchema.parse(c.raw));
      const pdf = await renderCard(plan, { paper: c.paper, date: "2026-12-01", version: "test" });
      const pages = await readBoxes(pdf);
      expect(problems(pages, plan, await readRules(pdf))).toEqual([]);
    });
  }
});
