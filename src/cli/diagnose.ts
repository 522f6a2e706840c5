/**
 * `armwind diagnose JOB (--bars r1,r2,… [--temperature T] | --measured FILE | --record FILE)
 * [--tolerance F] [--resolution R] [--json] [--logbook DIR] [--no-learn]`: judge the readings by the
 * bench rules (src/bench/rules.ts), solve the ring for each coil's own resistance and name the coils
 * behind each failing reading (src/winding/diagnose.ts does the work; this is the shell). JOB may be
 * a layout-only job (version, id, armature, winding): the readings are then judged against their
 * own median. Exit 4 when a reading fails a bench rule.
 */
import type { Argv } from "yargs";
import { resolve } from "node:path";
import { planJob } from "../design/plan.js";
import { windingSpec } from "../design/context.js";
import { layoutWinding } from "../winding/layout.js";
import { isLayoutOnly, layoutJobSchema, layoutJobSpec } from "../winding/layout-job.js";
import { ArmwindError, inputError, type Problem } from "../errors.js";
import { parseQuantity } from "../job/units.js";
import { rangeProblem } from "../job/ranges.js";
import { loadYaml } from "../job/load.js";
import { readText, readUserFile, guarded, loadJobText, isStdin, type Io, type Where } from "./io.js";
import { RECORD_FILE_LIMIT } from "../files.js";
import { logbookOptionsFor } from "./learning.js";
import { loadMeasured } from "./log.js";
import { predictWound, type WoundInput } from "../logbook/predict.js";
import { recordSchema, type LogRecord } from "../logbook/record.js";
import { diagnose, type Diagnosis } from "../winding/diagnose.js";
import { diagnosePartial, SPREAD_FROM, type PartialDiagnosis } from "../winding/diagnose-partial.js";
import { fourWireAdvice, isOpenText, type Level, NULL_LEADS, readingName, turnLengthCalibrated } from "../bench/rules.js";
import { resolveMeter, withResolution } from "./meter.js";
import { to20C } from "../wire/copper.js";
import { ohm, sig, signedPct, table } from "./format.js";
import type { Job } from "../job/schema.js";
import type { WindingSpec } from "../winding/types.js";
import { z } from "zod";
import { withJob, withLogbook } from "./options.js";
import { COMMAND_TEXT } from "./commands.js";

export interface DiagnoseInput {
  /** Readings r1 … rC as read, Ω; Infinity for OL/open. */
  readings: number[];
  /** Winding temperature when read, °C. */
  temperature: number;
  temperatureGiven: boolean;
  /** Expected coil resistances at 20 °C, Ω (coil index order); null for a layout-only job. */
  expected: number[] | null;
  /** Turns per coil; null when not known (layout-only job). */
  turns: number | null;
  /** Meter resolution, Ω, as the bench rules resolve it: --resolution, $ARMWIND_METER_RESOLUTION, the measured file's or record's, the shop profile's, else 0.1 Ω. */
  resolution: number;
  /** The plan's turn length was measured or calibrated (level ±5 %, else ±15 %). */
  calibrated: boolean;
  /** Bare diameter of the wire laid, m; null when not known. */
  bareDiameter: number | null;
  source: string;
}

/**
 * `--bars 1.05,1.05,OL,…` → Ω; each item may carry a unit ("1.05 ohm", "1050 mohm"), or read OL / open (Infinity).
 * With `partial`, an item left blank (`1.05,,1.04,…`) is a reading not taken yet: null.
 */
export function parseBars(text: string, bars: number): number[];
export function parseBars(text: string, bars: number, partial: true): (number | null)[];
export function parseBars(text: string, bars: number, partial = false): (number | null)[] {
  const items = text.split(",").map((s) => s.trim());
  const problems: Problem[] = [];
  const out = items.map((s, i) => {
    if (partial && s === "") return null;
    if (isOpenText(s)) return Infinity;
    const r = parseQuantity(s === "" ? "x" : s, "resistance");
    if (!r.ok) {
      problems.push({ code: "bad_quantity", path: `--bars[${i}]`, message: `${readingName(i)} "${s}": ${r.message}; or OL / open for an open circuit` });
      return NaN;
    }
    const outside = rangeProblem("resistance", r.value, 0);
    if (outside) problems.push({ code: "out_of_range", path: `--bars[${i}]`, message: `${readingName(i)} "${s}": ${outside}` });
    return r.value;
  });
  if (problems.length) throw new ArmwindError(problems);
  if (out.length !== bars) {
    throw inputError(
      "readings_count",
      "--bars",
      `${out.length} bar-to-bar readings for ${bars} bars; give r1 … r${bars} separated by commas (r_i between bar i and bar i+1, r${bars} between bar ${bars} and bar 1)${partial ? ", a blank for each one not read yet" : ""}`,
    );
  }
  return out;
}

