/**
 * What a logbook folder may hold that is not to be trusted, and the pieces of issue 14 that need
 * no process: record names of another job, impossible dates, numbers out of their physical range,
 * file systems that refuse hard links, other benches' temporary files, and the card's wrapping of
 * long unbroken words (its cost counted in characters measured, not in seconds).
 */
import { describe, expect, it, vi } from "vitest";
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import PDFDocument from "pdfkit";
import { ROOT, loadJobFile, loadJobText } from "./helpers/cli.js";
import { readLogbook, writeRecordFile } from "../src/logbook/store.js";
import { readUserFile, tempHost, TEXT_FILE_LIMIT } from "../src/files.js";
import { ArmwindError } from "../src/errors.js";
import { breakLongWords } from "../src/card/wrap.js";
import { planJob } from "../src/design/plan.js";
import { renderCard } from "../src/card/render.js";

const LOGBOOK = join(ROOT, "jobs", "logbook");
const BLIND_RECORD = readFileSync(join(LOGBOOK, "blind-motor-0031-2026-12-01-1.yaml"), "utf8");
const record = () => JSON.parse(BLIND_RECORD.slice(BLIND_RECORD.indexOf("{")));
const tmp = () => mkdtempSync(join(tmpdir(), "armwind-hostile-"));

function bookWith(files: Record<string, string>) {
  const dir = tmp();
  for (const [name, text] of Object.entries(files)) writeFileSync(join(dir, name), text);
  return readLogbook(dir);
}

describe("records that are not what they say", () => {
  it("a record whose name belongs to another job is a record_mismatch warning and is left out", () => {
    const book = bookWith({ "robot-3slot-0007-2026-12-01-1.yaml": BLIND_RECORD });
    expect(book.records).toEqual([]);
    expect(book.warnings).toEqual([
      expect.objectContaining({
        code: "record_mismatch",
        file: "robot-3slot-0007-2026-12-01-1.yaml",
        message: expect.stringMatching(/of job "blind-motor-0031" of 2026-12-01, not what its name says/),
      }),
    ]);
  });

  it("an impossible date (2026-13-45) is a damaged record", () => {
    const r = record();
    r.date = "2026-13-45";
    const book = bookWith({ "blind-motor-0031-2026-13-45-1.yaml": JSON.stringify(r) });
    expect(book.records).toEqual([]);
    expect(book.warnings[0]).toMatchObject({ code: "record_damaged", message: expect.stringMatching(/date: must be a date YYYY-MM-DD/) });
  });

  it.each([
    ["derived.mean_turn_length_mm", (r: ReturnType<typeof record>) => (r.derived.mean_turn_length_mm = 1e300)],
    ["winding.turns", (r: ReturnType<typeof record>) => (r.winding.turns = 1e9)],
    ["measured.temperature_c", (r: ReturnType<typeof record>) => (r.measured.temperature_c = 1e308)],
    ["measured.bar_to_bar_ohm[2]", (r: ReturnType<typeof record>) => (r.measured.bar_to_bar_ohm[2] = -1)],
    ["derived.ke_v_s_per_rad", (r: ReturnType<typeof record>) => (r.derived.ke_v_s_per_rad = 5e3)],
    ["job.id", (r: ReturnType<typeof record>) => (r.job.id = "CON")],
  ])("%s outside its physical range: record_damaged, not learned from", (path, edit) => {
    const r = record();
    edit(r);
    const book = bookWith({ [`${r.job.id}-2026-12-01-1.yaml`]: JSON.stringify(r) });
    expect(book.records).toEqual([]);
    expect(book.warnings).toHaveLength(1);
    expect(book.warnings[0].code).toBe("record_damaged");
    expect(book.warnings[0].message).toContain(path);
  });

  it("the demo records are all within range", () => {
    const book = readLogbook(LOGBOOK);
    expect(book.warnings).toEqual([]);
    expect(book.records.length).toBe(readdirSync(LOGBOOK).length);
  });
});

