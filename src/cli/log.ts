/**
 * `armwind log JOB --measured FILE [--logbook DIR] [--json] [--no-learn]`: record a finished rewind
 * in the logbook, set the bench readings beside the plan, exit 4 when a check fails (after writing:
 * the record is the shop's data either way).
 */
import type { Argv } from "yargs";
import { planJob } from "../design/plan.js";
import { guarded, loadFile, loadJob, type Io } from "./io.js";
import { logbookDir, logbookOptionsFor } from "./learning.js";
import { checkAgainstJob, measuredSchema, type Measured } from "../logbook/measured.js";
import { predictWound } from "../logbook/predict.js";
import { buildRecord, sameRewind, type LogRecord } from "../logbook/record.js";
import { readLogbook, writeRecordFile } from "../logbook/store.js";
import { ArmwindError } from "../errors.js";
import { benchName } from "./bench-name.js";
import { ohm, sig, table } from "./format.js";
import type { CheckRow } from "../logbook/compare.js";
import { checkLabel } from "../bench/rules.js";
import type { Job } from "../job/schema.js";
import { join, relative } from "node:path";
import { withJob, withLogbook } from "./options.js";
import { resolveMeter, withResolution } from "./meter.js";
import { COMMAND_TEXT } from "./commands.js";

/** Load a measured file and check it against the job (id, bar count); problems located in the measured file. */
export function loadMeasured(io: Io, file: string, job: Job): Measured {
  const r = loadFile(io, file, measuredSchema);
  checkAgainstJob(r.value, job, file === "-" ? "<stdin>" : file, r.locate);
  return r.value;
}

/**
 * The record as text: YAML in its JSON form (YAML 1.2 is a superset of JSON), under a comment
 * header. Any YAML reader reads it; the logbook reads it with JSON.parse, about a hundred times
 * faster than a YAML parser, so a history of a thousand records stays well under a second.
 */
export function recordYaml(record: LogRecord): string {
  return (
    `# armwind logbook record: ${record.job.id}, ${record.date}. Written by armwind log; do not edit (history and learning read it).\n` +
    `# YAML in its JSON form (YAML 1.2 reads JSON), numbers unrounded, units in the key names.\n` +
    JSON.stringify(record, null, 2) +
    "\n"
  );
}

const CAUTIONS = {
  stall: "Caution: a stall test heats the winding fast; keep it brief, at a reduced supply, with the rotor clamped and hands clear of the shaft.",
  insulation:
    "Caution: an insulation tester's test voltage can give a shock; discharge the winding to the core after the test, and follow local codes and licensed practice.",
};

function value(c: CheckRow, x: number | null): string {
  if (x === null) return "—";
  if (c.unit === "ohm") return `${ohm(x)} Ω`;
  if (c.unit === "fraction") return `${sig(x * 100)} %`;
  if (c.unit === "Mohm") return `${sig(x)} MΩ`;
  return `${sig(x)} ${c.unit}`;
}

function checkName(c: CheckRow): string {
  const label = checkLabel(c.check);
  if (label !== c.check) return `bar to bar ${label}`;
  return (
    (
      {
        "bar_to_bar.spread": "bar-to-bar spread",
        "bar_to_bar.level": "bar-to-bar level (median)",
        terminal_resistance: "terminal",
        "no_load.speed": "no-load speed",
        "no_load.current": "no-load current",
        "stall.current": "stall current",
        insulation: "insulation",
      } as Record<string, string>
    )[c.check] ?? c.check
  );
}

/** The checks out of tolerance, for `--json`: each with its reading, the prediction and the rule. */
export function logFailures(record: LogRecord) {
  return record.comparison.checks
    .filter((c) => c.verdict !== "ok" && c.verdict !== "not_checked")
    .map((c) => ({
      check: c.check,
      reading: checkName(c),
      unit: c.unit,
      predicted_value: c.predicted_value,
      measured_value: c.measured_value,
      measured_20c_value: c.measured_20c_value,
      deviation_fraction: c.deviation_fraction,
      tolerance_fraction: c.tolerance_fraction,
      verdict: c.verdict,
      rule: c.tolerance_source,
    }));
}

