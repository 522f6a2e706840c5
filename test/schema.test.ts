/**
 * The job file's JSON Schema (src/job/json-schema.ts): the committed copy is current, it is valid
 * draft 2020-12 for a general-purpose validator (ajv 8, `ajv/dist/2020.js`, strict mode), it
 * accepts every demo job and template and rejects files whose structure is wrong, and its
 * patterns never reject a quantity that armwind itself reads.
 */
import { describe, expect, it } from "vitest";
import { mkdtempSync, readdirSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import Ajv2020Module from "ajv/dist/2020.js";
import { parse } from "yaml";
import fc from "fast-check";
import { jobJsonSchema, jobJsonSchemaText, JOB_SCHEMA_ID, QUANTITY_PATTERN, FRACTION_PATTERN, FIELD_HELP } from "../src/job/json-schema.js";
import { jobSchema } from "../src/job/schema.js";
import { loadYaml } from "../src/job/load.js";
import { parseQuantity, unitNames, type QuantityKind } from "../src/job/units.js";
import { main } from "../src/cli/main.js";
import type { Io } from "../src/cli/io.js";

const ROOT = join(import.meta.dirname, "..");
const COMMITTED = join(ROOT, "templates", "job.schema.json");
const DEMO_JOBS = readdirSync(join(ROOT, "jobs"))
  .filter((f) => f.endsWith(".yaml"))
  .map((f) => join(ROOT, "jobs", f));
const TEMPLATES = ["tooth", "lap", "wave"].map((s) => join(ROOT, "templates", `${s}.yaml`));

// ajv's 2020-12 build: a validator written against the JSON Schema specification, not by us.
// strict mode refuses unknown keywords and malformed schemas; allowUnionTypes permits
// `type: ["number", "string"]`, which the specification allows.
const Ajv2020 = (Ajv2020Module as unknown as { default?: typeof Ajv2020Module }).default ?? Ajv2020Module;
function compile() {
  const ajv = new (Ajv2020 as unknown as new (o: object) => { compile: (s: object) => ValidateFn })({ strict: true, allowUnionTypes: true, allErrors: true });
  return ajv.compile(jobJsonSchema());
}
type ValidateFn = ((d: unknown) => boolean) & { errors?: { instancePath: string; keyword: string; params: Record<string, unknown> }[] | null };

const clone = <T>(x: T): T => structuredClone(x);
const demo = () => parse(readFileSync(DEMO_JOBS[0], "utf8")) as Record<string, Record<string, unknown>>;

function fakeIo(cwd: string): Io & { stdout: string[]; stderr: string[] } {
  const stdout: string[] = [];
  const stderr: string[] = [];
  return { out: (s) => stdout.push(s), err: (s) => stderr.push(s), stdin: () => "", env: {}, cwd, stdout, stderr };
}

describe("templates/job.schema.json", () => {
  it("is the schema generated from the zod schema now", () => {
    const committed = readFileSync(COMMITTED, "utf8");
    const fresh = jobJsonSchemaText();
    if (committed !== fresh) {
      expect.fail("templates/job.schema.json is out of date with src/job/schema.ts; regenerate it with: npm run schema");
    }
    expect(JSON.parse(committed).$id).toBe(JOB_SCHEMA_ID);
  });

  it("armwind schema prints it, and -o writes the same text", async () => {
    const dir = mkdtempSync(join(tmpdir(), "armwind-schema-"));
    const io = fakeIo(dir);
    expect(await main(["schema"], io)).toBe(0);
    expect(io.stdout.join("")).toBe(jobJsonSchemaText());
    const io2 = fakeIo(dir);
    expect(await main(["schema", "-o", "sub/job.schema.json"], io2)).toBe(0);
    expect(readFileSync(join(dir, "sub", "job.schema.json"), "utf8")).toBe(jobJsonSchemaText());
    expect(io2.stdout.join("")).toMatch(/schema written: sub\/job\.schema\.json/);
  });

  it("armwind schema -o into an impossible place: exit 3, one line", async () => {
    const io = fakeIo(ROOT);
    // a path under a regular file cannot be created
    expect(await main(["schema", "-o", join(ROOT, "package.json", "x.json")], io)).toBe(3);
    expect(io.stderr).toHaveLength(1);
    expect(io.stderr[0]).not.toContain("\n");
    expect(io.stderr[0]).toMatch(/\[write_failed\]$/);
  });

  it("has a title, an $id, and a description on every field", () => {
    const s = jobJsonSchema();
    expect(s.$schema).toBe("https://json-schema.org/draft/2020-12/schema");
    expect(s.title).toMatch(/job file/);
    const missing: string[] = [];
    const walk = (n: Record<string, unknown>, path: string) => {
      if (path && typeof n.description !== "string") missing.push(path);
      for (const [k, v] of Object.entries((n.properties ?? {}) as Record<string, Record<string, unknown>>)) walk(v, path ? `${path}.${k}` : k);
      if (n.items) walk(n.items as Record<string, unknown>, `${path}[]`);
    };
    walk(s, "");
    expect(missing).toEqual([]);
    // every key of the help table is a field of the schema (a renamed field would leave its help behind)
    const fields = new Set<string>();
    const collect = (n: Record<string, unknown>, path: string) => {
      if (path) fields.add(path);
      for (const [k, v] of Object.entries((n.properties ?? {}) as Record<string, Record<string, unknown>>)) collect(v, path ? `${path}.${k}` : k);
      if (n.items) collect(n.items as Record<string, unknown>, `${path}[]`);
      for (const b of (n.anyOf ?? []) as Record<string, unknown>[])
        for (const [k, v] of Object.entries((b.properties ?? {}) as Record<string, Record<string, unknown>>)) collect(v, `${path}.${k}`);
    };
    collect(s, "");
    expect(Object.keys(FIELD_HELP).filter((k) => !fields.has(k))).toEqual([]);
  });

  it("every quantity field carries a pattern and an example, and its help names a tool or says what it is", () => {
    const s = JSON.stringify(jobJsonSchema());
    const nodes: Record<string, unknown>[] = [];
    JSON.parse(s, (_k, v) => {
      if (v && typeof v === "object" && Array.isArray(v.type) && v.type.includes("number") && v.type.includes("string")) nodes.push(v);
      return v;
    });
    expect(nodes.length).toBeGreaterThan(40);
    for (const n of nodes) {
      expect([QUANTITY_PATTERN, FRACTION_PATTERN]).toContain(n.pattern);
      expect(Array.isArray(n.examples) && (n.examples as unknown[]).length > 0).toBe(true);
    }
    const props = jobJsonSchema().properties as Record<string, { properties: Record<string, { description: string }> }>;
    expect(props.armature.properties.stack_length.description).toMatch(/calipers/);
    expect(props.armature.properties.stack_length.description).toMatch(/mm, cm, m, um, in, mil/);
    expect(props.original.properties.turns.description).toMatch(/unwinding/);
    expect(props.original.properties.wire.description).toMatch(/micrometer/);
    expect(props.original.properties.wire.description).toMatch(/fumes/);
    expect(props.original.properties.wire_mass.description).toMatch(/scale/);
    expect(props.original.properties.terminal_resistance.description).toMatch(/four-wire/);
    expect(props.winding.properties.lead_throw.description).toMatch(/centre line/);
  });
});

describe("the JSON Schema against ajv 8 (draft 2020-12)", () => {
  const validate = compile();

  it.each([...DEMO_JOBS, ...TEMPLATES])("accepts %s", (file) => {
    const data = parse(readFileSync(file, "utf8"));
    const ok = validate(data);
    expect(validate.errors ?? []).toEqual([]);
    expect(ok).toBe(true);
  });

  it("the demo jobs and templates carry the YAML language server's schema comment on line 1", () => {
    for (const f of DEMO_JOBS) expect(readFileSync(f, "utf8").split("\n")[0]).toBe("# yaml-language-server: $schema=../templates/job.schema.json");
    for (const f of TEMPLATES) expect(readFileSync(f, "utf8").split("\n")[0]).toBe("# yaml-language-server: $schema=./job.schema.json");
  });

  const rejects = (mutate: (j: Record<string, Record<string, unknown>>) => void, keyword: string, at: string) => {
    const j = clone(demo());
    mutate(j);
    expect(validate(j)).toBe(false);
    expect(validate.errors?.some((e) => e.keyword === keyword && e.instancePath === at)).toBe(true);
  };

  it("rejects a wrong type", () => rejects((j) => (j.armature.slots = "five"), "type", "/armature/slots"));
  it("rejects a count that is not whole", () => rejects((j) => (j.armature.slots = 5.5), "type", "/armature/slots"));
  it("rejects an unknown key", () => rejects((j) => (j.armature.stak_length = "12 mm"), "additionalProperties", "/armature"));
  it("rejects a missing required key", () => rejects((j) => delete j.armature.slots, "required", "/armature"));
  it("rejects a missing section", () => rejects((j) => delete (j as Record<string, unknown>).original, "required", ""));
  it("rejects a choice that is not offered", () => rejects((j) => (j.winding.style = "lapp"), "enum", "/winding/style"));
  it("rejects another version", () => rejects((j) => ((j as Record<string, unknown>).version = 2), "const", "/version"));
  it("rejects a quantity that does not start with a number", () =>
    rejects((j) => (j.armature.stack_length = "twelve mm"), "pattern", "/armature/stack_length"));
  it("rejects a fraction written with a unit", () => rejects((j) => (j.winding.spare_margin = "10 mm"), "pattern", "/winding/spare_margin"));

  it("accepts $schema as a key (the editor hint)", () => {
    const j = demo() as Record<string, unknown>;
    j.$schema = "../templates/job.schema.json";
    expect(validate(j)).toBe(true);
    expect(() => loadYaml(`$schema: x\n${readFileSync(DEMO_JOBS[0], "utf8")}`, "j.yaml", jobSchema)).not.toThrow();
  });

  it("rules that compare two fields stay with the zod schema: a goal without its value passes JSON Schema, not armwind", () => {
    // JSON Schema checks structure only; `goal: kv` needs `kv:` beside it, which zod's superRefine says
    const j = demo();
    j.target.goal = "kv";
    expect(validate(j)).toBe(true);
    const text = readFileSync(DEMO_JOBS[0], "utf8").replace("goal: no_load_speed", "goal: kv");
    expect(() => loadYaml(text, "j.yaml", jobSchema)).toThrow(/goal kv needs its value/);
  });
});

describe("the quantity patterns never reject what armwind reads", () => {
  const KINDS: QuantityKind[] = [
    "length",
    "wire_length",
    "area",
    "voltage",
    "current",
    "speed",
    "temperature",
    "resistance",
    "flux",
    "flux_density",
    "torque",
    "mass",
    "frequency",
    "current_density",
    "speed_per_volt",
  ];
  const quantity = new RegExp(QUANTITY_PATTERN, "u");
  const fraction = new RegExp(FRACTION_PATTERN, "u");

  it("every text parseQuantity accepts matches QUANTITY_PATTERN", () => {
    const number = fc.oneof(
      fc.double({ min: -1e6, max: 1e6, noNaN: true }).map((x) => String(x)),
      fc.nat(100000).map(String),
      fc.tuple(fc.nat(999), fc.nat(999)).map(([a, b]) => `${a}.${b}`),
      fc.nat(999).map((b) => `.${b}`),
      fc.tuple(fc.nat(99), fc.integer({ min: -9, max: 9 })).map(([a, e]) => `${a}e${e}`),
    );
    fc.assert(
      fc.property(fc.constantFrom(...KINDS), number, fc.constantFrom("", " ", "  "), fc.nat(20), fc.constantFrom("", " "), (kind, n, sp, ui, lead) => {
        const units = unitNames(kind);
        const text = `${lead}${n}${sp}${units[ui % units.length]}`;
        if (parseQuantity(text, kind).ok) expect(quantity.test(text)).toBe(true);
        if (parseQuantity(n, kind).ok) expect(quantity.test(n)).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it("the fraction pattern takes fractions and percentages and nothing with another unit", () => {
    for (const ok of ["0.40", "40 %", "40%", " .4", "1"]) expect(fraction.test(ok)).toBe(true);
    for (const bad of ["40 mm", "forty", "0.4.4", ""]) expect(fraction.test(bad)).toBe(false);
    for (const bad of ["twelve mm", "mm 12", "", "12.5.3 mm"]) expect(quantity.test(bad)).toBe(false);
  });
});
