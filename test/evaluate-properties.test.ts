/**
 * ONE evaluation of a winding (src/design/evaluate.ts): the sweep's cheap figures are the full
 * evaluation's, over random armatures (tooth, lap and wave; slot counts, poles, spans, stacks, slot
 * sizes, turn-length sources) and random candidates (turns, stock wire, strands in hand).
 *
 * Both modes compute with the same functions; the cheap one gets the terminal reading of coils of
 * unequal turn length (lap and wave coils riding over earlier ones) in closed form from the arcs
 * the brushes cut the winding into, the full one from the ring network (src/winding/ring.ts).
 * Every figure agrees to rounding (1e-9 relative; the error fraction, a difference, to 1e-6).
 */
import fc from "fast-check";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { buildContext, type ArmatureContext } from "../src/design/context.js";
import type { Calibration } from "../src/design/types.js";
import { calibrateOriginal } from "../src/design/calibration.js";
import { makeEvaluator, type Evaluator } from "../src/design/evaluate.js";
import { planJob } from "../src/design/plan.js";
import { compareMissing, MeetingRank, TopList } from "../src/design/rank.js";
import { sweep, MAX_TURNS, type SweepOptions, type SweepResult } from "../src/design/sweep.js";
import type { Candidate, RejectCode } from "../src/design/types.js";
import { maxConductorsForFill } from "../src/armature/fill.js";
import type { Wire } from "../src/wire/types.js";
import { defaultStock } from "../src/wire/catalogue.js";
import { ArmwindError } from "../src/errors.js";
import { loadJobText } from "./helpers/cli.js";

const stock = defaultStock().filter((w) => w.bare_diameter <= 0.8e-3);

interface Arm {
  style: "tooth" | "lap" | "wave";
  slots: number;
  poles: number;
  u: number;
  spanFrac: number;
  stack: number;
  rotor: number;
  depth: number;
  turns: number;
  wireMm: number;
  mltSource: "model" | "length" | "measured";
  goal: "no_load_speed" | "kv" | "duty" | "stall_current";
}

const arbArm: fc.Arbitrary<Arm> = fc.record({
  style: fc.constantFrom("tooth", "lap", "wave") as fc.Arbitrary<Arm["style"]>,
  slots: fc.integer({ min: 3, max: 31 }),
  poles: fc.constantFrom(2, 2, 4),
  u: fc.integer({ min: 1, max: 3 }),
  spanFrac: fc.double({ min: 0.6, max: 1, noNaN: true }),
  stack: fc.integer({ min: 8, max: 60 }),
  rotor: fc.integer({ min: 16, max: 80 }),
  depth: fc.double({ min: 0.15, max: 0.3, noNaN: true }),
  turns: fc.integer({ min: 5, max: 80 }),
  wireMm: fc.constantFrom(0.2, 0.25, 0.315, 0.4, 0.5, 0.63),
  mltSource: fc.constantFrom("model", "length", "measured") as fc.Arbitrary<Arm["mltSource"]>,
  goal: fc.constantFrom("no_load_speed", "kv", "duty", "stall_current") as fc.Arbitrary<Arm["goal"]>,
});

/** The series goals and the motor data that go with them (a universal motor on 230 V 50 Hz, or a series DC motor; invented). */
type SeriesGoal = "restore" | "duty" | "convert";
interface SeriesMotorData {
  goal: SeriesGoal;
  ac: boolean;
}

/** The series field, its tests and nameplate, and the target, for a random series armature (invented values, test data only). */
function seriesParts(m: SeriesMotorData): { field: string; original: string; target: string } {
  const f = m.ac ? ", frequency: 50 Hz" : "";
  const supply = m.ac ? "{ value: 230 V, kind: ac, frequency: 50 Hz }" : "230 V";
  const goal = {
    restore: "goal: restore",
    duty: "goal: duty\n  duty: { torque: 0.1 N m, speed: 15000 rpm }\n  tolerance: 0.1\n  limits: { current_density: 20 A/mm2 }",
    convert: "goal: convert\n  tolerance: 0.1",
  }[m.goal];
  return {
    field: `field_winding:\n  resistance: { value: 3 ohm, at: 20 C }\n${m.ac ? "  inductance: 50 mH\n" : ""}`,
    original:
      `${m.ac ? "  armature_inductance: 30 mH\n" : ""}  tests:\n` +
      `    - { supply: 230 V, no_load_current: 0.5 A, no_load_speed: 20000 rpm${f} }\n` +
      `    - { supply: 120 V, no_load_current: 0.4 A, no_load_speed: 12000 rpm${f} }\n` +
      `  nameplate: { supply: 230 V, current: 1.5 A, speed: 12000 rpm${f} }\n`,
    target: `supply: ${m.goal === "convert" ? (m.ac ? "{ value: 120 V, kind: ac, frequency: 50 Hz }" : "120 V") : supply}\n  ${goal}`,
  };
}

