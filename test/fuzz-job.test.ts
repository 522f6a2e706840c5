/**
 * Robustness, property-based (fast-check): job files made by mutating the demo jobs and the
 * templates as data (keys dropped, keys misspelt, values of the wrong type, nonsense units,
 * negative, zero and huge numbers, unknown keys, repeated list items), written back as YAML and
 * fed through `loadYaml` and `planJob` (and the plan's text and JSON), in process.
 *
 * The rule for every input: either a plan, or an ArmwindError whose every problem has a
 * snake_case code, a one-line message with no stack trace, and a place: file, line and column
 * for load errors, a field path that the loader can locate for errors the core throws.
 * Anything else thrown is a fault. (Text-level damage to the YAML is in fuzz-text.test.ts.)
 */
import { describe, expect, it } from "vitest";
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { parse, stringify } from "yaml";
import { runJobText } from "./fuzz-support.js";
import { chunks } from "./helpers/chunks.js";

const ROOT = join(import.meta.dirname, "..");
const SEED_FILES = [
  ...readdirSync(join(ROOT, "jobs"))
    .filter((f) => f.endsWith(".yaml"))
    .map((f) => join(ROOT, "jobs", f)),
  ...["tooth", "lap", "wave"].map((s) => join(ROOT, "templates", `${s}.yaml`)),
];
const SEEDS = SEED_FILES.map((f) => parse(readFileSync(f, "utf8")) as unknown);

// ---- mutations of the parsed data ----

type Slot = { parent: Record<string, unknown> | unknown[]; key: string | number };

function slots(x: unknown, out: Slot[] = []): Slot[] {
  if (Array.isArray(x))
    for (const [i, v] of x.entries()) {
      out.push({ parent: x, key: i });
      slots(v, out);
    }
  else if (x !== null && typeof x === "object")
    for (const [k, v] of Object.entries(x)) out.push({ parent: x as Record<string, unknown>, key: k }), slots(v, out);
  return out;
}

const get = (s: Slot) => (s.parent as Record<string | number, unknown>)[s.key];
const set = (s: Slot, v: unknown) => ((s.parent as Record<string | number, unknown>)[s.key] = v);

const weird = fc.oneof(
  fc.constantFrom<unknown>(
    null,
    true,
    false,
    "",
    " ",
    [],
    {},
    "12",
    "-5 mm",
    "1e999 mm",
    ".5",
    "nan",
    ".inf",
    "Infinity",
    "0x10",
    "12 mm mm",
    "~",
    "yes",
    "1,5 mm",
    "½ mm",
    "5 slots",
    "grade 2",
  ),
  fc.double(),
  fc.integer(),
  fc.string({ maxLength: 12 }),
  fc.array(fc.integer(), { maxLength: 3 }),
  fc.dictionary(fc.string({ maxLength: 5 }), fc.oneof(fc.integer(), fc.string({ maxLength: 4 })), { maxKeys: 2 }),
);
const number = fc.oneof(
  fc.constantFrom(0, -0, -1, 1, 2, 3, 1e308, -1e308, 1e-300, 0.5, 2 ** 53, 1e6, 400, 401, 100001),
  fc.double({ noNaN: false }),
  fc.integer({ min: -1000, max: 100000 }),
);
const UNITS = [
  "furlongs",
  "V",
  "mm",
  "rpm",
  "A/mm2",
  "",
  "%",
  "ohm",
  "K",
  "F",
  "mm2",
  "Hz",
  "kg",
  "°",
  "µm",
  "N m",
  "in",
  "AWG",
  "SWG",
  "grade 9",
  "mWb",
  "T",
  "rpm/V",
  "A",
  "mA",
  "m",
  "g",
  "cmil/A",
  "mm mm",
];

