import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { awgName, catalogue, parseWireSpec, resolveWire, type WireSpec } from "../src/wire/index.js";

function spec(input: unknown, role: "stock" | "original" = "stock"): WireSpec {
  const r = parseWireSpec(input, role);
  if (!r.ok) throw new Error(`expected ${JSON.stringify(input)} to parse: ${r.message}`);
  return r.spec;
}
function message(input: unknown, role: "stock" | "original" = "stock"): string {
  const r = parseWireSpec(input, role);
  if (r.ok) throw new Error(`expected ${JSON.stringify(input)} to be refused, got ${JSON.stringify(r.spec)}`);
  return r.message;
}
const label = (input: unknown, role: "stock" | "original" = "stock") => resolveWire(spec(input, role)).label;

// The forms DESIGN.md ("The job file") gives for a wire.
describe("parseWireSpec: accepted forms", () => {
  it("metric diameters, with and without a grade", () => {
    expect(spec("0.25 mm grade 2")).toEqual({ system: "metric", size: "0.250", grade: 2 });
    expect(spec("0.25 mm G2")).toEqual({ system: "metric", size: "0.250", grade: 2 });
    expect(spec("0.25mm g1")).toEqual({ system: "metric", size: "0.250", grade: 1 });
    expect(spec("0.25 mm grade 3").grade).toBe(3);
    expect(label("0.25mm")).toBe("0.250 mm grade 2");
    expect(label(0.25)).toBe("0.250 mm grade 2"); // a bare number is mm
    expect(label("250 um")).toBe("0.250 mm grade 2");
  });

  it("a bare metric size in stock is read as grade 2 and says so (DESIGN.md)", () => {
    const s = spec("0.25 mm");
    expect(s.grade).toBe(2);
    expect(s.assumed).toMatch(/grade 2/);
  });

  it("a bare AWG size in stock is read as heavy build and says so (DESIGN.md)", () => {
    for (const text of ["33 AWG", "AWG 33", "33awg", "#33 AWG"]) {
      const s = spec(text);
      expect(s).toMatchObject({ system: "awg", size: "33", build: "heavy" });
      expect(s.assumed).toMatch(/heavy/);
    }
  });

  it("AWG with a build, and the aught sizes", () => {
    expect(spec("33 AWG heavy")).toEqual({ system: "awg", size: "33", build: "heavy" });
    expect(spec("33 AWG single")).toEqual({ system: "awg", size: "33", build: "single" });
    expect(spec("AWG 33 triple")).toEqual({ system: "awg", size: "33", build: "triple" });
    expect(spec("33 AWG Heavy build").build).toBe("heavy");
    expect(spec("0000 AWG heavy").size).toBe("4/0");
    expect(spec("2/0 AWG heavy").size).toBe("2/0");
    expect(spec("00 AWG heavy").size).toBe("2/0");
  });

  it("SWG with and without a grade", () => {
    expect(spec("36 SWG grade 1")).toEqual({ system: "swg", size: "36", grade: 1 });
    expect(spec("SWG 36 G3")).toEqual({ system: "swg", size: "36", grade: 3 });
    const s = spec("36 SWG");
    expect(s).toMatchObject({ system: "swg", size: "36", grade: 2 });
    expect(s.assumed).toMatch(/grade 2/);
    expect(spec("7/0 SWG grade 2").size).toBe("7/0");
  });

  it("lengths in other units give a metric or measured bare size (units: SI brochure, 1 in = 25.4 mm)", () => {
    // 10 mil = 0.010 in = 0.254 mm: not an IEC 60317 nominal size → a measured bare wire.
    for (const text of ["10 mil", "0.010 in"]) {
      const s = spec(text);
      expect(s.system).toBe("measured");
      expect(s.bare!).toBeCloseTo(0.254e-3, 12);
      expect(s.overall).toBeUndefined();
      expect(s.assumed).toMatch(/not an IEC 60317 nominal size.*0\.250 mm or 0\.265 mm/);
    }
    // 100 µm is the nominal size 0.100 mm.
    expect(label("100 um")).toBe("0.100 mm grade 2");
  });

  it("measured wires as a mapping or a pair", () => {
    const s = spec({ bare: "0.25 mm", overall: "0.282 mm" });
    expect(s.system).toBe("measured");
    expect(s.bare!).toBeCloseTo(0.25e-3, 12);
    expect(s.overall!).toBeCloseTo(0.282e-3, 12);
    expect(s.assumed).toBeUndefined();
    expect(resolveWire(s)).toMatchObject({ label: "0.250/0.282 mm measured", overall_source: "measured" });
    expect(label({ bare: 0.25, overall: 0.282 })).toBe("0.250/0.282 mm measured"); // bare numbers are mm
    expect(label("0.250/0.282 mm measured")).toBe("0.250/0.282 mm measured");
    expect(label({ bare: "10 mil", overall: "11.5 mil" })).toBe("0.254/0.2921 mm measured");
  });

  it("a measured bare diameter without overall in stock says that space fill cannot be checked", () => {
    expect(spec({ bare: "0.25 mm" }).assumed).toMatch(/no overall diameter/);
  });

  it("the original's wire is its bare copper: no build or grade is assumed", () => {
    expect(spec("33 AWG", "original")).toEqual({ system: "awg", size: "33" });
    expect(spec("0.25 mm", "original")).toEqual({ system: "metric", size: "0.250" });
    expect(spec("0.22 mm", "original")).toEqual({ system: "measured", size: "", bare: 0.22e-3 });
    expect(spec("36 SWG", "original")).toEqual({ system: "swg", size: "36" });
    const w = resolveWire(spec("33 AWG", "original"));
    expect(w.label).toBe("33 AWG");
    expect(w.overall_diameter).toBeNull();
  });

  it("a metric diameter that is no nominal size is a measured bare wire, and says so with the nearest sizes", () => {
    const s = spec("0.22 mm");
    expect(s).toMatchObject({ system: "measured", bare: 0.22e-3 });
    expect(s.assumed).toMatch(/0\.212 mm or 0\.224 mm/);
    expect(resolveWire(s)).toMatchObject({ label: "0.220 mm measured", overall_diameter: null, overall_source: "none" });
  });
});

