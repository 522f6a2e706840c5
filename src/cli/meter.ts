/**
 * The bench meter's resolution for `log`, `diagnose` and `card`: the shell reads the option, the
 * environment and the shop profile, and the bench rules choose (src/bench/rules.ts
 * `meterResolution`: option, environment, measured file, profile, default).
 */
import type { Argv } from "yargs";
import { DEFAULT_METER_RESOLUTION_OHM, METER_RESOLUTION_ENV, meterResolution, type MeterResolution } from "../bench/rules.js";
import { inputError } from "../errors.js";
import { parseQuantity } from "../job/units.js";
import { loadShop } from "./shop.js";
import type { Io } from "./io.js";

/** A resolution as written ("0.001 ohm", "1 mohm", a bare number in Ω), Ω; `where` names it in the message. */
export function parseResolution(text: string, where: string): number {
  const r = parseQuantity(text, "resistance");
  if (!r.ok || !(r.value > 0))
    throw inputError(
      "bad_quantity",
      where === "--resolution" ? "resolution" : where,
      `${where === "--resolution" ? "--resolution" : `$${where}=`}${where === "--resolution" ? " " : ""}${text}: ${r.ok ? "must be greater than 0" : r.message} (the meter's last digit on its lowest range, e.g. 0.001 ohm)`,
    );
  return r.value;
}

/** The meter's resolution for this run: `option` (the command's --resolution), $ARMWIND_METER_RESOLUTION, the measured file's (Ω), the shop profile's, the default. */
export function resolveMeter(io: Io, option: string | undefined, measured?: number | null): MeterResolution {
  const env = io.env[METER_RESOLUTION_ENV];
  return meterResolution({
    option: option === undefined ? undefined : parseResolution(option, "--resolution"),
    environment: env === undefined || env.trim() === "" ? undefined : parseResolution(env.trim(), METER_RESOLUTION_ENV),
    measured,
    profile: loadShop(io)?.shop.meter_resolution,
  });
}

/** The --resolution option, worded for a command that also reads a measured file (`file`) or not. */
export function withResolution<T>(y: Argv<T>, file: boolean) {
  return y.option("resolution", {
    type: "string",
    describe: `the bench meter's resolution, e.g. "0.001 ohm" (default: $${METER_RESOLUTION_ENV}, else ${file ? "the measured file's, else " : ""}the shop profile's meter_resolution, else ${DEFAULT_METER_RESOLUTION_OHM} ohm)`,
  });
}