function loadRecordFile(io: Io, file: string, job: { id: string; armature: { bars: number } }): LogRecord {
  const text = isStdin(file) ? readText(io, file) : readUserFile(resolve(io.cwd, file), { limit: RECORD_FILE_LIMIT, name: file });
  const r = loadYaml(text, file, recordSchema);
  const rec = r.value as unknown as LogRecord;
  const problems: Problem[] = [];
  if (rec.job.id !== job.id)
    problems.push({
      code: "job_mismatch",
      path: "job.id",
      message: `the record is of job "${rec.job.id}", not "${job.id}"; give the job file of ${rec.job.id}`,
      file,
      ...r.locate(["job", "id"]),
    });
  if (rec.measured.bar_to_bar_ohm.length !== job.armature.bars) {
    problems.push({
      code: "readings_count",
      path: "measured.bar_to_bar_ohm",
      message: `the record holds ${rec.measured.bar_to_bar_ohm.length} bar-to-bar readings for the job's ${job.armature.bars} bars`,
      file,
      ...r.locate(["measured", "bar_to_bar_ohm"]),
    });
  }
  const coils = (rec.predicted as { coil_ohm?: unknown }).coil_ohm;
  if (!Array.isArray(coils) || coils.some((x) => typeof x !== "number" || !(x > 0))) {
    problems.push({
      code: "record_damaged",
      path: "predicted.coil_ohm",
      message: "the record holds no expected coil resistances (predicted.coil_ohm)",
      file,
      ...r.locate(["predicted"]),
    });
  }
  if (problems.length) throw new ArmwindError(problems);
  return rec;
}

const nullable = (x: number | null) => (x !== null && Number.isFinite(x) ? x : null);

export function diagnoseJson(job: { id: string }, input: DiagnoseInput, d: Diagnosis) {
  return {
    ok: d.ok,
    errors: [],
    failures: d.failures.map((f) => ({ ...f, reading_ohm: nullable(f.reading_ohm) })),
    job_id: job.id,
    source: input.source,
    temperature_c: input.temperature,
    turns_per_coil: input.turns,
    meter_resolution_ohm: input.resolution,
    median_ohm: nullable(d.median_ohm),
    level: levelJson(d.level),
    coils: d.coils.map((c) => ({
      index: c.index,
      start_bar: c.start_bar,
      end_bar: c.end_bar,
      go_slot: c.go_slot,
      return_slot: c.return_slot,
      resistance_ohm: c.resistance_ohm,
      expected_ohm: c.expected_ohm,
      reference_ohm: c.reference_ohm,
      deviation_fraction: c.deviation_fraction,
      verdict: c.verdict,
    })),
    suspects: d.suspects.map((s) => ({
      kind: s.kind,
      coils: s.coils,
      bars: s.bars,
      readings: s.readings,
      turns_estimate: s.turns_estimate,
      message: s.message,
    })),
    readings: d.readings.map((r, i) => ({
      index: r.index,
      name: readingName(i),
      bar: r.bar,
      next_bar: r.next_bar,
      reading_ohm: Number.isFinite(input.readings[i]) ? input.readings[i] : null,
      reading_20c_ohm: r.reading_ohm,
      expected_ohm: r.expected_ohm,
      of_median_fraction: r.of_median_fraction,
      pass: r.pass,
      coils: r.coils,
    })),
    tolerance_fraction: d.tolerance,
    tolerance_source: d.tolerance_source,
    residual_fraction: d.residual_fraction,
    notes: d.notes,
    warnings: d.warnings,
  };
}

