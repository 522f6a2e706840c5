/**
 * Steady state of a brushed DC motor with a constant field (permanent magnet, or a shunt field
 * at constant field current), all SI: V, A, Ω, rad/s, N·m, W.
 *
 *     V = Ke·ω + I·R + V_b              (armature circuit)
 *     T_shaft = Kt·I − T_f(ω),  T_f(ω) = T_c + B·ω   (torque balance, Kt = Ke)
 *     I_f = V/R_f                       (a shunt field across the supply; 0 without one)
 *     efficiency = T_shaft·ω / (V·(I + I_f))
 *
 * I is the armature's current (through the brushes); the terminals carry I + I_f, and the input
 * power is V·(I + I_f): the field's copper loss V·I_f = V²/R_f is one of the losses. Source for the
 * shunt motor's power flow: the shunt DC motor of any electrical-machines textbook (I_L = I_A + I_F,
 * P_in = V_T·I_L, the field's copper loss among the electrical losses, η = P_out/P_in; e.g. S. J.
 * Chapman, Electric Machinery Fundamentals, 4th ed. (2005), ch. 9 "DC motor power flow and losses",
 * from memory).
 *
 * Source: the standard linear model of the permanent-magnet / separately excited DC motor (any
 * electrical-machines textbook), with the brush drop V_b taken as a constant voltage (machine
 * textbooks) and the no-load losses as Coulomb plus viscous friction. Everything here is linear,
 * so every point has a closed form; `peakEfficiency` and `maxOutput` are derived below.
 *
 * A series or universal motor has no constant field: Ke changes with current and there is no
 * safe no-load speed. For `field: "series"` only what the armature alone determines (Ke scaled by
 * turns, resistance) is summarized; the operating-point functions refuse it.
 */
import { inputError, type Warning } from "../errors.js";
import { fmt, requireNonNegative, requirePositive, rpm } from "./check.js";
import { keScaledByTurns, kvFromKe } from "./emf.js";

export type FieldKind = "constant" | "series";

/** No-load loss torque T_f(ω) = tc + b·ω: tc in N·m (Coulomb), b in N·m·s/rad (viscous). */
export interface LossTorque {
  tc: number;
  b: number;
}

export interface MotorModel {
  /** Ke in V·s/rad (= Kt in N·m/A). */
  ke: number;
  /** Terminal resistance of the armature, Ω, at the temperature of use (hot for stall and duty). */
  resistance: number;
  /** Total brush drop, V. */
  brushDrop: number;
  loss: LossTorque;
  field: FieldKind;
  /**
   * A shunt field across the supply: its resistance at the temperature of use, Ω; absent or null
   * for none (permanent magnet, series). Its current V/R_f adds to the terminal current and its
   * copper loss to the losses; it does not change the armature's figures (the field is constant).
   */
  fieldOhm?: number | null;
}

/** One steady operating point. */
export interface OperatingPoint {
  /** Shaft torque, N·m. */
  torque: number;
  /** Speed, rad/s. */
  speed: number;
  /** Armature current (through the brushes), A; the terminals carry a shunt field's current besides. */
  current: number;
  /** Electrical input at the terminals V·(I + I_f), W (I_f a shunt field's current, else 0). */
  inputW: number;
  /** Shaft output torque·speed, W. */
  outputW: number;
  /** outputW / inputW, 0 … 1 (0 when no current flows). */
  efficiency: number;
}

/** Check a model's numbers; throws `invalid_value` for impossible ones. */
export function checkModel(model: MotorModel): MotorModel {
  requirePositive(model.ke, "Ke", "motor.ke");
  requirePositive(model.resistance, "terminal resistance", "motor.resistance");
  requireNonNegative(model.brushDrop, "brush drop", "winding.brush_drop");
  requireNonNegative(model.loss.tc, "Coulomb loss torque", "motor.loss.tc");
  requireNonNegative(model.loss.b, "viscous loss coefficient", "motor.loss.b");
  if (model.fieldOhm !== undefined && model.fieldOhm !== null) requirePositive(model.fieldOhm, "shunt field resistance", "field_winding.resistance");
  return model;
}

function constantField(model: MotorModel, V: number): number {
  checkModel(model);
  if (model.field === "series") {
    throw inputError(
      "series_field",
      "armature.field",
      "a series (universal) motor has no constant field, so no operating point is computed from the armature alone; " + "never run it unloaded",
    );
  }
  requireNonNegative(V, "supply voltage", "target.supply");
  // Below the brush drop no current flows.
  return Math.max(0, V - model.brushDrop);
}

/**
 * The current a shunt field of resistance `fieldOhm` (Ω, at the temperature of use) takes across
 * supply V (V): I_f = V/R_f A (Ohm's law); 0 without one (null or absent). The one place it is worked out.
 */