describe("the store's writing", () => {
  it("where hard links are refused, the record is created exclusively and reads back; no temporary file is left", () => {
    const dir = tmp();
    const a = writeRecordFile(dir, "blind-motor-0031", "2026-12-01", "b1", BLIND_RECORD, { noLink: true });
    const b = writeRecordFile(dir, "blind-motor-0031", "2026-12-01", "b1", BLIND_RECORD, { noLink: true });
    expect([a, b].map((f) => f.slice(dir.length + 1))).toEqual(["blind-motor-0031-2026-12-01-b1-1.yaml", "blind-motor-0031-2026-12-01-b1-2.yaml"]);
    expect(readdirSync(dir).sort()).toEqual(["blind-motor-0031-2026-12-01-b1-1.yaml", "blind-motor-0031-2026-12-01-b1-2.yaml"]);
    expect(readLogbook(dir).records).toHaveLength(2);
  });

  it("temporary files of other hosts and of live processes are kept; this host's dead ones go", () => {
    const dir = tmp();
    const names = {
      other: `.blind-motor-0031-2026-12-01.other-bench.1.0123456789ab.tmp`,
      live: `.blind-motor-0031-2026-12-01.${tempHost()}.${process.pid}.0123456789ab.tmp`,
      dead: `.blind-motor-0031-2026-12-01.${tempHost()}.99999999.0123456789ab.tmp`,
    };
    for (const n of Object.values(names)) writeFileSync(join(dir, n), "{ half");
    writeRecordFile(dir, "blind-motor-0031", "2026-12-01", "b1", BLIND_RECORD);
    expect(readdirSync(dir).sort()).toEqual([names.other, names.live, "blind-motor-0031-2026-12-01-b1-1.yaml"].sort());
    // readers never take a temporary file for a record
    expect(readLogbook(dir)).toMatchObject({ records: [expect.anything()], warnings: [] });
  });

  it("a folder that cannot be written names the folder, never the hidden temporary file", () => {
    let e: unknown;
    try {
      writeRecordFile("/proc/armwind-no-such", "blind-motor-0031", "2026-12-01", "b1", BLIND_RECORD);
    } catch (x) {
      e = x;
    }
    expect(e).toBeInstanceOf(ArmwindError);
    const p = (e as ArmwindError).problems[0];
    expect(p.code).toBe("write_failed");
    expect(p.file).not.toMatch(/\.tmp$/);
    expect(p.message).not.toMatch(/\.tmp/);
  });
});

describe("readUserFile", () => {
  it("reads a regular file, refuses one over its limit by its size, before reading it", () => {
    const f = join(tmp(), "x.yaml");
    writeFileSync(f, "version: 1\n");
    expect(readUserFile(f)).toBe("version: 1\n");
    writeFileSync(f, Buffer.alloc(TEXT_FILE_LIMIT + 1, 0x20));
    expect(() => readUserFile(f)).toThrow(/larger than 1 MiB/);
    expect(() => readUserFile(join(tmp(), "none.yaml"))).toThrow(/no such file/);
  });
});

describe("Windows device names as job ids", () => {
  const blind = readFileSync(join(ROOT, "jobs", "blind-motor-0031.yaml"), "utf8");
  it.each(["CON", "nul", "Aux", "com1", "LPT9", "prn.job"])("%s is refused (bad_id)", (id) => {
    expect(() => loadJobText(blind.replace(/^id: .*/m, `id: ${id}`))).toThrow(/device name on Windows/);
  });
  it.each(["console", "null-motor", "com10", "con-0031"])("%s is fine", (id) => {
    expect(loadJobText(blind.replace(/^id: .*/m, `id: ${id}`)).id).toBe(id);
  });
});

describe("the card's wrapping of long unbroken words: linear in the text", () => {
  const mono = (s: string) => s.length * 5;
  it("cuts a long word into pieces that fit, keeping every character in order", () => {
    const word = "W".repeat(1000);
    const out = breakLongWords(`Customer: ${word} and more`, 100, mono);
    const pieces = out.split(/\s+/);
    expect(pieces.every((p) => mono(p) <= 100)).toBe(true);
    expect(out.replace(/\n/g, "")).toBe(`Customer: ${word} and more`);
    expect(breakLongWords("short words only, nothing to cut", 100, mono)).toBe("short words only, nothing to cut");
  });

  it("measures each distinct character once however long the word", () => {
    const calls: string[] = [];
    breakLongWords("ab".repeat(50_000), 100, (s) => (calls.push(s), s.length * 5));
    expect(calls.sort()).toEqual(["a", "b"]);
  });

  it("a card with a 20 000-character customer name measures a few times its text, not its square", async () => {
    const job = loadJobFile(join(ROOT, "jobs", "blind-motor-0031.yaml"));
    const measured = async (customer: string | undefined) => {
      let chars = 0;
      const spy = vi.spyOn(PDFDocument.prototype, "widthOfString").mockImplementation(function (
        this: PDFDocument,
        ...args: Parameters<PDFDocument["widthOfString"]>
      ) {
        chars += args[0].length;
        return spy.getMockImplementation() ? original.apply(this, args) : 0;
      });
      await renderCard(planJob({ ...job, customer }), { paper: "a4", date: "2026-12-02", version: "test" });
      spy.mockRestore();
      return chars;
    };
    const original = PDFDocument.prototype.widthOfString;
    const base = await measured(undefined);
    const long = await measured("W".repeat(20_000));
    // pdfkit alone measured the rest of the word again on every line: about 250 lines × 10 000 characters
    expect(long - base).toBeLessThan(40 * 20_000);
  });
});
