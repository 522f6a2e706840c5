/**
 * The bench against the plan: each reading corrected to 20 °C (IEC 60028, α20 = 0.00393/K), set
 * beside what the plan predicts for the winding laid, as a deviation and a verdict against a stated
 * tolerance. Pure; its output is already in the record's units (the `--json` contract's: Ω, A, rpm,
 * V, °C, fractions), since it goes straight into the record.
 */
import { copperFactor, to20C } from "../wire/copper.js";
import { toRpm } from "../format/units.js";
import type { Measured } from "./measured.js";
import { predictNoLoad, predictStall, type Prediction } from "./predict.js";

export type CheckVerdict = "ok" | "high" | "low" | "fail" | "not_checked";

export interface Tolerance {
  fraction: number;
  source: string;
}

/** Every tolerance the comparison uses, with where it comes from. */
export const TOLERANCES = {
  /** Each bar-to-bar reading within ±5 % of the mean of the readings (after the plan's own coil-to-coil pattern is divided out). */
  bar_to_bar_spread: { fraction: 0.05, source: "common practice, no published source: bar-to-bar readings within ±5 % of their mean" },
  /** A reading 10 % or more above the average: a poor coil-to-riser connection. */
  riser: { fraction: 0.1, source: "US Army TM 55-2210-223-34, armature bar-to-bar test: 10 % or more above the average points to a poor riser connection" },
  /** Each reading against the one the plan predicts, the same allowance as the terminal resistance. */
  bar_to_bar: { fraction: 0.1, source: "common practice, no published source: within ±10 % of predicted (wire resistance tolerance plus the turn-length model)" },
  terminal: { fraction: 0.1, source: "common practice, no published source: terminal resistance within ±10 % of predicted" },
  no_load_speed: { fraction: 0.1, source: "common practice, no published source: no-load speed within ±10 % of predicted" },
  no_load_current: { fraction: 0.3, source: "common practice, no published source: no-load current within ±30 % of predicted (friction and brush seating vary)" },
  stall_current: { fraction: 0.2, source: "common practice, no published source: brief stall current within ±20 % of predicted (brush contact varies at stall)" },
} satisfies Record<string, Tolerance>;

/** Least insulation resistance taken as a pass, Ω: 1 MΩ (common practice, no published source: the "one megohm" rule of thumb for small low-voltage windings). */
export const INSULATION_MIN_OHM = 1e6;

/** A reading below this many times the meter's resolution needs a four-wire or millivolt-drop reading (common practice, no published source). */
export const RESOLUTION_FACTOR = 10;

export interface CheckRow {
  /** Field path of the check: "bar_to_bar[2]", "bar_to_bar.spread", "terminal_resistance", "no_load.speed", … */
  check: string;
  unit: string;
  predicted_value: number | null;
  /** As read. */
  measured_value: number | null;
  /** Resistances corrected to 20 °C (IEC 60028); other figures as read. */
  measured_20c_value: number | null;
  /** (measured − predicted)/predicted, on the 20 °C value for resistances. */
  deviation_fraction: number | null;
  tolerance_fraction: number | null;
  tolerance_source: string;
  verdict: CheckVerdict;
  note: string | null;
}

export interface ReadingRow {
  /** Reading i: between bar i and bar i+1 (bar C and bar 1 for the last). */
  index: number;
  bars: [number, number];
  measured_ohm: number;
  measured_20c_ohm: number;
  predicted_ohm: number;
  deviation_fraction: number;
  /** Reading over the mean of the readings, divided by the same ratio of the predictions, minus 1. */
  of_mean_fraction: number;
}

export interface Comparison {
  ok: boolean;
  temperature_c: number;
  /** R(T)/R(20 °C) used to correct the readings (IEC 60028). */
  correction_factor: number;
  checks: CheckRow[];
  bar_to_bar: ReadingRow[];
  notes: string[];
}

