/**
 * Readings judged as they come in, at the bench, before the set is complete (the workbench's grid,
 * `diagnose --partial`). What a partial set can say, by the bench rules (docs/contracts.md "Bench
 * rules", src/bench/rules.ts):
 *  - each reading alone, against the reading the plan expects for it, within the level window
 *    (±5 % calibrated / ±15 % model, plus the conductor tolerance, plus one count): a hint only,
 *    since the level rule judges the median of the set, not one reading;
 *  - from SPREAD_FROM readings on, each against the median of those read so far (the spread rule,
 *    ±5 % plus one count; US Army TM 55-2210-223-34 for what a side suggests), and that median's
 *    level against the plan: with three or more, one odd reading cannot move the median;
 *  - the coils: from SPREAD_FROM readings on, the ring is solved (src/winding/diagnose.ts) with each
 *    reading not taken yet assumed to be as planned, scaled to the median so far; a coil is judged,
 *    and named as a suspect, only when a reading behind it has been taken. The full set's
 *    `diagnose` replaces these with the ring solved from readings alone.
 * Units: Ω at 20 °C; deviations and windows as fractions. Pure.
 */
import { barToBar } from "./ring.js";
import { DEFAULT_METER_RESOLUTION_OHM, judgeLevel, judgeSpread, median, readingName, type Level } from "../bench/rules.js";
import { coilsBehindReadings, diagnose, readingFailures, type CoilFinding, type DiagnoseOptions, type Failure, type Suspect } from "./diagnose.js";
import type { WindingLayout } from "./types.js";

/** Readings needed before the spread is judged against their median (a median of three is not moved by one odd reading; common practice, no published source). */
export const SPREAD_FROM = 3;

export interface PartialReading {
  /** r_i, 1-based. */
  index: number;
  name: string;
  bar: number;
  next_bar: number;
  /** False while the reading is blank. */
  read: boolean;
  /** At 20 °C, Ω; null when blank or open. */
  reading_ohm: number | null;
  open: boolean;
  /** What the plan expects between these bars, Ω; null for a layout-only job. */
  expected_ohm: number | null;
  /** The reading alone against the plan (the level window); null when blank, or without a plan. */
  alone: { deviation_fraction: number | null; window_fraction: number; pass: boolean } | null;
  /** Against the median of the readings so far (plan pattern divided out); null until SPREAD_FROM are in. */
  of_median_fraction: number | null;
  /** The spread rule's verdict; null until SPREAD_FROM readings are in (or while blank). */
  pass: boolean | null;
  /** Coils in series between the two bars. */
  coils: number[];
}

export interface PartialDiagnosis {
  ok: boolean;
  read: number;
  of: number;
  spread_from: number;
  /** Median of the readings so far (plan pattern divided out), Ω; null until SPREAD_FROM are in. */
  median_ohm: number | null;
  /** That median against the plan; null until SPREAD_FROM are in, or without a plan. */
  level: Level | null;
  readings: PartialReading[];
  /** Each coil as far as the readings behind it allow: verdict "unknown" until one of them is taken. */
  coils: CoilFinding[];
  failures: Failure[];
  suspects: Suspect[];
  notes: string[];
}

const mod1 = (n: number, m: number) => ((((n - 1) % m) + m) % m) + 1;

/**
 * Judge the readings typed so far: `readings` r1 … rC at 20 °C in Ω, null where not yet read,
 * Infinity for OL/open; `expectedCoilOhm` the plan's coil resistances (Ω, coil index order) or
 * null for a layout-only job. See the module comment for what each rule can say of a partial set.
 */
