/**
 * The bench against the plan: each reading corrected to 20 °C (IEC 60028, α20 = 0.00393/K), set
 * beside what the plan predicts for the winding laid, as a deviation and a verdict against a stated
 * tolerance. Pure; its output is already in the record's units (the `--json` contract's: Ω, A, rpm,
 * V, °C, fractions), since it goes straight into the record.
 */
import { hasShuntField } from "../format/shunt.js";
import { copperFactor, to20C } from "../wire/copper.js";
import { toRpm } from "../format/units.js";
import { signedPct } from "../format/number.js";
import type { Measured } from "./measured.js";
import {
  DEFAULT_METER_RESOLUTION_OHM,
  INSULATION_MIN_OHM,
  INSULATION_SOURCE,
  NO_LOAD_CURRENT,
  NO_LOAD_SPEED,
  NULL_LEADS,
  RISER,
  SPREAD,
  STALL_CURRENT,
  TERMINAL,
  fourWireAdvice,
  judgeLevel,
  judgeSpread,
  meterResolution,
  needsFourWire,
  readingName,
  spreadRuleText,
  type Level,
  type MeterResolution,
  type Spread,
  type Tolerance,
} from "../bench/rules.js";
import { predictNoLoad, predictStall, type Prediction } from "./predict.js";

export type CheckVerdict = "ok" | "high" | "low" | "fail" | "not_checked";

export type { Tolerance } from "../bench/rules.js";

/** Every tolerance the comparison uses, with where it comes from (the bench rules, src/bench/rules.ts). */
export const TOLERANCES = {
  bar_to_bar_spread: SPREAD,
  riser: RISER,
  terminal: TERMINAL,
  no_load_speed: NO_LOAD_SPEED,
  no_load_current: NO_LOAD_CURRENT,
  stall_current: STALL_CURRENT,
} satisfies Record<string, Tolerance>;

export { INSULATION_MIN_OHM };

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
  /** Reading i (r_i, 1-based): between bar i and bar i+1 (bar C and bar 1 for the last). */
  index: number;
  bars: [number, number];
  /** As read, Ω; null when read OL or open. */
  measured_ohm: number | null;
  measured_20c_ohm: number | null;
  predicted_ohm: number;
  /** Against the plan's reading; null when open. */
  deviation_fraction: number | null;
  /** The reading (the plan's pattern divided out) over the median of the set, minus 1 (the spread rule); null when open. */
  of_median_fraction: number | null;
}

export interface Comparison {
  ok: boolean;
  temperature_c: number;
  /** R(T)/R(20 °C) used to correct the readings (IEC 60028). */
  correction_factor: number;
  /** The meter resolution the rules used, Ω (the measured file's, else 0.1 Ω, a handheld meter's lowest range). */
  meter_resolution_ohm: number;
  checks: CheckRow[];
  bar_to_bar: ReadingRow[];
  notes: string[];
}

/** What the readings say about the winding, for the next plan of the same family (SI in, record units out). */
export interface Derived {
  /** Effective mean turn length of the winding laid, mm: the predicted one scaled by measured/predicted bar-to-bar mean at 20 °C. */
  mean_turn_length_mm: number;
  /** Ke of the winding laid from the no-load reading, V·s/rad: (V − V_brush − I0·R_T)/ω0 (docs/contracts.md "Calibration of Ke"). */
  ke_v_s_per_rad: number | null;
  /** Loss torque at the no-load speed, N·m: Kt·I0 with Kt = Ke (docs/contracts.md "No-load loss torque"). */
  loss_torque_n_m: number | null;
  /** The no-load speed the loss torque belongs to, rpm. */
  loss_speed_rpm: number | null;
  /** False when the bar-to-bar readings point to a fault (the turn length from them is then not used for learning). */
  readings_sound: boolean;
}

const fmtPct = (x: number) => signedPct(x, 1);
const r4 = (x: number) => x.toPrecision(4);

function verdictOf(dev: number, tol: number): CheckVerdict {
  if (dev > tol) return "high";
  if (dev < -tol) return "low";
  return "ok";
}

/**
 * Compare a measured file with the prediction for the winding laid. Resistances are corrected from
 * the reading temperature to 20 °C by R20 = R_T / (1 + 0.00393·(T − 20)) (IEC 60028); the bar-to-bar
 * set is judged by the bench rules (src/bench/rules.ts: spread against its median, level against
 * the plan); no-load and stall figures are predicted at the measured supply with the winding at the
 * reading temperature. `calibrated`: the plan's turn length was measured or calibrated (level ±5 %),
 * else it comes from the end-turn model (±15 %). `meter`: the meter's resolution as the bench rules
 * resolve it (src/bench/rules.ts `meterResolution`: option, environment, this file, shop profile,
 * default); without it, the file's, else the default.
 */
