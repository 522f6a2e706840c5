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
