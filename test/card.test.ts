/**
 * The PDF job card: every demo job in jobs/ (and a few variants made from them) is rendered and
 * read back with pdfjs-dist; what the winder needs must be on the card as printed.
 */
import { spreadRuleText } from "../src/bench/rules.js";
import { describe, expect, it } from "vitest";
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";
import { stringify } from "yaml";
import { loadYaml } from "../src/job/load.js";
import { jobSchema } from "../src/job/schema.js";
import { planJob } from "../src/design/plan.js";
import type { Plan } from "../src/design/types.js";
import { renderCard } from "../src/card/render.js";
import { ohm, sig } from "../src/cli/format.js";
import { cardLayout } from "../src/card/layout.js";
import { spoolMassNeeded } from "../src/shop/merge.js";

const JOBS = join(import.meta.dirname, "..", "jobs");
const demoFiles = readdirSync(JOBS)
  .filter((f) => f.endsWith(".yaml"))
  .sort();

function planOf(text: string, file: string): Plan {
  return planJob(loadYaml(text, file, jobSchema).value);
}

interface Read {
  pages: { width: number; height: number; text: string }[];
  all: string;
}

async function readPdf(buf: Buffer): Promise<Read> {
  const pdf = await getDocument({ data: new Uint8Array(buf), useSystemFonts: false, isEvalSupported: false }).promise;
  const pages: Read["pages"] = [];
  for (let i = 1; i <= pdf.numPages; i++) {
    const page = await pdf.getPage(i);
    const [x0, y0, x1, y1] = page.view;
    const tc = await page.getTextContent();
    const text = tc.items
      .map((it) => ("str" in it ? it.str + (it.hasEOL ? "\n" : "") : ""))
      .join(" ")
      .replace(/[ \t]+/g, " ");
    pages.push({ width: x1 - x0, height: y1 - y0, text });
  }
  await pdf.destroy();
  return { pages, all: pages.map((p) => p.text).join("\n") };
}

const OPTS = { date: "2026-12-01", version: "9.9.9-test" };

/** Variants of the first demo job, invented for these tests: a lap winding of 36 slots / 72 bars on a series field at mains voltage, and a wave winding with a dead coil and two strands in hand that cannot meet its goal. */
function variants(): { name: string; text: string }[] {
  const base = loadYaml(readFileSync(join(JOBS, demoFiles[0]), "utf8"), demoFiles[0], jobSchema).raw as Record<string, any>;
  const clone = () => JSON.parse(JSON.stringify(base)) as Record<string, any>;
  const lap = clone();
  lap.id = "test-lap-36";
  lap.armature = {
    ...lap.armature,
    slots: 36,
    bars: 72,
    field: "series",
    stack_length: "40 mm",
    rotor_diameter: "60 mm",
    slot: { area: "40 mm2", opening: "2 mm", liner: "0.2 mm" },
  };
  delete lap.armature.tooth_width;
  delete lap.armature.family;
  lap.winding = { style: "lap", span: 16, coils_per_slot: 2, lead_throw: 3, brushes: { count: 2, width_bars: 2, material: "carbon" } };
  lap.original = { turns: 12, wire: "0.4 mm", nameplate: { supply: "230 V", current: "4 A", speed: "10000 rpm" } };
  lap.target = { supply: { value: "230 V", kind: "ac", frequency: "50 Hz" }, goal: "restore" };
  lap.wire_stock = ["0.40 mm grade 2", "0.45 mm grade 2"];
  const wave = clone();
  wave.id = "test-wave-dead";
  wave.armature = {
    ...wave.armature,
    slots: 22,
    bars: 21,
    field_poles: 4,
    stack_length: "50 mm",
    rotor_diameter: "70 mm",
    slot: { area: "60 mm2", opening: "2.5 mm", liner: "0.2 mm" },
    magnet: { flux_per_pole: "2 mWb" },
  };
  delete wave.armature.tooth_width;
  delete wave.armature.family;
  wave.winding = { style: "wave", span: 5, dead_coil: true, lead_throw: -2, brushes: { count: 2, width_bars: 1, material: "carbon" } };
  wave.original = { turns: 4, wire: "1.0 mm", strands: 2, tests: [{ supply: "24 V", no_load_current: "2 A", no_load_speed: "3000 rpm" }] };
  wave.target = { supply: "24 V", goal: "duty", duty: { torque: "1 N m", speed: "2500 rpm" }, rated_current: "15 A" };
  wave.wire_stock = ["1.0 mm grade 2", "0.9 mm grade 2", "1.12 mm grade 2"];
  wave.max_in_hand = 3;
  return [
    { name: "variant lap 36/72 series mains", text: stringify(lap) },
    { name: "variant wave dead coil", text: stringify(wave) },
  ];
}

