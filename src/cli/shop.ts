/**
 * Finding and reading the shop profile (the shell's part; what it gives a job is src/shop/merge.ts).
 * docs/contracts.md: `--shop FILE`, else $ARMWIND_SHOP, else armwind.yaml in the working folder or the
 * nearest parent. A profile with problems stops the command with them, located in the profile.
 */
import { existsSync, statSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { loadYaml } from "../job/load.js";
import { shopSchema, type Shop, type ShopInput } from "../shop/schema.js";
import { readText, type Io } from "./io.js";

export const SHOP_FILE = "armwind.yaml";

export interface LoadedShop {
  shop: Shop;
  /** The profile as written (for merging into a job before it is validated). */
  raw: ShopInput;
  file: string;
}

/** The profile file to use, or undefined: --shop, else $ARMWIND_SHOP, else armwind.yaml here or in the nearest parent. */
export function findShopFile(io: Io): string | undefined {
  const given = io.shop ?? io.env.ARMWIND_SHOP;
  if (given) return resolve(io.cwd, given);
  for (let dir = resolve(io.cwd); ; ) {
    const f = join(dir, SHOP_FILE);
    if (existsSync(f) && isFile(f)) return f;
    const up = dirname(dir);
    if (up === dir) return undefined;
    dir = up;
  }
}

function isFile(p: string): boolean {
  try {
    return statSync(p).isFile();
  } catch {
    return false;
  }
}

const cache = new WeakMap<Io, LoadedShop | null>();

/** The shop profile for this run, read and validated once; undefined when there is none. */
export function loadShop(io: Io): LoadedShop | undefined {
  const hit = cache.get(io);
  if (hit !== undefined) return hit ?? undefined;
  const file = findShopFile(io);
  let out: LoadedShop | null = null;
  if (file) {
    const r = loadYaml(readText(io, file, "shop"), file, shopSchema);
    out = { shop: r.value, raw: r.raw as ShopInput, file };
  }
  cache.set(io, out);
  return out ?? undefined;
}

/** The profile's logbook folder, resolved against the profile's own folder. */
export function shopLogbook(io: Io): string | undefined {
  const s = loadShop(io);
  return s?.shop.logbook ? resolve(dirname(s.file), s.shop.logbook) : undefined;
}
