/**
 * Calibration of the motor model from measurements on the original winding: the `fit…`
 * functions that estimate the parameters of `model.ts`, each returning the value, a short basis
 * sentence and a rough relative uncertainty, and `calibrate`, which picks the Ke source in the
 * order docs/contracts.md gives (generator, no-load, logbook, nameplate, magnet).
 *
 * All inputs are SI numbers (V, A, rad/s, Ω at the temperature of the test). Measurements that
 * contradict each other throw `ArmwindError` code `inconsistent_tests` naming the numbers.
 *
 * The rough uncertainties are bounds of the kind a bench gives, not statistics:
 * about 1 % for an optical tachometer, 1 % for a hand-held voltmeter, 3 % for a no-load current
 * read on a hand-held meter while the brushes bounce, ±50 % on an assumed brush drop, 5 % on a
 * terminal resistance corrected for temperature (all common practice, no published source).
 */
import { inputError, type Warning } from "../errors.js";
import { fmt, requireNonNegative, requirePositive, rpm } from "./check.js";
import { keFromEmfEquation, type EmfInputs } from "./emf.js";
import type { LossTorque } from "./model.js";
import type { ArmatureField } from "../job/schema.js";

/** An estimate: the value, the sentence that says how it was found, a rough relative uncertainty. */
export interface Fit<T = number> {
  value: T;
  basis: string;
  /** Rough relative uncertainty (0.03 = ±3 %). */
  uncertainty: number;
}

/** A no-load bench test: supply V, current A, speed rad/s, shunt field current A (if any). */
export interface NoLoadTest {
  supply: number;
  current: number;
  speed: number;
  /** Shunt motors: the part of `current` the field takes, A. */
  fieldCurrent?: number;
}

/** Tachometer, relative (common practice, no published source). */
const U_SPEED = 0.01;
/** Hand-held voltmeter, relative (common practice, no published source). */
const U_VOLTS = 0.01;
/** Hand-held ammeter on a no-load current, relative (common practice, no published source). */
export const DEFAULT_CURRENT_UNCERTAINTY = 0.03;
/** An assumed brush drop, relative (it varies with current and brush condition; from memory). */
const U_BRUSH = 0.5;
/** Terminal resistance corrected to the test temperature, relative (common practice). */
const U_OHM = 0.05;
/** Nameplate estimate of Ke, relative: rounded ratings, rated temperature guessed (common practice). */
const U_NAMEPLATE = 0.15;
/** Logbook estimate of Ke, relative: unit-to-unit spread of magnets and winding (common practice). */
const U_LOGBOOK = 0.1;
/** Magnet estimate of Ke, relative: gap flux and leakage guessed (from memory). */
const U_MAGNET = 0.3;
/** Speeds closer than this ratio cannot separate Coulomb from viscous loss (armwind's own choice). */
const MIN_SPEED_RATIO = 1.2;
/** Generator and no-load Ke agreeing within this fraction is normal (common practice, no published source). */
export const KE_AGREEMENT = 0.05;

function describe(t: NoLoadTest): string {
  const field = t.fieldCurrent ? `, field ${fmt(t.fieldCurrent)} A` : "";
  return `${fmt(t.supply)} V, ${fmt(t.current)} A${field} at ${fmt(rpm(t.speed))} rpm`;
}

function checkTest(t: NoLoadTest, path: string): number {
  requirePositive(t.supply, "supply voltage", `${path}.supply`);
  requirePositive(t.current, "no-load current", `${path}.no_load_current`);
  requirePositive(t.speed, "no-load speed", `${path}.no_load_speed`);
  const field = t.fieldCurrent ?? 0;
  requireNonNegative(field, "field current", `${path}.field_current`);
  const ia = t.current - field;
  if (!(ia > 0)) {
    throw inputError(
      "inconsistent_tests",
      `${path}.field_current`,
      `field current ${fmt(field)} A is not less than the total no-load current ${fmt(t.current)} A, ` +
        `so no armature current is left; the field current must be a part of the total`,
    );
  }
  return ia;
}

/**
 * Ke from an open-circuit generator test: Ke = V_open / ω, V·s/rad (speed rad/s, volts V).
 * Source: EMF equation, E = Ke·ω with no current, so no resistive or brush drop.
 * Uncertainty: tachometer 1 % plus voltmeter 1 % (common practice, no published source).
 */
