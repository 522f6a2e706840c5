/**
 * The shop profile (DESIGN.md "The shop profile", version 1): the pure merge of a profile into a
 * job, and the shell that finds it (--shop, $ARMWIND_SHOP, armwind.yaml here or in a parent) and
 * takes each setting in DESIGN.md's order: option, environment, job, profile, default.
 */
import { describe, expect, it } from "vitest";
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync, existsSync, readdirSync } from "node:fs";
import { tmpdir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { parse } from "yaml";
import { main } from "../src/cli/main.js";
import { fakeIo } from "./helpers/io.js";
import { mergeShopIntoJob, firstSet } from "../src/shop/merge.js";
import { shopSchema } from "../src/shop/schema.js";
import { cardPaper } from "../src/cli/card.js";
import { shopJsonSchemaText, measuredJsonSchemaText } from "../src/shop/json-schemas.js";
import { ROOT } from "./helpers/cli.js";

const BLIND = join(ROOT, "jobs/blind-motor-0031.yaml");

const tmp = () => mkdtempSync(join(tmpdir(), "armwind-shop-"));

describe("mergeShopIntoJob (pure)", () => {
  const shop = {
    version: 1 as const,
    wire_shelf: [{ wire: "32 AWG heavy", spool_mass: "120 g" }],
    defaults: { limits: { copper_fill: 0.42, space_fill: 0.6 }, hot_temperature: "90 C" },
  };
  it("fills the shelf, the limits key by key and the hot temperature where the job is silent", () => {
    const job = { id: "x", target: { supply: "12 V", limits: { space_fill: 0.65 } } };
    const out = mergeShopIntoJob(job, shop) as any;
    expect(out.wire_stock).toEqual(["32 AWG heavy"]);
    expect(out.target.limits).toEqual({ copper_fill: 0.42, space_fill: 0.65 });
    expect(out.target.hot_temperature).toBe("90 C");
    expect(job.target.limits).toEqual({ space_fill: 0.65 }); // the input is not changed
  });
  it("the job's own values win, and its wire_stock replaces the shelf", () => {
    const job = { id: "x", wire_stock: ["0.2 mm"], target: { hot_temperature: "70 C" } };
    const out = mergeShopIntoJob(job, shop) as any;
    expect(out.wire_stock).toEqual(["0.2 mm"]);
    expect(out.target.hot_temperature).toBe("70 C");
  });
  it("option > environment > job > profile > default", () => {
    expect(firstSet("a", "b", "c")).toBe("a");
    expect(firstSet(undefined, "", "c", "d")).toBe("c");
    expect(cardPaper(undefined, undefined, "letter")).toBe("letter");
    expect(cardPaper(undefined, "a4", "letter")).toBe("a4");
    expect(cardPaper("letter", "a4", undefined)).toBe("letter");
    expect(cardPaper(undefined, undefined, undefined)).toBe("a4");
  });
});

describe("the shop profile's files", () => {
  it("the template validates, and the committed JSON Schemas are the generated ones", () => {
    const t = parse(readFileSync(join(ROOT, "templates/shop.yaml"), "utf8"));
    expect(shopSchema.safeParse(t).success).toBe(true);
    expect(readFileSync(join(ROOT, "templates/shop.schema.json"), "utf8")).toBe(shopJsonSchemaText());
    expect(readFileSync(join(ROOT, "templates/measured.schema.json"), "utf8")).toBe(measuredJsonSchemaText());
  });
});

function shopIn(dir: string, text: string): string {
  const f = join(dir, "armwind.yaml");
  writeFileSync(f, text);
  return f;
}

describe("the shell finds the profile and uses it", () => {
  it("armwind.yaml in a parent folder sets the shelf, the limits and the logbook; a job's own stock wins", async () => {
    const dir = tmp();
    shopIn(
      dir,
      "version: 1\nshop: Test Rewinds (invented)\nbench: b-7\nlogbook: book\nwire_shelf:\n  - { wire: 0.25 mm grade 2, spool_mass: 1 g }\ndefaults: { limits: { copper_fill: 0.45 } }\n",
    );
    const sub = join(dir, "a", "b");
    mkdirSync(sub, { recursive: true });
    const job = readFileSync(BLIND, "utf8").replace(/^wire_stock:[\s\S]*?(?=^\S)/m, "");
    writeFileSync(join(sub, "job.yaml"), job);
    const io = fakeIo(sub);
    const status = await main(["plan", "job.yaml", "--json", "--no-learn"], io);
    expect([0, 2], io.stderr.join("")).toContain(status);
    const j = JSON.parse(io.stdout.join(""));
    expect(j.design.wire.label).toBe("0.250 mm grade 2");
    // the whole cut weighs more than 1 g: the plan says the spool is short
    expect(j.warnings.map((w: { code: string }) => w.code)).toContain("spool_short");
    // the logbook is the profile's, relative to the profile
    const io2 = fakeIo(sub);
    const { logbookDir } = await import("../src/cli/learning.js");
    expect(logbookDir(io2)).toBe(join(dir, "book"));
    expect(logbookDir(fakeIo(sub, { ARMWIND_LOGBOOK: "/elsewhere" }))).toBe("/elsewhere");
    expect(logbookDir(io2, "given")).toBe(resolve(sub, "given"));
  });
  it("--shop FILE and $ARMWIND_SHOP name the profile; a bad profile is a located error, exit 1", async () => {
    const dir = tmp();
    const f = join(dir, "mine.yaml");
    writeFileSync(f, "version: 1\npaper: a5\n");
    const io = fakeIo(ROOT);
    expect(await main(["plan", BLIND, "--shop", f, "--no-learn"], io)).toBe(1);
    expect(io.stderr.join("")).toMatch(/mine\.yaml:2:\d+: paper: /);
    const io2 = fakeIo(ROOT, { ARMWIND_SHOP: f });
    expect(await main(["plan", BLIND, "--no-learn"], io2)).toBe(1);
    expect(io2.stderr.join("")).toMatch(/mine\.yaml:2/);
  });
  it("the card's header carries the shop and bench names, on the profile's paper", async () => {
    const dir = tmp();
    shopIn(dir, "version: 1\nshop: Test Rewinds (invented)\nbench: bench-9\npaper: letter\n");
    const io = fakeIo(dir);
    expect(await main(["card", BLIND, "--no-learn", "-o", "out", "--json"], io)).toBe(0);
    const file = JSON.parse(io.stdout.join("")).card as string;
    const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
    const doc = await pdfjs.getDocument({ data: new Uint8Array(readFileSync(file)), useSystemFonts: false }).promise;
    const page = await doc.getPage(1);
    expect(page.view[2]).toBe(612); // Letter
    const text = (await page.getTextContent()).items.map((i) => ("str" in i ? i.str : "")).join(" ");
    expect(text).toMatch(/Test Rewinds \(invented\)/);
    expect(text).toMatch(/bench bench-9/);
    await doc.destroy();
  });
});

describe("armwind new job | measured | shop", () => {
  it("new shop writes a commented profile whose $schema is a file that exists", async () => {
    const dir = tmp();
    const io = fakeIo(dir);
    expect(await main(["new", "shop"], io)).toBe(0);
    const text = readFileSync(join(dir, "armwind.yaml"), "utf8");
    const ref = /\$schema=(\S+)/.exec(text)![1];
    expect(existsSync(resolve(dir, ref))).toBe(true);
    expect(shopSchema.safeParse(parse(text)).success).toBe(true);
  });
  it("new job --style and new --style write a job whose $schema exists beside wherever it is written", async () => {
    for (const args of [
      ["new", "job", "--style", "lap", "--id", "j1"],
      ["new", "--style", "tooth", "--id", "j2", "-o", "deep/er/"],
    ]) {
      const dir = tmp();
      const io = fakeIo(dir);
      expect(await main(args, io), io.stderr.join("")).toBe(0);
      const f = join(dir, args.includes("-o") ? "deep/er/j2.yaml" : "j1.yaml");
      const ref = /\$schema=(\S+)/.exec(readFileSync(f, "utf8"))![1];
      expect(existsSync(resolve(dirname(f), ref)), ref).toBe(true);
    }
    const io = fakeIo(tmp());
    expect(await main(["new", "job"], io)).toBe(1);
    expect(io.stderr.join("")).toMatch(/--style/);
  });
  it("new measured JOB writes r1 … rC placeholders that log refuses until filled, and loads once filled", async () => {
    const dir = tmp();
    const io = fakeIo(dir, { SOURCE_DATE_EPOCH: "1764547200" });
    expect(await main(["new", "measured", BLIND, "--no-learn"], io), io.stderr.join("")).toBe(0);
    const name = readdirSync(dir).find((f) => f.endsWith(".yaml"))!;
    expect(name).toBe("blind-motor-0031-measured-2025-12-01.yaml");
    const text = readFileSync(join(dir, name), "utf8");
    for (let i = 1; i <= 5; i++) expect(text).toMatch(new RegExp(`# r${i}: bar ${i} to bar ${i === 5 ? 1 : i + 1} \\(expected`));
    expect(text).toMatch(/^wound:/m);
    expect(text).toMatch(/^meter_resolution:/m);
    expect(text).toMatch(/Null the test leads first/);
    const ref = /\$schema=(\S+)/.exec(text)![1];
    expect(existsSync(resolve(dir, ref))).toBe(true);
    const { measuredSchema } = await import("../src/logbook/measured.js");
    expect(measuredSchema.safeParse(parse(text)).success).toBe(false);
    const filled = text
      .replace(/^temperature: ~/m, "temperature: 21 C")
      .replace(/^meter_resolution: ~/m, "meter_resolution: 0.01 ohm")
      .replace(/^  - ~/gm, "  - 1.3")
      .replace(/^terminal_resistance: ~/m, "terminal_resistance: 1.9")
      .replace(/^no_load:.*$/m, "")
      .replace(/^stall:.*$/m, "")
      .replace(/^insulation: \{ pass: ~ \}/m, "insulation: { pass: true }");
    const r = measuredSchema.safeParse(parse(filled));
    expect(r.success, JSON.stringify(r.error?.issues)).toBe(true);
  });
});

describe("the meter's resolution: option, environment, measured file, shop profile, default (DESIGN.md order; src/bench/rules.ts)", () => {
  it("the rule picks the first one given", async () => {
    const { meterResolution, DEFAULT_METER_RESOLUTION_OHM } = await import("../src/bench/rules.js");
    expect(meterResolution({ option: 1e-4, environment: 1e-3, measured: 0.01, profile: 0.05 })).toEqual({ ohm: 1e-4, source: "option" });
    expect(meterResolution({ environment: 1e-3, measured: 0.01, profile: 0.05 })).toEqual({ ohm: 1e-3, source: "environment" });
    expect(meterResolution({ measured: 0.01, profile: 0.05 })).toEqual({ ohm: 0.01, source: "measured file" });
    expect(meterResolution({ measured: null, profile: 0.05 })).toEqual({ ohm: 0.05, source: "shop profile" });
    expect(meterResolution({})).toEqual({ ohm: DEFAULT_METER_RESOLUTION_OHM, source: "default" });
  });

  /** A shop folder with a profile whose meter reads 0.01 Ω, and the blind demo's measured file without its own resolution. */
  function bench(): { dir: string; measured: string } {
    const dir = tmp();
    shopIn(dir, "version: 1\nbench: b-1\nlogbook: book\nmeter_resolution: 0.01 ohm\n");
    const measured = join(dir, "measured.yaml");
    writeFileSync(measured, readFileSync(join(ROOT, "jobs/measured/blind-motor-0031.yaml"), "utf8").replace(/^meter_resolution:.*$/m, ""));
    return { dir, measured };
  }

  it("log: the profile's meter when the measured file gives none; then the file's; the environment and --resolution over both", async () => {
    const { dir, measured } = bench();
    const log = async (env: Record<string, string>, extra: string[] = [], file = measured) => {
      const io = fakeIo(dir, env);
      const status = await main(["log", BLIND, "--measured", file, "--no-learn", "--again", "--json", ...extra], io);
      expect([0, 4], io.stderr.join("")).toContain(status);
      return JSON.parse(io.stdout.join("")).logged.comparison as { meter_resolution_ohm: number; notes: string[] };
    };
    const fromProfile = await log({});
    expect(fromProfile.meter_resolution_ohm).toBe(0.01);
    expect(fromProfile.notes.join(" ")).toMatch(/meter resolution 0\.01 Ω from the shop profile/);
    expect(fromProfile.notes.join(" ")).not.toMatch(/not recorded/);
    expect((await log({}, [], join(ROOT, "jobs/measured/blind-motor-0031.yaml"))).meter_resolution_ohm).toBe(0.001);
    expect((await log({ ARMWIND_METER_RESOLUTION: "0.1 ohm" })).meter_resolution_ohm).toBeCloseTo(0.1, 12);
    expect((await log({ ARMWIND_METER_RESOLUTION: "0.1 ohm" }, ["--resolution", "1 mohm"])).meter_resolution_ohm).toBeCloseTo(0.001, 12);
    // a bad environment value is a one-line error naming the variable
    const io = fakeIo(dir, { ARMWIND_METER_RESOLUTION: "fast" });
    expect(await main(["log", BLIND, "--measured", measured, "--no-learn", "--again"], io)).toBe(1);
    expect(io.stderr.join("")).toMatch(/ARMWIND_METER_RESOLUTION/);
  });

  it("diagnose: the profile's meter for --bars and for a measured file without one; the file's own over the profile", async () => {
    const { dir, measured } = bench();
    const diag = async (args: string[], env: Record<string, string> = {}) => {
      const io = fakeIo(dir, env);
      const status = await main(["diagnose", BLIND, "--no-learn", "--json", ...args], io);
      expect([0, 4], io.stderr.join("")).toContain(status);
      return JSON.parse(io.stdout.join("")).meter_resolution_ohm as number;
    };
    const bars = ["--bars", "1.30,1.31,1.30,1.29,1.30"];
    expect(await diag(bars)).toBe(0.01);
    expect(await diag(bars, { ARMWIND_METER_RESOLUTION: "0.002 ohm" })).toBeCloseTo(0.002, 12);
    expect(await diag([...bars, "--resolution", "0.05 ohm"], { ARMWIND_METER_RESOLUTION: "0.002 ohm" })).toBeCloseTo(0.05, 12);
    expect(await diag(["--measured", measured])).toBe(0.01);
    expect(await diag(["--measured", join(ROOT, "jobs/measured/blind-motor-0031.yaml")])).toBe(0.001);
  });

  it("new measured: the template's meter_resolution is the environment's, else the profile's, else left to fill in", async () => {
    const { dir } = bench();
    const written = async (env: Record<string, string>, cwd = dir) => {
      const io = fakeIo(cwd, { SOURCE_DATE_EPOCH: "1764547200", ...env });
      expect(await main(["new", "measured", BLIND, "--no-learn", "-o", join(tmp(), "m.yaml")], io), io.stderr.join("")).toBe(0);
      const file = /measured file written: (\S+)/.exec(io.stdout.join(""))![1];
      return /^meter_resolution: (.*?)\s*(#|$)/m.exec(readFileSync(resolve(cwd, file), "utf8"))![1];
    };
    expect(await written({})).toBe("0.0100 ohm");
    expect(await written({ ARMWIND_METER_RESOLUTION: "0.001 ohm" })).toBe("0.00100 ohm");
    expect(await written({}, tmp())).toBe("~");
  });

  it("card: the bench sheet's windows are worked out for the profile's meter, and says so", async () => {
    const { dir } = bench();
    const sheet = async (env: Record<string, string> = {}, extra: string[] = []) => {
      const io = fakeIo(dir, env);
      expect(await main(["card", BLIND, "--no-learn", "-o", "out", "--json", ...extra], io), io.stderr.join("")).toBe(0);
      const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
      const doc = await pdfjs.getDocument({ data: new Uint8Array(readFileSync(JSON.parse(io.stdout.join("")).card)), useSystemFonts: false }).promise;
      let text = "";
      for (let i = 1; i <= doc.numPages; i++) text += (await (await doc.getPage(i)).getTextContent()).items.map((t) => ("str" in t ? t.str : "")).join(" ");
      await doc.destroy();
      return text.replace(/\s+/g, " ");
    };
    expect(await sheet()).toContain("Windows worked out for a 0.01 Ω meter (shop profile)");
    expect(await sheet({ ARMWIND_METER_RESOLUTION: "0.001 ohm" })).toContain("a 0.001 Ω meter (environment)");
    expect(await sheet({ ARMWIND_METER_RESOLUTION: "0.001 ohm" }, ["--resolution", "0.1 ohm"])).toContain("a 0.1 Ω meter (option)");
  });
});
