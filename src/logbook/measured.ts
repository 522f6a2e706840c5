/**
 * The measured file (docs/contracts.md "The measured file and the logbook record", version 1): what the
 * bench read on a finished rewind. One zod schema, quantities parsed into SI (°C for temperatures)
 * as the job file's are; the loader (`loadYaml`) locates every problem at file:line:column with its
 * field path. Checks that need the job (its id, its bar count) are `checkAgainstJob`.
 */
import { z } from "zod";
import { qty } from "../job/schema.js";
import { parseWireSpec } from "../wire/parse.js";
import type { Job } from "../job/schema.js";
import { ArmwindError, type Problem } from "../errors.js";
import type { PathPart } from "../job/paths.js";
import { isOpenText } from "../bench/rules.js";

const ohmReading = qty("resistance", { min: 0, minText: "0 ohm" });
/** A bar-to-bar reading: a resistance (Ω unless a unit is written), or `OL` / `open` for an open circuit (Infinity). */
const barReading = z
  .union([z.number(), z.string()])
  .meta({ description: 'a resistance such as "1.05 ohm" (bare numbers in ohm), or OL / open for an open circuit' })
  .transform((v, ctx) => {
    if (isOpenText(v)) return Infinity;
    const r = ohmReading.safeParse(v);
    if (r.success) return r.data;
    for (const issue of r.error.issues)
      ctx.addIssue({ code: "custom", message: issue.message, params: (issue as { params?: Record<string, unknown> }).params });
    return z.NEVER;
  });

const TEMP = { min: -60, max: 250, minText: "-60 C", maxText: "250 C" };

/** A wire actually laid: read as stock wire is ("0.25 mm" is grade 2, "33 AWG" heavy, and the record says so). */
const woundWire = z
  .union([
    z.string().meta({ description: 'a wire: "0.25 mm grade 2", "33 AWG heavy", "36 SWG"' }),
    z.number().meta({ description: "a bare copper diameter in mm" }),
    z.strictObject({ bare: z.union([z.number(), z.string()]), overall: z.union([z.number(), z.string()]).optional() }),
  ])
  .transform((v, ctx) => {
    const r = parseWireSpec(v, "stock");
    if (!r.ok) {
      ctx.addIssue({ code: "custom", message: r.message, params: { code: "bad_wire" } });
      return z.NEVER;
    }
    return r.spec;
  });

const dateText = z
  .union([z.string(), z.date()])
  .transform((v, ctx) => {
    const s = v instanceof Date ? v.toISOString().slice(0, 10) : v.trim();
    const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(s);
    const d = m ? new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]))) : null;
    if (!m || !d || d.toISOString().slice(0, 10) !== s) {
      ctx.addIssue({ code: "custom", message: `"${s}" is not a date; write it as YYYY-MM-DD, like 2026-12-01`, params: { code: "bad_date" } });
      return z.NEVER;
    }
    return s;
  })
  .meta({ description: "the date of the readings, YYYY-MM-DD" });

export const measuredSchema = z.strictObject({
  $schema: z.string().optional(),
  version: z.literal(1).meta({ description: "measured file version: 1" }),
  job: z.string().min(1).meta({ description: "the id of the job this rewind was planned by" }),
  date: dateText,
  wound: z
    .strictObject({
      turns: z.int().min(1).max(100000).optional(),
      wire: woundWire.optional(),
      strands: z.int().min(1).max(20).optional(),
    })
    .optional()
    .meta({ description: "the winding actually laid, only where it differs from the plan" }),
  temperature: qty("temperature", TEMP).meta({ description: "temperature of the winding when the resistances were read" }),
  meter_resolution: qty("resistance", { positive: true }).optional(),
  bar_to_bar: z
    .array(barReading)
    .min(1)
    .meta({ description: "r1 … rC, r_i between bar i and bar i+1; Ω unless a unit is written; OL or open for an open circuit" }),
  terminal_resistance: qty("resistance", { positive: true }).optional(),
  no_load: z
    .strictObject({
      supply: qty("voltage", { positive: true, max: 1000, maxText: "1000 V" }),
      current: qty("current", { positive: true }),
      speed: qty("speed", { positive: true }),
    })
    .optional(),
  stall: z
    .strictObject({
      supply: qty("voltage", { positive: true, max: 1000, maxText: "1000 V" }),
      current: qty("current", { positive: true }),
    })
    .optional(),
  insulation: z
    .union([
      z.strictObject({
        test_volts: qty("voltage", { positive: true, max: 10000, maxText: "10 kV" }),
        megohm: qty("resistance_large", { min: 0, minText: "0 Mohm" }),
      }),
      z.strictObject({ pass: z.boolean(), test_volts: qty("voltage", { positive: true, max: 10000, maxText: "10 kV" }).optional() }),
    ])
    .optional()
    .meta({ description: "{ test_volts: 500 V, megohm: 200 } or { pass: true }" }),
  notes: z.string().optional(),
});

/** A measured file as the code uses it: SI (Ω, V, A, rad/s; °C), insulation resistance in Ω. */
export type Measured = z.output<typeof measuredSchema>;

/**
 * Checks that need the job: the measured file names this job, and holds one bar-to-bar reading
 * per commutator bar. Throws ArmwindError (status 1) with problems located by `locate`.
 */
export function checkAgainstJob(m: Measured, job: Job, file: string, locate: (p: readonly PathPart[]) => { line: number; column: number }): void {
  const problems: Problem[] = [];
  if (m.job !== job.id) {
    problems.push({
      code: "job_mismatch",
      path: "job",
      message: `the readings are for job "${m.job}", not "${job.id}"; give the job file of ${m.job}, or correct the id`,
      file,
      ...locate(["job"]),
    });
  }
  const C = job.armature.bars;
  if (m.bar_to_bar.length !== C) {
    const at = m.bar_to_bar.length > C ? locate(["bar_to_bar", C]) : locate(["bar_to_bar"]);
    problems.push({
      code: "readings_count",
      path: "bar_to_bar",
      message: `${m.bar_to_bar.length} bar-to-bar readings for ${C} bars; give r1 … r${C} (r_i between bar i and bar i+1, r${C} between bar ${C} and bar 1)`,
      file,
      ...at,
    });
  }
  if (problems.length) throw new ArmwindError(problems);
}