/** `diagnose --partial --json`: the readings so far, each as far as the set allows (src/winding/diagnose-partial.ts). */
export function partialJson(job: { id: string }, input: DiagnoseInput, d: PartialDiagnosis) {
  return {
    ok: d.ok,
    errors: [],
    partial: true,
    job_id: job.id,
    source: input.source,
    temperature_c: input.temperature,
    turns_per_coil: input.turns,
    meter_resolution_ohm: input.resolution,
    read: d.read,
    of: d.of,
    spread_from: d.spread_from,
    median_ohm: nullable(d.median_ohm),
    level: levelJson(d.level),
    readings: d.readings.map((r, i) => ({ ...r, reading_as_read_ohm: r.read && !r.open ? input.readings[i] : null })),
    coils: d.coils,
    failures: d.failures.map((f) => ({ ...f, reading_ohm: nullable(f.reading_ohm) })),
    suspects: d.suspects.map((s) => ({
      kind: s.kind,
      coils: s.coils,
      bars: s.bars,
      readings: s.readings,
      turns_estimate: s.turns_estimate,
      message: s.message,
    })),
    notes: d.notes,
    warnings: [],
  };
}

function partialText(job: { id: string }, d: PartialDiagnosis): string {
  const L = [`${job.id}: ${d.notes[0]}`];
  for (const r of d.readings) {
    if (!r.read) continue;
    const alone = r.alone
      ? r.alone.deviation_fraction === null
        ? "open"
        : `${signedPct(r.alone.deviation_fraction)} from the plan's ${ohm(r.expected_ohm!)} (${r.alone.pass ? "within" : "outside"} ±${sig(r.alone.window_fraction * 100)} %)`
      : "";
    const spread =
      r.pass === null ? "" : `; ${r.of_median_fraction === null ? "open" : `${signedPct(r.of_median_fraction)} from the median`}: ${r.pass ? "ok" : "OUT"}`;
    L.push(`  ${r.name} ${r.open ? "OL" : ohm(r.reading_ohm!)}  ${alone}${spread}`);
  }
  for (const f of d.failures) L.push(`  ✗ ${f.message}`);
  for (const s of d.suspects) L.push(`  ! ${s.message} [${s.kind}]`);
  L.push(d.ok ? "No reading so far is outside the bench rules." : "A reading so far is outside the bench rules (exit status 4).");
  return L.join("\n");
}

/** The level judgement as JSON (unknowable figures null), the same for a full and a partial set. */
function levelJson(level: Level | null) {
  return (
    level && {
      median_ohm: nullable(level.median_ohm),
      expected_median_ohm: level.expected_median_ohm,
      deviation_fraction: nullable(level.deviation_fraction),
      window_fraction: level.window_fraction,
      pass: level.pass,
      source: level.source,
    }
  );
}

export function diagnoseText(job: { id: string }, input: DiagnoseInput, d: Diagnosis): string {
  const L: string[] = [];
  L.push(
    `${job.id}: ${input.readings.length} bar-to-bar readings (${input.source}), ${input.turns === null ? "turns not known (layout only)" : `${input.turns} turns a coil`}`,
  );
  L.push(
    input.temperatureGiven
      ? `Read at ${input.temperature} °C, corrected to 20 °C (IEC 60028, 0.00393/K)${input.expected ? " against the plan's coil resistances at 20 °C" : ""}`
      : "Temperature not given: the readings are taken as read at 20 °C (give --temperature for a winding that is warmer or colder)",
  );
  L.push("");
  const rows = d.coils.map((c) => [
    String(c.index),
    `${c.go_slot}–${c.return_slot}`,
    c.start_bar === null ? "dead" : `${c.start_bar}–${c.end_bar}`,
    c.resistance_ohm === null ? "—" : ohm(c.resistance_ohm),
    c.reference_ohm === null ? "—" : ohm(c.reference_ohm),
    c.deviation_fraction === null ? "" : signedPct(c.deviation_fraction),
    c.verdict === "ok" ? "ok" : c.verdict.toUpperCase(),
  ]);
  L.push(
    table(["coil", "slots", "bars", "solved Ω", d.level?.pass ? "expected Ω" : "reference Ω", "deviation", "verdict"], rows, [
      true,
      false,
      false,
      true,
      true,
      true,
      false,
    ]),
  );
  L.push("");
  if (d.failures.length) {
    L.push("Readings out of the bench rules:");
    for (const f of d.failures) L.push(`  ✗ ${f.message}`);
  }
  if (d.suspects.length) {
    L.push("Suspects:");
    for (const s of d.suspects) L.push(`  ! ${s.message} [${s.kind}]`);
  } else L.push("No coil stands out: every coil within the tolerance.");
  for (const n of d.notes) L.push(`  · ${n}`);
  L.push(`Rule: ${d.tolerance_source}${d.tolerance !== 0.05 ? ` (coils here ±${sig(d.tolerance * 100)} %)` : ""}`);
  if (d.level) L.push(`Level: ${d.level.source}`);
  L.push(d.ok ? "Every reading within the bench rules." : "A reading is outside the bench rules (exit status 4).");
  return L.join("\n");
}

