/**
 * The series (and universal) motor: armature and field in one circuit, so the flux follows the
 * current. All SI: V, A, Ω, H, Hz, rad/s, N·m, W. Sources, beside each formula:
 *
 *  [C] S. J. Chapman, Electric Machinery Fundamentals, 4th ed. (McGraw-Hill, 2005): §9.6 "The
 *      series DC motor" (E = K·φ·ω with φ = c·I in the linear range, V = E + I·(R_A + R_S),
 *      τ = K·c·I², and the torque–speed relation ω = V/√(K·c·τ) − (R_A + R_S)/(K·c)); the
 *      universal motor in ch. 10 as a series motor on AC whose field and armature reactances
 *      stand in quadrature with the resistive drop (section numbers from memory).
 *  [F] The Frölich magnetisation curve φ = a·I/(b + I) (Frölich, 1881), the usual two-parameter
 *      fit of a machine's magnetisation curve in machine texts (from memory).
 *
 * Here K·c is written `k` (V·s/(A·rad) = N·m/A²) and the flux linkage per radian ψ(I) = E/ω
 * (V·s/rad): ψ = k·I in the linear range, ψ = k·I/(1 + I/I_s) along a Frölich curve that bends
 * towards saturation around the current I_s. On AC every current and voltage is r.m.s.; the
 * back-EMF and the brush drop are in phase with the current, so
 *
 *     V² = (ψ(I)·ω + I·R + V_b)² + (I·X)²,   R = R_a + R_f,  X = 2πf·(L_a + L_f)     [C]
 *     mean torque T_e = ψ(I)·I  (= k·I² linear)                                        [C]
 *     shaft torque T = T_e − T_loss(ω),  T_loss(ω) = T_c + C₂·ω²
 *
 * with f = 0 on DC. The loss torque's ω² part is a motor's own fan (fan power ∝ ω³, the fan
 * laws, from memory); friction and iron loss are lumped into T_c. The brush drop V_b is a
 * constant voltage as in `brush.ts`.
 */
import { inputError } from "../errors.js";
import { fmt, requireNonNegative, requirePositive, rpm } from "./check.js";
import type { OperatingPoint } from "./model.js";

/** ψ(I) = k·I / (1 + I/iSat) (Frölich [F]); iSat null: linear, ψ = k·I [C]. */
export interface Magnetisation {
  /** V·s/(A·rad) = N·m/A², the slope in the linear range. */
  k: number;
  /** A; null for the linear model. */
  iSat: number | null;
}

/** Loss torque T_loss(ω) = tc + c2·ω², N·m (tc) and N·m·s²/rad² (c2). */
export interface SeriesLoss {
  tc: number;
  c2: number;
}

export interface SeriesMotor {
  mag: Magnetisation;
  /** Armature resistance (brushes excluded), Ω, at the temperature of use. */
  ra: number;
  /** Field resistance (all field coils of the circuit), Ω, at the temperature of use. */
  rf: number;
  /** Armature inductance, H. */
  la: number;
  /** Field inductance, H. */
  lf: number;
  /** Total brush drop, V. */
  brushDrop: number;
  loss: SeriesLoss;
}

/** A supply: r.m.s. volts and frequency (0 for DC). */
export interface Supply {
  volts: number;
  frequency: number;
}

/**
 * One steady operating point of a series motor: the fields of the constant-field model's point
 * (src/motor/model.ts `OperatingPoint`), with the current r.m.s. on AC and the input the real power
 * I·(E + I·R + V_b), plus the power factor.
 */
export interface SeriesPoint extends OperatingPoint {
  /** (E + I·R + V_b)/V: 1 on DC. */
  powerFactor: number;
}

/** Flux linkage per radian ψ(I) = E/ω, V·s/rad, [F] or linear [C]. */
export function fluxLinkage(mag: Magnetisation, current: number): number {
  return mag.iSat === null ? mag.k * current : (mag.k * current) / (1 + current / mag.iSat);
}