export function diagnosePartial(
  layout: WindingLayout,
  readings: (number | null)[],
  expectedCoilOhm: number[] | null,
  turns: number | null,
  options: DiagnoseOptions = {},
): PartialDiagnosis {
  const res = options.resolutionOhm ?? DEFAULT_METER_RESOLUTION_OHM;
  const calibrated = options.calibrated ?? false;
  const bare = options.bareDiameterM ?? 0.25e-3;
  const C = layout.bars;
  const expected = expectedCoilOhm
    ? barToBar(
        layout,
        expectedCoilOhm.map((x, i) => (layout.coils[i].dead ? 0 : x)),
      )
    : null;
  const behind = coilsBehindReadings(layout);
  const known = readings.flatMap((r, i) => (r === null ? [] : [i]));
  const spread =
    known.length >= SPREAD_FROM
      ? judgeSpread(
          known.map((i) => readings[i]!),
          known.map((i) => (expected ? expected[i] : 1)),
          res,
        )
      : null;
  const remapped = spread && { ...spread, rows: spread.rows.map((r) => ({ ...r, index: known[r.index] })) };
  const level =
    spread && expected
      ? judgeLevel(
          known.map((i) => readings[i]!),
          known.map((i) => expected[i]),
          calibrated,
          bare,
          res,
        )
      : null;
  const rows: PartialReading[] = readings.map((r, i) => {
    const row = remapped?.rows.find((x) => x.index === i);
    const alone = r !== null && expected ? judgeLevel([r], [expected[i]], calibrated, bare, res) : null;
    return {
      index: i + 1,
      name: readingName(i),
      bar: i + 1,
      next_bar: mod1(i + 2, C),
      read: r !== null,
      reading_ohm: r !== null && Number.isFinite(r) ? r : null,
      open: r === Infinity,
      expected_ohm: expected ? expected[i] : null,
      alone: alone && {
        deviation_fraction: Number.isFinite(alone.deviation_fraction) ? alone.deviation_fraction : null,
        window_fraction: alone.window_fraction,
        pass: alone.pass,
      },
      of_median_fraction: row && Number.isFinite(row.of_median_fraction) ? row.of_median_fraction : null,
      pass: row ? row.pass : null,
      coils: behind[i],
    };
  });
  const failures = remapped ? readingFailures(layout, remapped, level, behind, expected !== null) : [];
  const ring = spread ? ringSoFar(layout, readings, expected, known, spread.median_ohm, behind, expectedCoilOhm, turns, options) : null;
  return {
    ok: failures.length === 0,
    read: known.length,
    of: C,
    spread_from: SPREAD_FROM,
    median_ohm: spread ? spread.median_ohm : null,
    level,
    readings: rows,
    coils: ring?.coils ?? layout.coils.map((c) => unknownCoil(c, expectedCoilOhm)),
    failures,
    suspects: ring?.suspects ?? [],
    notes: [partialNote(known.length, C, expected !== null)],
  };
}

function unknownCoil(c: WindingLayout["coils"][number], expected: number[] | null): CoilFinding {
  return {
    index: c.index,
    start_bar: c.start_bar,
    end_bar: c.end_bar,
    go_slot: c.go_slot,
    return_slot: c.return_slot,
    resistance_ohm: null,
    expected_ohm: expected ? expected[c.index - 1] : null,
    reference_ohm: null,
    deviation_fraction: null,
    verdict: c.dead ? "dead" : "unknown",
  };
}

/** The ring solved with each reading not taken yet as planned at the median so far; only coils behind a taken reading keep their verdict and suspects. */
function ringSoFar(
  layout: WindingLayout,
  readings: (number | null)[],
  expected: number[] | null,
  known: number[],
  medianOhm: number,
  behind: number[][],
  expectedCoilOhm: number[] | null,
  turns: number | null,
  options: DiagnoseOptions,
): { coils: CoilFinding[]; suspects: Suspect[] } {
  const mE = expected ? median(known.map((i) => expected[i])) : 1;
  const filled = readings.map((r, i) => r ?? (medianOhm * (expected ? expected[i] : 1)) / mE);
  const full = diagnose(layout, filled, expectedCoilOhm, turns, undefined, options);
  const covered = new Set(known.flatMap((i) => behind[i]));
  const read = new Set(known.map((i) => readingName(i)));
  const coils = full.coils.map((c) => (covered.has(c.index) ? c : unknownCoil(layout.coils[c.index - 1], expectedCoilOhm)));
  const suspects = full.suspects.filter((s) =>
    s.coils.length ? s.coils.every((k) => covered.has(k)) : s.readings.length > 0 && s.readings.every((n) => read.has(n)),
  );
  return { coils, suspects };
}

/** What a set of n readings out of C can say, in words. */
export function partialNote(n: number, C: number, planned: boolean): string {
  const alone = planned ? "each reading is judged alone against the reading the plan expects (the level window; a hint, since the rule judges the median)" : "";
  const spread = `from ${SPREAD_FROM} readings on, each against the median of those read so far (the spread rule; one odd reading cannot move a median of ${SPREAD_FROM}), and each coil behind a reading taken is solved with the rest assumed as planned at that median`;
  return `${n} of ${C} readings: ${alone ? `${alone}; ` : ""}${spread}. The set's verdict and each coil's own resistance (the ring solved) come with all ${C}.`;
}