/** A job text for a random armature (invented values, test data only); null when the layout cannot exist. */
function jobText(a: Arm, series?: SeriesMotorData): string | null {
  const u = a.style === "tooth" ? 1 : a.u;
  const bars = a.slots * u;
  if (a.style === "wave" && ((bars + 1) % (a.poles / 2) !== 0 || a.poles === 2)) return null;
  if (a.style === "lap" && a.poles > 2 && (a.slots % (a.poles / 2) !== 0 || bars % (a.poles / 2) !== 0)) return null;
  const span = a.style === "tooth" ? 1 : Math.max(1, Math.round((a.spanFrac * a.slots) / a.poles));
  const depth = a.rotor * a.depth;
  const pitch = (Math.PI * (a.rotor - depth)) / a.slots;
  const wTop = pitch * 0.55;
  const wBottom = pitch * 0.4;
  if (wBottom < 1) return null;
  const goalLine = {
    no_load_speed: "goal: no_load_speed\n  no_load_speed: 6000 rpm\n  tolerance: 0.1",
    kv: "goal: kv\n  kv: 500 rpm/V\n  tolerance: 0.1",
    duty: "goal: duty\n  duty: { torque: 5 mN m, speed: 4000 rpm }\n  tolerance: 0.1\n  limits: { current_density: 12 A/mm2 }",
    stall_current: "goal: stall_current\n  stall_current: 5 A\n  tolerance: 0.2\n  rated_current: 1 A",
  }[a.goal];
  const mlt = a.mltSource === "measured" ? `  mean_turn_length: ${2 * a.stack + (a.style === "tooth" ? 1 : 2.5) * a.rotor} mm\n` : "";
  const len = a.mltSource === "length" ? `  wire_length: ${(((2 * a.stack + 1.2 * a.rotor) * a.turns * bars) / 1000).toFixed(2)} m\n` : "";
  const sp = series ? seriesParts(series) : null;
  return `version: 1
id: prop-job
title: random armature (invented)
armature:
  slots: ${a.slots}
  bars: ${bars}
  field_poles: ${a.poles}
  field: ${sp ? "series" : "permanent_magnet"}
  stack_length: ${a.stack} mm
  rotor_diameter: ${a.rotor} mm
  tooth_width: ${(pitch * 0.45).toFixed(2)} mm
  slot: { width_top: ${wTop.toFixed(2)} mm, width_bottom: ${wBottom.toFixed(2)} mm, depth: ${depth.toFixed(2)} mm, opening: ${(wTop * 0.6).toFixed(2)} mm, liner: 0.15 mm }
winding:
  style: ${a.style}
  span: ${span}
  coils_per_slot: ${u}
${mlt}  brushes: { count: 2, width_bars: 1, material: carbon }
${sp ? sp.field : ""}original:
  turns: ${a.turns}
  wire: ${a.wireMm} mm
${len}${sp ? sp.original : "  tests:\n    - { supply: 12 V, no_load_current: 0.3 A, no_load_speed: 5000 rpm }\n"}target:
  ${sp ? sp.target : `supply: 12 V\n  ${goalLine}`}
max_in_hand: 3
`;
}