export function fitKeFromGenerator(speed: number, volts: number, path = "original.generator"): Fit {
  requirePositive(speed, "generator test speed", `${path}.speed`);
  requirePositive(volts, "generator test voltage", `${path}.volts`);
  return {
    value: volts / speed,
    basis: `generator test: ${fmt(volts)} V open circuit at ${fmt(rpm(speed))} rpm, Ke = V/ω`,
    uncertainty: U_SPEED + U_VOLTS,
  };
}

function backEmf(t: NoLoadTest, ohm: number, brushDrop: number, path: string, what: string): { emf: number; ia: number } {
  const ia = checkTest(t, path);
  requirePositive(ohm, "terminal resistance", "original.terminal_resistance");
  requireNonNegative(brushDrop, "brush drop", "winding.brush_drop");
  const emf = t.supply - brushDrop - ia * ohm;
  if (!(emf > 0)) {
    throw inputError(
      "inconsistent_tests",
      path,
      `${what} (${describe(t)}) leaves no back-EMF: ${fmt(t.supply)} V − brush drop ${fmt(brushDrop)} V − ` +
        `${fmt(ia)} A × ${fmt(ohm)} Ω = ${fmt(emf)} V, yet the rotor turned; check the current, the terminal ` +
        `resistance and the brush drop`,
    );
  }
  return { emf, ia };
}

function noLoadUncertainty(t: NoLoadTest, emf: number, ia: number, ohm: number, brushDrop: number): number {
  return U_SPEED + (U_VOLTS * t.supply + U_BRUSH * brushDrop + (U_OHM + DEFAULT_CURRENT_UNCERTAINTY) * ia * ohm) / emf;
}

/**
 * Ke from one no-load test: Ke = (V − V_b − I_a·R) / ω0, V·s/rad, with I_a = I0 − I_field the
 * armature current (a shunt field's current subtracted), R the terminal resistance at the test
 * temperature (Ω), V_b the brush drop (V), ω0 rad/s. Source: the steady-state armature equation
 * V = Ke·ω + I·R + V_b (docs/contracts.md). Uncertainty: tachometer and voltmeter, ±50 % on the brush
 * drop, 5 % + 3 % on the I·R term, each divided by the back-EMF (common practice).
 * Zero or negative back-EMF throws `inconsistent_tests` naming the numbers.
 */
export function fitKeFromNoLoad(test: NoLoadTest, terminalOhmAtTestTemp: number, brushDrop: number, path = "original.tests[0]"): Fit {
  const { emf, ia } = backEmf(test, terminalOhmAtTestTemp, brushDrop, path, "the no-load test");
  return {
    value: emf / test.speed,
    basis:
      `no-load test ${describe(test)}: back-EMF ${fmt(test.supply)} − ${fmt(brushDrop)} − ` +
      `${fmt(ia)} × ${fmt(terminalOhmAtTestTemp)} = ${fmt(emf)} V, Ke = E/ω`,
    uncertainty: noLoadUncertainty(test, emf, ia, terminalOhmAtTestTemp, brushDrop),
  };
}

/**
 * Ke from several no-load tests by least squares through the origin, E_i = Ke·ω_i:
 * Ke = Σ E_i·ω_i / Σ ω_i², V·s/rad. `terminalOhm` is one value for all tests or one per test
 * (Ω at each test's temperature). Two tests whose single-test Ke differ by more than the sum of
 * their rough uncertainties throw `inconsistent_tests` naming both. Uncertainty: the smallest
 * single-test one or half the relative spread, whichever is larger (the tachometer and the brush
 * drop are the same in every test, so their error does not average out).
 * Source: least squares (any statistics text); the armature equation as in `fitKeFromNoLoad`.
 */