export function fieldCurrent(fieldOhm: number | null | undefined, V: number): number {
  return fieldOhm ? V / fieldOhm : 0;
}

/** An operating point at supply V: the input at the terminals V·(I + I_f) (module note). */
function point(model: MotorModel, V: number, torque: number, speed: number, current: number): OperatingPoint {
  const inputW = V * (current + fieldCurrent(model.fieldOhm, V));
  const outputW = torque * speed;
  const efficiency = inputW > 0 ? outputW / inputW : 0;
  return { torque, speed, current, inputW, outputW, efficiency };
}

/**
 * No-load point at supply V (V): ω0 with Kt·I = T_f(ω0) and V = Ke·ω0 + I·R + V_b.
 * Closed form: ω0 = (Ke·(V − V_b) − T_c·R) / (Ke² + B·R) rad/s, I0 = (V − V_b − Ke·ω0)/R A, the
 * armature's; `terminalCurrent` I0 + I_f A is what a meter at the terminals reads (a shunt field's
 * V/R_f besides). When the loss torque exceeds the stall torque the rotor does not turn: speed 0,
 * the stall current flows, `starts: false`. Source: the linear model above, solved.
 */
export function noLoad(model: MotorModel, V: number): { speed: number; current: number; terminalCurrent: number; starts: boolean } {
  const Vd = constantField(model, V);
  const { ke, resistance: R } = model;
  const { tc, b } = model.loss;
  const If = fieldCurrent(model.fieldOhm, V);
  const w0 = (ke * Vd - tc * R) / (ke * ke + b * R);
  if (!(w0 > 0)) return { speed: 0, current: Vd / R, terminalCurrent: Vd / R + If, starts: false };
  // I0 = T_f(ω0)/Kt, equal to (V − V_b − Ke·ω0)/R at ω0 but free of its cancellation (never −1e-14 A with no loss)
  const current = (tc + b * w0) / ke;
  return { speed: w0, current, terminalCurrent: current + If, starts: true };
}

/**
 * Stall at supply V (V): current (V − V_b)/R A, torque Kt·I − T_c N·m (never below 0).
 * Source: the linear model at ω = 0.
 */
export function stall(model: MotorModel, V: number): { current: number; torque: number } {
  constantField(model, V);
  const current = stallCurrent(model.resistance, model.brushDrop, V);
  return { current, torque: Math.max(0, model.ke * current - model.loss.tc) };
}

/**
 * Stall current (A) through resistance `resistance` (Ω) at supply V (V) with brush drop V_b (V):
 * (V − V_b)/R, 0 below the brush drop. Needs no field model: the rotor is still, so no back-EMF.
 * Source: the armature equation at ω = 0.
 */
export function stallCurrent(resistance: number, brushDrop: number, V: number): number {
  return Math.max(0, V - brushDrop) / resistance;
}

/**
 * Operating point at shaft torque `torque` (N·m, 0 … stall torque) and supply V (V).
 * Closed form: I = (Ke·(T + T_c) + B·(V − V_b)) / (Ke² + B·R) A, ω = (V − V_b − I·R)/Ke rad/s.
 * A torque beyond stall throws `beyond_stall` naming both torques (at `path`).
 * Source: the linear model above, solved.
 */
export function atTorque(model: MotorModel, V: number, torque: number, path = "target.duty.torque"): OperatingPoint {
  requireNonNegative(torque, "load torque", path);
  const p = pointAtTorque(model, V, torque);
  if (p === null) {
    const st = stall(model, V);
    throw inputError(
      "beyond_stall",
      path,
      `load torque ${fmt(torque)} N·m is beyond the stall torque ${fmt(st.torque)} N·m at ${fmt(V)} V ` +
        `(stall current ${fmt(st.current)} A); choose a torque below ${fmt(st.torque)} N·m or a higher supply`,
    );
  }
  return p;
}

/**
 * The operating point at shaft torque `torque` (N·m) and supply V (V), as `atTorque`, or null when
 * the torque is beyond stall (the sweep asks for many windings and needs no message).
 * Closed form: I = (Ke·(T + T_c) + B·(V − V_b)) / (Ke² + B·R) A, ω = (V − V_b − I·R)/Ke rad/s.
 */
export function pointAtTorque(model: MotorModel, V: number, torque: number): OperatingPoint | null {
  const Vd = constantField(model, V);
  const { ke, resistance: R } = model;
  const { tc, b } = model.loss;
  const current = (ke * (torque + tc) + b * Vd) / (ke * ke + b * R);
  let speed = (Vd - current * R) / ke;
  const scale = Vd / ke;
  if (speed < 0 && speed > -1e-9 * scale) speed = 0;
  if (speed < 0 || ke * stallCurrent(R, model.brushDrop, V) - tc <= 0) return null;
  return point(model, V, torque, speed, current);
}