/** Check that the cheap evaluation of each picked winding equals the full one; how many were checked, with unequal coils, on the series model. */
function checkPicks(text: string | null, picks: [number, number, number][]): { checked: number; unequal: number; series: number; running: number } {
  const none = { checked: 0, unequal: 0, series: 0, running: 0 };
  if (text === null) return none;
  let ctx: ArmatureContext;
  let ev: ReturnType<typeof makeEvaluator>;
  try {
    ctx = buildContext(loadJobText(text));
    const cal: Calibration = calibrateOriginal(ctx).calibration;
    ev = makeEvaluator(ctx, cal);
  } catch (e) {
    if (e instanceof ArmwindError) return none; // an armature the loader, the geometry or the series fit refuses: not this property's concern
    throw e;
  }
  const mlts = ctx.layout.coils.filter((c) => !c.dead).map((c) => c.rides_over);
  const equalCoils = ctx.layout.spec.style === "tooth" || mlts.every((r) => r === mlts[0]);
  const out = { ...none };
  for (const [turns, wi, strands] of picks) {
    const w = { turns, wire: stock[wi], strands };
    // more copper than a slot can hold is never swept (src/design/sweep.ts stops at the fill limit + 15 %)
    if ((ctx.sides * turns * strands * w.wire.area) / ctx.slot.free_area > 0.6) continue;
    const cheap = ev.evaluate(turns, w.wire, strands);
    const full = ev.full(w);
    out.checked++;
    const same = (x: number | null, y: number | null, tol = 1e-9) => {
      if (x === null || y === null) return expect(x).toBe(y);
      expect(Math.abs(x - y)).toBeLessThanOrEqual(tol * Math.max(Math.abs(x), Math.abs(y), 1e-300));
    };
    same(cheap.copper_fill, full.copper_fill);
    same(cheap.space_fill, full.space_fill);
    expect(cheap.build).toEqual(full.build);
    same(cheap.mlt, full.mlt);
    same(cheap.coil_ohm, full.coil_ohm);
    same(cheap.copper_mass, full.copper_mass);
    same(cheap.ke, full.ke);
    same(cheap.terminal_ohm, full.terminal_ohm);
    same(cheap.terminal_hot_ohm, full.terminal_hot_ohm);
    same(cheap.achieved, full.achieved);
    same(cheap.error, full.error, 1e-6);
    same(cheap.stall_current_hot, full.stall_current_hot);
    same(cheap.stall_current_cold, full.stall_current_cold);
    same(cheap.current_density, full.current_density);
    same(cheap.duty_input_w, full.duty_input_w);
    expect(cheap.rejected_because).toEqual(full.rejected_because);
    expect(cheap.meets_goal).toBe(full.meets_goal);
    if (ev.physics.series) {
      // the series model's own figures: the sweep's goal figure is the full report's (duty: the duty point; convert: the
      // speed at the original's rated torque on the new supply, the report's rated point), never a constant-field figure
      out.series++;
      expect(full.motor.series).not.toBeNull();
      expect(full.stall_current_hot).toBeNull();
      if (ev.goal !== "restore" && (cheap.achieved ?? 0) > 0) out.running++;
      if (ev.goal === "duty") same(cheap.achieved, full.duty?.speed ?? 0);
      if (ev.goal === "convert") same(cheap.achieved, full.motor.series!.rated?.speed ?? 0);
    }
    if (!equalCoils) out.unequal++;
  }
  return out;
}

const arbPicks = fc.array(fc.tuple(fc.integer({ min: 1, max: 150 }), fc.integer({ min: 0, max: stock.length - 1 }), fc.integer({ min: 1, max: 3 })), {
  minLength: 1,
  maxLength: 6,
});

describe("the sweep's figures are the full evaluation's (property)", () => {
  it("over random armatures and candidates", () => {
    let checked = 0;
    let unequal = 0;
    fc.assert(
      fc.property(arbArm, arbPicks, (a, picks) => {
        const r = checkPicks(jobText(a), picks);
        checked += r.checked;
        unequal += r.unequal;
      }),
      { numRuns: 150 },
    );
    expect(checked).toBeGreaterThan(150);
    expect(unequal).toBeGreaterThan(0);
  });

  it("over random series and universal armatures (the series model behind the same evaluation)", () => {
    let series = 0;
    let running = 0;
    const arbSeries = fc.record({
      goal: fc.constantFrom("restore", "duty", "convert") as fc.Arbitrary<SeriesGoal>,
      ac: fc.boolean(),
    });
    fc.assert(
      fc.property(arbArm, arbSeries, arbPicks, (a, m, picks) => {
        const r = checkPicks(jobText(a, m), picks);
        series += r.series;
        running += r.running;
      }),
      { numRuns: 80 },
    );
    expect(series).toBeGreaterThan(60);
    expect(running).toBeGreaterThan(20); // duty and convert windings that carry their load: the series model predicted them
  });
});

describe("the plan lists full evaluations", () => {
  it("every candidate the plan shows has the network's terminal reading (chair demo, a wave winding whose coils ride)", () => {
    const job = loadJobText(readFileSync(new URL("../jobs/chair-wave-0045.yaml", import.meta.url), "utf8"));
    const p = planJob(job);
    expect(p.design.terminal_ohm).toBe(p.resistance.terminal_ohm);
    const ev = makeEvaluator(buildContext(job), p.calibration);
    for (const c of p.candidates) expect(c.terminal_ohm / ev.full({ turns: c.turns, wire: c.wire, strands: c.strands }).terminal_ohm - 1).toBeCloseTo(0, 12);
  });
});

/**
 * The sweep as it was written before it made Candidates only for what its lists keep
 * (src/design/sweep.ts): every candidate evaluated by `ev.evaluate`, every one offered. The turns
 * range (fill limit + 15 %, + 1) is the sweep's own rule, written out again here.
 */
