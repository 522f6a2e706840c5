/**
 * The job file, version 1: one zod schema that is the single source of truth for what a job file
 * may hold, for its TypeScript types (`JobInput` as written, `Job` as parsed, in SI) and for the
 * JSON Schema that editors use (`armwind schema`, generated from this file).
 *
 * Quantities are parsed here, once, into SI (°C for temperatures); wire names into `WireSpec`s.
 * Key names are DESIGN.md's contract.
 */
import { z } from "zod";
import { parseQuantity, type QuantityKind, defaultUnit, example } from "./units.js";
import { parseWireSpec } from "../wire/parse.js";

interface QtyOptions {
  /** Strictly greater than zero. */
  positive?: boolean;
  /** At least this (SI). */
  min?: number;
  /** At most this (SI). */
  max?: number;
  /** How to print a limit in messages, e.g. "1 m". */
  maxText?: string;
  minText?: string;
}

/** "a length", "an area", "a speed per volt": the kind as a noun with its article. */
function kindNoun(kind: QuantityKind): string {
  const noun = kind.replace(/_/g, " ");
  return `${/^[aeiou]/.test(noun) ? "an" : "a"} ${noun}`;
}

/** A quantity of a kind: `"12 mm"` or a bare number in the kind's default unit → SI. */
export function qty(kind: QuantityKind, opts: QtyOptions = {}) {
  return z
    .union([z.number(), z.string()])
    .meta({ description: `${kindNoun(kind)}: a number with a unit such as "${example(kind)}", or a bare number in ${defaultUnit(kind)}` })
    .transform((v, ctx) => {
      const r = parseQuantity(v, kind);
      if (!r.ok) {
        ctx.addIssue({ code: "custom", message: r.message, params: { code: "bad_quantity" } });
        return z.NEVER;
      }
      const x = r.value;
      if (opts.positive && !(x > 0)) {
        ctx.addIssue({ code: "custom", message: `must be greater than zero, got ${JSON.stringify(v)}`, params: { code: "out_of_range" } });
        return z.NEVER;
      }
      if (opts.min !== undefined && x < opts.min) {
        ctx.addIssue({ code: "custom", message: `must be at least ${opts.minText ?? opts.min}, got ${JSON.stringify(v)}`, params: { code: "out_of_range" } });
        return z.NEVER;
      }
      if (opts.max !== undefined && x > opts.max) {
        ctx.addIssue({ code: "custom", message: `must be at most ${opts.maxText ?? opts.max}, got ${JSON.stringify(v)}`, params: { code: "out_of_range" } });
        return z.NEVER;
      }
      return x;
    });
}

/** A fraction 0 … 1 (or a percentage written "40 %"). */
export function fraction(opts: { max?: number; positive?: boolean } = {}) {
  const max = opts.max ?? 1;
  return z
    .union([z.number(), z.string()])
    .meta({ description: 'a fraction such as 0.40, or a percentage such as "40 %"' })
    .transform((v, ctx) => {
      let x: number;
      if (typeof v === "number") x = v;
      else {
        const m = /^\s*([+-]?(?:\d+\.?\d*|\.\d+))\s*(%?)\s*$/.exec(v);
        if (!m) {
          ctx.addIssue({ code: "custom", message: `"${v}" is not a fraction; write it like 0.40 or "40 %"`, params: { code: "bad_quantity" } });
          return z.NEVER;
        }
        x = Number(m[1]) / (m[2] ? 100 : 1);
      }
      if (!Number.isFinite(x) || x < 0 || x > max || (opts.positive && x === 0)) {
        ctx.addIssue({
          code: "custom",
          message: `must be a fraction ${opts.positive ? "above 0" : "from 0"} to ${max}, got ${JSON.stringify(v)}`,
          params: { code: "out_of_range" },
        });
        return z.NEVER;
      }
      return x;
    });
}

const wireRole = (role: "stock" | "original") =>
  z
    .union([
      z.string().meta({ description: 'a wire: "0.25 mm", "0.25 mm grade 2", "33 AWG heavy", "36 SWG"' }),
      z.number().meta({ description: "a bare copper diameter in mm" }),
      z.strictObject({
        bare: z.union([z.number(), z.string()]).meta({ description: "measured bare copper diameter, e.g. 0.25 mm" }),
        overall: z.union([z.number(), z.string()]).optional().meta({ description: "measured overall (enamelled) diameter, e.g. 0.282 mm" }),
      }),
    ])
    .transform((v, ctx) => {
      const r = parseWireSpec(v, role);
      if (!r.ok) {
        ctx.addIssue({ code: "custom", message: r.message, params: { code: "bad_wire" } });
        return z.NEVER;
      }
      return r.spec;
    });

