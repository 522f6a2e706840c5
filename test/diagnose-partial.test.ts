/** Readings judged as they are typed (src/winding/diagnose-partial.ts): what a partial set can say, and that the full set says what `diagnose` says. */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { diagnose } from "../src/winding/diagnose.js";
import { diagnosePartial, SPREAD_FROM } from "../src/winding/diagnose-partial.js";
import { barToBar } from "../src/winding/ring.js";
import { layoutWinding } from "../src/winding/layout.js";
import { spec } from "./helpers/winding.js";

const tooth5 = layoutWinding(spec({ style: "tooth", slots: 5, bars: 5, span: 1 }));
const lap12 = layoutWinding(spec({}));
const planned = (n: number) => Array.from({ length: n }, () => 1.0);

describe("diagnosePartial", () => {
  it("one coil 9 % low on a 5-bar ring (invented readings): named once its reading and two others are in, not before", () => {
    const coils = [1, 1, 0.91, 1, 1];
    const full = barToBar(tooth5, coils);
    const some = full.map((r, i) => ([0, 1, 3].includes(i) ? r : null));
    const before = diagnosePartial(tooth5, some, planned(5), 40);
    expect(before.suspects).toEqual([]);
    expect(before.coils[2].verdict).toBe("unknown");
    const withR3 = diagnosePartial(
      tooth5,
      full.map((r, i) => ([0, 2, 3].includes(i) ? r : null)),
      planned(5),
      40,
    );
    expect(withR3.suspects.map((s) => s.coils)).toEqual([[3]]);
    expect(withR3.coils[2].verdict).toBe("low");
  });

  it(`fewer than ${SPREAD_FROM} readings: each judged alone against the plan's level window, no spread, no median, no suspect`, () => {
    const r = barToBar(tooth5, planned(5));
    const d = diagnosePartial(tooth5, [r[0] * 1.3, null, null, null, r[4]], planned(5), 40, { resolutionOhm: 0.001 });
    expect(d.median_ohm).toBeNull();
    expect(d.readings[0].alone?.pass).toBe(false);
    expect(d.readings[0].alone?.deviation_fraction).toBeCloseTo(0.3, 12);
    expect(d.readings[4].alone?.pass).toBe(true);
    expect(d.readings.map((x) => x.pass)).toEqual([null, null, null, null, null]);
    expect(d.suspects).toEqual([]);
    expect(d.ok).toBe(true);
    expect(d.notes[0]).toMatch(/^2 of 5 readings/);
  });

  it("an open reading among three is a failing reading, with the coil behind it", () => {
    const r = barToBar(lap12, planned(12));
    const d = diagnosePartial(
      lap12,
      r.map((x, i) => (i < 3 ? x : i === 5 ? Infinity : null)),
      planned(12),
      10,
    );
    expect(d.ok).toBe(false);
    expect(d.failures.map((f) => f.reading)).toEqual(["r6"]);
    expect(d.readings[5].open).toBe(true);
  });

  it("with every reading in, it says what diagnose says (failures, coil verdicts, the suspects that name a coil)", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0.6, max: 1.4, noNaN: true }), { minLength: 12, maxLength: 12 }), (coils) => {
        const readings = barToBar(lap12, coils);
        const whole = diagnose(lap12, readings, planned(12), 10);
        const part = diagnosePartial(lap12, readings, planned(12), 10);
        expect(part.failures).toEqual(whole.failures);
        expect(part.coils.map((c) => c.verdict)).toEqual(whole.coils.map((c) => c.verdict));
        expect(part.suspects).toEqual(whole.suspects.filter((s) => s.coils.length > 0 || s.readings.length > 0));
      }),
      { numRuns: 60 },
    );
  });
});
