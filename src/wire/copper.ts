/**
 * Annealed copper, the International Annealed Copper Standard as IEC 60028 gives it:
 * resistivity 1/58 Ω·mm²/m at 20 °C, temperature coefficient of resistance 0.00393 /K at 20 °C,
 * density 8.89 g/cm³.
 */

/** Resistivity of annealed copper at 20 °C, Ω·m (IEC 60028: 1/58 Ω·mm²/m). */
export const COPPER_RESISTIVITY_20 = 1e-6 / 58;
/** Temperature coefficient of resistance at 20 °C, 1/K (IEC 60028). */
export const COPPER_ALPHA_20 = 0.00393;
/** Density, kg/m³ (IEC 60028: 8.89 g/cm³). */
export const COPPER_DENSITY = 8890;

/** Resistivity at temperature t (°C), Ω·m: ρ(t) = ρ20 · (1 + α20 · (t − 20)) (IEC 60028). */
export function copperResistivity(tC: number): number {
  return COPPER_RESISTIVITY_20 * (1 + COPPER_ALPHA_20 * (tC - 20));
}

/** Ratio R(t)/R(20 °C) of a copper conductor (IEC 60028). */
export function copperFactor(tC: number): number {
  return 1 + COPPER_ALPHA_20 * (tC - 20);
}

/** Correct a resistance read at t (°C) to 20 °C (IEC 60028). Ω → Ω. */
export function to20C(ohm: number, tC: number): number {
  return ohm / copperFactor(tC);
}

/** Resistance at t (°C) of a conductor that measures `ohm20` at 20 °C (IEC 60028). Ω → Ω. */
export function atTemperature(ohm20: number, tC: number): number {
  return ohm20 * copperFactor(tC);
}

/** Cross-section of a round conductor of diameter d (m), m². */
export function roundArea(d: number): number {
  return (Math.PI / 4) * d * d;
}

/** Resistance per metre at 20 °C of a round copper conductor of diameter d (m), Ω/m. */
export function ohmPerMetre(d: number): number {
  return COPPER_RESISTIVITY_20 / roundArea(d);
}

/** Mass per metre of a round copper conductor of diameter d (m), kg/m. */
export function kgPerMetre(d: number): number {
  return COPPER_DENSITY * roundArea(d);
}