const cases = [...demoFiles.map((f) => ({ name: f, text: readFileSync(join(JOBS, f), "utf8") })), ...variants()];

describe("renderCard on every demo job and the variants", () => {
  it("finds at least one demo job", () => {
    expect(demoFiles.length).toBeGreaterThan(0);
  });

  for (const c of cases) {
    it(`${c.name}: the winding, the cut, the bar-to-bar readings, Ω and a footer on every page`, async () => {
      const plan = planOf(c.text, c.name);
      const buf = await renderCard(plan, { paper: "a4", ...OPTS });
      expect(buf.subarray(0, 5).toString("latin1")).toBe("%PDF-");
      const pdf = await readPdf(buf);
      const first = pdf.pages[0].text;
      // THE WINDING, large, on page 1
      expect(first).toContain(`${plan.design.turns} turns`);
      expect(first).toContain(plan.design.wire.label);
      // the cut as printed: 3 significant figures
      expect(first).toContain(`${sig(plan.wire.cut)} m`);
      // every expected bar-to-bar reading (4 significant figures) is on the bench sheet
      for (const r of new Set(plan.resistance.bar_to_bar.map(ohm))) expect(pdf.all).toContain(r);
      expect(pdf.all).toContain(`r${plan.layout.bars}`);
      // the bench sheet prints the rule `log` and `diagnose` apply, in the same words (src/bench/rules.ts)
      const flat = pdf.all.replace(/\s+/g, " ");
      expect(flat).toContain(spreadRuleText().slice(0, 60));
      expect(flat).toContain("Null the test leads first");
      // the glyphs themselves (DejaVu embedded): Ω, °C, ±, mm²
      expect(pdf.all).toContain("Ω");
      expect(pdf.all).toContain("°C");
      expect(pdf.all).toContain("±");
      expect(pdf.all).toContain("mm²");
      // every coil has its step, in winding order
      const steps = pdf.pages
        .filter((p) => /COIL BY COIL/.test(p.text))
        .map((p) => p.text)
        .join("\n")
        .replace(/\s+/g, " ");
      expect(steps).not.toBe("");
      if (plan.coils.some((k) => k.dead)) expect(steps).toContain("dead coil: wind, cut and insulate both ends, hook to nothing");
      // footer on every page
      const n = pdf.pages.length;
      pdf.pages.forEach((p, i) => {
        expect(p.text).toContain(`page ${i + 1} of ${n}`);
        expect(p.text).toContain(plan.job.id);
        expect(p.text).toContain(OPTS.date);
        expect(p.text).toContain(`armwind ${OPTS.version}`);
      });
      // feasibility stated prominently when the goal is not met
      expect(first.includes("CLOSEST WINDING — DOES NOT MEET THE GOAL")).toBe(!plan.feasible);
      // every warning travels onto the card
      for (const w of plan.warnings) expect(pdf.all.replace(/\s+/g, "")).toContain(`[${w.code}]`);
      // the cautions that apply, and only those
      expect(pdf.all.includes("never run it unloaded")).toBe(plan.job.armature.field === "series");
      expect(pdf.all.includes("IEC 60449 band I")).toBe(plan.mains);
      expect(pdf.all).toContain("IEC 60034-1");
    });
  }

  it("A4 and Letter give their page sizes on every page (ISO 216: 595.28 × 841.89 pt; ANSI Letter: 612 × 792 pt)", async () => {
    const plan = planOf(cases[0].text, cases[0].name);
    for (const [paper, w, h] of [
      ["a4", 595.28, 841.89],
      ["letter", 612, 792],
    ] as const) {
      const pdf = await readPdf(await renderCard(plan, { paper, ...OPTS }));
      for (const p of pdf.pages) {
        expect(p.width).toBeCloseTo(w, 2);
        expect(p.height).toBeCloseTo(h, 2);
      }
    }
  });

  it("the same plan and date give the same bytes", async () => {
    const plan = planOf(cases[0].text, cases[0].name);
    const a = await renderCard(plan, { paper: "a4", ...OPTS });
    const b = await renderCard(plan, { paper: "a4", ...OPTS });
    expect(a.equals(b)).toBe(true);
  });

  it("the drill demo (universal motor) has its curves, rated-load figures and a reduced-voltage locked-rotor check, no mains stall current", async () => {
    const file = join(JOBS, "drill-lap-0112.yaml");
    const plan = planOf(readFileSync(file, "utf8"), file);
    const sp = plan.series!;
    const pdf = await readPdf(await renderCard(plan, { paper: "a4", ...OPTS }));
    const curves = pdf.pages.find((p) => /CURVES/.test(p.text))!;
    expect(curves.text).toContain("light load");
    expect(curves.text).toContain("torque, mN·m");
    // rated-load figures in the motor table and the load run
    expect(pdf.all).toContain(`at rated load ${sig(sp.ratedTorque! * 1e3)} mN·m`);
    expect(pdf.all).toContain(`expected ${sig(sp.rewound.rated!.current)} A`);
    // the locked-rotor check at its reduced voltage, with the expected current
    const lr = sp.lockedRotor!;
    expect(lr.supply.volts).toBeLessThanOrEqual(50);
    expect(pdf.all).toContain(`Locked-rotor check at ${lr.supply.volts} V 50 Hz AC (not at mains)`);
    expect(pdf.all).toContain(`expected ${sig(sp.rewound.lockedRotorCurrent)} A`);
    // no stall figure at the mains supply, and the mains cautions stay
    expect(pdf.all).not.toMatch(/stall current (hot|cold)/);
    expect(pdf.all).not.toContain("Brief stall current");
    expect(pdf.all).toContain("Mains voltage: 230 V AC");
  });

  it("a series motor gets no curves but the reason", async () => {
    const lap = cases.find((c) => c.name.startsWith("variant lap"))!;
    const pdf = await readPdf(await renderCard(planOf(lap.text, lap.name), { paper: "a4", ...OPTS }));
    const curves = pdf.pages.find((p) => /CURVES/.test(p.text))!;
    expect(curves.text).toContain("No curves for a series (universal) motor");
    expect(curves.text).not.toContain("torque, ");
  });

  it("follows the section order of the layout file", async () => {
    const plan = planOf(cases[0].text, cases[0].name);
    const pdf = await readPdf(await renderCard(plan, { paper: "a4", ...OPTS }));
    const titles: Record<string, RegExp> = {
      job: /ARMATURE REWIND — JOB CARD/,
      order: /ORDER OF WORK/,
      steps: /COIL BY COIL/,
      diagram: /WINDING DIAGRAM/,
      bench: /BENCH CHECKS/,
      curves: /CURVES/,
      candidates: /CANDIDATES/,
      cautions: /CAUTIONS/,
    };
    const firstPage = (re: RegExp) => pdf.pages.findIndex((p) => re.test(p.text));
    const order = cardLayout().sections.map((s) => firstPage(titles[s]));
    expect(order.every((i) => i >= 0)).toBe(true);
    expect([...order].sort((a, b) => a - b)).toEqual(order);
  });

  it("sets out the order of work in its real sequence, with the spool mass; a continuous winding is wound off the spool", async () => {
    const plan = planOf(cases[0].text, cases[0].name);
    const all = (await readPdf(await renderCard(plan, { paper: "a4", ...OPTS }))).all.replace(/\s+/g, " ");
    const seq = [
      "1. Wire",
      "2. Wind",
      "3. Bench checks before varnish",
      "4. Varnish and cure",
      "5. Skim and undercut, then bar to bar again",
      "6. Balance",
      "7. The run",
    ];
    const at = seq.map((t) => all.indexOf(t));
    expect(
      at.every((i) => i >= 0),
      JSON.stringify(at),
    ).toBe(true);
    expect([...at].sort((a, b) => a - b)).toEqual(at);
    expect(all).toMatch(/Have at least [\d.]+ g of .* on the spool \(copper [\d.]+ g and its enamel\)/);
    expect(all).not.toMatch(/Wind off the spool: one wire/);
    const cont = { ...plan, job: { ...plan.job, winding: { ...plan.job.winding, continuous: true } } } as Plan;
    const read2 = await readPdf(await renderCard(cont, { paper: "a4", ...OPTS }));
    const all2 = read2.all.replace(/\s+/g, " ");
    expect(all2).toMatch(/Wind off the spool: one wire through all the coils, no cut per coil/);
    // every page that lists the wire gives the spool length and mass, never a cut per coil (issue 11)
    const page1 = read2.pages[0].text.replace(/\s+/g, " ");
    const grams = sig(spoolMassNeeded(plan) * 1e3);
    expect(page1).toContain("WIND OFF THE SPOOL");
    expect(page1).toContain(`${sig(plan.wire.cut)} m`);
    expect(page1).toContain(`have ${grams} g on the spool (copper and enamel)`);
    expect(page1).not.toMatch(/\bCUT\b|Cut list|one coil/);
    expect(all2).toContain("do not cut at a finish bar");
    expect(all2).toContain(`Have at least ${grams} g of`);
    const page1cut = (await readPdf(await renderCard(plan, { paper: "a4", ...OPTS }))).pages[0].text;
    expect(page1cut).toMatch(/Cut list[\s\S]*\bCUT\b/);
    expect(page1cut).not.toContain("WIND OFF THE SPOOL");
    // the no-load run comes after varnish, not among the checks before it
    expect(all.lastIndexOf("No-load current and speed")).toBeGreaterThan(all.indexOf("3. After varnish"));
    expect(all.indexOf("3. After varnish")).toBeGreaterThan(all.indexOf("2. Before varnish"));
  });
});