/** Read the job file: a full job, or a layout-only one (version, id, armature, winding). */
function loadAnyJob(io: Io, file: string, where: Where): { job: Job | null; id: string; spec: WindingSpec; bars: number } {
  const name = isStdin(file) ? "<stdin>" : file;
  const text = readText(io, file);
  const peek = loadYaml(text, name, z.unknown());
  where.file = name;
  where.locate = peek.locate;
  if (isLayoutOnly(peek.raw)) {
    const lj = loadYaml(text, name, layoutJobSchema).value;
    return { job: null, id: lj.id, spec: layoutJobSpec(lj), bars: lj.armature.bars };
  }
  const { job } = loadJobText(text, name);
  return { job, id: job.id, spec: windingSpec(job), bars: job.armature.bars };
}

interface DiagnoseArgs {
  bars?: string;
  temperature?: string;
  measured?: string;
  record?: string;
  resolution?: string;
  learn: boolean;
  logbook?: string;
  partial?: boolean;
}

/** The readings and what to judge them against, from a record, a measured file or --bars (with the plan), or from a layout-only job (no plan). */
function gatherInput(io: Io, argv: DiagnoseArgs, loaded: { job: Job | null; id: string; bars: number }): DiagnoseInput {
  const job = loaded.job;
  if (argv.record !== undefined) {
    if (!job) throw inputError("record_needs_plan", "record", "a logbook record goes with the full job it was planned by, not a layout-only job");
    const rec = loadRecordFile(io, argv.record, job);
    return {
      readings: rec.measured.bar_to_bar_ohm.map((r) => (r === null ? Infinity : r)),
      temperature: rec.measured.temperature_c,
      temperatureGiven: true,
      expected: rec.predicted.coil_ohm,
      turns: rec.winding.turns,
      resolution: resolveMeter(io, argv.resolution, rec.measured.meter_resolution_ohm).ohm,
      calibrated: turnLengthCalibrated(rec.predicted.mean_turn_length_source),
      bareDiameter: rec.winding.wire.bare_diameter_mm * 1e-3,
      source: `logbook record ${argv.record}`,
    };
  }
  let readings: number[];
  let temperature = 20;
  let given = false;
  let wound: WoundInput | undefined;
  let date: string | undefined;
  let meter: number | undefined;
  if (argv.measured !== undefined) {
    if (!job)
      throw inputError(
        "measured_needs_plan",
        "measured",
        "a measured file goes with the full job it was planned by; with a layout-only job give the readings as --bars",
      );
    const m = loadMeasured(io, argv.measured, job);
    ({ bar_to_bar: readings, temperature, wound, date } = m);
    meter = m.meter_resolution;
    given = true;
  } else {
    // a reading not taken yet (--partial) is NaN here, null again in diagnosePartial
    readings = argv.partial ? parseBars(argv.bars!, loaded.bars, true).map((r) => r ?? NaN) : parseBars(argv.bars!, loaded.bars);
    if (argv.temperature !== undefined) {
      const t = parseQuantity(argv.temperature, "temperature");
      if (!t.ok) throw inputError("bad_quantity", "--temperature", `--temperature ${argv.temperature}: ${t.message}`);
      const outside = rangeProblem("temperature", t.value);
      if (outside) throw inputError("out_of_range", "--temperature", `--temperature ${argv.temperature}: ${outside}`);
      temperature = t.value;
      given = true;
    }
  }
  const base = {
    readings,
    temperature,
    temperatureGiven: given,
    resolution: resolveMeter(io, argv.resolution, meter).ohm,
    source: argv.measured !== undefined ? `measured file ${argv.measured}` : "--bars",
  };
  if (!job) return { ...base, expected: null, turns: null, calibrated: false, bareDiameter: null };
  const options = argv.learn ? logbookOptionsFor(io, job, argv.logbook, date ? { before: date } : {}) : {};
  const plan = planJob(job, options);
  const p = predictWound(job, plan, wound, options);
  return { ...base, expected: p.coil_ohm, turns: p.turns, calibrated: turnLengthCalibrated(plan.wire.mlt_source), bareDiameter: p.wire.bare_diameter };
}