export function fitKeFromNoLoadTests(tests: NoLoadTest[], terminalOhm: number | number[], brushDrop: number, path = "original.tests"): Fit {
  if (tests.length === 0) throw inputError("invalid_value", path, "at least one no-load test is needed");
  const ohms = tests.map((_, i) => (Array.isArray(terminalOhm) ? terminalOhm[i] : terminalOhm));
  if (Array.isArray(terminalOhm) && terminalOhm.length !== tests.length) {
    throw inputError("invalid_value", path, `${tests.length} tests but ${terminalOhm.length} terminal resistances`);
  }
  const singles = tests.map((t, i) => fitKeFromNoLoad(t, ohms[i], brushDrop, `${path}[${i}]`));
  if (tests.length === 1) return singles[0];
  for (let i = 0; i < tests.length; i++) {
    for (let j = i + 1; j < tests.length; j++) {
      const a = singles[i].value;
      const b = singles[j].value;
      const d = Math.abs(a - b) / ((a + b) / 2);
      if (d > singles[i].uncertainty + singles[j].uncertainty) {
        throw inputError(
          "inconsistent_tests",
          `${path}[${j}]`,
          `no-load tests ${path}[${i}] (${describe(tests[i])}) and ${path}[${j}] (${describe(tests[j])}) give ` +
            `Ke ${fmt(a)} and ${fmt(b)} V·s/rad, ${fmt(d * 100)} % apart, beyond their ±${fmt(singles[i].uncertainty * 100)} % ` +
            `and ±${fmt(singles[j].uncertainty * 100)} %; check the speeds and currents`,
        );
      }
    }
  }
  let num = 0;
  let den = 0;
  tests.forEach((t, i) => {
    const emf = singles[i].value * t.speed;
    num += emf * t.speed;
    den += t.speed * t.speed;
  });
  const ke = num / den;
  const values = singles.map((s) => s.value);
  const spread = (Math.max(...values) - Math.min(...values)) / ke;
  return {
    value: ke,
    basis: `${tests.length} no-load tests, least squares of back-EMF against speed: Ke = ${fmt(ke)} V·s/rad`,
    uncertainty: Math.max(Math.min(...singles.map((s) => s.uncertainty)), spread / 2),
  };
}

/**
 * Rough Ke from the nameplate: Ke ≈ (V − V_b − I·R_hot) / ω_rated, V·s/rad (supply V, rated
 * current A, rated speed rad/s, hot terminal resistance Ω, brush drop V). Source: the armature
 * equation at the rated point (docs/contracts.md). Uncertainty 15 %: ratings are rounded and the
 * winding's temperature at the rated point is a guess (common practice, no published source).
 */
export function fitKeFromNameplate(supply: number, current: number, speed: number, hotOhm: number, brushDrop: number, path = "original.nameplate"): Fit {
  const t: NoLoadTest = { supply, current, speed };
  const { emf } = backEmf(t, hotOhm, brushDrop, path, "the nameplate");
  return {
    value: emf / speed,
    basis: `nameplate ${describe(t)} with ${fmt(hotOhm)} Ω hot: Ke ≈ ${fmt(emf / speed)} V·s/rad (rough)`,
    uncertainty: U_NAMEPLATE,
  };
}

/**
 * No-load loss torque T_f(ω) = T_c + B·ω from no-load tests and Kt = Ke (N·m/A):
 * T_f,i = Kt·I_a,i at speed ω_i (rad/s). One test (or tests at speeds within 20 % of each other):
 * T_c = mean Kt·I_a, B = 0. Two or more at different speeds: straight-line least squares.
 * Returns T_c in N·m and B in N·m·s/rad. A negative B or T_c beyond what the current readings'
 * uncertainty allows throws `inconsistent_tests` naming the two tests; within it, it is set to
 * zero and the other refitted. Source: Coulomb plus viscous friction (docs/contracts.md); least squares.
 * Uncertainty: the current reading (default 3 %) plus Ke's own, at the tests' speeds; beyond them
 * the loss is an extrapolation.
 */
