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
import { COUNTS, ID_MAX_LENGTH, KIND_RANGES, RESERVED_NAMES, TEMPERATURE, TEXT_MAX_LENGTH } from "./ranges.js";

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
      // the kind's physical range (src/job/ranges.ts) bounds every field that does not narrow it
      const range = KIND_RANGES[kind];
      const max = opts.max ?? range.max;
      const min = opts.min ?? range.min;
      if (opts.positive && !(x > 0)) {
        ctx.addIssue({ code: "custom", message: `must be greater than zero, got ${JSON.stringify(v)}`, params: { code: "out_of_range" } });
        return z.NEVER;
      }
      if (min !== undefined && x < min) {
        ctx.addIssue({ code: "custom", message: `must be at least ${opts.min !== undefined ? (opts.minText ?? opts.min) : range.minText}, got ${JSON.stringify(v)}`, params: { code: "out_of_range" } });
        return z.NEVER;
      }
      if (x > max) {
        ctx.addIssue({ code: "custom", message: `must be at most ${opts.max !== undefined ? (opts.maxText ?? opts.max) : range.maxText}, got ${JSON.stringify(v)}`, params: { code: "out_of_range" } });
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
  temperature: qty("temperature").optional(),
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

/**
 * A job id names files (cards, records) and may travel to a shared drive: letters, digits, '.',
 * '_' and '-', at most ID_MAX_LENGTH characters, not a name Windows keeps for a device (CON, NUL…).
 */
export const jobId = z.string().superRefine((id, ctx) => {
  const bad = (message: string, code = "bad_id") => ctx.addIssue({ code: "custom", message, params: { code } });
  if (id.length > ID_MAX_LENGTH) bad(`is ${id.length} characters long; an id names files, so keep it to ${ID_MAX_LENGTH} or fewer`);
  else if (!/^[A-Za-z0-9][A-Za-z0-9._-]*$/.test(id)) bad("must be letters, digits, '.', '_' or '-' (it names files), starting with a letter or digit");
  else if (RESERVED_NAMES.test(id)) bad(`"${id}" is a device name on Windows (CON, PRN, AUX, NUL, COM1…, LPT1…): a card or record named by it cannot be written to a shared drive; choose another id`);
});

/** Free text (title, customer, notes), at most TEXT_MAX_LENGTH characters. */
const freeText = z.string().max(TEXT_MAX_LENGTH);

export const GOALS = ["restore", "no_load_speed", "kv", "stall_current", "duty"] as const;

const TEMP = { min: TEMPERATURE.min, max: TEMPERATURE.max, minText: TEMPERATURE.minText, maxText: TEMPERATURE.maxText };

export const jobSchema = z
  .strictObject({
    $schema: z.string().optional().meta({ description: "editor hint, ignored" }),
    version: z.literal(1).meta({ description: "job file version: 1" }),
    id: jobId.meta({ description: "unique job id, used in file names and the logbook" }),
    title: freeText.min(1),
    customer: freeText.optional(),
    notes: freeText.optional(),
    armature: z.strictObject({
      family: z.string().min(1).optional().meta({ description: "rewinds of the same armature share calibration" }),
      slots: count(COUNTS.slots.min, "slots (= teeth)").max(COUNTS.slots.max),
      bars: count(COUNTS.bars.min, "commutator bars (segments)").max(COUNTS.bars.max),
      field_poles: count(COUNTS.poles.min, "poles of the stator field (2, 4, 6 …)").max(COUNTS.poles.max),
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
      coils_per_slot: count(COUNTS.coils_per_slot.min, "coils per slot u (bars = u × slots)").max(COUNTS.coils_per_slot.max).prefault(1),
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
      turns: count(COUNTS.turns.min, "turns per coil of the original winding").max(COUNTS.turns.max),
      wire: wireRole("original"),
      strands: count(COUNTS.strands.min, "strands in hand").max(COUNTS.strands.max).prefault(1),
      wire_length: qty("wire_length", { positive: true }).optional(),
      wire_mass: qty("mass", { positive: true }).optional(),
      nameplate: z
        .strictObject({
          supply: qty("voltage", { positive: true }),
          current: qty("current", { positive: true }),
          speed: qty("speed", { positive: true }),
        })
        .optional(),
      tests: z.array(noLoadTestSchema).max(COUNTS.tests.max).optional(),
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
      tolerance: fraction({ max: 0.5, positive: true }).prefault(0.03),
      rated_current: qty("current", { positive: true }).optional(),
      limits: z
        .strictObject({
          copper_fill: fraction({ max: 0.9, positive: true }).prefault(0.4),
          space_fill: fraction({ max: 0.907, positive: true }).prefault(0.7),
          current_density: qty("current_density", { positive: true }).optional(),
          hot_stall_current: qty("current", { positive: true }).optional(),
        })
        .prefault({}),
      hot_temperature: qty("temperature", TEMP).prefault(80),
    }),
    wire_stock: z.array(wireRole("stock")).min(1).max(COUNTS.wire_stock.max).optional(),
    max_in_hand: count(COUNTS.in_hand.min, "most strands wound together").max(COUNTS.in_hand.max).prefault(1),
  })
  .superRefine((job, ctx) => {
    const t = job.target;
    const need: Record<string, unknown> = {
      no_load_speed: t.no_load_speed,
      kv: t.kv,
      stall_current: t.stall_current,
      duty: t.duty,
    };
    if (t.goal in need && need[t.goal] === undefined) {
      const ex: Record<string, string> = {
        no_load_speed: "no_load_speed: 9000 rpm",
        kv: "kv: 600 rpm/V",
        stall_current: "stall_current: 3 A",
        duty: "duty: { torque: 4 mN m, speed: 5000 rpm }",
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
    checkSlotFitsRotor(job.armature, ctx);
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

/**
 * The slots must fit in the rotor: all slots' free area together less than the rotor's
 * cross-section π/4·D², a trapezoid slot no deeper than the rotor's radius (geometry; catches a
 * slot area written in the wrong unit, like 1e300 mm² on a 20 mm rotor).
 */
function checkSlotFitsRotor(a: { slots: number; rotor_diameter: number; slot: { area?: number; depth?: number } }, ctx: z.core.$RefinementCtx) {
  const disc = (Math.PI / 4) * a.rotor_diameter ** 2;
  const mm2 = (x: number) => `${Number((x * 1e6).toPrecision(3))} mm²`;
  if (a.slot.area !== undefined && a.slot.area * a.slots > disc) {
    ctx.addIssue({
      code: "custom",
      path: ["armature", "slot", "area"],
      message: `${a.slots} slots of ${mm2(a.slot.area)} are more than the whole cross-section of a ${Number((a.rotor_diameter * 1e3).toPrecision(4))} mm rotor (${mm2(disc)}); the free area of one slot is a few per cent of it (check the unit: mm2)`,
      params: { code: "inconsistent_geometry" },
    });
  }
  if (a.slot.depth !== undefined && a.slot.depth > a.rotor_diameter / 2) {
    ctx.addIssue({
      code: "custom",
      path: ["armature", "slot", "depth"],
      message: `a slot ${Number((a.slot.depth * 1e3).toPrecision(4))} mm deep does not fit in a rotor of ${Number((a.rotor_diameter * 1e3).toPrecision(4))} mm diameter (at most its radius)`,
      params: { code: "inconsistent_geometry" },
    });
  }
}

/** The job file as written (before parsing units). */
export type JobInput = z.input<typeof jobSchema>;
/** The job as the core uses it: every quantity in SI (°C for temperatures), wires as specs. */
export type Job = z.output<typeof jobSchema>;