function straightforwardSweep(ev: Evaluator, opts: SweepOptions, keep = 20): SweepResult {
  const meeting = new MeetingRank(ev.goal, keep);
  const missing = compareMissing(ev.tolerance);
  const nearest = new TopList<Candidate>(keep, missing);
  const nearFit = new TopList<Candidate>(5, missing);
  const nearOver = new TopList<Candidate>(5, missing);
  const rejections: Partial<Record<RejectCode, number>> = {};
  let total = 0;
  for (const wire of opts.wires) {
    for (let k = opts.fixedStrands ?? 1; k <= (opts.fixedStrands ?? opts.maxInHand); k++) {
      const nFit = Math.floor(maxConductorsForFill(ev.fillLimit, wire.area, opts.freeArea) / (opts.sides * k));
      const lo = opts.fixedTurns ?? 1;
      const hi = opts.fixedTurns ?? Math.min(MAX_TURNS, Math.max(1, Math.ceil(nFit * 1.15) + 1));
      for (let n = lo; n <= hi; n++) {
        const c = ev.evaluate(n, wire, k);
        total++;
        for (const r of c.rejected_because) rejections[r] = (rejections[r] ?? 0) + 1;
        if (c.meets_goal) meeting.offer(c);
        else {
          nearest.offer(c);
          (c.rejected_because.length === 0 ? nearFit : nearOver).offer(c);
        }
      }
    }
  }
  const ranked = meeting.ranked();
  const best = ranked[0] ?? nearest.items[0] ?? null;
  const shown = meeting.count === 0 ? nearest.items : [...ranked, ...nearFit.items, ...nearOver.items];
  return { best, shown: shown.filter((c, i) => shown.indexOf(c) === i), total, rejections, meeting: meeting.count };
}

/** A stock wire whose overall diameter is not known (its fit checks stop at the copper fill). */
const noOverall = (w: Wire): Wire => ({ ...w, label: `${w.label} (overall unknown)`, overall_diameter: null, overall_source: "none" });

describe("the sweep keeps what it would keep if it made every candidate (property)", () => {
  it("over random armatures, goals, stocks (an unknown overall diameter among them), strands, fixed turns, list sizes", () => {
    let fullLists = 0;
    let manyMeeting = 0;
    const arbStock = fc.tuple(fc.integer({ min: 0, max: stock.length - 12 }), fc.integer({ min: 1, max: 12 }), fc.boolean());
    const fixedTurns: fc.Arbitrary<[number, number | null]> = fc.tuple(fc.integer({ min: 1, max: 120 }), fc.option(fc.integer({ min: 1, max: 3 })));
    const arbFixed = fc.oneof({ arbitrary: fc.constant(null), weight: 3 }, { arbitrary: fixedTurns, weight: 1 });
    fc.assert(
      fc.property(arbArm, arbStock, fc.integer({ min: 1, max: 3 }), arbFixed, fc.constantFrom(2, 5, 20), (a, [from, n, unknown], maxInHand, fixed, keep) => {
        const text = jobText(a);
        if (text === null) return;
        let ctx: ArmatureContext;
        let ev: Evaluator;
        try {
          ctx = buildContext(loadJobText(text));
          ev = makeEvaluator(ctx, calibrateOriginal(ctx).calibration);
        } catch (e) {
          if (e instanceof ArmwindError) return;
          throw e;
        }
        const wires = stock.slice(from, from + n);
        if (unknown) wires.splice(1, 0, noOverall(wires[0]));
        const opts: SweepOptions = { wires, maxInHand, sides: ctx.sides, freeArea: ctx.slot.free_area };
        if (fixed) {
          opts.fixedTurns = fixed[0];
          if (fixed[1] !== null) opts.fixedStrands = fixed[1];
        }
        const got = sweep(ev, opts, keep);
        const want = straightforwardSweep(ev, opts, keep);
        expect(got).toEqual(want);
        // the plan swaps the best for its full evaluation in the shown list by identity (src/design/plan.ts)
        expect(got.best === null || got.shown.includes(got.best)).toBe(want.best === null || want.shown.includes(want.best));
        expect(Object.keys(got.rejections)).toEqual(Object.keys(want.rejections)); // their order too (the plan lists them)
        if (got.meeting > 3 * keep) manyMeeting++;
        if (got.total - got.meeting > 3 * keep) fullLists++;
      }),
      { numRuns: 100 },
    );
    expect(manyMeeting).toBeGreaterThan(3); // lists of a turns count that were full when offered more
    expect(fullLists).toBeGreaterThan(20);
  });
});
