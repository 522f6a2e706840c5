/**
 * The bench name that logbook record names carry (DESIGN.md "The shop profile"): $ARMWIND_BENCH,
 * else the shop profile's `bench`, else a short random tag made once and kept in the user's own
 * configuration folder ($XDG_CONFIG_HOME/armwind, %APPDATA%\armwind, else ~/.config/armwind) —
 * never in the logbook, which benches may share — so folders written on several benches merge by
 * git or a sync service with no collision.
 */
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { homedir } from "node:os";
import { join } from "node:path";
import { randomBytes } from "node:crypto";
import { ArmwindError } from "../errors.js";
import { BENCH_NAME } from "../logbook/store.js";
import type { Io } from "./io.js";
import { loadShop } from "./shop.js";

/** The user's configuration folder for armwind. */
export function configDir(io: Io): string {
  const base = io.env.XDG_CONFIG_HOME || (process.platform === "win32" ? io.env.APPDATA : undefined) || join(io.env.HOME || homedir(), ".config");
  return join(base, "armwind");
}

/** The bench name for record names. */
export function benchName(io: Io): string {
  const given = io.env.ARMWIND_BENCH;
  if (given) {
    if (!BENCH_NAME.test(given))
      throw new ArmwindError({
        code: "bad_bench",
        path: "",
        message: `ARMWIND_BENCH="${given}": a bench name is letters, digits, _ and - (at most 32), e.g. bench-2`,
      });
    return given;
  }
  const fromShop = loadShop(io)?.shop.bench;
  if (fromShop) return fromShop;
  return benchTag(configDir(io));
}

/** The random tag kept in `dir/bench-tag` (made on first use, exclusively, so two first runs agree). */
export function benchTag(dir: string): string {
  const file = join(dir, "bench-tag");
  const read = (): string | undefined => {
    try {
      const t = readFileSync(file, "utf8").trim();
      return BENCH_NAME.test(t) ? t : undefined;
    } catch {
      return undefined;
    }
  };
  const have = read();
  if (have) return have;
  const tag = `b${randomBytes(3).toString("hex")}`;
  try {
    mkdirSync(dir, { recursive: true });
    writeFileSync(file, `${tag}\n`, { flag: "wx" });
    return tag;
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === "EEXIST") return read() ?? tag;
    // no configuration folder to keep it in: still a tag for this record, and say nothing of it
    return tag;
  }
}
