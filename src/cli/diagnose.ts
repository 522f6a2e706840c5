/**
 * `armwind diagnose JOB (--bars r1,r2,… [--temperature T] | --measured FILE | --record FILE)
 * [--tolerance F] [--json] [--logbook DIR] [--no-learn]`: solve the ring for each coil's own
 * resistance, name the coils that stand out and what that suggests (src/winding/diagnose.ts does
 * the work; this is the shell). Exit 4 when a coil or reading is out of tolerance.
 */
import type { Argv } from "yargs";
import { planJob } from "../design/plan.js";
import { windingSpec } from "../design/context.js";
import { layoutWinding } from "../winding/layout.js";
import { ArmwindError, inputError, type Problem } from "../errors.js";
import { parseQuantity } from "../job/units.js";
import { rangeProblem } from "../job/ranges.js";
import { loadYaml } from "../job/load.js";
import { readText, readUserFile, guarded, loadJob, type Io } from "./io.js";
import { RECORD_FILE_LIMIT } from "../files.js";
import type { Where } from "./plan.js";
import { logbookOptionsFor } from "./learning.js";
import { loadMeasured } from "./log.js";
import { predictWound } from "../logbook/predict.js";
import { recordSchema, type LogRecord } from "../logbook/record.js";
import { diagnose, type Diagnosis } from "../winding/diagnose.js";
import { to20C } from "../wire/copper.js";
import { ohm, sig, table } from "./format.js";
import type { Job } from "../job/schema.js";
import { withJob, withLogbook } from "./options.js";

export interface DiagnoseInput {
  /** Readings r1 … rC as read, Ω. */
  readings: number[];
  /** Winding temperature when read, °C. */
  temperature: number;
  temperatureGiven: boolean;
  /** Expected coil resistances at 20 °C, Ω (coil index order). */
  expected: number[];
  turns: number;
  source: string;
}

/** `--bars 1.05,1.05,…` → Ω; each item may carry a unit ("1.05 ohm", "1050 mohm"). */
export function parseBars(text: string, bars: number): number[] {
  const items = text.split(",").map((s) => s.trim());
  const problems: Problem[] = [];
  const out = items.map((s, i) => {
    const r = parseQuantity(s === "" ? "x" : s, "resistance");
    if (!r.ok) {
      problems.push({ code: "bad_quantity", path: `--bars[${i}]`, message: `r${i + 1} "${s}": ${r.message}` });
      return NaN;
    }
    const outside = rangeProblem("resistance", r.value, 0);
    if (outside) problems.push({ code: "out_of_range", path: `--bars[${i}]`, message: `r${i + 1} "${s}": ${outside}` });
    return r.value;
  });
  if (problems.length) throw new ArmwindError(problems);
  if (out.length !== bars) {
    throw inputError("readings_count", "--bars", `${out.length} bar-to-bar readings for ${bars} bars; give r1 … r${bars} separated by commas (r_i between bar i and bar i+1, r${bars} between bar ${bars} and bar 1)`);
  }
  return out;
}

function loadRecordFile(io: Io, file: string, job: Job): LogRecord {
  const text = file === "-" || file === "" ? readText(io, file) : readUserFile(file, { limit: RECORD_FILE_LIMIT });
  const r = loadYaml(text, file, recordSchema);
  const rec = r.value as unknown as LogRecord;
  const problems: Problem[] = [];
  if (rec.job.id !== job.id) problems.push({ code: "job_mismatch", path: "job.id", message: `the record is of job "${rec.job.id}", not "${job.id}"; give the job file of ${rec.job.id}`, file, ...r.locate(["job", "id"]) });
  if (rec.measured.bar_to_bar_ohm.length !== job.armature.bars) {
    problems.push({ code: "readings_count", path: "measured.bar_to_bar_ohm", message: `the record holds ${rec.measured.bar_to_bar_ohm.length} bar-to-bar readings for the job's ${job.armature.bars} bars`, file, ...r.locate(["measured", "bar_to_bar_ohm"]) });
  }
  const coils = (rec.predicted as { coil_ohm?: unknown }).coil_ohm;
  if (!Array.isArray(coils) || coils.some((x) => typeof x !== "number" || !(x > 0))) {
    problems.push({ code: "record_damaged", path: "predicted.coil_ohm", message: "the record holds no expected coil resistances (predicted.coil_ohm)", file, ...r.locate(["predicted"]) });
  }
  if (problems.length) throw new ArmwindError(problems);
  return rec;
}

