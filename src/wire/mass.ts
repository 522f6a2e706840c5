/**
 * Mass of enamelled wire as it comes off the spool: copper plus its enamel film.
 * Copper: IEC 60028 density (copper.ts). Enamel: the film's cross-section π/4·(overall² − bare²)
 * at 1.3 g/cm³, the usual density of polyurethane, polyester-imide and polyamide-imide magnet-wire
 * enamels (from memory, within about ±10 %); the film is a few per cent of a fine wire's mass.
 */
import type { Wire } from "./types.js";

/** Density of a magnet-wire enamel film, kg/m³ (from memory, see the module comment). */
export const ENAMEL_DENSITY = 1300;

/** Mass per metre of one strand, copper and enamel, kg/m; copper alone where the overall diameter is not known. */
export function enamelledKgPerMetre(w: Wire): number {
  const d = w.overall_diameter;
  const film = d !== null && d > w.bare_diameter ? (Math.PI / 4) * (d * d - w.bare_diameter * w.bare_diameter) * ENAMEL_DENSITY : 0;
  return w.kg_per_m + film;
}