const count = (min: number, description: string) => z.int().min(min).meta({ description });

const slotSchema = z
  .strictObject({
    area: qty("area", { positive: true }).optional(),
    width_top: qty("length", { positive: true }).optional(),
    width_bottom: qty("length", { positive: true }).optional(),
    depth: qty("length", { positive: true }).optional(),
    perimeter: qty("length", { positive: true }).optional(),
    opening: qty("length", { positive: true }),
    liner: qty("length", { min: 0, minText: "0 mm" }).prefault(0),
  })
  .superRefine((s, ctx) => {
    const dims = [s.width_top, s.width_bottom, s.depth];
    const some = dims.some((d) => d !== undefined);
    const all = dims.every((d) => d !== undefined);
    if (s.area === undefined && !all) {
      const missing = (["width_top", "width_bottom", "depth"] as const).filter((k) => s[k] === undefined);
      ctx.addIssue({
        code: "custom",
        path: some ? [missing[0]] : ["area"],
        message: some
          ? `a trapezoid slot needs width_top, width_bottom and depth; ${missing.join(" and ")} missing`
          : "give the slot's free area (area: 13.5 mm2) or its three dimensions (width_top, width_bottom, depth)",
        params: { code: "missing_field" },
      });
    }
  });

const magnetSchema = z
  .strictObject({
    flux_per_pole: qty("flux", { positive: true }).optional(),
    gap_flux_density: qty("flux_density", { positive: true, max: 3, maxText: "3 T" }).optional(),
    pole_arc: fraction({ positive: true }).optional(),
  })
  .superRefine((m, ctx) => {
    if (m.flux_per_pole === undefined && m.gap_flux_density === undefined) {
      ctx.addIssue({
        code: "custom",
        path: ["flux_per_pole"],
        message: "give flux_per_pole (e.g. 0.20 mWb) or gap_flux_density (e.g. 0.35 T) with pole_arc",
        params: { code: "missing_field" },
      });
    }
  });

const brushesSchema = z.strictObject({
  count: count(2, "number of brushes (2, or P on a lap winding with P poles)").prefault(2),
  width_bars: z.number().positive().max(4).meta({ description: "brush width in bars (1 = one bar wide)" }).prefault(1),
  material: z.enum(["carbon", "metal"]).meta({ description: "carbon (drop about 2 V in total) or metal (a few tenths)" }).optional(),
});

const noLoadTestSchema = z.strictObject({
  supply: qty("voltage", { positive: true }),
  no_load_current: qty("current", { positive: true }),
  no_load_speed: qty("speed", { positive: true }),
  temperature: qty("temperature", { min: -60, max: 250, minText: "-60 C", maxText: "250 C" }).optional(),
  field_current: qty("current", { min: 0 }).optional(),
});

const supplySchema = z.union([
  qty("voltage", { positive: true, max: 1000, maxText: "1000 V" }),
  z
    .strictObject({
      value: qty("voltage", { positive: true, max: 1000, maxText: "1000 V" }),
      kind: z.enum(["dc", "ac"]).prefault("dc"),
      frequency: qty("frequency", { positive: true }).optional(),
    })
    .meta({ description: "a supply: { value: 230 V, kind: ac, frequency: 50 Hz }" }),
]);

const dutySchema = z.strictObject({
  torque: qty("torque", { positive: true }),
  speed: qty("speed", { positive: true }),
});

export const GOALS = ["restore", "no_load_speed", "kv", "stall_current", "duty", "fixed"] as const;

/** The two senses of Kv (DESIGN.md "Kv"): the motor constant 60/(2π·Ke), or no-load speed ÷ supply. */
export const KV_BASES = ["constant", "no_load"] as const;

/**
 * A tolerance on the goal: a bare fraction (± that much; for `stall_current`, a limit, t below and
 * nothing above) or `{ below, above }`, each side a fraction 0 … 0.5 (0: that side not allowed).
 * DESIGN.md "Choosing among candidates".
 */
const toleranceSchema = z.union([
  fraction({ max: 0.5, positive: true }),
  z
    .strictObject({
      below: fraction({ max: 0.5 }),
      above: fraction({ max: 0.5 }),
    })
    .meta({ description: "one-sided or asymmetric tolerance: { below: 0.02, above: 0.08 }" }),
]);