export function compareReadings(
  p: Prediction,
  m: Measured,
  calibrated = false,
  meter: MeterResolution = meterResolution({ measured: m.meter_resolution }),
): { comparison: Comparison; derived: Derived } {
  const T = m.temperature;
  const k = copperFactor(T);
  const res = meter.ohm;
  const notes: string[] = [];
  if (T !== 20) notes.push(`resistances read at ${T} °C are divided by ${k.toFixed(4)} to give 20 °C values (IEC 60028, 0.00393/K)`);
  const m20 = m.bar_to_bar.map((r) => (Number.isFinite(r) ? to20C(r, T) : r));
  const spread = judgeSpread(m20, p.bar_to_bar, res);
  const level = judgeLevel(m20, p.bar_to_bar, calibrated, p.wire.bare_diameter, res);
  const rows = readingRows(p, m, m20, spread);
  const checks: CheckRow[] = [...barChecks(p, m, m20, spread), spreadCheck(spread), levelCheck(level, calibrated)];
  notes.push(...resolutionNotes(p, m, meter));
  checks.push(terminalCheck(p, m));
  const derived: Derived = {
    mean_turn_length_mm: Number.isFinite(level.median_ohm) ? p.mlt * (level.median_ohm / level.expected_median_ohm) * 1e3 : p.mlt * 1e3,
    ke_v_s_per_rad: null,
    loss_torque_n_m: null,
    loss_speed_rpm: null,
    readings_sound: spread.pass,
  };
  checks.push(...noLoadChecks(p, m, derived, notes));
  checks.push(stallCheck(p, m), insulationCheck(m));
  const ok = checks.every((c) => c.verdict === "ok" || c.verdict === "not_checked");
  return { comparison: { ok, temperature_c: T, correction_factor: k, meter_resolution_ohm: res, checks, bar_to_bar: rows, notes }, derived };
}

/** The readings beside the plan's, r1 … rC (Ω; the spread rule's deviation from the median). */
function readingRows(p: Prediction, m: Measured, m20: number[], spread: Spread): ReadingRow[] {
  const C = m20.length;
  return m20.map((r, i) => ({
    index: i + 1,
    bars: [i + 1, i + 2 > C ? 1 : i + 2],
    measured_ohm: Number.isFinite(m.bar_to_bar[i]) ? m.bar_to_bar[i] : null,
    measured_20c_ohm: Number.isFinite(r) ? r : null,
    predicted_ohm: p.bar_to_bar[i],
    deviation_fraction: Number.isFinite(r) ? r / p.bar_to_bar[i] - 1 : null,
    of_median_fraction: Number.isFinite(spread.rows[i].of_median_fraction) ? spread.rows[i].of_median_fraction : null,
  }));
}

/** One check per reading (path `bar_to_bar[i]`, people's name r{i+1}): the spread rule against the median of the set. */
function barChecks(p: Prediction, m: Measured, m20: number[], spread: Spread): CheckRow[] {
  return spread.rows.map((row, i) => ({
    check: `bar_to_bar[${i}]`,
    unit: "ohm",
    predicted_value: p.bar_to_bar[i],
    measured_value: Number.isFinite(m.bar_to_bar[i]) ? m.bar_to_bar[i] : null,
    measured_20c_value: Number.isFinite(m20[i]) ? m20[i] : null,
    deviation_fraction: Number.isFinite(row.of_median_fraction) ? row.of_median_fraction : null,
    tolerance_fraction: row.window_fraction,
    tolerance_source: spreadRuleText(),
    verdict: row.pass ? "ok" : row.side === "open" ? "fail" : row.of_median_fraction > 0 ? "high" : "low",
    note: row.pass ? null : `${readingName(i)} ${row.side === "open" ? "reads open" : `${fmtPct(row.of_median_fraction)} of the median`}: ${row.suggests}`,
  }));
}