export function fitLossTorque(
  tests: NoLoadTest[],
  ke: number,
  options: { currentUncertainty?: number; keUncertainty?: number; path?: string } = {},
): Fit<LossTorque> {
  const path = options.path ?? "original.tests";
  const uI = options.currentUncertainty ?? DEFAULT_CURRENT_UNCERTAINTY;
  const uK = options.keUncertainty ?? 0;
  requirePositive(ke, "Ke", "motor.ke");
  if (tests.length === 0) throw inputError("invalid_value", path, "at least one no-load test is needed for the loss torque");
  const w = tests.map((t) => t.speed);
  const T = tests.map((t, i) => ke * checkTest(t, `${path}[${i}]`));
  const n = tests.length;
  const uncertainty = uI + uK;
  const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;
  const pair = (i: number, j: number) =>
    `${path}[${i}] (${describe(tests[i])}, loss torque ${fmt(T[i])} N·m) and ${path}[${j}] (${describe(tests[j])}, loss torque ${fmt(T[j])} N·m)`;

  if (n === 1 || Math.max(...w) / Math.min(...w) < MIN_SPEED_RATIO) {
    const tc = mean(T);
    const basis =
      n === 1
        ? `loss torque from one no-load test: T_c = Kt × ${fmt(tests[0].current - (tests[0].fieldCurrent ?? 0))} A = ${fmt(tc)} N·m, B = 0`
        : `loss torque from ${n} no-load tests at nearly the same speed: T_c = ${fmt(tc)} N·m (mean), B = 0`;
    return { value: { tc, b: 0 }, basis, uncertainty };
  }

  const wm = mean(w);
  const Tm = mean(T);
  const sxx = w.reduce((s, x) => s + (x - wm) ** 2, 0);
  let b = w.reduce((s, x, i) => s + (x - wm) * (T[i] - Tm), 0) / sxx;
  let tc = Tm - b * wm;
  // Bounds from the current readings, propagated through the linear fit.
  const dT = T.map((t) => uI * t);
  const dB = w.reduce((s, x, i) => s + Math.abs(x - wm) * dT[i], 0) / sxx;
  const dTc = w.reduce((s, x, i) => s + Math.abs(1 / n - (wm * (x - wm)) / sxx) * dT[i], 0);
  let note = "";

  if (b < 0) {
    if (b < -dB) {
      // Name the pair with the steepest fall of loss torque with speed.
      let worst: [number, number] = [0, 1];
      let steepest = Infinity;
      for (let i = 0; i < n; i++)
        for (let j = 0; j < n; j++)
          if (w[j] > w[i]) {
            const s = (T[j] - T[i]) / (w[j] - w[i]);
            if (s < steepest) {
              steepest = s;
              worst = [i, j];
            }
          }
      throw inputError(
        "inconsistent_tests",
        `${path}[${worst[1]}]`,
        `no-load tests ${pair(worst[0], worst[1])} imply negative viscous friction (the loss torque falls as the speed ` +
          `rises, B = ${fmt(b)} N·m·s/rad), beyond the ±${fmt(uI * 100)} % of the current readings; check the currents` +
          (tests.some((t) => t.fieldCurrent) ? " and the field currents" : ""),
      );
    }
    b = 0;
    tc = Tm;
    note = "; the fitted B came out slightly negative, within the readings' noise, and was set to 0";
  }
  if (tc < 0) {
    if (tc < -dTc) {
      const lo = w.indexOf(Math.min(...w));
      const hi = w.indexOf(Math.max(...w));
      throw inputError(
        "inconsistent_tests",
        `${path}[${lo}]`,
        `no-load tests ${pair(lo, hi)} imply a negative Coulomb loss torque (T_c = ${fmt(tc)} N·m at zero speed), ` +
          `beyond the ±${fmt(uI * 100)} % of the current readings; the loss torque cannot grow in proportion to speed ` +
          `from nothing; check the currents`,
      );
    }
    tc = 0;
    b = w.reduce((s, x, i) => s + x * T[i], 0) / w.reduce((s, x) => s + x * x, 0);
    note += "; the fitted T_c came out slightly negative, within the readings' noise, and was set to 0";
  }
  return {
    value: { tc, b },
    basis:
      `loss torque from ${n} no-load tests at ${fmt(rpm(Math.min(...w)))} to ${fmt(rpm(Math.max(...w)))} rpm, ` +
      `least squares: T_c = ${fmt(tc)} N·m, B = ${fmt(b)} N·m·s/rad${note}`,
    uncertainty,
  };
}

/**
 * Relative disagreement between the generator-test Ke and the no-load Ke, |Ke_gen − Ke_nl| / Ke_gen
 * (the generator test, the better measurement, is the reference). Dimensionless.
 */
export function disagreement(keGen: number, keNoLoad: number): number {
  requirePositive(keGen, "generator-test Ke", "original.generator");
  requirePositive(keNoLoad, "no-load Ke", "original.tests");
  return Math.abs(keGen - keNoLoad) / keGen;
}

export type KeSource = "generator" | "no_load" | "logbook" | "nameplate" | "magnet" | "none";

/** A no-load test with the terminal resistance at its temperature, Ω. */
export interface NoLoadTestWithOhm extends NoLoadTest {
  terminalOhm: number;
}

