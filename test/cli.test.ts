/**
 * The command line as a user meets it: the demo jobs, the `--json` contract of DESIGN.md, the
 * PDF read back, and bad input giving one located line, exit status 1 and nothing written.
 * In-process through `main(args, io)` (test/helpers/cli.ts `runMain`); cli-io.test.ts runs the
 * real command where the process boundary matters.
 */
import { describe, expect, it } from "vitest";
import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { ROOT, demoJobFiles, runMain } from "./helpers/cli.js";

const BLIND = join(ROOT, "jobs/blind-motor-0031.yaml");
const blindText = readFileSync(BLIND, "utf8");

function tmp(): string {
  return mkdtempSync(join(tmpdir(), "armwind-cli-"));
}

async function pdfText(file: string): Promise<string> {
  const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
  const doc = await pdfjs.getDocument({ data: new Uint8Array(readFileSync(file)), useSystemFonts: false }).promise;
  let text = "";
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i);
    const c = await page.getTextContent();
    text += c.items.map((it) => ("str" in it ? it.str : "")).join(" ") + "\n";
  }
  return text;
}

describe("plan --json (DESIGN.md contract)", () => {
  for (const file of demoJobFiles()) {
    it(`has the contract's keys for ${file.split("/").pop()}`, async () => {
      const r = await runMain(["plan", file, "--json"]);
      expect([0, 2]).toContain(r.status);
      const j = JSON.parse(r.stdout);
      expect(j.ok).toBe(r.status === 0);
      expect(j.errors).toEqual([]);
      for (const k of [
        "job_id",
        "feasible",
        "goal",
        "design",
        "coils",
        "paths",
        "resistance",
        "wire",
        "motor",
        "original_motor",
        "duty",
        "candidates",
        "candidates_total",
        "warnings",
      ])
        expect(j, k).toHaveProperty(k);
      for (const k of ["kind", "unit", "target_value", "achieved_value", "error_fraction"]) expect(j.goal).toHaveProperty(k);
      for (const k of ["turns_per_coil", "strands_in_hand", "copper_fill", "space_fill", "layers"]) expect(j.design).toHaveProperty(k);
      for (const k of ["label", "bare_diameter_mm", "overall_diameter_mm", "source"]) expect(j.design.wire).toHaveProperty(k);
      for (const k of ["index", "go_slot", "return_slot", "layer", "start_bar", "end_bar", "turns", "direction", "mean_turn_length_mm", "dead"])
        expect(j.coils[0]).toHaveProperty(k);
      for (const k of ["coil_ohm", "bar_to_bar_ohm", "terminal_ohm", "terminal_min_ohm", "terminal_max_ohm", "terminal_hot_ohm"])
        expect(j.resistance).toHaveProperty(k);
      for (const k of ["mean_turn_length_mm", "per_coil_m", "winding_m", "cut_m", "copper_mass_g"]) expect(j.wire).toHaveProperty(k);
      for (const m of [j.motor, j.original_motor])
        for (const k of [
          "ke_v_s_per_rad",
          "kt_n_m_per_a",
          "kv_rpm_per_v",
          "no_load_speed_rpm",
          "no_load_current_a",
          "stall_current_a",
          "stall_torque_n_m",
          "peak_efficiency",
          "peak_efficiency_current_a",
          "max_output_w",
          "calibration",
        ])
          expect(m, k).toHaveProperty(k);
      for (const k of ["turns_per_coil", "wire", "strands_in_hand", "copper_fill", "terminal_ohm", "kv_rpm_per_v", "meets_goal", "rejected_because"])
        expect(j.candidates[0]).toHaveProperty(k);
      expect(Number.isInteger(j.paths)).toBe(true);
      expect(j.coils.length).toBeGreaterThanOrEqual(j.winding.slots);
    });
  }
});

describe("card", () => {
  it("writes output/<id>.pdf whose text carries the turn count, the cut length and the expected bar-to-bar reading", async () => {
    const out = tmp();
    const r = await runMain(["card", BLIND, "-o", out], { env: { SOURCE_DATE_EPOCH: "1796083200" } });
    expect(r.stderr).toBe("");
    expect(r.status).toBe(0);
    const pdf = join(out, "blind-motor-0031.pdf");
    expect(existsSync(pdf)).toBe(true);
    const j = JSON.parse((await runMain(["plan", BLIND, "--json"])).stdout);
    const text = await pdfText(pdf);
    const { sig, ohm } = await import("../src/cli/format.js");
    expect(text).toContain(String(j.design.turns_per_coil));
    expect(text).toContain(sig(j.wire.cut_m));
    expect(text).toContain(ohm(j.resistance.bar_to_bar_ohm));
    expect(text).toContain("Ω");
    expect(readdirSync(out).sort()).toEqual(["blind-motor-0031-curves.svg", "blind-motor-0031.pdf"]);
  });
  it("writes the curves as an SVG image beside the card: four charts, original dashed and new solid", async () => {
    const out = tmp();
    expect((await runMain(["card", BLIND, "-o", out])).status).toBe(0);
    const svg = readFileSync(join(out, "blind-motor-0031-curves.svg"), "utf8");
    expect(svg.startsWith("<?xml")).toBe(true);
    for (const t of ["Speed, rpm", "Current, A", "Efficiency, %", "Output power, W", "torque, mN·m"]) expect(svg).toContain(t);
    const lines = svg.match(/<polyline [^>]*>/g) ?? [];
    expect(lines.filter((l) => l.includes("stroke-dasharray")).length).toBeGreaterThanOrEqual(4 + 1);
    expect(lines.filter((l) => !l.includes("stroke-dasharray")).length).toBeGreaterThanOrEqual(4 + 1);
  });
  it("writes the series motor's curves image when the job describes its field (light load to rated)", async () => {
    const out = tmp();
    expect((await runMain(["card", join(ROOT, "jobs/drill-lap-0112.yaml"), "-o", out])).status).toBe(0);
    expect(readdirSync(out).sort()).toEqual(["drill-lap-0112-curves.svg", "drill-lap-0112.pdf"]);
    expect(readFileSync(join(out, "drill-lap-0112-curves.svg"), "utf8")).toContain("light load to rated");
  });
  it("writes no curves image for a series motor whose field the job does not describe", async () => {
    const out = tmp();
    const job = join(out, "drill.yaml");
    writeFileSync(job, readFileSync(join(ROOT, "jobs/drill-lap-0112.yaml"), "utf8").replace(/field_winding:[\s\S]*?turns_per_pole: 110\n/, ""));
    expect((await runMain(["card", job, "-o", out])).status).toBe(0);
    expect(readdirSync(out).sort()).toEqual(["drill-lap-0112.pdf", "drill.yaml"]);
  });
});