/** The spread of the set as one check (the worst reading against the median). */
function spreadCheck(spread: Spread): CheckRow {
  const worst = spread.rows.reduce((w, r) => (Math.abs(r.of_median_fraction) > Math.abs(w.of_median_fraction) ? r : w), spread.rows[0]);
  const outside = spread.rows.filter((r) => !r.pass);
  const dev = Number.isFinite(worst.of_median_fraction) ? worst.of_median_fraction : null;
  return {
    check: "bar_to_bar.spread",
    unit: "fraction",
    predicted_value: 0,
    measured_value: dev,
    measured_20c_value: dev,
    deviation_fraction: dev,
    tolerance_fraction: worst.window_fraction,
    tolerance_source: spreadRuleText(),
    verdict: outside.length ? "fail" : "ok",
    note: outside.length
      ? outside
          .map(
            (r) =>
              `${readingName(r.index)} (bars ${r.index + 1}–${r.index + 2 > spread.rows.length ? 1 : r.index + 2}) ${r.side === "open" ? "reads open" : `${fmtPct(r.of_median_fraction)} of the median`}: ${r.suggests}`,
          )
          .join("; ") + " (armwind diagnose names the coil)"
      : `largest ${readingName(worst.index)} ${fmtPct(worst.of_median_fraction)} of the median ${r4(spread.median_ohm)} Ω (band ±${(worst.window_fraction * 100).toFixed(1)} %)`,
  };
}

/** The level of the set: the median against the plan's expected reading. */
function levelCheck(level: Level, calibrated: boolean): CheckRow {
  return {
    check: "bar_to_bar.level",
    unit: "ohm",
    predicted_value: level.expected_median_ohm,
    measured_value: Number.isFinite(level.median_ohm) ? level.median_ohm : null,
    measured_20c_value: Number.isFinite(level.median_ohm) ? level.median_ohm : null,
    deviation_fraction: Number.isFinite(level.deviation_fraction) ? level.deviation_fraction : null,
    tolerance_fraction: level.window_fraction,
    tolerance_source: level.source,
    verdict: level.pass ? "ok" : level.deviation_fraction > 0 ? "high" : "low",
    note: level.pass
      ? null
      : `the median reading is ${fmtPct(level.deviation_fraction)} from the plan's (${calibrated ? "turn length calibrated" : "turn length from the model"}): the wire or the turn length was not what the plan assumed; the coils are judged against your own median (armwind diagnose)`,
  };
}

/** Four-wire advice below FOUR_WIRE_FACTOR counts of the meter, and always "null the test leads first" (common practice). */
function resolutionNotes(p: Prediction, m: Measured, meter: MeterResolution): string[] {
  const out: string[] = [];
  const res = meter.ohm;
  if (meter.source === "default")
    out.push(`meter resolution not recorded: taken as ${DEFAULT_METER_RESOLUTION_OHM} Ω, a handheld meter's lowest range (add meter_resolution)`);
  else if (meter.source !== "measured file")
    out.push(
      `meter resolution ${Number(res.toPrecision(4))} Ω from the ${meter.source}${m.meter_resolution !== undefined ? ` (the measured file says ${Number(m.meter_resolution.toPrecision(4))} Ω)` : ""}`,
    );
  const advice = fourWireAdvice(Math.min(...p.bar_to_bar), res);
  if (advice) out.push(advice);
  if (m.terminal_resistance !== undefined && needsFourWire(p.terminal.single, res)) {
    out.push(`the expected terminal resistance (${r4(p.terminal.single)} Ω) is below the same limit: read it four-wire or by millivolt drop (common practice)`);
  }
  out.push(NULL_LEADS);
  return out;
}

/** Terminal resistance at 20 °C against the plan (TERMINAL), with the rotor-position range as a hint. */
function terminalCheck(p: Prediction, m: Measured): CheckRow {
  const T = m.temperature;
  const tt = TERMINAL;
  if (m.terminal_resistance === undefined) return notChecked("terminal_resistance", "ohm", p.terminal.single, tt, "not read");
  const r20 = to20C(m.terminal_resistance, T);
  const dev = r20 / p.terminal.single - 1;
  let verdict = verdictOf(dev, tt.fraction);
  let note: string | null = null;
  const bridged = p.terminal.bridged;
  const devBridged = r20 / bridged - 1;
  const lo = p.terminal.min ?? 0;
  if (verdict !== "ok" && Math.abs(devBridged) <= tt.fraction) {
    verdict = "ok";
    note = `${fmtPct(devBridged)} from ${r4(bridged)} Ω, the reading with the brushes bridging bars: turn the rotor until each brush sits on one bar to compare with ${r4(p.terminal.single)} Ω`;
  } else if (verdict !== "ok" && r20 >= lo * (1 - tt.fraction) && r20 <= p.terminal.max * (1 + tt.fraction)) {
    note = `within the ${p.terminal.min === null ? "—" : r4(p.terminal.min)} to ${r4(p.terminal.max)} Ω the brushes give as the rotor turns: read again with each brush on a single bar`;
  }
  return {
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
  };
}

