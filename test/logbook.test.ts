/**
 * The logbook: the measured file (located errors), temperature correction (IEC 60028), the
 * comparison's tolerances, records written by `armwind log` (exit 4 after writing), damaged records,
 * learning from the family's records, and the demo records.
 */
import { mkdtempSync, readdirSync, readFileSync, writeFileSync, copyFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../src/cli/main.js";
import type { Io } from "../src/cli/io.js";
import { loadYaml } from "../src/job/load.js";
import type { ArmwindError } from "../src/errors.js";
import { planJob } from "../src/design/plan.js";
import { checkAgainstJob, measuredSchema, type Measured } from "../src/logbook/measured.js";
import { predictWound } from "../src/logbook/predict.js";
import { compareReadings, TOLERANCES } from "../src/logbook/compare.js";
import { buildRecord } from "../src/logbook/record.js";
import { learnFromRecords } from "../src/logbook/learn.js";
import { parseRecordText, readLogbook } from "../src/logbook/store.js";
import { logbookOptionsFor } from "../src/cli/learning.js";
import { fromRpm } from "../src/job/units.js";
import { toRpm } from "../src/format/units.js";
import { resolveWire } from "../src/wire/catalogue.js";
import { ROOT, loadJobFile } from "./helpers/cli.js";

const BLIND = join(ROOT, "jobs/blind-motor-0031.yaml");
const BLIND_MEASURED = join(ROOT, "jobs/measured/blind-motor-0031.yaml");

function fakeIo(cwd = ROOT, env: NodeJS.ProcessEnv = { ARMWIND_BENCH: "bench-t" }): Io & { stdout: string[]; stderr: string[] } {
  const stdout: string[] = [];
  const stderr: string[] = [];
  return { out: (s) => stdout.push(s), err: (s) => stderr.push(s), stdin: () => "", env, cwd, stdout, stderr };
}

const tmp = () => mkdtempSync(join(tmpdir(), "armwind-logbook-"));

function measured(text: string, file = "m.yaml") {
  return loadYaml(text, file, measuredSchema);
}

const GOOD = `version: 1
job: blind-motor-0031
date: 2026-12-01
temperature: 21 C
meter_resolution: 0.001 ohm
bar_to_bar: [1.338, 1.331, 1.342, 1.329, 1.336]
terminal_resistance: 2.01 ohm
no_load: { supply: 12 V, current: 0.175 A, speed: 9080 rpm }
`;

describe("the measured file", () => {
  it("reads units into SI: mΩ, °F, rpm", () => {
    const m = measured(GOOD.replace("[1.338, 1.331, 1.342, 1.329, 1.336]", '[1338 mohm, "1.331 ohm", 1.342, 1.329, 1.336]').replace("21 C", "69.8 F")).value;
    expect(m.bar_to_bar[0]).toBeCloseTo(1.338, 12);
    expect(m.bar_to_bar[1]).toBeCloseTo(1.331, 12);
    // 69.8 °F = 21 °C exactly ((F − 32)·5/9, NIST SP 811)
    expect(m.temperature).toBeCloseTo(21, 10);
    expect(m.no_load!.speed).toBeCloseTo(fromRpm(9080), 9);
  });

  it("a bad value is located at file:line:column with its field path", () => {
    try {
      measured(GOOD.replace("1.331", '"1.331 V"'));
      expect.unreachable();
    } catch (e) {
      const p = (e as ArmwindError).problems[0];
      expect(p.path).toBe("bar_to_bar[1]");
      expect(p.line).toBe(6);
      expect(p.code).toBe("bad_quantity");
      expect(p.file).toBe("m.yaml");
    }
  });

  it("an unknown key names the nearest known one", () => {
    try {
      measured(GOOD + "temprature: 21 C\n");
      expect.unreachable();
    } catch (e) {
      const p = (e as ArmwindError).problems.find((x) => x.code === "unknown_key")!;
      expect(p.path).toBe("temprature");
      expect(p.message).toMatch(/temperature/);
    }
  });

  it("the reading count must equal the job's bars, located at the list", () => {
    const r = measured(GOOD.replace("[1.338, 1.331, 1.342, 1.329, 1.336]", "[1.338, 1.331, 1.342, 1.329]"));
    const job = loadJobFile(BLIND);
    try {
      checkAgainstJob(r.value, job, "m.yaml", r.locate);
      expect.unreachable();
    } catch (e) {
      const p = (e as ArmwindError).problems[0];
      expect(p.code).toBe("readings_count");
      expect(p.path).toBe("bar_to_bar");
      expect(p.line).toBe(6);
      expect(p.message).toMatch(/4 bar-to-bar readings for 5 bars/);
    }
  });

  it("a file for another job is refused", () => {
    const r = measured(GOOD.replace("job: blind-motor-0031", "job: other-1"));
    expect(() => checkAgainstJob(r.value, loadJobFile(BLIND), "m.yaml", r.locate)).toThrow(/not "blind-motor-0031"/);
  });

  it("a date that is no date is refused", () => {
    expect(() => measured(GOOD.replace("2026-12-01", "2026-13-03"))).toThrow(/YYYY-MM-DD/);
  });
});

describe("comparison", () => {
  const job = loadJobFile(BLIND);
  const plan = planJob(job);
  const p = predictWound(job, plan, undefined);

  it("the prediction for the planned winding is the plan's own figures", () => {
    expect(p.differs).toBe(false);
    expect(p.terminal.single).toBe(plan.resistance.terminal_ohm);
    for (const [i, r] of plan.resistance.bar_to_bar.entries()) expect(p.bar_to_bar[i]).toBeCloseTo(r, 12);
    const nl = compareReadings(p, { ...measured(GOOD).value, temperature: 20, no_load: { supply: 12, current: 0.17, speed: 900 } }).comparison.checks.find(
      (c) => c.check === "no_load.speed",
    )!;
    expect(nl.predicted_value!).toBeCloseTo(toRpm(plan.goal.achieved!), 6);
  });

  it("a wound winding that differs is predicted with its own turns: R ∝ N at the same wire (DESIGN.md coil resistance)", () => {
    const q = predictWound(job, plan, { turns: plan.design.turns - 6 });
    expect(q.differs).toBe(true);
    // R = ρ20·N·MLT/(k·A): the same wire and strands, so R/(N·MLT) is the same for both windings
    expect(q.coil_ohm[0] / (q.turns * q.coil_mlt[0])).toBeCloseTo(p.coil_ohm[0] / (p.turns * p.coil_mlt[0]), 9);
    // fewer turns build thinner: the turn length shortens, so R falls a little more than N
    expect(q.coil_ohm[0] / p.coil_ohm[0]).toBeLessThan((plan.design.turns - 6) / plan.design.turns);
  });

  // IEC 60028: R20 = R_T / (1 + 0.00393·(T − 20)). 1.000 Ω read at 45 °C is 0.910581 Ω at 20 °C
  // (1/1.09825, computed by hand); at 5 °C it is 1.062270 Ω (1/0.94105).
  it.each([
    [45, 1 / 1.09825],
    [5, 1 / 0.94105],
    [20, 1],
  ])("readings at %d °C are corrected to 20 °C by IEC 60028 (α20 = 0.00393/K)", (T, factor) => {
    const m: Measured = { ...measured(GOOD).value, temperature: T, bar_to_bar: [1, 1, 1, 1, 1], terminal_resistance: 1.5 };
    const { comparison } = compareReadings(p, m);
    for (const row of comparison.bar_to_bar) expect(row.measured_20c_ohm).toBeCloseTo(factor, 6);
    expect(comparison.checks.find((c) => c.check === "terminal_resistance")!.measured_20c_value).toBeCloseTo(1.5 * factor, 6);
  });

  it("readings that equal the prediction at another temperature pass every resistance check", () => {
    const T = 38;
    const k = 1 + 0.00393 * (T - 20);
    const m: Measured = {
      ...measured(GOOD).value,
      temperature: T,
      bar_to_bar: p.bar_to_bar.map((r) => r * k),
      terminal_resistance: p.terminal.single * k,
      no_load: undefined,
    };
    const { comparison } = compareReadings(p, m);
    for (const c of comparison.checks.filter((c) => c.unit === "ohm")) expect(Math.abs(c.deviation_fraction!)).toBeLessThan(1e-9);
    expect(comparison.ok).toBe(true);
  });

  it("spread: each reading within ±5 % of the median, widened by one meter count, passes; beyond fails (common practice, no published source)", () => {
    const base = p.bar_to_bar;
    const mean = base[0];
    // +4 % on r2 (the median of the five is still the plan's reading): passes
    const ok = compareReadings(p, { ...measured(GOOD).value, temperature: 20, bar_to_bar: base.map((r, i) => (i === 1 ? r * 1.04 : r)) }).comparison;
    expect(ok.checks.find((c) => c.check === "bar_to_bar.spread")!.verdict).toBe("ok");
    // +8 % on r2: +8 % of the median, outside ±(5 % + 0.001 Ω / median): fails
    const bad = compareReadings(p, { ...measured(GOOD).value, temperature: 20, bar_to_bar: base.map((r, i) => (i === 1 ? r * 1.08 : r)) }).comparison;
    const spread = bad.checks.find((c) => c.check === "bar_to_bar.spread")!;
    expect(spread.verdict).toBe("fail");
    expect(spread.tolerance_fraction).toBeCloseTo(0.05 + 0.001 / base[0], 12);
    expect(spread.tolerance_source).toMatch(/common practice, no published source/);
    expect(spread.note).toMatch(/r2 \(bars 2–3\)/);
    expect(bad.ok).toBe(false);
    expect(mean).toBeGreaterThan(0);
  });

  it("a reading 10 % or more above the average is named a poor riser connection (US Army TM 55-2210-223-34)", () => {
    const { comparison } = compareReadings(p, { ...measured(GOOD).value, temperature: 20, bar_to_bar: p.bar_to_bar.map((r, i) => (i === 3 ? r * 1.15 : r)) });
    const spread = comparison.checks.find((c) => c.check === "bar_to_bar.spread")!;
    expect(spread.note).toMatch(/r4 \(bars 4–5\).*poor coil-to-riser connection/);
    expect(spread.tolerance_source).toMatch(/TM 55-2210-223-34/);
  });

  it("terminal ±10 %, no-load speed ±10 %, no-load current ±30 % (common practice), each stated", () => {
    expect(TOLERANCES.terminal.fraction).toBe(0.1);
    expect(TOLERANCES.no_load_speed.fraction).toBe(0.1);
    expect(TOLERANCES.no_load_current.fraction).toBe(0.3);
    const m: Measured = { ...measured(GOOD).value, temperature: 20, terminal_resistance: p.terminal.single * 1.12 };
    const t = compareReadings(p, m).comparison.checks.find((c) => c.check === "terminal_resistance")!;
    expect(t.verdict).toBe("high");
    expect(t.deviation_fraction).toBeCloseTo(0.12, 9);
    expect(t.tolerance_source).toMatch(/common practice/);
  });

  it("readings below forty counts of the meter call for a four-wire or millivolt-drop reading, and the leads are nulled first (common practice)", () => {
    const coarse = compareReadings(p, { ...measured(GOOD).value, meter_resolution: 0.2 }).comparison;
    expect(coarse.notes.join(" ")).toMatch(/four-wire or millivolt-drop/);
    const fine = compareReadings(p, { ...measured(GOOD).value, meter_resolution: 0.001 }).comparison;
    expect(fine.notes.join(" ")).not.toMatch(/four-wire/);
    // 1.3 Ω readings: 40 counts of 0.03 Ω is 1.2 Ω (no advice), of 0.035 Ω is 1.4 Ω (advice)
    expect(compareReadings(p, { ...measured(GOOD).value, meter_resolution: 0.03 }).comparison.notes.join(" ")).not.toMatch(/four-wire/);
    expect(compareReadings(p, { ...measured(GOOD).value, meter_resolution: 0.035 }).comparison.notes.join(" ")).toMatch(/four-wire/);
    expect(fine.notes.join(" ")).toMatch(/[Nn]ull the test leads first/);
  });
});

describe("armwind log", () => {
  it("writes one record named <job id>-<date>-<bench>-<n>.yaml; the same readings again are refused naming the record, unless --again", async () => {
    const dir = tmp();
    const io1 = fakeIo();
    expect(await main(["log", BLIND, "--measured", BLIND_MEASURED, "--logbook", dir], io1)).toBe(0);
    const io2 = fakeIo();
    expect(await main(["log", BLIND, "--measured", BLIND_MEASURED, "--logbook", dir, "--json"], io2)).toBe(1);
    const out = JSON.parse(io2.stdout.join(""));
    expect(out.errors[0].code).toBe("already_logged");
    expect(io2.stderr.join("")).toMatch(/blind-motor-0031-2026-12-01-bench-t-1\.yaml.*already holds these readings.*--again/);
    expect(readdirSync(dir)).toEqual(["blind-motor-0031-2026-12-01-bench-t-1.yaml"]);
    for (let i = 0; i < 2; i++) expect(await main(["log", BLIND, "--measured", BLIND_MEASURED, "--logbook", dir, "--again"], fakeIo())).toBe(0);
    // another bench writing the same day takes its own name: the folders merge with no collision
    expect(await main(["log", BLIND, "--measured", BLIND_MEASURED, "--logbook", dir, "--again"], fakeIo(ROOT, { ARMWIND_BENCH: "other" }))).toBe(0);
    expect(readdirSync(dir).sort()).toEqual([
      "blind-motor-0031-2026-12-01-bench-t-1.yaml",
      "blind-motor-0031-2026-12-01-bench-t-2.yaml",
      "blind-motor-0031-2026-12-01-bench-t-3.yaml",
      "blind-motor-0031-2026-12-01-other-1.yaml",
    ]);
    const book = readLogbook(dir);
    expect(book.records).toHaveLength(4);
    expect(book.warnings).toEqual([]);
    // learning counts the one rewind once
    const learned = learnFromRecords(loadJobFile(BLIND), book.records);
    expect(learned.used.records).toBe(1);
  });

  it("without a bench name, a random tag is made once in the user's configuration folder (never in the logbook) and kept", async () => {
    const dir = tmp();
    const conf = tmp();
    const env = { XDG_CONFIG_HOME: conf };
    expect(await main(["log", BLIND, "--measured", BLIND_MEASURED, "--logbook", dir], fakeIo(ROOT, env))).toBe(0);
    const tag = readFileSync(join(conf, "armwind", "bench-tag"), "utf8").trim();
    expect(tag).toMatch(/^b[0-9a-f]{6}$/);
    expect(await main(["log", BLIND, "--measured", BLIND_MEASURED, "--logbook", dir, "--again"], fakeIo(ROOT, env))).toBe(0);
    expect(readdirSync(dir).sort()).toEqual([`blind-motor-0031-2026-12-01-${tag}-1.yaml`, `blind-motor-0031-2026-12-01-${tag}-2.yaml`]);
  });

  it("a failing check exits 4 after writing the record (it is the shop's data)", async () => {
    const dir = tmp();
    const f = join(dir, "m.yaml");
    writeFileSync(f, GOOD.replace("[1.338, 1.331, 1.342, 1.329, 1.336]", "[1.338, 1.331, 1.60, 1.329, 1.336]"));
    const io = fakeIo();
    expect(await main(["log", BLIND, "--measured", f, "--logbook", join(dir, "book"), "--json"], io)).toBe(4);
    const out = JSON.parse(io.stdout.join(""));
    expect(out.ok).toBe(false);
    // DESIGN.md: status 4 keeps the one shape: errors empty, the failed checks, the record's file name
    expect(out.errors).toEqual([]);
    expect(out.record).toBe(join(dir, "book", "blind-motor-0031-2026-12-01-bench-t-1.yaml"));
    expect(out.failures.map((x: { check: string }) => x.check)).toContain("bar_to_bar.spread");
    expect(out.logged.comparison.checks.find((c: { check: string }) => c.check === "bar_to_bar.spread").verdict).toBe("fail");
    expect(io.stderr.join("\n")).toMatch(/the record was written: .*blind-motor-0031-2026-12-01-bench-t-1\.yaml/);
    expect(readdirSync(join(dir, "book"))).toEqual(["blind-motor-0031-2026-12-01-bench-t-1.yaml"]);
  });

  it("a measured file with an error writes nothing, exits 1 and names file:line:column", async () => {
    const dir = tmp();
    const f = join(dir, "m.yaml");
    writeFileSync(f, GOOD.replace("12 V", "12 rpm"));
    const io = fakeIo();
    expect(await main(["log", BLIND, "--measured", f, "--logbook", join(dir, "book")], io)).toBe(1);
    expect(io.stderr.join("\n")).toMatch(new RegExp(`${f.replace(/[.*+?^${}()|[\]\\/]/g, "\\$&")}:8:\\d+: no_load.supply: .*\\[bad_quantity\\]`));
    expect(() => readdirSync(join(dir, "book"))).toThrow();
  });

  it("a logbook folder that cannot be created is exit 3", async () => {
    const dir = tmp();
    writeFileSync(join(dir, "file"), "");
    const io = fakeIo();
    expect(await main(["log", BLIND, "--measured", BLIND_MEASURED, "--logbook", join(dir, "file", "book")], io)).toBe(3);
    expect(io.stderr.join("\n")).toMatch(/write_failed/);
  });

  it("the logbook folder: --logbook, else $ARMWIND_LOGBOOK, else jobs/logbook under the working directory", async () => {
    const cwd = tmp();
    const envDir = join(cwd, "from-env");
    expect(await main(["log", BLIND, "--measured", BLIND_MEASURED], fakeIo(cwd, { ARMWIND_LOGBOOK: envDir }))).toBe(0);
    expect(readdirSync(envDir)).toHaveLength(1);
    expect(await main(["log", BLIND, "--measured", BLIND_MEASURED], fakeIo(cwd, {}))).toBe(0);
    expect(readdirSync(join(cwd, "jobs/logbook"))).toHaveLength(1);
  });
});

describe("reading the logbook", () => {
  it("a damaged record is a warning naming its file; the others still list", async () => {
    const dir = tmp();
    expect(await main(["log", BLIND, "--measured", BLIND_MEASURED, "--logbook", dir], fakeIo())).toBe(0);
    writeFileSync(join(dir, "blind-motor-0031-2026-12-04-1.yaml"), "version: 1\nkind: [unclosed\n");
    const good = readdirSync(dir).find((f) => f.endsWith("-1.yaml") && f.includes("12-01"))!;
    // a record that lost its readings (as a careless edit would leave it)
    const lost = parseRecordText(readFileSync(join(dir, good), "utf8")) as { measured: Record<string, unknown> };
    delete lost.measured.bar_to_bar_ohm;
    writeFileSync(join(dir, "blind-motor-0031-2026-12-05-1.yaml"), JSON.stringify(lost));
    const book = readLogbook(dir);
    expect(book.records.map((r) => r.file)).toEqual([good]);
    expect(book.warnings.map((w) => w.file).sort()).toEqual(["blind-motor-0031-2026-12-04-1.yaml", "blind-motor-0031-2026-12-05-1.yaml"]);
    expect(book.warnings.every((w) => w.code === "record_damaged")).toBe(true);
  });
});

describe("learning from the family's records", () => {
  it("a simulated round trip: records of a motor 8 % more resistive, Ke 5 % higher, known losses are learnt back", () => {
    // recorded from the demo job's plan; learnt back by the same armature without its own bench tests
    const full = loadJobFile(BLIND);
    const job = loadJobFile(BLIND);
    delete job.original.tests;
    delete job.original.generator;
    delete job.original.nameplate;
    const plan0 = planJob(full);
    const p = predictWound(full, plan0, undefined);
    expect(p.ke).not.toBeNull();
    // the "true" motor: every coil 8 % above the prediction, Ke 5 % above, Coulomb loss 2.5 mN·m
    const T = 24;
    const k = 1 + 0.00393 * (T - 20);
    const R = p.terminal.single * 1.08 * k;
    const keTrue = p.ke! * 1.05;
    const tc = 2.5e-3;
    const V = 12;
    const Vb = p.brush_drop;
    // linear model (DESIGN.md "Steady state"): I0 = Tc/Kt, ω0 = (V − Vb − I0·R)/Ke
    const I0 = tc / keTrue;
    const w0 = (V - Vb - I0 * R) / keTrue;
    const m: Measured = {
      version: 1,
      job: job.id,
      date: "2026-12-10",
      temperature: T,
      bar_to_bar: p.bar_to_bar.map((r) => r * 1.08 * k),
      terminal_resistance: R,
      no_load: { supply: V, current: I0, speed: w0 },
    };
    const record = buildRecord(full, plan0, p, m, "2026-12-10T12:00:00Z");
    expect(record.derived.ke_v_s_per_rad!).toBeCloseTo(keTrue, 9);
    expect(record.derived.loss_torque_n_m!).toBeCloseTo(tc, 9);
    const learned = learnFromRecords(job, [{ record }]);
    expect(learned.used).toMatchObject({ records: 1, turn_length: 1, ke: 1, loss: 1 });
    const o = learned.options!;
    // Ke scaled by turns back to the original's: Ke_orig = Ke_rec · N_orig / N_rec (DESIGN.md)
    expect(o.ke!).toBeCloseTo((keTrue * job.original.turns) / p.turns, 9);
    expect(o.loss!.tc).toBeCloseTo(tc, 9);
    const plan1 = planJob(job, { logbook: o });
    expect(plan1.calibration.source).toBe("logbook");
    expect(plan1.wire.mlt_source).toBe("logbook");
    expect(plan1.learning!.records).toBe(1);
    expect(plan1.learning!.moves.map((mv) => mv.figure)).toEqual(
      expect.arrayContaining(["mean turn length (original build)", "Ke (original winding)", "loss torque"]),
    );
    // the same winding planned again now predicts what was measured
    const spec = job.wire_stock!.find((w) => resolveWire(w).label === p.wire.label)!;
    const same = predictWound(job, plan1, { turns: p.turns, wire: spec, strands: p.strands }, { logbook: o });
    const { comparison } = compareReadings(same, m);
    for (const c of comparison.checks.filter((c) => c.unit === "ohm")) expect(Math.abs(c.deviation_fraction!)).toBeLessThan(0.002);
    const speed = comparison.checks.find((c) => c.check === "no_load.speed")!;
    expect(Math.abs(speed.deviation_fraction!)).toBeLessThan(0.002);
  });

  it("records of another family, or with faulty readings for the turn length, are not used", () => {
    const job = loadJobFile(BLIND);
    const plan = planJob(job);
    const p = predictWound(job, plan, undefined);
    const m = measured(GOOD).value;
    const r = buildRecord(job, plan, p, m, "t");
    expect(learnFromRecords(job, [{ record: { ...r, job: { ...r.job, family: "other" } } }]).options).toBeUndefined();
    const faulty = buildRecord(job, plan, p, { ...m, bar_to_bar: [1.338, 1.331, 1.6, 1.329, 1.336] }, "t");
    const l = learnFromRecords(job, [{ record: faulty }]);
    expect(l.used.turn_length).toBe(0);
    expect(l.options?.mltFactor).toBeUndefined();
    const noFamily = { ...job, armature: { ...job.armature, family: undefined } };
    expect(learnFromRecords(noFamily, [{ record: r }]).options).toBeUndefined();
  });

  it("plan learns from the logbook folder and says how many records it used", () => {
    const dir = tmp();
    copyFileSync(join(ROOT, "jobs/logbook/blind-motor-0031-2026-12-01-1.yaml"), join(dir, "blind-motor-0031-2026-12-01-1.yaml"));
    const job = loadJobFile(BLIND);
    const io = fakeIo(ROOT, {});
    const opts = logbookOptionsFor(io, job, dir);
    expect(opts.logbook!.records).toBe(1);
    expect(opts.logbook!.mltFactor).toBeGreaterThan(0);
    expect(logbookOptionsFor(io, job, dir, { before: "2026-12-01" })).toEqual({});
  });
});

describe("demo records", () => {
  const book = readLogbook(join(ROOT, "jobs/logbook"));
  it("every demo record parses", () => {
    expect(book.warnings).toEqual([]);
    expect(book.records.length).toBeGreaterThanOrEqual(5);
  });

  it.each(readdirSync(join(ROOT, "jobs/logbook")).filter((f) => f.endsWith(".yaml")))(
    "%s still matches its job's plan (re-run armwind log when the plan changes)",
    (file) => {
      const rec = book.records.find((r) => r.file === file)!.record;
      const job = loadJobFile(join(ROOT, "jobs", `${rec.job.id}.yaml`));
      const io = fakeIo(ROOT, {});
      const options = logbookOptionsFor(io, job, join(ROOT, "jobs/logbook"), { before: rec.date });
      const plan = planJob(job, options);
      expect(rec.predicted.plan).toEqual({ turns: plan.design.turns, wire: plan.design.wire.label, strands: plan.design.strands });
      expect(rec.predicted.terminal_ohm).toBeCloseTo(plan.resistance.terminal_ohm, 9);
      for (const [i, r] of rec.predicted.bar_to_bar_ohm.entries()) expect(r).toBeCloseTo(plan.resistance.bar_to_bar[i], 9);
      // the demo readings are invented but pass their checks
      expect(rec.comparison.ok).toBe(true);
    },
  );

  it("the demo readings with coil 3 six turns short fail the spread", () => {
    const job = loadJobFile(BLIND);
    const plan = planJob(job);
    const r = loadYaml(readFileSync(join(ROOT, "jobs/measured/blind-motor-0031-coil3-short.yaml"), "utf8"), "m", measuredSchema).value;
    const { comparison } = compareReadings(predictWound(job, plan, r.wound), r);
    expect(comparison.checks.find((c) => c.check === "bar_to_bar.spread")!.note).toMatch(/r3 \(bars 3–4\)/);
  });
});