/** What the readings say about the winding, for the next plan of the same family (SI in, record units out). */
export interface Derived {
  /** Effective mean turn length of the winding laid, mm: the predicted one scaled by measured/predicted bar-to-bar mean at 20 °C. */
  mean_turn_length_mm: number;
  /** Ke of the winding laid from the no-load reading, V·s/rad: (V − V_brush − I0·R_T)/ω0 (DESIGN.md "Calibration of Ke"). */
  ke_v_s_per_rad: number | null;
  /** Loss torque at the no-load speed, N·m: Kt·I0 with Kt = Ke (DESIGN.md "No-load loss torque"). */
  loss_torque_n_m: number | null;
  /** The no-load speed the loss torque belongs to, rpm. */
  loss_speed_rpm: number | null;
  /** False when the bar-to-bar readings point to a fault (the turn length from them is then not used for learning). */
  readings_sound: boolean;
}

const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;
const fmtPct = (x: number) => `${x >= 0 ? "+" : "−"}${Math.abs(x * 100).toFixed(1)} %`;
const r4 = (x: number) => x.toPrecision(4);

function verdictOf(dev: number, tol: number): CheckVerdict {
  if (dev > tol) return "high";
  if (dev < -tol) return "low";
  return "ok";
}

/**
 * Compare a measured file with the prediction for the winding laid. Resistances are corrected from
 * the reading temperature to 20 °C by R20 = R_T / (1 + 0.00393·(T − 20)) (IEC 60028); no-load and
 * stall figures are predicted at the measured supply with the winding at the reading temperature.
 */
