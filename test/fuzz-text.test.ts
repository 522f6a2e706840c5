/**
 * Robustness, property-based (fast-check): damage done to the YAML text itself (lines deleted,
 * repeated so that keys are duplicated, re-indented, swapped, joined, cut short; garbage and YAML
 * punctuation inserted; tabs), and random YAML and random bytes, through `loadYaml` and `planJob`.
 * Then the measured file of the logbook (src/logbook/measured.ts), mutated the same ways, through
 * `loadYaml` and `checkAgainstJob`. The rule is fuzz-support.ts's: a result, or located one-line
 * problems; never another exception.
 */
import { describe, expect, it } from "vitest";
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { parse, stringify } from "yaml";
import { checkPrintedError, loadChecked, runJobText } from "./fuzz-support.js";
import { chunks } from "./helpers/chunks.js";
import { measuredSchema, checkAgainstJob } from "../src/logbook/measured.js";
import { loadYaml } from "../src/job/load.js";
import { jobSchema } from "../src/job/schema.js";

const ROOT = join(import.meta.dirname, "..");
const RAW = [
  ...readdirSync(join(ROOT, "jobs"))
    .filter((f) => f.endsWith(".yaml"))
    .map((f) => join(ROOT, "jobs", f)),
  ...["tooth", "lap", "wave"].map((s) => join(ROOT, "templates", `${s}.yaml`)),
].map((f) => readFileSync(f, "utf8"));
// the same files without their comment lines: quicker to parse, and every edit lands on data
const SEEDS = [
  ...RAW,
  ...RAW.map((t) =>
    t
      .split("\n")
      .filter((l) => !/^\s*#/.test(l))
      .join("\n"),
  ),
];

type Edit =
  | { op: "delete" | "repeat" | "tab"; line: number }
  | { op: "indent"; line: number; by: number }
  | { op: "swap"; line: number; other: number }
  | { op: "join"; line: number }
  | { op: "insert"; at: number; text: string }
  | { op: "punct"; at: number; ch: string }
  | { op: "cut"; at: number }
  | { op: "revalue"; line: number; value: string };

const PUNCT = [
  ":",
  "{",
  "}",
  "[",
  "]",
  "-",
  "#",
  "&a",
  "*a",
  "!",
  "!!str",
  "|",
  ">",
  "'",
  '"',
  "%",
  "@",
  "`",
  "\t",
  "? ",
  ",",
  "<<: *a",
  "\\",
  "\u0000",
  "\ufeff",
  "\u2028",
];
const VALUES = [
  "",
  "~",
  "[]",
  "{}",
  "-1",
  "0",
  "1e400",
  ".nan",
  "12 furlongs",
  "true",
  "{ a: 1 }",
  "[1, 2",
  "&x 5",
  "*x",
  "!!binary AAAA",
  "'unterminated",
  "12 mm # c",
  "0x1F",
  "2026-12-01",
  "- 1\n- 2",
  "|\n  text",
];

const edit: fc.Arbitrary<Edit> = fc.oneof(
  fc.record({ op: fc.constantFrom("delete" as const, "repeat" as const, "tab" as const), line: fc.nat() }),
  fc.record({ op: fc.constant("indent" as const), line: fc.nat(), by: fc.integer({ min: -4, max: 4 }) }),
  fc.record({ op: fc.constant("swap" as const), line: fc.nat(), other: fc.nat() }),
  fc.record({ op: fc.constant("join" as const), line: fc.nat() }),
  fc.record({
    op: fc.constant("insert" as const),
    at: fc.nat(),
    text: fc.oneof(fc.string({ maxLength: 8 }), fc.string({ unit: "binary", maxLength: 6 }), fc.constantFrom(...VALUES)),
  }),
  fc.record({ op: fc.constant("punct" as const), at: fc.nat(), ch: fc.constantFrom(...PUNCT) }),
  fc.record({ op: fc.constant("cut" as const), at: fc.nat() }),
  fc.record({ op: fc.constant("revalue" as const), line: fc.nat(), value: fc.oneof(fc.constantFrom(...VALUES), fc.string({ maxLength: 10 })) }),
);

function applyEdit(text: string, e: Edit): string {
  const lines = text.split("\n");
  const n = lines.length;
  switch (e.op) {
    case "delete":
      lines.splice(e.line % n, 1);
      break;
    case "repeat": // a repeated key line is a duplicate key
      lines.splice(e.line % n, 0, lines[e.line % n]);
      break;
    case "tab":
      lines[e.line % n] = "\t" + lines[e.line % n];
      break;
    case "indent": {
      const i = e.line % n;
      lines[i] = e.by >= 0 ? " ".repeat(e.by) + lines[i] : lines[i].replace(new RegExp(`^ {0,${-e.by}}`), "");
      break;
    }
    case "swap": {
      const i = e.line % n;
      const j = e.other % n;
      [lines[i], lines[j]] = [lines[j], lines[i]];
      break;
    }
    case "join": {
      const i = e.line % n;
      if (i + 1 < n) lines.splice(i, 2, lines[i] + lines[i + 1]);
      break;
    }
    case "revalue": {
      const i = e.line % n;
      lines[i] = lines[i].replace(/^(\s*(?:- )?[^:#]+:).*$/, `$1 ${e.value}`);
      break;
    }
    case "insert": {
      const at = e.at % (text.length + 1);
      return text.slice(0, at) + e.text + text.slice(at);
    }
    case "punct": {
      const at = e.at % (text.length + 1);
      return text.slice(0, at) + e.ch + text.slice(at + 1);
    }
    case "cut":
      return text.slice(0, e.at % (text.length + 1));
  }
  return lines.join("\n");
}

describe("damaged job texts through load and plan", () => {
  // 5500 text edits in pieces of about 350 (test/helpers/chunks.ts), each piece its own seed
  const seen = { planned: 0, load_error: 0, plan_error: 0 };
  for (const c of chunks(5500, 16)) {
    it(`text edits ${c.part}/${c.parts} (${c.runs}): a plan or located one-line problems, never another exception`, () => {
      fc.assert(
        fc.property(fc.nat(SEEDS.length - 1), fc.array(edit, { minLength: 1, maxLength: 4 }), (seed, edits) => {
          const text = edits.reduce(applyEdit, SEEDS[seed]);
          seen[runJobText(text).kind]++;
        }),
        { numRuns: c.runs, seed: c.seed },
      );
    });
  }
  it("the 5500 text edits reached both outcomes", () => {
    expect(seen.load_error).toBeGreaterThan(2000);
    expect(seen.planned).toBeGreaterThan(50); // some edits only touch comments or leave valid YAML
  });

  it("1000 random documents and random bytes: located problems", () => {
    const doc = fc.oneof(
      fc.anything({ maxDepth: 3 }).map((x) => {
        try {
          return stringify(x) ?? "";
        } catch {
          return String(x);
        }
      }),
      fc.string({ unit: "binary", maxLength: 60 }),
      fc
        .dictionary(
          fc.constantFrom("version", "id", "title", "armature", "winding", "original", "target", "wire_stock", "max_in_hand"),
          fc.jsonValue({ maxDepth: 2 }),
        )
        .map((x) => stringify(x)),
      fc.constantFrom(
        "",
        "\n",
        "---\n---\n",
        "a: &a [*a]\n",
        "- 1\n- 2\n",
        "42\n",
        "null\n",
        "%YAML 1.2\n---\n",
        "? [a]\n: b\n",
        "a: 1\na: 2\n",
        "\ufeffversion: 1\n",
      ),
    );
    fc.assert(
      fc.property(doc, (text) => {
        expect(runJobText(text).kind).not.toBe("planned");
      }),
      { numRuns: 1000 },
    );
  });

  it("many aliases (a 'billion laughs' file) are refused, not expanded", () => {
    const text = [
      "a: &a [x, x, x, x, x, x, x, x, x, x]",
      "b: &b [*a, *a, *a, *a, *a, *a, *a, *a, *a, *a]",
      "c: &c [*b, *b, *b, *b, *b, *b, *b, *b, *b, *b]",
      "d: [*c, *c, *c, *c, *c, *c, *c, *c, *c, *c]",
      "",
    ].join("\n");
    expect(runJobText(text).kind).toBe("load_error");
  });
});

// DESIGN.md's measured-file example (values invented there), for the demo job's 5 bars.
const MEASURED = `version: 1
job: blind-motor-0031
date: 2026-12-01
wound: { turns: 60, wire: 0.22 mm, strands: 1 }
temperature: 21 C
meter_resolution: 0.001 ohm
bar_to_bar: [1.05, 1.05, 1.04, 1.06, 1.05]
terminal_resistance: 1.57 ohm
no_load: { supply: 12 V, current: 0.17 A, speed: 9650 rpm }
stall: { supply: 3 V, current: 1.8 A }
insulation: { test_volts: 500 V, megohm: 200 }
notes: invented readings
`;

describe("measured files through load and the job check", () => {
  const job = loadYaml(readFileSync(join(ROOT, "jobs", "blind-motor-0031.yaml"), "utf8"), "job.yaml", jobSchema).value;
  const run = (text: string): "ok" | "load_error" | "check_error" => {
    const m = loadChecked(text, measuredSchema);
    if (!m) return "load_error";
    try {
      checkAgainstJob(m.value, job, "fuzz.yaml", m.locate);
      return "ok";
    } catch (e) {
      // checkAgainstJob locates its problems itself (file, line, column) and names the field;
      // checked as the CLI prints them (it quotes the measured file's job id as written)
      checkPrintedError(e, text);
      return "check_error";
    }
  };

  it("the seed is accepted", () => expect(run(MEASURED)).toBe("ok"));

  // 3000 in six pieces (test/helpers/chunks.ts), each its own seed
  const seen = { ok: 0, load_error: 0, check_error: 0 };
  for (const c of chunks(3000, 6)) {
    it(`text edits and data mutations ${c.part}/${c.parts} (${c.runs}): located one-line problems, never another exception`, () => {
      const seed = parse(MEASURED) as Record<string, unknown>;
      const keys = Object.keys(seed);
      const dataEdit = fc.record({
        key: fc.constantFrom(...keys),
        how: fc.constantFrom("drop", "rename", "value", "readings"),
        value: fc.oneof(
          fc.constantFrom<unknown>(null, "", -1, 0, 1e308, "1 V", "12 furlongs", [], {}, "2026-02-30", "yesterday", [1, "x", -2]),
          fc.double(),
          fc.string({ maxLength: 8 }),
        ),
        n: fc.nat(12),
      });
      fc.assert(
        fc.property(fc.boolean(), fc.array(edit, { minLength: 1, maxLength: 3 }), fc.array(dataEdit, { minLength: 1, maxLength: 3 }), (asText, edits, data) => {
          let text: string;
          if (asText) text = edits.reduce(applyEdit, MEASURED);
          else {
            const d = structuredClone(seed);
            for (const e of data) {
              if (e.how === "drop") delete d[e.key];
              else if (e.how === "rename") (d[e.key + "s"] = d[e.key]), delete d[e.key];
              else if (e.how === "value") d[e.key] = e.value;
              else d.bar_to_bar = Array.from({ length: e.n }, (_, i) => (i % 3 === 0 ? e.value : 1.05));
            }
            text = stringify(d);
          }
          seen[run(text)]++;
        }),
        { numRuns: c.runs, seed: c.seed },
      );
    });
  }
  it("the 3000 measured-file edits reached both kinds of problem", () => {
    expect(seen.load_error).toBeGreaterThan(500);
    expect(seen.check_error).toBeGreaterThan(0);
  });
});
