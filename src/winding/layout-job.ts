/**
 * A layout-only job (docs/contracts.md "The job file"): for `diagnose` alone a job may hold only
 * `version`, `id`, `armature` (slots, bars, field_poles) and `winding` (style, span and what the
 * style needs): a shop triaging an armature that came in for test knows no turns and has no goal.
 * The fields are the job schema's own (one source of truth); only the selection is made here.
 */
import { z } from "zod";
import { jobSchema } from "../job/schema.js";

const J = jobSchema.shape;
const A = J.armature.shape;
const W = J.winding.shape;

export const layoutJobSchema = z
  .strictObject({
    $schema: J.$schema,
    version: J.version,
    id: J.id,
    title: z.string().min(1).optional(),
    customer: J.customer,
    notes: J.notes,
    armature: z.strictObject({ family: A.family, slots: A.slots, bars: A.bars, field_poles: A.field_poles, field: A.field.optional() }),
    winding: z.strictObject({
      style: W.style,
      span: W.span,
      coils_per_slot: W.coils_per_slot,
      dead_coil: W.dead_coil,
      equalizers: W.equalizers,
      progression: W.progression,
      lead_throw: W.lead_throw,
      direction: W.direction,
      brushes: W.brushes,
    }),
  })
  .superRefine((job, ctx) => {
    if (job.armature.field_poles % 2 !== 0) {
      ctx.addIssue({
        code: "custom",
        path: ["armature", "field_poles"],
        message: `poles come in pairs; ${job.armature.field_poles} is odd`,
        params: { code: "odd_poles" },
      });
    }
    if (job.winding.style !== "tooth" && job.winding.span === undefined) {
      ctx.addIssue({
        code: "custom",
        path: ["winding", "span"],
        message: `a ${job.winding.style} winding needs its coil span in slots, counted on the old winding`,
        params: { code: "missing_field" },
      });
    }
  });

export type LayoutJob = z.output<typeof layoutJobSchema>;

/** True when a parsed job file holds neither `original` nor `target`: a layout-only job, which only `diagnose` reads. */
export function isLayoutOnly(raw: unknown): boolean {
  return typeof raw === "object" && raw !== null && !Array.isArray(raw) && !("original" in raw) && !("target" in raw);
}

export { layoutJobSpec } from "./spec.js";