/**
 * What failed, for `--json` (DESIGN.md: status 4 carries `failures`): each coil out of tolerance
 * with its solved and expected resistance and the rule, and each suspect not already named by a coil.
 */
export function diagnoseFailures(d: Diagnosis) {
  const bad = d.coils.filter((c) => c.verdict === "high" || c.verdict === "low" || c.verdict === "open" || c.verdict === "shorted");
  const named = new Set(bad.map((c) => c.index));
  return [
    ...bad.map((c) => ({
      check: `coil[${c.index - 1}]`,
      coils: [c.index],
      verdict: c.verdict,
      resistance_ohm: c.resistance_ohm,
      expected_ohm: c.expected_ohm,
      deviation_fraction: c.deviation_fraction,
      tolerance_fraction: d.tolerance,
      rule: d.tolerance_source,
    })),
    ...d.suspects
      .filter((s) => !s.coils.some((i) => named.has(i)))
      .map((s) => ({ check: s.kind, coils: s.coils, verdict: s.kind, resistance_ohm: null, expected_ohm: null, deviation_fraction: null, tolerance_fraction: d.tolerance, rule: s.message })),
  ];
}

export function diagnoseJson(job: Job, input: DiagnoseInput, d: Diagnosis) {
  return {
    ok: d.ok,
    errors: [],
    failures: d.ok ? [] : diagnoseFailures(d),
    job_id: job.id,
    source: input.source,
    temperature_c: input.temperature,
    turns_per_coil: input.turns,
    coils: d.coils.map((c) => ({
      index: c.index,
      start_bar: c.start_bar,
      end_bar: c.end_bar,
      go_slot: c.go_slot,
      return_slot: c.return_slot,
      resistance_ohm: c.resistance_ohm,
      expected_ohm: c.expected_ohm,
      deviation_fraction: c.deviation_fraction,
      verdict: c.verdict,
    })),
    suspects: d.suspects.map((s) => ({ kind: s.kind, coils: s.coils, bars: s.bars, turns_estimate: s.turns_estimate, message: s.message })),
    readings: d.readings.map((r, i) => ({
      index: r.index,
      bar: r.bar,
      next_bar: r.next_bar,
      reading_ohm: Number.isFinite(input.readings[i]) ? input.readings[i] : null,
      reading_20c_ohm: r.reading_ohm,
      expected_ohm: r.expected_ohm,
      of_average: r.of_average,
    })),
    tolerance_fraction: d.tolerance,
    tolerance_source: d.tolerance_source,
    residual_fraction: d.residual_fraction,
    notes: d.notes,
    warnings: d.warnings,
  };
}

export function diagnoseText(job: Job, input: DiagnoseInput, d: Diagnosis): string {
  const L: string[] = [];
  L.push(`${job.id}: ${input.readings.length} bar-to-bar readings (${input.source}), ${input.turns} turns a coil`);
  L.push(
    input.temperatureGiven
      ? `Read at ${input.temperature} °C, corrected to 20 °C (IEC 60028, 0.00393/K) against the plan's coil resistances at 20 °C`
      : "Temperature not given: the readings are taken as read at 20 °C (give --temperature for a winding that is warmer or colder)",
  );
  L.push("");
  const rows = d.coils.map((c) => [
    String(c.index),
    `${c.go_slot}–${c.return_slot}`,
    c.start_bar === null ? "dead" : `${c.start_bar}–${c.end_bar}`,
    c.resistance_ohm === null ? "—" : ohm(c.resistance_ohm),
    ohm(c.expected_ohm),
    c.deviation_fraction === null ? "" : `${c.deviation_fraction >= 0 ? "+" : "−"}${sig(Math.abs(c.deviation_fraction) * 100)} %`,
    c.verdict === "ok" ? "ok" : c.verdict.toUpperCase(),
  ]);
  L.push(table(["coil", "slots", "bars", "solved Ω", "expected Ω", "deviation", "verdict"], rows, [true, false, false, true, true, true, false]));
  L.push("");
  if (d.suspects.length) {
    L.push("Suspects:");
    for (const s of d.suspects) L.push(`  ! ${s.message} [${s.kind}]`);
  } else L.push("No coil stands out: every coil within the tolerance.");
  for (const n of d.notes) L.push(`  · ${n}`);
  L.push(`Tolerance: ${d.tolerance_source}${d.tolerance !== 0.05 ? ` (here ±${sig(d.tolerance * 100)} %)` : ""}`);
  if (!d.ok) L.push("A coil or reading is out of tolerance (exit status 4).");
  return L.join("\n");
}

