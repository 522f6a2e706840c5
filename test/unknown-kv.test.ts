/**
 * Unknown is null (docs "Unknown is null"), Kv in its two senses (docs "Kv"), series motors until
 * their model covers a figure, and the single no-load test. Each check failed before the change.
 */
import { describe, expect, it } from "vitest";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { planJob } from "../src/design/plan.js";
import { noLoad } from "../src/motor/model.js";
import { pitchFactor } from "../src/motor/emf.js";
import { curvesDrawing } from "../src/plot/curves.js";
import { ROOT, loadJobText, runMain } from "./helpers/cli.js";

const text = (name: string) => readFileSync(join(ROOT, "jobs", `${name}.yaml`), "utf8");
const tmp = mkdtempSync(join(tmpdir(), "armwind-null-"));
function write(name: string, body: string): string {
  const f = join(tmp, name);
  writeFileSync(f, body);
  return f;
}

/** Invented values: a 3 V toy motor (3-slot can) rewound with twice the turns of thinner wire. */
const TOY = `version: 1
id: toy-3slot
title: 3 V toy motor (invented values)
armature:
  slots: 3
  bars: 3
  field_poles: 2
  field: permanent_magnet
  stack_length: 8 mm
  rotor_diameter: 12 mm
  tooth_width: 2.0 mm
  slot: { width_top: 5.0 mm, width_bottom: 2.0 mm, depth: 3.5 mm, opening: 0.8 mm, liner: 0.05 mm }
winding:
  style: tooth
  mean_turn_length: 54 mm
  brushes: { count: 2, width_bars: 0.4, material: metal }
  brush_drop: 0.2 V
original:
  turns: 40
  wire: 0.15 mm
  tests:
    - { supply: 3 V, no_load_current: 0.25 A, no_load_speed: 9000 rpm }
target:
  supply: 3 V
  goal: fixed
  fixed: { turns: 80, wire: 0.106 mm grade 2 }
`;

describe("unknown is null: no loss data (nameplate only, magnet estimate)", () => {
  const boat = text("boat-7slot-0020"); // calibrated from the nameplate: no loss torque known
  let cached: ReturnType<typeof planJob> | null = null;
  const boatPlan = () => (cached ??= planJob(loadJobText(boat)));
  it("no-load current, peak efficiency and the curve's efficiencies are null, not 0 A and 83 %", () => {
    const p = boatPlan();
    expect(p.calibration.loss_known).toBe(false);
    for (const m of [p.motor, p.original_motor]) {
      expect(m.noLoadCurrent).toBeNull();
      expect(m.peakEfficiency).toBeNull();
      expect(m.peakEfficiencyCurrent).toBeNull();
      expect(m.curve.every((pt) => pt.efficiency === null)).toBe(true);
      expect(m.noLoadSpeed).not.toBeNull(); // the speed is still predicted (losses taken as zero, said in a warning)
    }
    expect(p.warnings.some((w) => w.code === "loss_unknown")).toBe(true);
  });
  it("the JSON says null and the text says —; the efficiency chart is not drawn", async () => {
    const f = write("boat.yaml", boat);
    const j = JSON.parse((await runMain(["plan", f, "--json", "--no-learn"])).stdout);
    expect(j.motor.no_load_current_a).toBeNull();
    expect(j.motor.peak_efficiency).toBeNull();
    expect(j.original_motor.no_load_current_a).toBeNull();
    const t = (await runMain(["plan", f, "--no-learn"])).stdout;
    expect(t).toMatch(/no-load current A\s+—\s+—/);
    expect(t).toMatch(/peak efficiency\s+—\s+—/);
    const d = curvesDrawing(boatPlan(), { width: 500, height: 400 });
    const titles = d.shapes.filter((s) => s.kind === "text").map((s) => (s as { text: string }).text);
    expect(titles.some((x) => /^Efficiency/.test(x))).toBe(false);
    expect(titles.some((x) => /^Speed/.test(x))).toBe(true);
  });
  it("magnet estimate alone: no −4.6e-14 A, the no-load current is null; the model's own no-load current is never negative", () => {
    const magnetOnly = boat.replace(/  nameplate:.*\n/, "");
    const p = planJob(loadJobText(magnetOnly));
    expect(p.calibration.source).toBe("magnet");
    expect(p.motor.noLoadCurrent).toBeNull();
    // I0 = T_f(ω0)/Kt: with no loss exactly 0, never a rounding residue below it (linear model, solved)
    const nl = noLoad({ ke: 0.0068, resistance: 0.18, brushDrop: 2, loss: { tc: 0, b: 0 }, field: "constant" }, 12);
    expect(nl.current).toBe(0);
    expect(nl.speed).toBeCloseTo(10 / 0.0068, 9);
  });
  it("history does not plot an unknown predicted no-load current (the boat record)", async () => {
    const j = JSON.parse((await runMain(["history", "--json", "--logbook", join(ROOT, "jobs/logbook")])).stdout);
    const boatRec = j.records.find((r: { job_id: string }) => r.job_id === "boat-7slot-0020");
    expect(boatRec.no_load_current_predicted_a).toBeNull();
    expect(boatRec.no_load_current_measured_a).toBeCloseTo(1.9, 9);
  });
});