type Mutation =
  | { op: "drop"; at: number }
  | { op: "typo"; at: number; pos: number; ch: string; how: "insert" | "delete" | "replace" | "swap" }
  | { op: "type"; at: number; value: unknown }
  | { op: "unit"; at: number; unit: string }
  | { op: "number"; at: number; value: number; keepUnit: boolean }
  | { op: "add"; at: number; key: string; value: unknown }
  | { op: "repeat"; at: number };

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ op: fc.constant("drop" as const), at: fc.nat() }),
  fc.record({
    op: fc.constant("typo" as const),
    at: fc.nat(),
    pos: fc.nat(),
    ch: fc.constantFrom(..."abcdefghijklmnopqrstuvwxyz_-. 0"),
    how: fc.constantFrom("insert" as const, "delete" as const, "replace" as const, "swap" as const),
  }),
  fc.record({ op: fc.constant("type" as const), at: fc.nat(), value: weird }),
  fc.record({ op: fc.constant("unit" as const), at: fc.nat(), unit: fc.constantFrom(...UNITS) }),
  fc.record({ op: fc.constant("number" as const), at: fc.nat(), value: number, keepUnit: fc.boolean() }),
  fc.record({
    op: fc.constant("add" as const),
    at: fc.nat(),
    key: fc.oneof(fc.string({ maxLength: 10 }), fc.constantFrom("span", "kv", "duty", "magnet", "tests", "dead_coil", "$schema", "__proto__", "constructor")),
    value: weird,
  }),
  fc.record({ op: fc.constant("repeat" as const), at: fc.nat() }),
);

function typo(key: string, m: Extract<Mutation, { op: "typo" }>): string {
  const i = m.pos % (key.length + 1);
  switch (m.how) {
    case "insert":
      return key.slice(0, i) + m.ch + key.slice(i);
    case "delete":
      return key.length > 1 ? key.slice(0, i) + key.slice(i + 1) : key + m.ch;
    case "replace":
      return key.slice(0, i) + m.ch + key.slice(i + 1);
    case "swap":
      return i + 1 < key.length ? key.slice(0, i) + key[i + 1] + key[i] + key.slice(i + 2) : m.ch + key;
  }
}

function apply(doc: unknown, m: Mutation): void {
  const all = slots(doc);
  if (all.length === 0) return;
  const s = all[m.at % all.length];
  const v = get(s);
  switch (m.op) {
    case "drop":
      if (Array.isArray(s.parent)) s.parent.splice(s.key as number, 1);
      else delete s.parent[s.key as string];
      return;
    case "typo": {
      if (Array.isArray(s.parent)) return;
      const k = typo(s.key as string, m);
      delete s.parent[s.key as string];
      s.parent[k] = v;
      return;
    }
    case "type":
      set(s, m.value);
      return;
    case "unit": {
      const num = typeof v === "number" ? String(v) : typeof v === "string" ? (/^\s*[-+.\d][\d.eE+-]*/.exec(v)?.[0] ?? v) : "1";
      set(s, `${num}${m.unit ? " " + m.unit : ""}`);
      return;
    }
    case "number": {
      const unit = typeof v === "string" ? v.replace(/^\s*[-+.\d][\d.eE+-]*\s*/, "") : "";
      set(s, m.keepUnit && unit ? `${m.value} ${unit}` : m.value);
      return;
    }
    case "add": {
      const target = v !== null && typeof v === "object" && !Array.isArray(v) ? (v as Record<string, unknown>) : Array.isArray(s.parent) ? undefined : s.parent;
      if (target) Object.defineProperty(target, m.key, { value: m.value, enumerable: true, writable: true, configurable: true });
      return;
    }
    case "repeat":
      if (Array.isArray(v)) v.push(structuredClone(v[0] ?? 1), ...v.slice(0, 3).map((x) => structuredClone(x)));
      else if (Array.isArray(s.parent)) s.parent.push(structuredClone(v));
      return;
  }
}

describe("mutated job files through load and plan", () => {
  it("the seeds themselves plan", () => {
    for (const f of SEED_FILES) expect(runJobText(readFileSync(f, "utf8")).kind, f).toBe("planned");
  });

  // 3500 data mutations in pieces of 250 (test/helpers/chunks.ts), each piece its own seed
  const seen = { planned: 0, load_error: 0, plan_error: 0 };
  for (const c of chunks(3500, 14)) {
    it(`data mutations ${c.part}/${c.parts} (${c.runs}): a plan or located one-line problems, never another exception`, () => {
      fc.assert(
        fc.property(fc.nat(SEEDS.length - 1), fc.array(mutation, { minLength: 1, maxLength: 4 }), (seed, ms) => {
          const doc = structuredClone(SEEDS[seed]);
          for (const m of ms) apply(doc, m);
          seen[runJobText(stringify(doc)).kind]++;
        }),
        { numRuns: c.runs, seed: c.seed },
      );
    });
  }
  it("the 3500 data mutations reached every outcome", () => {
    // the mutations reach every outcome: some still plan, some fail to load, some fail in the core
    expect(seen.planned).toBeGreaterThan(150);
    expect(seen.load_error).toBeGreaterThan(1500);
    expect(seen.plan_error).toBeGreaterThan(0);
  });
});