/** Reactance X = 2πf·(L_a + L_f), Ω (f in Hz; 0 on DC). */
export function reactance(m: SeriesMotor, frequency: number): number {
  return 2 * Math.PI * frequency * (m.la + m.lf);
}

/** R_a + R_f, Ω. */
export function circuitResistance(m: SeriesMotor): number {
  return m.ra + m.rf;
}

/** The in-phase part of the supply, √(V² − (I·X)²), V; NaN when the reactance alone needs more than V. */
function inPhase(s: Supply, current: number, x: number): number {
  const d = s.volts * s.volts - (current * x) ** 2;
  return d >= 0 ? Math.sqrt(d) : NaN;
}

/**
 * Locked-rotor current (E = 0) at supply s, A: the root of (I·R + V_b)² + (I·X)² = V², i.e.
 * I = (−R·V_b + √(R²·V_b² − (R² + X²)(V_b² − V²))) / (R² + X²); 0 below the brush drop.
 * Source: the AC series-motor equation above with ω = 0 [C]; on DC I = (V − V_b)/R.
 */
export function lockedRotorCurrent(m: SeriesMotor, s: Supply): number {
  requireNonNegative(s.volts, "supply voltage", "target.supply");
  if (s.volts <= m.brushDrop) return 0;
  const R = circuitResistance(m);
  const X = reactance(m, s.frequency);
  const Vb = m.brushDrop;
  const a = R * R + X * X;
  return (-R * Vb + Math.sqrt(R * R * Vb * Vb - a * (Vb * Vb - s.volts * s.volts))) / a;
}

/** Supply voltage that drives `current` (A) through the locked rotor: √((I·R + V_b)² + (I·X)²), V [C]. */
export function lockedRotorVoltage(m: SeriesMotor, frequency: number, current: number): number {
  const R = circuitResistance(m);
  const X = reactance(m, frequency);
  return Math.hypot(current * R + m.brushDrop, current * X);
}

/** Loss torque at ω (rad/s), N·m. */
export function lossTorque(loss: SeriesLoss, speed: number): number {
  return loss.tc + loss.c2 * speed * speed;
}

/**
 * The operating point at current I (A): ω = (√(V² − (I·X)²) − I·R − V_b)/ψ(I) rad/s (0 when the
 * rotor is held: the current is then at or above the locked-rotor current), shaft torque
 * ψ(I)·I − T_loss(ω) N·m, real input I·√(V² − (I·X)²) W. Source: the equations above [C].
 */
export function atCurrent(m: SeriesMotor, s: Supply, current: number): SeriesPoint {
  requirePositive(current, "current", "motor.series.current");
  const x = reactance(m, s.frequency);
  const vp = inPhase(s, current, x);
  const psi = fluxLinkage(m.mag, current);
  const e = Number.isNaN(vp) ? 0 : vp - current * circuitResistance(m) - m.brushDrop;
  const speed = Math.max(0, e / psi);
  const torque = psi * current - lossTorque(m.loss, speed);
  const inputW = current * (speed * psi + current * circuitResistance(m) + m.brushDrop);
  const outputW = Math.max(0, torque) * speed;
  return {
    torque,
    speed,
    current,
    inputW,
    outputW,
    efficiency: inputW > 0 ? outputW / inputW : 0,
    powerFactor: s.volts > 0 ? inputW / (current * s.volts) : 0,
  };
}