/**
 * Operating point at speed `speed` (rad/s, 0 … no-load speed) and supply V (V):
 * I = (V − V_b − Ke·ω)/R A, T = Kt·I − T_c − B·ω N·m. A speed outside 0 … no-load throws
 * `beyond_no_load` (at `path`). Source: the linear model above.
 */
export function atSpeed(model: MotorModel, V: number, speed: number, path = "target.duty.speed"): OperatingPoint {
  const Vd = constantField(model, V);
  requireNonNegative(speed, "speed", path);
  const nl = noLoad(model, V);
  if (speed > nl.speed * (1 + 1e-12)) {
    throw inputError(
      "beyond_no_load",
      path,
      `speed ${fmt(rpm(speed))} rpm is above the no-load speed ${fmt(rpm(nl.speed))} rpm at ${fmt(V)} V; ` + `choose a speed up to ${fmt(rpm(nl.speed))} rpm`,
    );
  }
  const w = Math.min(speed, nl.speed);
  const current = (Vd - model.ke * w) / model.resistance;
  const torque = Math.max(0, model.ke * current - model.loss.tc - model.loss.b * w);
  return point(model, V, torque, w, current);
}

/**
 * `n` points (n ≥ 2) evenly spaced in speed from no load to stall at supply V, each
 * { torque N·m, speed rad/s, current A, efficiency, outputW W, inputW W }. A motor that does not
 * start gives its stall point only. Source: the linear model above.
 */
export function curve(model: MotorModel, V: number, n = 21): OperatingPoint[] {
  constantField(model, V);
  if (!Number.isInteger(n) || n < 2) {
    throw inputError("invalid_value", "", `a curve needs a whole number of points, at least 2, got ${fmt(n)}`);
  }
  const nl = noLoad(model, V);
  if (!nl.starts) return [atSpeed(model, V, 0)];
  const pts: OperatingPoint[] = [];
  for (let i = 0; i < n; i++) pts.push(atSpeed(model, V, nl.speed * (1 - i / (n - 1))));
  return pts;
}

/**
 * Peak efficiency at supply V: { efficiency, current A (the armature's), torque N·m, speed rad/s }.
 * Closed form: with x = I·R and c = I_f·R (a shunt field's current, else 0), output/input =
 * (αx − β)(V' − x) / (Ke·V·(x + c)/R), α = Kt/R + B/Ke, β = T_c + B·V'/Ke, V' = V − V_b;
 * d/dx = 0 gives (x + c)² = (V' + c)(β/α + c). With c = 0, x = √(β·V'/α); with B = 0 too this is
 * the textbook I = √(I0 · I_stall), I0 = T_c/Kt. The field's constant loss V·I_f moves the peak to
 * a larger current, as any constant loss does. Derived here from the linear model; with no loss at
 * all the limit is I → 0, efficiency → V'/V.
 */
export function peakEfficiency(model: MotorModel, V: number): { efficiency: number; current: number; torque: number; speed: number } {
  const Vd = constantField(model, V);
  const { ke, resistance: R } = model;
  const { tc, b } = model.loss;
  const nl = noLoad(model, V);
  if (!nl.starts || Vd <= 0) return { efficiency: 0, current: nl.current, torque: 0, speed: 0 };
  const alpha = ke / R + b / ke;
  const beta = tc + (b * Vd) / ke;
  const c = fieldCurrent(model.fieldOhm, V) * R;
  if (beta === 0 && c === 0) return { efficiency: V > 0 ? Vd / V : 0, current: 0, torque: 0, speed: Vd / ke };
  // c = 0 in the form that has always been used, so a permanent-magnet motor's figures keep every digit
  const x = c === 0 ? Math.sqrt((beta * Vd) / alpha) : Math.sqrt((Vd + c) * (beta / alpha + c)) - c;
  const current = x / R;
  const speed = (Vd - x) / ke;
  const p = atSpeed(model, V, speed);
  return { efficiency: p.efficiency, current, torque: p.torque, speed };
}

/**
 * Maximum shaft output at supply V: { power W, torque N·m, speed rad/s }.
 * Output P(ω) = (a − c·ω)·ω with a = Kt·V'/R − T_c and c = Kt·Ke/R + B, a parabola: the peak is at
 * ω = a/(2c) (half the no-load speed), torque a/2, power a²/(4c). With no loss, half the stall
 * torque at half the no-load speed (textbook result). Derived from the linear model.
 */
export function maxOutput(model: MotorModel, V: number): { power: number; torque: number; speed: number } {
  const Vd = constantField(model, V);
  const { ke, resistance: R } = model;
  const a = (ke * Vd) / R - model.loss.tc;
  const c = (ke * ke) / R + model.loss.b;
  if (!(a > 0)) return { power: 0, torque: 0, speed: 0 };
  return { power: (a * a) / (4 * c), torque: a / 2, speed: a / (2 * c) };
}