/** The terminal report of a logged record. */
export function logText(record: LogRecord, file: string, jobFile = `${record.job.id}.yaml`): string {
  const L: string[] = [];
  const w = record.winding;
  L.push(`Logged ${record.job.id} of ${record.date} as ${file}`);
  L.push(
    `Winding laid: ${w.turns} turns × ${w.wire.label}${w.strands > 1 ? ` × ${w.strands} in hand` : ""}${w.differs_from_plan ? ` (not as planned: ${w.differences.join(", ")})` : " (as planned)"}`,
  );
  const cmp = record.comparison;
  L.push(`Readings at ${sig(cmp.temperature_c)} °C; resistances corrected to 20 °C (÷ ${cmp.correction_factor.toFixed(4)}, IEC 60028)`);
  L.push("");
  const rows = cmp.checks.map((c) => [
    checkName(c),
    c.check === "insulation" || c.check === "bar_to_bar.spread" ? "" : value(c, c.predicted_value),
    c.check === "insulation" && c.unit === ""
      ? c.verdict === "ok"
        ? "passed"
        : c.verdict === "fail"
          ? "failed"
          : "—"
      : c.unit === "ohm"
        ? c.measured_20c_value === null && c.verdict === "fail"
          ? "open"
          : value(c, c.measured_20c_value)
        : value(c, c.measured_value),
    c.deviation_fraction === null || c.unit === "fraction" ? "" : `${c.deviation_fraction >= 0 ? "+" : "−"}${sig(Math.abs(c.deviation_fraction) * 100)} %`,
    c.check === "insulation" && c.unit === "Mohm"
      ? `≥ ${value(c, c.predicted_value)}`
      : c.tolerance_fraction === null
        ? ""
        : `±${sig(c.tolerance_fraction * 100)} %`,
    c.verdict === "not_checked" ? "not checked" : c.verdict === "ok" ? "ok" : c.verdict.toUpperCase(),
  ]);
  L.push(table(["check", "predicted", "measured (20 °C)", "deviation", "tolerance", "verdict"], rows, [false, true, true, true, true, false]));
  L.push("  (each bar-to-bar reading: deviation and band against the median of your readings, the spread rule; the level row: your median against the plan's)");
  const spread = cmp.checks.find((c) => c.check === "bar_to_bar.spread");
  if (spread?.note) L.push(`  spread: ${spread.note}`);
  for (const c of cmp.checks)
    if (c.note && c.verdict !== "not_checked" && c.check !== "bar_to_bar.spread" && c.verdict !== "ok") L.push(`  ${checkName(c)}: ${c.note}`);
  for (const c of cmp.checks) if (c.verdict === "not_checked" && c.note) L.push(`  ${checkName(c)} not checked: ${c.note}`);
  for (const n of cmp.notes) L.push(`  · ${n}`);
  L.push("");
  L.push("Tolerances:");
  const seen = new Set<string>();
  for (const c of cmp.checks) {
    if (c.verdict === "not_checked" || seen.has(c.tolerance_source)) continue;
    seen.add(c.tolerance_source);
    L.push(`  ${checkName(c).replace(/ r\d+$/, "")}: ${c.tolerance_source}`);
  }
  L.push("");
  const failed = cmp.checks.filter((c) => c.verdict !== "ok" && c.verdict !== "not_checked");
  L.push(
    failed.length
      ? `${failed.length} check${failed.length > 1 ? "s" : ""} out of tolerance (${failed.map(checkName).join(", ")}): the record is kept; armwind diagnose ${jobFile} --record ${file} names the coil (exit status 4)`
      : "Every check within tolerance.",
  );
  L.push(
    "A reversed coil or a wrong lead throw reads normal bar to bar: a polarity check (a compass or a growler along the slots) finds it (common practice).",
  );
  if (record.measured.stall) L.push(CAUTIONS.stall);
  if (record.measured.insulation) L.push(CAUTIONS.insulation);
  return L.join("\n");
}

/** Refuse (status 1, `already_logged`) a record whose job and readings the logbook already holds, naming that record. */
function refuseIfLogged(dir: string, record: LogRecord): void {
  const book = readLogbook(dir);
  const twin = sameRewind(book.records, record)[0];
  if (twin) {
    throw new ArmwindError({
      code: "already_logged",
      path: "",
      file: join(dir, twin.file),
      message: `already holds these readings of ${record.job.id} (${record.date}); nothing written. To log them again anyway: armwind log … --again`,
    });
  }
}

export function logCommand(yargs: Argv, io: Io, setStatus: (n: number) => void) {
  return yargs.command(
    COMMAND_TEXT.log.command,
    COMMAND_TEXT.log.describe,
    (y) =>
      withResolution(
        withLogbook(
          withJob(y, "job file (YAML) the rewind was planned by"),
          "predict as the plan did, with the family's earlier records (--no-learn: without)",
        ),
        true,
      )
        .option("measured", {
          type: "string",
          demandOption: true,
          describe: "measured file (YAML): date, temperature, bar-to-bar readings, terminal, no-load, stall, insulation",
        })
        .option("again", { type: "boolean", default: false, describe: "log it even when the logbook already holds these readings for this job" })
        .option("json", { type: "boolean", default: false, describe: "print { ok, file, record } as JSON (ok: every check within tolerance)" }),
    async (argv) => {
      setStatus(
        await guarded(io, argv.json, (where) => {
          const { job, file, locate } = loadJob(io, argv.job);
          where.file = file;
          where.locate = locate;
          const m = loadMeasured(io, argv.measured, job);
          const dir = logbookDir(io, argv.logbook);
          const options = argv.learn ? logbookOptionsFor(io, job, argv.logbook, { before: m.date }) : {};
          const plan = planJob(job, options);
          const prediction = predictWound(job, plan, m.wound, options);
          const record = buildRecord(job, plan, prediction, m, new Date().toISOString(), resolveMeter(io, argv.resolution, m.meter_resolution));
          const hold = Number(io.env.ARMWIND_LOG_HOLD_MS ?? 0);
          if (!argv.again) refuseIfLogged(dir, record);
          const path = writeRecordFile(dir, job.id, m.date, benchName(io), recordYaml(record), { holdMs: Number.isFinite(hold) ? hold : 0 });
          const shown = relative(io.cwd, path).startsWith("..") ? path : relative(io.cwd, path);
          // docs/contracts.md: `record` is the file written (also `file`), `failures` the checks out of tolerance; the record itself is `logged`
          if (argv.json)
            io.out(
              JSON.stringify({ ok: record.comparison.ok, errors: [], failures: logFailures(record), record: shown, file: shown, logged: record }, null, 2),
            );
          else io.out(logText(record, shown, file));
          if (!record.comparison.ok) io.err(`armwind: a bench check failed; the record was written: ${shown}`);
          return record.comparison.ok ? 0 : 4;
        }),
      );
    },
  );
}