/** Bisection of a function increasing in I on (lo, hi] for f(I) = 0; 200 halvings at most. */
function bisect(f: (i: number) => number, lo: number, hi: number): number {
  for (let k = 0; k < 200 && hi - lo > 1e-13 * hi; k++) {
    const mid = (lo + hi) / 2;
    if (f(mid) < 0) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/**
 * Shaft torque at current I (A) on supply s, N·m: ψ(I)·I − T_loss(ω(I)) with ω(I) as `atCurrent`
 * gives it (the same arithmetic, without building a point: the sweep's inner loop). x the
 * reactance (Ω), r the circuit resistance (Ω). Source: the equations above [C].
 */
function shaftTorque(m: SeriesMotor, s: Supply, x: number, r: number, current: number): number {
  const d = s.volts * s.volts - (current * x) ** 2;
  const psi = fluxLinkage(m.mag, current);
  const e = d >= 0 ? Math.sqrt(d) - current * r - m.brushDrop : 0;
  return psi * current - lossTorque(m.loss, Math.max(0, e / psi));
}

/**
 * The operating point at shaft torque T (N·m) on supply s, or null when the motor cannot carry it
 * (at or beyond the locked-rotor torque) or has no finite speed there (no load and no loss torque:
 * it races). The current with ψ(I)·I − T_loss(ω(I)) = T is found by bisection (the left side rises
 * with I: more current, more torque and less speed, so less fan loss). Without messages: the sweep
 * asks it of many windings. Source: the equations above [C]; with V_b = 0, no loss and a linear
 * field it is Chapman's ω = V/√(k·T) − R/k (DC).
 */
export function pointAtTorqueSeries(m: SeriesMotor, s: Supply, torque: number): SeriesPoint | null {
  const iLock = lockedRotorCurrent(m, s);
  const locked = iLock > 0 ? fluxLinkage(m.mag, iLock) * iLock - m.loss.tc : 0;
  if (!(torque < locked)) return null;
  if (torque === 0 && m.loss.tc <= 0 && m.loss.c2 <= 0) return null;
  const x = reactance(m, s.frequency);
  const r = circuitResistance(m);
  return atCurrent(
    m,
    s,
    bisect((c) => shaftTorque(m, s, x, r, c) - torque, 0, iLock),
  );
}

/**
 * The operating point at shaft torque T (N·m) on supply s, as `pointAtTorqueSeries`; a torque
 * beyond the locked-rotor torque throws `beyond_stall` at `path`, no load with no loss torque
 * `series_no_load`. Source: the equations above [C].
 */
export function atTorqueSeries(m: SeriesMotor, s: Supply, torque: number, path = "target.duty.torque"): SeriesPoint {
  requireNonNegative(torque, "load torque", path);
  const p = pointAtTorqueSeries(m, s, torque);
  if (p !== null) return p;
  if (torque === 0 && m.loss.tc <= 0 && m.loss.c2 <= 0) {
    throw inputError("series_no_load", path, "with no loss torque a series motor has no finite no-load speed: it races; give a load torque");
  }
  const iLock = lockedRotorCurrent(m, s);
  const locked = iLock > 0 ? fluxLinkage(m.mag, iLock) * iLock - m.loss.tc : 0;
  throw inputError(
    "beyond_stall",
    path,
    `load torque ${fmt(torque)} N·m is beyond the locked-rotor torque ${fmt(Math.max(0, locked))} N·m at ${fmt(s.volts)} V; ` +
      `choose a smaller torque or a higher supply`,
  );
}

/**
 * No-load point (shaft torque 0) on supply s, or null when the model has no loss torque (the
 * motor would race without limit [C]). Only for small series motors tested briefly in their
 * housing (universal motors with their own fan); never for a large series DC motor.
 */
export function noLoadSeries(m: SeriesMotor, s: Supply): SeriesPoint | null {
  if (m.loss.tc <= 0 && m.loss.c2 <= 0) return null;
  return atTorqueSeries(m, s, 0, "target.supply");
}

/**
 * `n` points (n ≥ 2) evenly spaced in shaft torque from `light` × `rated` to `rated` (N·m) on
 * supply s: the speed–torque and current–torque curves from light load to rated. Source: above.
 */
export function seriesCurve(m: SeriesMotor, s: Supply, rated: number, n = 21, light = 0.1): SeriesPoint[] {
  requirePositive(rated, "rated torque", "motor.series.rated");
  if (!Number.isInteger(n) || n < 2) throw inputError("invalid_value", "", `a curve needs a whole number of points, at least 2, got ${fmt(n)}`);
  const pts: SeriesPoint[] = [];
  for (let j = 0; j < n; j++) pts.push(atTorqueSeries(m, s, rated * (light + ((1 - light) * j) / (n - 1)), "motor.series.rated"));
  return pts;
}

/** Turns ratios of a rewind: armature turns new/old (`armature`), field turns new/old (`field`, 1 when the field stays). */
export interface RewindRatios {
  armature: number;
  field: number;
}

/**
 * The motor after a rewind: ψ = (Z·P·φ)/(2π·a) grows with the armature conductors and, in the
 * linear range, φ with the field's ampere-turns, so k scales with both ratios; the field saturates
 * at the same ampere-turns, so I_s scales as 1/field; L_a ∝ N_a² and L_f ∝ N_f² (inductance of a
 * coil ∝ turns², any electromagnetics text, from memory). `ra` and `rf` are the new resistances
 * (Ω, at the temperature of use: the caller computes them from the wire); brush drop and loss
 * torque belong to the machine and stay. Source: the EMF equation (docs/contracts.md) and [C].
 */
export function rescaleSeries(m: SeriesMotor, r: RewindRatios, ra: number, rf: number): SeriesMotor {
  requirePositive(r.armature, "armature turns ratio", "original.turns");
  requirePositive(r.field, "field turns ratio", "field_winding.turns_per_pole");
  return {
    mag: { k: m.mag.k * r.armature * r.field, iSat: m.mag.iSat === null ? null : m.mag.iSat / r.field },
    ra: requirePositive(ra, "armature resistance", "resistance.terminal_ohm"),
    rf: requireNonNegative(rf, "field resistance", "field_winding.resistance"),
    la: m.la * r.armature * r.armature,
    lf: m.lf * r.field * r.field,
    brushDrop: m.brushDrop,
    loss: { ...m.loss },
  };
}

/**
 * A voltage conversion: the turns ratio n (armature and field both × n) with which the motor on
 * the new supply runs at the original's rated speed at its rated torque. With both windings × n in
 * the same copper (wire area ÷ n), R × n², L × n², k × n², I_s ÷ n, so every voltage term scales by n
 * except the brush drop: n ≈ V_new/V_old, found exactly by bisection on the speed at the rated
 * torque (which falls as n grows). Returns n and the converted motor (resistances × n²).
 * Source: the scaling of `rescaleSeries` with R ∝ N² at constant copper volume [C].
 */
export function convertRatio(m: SeriesMotor, s: Supply, ratedTorque: number, ratedSpeed: number): { ratio: number; motor: SeriesMotor } {
  requirePositive(ratedSpeed, "rated speed", "original.nameplate.speed");
  const conv = (n: number) => rescaleSeries(m, { armature: n, field: n }, m.ra * n * n, m.rf * n * n);
  const speedAt = (n: number) => {
    try {
      return atTorqueSeries(conv(n), s, ratedTorque).speed;
    } catch {
      return 0;
    }
  };
  let lo = 1e-3;
  let hi = 1e3;
  for (let k = 0; k < 200 && hi / lo > 1 + 1e-12; k++) {
    const mid = Math.sqrt(lo * hi);
    if (speedAt(mid) > ratedSpeed) lo = mid;
    else hi = mid;
  }
  const ratio = Math.sqrt(lo * hi);
  return { ratio, motor: conv(ratio) };
}

// ---------------------------------------------------------------------------------------------
// Calibration: the `fit…` functions that estimate the model above from bench readings.
// ---------------------------------------------------------------------------------------------

/** A reading of the running motor: supply, current, speed (at the motor shaft) and, when known, its shaft torque. */
export interface SeriesReading {
  supply: Supply;
  /** A. */
  current: number;
  /** rad/s, at the motor. */
  speed: number;
  /** Shaft torque, N·m: 0 for a no-load test, null when unknown (a nameplate in amps). */
  torque: number | null;
  /** Circuit resistance R_a + R_f at the reading's temperature, Ω. */
  resistance: number;
  /** Dotted path of the reading in the job, for messages. */
  path: string;
  /** How the reading is described in messages ("the no-load test"). */
  what: string;
}

/**
 * Flux linkage per radian at a reading: ψ = (√(V² − (I·X)²) − I·R − V_b)/ω, V·s/rad [C].
 * When the stated resistances, inductance and brush drop leave no back-EMF the reading and the
 * field data contradict each other: `inconsistent_tests`, naming the numbers.
 */
export function fitFluxLinkage(r: SeriesReading, inductance: number, brushDrop: number): number {
  requirePositive(r.current, "current", `${r.path}`);
  requirePositive(r.speed, "speed", `${r.path}`);
  const x = 2 * Math.PI * r.supply.frequency * inductance;
  const vp = inPhase(r.supply, r.current, x);
  const e = vp - r.current * r.resistance - brushDrop;
  if (!(e > 0)) {
    const react = x > 0 ? ` with the reactance ${fmt(x)} Ω in quadrature` : "";
    throw inputError(
      "inconsistent_tests",
      r.path,
      `${r.what} (${fmt(r.supply.volts)} V, ${fmt(r.current)} A at ${fmt(rpm(r.speed))} rpm) leaves no back-EMF: ` +
        `${fmt(r.current)} A through armature and field (${fmt(r.resistance)} Ω) and the ${fmt(brushDrop)} V brush drop${react} ` +
        `take all of the supply, yet the rotor turned; check the field and armature resistances, the inductance and the current`,
    );
  }
  return e / r.speed;
}

/**
 * The magnetisation curve through the readings' (I, ψ) points. One point (or all at about one
 * current, within 20 %): linear, k = ψ/I, and figures far above that current are optimistic.
 * Two or more: the Frölich curve [F] through the lowest- and highest-current points, from
 * I/ψ = 1/k + I/(k·I_s), a straight line in I; when ψ/I does not fall with current there is no
 * bend to fit and the model stays linear (k from the lower-current point).
 */
export function fitMagnetisation(points: { current: number; psi: number }[]): { mag: Magnetisation; basis: string } {
  if (points.length === 0) throw inputError("missing_field", "original.tests", "no running reading to calibrate the series field from");
  const sorted = [...points].sort((a, b) => a.current - b.current);
  const lo = sorted[0];
  const hi = sorted[sorted.length - 1];
  const kLo = lo.psi / lo.current;
  if (hi.current < 1.2 * lo.current) {
    const k = sorted.reduce((s, p) => s + p.psi / p.current, 0) / sorted.length;
    return {
      mag: { k, iSat: null },
      basis: `linear field, k = ψ/I = ${fmt(k)} V·s/(A·rad) from one operating current (${fmt(lo.current)} A): figures far above that current are optimistic (saturation not seen)`,
    };
  }
  const c1 = (hi.current / hi.psi - lo.current / lo.psi) / (hi.current - lo.current);
  const c0 = lo.current / lo.psi - c1 * lo.current;
  if (!(c1 > 0) || !(c0 > 0)) {
    return {
      mag: { k: kLo, iSat: null },
      basis: `linear field, k = ${fmt(kLo)} V·s/(A·rad) at ${fmt(lo.current)} A: the reading at ${fmt(hi.current)} A shows no saturation to fit`,
    };
  }
  const k = 1 / c0;
  const iSat = c0 / c1;
  return {
    mag: { k, iSat },
    basis: `magnetisation curve (Frölich) through ${fmt(lo.current)} A and ${fmt(hi.current)} A: k = ${fmt(k)} V·s/(A·rad), bending around ${fmt(iSat)} A`,
  };
}

/**
 * The loss torque from readings with a known shaft torque: T_loss = ψ(I)·I − T at ω (a no-load test
 * has T = 0). One speed (or speeds within 20 %): constant T_c (figures at other speeds are rough).
 * Two or more: T_c + C₂·ω² through the slowest and the fastest (a motor's own fan, ∝ ω²); a negative
 * T_c is taken as 0 with C₂ through the fastest point. Source: torque balance [C]; fan law from memory.
 */
export function fitSeriesLoss(points: { speed: number; lossTorque: number; path: string }[]): { loss: SeriesLoss; basis: string } {
  if (points.length === 0) return { loss: { tc: 0, c2: 0 }, basis: "no running reading with a known torque: loss torque unknown, taken as zero" };
  for (const p of points) {
    if (!(p.lossTorque >= 0)) {
      throw inputError(
        "inconsistent_tests",
        p.path,
        `the reading's shaft torque is more than the motor's own torque ψ·I at that current (by ${fmt(-p.lossTorque)} N·m); check the torque or output power, the current and the speed`,
      );
    }
  }
  const s = [...points].sort((a, b) => a.speed - b.speed);
  const a = s[0];
  const b = s[s.length - 1];
  if (b.speed < 1.2 * a.speed) {
    const tc = s.reduce((t, p) => t + p.lossTorque, 0) / s.length;
    return { loss: { tc, c2: 0 }, basis: `loss torque held constant at ${fmt(tc)} N·m (readings at one speed): figures at other speeds are rough` };
  }
  let c2 = (b.lossTorque - a.lossTorque) / (b.speed ** 2 - a.speed ** 2);
  let tc = a.lossTorque - c2 * a.speed ** 2;
  if (c2 < 0) {
    tc = s.reduce((t, p) => t + p.lossTorque, 0) / s.length;
    return {
      loss: { tc, c2: 0 },
      basis: `loss torque held constant at ${fmt(tc)} N·m: it does not grow with speed between ${fmt(rpm(a.speed))} and ${fmt(rpm(b.speed))} rpm`,
    };
  }
  if (tc < 0) {
    tc = 0;
    c2 = b.lossTorque / b.speed ** 2;
  }
  return {
    loss: { tc, c2 },
    basis: `loss torque ${fmt(tc)} N·m + ${fmt(c2)} N·m·s²·ω² (fan and friction) from readings at ${fmt(rpm(a.speed))} and ${fmt(rpm(b.speed))} rpm`,
  };
}

/**
 * Current from a nameplate's input watts P on supply s with circuit reactance X (Ω): the real
 * power is I·(E + I·R + V_b) and V² = (E + I·R + V_b)² + (I·X)², so I²·V² = P² + I⁴·X² and
 * I² = (V² − √(V⁴ − 4·X²·P²)) / (2·X²) (the high-power-factor root); I = P/V on DC or with X = 0.
 * Source: the AC equation above [C].
 */
export function currentFromInputWatts(watts: number, s: Supply, x: number, path = "original.nameplate.input_power"): number {
  requirePositive(watts, "input power", path);
  if (x <= 0) return watts / s.volts;
  const v2 = s.volts * s.volts;
  const disc = v2 * v2 - 4 * x * x * watts * watts;
  if (disc < 0) {
    throw inputError(
      "inconsistent_tests",
      path,
      `${fmt(watts)} W cannot be drawn at ${fmt(s.volts)} V through the reactance ${fmt(x)} Ω (at most ${fmt(v2 / (2 * x))} W); check the watts and the inductance`,
    );
  }
  return Math.sqrt((v2 - Math.sqrt(disc)) / (2 * x * x));
}

/**
 * The circuit inductance L_a + L_f (H) from a locked-rotor AC reading (V, I at f Hz, resistance R Ω
 * at the reading's temperature): X = √(V² − (I·R + V_b)²)/I, L = X/(2πf) [C]. A reading that the
 * resistances alone would exceed contradicts them: `inconsistent_tests`.
 */
export function fitInductanceFromLockedRotor(
  reading: { volts: number; current: number; frequency: number },
  resistance: number,
  brushDrop: number,
  path = "field_winding.locked_rotor",
): number {
  requirePositive(reading.current, "locked-rotor current", `${path}.current`);
  requirePositive(reading.frequency, "frequency", `${path}.frequency`);
  const drop = reading.current * resistance + brushDrop;
  if (!(reading.volts > drop)) {
    throw inputError(
      "inconsistent_tests",
      path,
      `${fmt(reading.current)} A at ${fmt(reading.volts)} V is more than the resistances allow: ${fmt(reading.current)} A × ${fmt(resistance)} Ω ` +
        `+ ${fmt(brushDrop)} V brush drop = ${fmt(drop)} V; check the reading and the field and armature resistances`,
    );
  }
  return Math.sqrt(reading.volts ** 2 - drop ** 2) / reading.current / (2 * Math.PI * reading.frequency);
}

/**
 * Split of a measured circuit inductance `sum` (H) between armature and field. Given one part, the
 * other is the rest; given neither, half each (armwind's own assumption, no published source: the
 * plan states it, and only the armature's share scales with a rewind).
 */
export function splitInductance(sum: number, armature?: number, field?: number): { la: number; lf: number; basis: string } {
  requireNonNegative(sum, "inductance", "field_winding.locked_rotor");
  if (armature !== undefined) {
    return {
      la: Math.min(armature, sum),
      lf: Math.max(0, sum - armature),
      basis: `armature ${fmt(armature * 1e3)} mH as given, field the rest of ${fmt(sum * 1e3)} mH`,
    };
  }
  if (field !== undefined) {
    return {
      la: Math.max(0, sum - field),
      lf: Math.min(field, sum),
      basis: `field ${fmt(field * 1e3)} mH as given, armature the rest of ${fmt(sum * 1e3)} mH`,
    };
  }
  return { la: sum / 2, lf: sum / 2, basis: `split assumed half armature, half field of the ${fmt(sum * 1e3)} mH measured (no published source)` };
}

/** A running reading as the job gives it: the current, or (nameplate) the input watts instead. */
export interface SeriesReadingInput extends Omit<SeriesReading, "current" | "torque"> {
  current: number | null;
  /** Input watts (nameplate), used when `current` is null. */
  inputW?: number;
  /** Shaft torque, N·m (0: no-load), or null. */
  torque: number | null;
  /** Shaft output, W, instead of the torque (load test). */
  outputW?: number;
  /** The reading names the rated point (nameplate, or a load test when there is no nameplate). */
  rated?: boolean;
}

export interface SeriesInputs {
  /** Circuit inductance parts, H, when given. */
  la?: number;
  lf?: number;
  /** Locked-rotor reading: AC (frequency) gives L_a + L_f; resistance R_a + R_f at its temperature, Ω. */
  lockedRotor?: { volts: number; current: number; frequency: number | null; resistance: number; path: string };
  brushDrop: number;
  readings: SeriesReadingInput[];
}

export interface SeriesCalibration {
  mag: Magnetisation;
  loss: SeriesLoss;
  /** False when no reading with a known shaft torque gives the loss torque (taken as zero): efficiencies are then unknown. */
  lossKnown: boolean;
  la: number;
  lf: number;
  /** False when an AC motor has no inductance data: the reactance was taken as zero. */
  inductanceKnown: boolean;
  /** The rated point of the original (supply, current A, speed rad/s, shaft torque N·m), or null with no loaded reading. */
  rated: { supply: Supply; current: number; speed: number; torque: number } | null;
  /** Sentences: how each part was found, and the split of the inductance. */
  basis: string[];
}

/**
 * The circuit inductance parts (H) from what the job gives: both parts, one part, or a locked-rotor
 * AC reading split by `splitInductance`; a DC locked-rotor reading checks the resistances (more than
 * 25 % apart: `inconsistent_tests`). On AC with nothing known, zero and `known: false`.
 */
export function fitSeriesInductance(
  inp: Pick<SeriesInputs, "la" | "lf" | "lockedRotor" | "brushDrop">,
  ac: boolean,
): { la: number; lf: number; known: boolean; basis: string[] } {
  const lr = inp.lockedRotor;
  if (lr && lr.frequency !== null) {
    const sum = fitInductanceFromLockedRotor({ volts: lr.volts, current: lr.current, frequency: lr.frequency }, lr.resistance, inp.brushDrop, lr.path);
    const sp = splitInductance(sum, inp.la, inp.lf);
    return { la: sp.la, lf: sp.lf, known: true, basis: [`inductance ${fmt(sum * 1e3)} mH from the locked-rotor reading; ${sp.basis}`] };
  }
  if (lr) {
    const implied = (lr.volts - inp.brushDrop) / lr.current;
    if (!(implied > 0) || Math.abs(implied - lr.resistance) > 0.25 * lr.resistance) {
      throw inputError(
        "inconsistent_tests",
        lr.path,
        `the DC locked-rotor reading ${fmt(lr.current)} A at ${fmt(lr.volts)} V implies ${fmt(implied)} Ω after the ${fmt(inp.brushDrop)} V brush drop, ` +
          `but armature and field are stated as ${fmt(lr.resistance)} Ω; check the reading and the resistances`,
      );
    }
  }
  if (inp.la !== undefined || inp.lf !== undefined) {
    return { la: inp.la ?? 0, lf: inp.lf ?? 0, known: inp.la !== undefined && inp.lf !== undefined, basis: ["inductances as given"] };
  }
  return { la: 0, lf: 0, known: !ac, basis: ac ? ["no inductance given: the reactance is taken as zero, so AC figures are optimistic"] : [] };
}

/**
 * Calibrate a series motor from what a bench can read (SI; resistances at each reading's
 * temperature): the inductance from the job or a locked-rotor AC reading; ψ at each running reading
 * (`fitFluxLinkage`; a nameplate in input watts gives its current by `currentFromInputWatts`); the
 * magnetisation curve through them (`fitMagnetisation`); the loss torque from the readings with a
 * known torque (`fitSeriesLoss`); and the rated point (the nameplate, else a load test).
 * Returns null magnetisation (`null`) when there is no running reading. Sources: as each fit says.
 */
export function calibrateSeries(inp: SeriesInputs): SeriesCalibration | null {
  requireNonNegative(inp.brushDrop, "brush drop", "winding.brush_drop");
  const ac = inp.readings.some((r) => r.supply.frequency > 0);
  const ind = fitSeriesInductance(inp, ac);
  const L = ind.la + ind.lf;
  const pts: { r: SeriesReading; psi: number; outputW?: number; rated?: boolean }[] = [];
  for (const r of inp.readings) {
    const x = 2 * Math.PI * r.supply.frequency * L;
    const current = r.current ?? currentFromInputWatts(r.inputW ?? NaN, r.supply, x, `${r.path}.input_power`);
    const torque = r.torque ?? (r.outputW !== undefined ? r.outputW / r.speed : null);
    const reading: SeriesReading = { ...r, current, torque };
    pts.push({ r: reading, psi: fitFluxLinkage(reading, L, inp.brushDrop), rated: r.rated });
  }
  if (pts.length === 0) return null;
  const mag = fitMagnetisation(pts.map((p) => ({ current: p.r.current, psi: p.psi })));
  const known = pts.filter((p) => p.r.torque !== null);
  const lf = fitSeriesLoss(known.map((p) => ({ speed: p.r.speed, lossTorque: p.psi * p.r.current - (p.r.torque as number), path: p.r.path })));
  const ratedPt = pts.find((p) => p.rated) ?? pts.find((p) => (p.r.torque ?? 0) > 0);
  let rated: SeriesCalibration["rated"] = null;
  if (ratedPt) {
    const r = ratedPt.r;
    const torque = r.torque ?? ratedPt.psi * r.current - lossTorque(lf.loss, r.speed);
    if (torque > 0) rated = { supply: r.supply, current: r.current, speed: r.speed, torque };
  }
  return {
    mag: mag.mag,
    loss: lf.loss,
    lossKnown: known.length > 0,
    la: ind.la,
    lf: ind.lf,
    inductanceKnown: ind.known,
    rated,
    basis: [mag.basis, lf.basis, ...ind.basis],
  };
}