/** No-load speed and current against the plan at the measured supply; what the reading says about Ke and the loss torque goes into `derived` (docs/contracts.md "Calibration of Ke"). */
function noLoadChecks(p: Prediction, m: Measured, derived: Derived, notes: string[]): CheckRow[] {
  const T = m.temperature;
  const ns = NO_LOAD_SPEED;
  const nc = NO_LOAD_CURRENT;
  if (!m.no_load) {
    return [
      notChecked("no_load.speed", "rpm", null, ns, p.series ? "not run (a series motor must never run unloaded)" : "not run"),
      notChecked("no_load.current", "A", null, nc, "not run"),
    ];
  }
  const out: CheckRow[] = [];
  const pr = predictNoLoad(p, m.no_load.supply, T);
  const why = p.series
    ? "a series DC motor has no safe no-load speed to predict (a universal motor's needs its field data and running tests)"
    : "nothing calibrates Ke";
  if (pr) {
    const ds = m.no_load.speed / pr.speed - 1;
    out.push({
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
    const predicted = pr.current !== null && pr.current > 0 ? pr.current : null;
    const dc = predicted !== null ? m.no_load.current / predicted - 1 : null;
    out.push({
      check: "no_load.current",
      unit: "A",
      predicted_value: predicted, // unknown, not 0: history must not plot it (docs "Unknown is null")
      measured_value: m.no_load.current,
      measured_20c_value: null,
      deviation_fraction: dc,
      tolerance_fraction: nc.fraction,
      tolerance_source: nc.source,
      verdict: dc === null ? "not_checked" : verdictOf(dc, nc.fraction),
      note: dc === null ? "the plan knows no loss torque, so it predicts no no-load current" : `at ${m.no_load.supply} V`,
    });
  } else out.push(notChecked("no_load.speed", "rpm", null, ns, why), notChecked("no_load.current", "A", null, nc, why));
  const rT = m.terminal_resistance ?? p.terminal.single * copperFactor(T);
  const emf = m.no_load.supply - p.brush_drop - m.no_load.current * rT;
  if (emf > 0 && !p.series) {
    const ke = emf / m.no_load.speed;
    derived.ke_v_s_per_rad = ke;
    derived.loss_torque_n_m = ke * m.no_load.current;
    derived.loss_speed_rpm = toRpm(m.no_load.speed);
  } else if (!p.series) {
    notes.push(
      `the no-load reading leaves no back-EMF (${m.no_load.supply} V − ${p.brush_drop} V brushes − ${m.no_load.current} A × ${r4(rT)} Ω ≤ 0): check the supply, current and brush drop`,
    );
  }
  return out;
}

/** A brief stall reading against (V − V_brush)/R at the winding's temperature (docs/contracts.md "Steady state"). */
function stallCheck(p: Prediction, m: Measured): CheckRow {
  const st = STALL_CURRENT;
  if (!m.stall) return notChecked("stall.current", "A", null, st, "not run");
  const pred = predictStall(p, m.stall.supply, m.temperature);
  if (pred === null) return notChecked("stall.current", "A", null, st, "no expected figure: the series field is not described (field_winding)");
  const dev = m.stall.current / pred - 1;
  return {
    check: "stall.current",
    unit: "A",
    predicted_value: pred,
    measured_value: m.stall.current,
    measured_20c_value: null,
    deviation_fraction: dev,
    tolerance_fraction: st.fraction,
    tolerance_source: st.source,
    verdict: verdictOf(dev, st.fraction),
    note: `at ${m.stall.supply} V, winding at ${m.temperature} °C${hasShuntField(p) ? "; the armature's current (in the armature lead; the field's V/R_f is not in it)" : ""}`,
  };
}

/** Insulation to the shaft and core: at least INSULATION_MIN_OHM, or the tester's own pass. */
function insulationCheck(m: Measured): CheckRow {
  const ins = m.insulation;
  if (!ins)
    return {
      ...notChecked(
        "insulation",
        "",
        null,
        { fraction: 0, source: "" },
        "not tested: a test from every bar to the shaft and core belongs on every bench sheet (common practice)",
      ),
      tolerance_fraction: null,
    };
  if ("megohm" in ins) {
    return {
      check: "insulation",
      unit: "Mohm",
      predicted_value: INSULATION_MIN_OHM / 1e6,
      measured_value: ins.megohm / 1e6,
      measured_20c_value: null,
      deviation_fraction: null,
      tolerance_fraction: null,
      tolerance_source: INSULATION_SOURCE,
      verdict: ins.megohm >= INSULATION_MIN_OHM ? "ok" : "fail",
      note: `at ${ins.test_volts} V`,
    };
  }
  return {
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
  };
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