describe("parseWireSpec: refusals name what would be right", () => {
  it("a misspelt system", () => {
    expect(message("33 AGW")).toBe(`unknown wire "33 AGW"; write it like "33 AWG heavy", "36 SWG", "0.25 mm grade 2" or { bare: 0.25 mm, overall: 0.282 mm }`);
    expect(message("copper")).toMatch(/write it like "33 AWG heavy"/);
    expect(message(null)).toMatch(/write it like/);
    expect(message(["0.25 mm"])).toMatch(/write it like/);
  });
  it("sizes that do not exist", () => {
    expect(message("60 AWG")).toMatch(/AWG runs from 4\/0 .* to 56/);
    expect(message("51 SWG")).toMatch(/SWG runs from 7\/0 to 50/);
    expect(message("0.25 mm grade 4")).toMatch(/grades 1, 2 and 3/);
    expect(message("36 SWG grade 5")).toMatch(/grades 1, 2 and 3/);
  });
  it("builds and grades in the wrong system", () => {
    expect(message("33 AWG grade 2")).toMatch(/film builds single, heavy or triple.*"33 AWG heavy"/);
    expect(message("36 SWG heavy")).toMatch(/"36 SWG grade 2"/);
    expect(message("33 AWG thick")).toMatch(/single, heavy or triple/);
  });
  it("a grade on a size that is not nominal names the nearest nominal sizes", () => {
    expect(message("0.254 mm grade 2")).toMatch(/0\.250 mm or 0\.265 mm/);
  });
  it("absurd diameters and readings", () => {
    expect(message(33)).toMatch(/too thick.*"33 AWG"/); // 33 mm: someone meant a gauge
    expect(message("0 mm")).toMatch(/more than 0/);
    expect(message("-0.2 mm")).toMatch(/more than 0/);
    expect(message({ bare: "0.25 mm", overall: "0.24 mm" })).toMatch(/must be more than the bare/);
    expect(message({ bare: "0.25 mm", overall: "2.5 mm" })).toMatch(/check the two readings/);
    expect(message({ overall: "0.282 mm" })).toMatch(/needs "bare"/);
    expect(message({ bare: "0.25 mm", overal: "0.282 mm" })).toMatch(/only "bare" and "overall", not "overal"/);
    expect(message({ bare: "0.25 V" })).toMatch(/^bare: unknown unit "V"/);
    expect(message("0.25 V")).toMatch(/unknown wire/);
  });
});

describe("labels parse back to the same wire (property)", () => {
  it("any AWG label printed by the catalogue", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: -3, max: 56 }),
        fc.constantFrom("single", "heavy", "triple"),
        fc.constantFrom<"stock" | "original">("stock", "original"),
        (n, build, role) => {
          const w = resolveWire({ system: "awg", size: awgName(n), build: build as "single" | "heavy" | "triple" });
          const back = resolveWire(spec(w.label, role));
          expect(back).toEqual(w);
        },
      ),
    );
  });
  it("every catalogue label, in stock and as an original", () => {
    for (const e of catalogue()) {
      for (const key of Object.keys(e.overall)) {
        const w = resolveWire(
          e.system === "awg"
            ? { system: "awg", size: e.size, build: key as "heavy" }
            : { system: e.system, size: e.size, grade: Number(key.slice(-1)) as 1 | 2 | 3 },
        );
        expect(resolveWire(spec(w.label))).toEqual(w);
      }
      // the bare entry label, as an original's wire, gives the same bare copper
      expect(resolveWire(spec(e.label, "original")).bare_diameter).toBe(e.bare_diameter);
    }
  });
  it("measured labels", () => {
    fc.assert(
      fc.property(fc.integer({ min: 20, max: 3000 }), fc.integer({ min: 1, max: 200 }), (bareUm, filmUm) => {
        const w = resolveWire({ system: "measured", size: "", bare: bareUm / 1e6, overall: (bareUm + filmUm) / 1e6 });
        const back = resolveWire(spec(w.label));
        expect(back.label).toBe(w.label);
        expect(back.bare_diameter).toBeCloseTo(w.bare_diameter, 12);
        expect(back.overall_diameter!).toBeCloseTo(w.overall_diameter!, 12);
      }),
    );
  });
});