export function diagnoseCommand(yargs: Argv, io: Io, setStatus: (n: number) => void) {
  return yargs.command(
    "diagnose <job>",
    "Solve the bar-to-bar readings for each coil's resistance and name the coils that stand out (exit 4 when one is out of tolerance)",
    (y) =>
      withLogbook(withJob(y, "job file (YAML)"), "expect what the plan expects with the family's records (--no-learn: without)")
        .option("bars", { type: "string", describe: "readings r1,r2,…,rC in Ω (a unit may follow each: 1.05 ohm, 1050 mohm)" })
        .option("temperature", { type: "string", describe: 'winding temperature when read with --bars, e.g. "21 C" or "70 F" (default 20 C)' })
        .option("measured", { type: "string", describe: "take the readings (and the winding laid) from a measured file" })
        .option("record", { type: "string", describe: "take the readings (and the winding laid) from a logbook record" })
        .option("tolerance", { type: "number", describe: "tolerance on each coil as a fraction (default 0.05, common practice)" })
        .option("json", { type: "boolean", default: false, describe: "print { ok, coils, suspects, … } as JSON" }),

    async (argv) => {
      setStatus(
        await guarded(
          io,
          argv.json,
          (where) => {
            const ways = [argv.bars, argv.measured, argv.record].filter((x) => x !== undefined).length;
            if (ways !== 1) throw inputError("readings_missing", "", "give the readings one way: --bars r1,r2,…, --measured FILE or --record FILE");
            if (argv.temperature !== undefined && argv.bars === undefined) throw inputError("option_conflict", "--temperature", "--temperature goes with --bars (measured files and records carry their own)");
            if (argv.tolerance !== undefined && !(argv.tolerance > 0 && argv.tolerance < 1)) {
              throw inputError("tolerance_invalid", "--tolerance", `--tolerance ${argv.tolerance}: a fraction between 0 and 1 is needed, like 0.05 for ±5 %`);
            }
            const { job, file, locate } = loadJob(io, argv.job);
            where.file = file;
            where.locate = locate;
            let input: DiagnoseInput;
            if (argv.record !== undefined) {
              const rec = loadRecordFile(io, argv.record, job);
              input = {
                readings: rec.measured.bar_to_bar_ohm,
                temperature: rec.measured.temperature_c,
                temperatureGiven: true,
                expected: rec.predicted.coil_ohm,
                turns: rec.winding.turns,
                source: `logbook record ${argv.record}`,
              };
            } else {
              let readings: number[];
              let temperature = 20;
              let given = false;
              let wound;
              let date: string | undefined;
              if (argv.measured !== undefined) {
                const m = loadMeasured(io, argv.measured, job);
                readings = m.bar_to_bar;
                temperature = m.temperature;
                given = true;
                wound = m.wound;
                date = m.date;
              } else {
                readings = parseBars(argv.bars!, job.armature.bars);
                if (argv.temperature !== undefined) {
                  const t = parseQuantity(argv.temperature, "temperature");
                  if (!t.ok) throw inputError("bad_quantity", "--temperature", `--temperature ${argv.temperature}: ${t.message}`);
                  const outside = rangeProblem("temperature", t.value);
                  if (outside) throw inputError("out_of_range", "--temperature", `--temperature ${argv.temperature}: ${outside}`);
                  temperature = t.value;
                  given = true;
                }
              }
              const options = argv.learn ? logbookOptionsFor(io, job, argv.logbook, date ? { before: date } : {}) : {};
              const plan = planJob(job, options);
              const p = predictWound(job, plan, wound, options);
              input = {
                readings,
                temperature,
                temperatureGiven: given,
                expected: p.coil_ohm,
                turns: p.turns,
                source: argv.measured !== undefined ? `measured file ${argv.measured}` : "--bars",
              };
            }
            const layout = layoutWinding(windingSpec(job));
            if (input.expected.length !== layout.coils.length) {
              throw inputError("record_mismatch", "predicted.coil_ohm", `the record expects ${input.expected.length} coils, the job's coil table has ${layout.coils.length}`);
            }
            const at20 = input.readings.map((r) => (Number.isFinite(r) ? to20C(r, input.temperature) : r));
            const d = diagnose(layout, at20, input.expected, input.turns, argv.tolerance);
            io.out(argv.json ? JSON.stringify(diagnoseJson(job, input, d), null, 2) : diagnoseText(job, input, d));
            return d.ok ? 0 : 4;
          },
        ),
      );
    },
  );
}
