/**
 * Robustness of the card (src/card/render.ts), property-based (fast-check): jobs made from the demo
 * jobs and templates with valid but unusual values (extreme sizes, few and many turns, free text in
 * any script, long ids, another paper) are planned and drawn. Every job that plans must give a PDF;
 * nothing may throw. A few hundred runs: a card takes a tenth of a second or more.
 */
import { describe, expect, it } from "vitest";
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { parse, stringify } from "yaml";
import { renderCard } from "../src/card/render.js";
import { runJobText } from "./fuzz-support.js";
import { chunks } from "./helpers/chunks.js";
import type { Plan } from "../src/design/types.js";

const ROOT = join(import.meta.dirname, "..");
const SEEDS = [
  ...readdirSync(join(ROOT, "jobs"))
    .filter((f) => f.endsWith(".yaml"))
    .map((f) => join(ROOT, "jobs", f)),
  ...["tooth", "lap", "wave"].map((s) => join(ROOT, "templates", `${s}.yaml`)),
].map((f) => parse(readFileSync(f, "utf8")) as Job);

type Job = Record<string, Record<string, unknown>> & { id: string };

const text = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.string({ unit: "binary", maxLength: 30 }),
  fc.constantFrom(
    "Ω ± ° ² µ",
    "Motor für Rollläden",
    "電動機の巻き直し",
    "محرك كهربائي",
    "🔧⚡🌀",
    "a".repeat(400),
    "line\nbreak",
    "tab\there",
    "\u200b\u202e reversed",
  ),
);
const variant = fc.record({
  seed: fc.nat(SEEDS.length - 1),
  title: text,
  customer: text,
  notes: text,
  id: fc.oneof(fc.constant(undefined), fc.stringMatching(/^[A-Za-z0-9][A-Za-z0-9._-]{0,79}$/)),
  turnsScale: fc.constantFrom(0.02, 0.3, 1, 3, 30),
  stack: fc.constantFrom(undefined, "0.5 mm", "2 mm", "150 mm", "0.9 m"),
  supply: fc.constantFrom(undefined, "1.5 V", "6 V", "48 V", "230 V", "999 V"),
  stock: fc.constantFrom(
    undefined,
    ["0.05 mm grade 1"],
    ["2 mm grade 2"],
    ["40 AWG heavy", "20 AWG heavy"],
    ["36 SWG"],
    [{ bare: "0.3 mm", overall: "0.34 mm" }],
  ),
  inHand: fc.integer({ min: 1, max: 8 }),
  leadThrow: fc.integer({ min: -40, max: 40 }),
  paper: fc.constantFrom("a4" as const, "letter" as const),
});

type Variant = typeof variant extends fc.Arbitrary<infer T> ? T : never;

function build(v: Variant): string {
  const job = structuredClone(SEEDS[v.seed]);
  const free = job as Record<string, unknown>;
  free.title = v.title === "" ? "x" : v.title;
  free.customer = v.customer;
  free.notes = v.notes;
  if (v.id !== undefined) job.id = v.id;
  job.original.turns = Math.max(1, Math.round(Number(job.original.turns) * v.turnsScale));
  if (v.stack) job.armature.stack_length = v.stack;
  if (v.supply) job.target.supply = v.supply;
  if (v.stock) (job as Record<string, unknown>).wire_stock = v.stock;
  (job as Record<string, unknown>).max_in_hand = v.inHand;
  job.winding.lead_throw = v.leadThrow;
  return stringify(job);
}

describe("jobs with unusual values through plan and card", () => {
  // 200 cards in pieces of 20 (test/helpers/chunks.ts), each piece its own seed
  let drawn = 0;
  for (const c of chunks(200, 10)) {
    it(`cards ${c.part}/${c.parts} (${c.runs}): every job that plans is drawn, nothing throws`, async () => {
      await fc.assert(
        fc.asyncProperty(variant, async (v) => {
          const r = runJobText(build(v));
          if (r.kind !== "planned") return;
          const plan: Plan = r.plan;
          const pdf = await renderCard(plan, { paper: v.paper, date: "2026-12-01", version: "test" });
          expect(pdf.subarray(0, 5).toString("latin1")).toBe("%PDF-");
          drawn++;
        }),
        { numRuns: c.runs, seed: c.seed },
      );
    });
  }
  it("of the 200 variants, at least 60 were drawn", () => {
    // about half the variants plan (the others are refused, which the job fuzz covers); at least 60 must be drawn
    expect(drawn).toBeGreaterThanOrEqual(60);
  });
});
