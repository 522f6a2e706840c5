/**
 * Learning from the logbook: finished rewinds of the same armature family correct the next plan.
 * Pure: records in (as read by the store), the plan's logbook options out.
 *
 *  - Turn length: each sound record's effective mean turn length (from its measured bar-to-bar
 *    readings, corrected to 20 °C) fits the end-turn factor of the turn-length model for the build
 *    it had, f = (MLT − riding − 2L) / end-turn model (src/armature/turn.ts `fitEndTurnFactor`); the
 *    mean factor carries to the new build (docs/contracts.md "Mean length of turn").
 *  - Ke: each record's Ke from its no-load reading, scaled by turns to the job's original turns,
 *    Ke_orig = Ke_rec · N_orig / N_rec (docs/contracts.md "Calibration of Ke"); the mean.
 *  - Loss torque: each record's T_c = Kt · I0 (Kt = Ke); the mean, as a Coulomb torque (docs/contracts.md
 *    "No-load loss torque": T_c alone from one test per record).
 * Each figure is used by the plan as docs/contracts.md orders its sources (a generator or no-load test of
 * the job itself still wins for Ke and the losses); `moves` lists only the figures that moved.
 */
import { oncePerRewind } from "./record.js";
import type { Job } from "../job/schema.js";
import type { PlanOptions } from "../design/plan.js";
import { calibrateOriginal } from "../design/calibration.js";
import { buildContext, fitToOldTurn, layingOverall, type ArmatureContext } from "../design/context.js";
import { bundleThickness } from "../armature/turn.js";
import { contextFor } from "./predict.js";
import type { LogRecord } from "./record.js";

export type LogbookOptions = NonNullable<PlanOptions["logbook"]>;

/** What learning reads of a record (the family's share in the cache keeps only this much of each). */
export type LearningRecord = Pick<LogRecord, "date" | "job" | "measured" | "winding" | "derived">;

/** The part of a record learning reads. */
export function learningPart(r: LearningRecord): LearningRecord {
  return { date: r.date, job: r.job, measured: r.measured, winding: r.winding, derived: r.derived };
}

export interface Learned {
  /** What the plan takes (undefined when no record of the family helps). */
  options: LogbookOptions | undefined;
  /** Records of the family, and how many of them gave each figure. */
  family: string | null;
  used: { records: number; turn_length: number; ke: number; loss: number };
  /** Records of the family set aside, and why. */
  skipped: { file?: string; why: string }[];
}

const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;

/** The end-turn factor a record's effective turn length implies on this armature (null when it implies none). */
export function recordEndTurnFactor(ctx: ArmatureContext, r: Pick<LogRecord, "winding" | "derived">): number | null {
  const w = r.winding.wire;
  const { overall } = layingOverall({
    label: w.label,
    bare_diameter: w.bare_diameter_mm / 1e3,
    overall_diameter: w.overall_diameter_mm === null ? null : w.overall_diameter_mm / 1e3,
    overall_source: w.overall_diameter_mm === null ? "none" : "published",
    system: "measured",
    size: "",
  });
  const f = fitToOldTurn(ctx, r.derived.mean_turn_length_mm / 1e3, bundleThickness(r.winding.turns, r.winding.strands, overall, ctx.along));
  return Number.isFinite(f) && f > 0 ? f : null;
}

/** Turn a family's records into the plan's logbook options for `job`. */
export function learnFromRecords(job: Job, records: { file?: string; record: LearningRecord }[]): Learned {
  const family = job.armature.family ?? null;
  const used = { records: 0, turn_length: 0, ke: 0, loss: 0 };
  const skipped: Learned["skipped"] = [];
  if (family === null) return { options: undefined, family, used, skipped };
  // one rewind logged twice (the same job, date and readings) counts once
  const same = oncePerRewind(records.filter(({ record: r }) => r.job.family === family));
  if (same.length === 0) return { options: undefined, family, used, skipped };
  const ctx = contextFor(job);
  const factors: number[] = [];
  const kes: number[] = [];
  const losses: number[] = [];
  for (const { file, record: r } of same) {
    if (r.job.slots !== job.armature.slots || r.job.bars !== job.armature.bars || r.job.style !== job.winding.style) {
      skipped.push({
        file,
        why: `family ${family} but ${r.job.style} ${r.job.slots} slots / ${r.job.bars} bars, not ${job.winding.style} ${job.armature.slots} / ${job.armature.bars}`,
      });
      continue;
    }
    let any = false;
    if (r.derived.readings_sound) {
      const f = recordEndTurnFactor(ctx, r);
      if (f !== null) {
        factors.push(f);
        any = true;
      }
    } else skipped.push({ file, why: "its bar-to-bar readings point to a fault: not used for the turn length" });
    if (r.derived.ke_v_s_per_rad !== null && r.derived.ke_v_s_per_rad > 0) {
      kes.push((r.derived.ke_v_s_per_rad * job.original.turns) / r.winding.turns);
      any = true;
    }
    if (r.derived.loss_torque_n_m !== null && r.derived.loss_torque_n_m >= 0) {
      losses.push(r.derived.loss_torque_n_m);
      any = true;
    }
    if (any) used.records++;
  }
  used.turn_length = factors.length;
  used.ke = kes.length;
  used.loss = losses.length;
  if (used.records === 0) return { options: undefined, family, used, skipped };

  const options: LogbookOptions = { records: used.records, moves: [] };
  const moves = options.moves!;
  let ctx1 = ctx; // the armature as the plan will build it with these options
  if (factors.length && ctx.mltSource !== "measured") {
    options.mltFactor = mean(factors);
    ctx1 = buildContext(job, { mltFactor: options.mltFactor });
    moves.push({ figure: "mean turn length (original build)", from: ctx.original.mlt * 1e3, to: ctx1.original.mlt * 1e3, unit: "mm" });
  }
  if (kes.length) options.ke = mean(kes);
  if (losses.length) options.loss = { tc: mean(losses), b: 0 };
  // what the plan's calibration does with them (a bench test of the job itself wins)
  const before = calibrateOriginal(ctx).calibration;
  const after = calibrateOriginal(ctx1, options).calibration;
  if (after.ke !== null && after.ke !== before.ke) moves.push({ figure: "Ke (original winding)", from: before.ke ?? NaN, to: after.ke, unit: "V·s/rad" });
  if (after.loss.tc !== before.loss.tc) moves.push({ figure: "loss torque", from: before.loss.tc * 1e3, to: after.loss.tc * 1e3, unit: "mN·m" });
  if (after.loss.b !== before.loss.b) moves.push({ figure: "viscous loss", from: before.loss.b, to: after.loss.b, unit: "N·m·s/rad" });
  return { options, family, used, skipped };
}
