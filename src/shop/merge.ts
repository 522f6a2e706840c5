/**
 * What a shop profile gives a job and a command: pure functions, no files (the CLI shell finds and
 * reads the profile). docs/contracts.md's order for every setting: the command-line option, the
 * environment variable, the job, the profile, the built-in default; `limits` merge key by key;
 * a job's `wire_stock` replaces the shelf.
 */
import type { Shop, ShopInput } from "./schema.js";
import type { Plan } from "../design/types.js";
import type { Warning } from "../errors.js";
import { resolveWire } from "../wire/catalogue.js";
import { parseWireSpec } from "../wire/parse.js";
import { enamelledKgPerMetre } from "../wire/mass.js";

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === "object" && v !== null && !Array.isArray(v);

/**
 * The job as written, with the profile's defaults filled in where the job is silent: the shelf as
 * `wire_stock`, `target.limits` key by key, `target.hot_temperature`. Returns a new object; the
 * job's own values always win. `raw` is the job file's YAML as plain data, before validation.
 */
export function mergeShopIntoJob(raw: Obj, shop: ShopInput | undefined): Obj {
  if (!shop) return raw;
  const out: Obj = { ...raw };
  if (out.wire_stock === undefined && shop.wire_shelf?.length) out.wire_stock = shop.wire_shelf.map((w) => w.wire);
  const d = shop.defaults;
  if (d && isObj(out.target)) {
    const target: Obj = { ...out.target };
    if (d.limits) {
      const own = isObj(target.limits) ? target.limits : {};
      const merged: Obj = {};
      for (const [k, v] of Object.entries(d.limits)) if (v !== undefined) merged[k] = v;
      target.limits = target.limits === undefined || isObj(target.limits) ? { ...merged, ...own } : target.limits;
    }
    if (target.hot_temperature === undefined && d.hot_temperature !== undefined) target.hot_temperature = d.hot_temperature;
    out.target = target;
  }
  return out;
}

/** First of the values that is set: option, environment, job, profile, default (docs/contracts.md's order). */
export function firstSet<T>(...values: (T | undefined | null | "")[]): T | undefined {
  for (const v of values) if (v !== undefined && v !== null && v !== "") return v as T;
  return undefined;
}

/** The shelf's spool for the plan's wire (matched by label), or undefined. */
export function spoolFor(plan: Plan, shop: Shop | undefined): { label: string; spool_mass: number } | undefined {
  for (const w of shop?.wire_shelf ?? []) {
    const r = parseWireSpec(w.wire, "stock");
    if (!r.ok || w.spool_mass === undefined) continue;
    let label: string;
    try {
      label = resolveWire(r.spec).label;
    } catch {
      continue;
    }
    if (label === plan.design.wire.label) return { label, spool_mass: w.spool_mass };
  }
  return undefined;
}

/**
 * Mass of wire to have on the spool for the whole cut, copper plus enamel, kg (all strands: the
 * cut is given for all of them). Copper IEC 60028; enamel wire/mass.ts.
 */
export function spoolMassNeeded(plan: Plan): number {
  return plan.wire.cut * enamelledKgPerMetre(plan.design.wire);
}

/** A warning when the plan needs more wire than the shelf's spool of that wire holds. */
export function spoolWarnings(plan: Plan, shop: Shop | undefined): Warning[] {
  const spool = spoolFor(plan, shop);
  if (!spool) return [];
  const need = spoolMassNeeded(plan);
  if (need <= spool.spool_mass) return [];
  const g = (kg: number) => `${(kg * 1e3).toPrecision(3)} g`;
  return [
    {
      code: "spool_short",
      path: "wire_shelf",
      message: `the cut of ${plan.design.wire.label} weighs about ${g(need)} with its enamel, but the shelf's spool holds ${g(spool.spool_mass)}: get another spool before winding`,
    },
  ];
}
