/**
 * Motor constants from the EMF equation of the DC machine, and the conversions between them.
 *
 * EMF equation (any machine-design textbook, e.g. the DC-generator chapter of B. L. Theraja,
 * "A Textbook of Electrical Technology" Vol. II, from memory):
 *
 *     E = (P · Z · Φ / (2π · a)) · ω
 *
 * P field poles, Z active conductors (2 · turns per coil · coils), Φ flux per pole (Wb),
 * a parallel paths (lap: a = P, wave: a = 2, tooth: 2), ω in rad/s. So the motor constant
 * Ke = E/ω in V·s/rad, which equals the torque constant Kt in N·m/A (power balance E·I = T·ω).
 */
import { requirePositive } from "./check.js";
import { fromRpm, toRpm } from "../format/units.js";

export interface EmfInputs {
  /** Field poles P (2, 4, 6 …). */
  poles: number;
  /** Active conductors Z = 2 · turns per coil · coils. */
  conductors: number;
  /** Parallel paths a between the brushes. */
  paths: number;
  /** Flux per pole Φ, Wb. */
  fluxPerPole: number;
  /** Pitch factor k_p (1 for full pitch); see `pitchFactor`. Default 1. */
  pitchFactor?: number;
}

/**
 * Ke = Kt = k_p · P · Z · Φ / (2π · a), V·s/rad (= N·m/A).
 * Source: EMF equation of the DC machine, any machine-design textbook; the pitch factor k_p
 * reduces it for coils spanning less than a pole pitch (see `pitchFactor`).
 */
export function keFromEmfEquation(inputs: EmfInputs): number {
  const { poles, conductors, paths, fluxPerPole } = inputs;
  const kp = inputs.pitchFactor ?? 1;
  requirePositive(poles, "field poles", "armature.field_poles");
  requirePositive(conductors, "active conductors", "winding");
  requirePositive(paths, "parallel paths", "winding");
  requirePositive(fluxPerPole, "flux per pole", "armature.magnet.flux_per_pole");
  requirePositive(kp, "pitch factor", "winding.span");
  return (kp * poles * conductors * fluxPerPole) / (2 * Math.PI * paths);
}

/**
 * Active conductors Z = 2 · N · C (each turn has two active sides), dimensionless.
 * Source: definition used with the EMF equation (any machine-design textbook).
 */
export function activeConductors(turnsPerCoil: number, coils: number): number {
  requirePositive(turnsPerCoil, "turns per coil", "original.turns");
  requirePositive(coils, "coils", "armature.bars");
  return 2 * turnsPerCoil * coils;
}

/**
 * Pitch factor of a coil spanning `spanSlots` slots on an armature of `slots` slots in a field
 * of `poles` poles: k_p = sin(θ_e / 2), θ_e = span · 2π/slots · P/2 the electrical span angle.
 * ASSUMES A SINUSOIDAL AIR-GAP FIELD (the fundamental only). A flat field over the whole pole arc
 * gives less, not more: a coil spanning σ links at most σ/π of a full-pitch coil's flux swing, and
 * σ/π lies below sin(σ/2) for 0 < σ < π (3 slots: 0.667 against 0.866); a real magnet's field,
 * between the two, lies between them. Full pitch (span = slots/P) → 1;
 * one-tooth coils on 2 poles: 3 slots 0.866, 5 slots 0.588, 7 slots 0.434.
 * Source: distribution of the coil EMF over its two sides (textbook pitch or chording factor
 * of AC windings, applied to the DC armature coil); dimensionless.
 */
export function pitchFactor(spanSlots: number, slots: number, poles: number): number {
  requirePositive(spanSlots, "coil span", "winding.span");
  requirePositive(slots, "slots", "armature.slots");
  requirePositive(poles, "field poles", "armature.field_poles");
  const electricalSpan = (spanSlots * 2 * Math.PI * poles) / (2 * slots);
  return Math.abs(Math.sin(electricalSpan / 2));
}

/**
 * Flux per pole from the air-gap flux density: Φ = B · pole_arc · (π D / P) · L, Wb.
 * B in T, poleArc the fraction of the pole pitch the magnet covers (0 … 1), D rotor diameter (m),
 * L stack length (m), P poles. Assumes a uniform gap flux density under the pole arc, no fringing.
 * Source: flux = density × area of the pole face (any machine-design textbook).
 */
export function fluxFromGap(gapFluxDensity: number, poleArc: number, rotorDiameter: number, stackLength: number, poles: number): number {
  requirePositive(gapFluxDensity, "gap flux density", "armature.magnet.gap_flux_density");
  requirePositive(poleArc, "pole arc", "armature.magnet.pole_arc");
  requirePositive(rotorDiameter, "rotor diameter", "armature.rotor_diameter");
  requirePositive(stackLength, "stack length", "armature.stack_length");
  requirePositive(poles, "field poles", "armature.field_poles");
  return gapFluxDensity * poleArc * ((Math.PI * rotorDiameter) / poles) * stackLength;
}

/**
 * Kv in rpm/V from Ke in V·s/rad: Kv = 60 / (2π · Ke). This is the motor constant; the no-load
 * speed per supply volt is lower by the resistive and brush drops and the loss current.
 * Source: unit conversion (1 rpm = 2π/60 rad/s).
 */
export function kvFromKe(ke: number): number {
  requirePositive(ke, "Ke", "motor.ke");
  return toRpm(1 / ke);
}

/** Ke in V·s/rad from Kv in rpm/V: Ke = 60 / (2π · Kv). Source: unit conversion. */
export function keFromKv(kv: number): number {
  requirePositive(kv, "Kv", "target.kv");
  return 1 / fromRpm(kv);
}

/**
 * Ke of a rewind with `nNew` turns per coil at the same layout (same slots, bars, span, paths,
 * field): Ke_new = Ke_orig · N_new / N_orig, V·s/rad. Follows from the EMF equation (Z ∝ N).
 */
export function keScaledByTurns(keOrig: number, nOrig: number, nNew: number): number {
  requirePositive(keOrig, "original Ke", "original");
  requirePositive(nOrig, "original turns per coil", "original.turns");
  requirePositive(nNew, "new turns per coil", "design.turns_per_coil");
  return (keOrig * nNew) / nOrig;
}
