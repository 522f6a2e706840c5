/** The job form's edits touch only the characters of the fields changed: comments, order and alignment stay. */
import { describe, expect, it } from "vitest";
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { applyEdits } from "../src/web/edit.js";
import { ArmwindError } from "../src/errors.js";
import { loadJobText, ROOT } from "./helpers/cli.js";

const files = [
  ...readdirSync(join(ROOT, "jobs"))
    .filter((f) => f.endsWith(".yaml"))
    .map((f) => join(ROOT, "jobs", f)),
  ...readdirSync(join(ROOT, "templates"))
    .filter((f) => f.endsWith(".yaml"))
    .map((f) => join(ROOT, "templates", f)),
];
const blind = readFileSync(join(ROOT, "jobs/blind-motor-0031.yaml"), "utf8");

describe("applyEdits", () => {
  it.each(files)("leaves %s byte for byte when nothing changes", (f) => {
    const t = readFileSync(f, "utf8");
    expect(applyEdits(t, [])).toBe(t);
    // and a value set to what it already is
    expect(applyEdits(t, [{ path: "version", text: "1" }])).toBe(t);
  });

  it("changes one value and nothing else, keeping the comment on its line", () => {
    const t = readFileSync(join(ROOT, "templates/tooth.yaml"), "utf8");
    const line = t.split("\n").find((l) => l.trimStart().startsWith("stack_length:"))!;
    const out = applyEdits(t, [{ path: "armature.stack_length", text: "14 mm" }]);
    expect(out).toBe(t.replace(line, line.replace("12 mm", "14 mm")));
    expect(out.split("\n").find((l) => l.trimStart().startsWith("stack_length:"))).toMatch(/14 mm\s+# calipers/);
  });

  it("adds a key (and its missing parent) under the right section, removes one by its lines", () => {
    const out = applyEdits(blind, [
      { path: "winding.brush_drop", text: "0.3 V" },
      { path: "armature.magnet.flux_per_pole", text: "0.2 mWb" },
      { path: "original.wire_length", text: "" },
    ]);
    const job = loadJobText(out);
    expect(job.winding.brush_drop).toBeCloseTo(0.3, 12);
    expect(job.armature.magnet?.flux_per_pole).toBeCloseTo(0.2e-3, 12);
    expect(job.original.wire_length).toBeUndefined();
    expect(out).toContain("  magnet:\n    flux_per_pole: 0.2 mWb\n");
    // every comment survives
    const comments = (s: string) => s.split("\n").filter((l) => l.includes("#"));
    expect(comments(out)).toEqual(comments(blind));
  });

  it("a field that is not YAML is a located bad_yaml problem", () => {
    let err: unknown;
    try {
      applyEdits(blind, [{ path: "target.no_load_speed", text: "{ 9000" }]);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ArmwindError);
    expect((err as ArmwindError).problems[0]).toMatchObject({ code: "bad_yaml", path: "target.no_load_speed" });
  });
});

describe("applyEdits on lists and one-line maps (the form's list rows and variants)", () => {
  const comments = (s: string) => s.split("\n").filter((l) => l.includes("#"));
  const chair = readFileSync(join(ROOT, "jobs/chair-wave-0045.yaml"), "utf8");

  it("adds a row at the end of a block list and removes one by its lines, comments kept", () => {
    const added = applyEdits(blind, [
      { path: "original.tests[1]", text: "{ supply: 6 V, no_load_current: 0.15 A, no_load_speed: 4700 rpm, temperature: 21 C }" },
    ]);
    expect(added).toContain("    - { supply: 12 V, no_load_current: 0.18 A, no_load_speed: 9800 rpm, temperature: 21 C }\n    - { supply: 6 V,");
    expect(loadJobText(added).original.tests).toHaveLength(2);
    expect(comments(added)).toEqual(comments(blind));
    const removed = applyEdits(chair, [{ path: "original.tests[0]", text: "" }]);
    expect(loadJobText(removed).original.tests?.map((t) => t.supply)).toEqual([12]);
    expect(comments(removed)).toEqual(comments(chair));
    // a wire on the shelf: the fourth row removed, a new one added, the rest byte for byte
    const shelf = applyEdits(blind, [
      { path: "wire_stock[3]", text: "" },
      { path: "wire_stock[4]", text: "0.18 mm grade 2" },
    ]);
    expect(shelf).toBe(blind.replace("  - 32 AWG heavy\n", "").replace("  - 33 AWG heavy\n", "  - 33 AWG heavy\n  - 0.18 mm grade 2\n"));
  });

  it("the last row removed takes its key with it: no list is the same as no rows (the whole catalogue, no tests)", () => {
    const a = applyEdits(blind, [{ path: "original.tests[0]", text: "" }]);
    expect(a).not.toContain("tests:");
    expect(loadJobText(a).original.tests).toBeUndefined();
    const b = applyEdits(
      blind,
      [0, 1, 2, 3, 4].map(() => ({ path: "wire_stock[0]", text: "" })),
    );
    expect(b).not.toContain("wire_stock");
    expect(loadJobText(b).wire_stock).toBeUndefined();
    expect(applyEdits("a: 1\nb: [x]\n", [{ path: "b[0]", text: "" }])).toBe("a: 1\n");
  });

  it("refuses a row beyond the list's end (the form numbers rows from 0 without gaps)", () => {
    expect(() => applyEdits(blind, [{ path: "original.tests[3]", text: "{ supply: 6 V }" }])).toThrow(/a new one goes at \[1\]/);
  });

  it("takes and loses a key inside a one-line { … } map, in place", () => {
    const drill = readFileSync(join(ROOT, "jobs/drill-lap-0112.yaml"), "utf8");
    const a = applyEdits(drill, [{ path: "target.supply.frequency", text: "" }]);
    expect(a).toContain("  supply: { value: 230 V, kind: ac }\n");
    const b = applyEdits(a, [{ path: "target.supply.frequency", text: "60 Hz" }]);
    expect(b).toContain("  supply: { value: 230 V, kind: ac, frequency: 60 Hz }\n");
    const c = applyEdits(drill, [{ path: "target.supply.value", text: "" }]);
    expect(c).toContain("  supply: { kind: ac, frequency: 50 Hz }\n");
    expect(applyEdits("a: {}\n", [{ path: "a.b", text: "1" }])).toBe("a: { b: 1 }\n");
    expect(applyEdits("a: []\n", [{ path: "a[0]", text: "x" }])).toBe("a: [x]\n");
    expect(applyEdits("a: [x, y, z]\n", [{ path: "a[1]", text: "" }])).toBe("a: [x, z]\n");
    expect(applyEdits("a: [x, y, z]\n", [{ path: "a[2]", text: "" }])).toBe("a: [x, y]\n");
  });

  it("a union switches form: a bare tolerance becomes { below, above } and back", () => {
    const a = applyEdits(blind, [{ path: "target.tolerance", text: "{ below: 0.02, above: 0.05 }" }]);
    expect(a).toContain("  tolerance: { below: 0.02, above: 0.05 }\n");
    expect(loadJobText(a).target.tolerance).toEqual({ below: 0.02, above: 0.05 });
    expect(applyEdits(a, [{ path: "target.tolerance", text: "0.03" }])).toBe(blind);
  });

  it("a missing list is created with its first row", () => {
    const t = "version: 1\noriginal:\n  turns: 3   # counted\n";
    expect(applyEdits(t, [{ path: "original.tests[0]", text: "{ supply: 6 V }" }])).toBe(
      "version: 1\noriginal:\n  turns: 3   # counted\n  tests: [{ supply: 6 V }]\n",
    );
  });
});