export interface CalibrationInputs {
  /** Total brush drop, V. */
  brushDrop: number;
  /** Open-circuit spin test: speed rad/s, volts V. */
  generator?: { speed: number; volts: number };
  /** No-load tests, each with the terminal resistance at its temperature. */
  noLoad?: NoLoadTestWithOhm[];
  /** Logbook: Ke (V·s/rad) of finished rewinds of the same family, already scaled by the caller to the
   * original's turns per coil, from `records` records; `loss` when the logbook has it. */
  logbook?: { ke: number; records: number; loss?: LossTorque };
  /** Nameplate rated point: supply V, current A, speed rad/s, hot terminal resistance Ω. */
  nameplate?: { supply: number; current: number; speed: number; hotOhm: number };
  /** Magnet estimate through the EMF equation. */
  magnet?: EmfInputs;
  /** Field of the machine (for warnings). Default permanent_magnet. */
  field?: ArmatureField;
  /** Relative uncertainty of the no-load current readings (default 0.03). */
  currentUncertainty?: number;
}

/** The fit of Ke and the losses from the original's measurements (the design's `Calibration`, src/design/types.ts, is built from it). */
export interface KeCalibration {
  /** V·s/rad, null when nothing calibrates it. */
  ke: number | null;
  source: KeSource;
  /** Rough relative uncertainty of ke, null with no ke. */
  uncertainty: number | null;
  basis: string;
  /** No-load loss torque, null when no test (or logbook) gives it. */
  loss: LossTorque | null;
  lossBasis: string | null;
  /** Why this source, and what else was available and how it was used. */
  reasons: string[];
  warnings: Warning[];
  fits: {
    generator?: Fit;
    noLoad?: Fit;
    logbook?: Fit;
    nameplate?: Fit;
    magnet?: Fit;
    loss?: Fit<LossTorque>;
  };
}

/**
 * The Ke source, best first (docs/contracts.md, "Calibration of Ke"): generator test, no-load tests,
 * the logbook of the same family, nameplate (rough), magnet estimate; the reasons and warnings that
 * go with the choice (generator and no-load disagreeing by more than 5 %, a rough source).
 */
function chooseKe(
  inputs: CalibrationInputs,
  fits: KeCalibration["fits"],
  reasons: string[],
  warnings: Warning[],
): { chosen: Fit | undefined; source: KeSource } {
  let chosen: Fit | undefined;
  let source: KeSource = "none";
  if (fits.generator) {
    chosen = fits.generator;
    source = "generator";
    reasons.push("Ke from the generator test: the open-circuit voltage measures it directly, with no resistive or brush drop");
    if (fits.noLoad) {
      const d = disagreement(fits.generator.value, fits.noLoad.value);
      reasons.push(`the no-load tests give Ke ${fmt(fits.noLoad.value)} V·s/rad, ${fmt(d * 100)} % from the generator test; they set the loss torque`);
      if (d > KE_AGREEMENT) {
        warnings.push({
          code: "ke_sources_disagree",
          path: "original.generator",
          message:
            `the generator test gives Ke ${fmt(fits.generator.value)} V·s/rad and the no-load tests ${fmt(fits.noLoad.value)} V·s/rad, ` +
            `${fmt(d * 100)} % apart (more than ${KE_AGREEMENT * 100} % is unusual); the generator test is used; check the tachometer, ` +
            `the terminal resistance and the brush drop`,
        });
      }
    }
  } else if (fits.noLoad) {
    chosen = fits.noLoad;
    source = "no_load";
    reasons.push("Ke from the no-load tests: no generator test was given");
  } else if (inputs.logbook) {
    requirePositive(inputs.logbook.ke, "logbook Ke", "logbook");
    requirePositive(inputs.logbook.records, "logbook records", "logbook");
    fits.logbook = {
      value: inputs.logbook.ke,
      basis: `logbook: ${inputs.logbook.records} finished rewind(s) of the same family, scaled by turns`,
      uncertainty: U_LOGBOOK,
    };
    chosen = fits.logbook;
    source = "logbook";
    reasons.push("Ke from the logbook of the same family: no generator or no-load test was given");
  } else if (inputs.nameplate) {
    const np = inputs.nameplate;
    fits.nameplate = fitKeFromNameplate(np.supply, np.current, np.speed, np.hotOhm, inputs.brushDrop);
    chosen = fits.nameplate;
    source = "nameplate";
    reasons.push("Ke from the nameplate (rough): no bench test or logbook record was given");
    warnings.push({
      code: "rough_calibration",
      path: "original.nameplate",
      message: `Ke from the nameplate is rough (±${U_NAMEPLATE * 100} %); a no-load or generator test would pin it down`,
    });
  } else if (inputs.magnet) {
    const ke = keFromEmfEquation(inputs.magnet);
    fits.magnet = {
      value: ke,
      basis: `magnet estimate through the EMF equation: Ke = ${fmt(ke)} V·s/rad`,
      uncertainty: U_MAGNET,
    };
    chosen = fits.magnet;
    source = "magnet";
    reasons.push("Ke estimated from the magnet flux: nothing measured was given");
    warnings.push({
      code: "rough_calibration",
      path: "armature.magnet",
      message: `Ke estimated from the magnet flux is rough (±${U_MAGNET * 100} %); a no-load or generator test would pin it down`,
    });
  } else {
    reasons.push("no Ke source: no generator test, no-load test, logbook record, nameplate or magnet data");
    warnings.push({
      code: "uncalibrated",
      path: "original",
      message: "nothing calibrates Ke: give a no-load test (supply, current, speed) or a generator test of the original",
    });
  }

  return { chosen, source };
}