/** A tolerance as the core uses it: the fraction allowed below and above the goal. */
export interface Tolerance {
  below: number;
  above: number;
}

/** Bare t → ±t, except for a `stall_current` limit, never exceeded: { below: t, above: 0 } (DESIGN.md). */
export function toleranceOf(given: number | Tolerance, goal: (typeof GOALS)[number]): Tolerance {
  if (typeof given !== "number") return given;
  return goal === "stall_current" ? { below: given, above: 0 } : { below: given, above: given };
}

const fixedSchema = z
  .strictObject({
    turns: count(1, "turns per coil of the chosen winding").max(100000),
    wire: wireRole("stock"),
    strands: count(1, "strands in hand").max(20).prefault(1),
  })
  .meta({ description: "goal fixed: the winding chosen, { turns: 45, wire: 0.25 mm grade 2, strands: 1 }" });

const TEMP = { min: -60, max: 250, minText: "-60 C", maxText: "250 C" };

export const jobSchema = z
  .strictObject({
    $schema: z.string().optional().meta({ description: "editor hint, ignored" }),
    version: z.literal(1).meta({ description: "job file version: 1" }),
    id: z
      .string()
      .regex(/^[A-Za-z0-9][A-Za-z0-9._-]{0,79}$/, "must be letters, digits, '.', '_' or '-' (it names files), starting with a letter or digit")
      .meta({ description: "unique job id, used in file names and the logbook" }),
    title: z.string().min(1),
    customer: z.string().optional(),
    notes: z.string().optional(),
    armature: z.strictObject({
      family: z.string().min(1).optional().meta({ description: "rewinds of the same armature share calibration" }),
      slots: count(2, "slots (= teeth)").max(200),
      bars: count(2, "commutator bars (segments)").max(400),
      field_poles: count(2, "poles of the stator field (2, 4, 6 …)").max(24),
      field: z.enum(["permanent_magnet", "shunt", "series"]),
      stack_length: qty("length", { positive: true, max: 1, maxText: "1 m" }),
      rotor_diameter: qty("length", { positive: true, max: 1, maxText: "1 m" }),
      tooth_width: qty("length", { positive: true, max: 0.5, maxText: "500 mm" }).optional(),
      slot: slotSchema,
      magnet: magnetSchema.optional(),
    }),
    winding: z.strictObject({
      style: z.enum(["tooth", "lap", "wave"]),
      span: count(0, "coil span in slots (tooth: 1)").max(200).optional(),
      coils_per_slot: count(1, "coils per slot u (bars = u × slots)").max(8).prefault(1),
      dead_coil: z.boolean().prefault(false),
      equalizers: z.boolean().prefault(false),
      progression: z.enum(["progressive", "retrogressive"]).prefault("progressive"),
      lead_throw: z.number().min(-400).max(400).meta({ description: "bars clockwise from coil 1's centre line to bar 1 (copied from the old winding)" }).prefault(0),
      direction: z.enum(["cw", "ccw"]).prefault("cw"),
      mean_turn_length: qty("length", { positive: true, max: 5, maxText: "5 m" }).optional(),
      lead_allowance: qty("length", { min: 0, max: 2, maxText: "2 m" }).prefault("50 mm"),
      spare_margin: fraction({ max: 2 }).prefault(0.1),
      brushes: brushesSchema.prefault({}),
      brush_drop: qty("voltage", { min: 0, max: 10, maxText: "10 V" }).optional(),
    }),
    original: z.strictObject({
      turns: count(1, "turns per coil of the original winding").max(100000),
      wire: wireRole("original"),
      strands: count(1, "strands in hand").max(20).prefault(1),
      wire_length: qty("wire_length", { positive: true }).optional(),
      wire_mass: qty("mass", { positive: true }).optional(),
      nameplate: z
        .strictObject({
          supply: qty("voltage", { positive: true }),
          current: qty("current", { positive: true }),
          speed: qty("speed", { positive: true }),
        })
        .optional(),
      tests: z.array(noLoadTestSchema).optional(),
      generator: z.strictObject({ speed: qty("speed", { positive: true }), volts: qty("voltage", { positive: true }) }).optional(),
      terminal_resistance: z
        .strictObject({ value: qty("resistance", { positive: true }), at: qty("temperature", TEMP).prefault(20) })
        .optional(),
    }),
    target: z.strictObject({
      supply: supplySchema,
      goal: z.enum(GOALS),
      no_load_speed: qty("speed", { positive: true }).optional(),
      kv: qty("speed_per_volt", { positive: true }).optional(),
      stall_current: qty("current", { positive: true }).optional(),
      duty: dutySchema.optional(),
      fixed: fixedSchema.optional(),
      kv_basis: z.enum(KV_BASES).prefault("constant").meta({ description: "goal kv: constant (60/(2π·Ke), default) or no_load (no-load speed ÷ supply)" }),
      tolerance: toleranceSchema.prefault(0.03),
      rated_current: qty("current", { positive: true }).optional(),
      limits: z
        .strictObject({
          copper_fill: fraction({ max: 0.9, positive: true }).prefault(0.4),
          space_fill: fraction({ max: 0.907, positive: true }).prefault(0.7),
          current_density: z
            .union([z.literal("none").meta({ description: "none: no current-density limit" }), qty("current_density", { positive: true })])
            .optional(),
          hot_stall_current: qty("current", { positive: true }).optional(),
        })
        .prefault({}),
      hot_temperature: qty("temperature", TEMP).prefault(80),
    })
    .transform((t) => ({ ...t, tolerance: toleranceOf(t.tolerance, t.goal) })),
    wire_stock: z.array(wireRole("stock")).min(1).optional(),
    max_in_hand: count(1, "most strands wound together").max(8).prefault(1),
  })
  .superRefine((job, ctx) => {
    const t = job.target;
    const need: Record<string, unknown> = {
      no_load_speed: t.no_load_speed,
      kv: t.kv,
      stall_current: t.stall_current,
      duty: t.duty,
      fixed: t.fixed,
    };
    if (t.goal in need && need[t.goal] === undefined) {
      const ex: Record<string, string> = {
        no_load_speed: "no_load_speed: 9000 rpm",
        kv: "kv: 600 rpm/V",
        stall_current: "stall_current: 3 A",
        duty: "duty: { torque: 4 mN m, speed: 5000 rpm }",
        fixed: "fixed: { turns: 45, wire: 0.25 mm grade 2, strands: 1 }",
      };
      ctx.addIssue({
        code: "custom",
        path: ["target", t.goal],
        message: `goal ${t.goal} needs its value: add ${ex[t.goal]}`,
        params: { code: "missing_field" },
      });
    }
    if (job.armature.field === "series" && (t.goal === "no_load_speed" || t.goal === "kv")) {
      ctx.addIssue({
        code: "custom",
        path: ["target", "goal"],
        message: `a series or universal motor has no safe no-load speed and no constant Kv; use goal restore, stall_current or duty`,
        params: { code: "goal_unsuitable" },
      });
    }
    if (job.armature.field === "series" && t.goal === "stall_current") {
      ctx.addIssue({
        code: "custom",
        path: ["target", "goal"],
        message:
          "a series or universal motor's stall current is set by its field winding and, on AC, its reactance, which the armature alone does not give; use goal restore or duty (and stall-test only at a reduced voltage)",
        params: { code: "goal_unsuitable" },
      });
    }
    if (t.limits.current_density === "none" && t.duty === undefined && t.rated_current === undefined) {
      ctx.addIssue({
        code: "custom",
        path: ["target", "limits", "current_density"],
        message: "current_density: none turns off a limit that applies only with a duty or a rated_current, and this job gives neither; remove the line, or add rated_current: 0.9 A",
        params: { code: "limit_unused" },
      });
    }
    if (job.armature.field_poles % 2 !== 0) {
      ctx.addIssue({
        code: "custom",
        path: ["armature", "field_poles"],
        message: `poles come in pairs; ${job.armature.field_poles} is odd (nearest: ${job.armature.field_poles - 1} or ${job.armature.field_poles + 1})`,
        params: { code: "odd_poles" },
      });
    }
    if (job.winding.style !== "tooth" && job.winding.span === undefined) {
      const pitch = Math.max(1, Math.floor(job.armature.slots / job.armature.field_poles));
      ctx.addIssue({
        code: "custom",
        path: ["winding", "span"],
        message: `a ${job.winding.style} winding needs its coil span in slots, counted on the old winding (full pitch here would be span: ${pitch})`,
        params: { code: "missing_field" },
      });
    }
  });

/** The job file as written (before parsing units). */
export type JobInput = z.input<typeof jobSchema>;
/** The job as the core uses it: every quantity in SI (°C for temperatures), wires as specs. */
export type Job = z.output<typeof jobSchema>;