export function compareReadings(p: Prediction, m: Measured): { comparison: Comparison; derived: Derived } {
  const T = m.temperature;
  const k = copperFactor(T);
  const C = p.bar_to_bar.length;
  const notes: string[] = [];
  const checks: CheckRow[] = [];
  if (T !== 20) notes.push(`resistances read at ${T} °C are divided by ${k.toFixed(4)} to give 20 °C values (IEC 60028, 0.00393/K)`);

  // bar to bar
  const m20 = m.bar_to_bar.map((r) => to20C(r, T));
  const mMean = mean(m20);
  const pMean = mean(p.bar_to_bar);
  const rows: ReadingRow[] = m20.map((r, i) => ({
    index: i + 1,
    bars: [i + 1, i + 2 > C ? 1 : i + 2],
    measured_ohm: m.bar_to_bar[i],
    measured_20c_ohm: r,
    predicted_ohm: p.bar_to_bar[i],
    deviation_fraction: r / p.bar_to_bar[i] - 1,
    of_mean_fraction: mMean > 0 ? r / mMean / (p.bar_to_bar[i] / pMean) - 1 : NaN,
  }));
  const tb = TOLERANCES.bar_to_bar;
  for (const row of rows) {
    checks.push({
      check: `bar_to_bar[${row.index - 1}]`,
      unit: "ohm",
      predicted_value: row.predicted_ohm,
      measured_value: row.measured_ohm,
      measured_20c_value: row.measured_20c_ohm,
      deviation_fraction: row.deviation_fraction,
      tolerance_fraction: tb.fraction,
      tolerance_source: tb.source,
      verdict: verdictOf(row.deviation_fraction, tb.fraction),
      note: null,
    });
  }
  const ts = TOLERANCES.bar_to_bar_spread;
  const worst = rows.reduce((w, r) => (Math.abs(r.of_mean_fraction) > Math.abs(w.of_mean_fraction) ? r : w), rows[0]);
  const outside = rows.filter((r) => !(Math.abs(r.of_mean_fraction) <= ts.fraction));
  const spreadNotes: string[] = [];
  for (const r of outside) {
    const bars = `r${r.index} (bars ${r.bars[0]}–${r.bars[1]})`;
    if (r.of_mean_fraction >= TOLERANCES.riser.fraction) spreadNotes.push(`${bars} ${fmtPct(r.of_mean_fraction)} of the mean: a poor coil-to-riser connection (${TOLERANCES.riser.source.split(",")[0]})`);
    else if (r.of_mean_fraction <= -0.9) spreadNotes.push(`${bars} near zero: bars bridged or the coil between them shorted (US Army TM 55-2210-223-34)`);
    else if (r.of_mean_fraction < 0) spreadNotes.push(`${bars} ${fmtPct(r.of_mean_fraction)} of the mean: turns short or shorted turns (armwind diagnose names the coil)`);
    else spreadNotes.push(`${bars} ${fmtPct(r.of_mean_fraction)} of the mean: turns too many or a poor joint (armwind diagnose names the coil)`);
  }
  checks.push({
    check: "bar_to_bar.spread",
    unit: "fraction",
    predicted_value: 0,
    measured_value: worst.of_mean_fraction,
    measured_20c_value: worst.of_mean_fraction,
    deviation_fraction: worst.of_mean_fraction,
    tolerance_fraction: ts.fraction,
    tolerance_source: ts.source + "; " + TOLERANCES.riser.source,
    verdict: outside.length ? "fail" : "ok",
    note: outside.length ? spreadNotes.join("; ") : `largest r${worst.index} ${fmtPct(worst.of_mean_fraction)} of the mean`,
  });

  // meter resolution
  if (m.meter_resolution !== undefined) {
    const low = p.bar_to_bar.filter((r) => r < RESOLUTION_FACTOR * m.meter_resolution!);
    if (low.length) {
      notes.push(
        `the expected bar-to-bar readings (${r4(Math.min(...low))} Ω) are below ten times the meter's resolution (${m.meter_resolution} Ω): a four-wire or millivolt-drop reading at a known current is needed for a trustworthy spread (common practice)`,
      );
    }
    if (m.terminal_resistance !== undefined && p.terminal.single < RESOLUTION_FACTOR * m.meter_resolution) {
      notes.push(`the expected terminal resistance (${r4(p.terminal.single)} Ω) is below ten times the meter's resolution: read it four-wire or by millivolt drop (common practice)`);
    }
  } else {
    notes.push("meter resolution not recorded: whether a four-wire or millivolt-drop reading was needed cannot be said (add meter_resolution)");
  }

  // terminal
  const tt = TOLERANCES.terminal;
  if (m.terminal_resistance !== undefined) {
    const r20 = to20C(m.terminal_resistance, T);
    const dev = r20 / p.terminal.single - 1;
    let verdict = verdictOf(dev, tt.fraction);
    let note: string | null = null;
    const devBridged = r20 / p.terminal.min - 1;
    if (verdict !== "ok" && Math.abs(devBridged) <= tt.fraction) {
      verdict = "ok";
      note = `${fmtPct(devBridged)} from ${r4(p.terminal.min)} Ω, the reading with the brushes bridging bars: turn the rotor until each brush sits on one bar to compare with ${r4(p.terminal.single)} Ω`;
    } else if (verdict !== "ok" && r20 >= p.terminal.min * (1 - tt.fraction) && r20 <= p.terminal.max * (1 + tt.fraction)) {
      note = `within the ${r4(p.terminal.min)} to ${r4(p.terminal.max)} Ω the brushes give as the rotor turns: read again with each brush on a single bar`;
    }
    checks.push({
      check: "terminal_resistance",
      unit: "ohm",
      predicted_value: p.terminal.single,
      measured_value: m.terminal_resistance,
      measured_20c_value: r20,
      deviation_fraction: dev,
      tolerance_fraction: tt.fraction,
      tolerance_source: tt.source,
      verdict,
      note,
    });
  } else checks.push(notChecked("terminal_resistance", "ohm", p.terminal.single, tt, "not read"));

  // no load
  const derived: Derived = {
    mean_turn_length_mm: p.mlt * (mMean / pMean) * 1e3,
    ke_v_s_per_rad: null,
    loss_torque_n_m: null,
    loss_speed_rpm: null,
    readings_sound: outside.length === 0,
  };
  const ns = TOLERANCES.no_load_speed;
  const nc = TOLERANCES.no_load_current;
  if (m.no_load) {
    const pr = predictNoLoad(p, m.no_load.supply, T);
    const why = p.series ? "a series or universal motor has no safe no-load speed to predict" : "nothing calibrates Ke";
    if (pr) {
      const ds = m.no_load.speed / pr.speed - 1;
      checks.push({
        check: "no_load.speed",
        unit: "rpm",
        predicted_value: toRpm(pr.speed),
        measured_value: toRpm(m.no_load.speed),
        measured_20c_value: null,
        deviation_fraction: ds,
        tolerance_fraction: ns.fraction,
        tolerance_source: ns.source,
        verdict: verdictOf(ds, ns.fraction),
        note: `at ${m.no_load.supply} V`,
      });
      const dc = pr.current > 0 ? m.no_load.current / pr.current - 1 : null;
      checks.push({
        check: "no_load.current",
        unit: "A",
        predicted_value: pr.current,
        measured_value: m.no_load.current,
        measured_20c_value: null,
        deviation_fraction: dc,
        tolerance_fraction: nc.fraction,
        tolerance_source: nc.source,
        verdict: dc === null ? "not_checked" : verdictOf(dc, nc.fraction),
        note: dc === null ? "the plan knows no loss torque, so it predicts no no-load current" : `at ${m.no_load.supply} V`,
      });
    } else {
      checks.push(notChecked("no_load.speed", "rpm", null, ns, why));
      checks.push(notChecked("no_load.current", "A", null, nc, why));
    }
    // what the no-load reading says about Ke and the losses
    const rT = m.terminal_resistance ?? p.terminal.single * k;
    const emf = m.no_load.supply - p.brush_drop - m.no_load.current * rT;
    if (emf > 0 && !p.series) {
      const ke = emf / m.no_load.speed;
      derived.ke_v_s_per_rad = ke;
      derived.loss_torque_n_m = ke * m.no_load.current;
      derived.loss_speed_rpm = toRpm(m.no_load.speed);
    } else if (!p.series) {
      notes.push(`the no-load reading leaves no back-EMF (${m.no_load.supply} V − ${p.brush_drop} V brushes − ${m.no_load.current} A × ${r4(rT)} Ω ≤ 0): check the supply, current and brush drop`);
    }
  } else {
    checks.push(notChecked("no_load.speed", "rpm", null, ns, p.series ? "not run (a series motor must never run unloaded)" : "not run"));
    checks.push(notChecked("no_load.current", "A", null, nc, "not run"));
  }

  // stall
  const st = TOLERANCES.stall_current;
  if (m.stall) {
    const pred = predictStall(p, m.stall.supply, T);
    const dev = m.stall.current / pred - 1;
    checks.push({
      check: "stall.current",
      unit: "A",
      predicted_value: pred,
      measured_value: m.stall.current,
      measured_20c_value: null,
      deviation_fraction: dev,
      tolerance_fraction: st.fraction,
      tolerance_source: st.source,
      verdict: verdictOf(dev, st.fraction),
      note: `at ${m.stall.supply} V, winding at ${T} °C`,
    });
  } else checks.push(notChecked("stall.current", "A", null, st, "not run"));

  // insulation
  const ins = m.insulation;
  if (ins) {
    const src = "common practice, no published source: at least 1 MΩ to the shaft and core";
    if ("megohm" in ins) {
      checks.push({
        check: "insulation",
        unit: "Mohm",
        predicted_value: INSULATION_MIN_OHM / 1e6,
        measured_value: ins.megohm / 1e6,
        measured_20c_value: null,
        deviation_fraction: null,
        tolerance_fraction: null,
        tolerance_source: src,
        verdict: ins.megohm >= INSULATION_MIN_OHM ? "ok" : "fail",
        note: `at ${ins.test_volts} V`,
      });
    } else {
      checks.push({
        check: "insulation",
        unit: "",
        predicted_value: null,
        measured_value: null,
        measured_20c_value: null,
        deviation_fraction: null,
        tolerance_fraction: null,
        tolerance_source: "the tester's own pass limit",
        verdict: ins.pass ? "ok" : "fail",
        note: ins.pass ? "passed" : "failed: a ground from the winding to the shaft or core",
      });
    }
  } else checks.push({ ...notChecked("insulation", "", null, { fraction: 0, source: "" }, "not tested: a test from every bar to the shaft and core belongs on every bench sheet (common practice)"), tolerance_fraction: null });

  const ok = checks.every((c) => c.verdict === "ok" || c.verdict === "not_checked");
  return { comparison: { ok, temperature_c: T, correction_factor: k, checks, bar_to_bar: rows, notes }, derived };
}

function notChecked(check: string, unit: string, predicted: number | null, tol: Tolerance, why: string): CheckRow {
  return {
    check,
    unit,
    predicted_value: predicted,
    measured_value: null,
    measured_20c_value: null,
    deviation_fraction: null,
    tolerance_fraction: tol.fraction,
    tolerance_source: tol.source,
    verdict: "not_checked",
    note: why,
  };
}
