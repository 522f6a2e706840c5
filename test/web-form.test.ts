/**
 * The workbench's job form (src/web/form.ts) from the job file's JSON Schema: a bench test shows the
 * fields of its kind only (src/job/schema.ts `TEST_FORMS`: a no-load test reads no_load_current and
 * no_load_speed, a load test current, speed and torque or output_power), as a choice of two forms.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { parseDocument } from "yaml";
import { jobJsonSchema } from "../src/job/json-schema.js";
import { discriminatorOf, jobForm } from "../src/web/form.js";
import { ROOT } from "./helpers/cli.js";

const schema = jobJsonSchema();
const formOf = (text: string) => jobForm(schema, parseDocument(text));
const blind = readFileSync(join(ROOT, "jobs/blind-motor-0031.yaml"), "utf8");

/** The HTML of a test row's two forms: [no-load, load], and which is shown. */
function forms(html: string, item: string): { bodies: string[]; hidden: boolean[]; choice: string } {
  const start = html.indexOf(`data-union="${item}"`);
  expect(start, `${item} is a choice of forms`).toBeGreaterThan(0);
  const end = html.indexOf('class="remove"', start);
  const row = html.slice(start, end);
  const parts = row.split('<div class="variant" data-variant="').slice(1);
  return {
    bodies: parts,
    hidden: parts.map((p) => /^\d+" hidden>/.test(p)),
    choice: row.slice(0, row.indexOf('<div class="variant"')),
  };
}
const fields = (body: string) => [...body.matchAll(/data-field="([^"]+)"/g)].map((m) => m[1]);

describe("a bench test's form follows its kind", () => {
  it("the editor schema gives the two forms, told apart by kind", () => {
    const items = (schema.properties as any).original.properties.tests.items;
    expect(discriminatorOf(items)).toBe("kind");
    const [noLoad, load] = items.anyOf;
    expect(Object.keys(noLoad.properties)).not.toContain("torque");
    expect(Object.keys(load.properties)).not.toContain("no_load_current");
    expect(load.required).toContain("kind");
  });

  it("a no-load test (the blind demo's) shows no load-test field; the load form is there, hidden", () => {
    const f = forms(formOf(blind), "original.tests[0]");
    expect(f.choice).toMatch(/value="0" data-variant-of="original.tests\[0\]" checked> no load</);
    expect(f.choice).toMatch(/value="1" data-variant-of="original.tests\[0\]"> load</);
    expect(f.hidden).toEqual([false, true]);
    const shown = fields(f.bodies[0]);
    expect(shown).toContain("original.tests[0].no_load_current");
    expect(shown).toContain("original.tests[0].no_load_speed");
    for (const k of ["current", "speed", "torque", "output_power", "kind"]) expect(shown).not.toContain(`original.tests[0].${k}`);
    // the held values are in the shown form
    expect(f.bodies[0]).toMatch(/data-field="original.tests\[0\].no_load_current" value="0.18 A"/);
    const other = fields(f.bodies[1]);
    for (const k of ["kind", "current", "speed", "torque", "output_power"]) expect(other).toContain(`original.tests[0].${k}`);
    expect(other).not.toContain("original.tests[0].no_load_current");
    expect(f.bodies[1]).toMatch(/<input type="hidden" data-field="original.tests\[0\].kind" data-fixed value="load">/);
  });

  it("a load test shows the load form, and every id stays unique", () => {
    const text = blind.replace(
      /    - \{ supply: 12 V, no_load_current: 0.18 A.*\n/,
      "    - { kind: load, supply: 12 V, current: 0.9 A, speed: 8000 rpm, torque: 4 mN m }\n",
    );
    const html = formOf(text);
    const f = forms(html, "original.tests[0]");
    expect(f.hidden).toEqual([true, false]);
    expect(f.bodies[1]).toMatch(/data-field="original.tests\[0\].torque" value="4 mN m"/);
    expect(f.bodies[0]).toMatch(/data-field="original.tests\[0\].supply" value=""/);
    const ids = [...html.matchAll(/ id="([^"]+)"/g)].map((m) => m[1]);
    expect(new Set(ids).size).toBe(ids.length);
    // each label names a control that exists
    for (const m of html.matchAll(/<label for="([^"]+)"/g)) expect(ids).toContain(m[1]);
  });
});

describe("a field only one kind of motor field reads is marked with it", () => {
  it("a no-load test's field_current is shunt only (its help says so), and the page can hide it for other fields", () => {
    const html = formOf(blind);
    const at = html.indexOf('data-path="original.tests[0].field_current"');
    expect(at).toBeGreaterThan(0);
    const div = html.slice(html.lastIndexOf("<div", at), html.indexOf(">", at));
    expect(div).toContain('data-motor-field="shunt"');
    // a field every kind of motor reads carries no mark
    const supply = html.indexOf('data-path="original.tests[0].supply"');
    expect(html.slice(html.lastIndexOf("<div", supply), html.indexOf(">", supply))).not.toContain("data-motor-field");
  });
});
