import { describe, expect, it } from "vitest";
import { runWires, sig } from "../src/cli/wires.js";

// DESIGN.md, "Other commands with --json": wires → { ok, wires: [ { label, system, size,
// bare_diameter_mm, area_mm2, ohm_per_m, g_per_m, overall_diameter_mm, overall_source } ] }.
const KEYS = ["label", "system", "size", "bare_diameter_mm", "area_mm2", "ohm_per_m", "g_per_m", "overall_diameter_mm", "overall_source"];

describe("runWires --json", () => {
  it("has exactly the keys of DESIGN.md, for every system", () => {
    const r = runWires({ json: true });
    expect(r.status).toBe(0);
    expect(r.stderr).toBe("");
    const out = JSON.parse(r.stdout);
    expect(Object.keys(out)).toEqual(["ok", "errors", "wires"]);
    expect(out.ok).toBe(true);
    for (const w of out.wires) {
      expect(Object.keys(w)).toEqual(KEYS);
      const builds = w.system === "awg" ? ["single", "heavy", "triple"] : ["grade 1", "grade 2", "grade 3"];
      expect(Object.keys(w.overall_diameter_mm)).toEqual(builds);
      expect(Object.keys(w.overall_source)).toEqual(builds);
      for (const b of builds) {
        expect(["published", "interpolated", "from memory", "none"]).toContain(w.overall_source[b]);
        expect(w.overall_diameter_mm[b] === null).toBe(w.overall_source[b] === "none");
      }
    }
    expect(new Set(out.wires.map((w: { system: string }) => w.system))).toEqual(new Set(["awg", "swg", "metric"]));
  });

  it("numbers are unrounded and in the units their keys name", () => {
    const out = JSON.parse(runWires({ json: true, system: "awg", min: "0.25 mm", max: "0.26 mm" }).stdout);
    expect(out.wires.map((w: { label: string }) => w.label)).toEqual(["30 AWG"]);
    const w = out.wires[0];
    // ASTM B258 formula: 0.127 mm × 92^(6/39) = 0.25464 mm, unrounded
    expect(w.bare_diameter_mm).toBeCloseTo(0.127 * 92 ** (6 / 39), 12);
    expect(w.area_mm2).toBeCloseTo((Math.PI / 4) * w.bare_diameter_mm ** 2, 12);
    // IEC 60028: ρ = 1/58 Ω·mm²/m, density 8.89 g/cm³
    expect(w.ohm_per_m).toBeCloseTo(1 / 58 / w.area_mm2, 12);
    expect(w.g_per_m).toBeCloseTo(8.89 * w.area_mm2, 12);
  });

  it("36 SWG grades are the published IS 13730-0-1 values in mm", () => {
    const out = JSON.parse(runWires({ json: true, system: "SWG", min: "0.0076 in", max: "0.0076 in" }).stdout);
    expect(out.wires).toHaveLength(1);
    expect(out.wires[0].overall_diameter_mm).toEqual({ "grade 1": 0.219, "grade 2": 0.232, "grade 3": 0.245 });
    expect(out.wires[0].overall_source["grade 2"]).toBe("published");
  });

  it("a bad filter: status 1, one line each on stderr, and ok:false with the errors", () => {
    const r = runWires({ json: true, system: "awgg", min: "3 V" });
    expect(r.status).toBe(1);
    const lines = r.stderr.trimEnd().split("\n");
    expect(lines).toHaveLength(2);
    expect(lines[0]).toMatch(/use awg, swg or metric/);
    expect(lines[1]).toMatch(/use one of mm/);
    const out = JSON.parse(r.stdout);
    expect(out.ok).toBe(false);
    expect(out.errors.map((e: { code: string; path: string }) => [e.code, e.path])).toEqual([
      ["unknown_wire_system", "system"],
      ["bad_length", "min"],
    ]);
    for (const e of out.errors) expect(Object.keys(e).sort()).toEqual(["code", "message", "path"]);
  });

  it("min above max is refused, naming the fix", () => {
    const r = runWires({ json: false, min: "1 mm", max: "0.5 mm" });
    expect(r.status).toBe(1);
    expect(r.stdout).toBe("");
    expect(r.stderr).toMatch(/swap them/);
  });
});

describe("runWires table", () => {
  it("shows every system with marks, the legend and the sentence about measuring", () => {
    const r = runWires({ json: false });
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^AWG /m);
    expect(r.stdout).toMatch(/^SWG /m);
    expect(r.stdout).toMatch(/^Metric /m);
    expect(r.stdout).toMatch(/\* interpolated.*~ from memory.*– none known/);
    expect(r.stdout).toMatch(/Where no overall diameter is known you must measure one/);
  });
  it("rounds to 3 significant figures, resistance to 4", () => {
    const r = runWires({ json: false, system: "metric", min: "0.25 mm", max: "0.25 mm" });
    const row = r.stdout.split("\n").find((l) => l.startsWith("0.250 mm"))!;
    // 0.250 mm: area 0.0491 mm², 0.3512 Ω/m (1/58 / 0.049087), 0.436 g/m; grade 2 interpolated 0.299*
    expect(row.split(/\s{2,}/)).toEqual(["0.250 mm", "0.250", "0.282*", "0.299*", "0.314*", "0.0491", "0.3512", "0.436"]);
  });
  it("marks from-memory values and unknown ones", () => {
    const r = runWires({ json: false, system: "awg", min: "11 mm" });
    expect(r.stdout).toMatch(/^4\/0 AWG\s+11\.7\s+–\s+–\s+–/m);
    const r30 = runWires({ json: false, system: "awg", min: "0.25 mm", max: "0.26 mm" });
    expect(r30.stdout).toMatch(/^30 AWG .*~/m);
  });
  it("an empty range says so", () => {
    const r = runWires({ json: false, system: "metric", min: "6 mm" });
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/No catalogue wire/);
  });
  it("sig() keeps 3 significant figures without exponents", () => {
    expect(sig(0.0254, 3)).toBe("0.0254");
    expect(sig(5, 3)).toBe("5.00");
    expect(sig(1126.3, 3)).toBe("1126");
    expect(sig(0.00016079, 4)).toBe("0.0001608");
  });
});

describe("wires --min/--max as gauges (issue 11 paper cut)", () => {
  const labels = (r: ReturnType<typeof runWires>) => JSON.parse(r.stdout).wires.map((w: { label: string }) => w.label);
  it("bare numbers with --system awg are gauge numbers, a range whichever way round", () => {
    const r = runWires({ json: true, system: "awg", min: "25", max: "27" });
    expect(r.status).toBe(0);
    expect(labels(r)).toEqual(["25 AWG", "26 AWG", "27 AWG"]);
  });
  it('"27 AWG" is read as the gauge\'s bare diameter', () => {
    const r = runWires({ json: true, min: "27 AWG", max: "26 awg" });
    expect(r.status).toBe(0);
    expect(labels(r)).toContain("27 AWG");
    expect(labels(r)).toContain("26 AWG");
    expect(labels(r)).not.toContain("25 AWG");
    const swg = runWires({ json: true, system: "swg", min: "36", max: "34" });
    expect(labels(swg)).toEqual(expect.arrayContaining(["34 SWG", "35 SWG", "36 SWG"]));
    expect(labels(swg)).toHaveLength(3);
  });
  it("a gauge that does not exist is refused; a bare number without a system stays mm with a hint when nothing matches", () => {
    expect(runWires({ json: false, min: "99 AWG" }).status).toBe(1);
    const r = runWires({ json: false, min: "25", max: "27" });
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/for a gauge write it with its system/);
  });
});