/** Warnings the field adds: a series motor's Ke holds only at the test's field current; a shunt test without its field current. */
function fieldWarnings(inputs: CalibrationInputs, tests: NoLoadTestWithOhm[], warnings: Warning[]): void {
  if (inputs.field === "series" && (tests.length > 0 || inputs.generator)) {
    warnings.push({
      code: "series_field",
      path: "armature.field",
      message:
        "series (universal) motor: Ke holds only at the field current of the test; never run a series motor unloaded at full voltage, it races until it bursts",
    });
  }
  if (inputs.field === "shunt" && tests.some((t) => t.fieldCurrent === undefined)) {
    warnings.push({
      code: "field_current_missing",
      path: "original.tests",
      message: "shunt motor test without field_current: the whole current was taken as armature current, so Ke reads low and the loss high",
    });
  }
}

/** The loss torque: from the no-load tests with the chosen Kt, else the logbook's, else unknown (null). */
function lossOf(
  inputs: CalibrationInputs,
  tests: NoLoadTestWithOhm[],
  chosen: Fit | undefined,
  fits: KeCalibration["fits"],
  reasons: string[],
): { loss: LossTorque | null; lossBasis: string | null } {
  let loss: LossTorque | null = null;
  let lossBasis: string | null = null;
  if (chosen && tests.length > 0) {
    fits.loss = fitLossTorque(tests, chosen.value, {
      currentUncertainty: inputs.currentUncertainty,
      keUncertainty: chosen.uncertainty,
    });
    loss = fits.loss.value;
    lossBasis = fits.loss.basis;
  } else if (inputs.logbook?.loss) {
    requireNonNegative(inputs.logbook.loss.tc, "logbook loss torque", "logbook");
    requireNonNegative(inputs.logbook.loss.b, "logbook viscous loss", "logbook");
    loss = { ...inputs.logbook.loss };
    lossBasis = "loss torque from the logbook of the same family";
  } else if (chosen) {
    reasons.push("no no-load test: the loss torque is unknown");
  }

  return { loss, lossBasis };
}

/**
 * Calibrate Ke (V·s/rad) and the loss torque from whatever the original offers, best source first:
 * generator test, no-load tests, the logbook of the same family, nameplate (rough), magnet estimate
 * (docs/contracts.md, "Calibration of Ke"). When both the generator and the no-load tests exist their
 * disagreement above 5 % is a warning (common practice, no published source). The loss torque comes
 * from the no-load tests with the chosen Kt, else from the logbook, else it is null.
 */
export function calibrate(inputs: CalibrationInputs): KeCalibration {
  requireNonNegative(inputs.brushDrop, "brush drop", "winding.brush_drop");
  const reasons: string[] = [];
  const warnings: Warning[] = [];
  const fits: KeCalibration["fits"] = {};
  const tests = inputs.noLoad ?? [];

  if (inputs.generator) fits.generator = fitKeFromGenerator(inputs.generator.speed, inputs.generator.volts);
  if (tests.length > 0)
    fits.noLoad = fitKeFromNoLoadTests(
      tests,
      tests.map((t) => t.terminalOhm),
      inputs.brushDrop,
    );

  const { chosen, source } = chooseKe(inputs, fits, reasons, warnings);
  fieldWarnings(inputs, tests, warnings);
  const { loss, lossBasis } = lossOf(inputs, tests, chosen, fits, reasons);
  return {
    ke: chosen ? chosen.value : null,
    source,
    uncertainty: chosen ? chosen.uncertainty : null,
    basis: chosen ? chosen.basis : "uncalibrated",
    loss,
    lossBasis,
    reasons,
    warnings,
    fits,
  };
}