describe("Kv: the constant and the no-load speed per volt, each with its definition", () => {
  it("plan --json gives both; no_load_rpm_per_v is the no-load speed ÷ the supply, below the constant", async () => {
    const f = write("blind.yaml", text("blind-motor-0031"));
    const j = JSON.parse((await runMain(["plan", f, "--json", "--no-learn"])).stdout);
    const m = j.motor;
    expect(m.kv_rpm_per_v).toBeCloseTo(60 / (2 * Math.PI * m.ke_v_s_per_rad), 9);
    expect(m.no_load_rpm_per_v).toBeCloseTo(m.no_load_speed_rpm / 12, 9);
    expect(m.no_load_rpm_per_v).toBeLessThan(m.kv_rpm_per_v);
    const t = (await runMain(["plan", f, "--no-learn"])).stdout;
    expect(t).toMatch(/Kv: the motor constant 60\/\(2π·Ke\); no-load rpm\/V: the predicted no-load speed ÷ the supply/);
    expect(t).toMatch(/no-load rpm\/V \(speed ÷ supply\)/);
  });
  it("a kv goal with kv_basis: no_load meets 1400 rpm/V of no-load speed per volt, not of the constant", () => {
    const boat = text("boat-7slot-0020");
    const constant = planJob(loadJobText(boat));
    const measured = planJob(loadJobText(boat.replace("  kv: 1400 rpm/V\n", "  kv: 1400 rpm/V\n  kv_basis: no_load\n")));
    expect(measured.feasible).toBe(true);
    const perVolt = (measured.motor.noLoadSpeed! * 60) / (2 * Math.PI) / 12;
    expect(Math.abs(perVolt / 1400 - 1)).toBeLessThanOrEqual(0.04 + 1e-9);
    // the no-load basis needs fewer turns (the drops take some speed): a different winding
    expect(measured.design.turns).toBeLessThan(constant.design.turns);
  });
});

describe("series motors until the series model covers a figure", () => {
  it("no Kv in either sense, in the JSON or the text", async () => {
    const f = write("drill.yaml", text("drill-lap-0112"));
    const j = JSON.parse((await runMain(["plan", f, "--json", "--no-learn"])).stdout);
    expect(j.motor.kv_rpm_per_v).toBeNull();
    expect(j.motor.no_load_rpm_per_v).toBeNull();
    const t = (await runMain(["plan", f, "--no-learn"])).stdout;
    expect(t).not.toMatch(/Kv/);
  });
  it("a stall_current goal on a series motor is refused: one located line, exit 1 (its stall current needs the field)", async () => {
    const body = text("drill-lap-0112").replace("goal: restore", "goal: stall_current\n  stall_current: 3 A");
    const f = write("drill-stall.yaml", body);
    const r = await runMain(["plan", f]);
    expect(r.status).toBe(1);
    expect(r.stderr.trim().split("\n")).toHaveLength(1);
    expect(r.stderr).toMatch(/drill-stall\.yaml:\d+:\d+: target\.goal: .*series.*\[goal_unsuitable\]/);
  });
});

describe("the toy motor rewound with about twice the turns of thinner wire (common practice, no published source)", () => {
  it("its stall current falls from about 2 A to about 0.5 A", () => {
    const p = planJob(loadJobText(TOY));
    // R ∝ N/A: twice the turns of wire with half the area (0.106² ≈ 0.15²/2) is four times the resistance
    expect(p.original_motor.stallCurrentCold!).toBeGreaterThan(1.8);
    expect(p.original_motor.stallCurrentCold!).toBeLessThan(2.2);
    expect(p.motor.stallCurrentCold!).toBeGreaterThan(0.4);
    expect(p.motor.stallCurrentCold!).toBeLessThan(0.6);
  });
  it("with one no-load test, far from the new no-load speed, the plan warns and asks for a second at half the supply; with two it does not", () => {
    const one = planJob(loadJobText(TOY));
    const w = one.warnings.find((x) => x.code === "loss_from_one_test")!;
    expect(w.message).toMatch(/one no-load test at 9000 rpm.*half the supply \(1\.50 V\)/);
    const two = planJob(
      loadJobText(
        TOY.replace(
          "    - { supply: 3 V, no_load_current: 0.25 A, no_load_speed: 9000 rpm }\n",
          "    - { supply: 3 V, no_load_current: 0.25 A, no_load_speed: 9000 rpm }\n    - { supply: 1.5 V, no_load_current: 0.19 A, no_load_speed: 4300 rpm }\n",
        ),
      ),
    );
    expect(two.warnings.some((x) => x.code === "loss_from_one_test")).toBe(false);
    // the loss that falls with speed: the slower rewind idles on less current than the held-constant loss says
    expect(two.motor.noLoadCurrent!).toBeLessThan(one.motor.noLoadCurrent!);
  });
  it("the templates ask for a second no-load test at about half the supply", () => {
    for (const t of ["tooth", "wave"]) {
      const body = readFileSync(join(ROOT, "templates", `${t}.yaml`), "utf8");
      expect(body, t).toMatch(/a second at about half the supply/);
      expect(loadJobText(body).original.tests!.length, t).toBe(2);
    }
  });
});

describe("pitch factor (sinusoidal field; the code was right, its comment argued the wrong way)", () => {
  it("3 tooth coils on 2 poles: sin(σ/2) = 0.866, above a flat full-arc field's σ/π = 0.667", () => {
    const sigma = (2 * Math.PI) / 3;
    expect(pitchFactor(1, 3, 2)).toBeCloseTo(Math.sin(sigma / 2), 12);
    expect(sigma / Math.PI).toBeLessThan(pitchFactor(1, 3, 2));
  });
});