export interface MotorSummary {
  /** V·s/rad. */
  ke: number;
  /** N·m/A (= ke). */
  kt: number;
  /** rpm/V, the motor constant 60/(2π·Ke). */
  kv: number;
  /**
   * The predicted no-load speed divided by the supply, rad/s per V: what a tachometer on a bench
   * supply gives (below 1/Ke by the resistive and brush drops and the loss current); null for a
   * series motor (docs "Kv").
   */
  noLoadPerVolt: number | null;
  /** Ω, terminal, at the temperature of use. */
  resistance: number;
  /** rad/s. */
  noLoadSpeed: number | null;
  /** At the terminals, A: the armature's and a shunt field's (what the meter on the supply reads). */
  noLoadCurrent: number | null;
  /** The armature's (through the brushes and the winding), A; a shunt field's current is not in it. */
  stallCurrent: number | null;
  /** N·m. */
  stallTorque: number | null;
  /** Fraction 0 … 1: shaft output over the input at the terminals (a shunt field's loss included). */
  peakEfficiency: number | null;
  /** The armature's current there, A. */
  peakEfficiencyCurrent: number | null;
  /** W. */
  maxOutputW: number | null;
  warnings: Warning[];
}

/**
 * The summary of a motor of which nothing is known but Ke (V·s/rad; null when nothing calibrates
 * it: Ke, Kt and Kv are then NaN) and the terminal resistance (Ω): every figure that needs more
 * (a constant field, the losses, a series field the job does not describe) is null, never a guess
 * (docs/contracts.md "Unknown is null"). The one place such a summary is made.
 */
export function unknownSummary(ke: number | null, resistance: number, warnings: Warning[] = []): MotorSummary {
  return {
    ke: ke ?? NaN,
    kt: ke ?? NaN,
    kv: ke ? kvFromKe(ke) : NaN,
    noLoadPerVolt: null,
    resistance,
    noLoadSpeed: null,
    noLoadCurrent: null,
    stallCurrent: null,
    stallTorque: null,
    peakEfficiency: null,
    peakEfficiencyCurrent: null,
    maxOutputW: null,
    warnings,
  };
}

/**
 * The headline figures at supply V, SI. For `field: "series"` every figure that needs a constant
 * field is null (the stall current too: the field winding's resistance is not in the armature
 * model) and a warning says never to run the motor unloaded. Source: the functions above.
 */
export function summarize(model: MotorModel, V: number): MotorSummary {
  checkModel(model);
  requireNonNegative(V, "supply voltage", "target.supply");
  if (model.field === "series") {
    return unknownSummary(model.ke, model.resistance, [
      {
        code: "series_field",
        path: "armature.field",
        message:
          "series (universal) motor: no constant field, so only the armature figures (Ke scaled by turns, resistance) " +
          "are given; never run a series motor unloaded, it races until it bursts",
      },
    ]);
  }
  const nl = noLoad(model, V);
  const st = stall(model, V);
  const pe = peakEfficiency(model, V);
  const mo = maxOutput(model, V);
  const warnings: Warning[] = [];
  if (!nl.starts) {
    warnings.push({
      code: "does_not_start",
      path: "target.supply",
      message:
        `at ${fmt(V)} V the stall torque ${fmt(model.ke * st.current)} N·m does not overcome the loss torque ` +
        `${fmt(model.loss.tc)} N·m: the motor would not start`,
    });
  }
  return {
    ke: model.ke,
    kt: model.ke,
    kv: kvFromKe(model.ke),
    resistance: model.resistance,
    noLoadPerVolt: V > 0 ? nl.speed / V : null,
    noLoadSpeed: nl.speed,
    noLoadCurrent: nl.terminalCurrent,
    stallCurrent: st.current,
    stallTorque: st.torque,
    peakEfficiency: pe.efficiency,
    peakEfficiencyCurrent: pe.current,
    maxOutputW: mo.power,
    warnings,
  };
}

/**
 * The model of a rewind with `nNew` turns per coil (same layout) and terminal resistance
 * `resistance` (Ω, at the temperature of use): Ke scales with turns (EMF equation), the loss
 * torque stays (friction and iron loss belong to the machine, not the winding, so the new
 * no-load current is T_f(ω_new)/Kt_new as docs/contracts.md says), brush drop and field stay.
 */
export function rescaleForTurns(model: MotorModel, nOrig: number, nNew: number, resistance: number): MotorModel {
  checkModel(model);
  requirePositive(resistance, "terminal resistance", "resistance.terminal_ohm");
  return { ...model, ke: keScaledByTurns(model.ke, nOrig, nNew), resistance, loss: { ...model.loss } };
}