/** The bench rules' four-wire advice when the plan's readings (Ω) are below forty counts of the meter (Ω), as the card and `log` give it; none without a plan. */
function meterNotes(readings: { expected_ohm: number | null }[], resolutionOhm: number): string[] {
  const expected = readings.map((r) => r.expected_ohm).filter((x): x is number => x !== null);
  const advice = expected.length ? fourWireAdvice(Math.min(...expected), resolutionOhm) : null;
  return advice ? [advice, NULL_LEADS] : [];
}

export function diagnoseCommand(yargs: Argv, io: Io, setStatus: (n: number) => void) {
  return yargs.command(
    COMMAND_TEXT.diagnose.command,
    COMMAND_TEXT.diagnose.describe,
    (y) =>
      withResolution(
        withLogbook(
          withJob(y, "job file (YAML), or a layout-only job (version, id, armature, winding)"),
          "expect what the plan expects with the family's records (--no-learn: without)",
        ),
        true,
      )
        .option("bars", { type: "string", describe: "readings r1,r2,…,rC in Ω (a unit may follow each: 1.05 ohm, 1050 mohm; OL or open for an open circuit)" })
        .option("temperature", { type: "string", describe: 'winding temperature when read with --bars, e.g. "21 C" or "70 F" (default 20 C)' })
        .option("measured", { type: "string", describe: "take the readings (and the winding laid) from a measured file" })
        .option("record", { type: "string", describe: "take the readings (and the winding laid) from a logbook record" })
        .option("tolerance", { type: "number", describe: "tolerance on each coil as a fraction (default 0.05, the spread rule; common practice)" })
        .option("partial", {
          type: "boolean",
          describe: `readings still being taken: a blank for each one not read yet (1.33,,1.32,…); each read one is judged alone against the plan, and from ${SPREAD_FROM} on against their median`,
        })
        .option("json", { type: "boolean", default: false, describe: "print { ok, errors, failures, coils, suspects, … } as JSON" }),

    async (argv) => {
      setStatus(
        await guarded(io, argv.json, (where) => {
          const ways = [argv.bars, argv.measured, argv.record].filter((x) => x !== undefined).length;
          if (ways !== 1) throw inputError("readings_missing", "", "give the readings one way: --bars r1,r2,…, --measured FILE or --record FILE");
          if (argv.partial && argv.bars === undefined)
            throw inputError("option_conflict", "--partial", "--partial goes with --bars (a blank for each reading not taken yet)");
          if (argv.temperature !== undefined && argv.bars === undefined)
            throw inputError("option_conflict", "--temperature", "--temperature goes with --bars (measured files and records carry their own)");
          if (argv.tolerance !== undefined && !(argv.tolerance > 0 && argv.tolerance < 1)) {
            throw inputError("tolerance_invalid", "--tolerance", `--tolerance ${argv.tolerance}: a fraction between 0 and 1 is needed, like 0.05 for ±5 %`);
          }
          const loaded = loadAnyJob(io, argv.job, where);
          const input = gatherInput(io, argv, loaded);
          const layout = layoutWinding(loaded.spec);
          if (input.expected && input.expected.length !== layout.coils.length) {
            throw inputError(
              "record_mismatch",
              "predicted.coil_ohm",
              `the record expects ${input.expected.length} coils, the job's coil table has ${layout.coils.length}`,
            );
          }
          const at20 = input.readings.map((r) => (Number.isFinite(r) ? to20C(r, input.temperature) : r));
          if (argv.partial) {
            const d = diagnosePartial(
              layout,
              at20.map((r) => (Number.isNaN(r) ? null : r)),
              input.expected,
              input.turns,
              { resolutionOhm: input.resolution, calibrated: input.calibrated, bareDiameterM: input.bareDiameter ?? undefined },
            );
            d.notes.push(...meterNotes(d.readings, input.resolution));
            io.out(argv.json ? JSON.stringify(partialJson(loaded, input, d), null, 2) : partialText(loaded, d));
            return d.ok ? 0 : 4;
          }
          const d = diagnose(layout, at20, input.expected, input.turns, argv.tolerance, {
            resolutionOhm: input.resolution,
            calibrated: input.calibrated,
            bareDiameterM: input.bareDiameter ?? undefined,
          });
          d.notes.push(...meterNotes(d.readings, input.resolution));
          io.out(argv.json ? JSON.stringify(diagnoseJson(loaded, input, d), null, 2) : diagnoseText(loaded, input, d));
          return d.ok ? 0 : 4;
        }),
      );
    },
  );
}
