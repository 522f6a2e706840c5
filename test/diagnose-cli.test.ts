/**
 * `armwind diagnose` end to end (in process): readings made by the test's own nodal solution of
 * the ring come back as the coils that made them; temperature correction (IEC 60028); the demo
 * readings with coil 3 six turns short; the JSON contract and exit statuses.
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../src/cli/main.js";
import type { Io } from "../src/cli/io.js";
import { planJob } from "../src/design/plan.js";
import { windingSpec } from "../src/design/context.js";
import { layoutWinding } from "../src/winding/layout.js";
import { ROOT, loadJobFile } from "./helpers/cli.js";
import { nodalReadings } from "./helpers/nodal.js";

function fakeIo(cwd = ROOT): Io & { stdout: string[]; stderr: string[] } {
  const stdout: string[] = [];
  const stderr: string[] = [];
  return { out: (s) => stdout.push(s), err: (s) => stderr.push(s), stdin: () => "", env: {}, cwd, stdout, stderr };
}

async function diagnoseJson(args: string[]) {
  const io = fakeIo();
  const status = await main(["diagnose", ...args, "--json"], io);
  return { status, out: JSON.parse(io.stdout.join("")), stderr: io.stderr.join("\n") };
}

describe("diagnose: the inversion against an independent nodal solution", () => {
  // tooth 5/5, wave 21/21 on 4 poles (two coils between adjacent bars), lap 12 slots / 24 bars
  it.each(["blind-motor-0031", "chair-wave-0045", "drill-lap-0112", "robot-3slot-0007"])(
    "%s: known coils → readings (test's own solve) → the same coils",
    async (id) => {
      const file = join(ROOT, "jobs", `${id}.yaml`);
      const job = loadJobFile(file);
      const layout = layoutWinding(windingSpec(job));
      const plan = planJob(job, {});
      // each coil its own resistance: the plan's, times 0.97 … 1.03 (within tolerance)
      const known = plan.coils.map((c, k) => c.ohm * (0.97 + ((k * 7) % 13) * 0.005));
      const readings = nodalReadings(layout, known);
      const r = await diagnoseJson([file, "--bars", readings.map((x) => x.toPrecision(15)).join(","), "--no-learn"]);
      expect(r.status, r.stderr).toBe(0);
      expect(r.out.ok).toBe(true);
      r.out.coils.forEach((c: { index: number; resistance_ohm: number; expected_ohm: number }, k: number) => {
        expect(c.index).toBe(k + 1);
        expect(c.resistance_ohm / known[k] - 1).toBeCloseTo(0, 8);
        expect(c.expected_ohm).toBeCloseTo(plan.coils[k].ohm, 12);
      });
    },
  );

  it("one coil 4 turns short on the lap winding is named with its bars and slots, and exit 4", async () => {
    const file = join(ROOT, "jobs/drill-lap-0112.yaml");
    const job = loadJobFile(file);
    const layout = layoutWinding(windingSpec(job));
    const plan = planJob(job, {});
    const N = plan.design.turns;
    const known = plan.coils.map((c) => c.ohm);
    known[6] *= (N - 4) / N;
    // read four-wire (a 0.1 mΩ resolution): the spread rule's band is ±5 % plus one count (bench rules)
    const r = await diagnoseJson([
      file,
      "--bars",
      nodalReadings(layout, known)
        .map((x) => x.toPrecision(15))
        .join(","),
      "--resolution",
      "0.0001 ohm",
      "--no-learn",
    ]);
    expect(r.status).toBe(4);
    expect(r.out.ok).toBe(false);
    expect(r.out.coils[6].verdict).toBe("low");
    const s = r.out.suspects.find((x: { coils: number[] }) => x.coils.includes(7));
    expect(s.kind).toBe("turns_miscounted");
    expect(s.turns_estimate).toBe(-4);
    const coil = plan.coils[6];
    expect(s.message).toContain(`bars ${coil.start_bar}–${coil.end_bar}, slots ${coil.go_slot}–${coil.return_slot}`);
  });
});

describe("diagnose: temperature", () => {
  // IEC 60028: R_T = R20·(1 + 0.00393·(T − 20)); readings taken at 35 °C (= 95 °F) of coils that are
  // exactly as planned at 20 °C solve back to the plan's coils once corrected
  it.each(["35 C", "95 F"])("readings at %s are corrected to 20 °C before solving", async (t) => {
    const file = join(ROOT, "jobs/blind-motor-0031.yaml");
    const job = loadJobFile(file);
    const plan = planJob(job, {});
    const k = 1 + 0.00393 * 15;
    const readings = plan.resistance.bar_to_bar.map((r) => (r * k).toPrecision(15));
    const r = await diagnoseJson([file, "--bars", readings.join(","), "--temperature", t, "--no-learn"]);
    expect(r.status).toBe(0);
    expect(r.out.temperature_c).toBeCloseTo(35, 9);
    for (const c of r.out.coils) expect(c.deviation_fraction).toBeCloseTo(0, 9);
    // the same readings taken as 20 °C: every coil 5.9 % above the plan, a common factor that the
    // level rule judges once (median within its window: exit 0); each coil sits on the armature's own median
    const cold = await diagnoseJson([file, "--bars", readings.join(","), "--resolution", "0.001 ohm", "--no-learn"]);
    expect(cold.out.level.deviation_fraction).toBeCloseTo(0.00393 * 15, 6);
    for (const c of cold.out.coils) {
      expect(c.resistance_ohm / c.expected_ohm - 1).toBeCloseTo(0.00393 * 15, 6);
      expect(c.deviation_fraction).toBeCloseTo(0, 6);
    }
    expect(cold.status).toBe(cold.out.level.pass ? 0 : 4);
  });
});

describe("diagnose: inputs and the contract", () => {
  const BLIND = join(ROOT, "jobs/blind-motor-0031.yaml");

  it("the demo readings with coil 3 six turns short name coil 3 (bars 3–4) and about 6 turns", async () => {
    const r = await diagnoseJson([BLIND, "--measured", join(ROOT, "jobs/measured/blind-motor-0031-coil3-short.yaml"), "--no-learn"]);
    expect(r.status).toBe(4);
    expect(Object.keys(r.out)).toEqual(expect.arrayContaining(["ok", "coils", "suspects"]));
    for (const c of r.out.coils)
      expect(Object.keys(c)).toEqual(
        expect.arrayContaining(["index", "start_bar", "end_bar", "resistance_ohm", "expected_ohm", "deviation_fraction", "verdict"]),
      );
    const bad = r.out.coils.filter((c: { verdict: string }) => c.verdict !== "ok");
    expect(bad.map((c: { index: number }) => c.index)).toEqual([3]);
    expect([bad[0].start_bar, bad[0].end_bar]).toEqual([3, 4]);
    expect(r.out.suspects).toHaveLength(1);
    expect(r.out.suspects[0].turns_estimate).toBe(-6);
    expect(r.out.notes.join(" ")).toMatch(/polarity check/);
  });

  it("readings below forty counts of the meter get the four-wire advice and 'null the leads', as the card and log give them (bench rules)", async () => {
    const bars = "--bars=1.33,1.33,1.23,1.33,1.33";
    const handheld = await diagnoseJson([BLIND, bars, "--no-learn"]);
    expect(handheld.out.notes.join(" ")).toMatch(/below 40 counts of a 0\.1 Ω meter.*four-wire.*Null the test leads first/);
    const bench = await diagnoseJson([BLIND, bars, "--resolution=0.001 ohm", "--no-learn"]);
    expect(bench.out.notes.join(" ")).not.toMatch(/four-wire|Null the test leads/);
    const partial = await diagnoseJson([BLIND, "--bars=1.33,,,,", "--partial", "--no-learn"]);
    expect(partial.out.notes.join(" ")).toMatch(/four-wire/);
  });

  it("a logbook record gives the readings and the winding laid", async () => {
    const r = await diagnoseJson([BLIND, "--record", join(ROOT, "jobs/logbook/blind-motor-0031-2026-12-01-1.yaml")]);
    expect(r.status).toBe(0);
    expect(r.out.temperature_c).toBe(21);
    expect(r.out.coils).toHaveLength(5);
  });

  it("a wound winding that differs sets the expected coils (measured file wound: turns)", async () => {
    const dir = mkdtempSync(join(tmpdir(), "armwind-diag-"));
    const job = loadJobFile(BLIND);
    const plan = planJob(job, {});
    const N = plan.design.turns - 4;
    const f = join(dir, "m.yaml");
    // readings of a winding of N turns, made by scaling with its R/(N·MLT)… simply: the diagnosis expects fewer ohms
    writeFileSync(
      f,
      `version: 1\njob: blind-motor-0031\ndate: 2026-12-09\nwound: { turns: ${N} }\ntemperature: 20 C\nbar_to_bar: [${plan.resistance.bar_to_bar.join(", ")}]\n`,
    );
    const r = await diagnoseJson([BLIND, "--measured", f, "--no-learn"]);
    expect(r.out.turns_per_coil).toBe(N);
    for (const c of r.out.coils) expect(c.expected_ohm).toBeLessThan(plan.coils[0].ohm * (N / plan.design.turns) + 1e-12);
  });

  it("the wrong number of readings, or a reading that is not a resistance, exits 1 with a path", async () => {
    const io = fakeIo();
    expect(await main(["diagnose", BLIND, "--bars", "1.3,1.3,1.3,1.3"], io)).toBe(1);
    expect(io.stderr.join("\n")).toMatch(/bars: 4 bar-to-bar readings for 5 bars.*\[readings_count\]/);
    const io2 = fakeIo();
    expect(await main(["diagnose", BLIND, "--bars", "1.3,1.3,1.3 V,1.3,1.3"], io2)).toBe(1);
    expect(io2.stderr.join("\n")).toMatch(/bars\[2\]: r3 "1.3 V".*\[bad_quantity\]/);
    const io3 = fakeIo();
    expect(await main(["diagnose", BLIND], io3)).toBe(1);
    expect(io3.stderr.join("\n")).toMatch(/give the readings one way/);
  });
});
