/**
 * `armwind history`: the table, CSV (RFC 4180), JSON with damaged records as warnings, the family
 * filter, and the predicted-against-measured plot as SVG and PDF.
 */
import { copyFileSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../src/cli/main.js";
import type { Io } from "../src/cli/io.js";
import { historyCsv, historyRows } from "../src/logbook/history.js";
import { niceTicks as ticks } from "../src/plot/ticks.js";
const niceTicks = (lo: number, hi: number) => ticks(lo, hi, 5, [1, 2, 5, 10]);
import { readLogbook, parseRecordText } from "../src/logbook/store.js";
import { parse, stringify } from "yaml";
import { ROOT } from "./helpers/cli.js";

const BOOK = join(ROOT, "jobs/logbook");

function fakeIo(): Io & { stdout: string[]; stderr: string[] } {
  const stdout: string[] = [];
  const stderr: string[] = [];
  // the family index and the history summary go to the tests' cache folder (test/helpers/setup.ts), never the user's
  const env = { ARMWIND_CACHE_DIR: process.env.ARMWIND_CACHE_DIR };
  return { out: (s) => stdout.push(s), err: (s) => stderr.push(s), stdin: () => "", env, cwd: ROOT, stdout, stderr };
}

function bookWithDamage(): string {
  const dir = mkdtempSync(join(tmpdir(), "armwind-history-"));
  for (const f of readdirSync(BOOK)) copyFileSync(join(BOOK, f), join(dir, f));
  writeFileSync(join(dir, "broken-2026-12-01-1.yaml"), "{ this is not: [ a record");
  return dir;
}

describe("armwind history", () => {
  it("JSON: every record, predicted against measured, and the damaged one as a warning by name", async () => {
    const dir = bookWithDamage();
    const io = fakeIo();
    expect(await main(["history", "--logbook", dir, "--json"], io)).toBe(0);
    const out = JSON.parse(io.stdout.join(""));
    expect(out.ok).toBe(true);
    expect(out.records).toHaveLength(readdirSync(BOOK).length);
    expect(out.warnings).toHaveLength(1);
    expect(out.warnings[0]).toMatchObject({ code: "record_damaged", file: "broken-2026-12-01-1.yaml" });
    expect(io.stderr.join("\n")).toMatch(/broken-2026-12-01-1\.yaml: damaged record/);
    const blind = out.records.find((r: { job_id: string }) => r.job_id === "blind-motor-0031");
    expect(blind).toMatchObject({ family: "blind-5slot", style: "tooth", slots: 5, bars: 5, turns_per_coil: 65, wire: "32 AWG heavy", strands_in_hand: 1 });
    // measured terminal 2.05 Ω at 21 °C is 2.05/1.00393 at 20 °C (IEC 60028)
    expect(blind.terminal_measured_ohm).toBeCloseTo(2.05 / 1.00393, 9);
    expect(blind.no_load_speed_measured_rpm).toBeCloseTo(8940, 6);
    // sorted by date
    const dates = out.records.map((r: { date: string }) => r.date);
    expect(dates).toEqual([...dates].sort());
  });

  it("--family keeps one family", async () => {
    const io = fakeIo();
    expect(await main(["history", "--logbook", BOOK, "--json", "--family", "chair-21s"], io)).toBe(0);
    const out = JSON.parse(io.stdout.join(""));
    expect(out.records.map((r: { job_id: string }) => r.job_id)).toEqual(["chair-wave-0045"]);
  });

  it("the table names job, date, armature, winding and the three figures", async () => {
    const io = fakeIo();
    expect(await main(["history", "--logbook", BOOK], io)).toBe(0);
    const text = io.stdout.join("\n");
    expect(text).toMatch(/blind-motor-0031\s+2026-12-01\s+blind-5slot, tooth 5\/5\s+65 × 32 AWG heavy\s+1\.963 \/ 2\.042/);
    expect(text).toMatch(/drill-lap-0112 .*7\.445 \/ 7\.472\s+—\s+—\s+ok/);
  });

  it("CSV (RFC 4180): a header, one line per record, fields with commas or quotes quoted", () => {
    const rows = historyRows(readLogbook(BOOK).records);
    rows[0] = { ...rows[0], wire: 'odd, "quoted" wire' };
    const csv = historyCsv(rows);
    const lines = csv.split("\r\n");
    expect(lines[0].split(",")).toContain("terminal_measured_ohm");
    expect(lines).toHaveLength(rows.length + 2);
    expect(lines[1]).toContain('"odd, ""quoted"" wire"');
    expect(csv.endsWith("\r\n")).toBe(true);
  });

  it("--plot FILE.svg: one panel per figure, a point per record with the figure, the y = x line", async () => {
    const dir = mkdtempSync(join(tmpdir(), "armwind-plot-"));
    const f = join(dir, "h.svg");
    expect(await main(["history", "--logbook", BOOK, "--plot", f], fakeIo())).toBe(0);
    const svg = readFileSync(f, "utf8");
    expect(svg).toMatch(/^<\?xml/);
    expect(svg).toContain("Terminal resistance at 20 °C (Ω)");
    expect(svg).toContain("No-load current (A)");
    expect(svg).toContain("No-load speed (rpm)");
    const rows = historyRows(readLogbook(BOOK).records);
    const expected =
      rows.filter((r) => r.terminal_measured_ohm !== null).length +
      rows.filter((r) => r.no_load_current_measured_a !== null && r.no_load_current_predicted_a !== null).length +
      rows.filter((r) => r.no_load_speed_measured_rpm !== null && r.no_load_speed_predicted_rpm !== null).length;
    expect((svg.match(/class="point"/g) ?? []).length).toBe(expected);
    // well-formed enough for an XML reader: every element closed
    expect((svg.match(/<svg/g) ?? []).length).toBe(1);
    expect(svg.trim().endsWith("</svg>")).toBe(true);
  });

  it("--plot FILE.pdf: a one-page PDF whose text carries the panel titles with Ω", async () => {
    const dir = mkdtempSync(join(tmpdir(), "armwind-plot-"));
    const f = join(dir, "h.pdf");
    expect(await main(["history", "--logbook", BOOK, "--plot", f], fakeIo())).toBe(0);
    const data = new Uint8Array(readFileSync(f));
    expect(Buffer.from(data.slice(0, 5)).toString()).toBe("%PDF-");
    const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
    const doc = await pdfjs.getDocument({ data, useSystemFonts: false }).promise;
    expect(doc.numPages).toBe(1);
    const page = await doc.getPage(1);
    const text = (await page.getTextContent()).items.map((i) => ("str" in i ? i.str : "")).join(" ");
    expect(text).toContain("Terminal resistance at 20 °C (Ω)");
    expect(text).toContain("No-load speed (rpm)");
  });

  it("a plot file that is neither .svg nor .pdf is refused", async () => {
    const io = fakeIo();
    expect(await main(["history", "--logbook", BOOK, "--plot", "h.png"], io)).toBe(1);
    expect(io.stderr.join("\n")).toMatch(/\[bad_plot_file\]/);
  });

  it("no logbook yet is not an error", async () => {
    const io = fakeIo();
    expect(await main(["history", "--logbook", join(tmpdir(), "armwind-none-" + process.pid)], io)).toBe(0);
    expect(io.stdout.join("")).toMatch(/No logbook at/);
  });
});

describe("record text", () => {
  it("records are YAML: the YAML parser and the fast JSON path read the same thing", () => {
    for (const f of readdirSync(BOOK)) {
      const text = readFileSync(join(BOOK, f), "utf8");
      expect(parseRecordText(text)).toEqual(parse(text));
    }
  });

  it("a record saved as block YAML still reads", () => {
    const text = readFileSync(join(BOOK, readdirSync(BOOK)[0]), "utf8");
    const obj = parse(text) as Record<string, unknown>;
    const block = stringify(obj);
    expect(block.trimStart().startsWith("{")).toBe(false);
    expect(parseRecordText(block)).toEqual(obj);
  });

  it("nice ticks step by 1, 2 or 5 × 10^k", () => {
    expect(niceTicks(0, 10)).toEqual([0, 2, 4, 6, 8, 10]);
    expect(niceTicks(1.8, 2.2)).toEqual([1.8, 1.9, 2, 2.1, 2.2]);
  });
});