describe("bad input: one located line, exit 1, no stack trace, nothing written", () => {
  const cases: [string, (s: string) => string, RegExp][] = [
    ["malformed YAML", (s) => s.replace("slots: 5", "slots: [5"), /blind\.yaml:\d+:\d+: .*not valid YAML/],
    [
      "an unknown key, with the nearest known one",
      (s) => s.replace("stack_length:", "stak_length:"),
      /blind\.yaml:\d+:\d+: armature\.stak_length: unknown key "stak_length"; did you mean "stack_length"\?/,
    ],
    ["a missing field", (s) => s.replace(/  rotor_diameter: .*\n/, ""), /blind\.yaml:\d+:\d+: armature\.rotor_diameter: missing/],
    [
      "a value without a sensible unit",
      (s) => s.replace("stack_length: 12 mm", "stack_length: 12 V"),
      /armature\.stack_length: unknown unit "V" for a length \("V" is a unit of voltage\)/,
    ],
    ["a value out of physical range", (s) => s.replace("stack_length: 12 mm", "stack_length: -12 mm"), /armature\.stack_length: must be greater than zero/],
    ["bars that do not suit the slots", (s) => s.replace("bars: 5", "bars: 7"), /blind\.yaml:\d+:\d+: (armature|winding)\.\w+: /],
  ];
  for (const [name, edit, pattern] of cases) {
    it(name, async () => {
      const dir = tmp();
      const job = join(dir, "blind.yaml");
      writeFileSync(job, edit(blindText));
      const out = join(dir, "out");
      const r = await runMain(["card", job, "-o", out]);
      expect(r.status).toBe(1);
      expect(r.stderr).toMatch(pattern);
      expect(r.stderr).not.toMatch(/\n\s+at /);
      expect(r.stderr.trim().split("\n").length).toBeLessThanOrEqual(3);
      expect(existsSync(out)).toBe(false);
      const j = await runMain(["plan", job, "--json"]);
      expect(j.status).toBe(1);
      const body = JSON.parse(j.stdout);
      expect(body.ok).toBe(false);
      for (const e of body.errors) for (const k of ["code", "message", "file", "line", "column", "path"]) expect(e).toHaveProperty(k);
    });
  }
});

describe("exit statuses", () => {
  it("2 when no winding meets the goal, with the closest candidate and feasible false", async () => {
    const dir = tmp();
    const job = join(dir, "fast.yaml");
    writeFileSync(job, blindText.replace("no_load_speed: 9000 rpm", "no_load_speed: 90000 rpm"));
    const r = await runMain(["plan", job, "--json"]);
    expect(r.status).toBe(2);
    const j = JSON.parse(r.stdout);
    expect(j.feasible).toBe(false);
    expect(j.design.turns_per_coil).toBeGreaterThan(0);
    expect((await runMain(["check", job])).status).toBe(2);
  });
  it("0 for check on a good job; the job may come on standard input as -", async () => {
    expect((await runMain(["check", BLIND])).status).toBe(0);
    const r = await runMain(["plan", "-", "--json"], { input: blindText });
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).job_id).toBe("blind-motor-0031");
  });
  it("3 when the card cannot be written, with a clear line", async () => {
    const dir = tmp();
    const blocker = join(dir, "file");
    writeFileSync(blocker, "x");
    const r = await runMain(["card", BLIND, "-o", join(blocker, "sub")]);
    expect(r.status).toBe(3);
    expect(r.stderr).toMatch(/cannot write .*blind-motor-0031\.pdf/);
  });
  it("every command has --help", async () => {
    // every command the README's table lists
    const readme = readFileSync(join(ROOT, "README.md"), "utf8").split("## Commands")[1].split("### Exit statuses")[0];
    const listed = [...new Set([...readme.matchAll(/^\| `(\w+)[ `]/gm)].map((m) => m[1]))];
    expect(listed).toEqual(["plan", "check", "card", "wires", "new", "schema", "log", "diagnose", "history", "serve"]);
    for (const c of listed) {
      const r = await runMain([c, "--help"]);
      expect(r.status, c).toBe(0);
      expect(r.stdout).toMatch(/Options/);
    }
  });
});
