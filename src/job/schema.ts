/**
 * The job file, version 1: one zod schema that is the single source of truth for what a job file
 * may hold, for its TypeScript types (`JobInput` as written, `Job` as parsed, in SI) and for the
 * JSON Schema that editors use (`armwind schema`, generated from this file).
 *
 * Quantities are parsed here, once, into SI (°C for temperatures); wire names into `WireSpec`s.
 * Key names are docs/contracts.md's contract.
 */
import { z } from "zod";
import { parseQuantity, type QuantityKind, defaultUnit, example } from "./units.js";
import { parseWireSpec } from "../wire/parse.js";
import { COUNTS, ID_MAX_LENGTH, KIND_RANGES, RESERVED_NAMES, TEMPERATURE, TEXT_MAX_LENGTH } from "./ranges.js";

const TEMP = { min: TEMPERATURE.min, max: TEMPERATURE.max, minText: TEMPERATURE.minText, maxText: TEMPERATURE.maxText };

/**
 * The job file's enumerations, declared once: the schema uses them and every module takes its type
 * from here (winding style, progression, direction, field, supply kind, brush material).
 */
export const windingStyleSchema = z.enum(["tooth", "lap", "wave"]);
export type WindingStyle = z.infer<typeof windingStyleSchema>;
export const progressionSchema = z.enum(["progressive", "retrogressive"]);
export type Progression = z.infer<typeof progressionSchema>;
export const senseSchema = z.enum(["cw", "ccw"]);
export type Sense = z.infer<typeof senseSchema>;
export const armatureFieldSchema = z.enum(["permanent_magnet", "shunt", "series"]);
export type ArmatureField = z.infer<typeof armatureFieldSchema>;
export const supplyKindSchema = z.enum(["dc", "ac"]);
export type SupplyKind = z.infer<typeof supplyKindSchema>;
export const brushMaterialSchema = z.enum(["carbon", "metal"]);
export type BrushMaterial = z.infer<typeof brushMaterialSchema>;

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
        ctx.addIssue({
          code: "custom",
          message: `must be at least ${opts.min !== undefined ? (opts.minText ?? opts.min) : range.minText}, got ${JSON.stringify(v)}`,
          params: { code: "out_of_range" },
        });
        return z.NEVER;
      }
      if (x > max) {
        ctx.addIssue({
          code: "custom",
          message: `must be at most ${opts.max !== undefined ? (opts.maxText ?? opts.max) : range.maxText}, got ${JSON.stringify(v)}`,
          params: { code: "out_of_range" },
        });
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
  material: brushMaterialSchema.meta({ description: "carbon (drop about 2 V in total) or metal (a few tenths)" }).optional(),
});

/** A bench reading's frequency: AC at this frequency, 0 Hz for DC; absent: the target supply's kind. */
const readingFrequency = () => qty("frequency", { min: 0, max: 1000, minText: "0 Hz (DC)", maxText: "1000 Hz" }).optional();

/** What a bench test is: no_load (nothing on the shaft) or load (a known torque or output power). */
const testKindSchema = z.enum(["no_load", "load"]).meta({ description: "no_load (nothing on the shaft) or load (a known torque or output power)" });

/** The fields every bench test reads, whatever its kind: the supply, then the optional ones (written after a kind's own). */
const testSupply = { supply: qty("voltage", { positive: true }) };
const testOptional = {
  frequency: readingFrequency(),
  temperature: qty("temperature").optional(),
  field_current: qty("current", { min: 0 }).optional(),
};
const testCommon = { ...testSupply, ...testOptional };

/**
 * The two forms of a bench test, one per `kind`: the one statement of which fields each kind reads
 * (required unless optional). The validation below derives its "needs" and "belongs to" rules from
 * them, and the editor's JSON Schema (and so the workbench's form) shows them as a choice of two
 * forms (`EDITOR_FORMS`). A load test's torque or output power (one of the two) is a rule zod keeps.
 */
export const TEST_FORMS = {
  no_load: z.strictObject({
    kind: z.literal("no_load").meta({ description: "no_load: nothing on the shaft (the default)" }).optional(),
    ...testSupply,
    no_load_current: qty("current", { positive: true }),
    no_load_speed: qty("speed", { positive: true }),
    ...testOptional,
  }),
  load: z.strictObject({
    kind: z.literal("load").meta({ description: "load: a known load (brake or dynamometer)" }),
    ...testSupply,
    current: qty("current", { positive: true }),
    speed: qty("speed", { positive: true }),
    torque: qty("torque", { positive: true }).optional(),
    output_power: qty("power", { positive: true }).optional(),
    ...testOptional,
  }),
};

type TestKind = keyof typeof TEST_FORMS;
/** A kind's own fields (not shared with the other kind), and which of them it needs. */
function ownFields(kind: TestKind): { keys: string[]; required: string[] } {
  const other = TEST_FORMS[kind === "load" ? "no_load" : "load"].shape as Record<string, z.ZodType>;
  const shape = TEST_FORMS[kind].shape as Record<string, z.ZodType>;
  const keys = Object.keys(shape).filter((k) => !(k in other));
  return { keys, required: keys.filter((k) => !shape[k].safeParse(undefined).success) };
}

/** How the messages show a missing field (with a value written the usual way). */
const TEST_EXAMPLE: Record<string, string> = {
  no_load_current: "no_load_current: 0.18 A",
  no_load_speed: "no_load_speed: 9800 rpm",
  current: "current: 2.1 A",
  speed: "speed: 18000 rpm",
};
/** What to do instead, for a field of the other kind. */
const TEST_INSTEAD: Record<TestKind, string> = {
  no_load: "write kind: load for a test with a load, or use no_load_current and no_load_speed",
  load: "a load test uses current and speed",
};

const noLoadTestSchema = z
  .strictObject({
    kind: testKindSchema.prefault("no_load"),
    // every field of either form, optional here (the kind's own rules follow), the common ones as they are
    ...TEST_FORMS.no_load.partial().omit({ kind: true }).shape,
    ...TEST_FORMS.load.partial().omit({ kind: true }).shape,
    ...testCommon,
  })
  .superRefine((t, ctx) => {
    const need = (key: string, ex: string) =>
      ctx.addIssue({ code: "custom", path: [key], message: `a ${t.kind.replace("_", "-")} test needs ${key}: add ${ex}`, params: { code: "missing_field" } });
    const refuse = (key: string, instead: string) =>
      ctx.addIssue({
        code: "custom",
        path: [key],
        message: `${key} belongs to a ${t.kind === "load" ? "no-load" : "load"} test; ${instead}`,
        params: { code: "unknown_key" },
      });
    const values = t as Record<string, unknown>;
    const own = ownFields(t.kind);
    for (const k of own.required) if (values[k] === undefined) need(k, TEST_EXAMPLE[k] ?? `${k}: …`);
    if (t.kind === "load") {
      if (t.torque === undefined && t.output_power === undefined) need("torque", "torque: 0.35 N m (or output_power: 400 W)");
      if (t.torque !== undefined && t.output_power !== undefined) refuse("output_power", "give either torque or output_power, not both");
    }
    for (const k of ownFields(t.kind === "load" ? "no_load" : "load").keys) if (values[k] !== undefined) refuse(k, TEST_INSTEAD[t.kind]);
  });

/**
 * Schemas whose editor JSON Schema is a choice of forms rather than their own (src/job/json-schema.ts):
 * a bench test is written in the form of its kind.
 */
export const EDITOR_FORMS = new Map<z.ZodType, z.ZodType>([[noLoadTestSchema, z.union([TEST_FORMS.no_load, TEST_FORMS.load])]]);

const nameplateSchema = z
  .strictObject({
    supply: qty("voltage", { positive: true }),
    frequency: readingFrequency(),
    current: qty("current", { positive: true }).optional(),
    input_power: qty("power", { positive: true }).optional(),
    speed: qty("speed", { positive: true }),
    speed_kind: z
      .enum(["motor", "spindle"])
      .meta({ description: "motor: the speed at the armature; spindle: at a geared output (give gear_ratio)" })
      .prefault("motor"),
    gear_ratio: z.number().positive().max(1000).meta({ description: "motor speed ÷ spindle speed (a 4:1 reduction is 4)" }).optional(),
  })
  .superRefine((n, ctx) => {
    if (n.current === undefined && n.input_power === undefined) {
      ctx.addIssue({
        code: "custom",
        path: ["current"],
        message: "a nameplate needs its current (current: 2.2 A) or its input watts (input_power: 500 W)",
        params: { code: "missing_field" },
      });
    }
    if (n.speed_kind === "spindle" && n.gear_ratio === undefined) {
      ctx.addIssue({
        code: "custom",
        path: ["gear_ratio"],
        message: "a spindle speed needs the gear ratio to reach the motor: add gear_ratio (motor speed ÷ spindle speed, e.g. 4)",
        params: { code: "missing_field" },
      });
    }
  });

const ohmAt = () => z.strictObject({ value: qty("resistance", { positive: true }), at: qty("temperature", TEMP).prefault(20) });

/** A series (or shunt) field: a stator part, so at the top level of the job. */
const fieldWindingSchema = z.strictObject({
  resistance: ohmAt().meta({ description: "all field coils of the circuit in series, at a temperature" }),
  inductance: qty("inductance", { positive: true }).optional(),
  locked_rotor: z
    .strictObject({
      supply: qty("voltage", { positive: true, max: 1000, maxText: "1000 V" }),
      current: qty("current", { positive: true }),
      frequency: readingFrequency(),
      temperature: qty("temperature", TEMP).optional(),
    })
    .optional(),
  turns_per_pole: count(1, "turns per pole of the field coil").max(100000).optional(),
  rewound_turns_per_pole: count(1, "turns per pole when the field is rewound to a new count").max(100000).optional(),
});

const supplySchema = z.union([
  qty("voltage", { positive: true, max: 1000, maxText: "1000 V" }),
  z
    .strictObject({
      value: qty("voltage", { positive: true, max: 1000, maxText: "1000 V" }),
      kind: supplyKindSchema.prefault("dc"),
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
  else if (RESERVED_NAMES.test(id))
    bad(
      `"${id}" is a device name on Windows (CON, PRN, AUX, NUL, COM1…, LPT1…): a card or record named by it cannot be written to a shared drive; choose another id`,
    );
});

/** Free text (title, customer, notes), at most TEXT_MAX_LENGTH characters. */
const freeText = z.string().max(TEXT_MAX_LENGTH);

export const GOALS = ["restore", "no_load_speed", "kv", "stall_current", "duty", "convert", "fixed"] as const;

/** The two senses of Kv (docs/contracts.md "Kv"): the motor constant 60/(2π·Ke), or no-load speed ÷ supply. */
export const KV_BASES = ["constant", "no_load"] as const;

/**
 * A tolerance on the goal: a bare fraction (± that much; for `stall_current`, a limit, t below and
 * nothing above) or `{ below, above }`, each side a fraction 0 … 0.5 (0: that side not allowed).
 * docs/contracts.md "Choosing among candidates".
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

/** Bare t → ±t, except for a `stall_current` limit, never exceeded: { below: t, above: 0 } (docs/contracts.md). */
export function toleranceOf(given: number | Tolerance, goal: (typeof GOALS)[number]): Tolerance {
  if (typeof given !== "number") return given;
  return goal === "stall_current" ? { below: given, above: 0 } : { below: given, above: given };
}

const fixedSchema = z
  .strictObject({
    turns: count(COUNTS.turns.min, "turns per coil of the chosen winding").max(COUNTS.turns.max),
    wire: wireRole("stock"),
    strands: count(COUNTS.strands.min, "strands in hand").max(COUNTS.strands.max).prefault(1),
  })
  .meta({ description: "goal fixed: the winding chosen, { turns: 45, wire: 0.25 mm grade 2, strands: 1 }" });

const jobShape = z.strictObject({
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
    field: armatureFieldSchema,
    stack_length: qty("length", { positive: true, max: 1, maxText: "1 m" }),
    rotor_diameter: qty("length", { positive: true, max: 1, maxText: "1 m" }),
    tooth_width: qty("length", { positive: true, max: 0.5, maxText: "500 mm" }).optional(),
    slot: slotSchema,
    magnet: magnetSchema.optional(),
  }),
  field_winding: fieldWindingSchema.optional(),
  winding: z.strictObject({
    style: windingStyleSchema,
    span: count(0, "coil span in slots (tooth: 1)").max(200).optional(),
    coils_per_slot: count(COUNTS.coils_per_slot.min, "coils per slot u (bars = u × slots)").max(COUNTS.coils_per_slot.max).prefault(1),
    dead_coil: z.boolean().prefault(false),
    equalizers: z.boolean().prefault(false),
    progression: progressionSchema.prefault("progressive"),
    lead_throw: z
      .number()
      .min(-400)
      .max(400)
      .meta({ description: "bars clockwise from coil 1's centre line to bar 1 (copied from the old winding)" })
      .prefault(0),
    direction: senseSchema.prefault("cw"),
    mean_turn_length: qty("length", { positive: true, max: 5, maxText: "5 m" }).optional(),
    lead_allowance: qty("length", { min: 0, max: 2, maxText: "2 m" }).prefault("50 mm"),
    spare_margin: fraction({ max: 2 }).prefault(0.1),
    continuous: z.boolean().prefault(false),
    brushes: brushesSchema.prefault({}),
    brush_drop: qty("voltage", { min: 0, max: 10, maxText: "10 V" }).optional(),
  }),
  original: z.strictObject({
    turns: count(COUNTS.turns.min, "turns per coil of the original winding").max(COUNTS.turns.max),
    wire: wireRole("original"),
    strands: count(COUNTS.strands.min, "strands in hand").max(COUNTS.strands.max).prefault(1),
    wire_length: qty("wire_length", { positive: true }).optional(),
    wire_mass: qty("mass", { positive: true }).optional(),
    nameplate: nameplateSchema.optional(),
    armature_inductance: qty("inductance", { positive: true }).optional(),
    tests: z.array(noLoadTestSchema).max(COUNTS.tests.max).optional(),
    generator: z.strictObject({ speed: qty("speed", { positive: true }), volts: qty("voltage", { positive: true }) }).optional(),
    terminal_resistance: z.strictObject({ value: qty("resistance", { positive: true }), at: qty("temperature", TEMP).prefault(20) }).optional(),
  }),
  target: z
    .strictObject({
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
  wire_stock: z.array(wireRole("stock")).min(1).max(COUNTS.wire_stock.max).optional(),
  max_in_hand: count(COUNTS.in_hand.min, "most strands wound together").max(COUNTS.in_hand.max).prefault(1),
});

export const jobSchema = jobShape.superRefine((job, ctx) => {
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
  seriesRules(job, ctx);
  checkSlotFitsRotor(job.armature, ctx);
  if (t.limits.current_density === "none" && t.duty === undefined && t.rated_current === undefined) {
    ctx.addIssue({
      code: "custom",
      path: ["target", "limits", "current_density"],
      message:
        "current_density: none turns off a limit that applies only with a duty or a rated_current, and this job gives neither; remove the line, or add rated_current: 0.9 A",
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

type JobOut = z.output<typeof jobShape>;

/** Rules for series motors, their field and their goals (docs/contracts.md, "Series and universal motors"). */
function seriesRules(job: JobOut, ctx: z.RefinementCtx): void {
  const t = job.target;
  const series = job.armature.field === "series";
  const issue = (path: (string | number)[], message: string, code: string) => ctx.addIssue({ code: "custom", path, message, params: { code } });
  if (series && (t.goal === "no_load_speed" || t.goal === "kv" || t.goal === "stall_current")) {
    issue(
      ["target", "goal"],
      `a series or universal motor has no safe no-load speed, no constant Kv and no stall figure at its supply; use goal restore, duty or convert`,
      "goal_unsuitable",
    );
  }
  if (!series && t.goal === "convert") {
    issue(
      ["target", "goal"],
      `goal convert re-plans a series motor's armature for a new supply; for a ${job.armature.field.replace("_", "-")} motor use no_load_speed, kv or duty`,
      "goal_unsuitable",
    );
  }
  if (series && t.goal === "convert" && !job.original.nameplate && !(job.original.tests ?? []).some((x) => x.kind === "load")) {
    issue(
      ["original", "nameplate"],
      "goal convert keeps the original's rated speed and torque: give the nameplate (supply, current or input_power, speed) or a load test",
      "missing_field",
    );
  }
  if (series && t.goal === "convert" && !job.field_winding) {
    issue(
      ["field_winding"],
      "goal convert says what the field must become: give field_winding with the field's resistance (resistance: { value: 3.8 ohm, at: 20 C })",
      "missing_field",
    );
  }
  (job.original.tests ?? []).forEach((x, i) => {
    if (x.kind === "load" && !series)
      issue(["original", "tests", i, "kind"], "load tests calibrate series motors only; for this motor give a no-load test (kind: no_load)", "goal_unsuitable");
  });
  if (typeof t.supply === "object" && t.supply.kind === "ac" && t.supply.frequency === undefined) {
    issue(["target", "supply", "frequency"], "an AC supply needs its frequency: add frequency: 50 Hz (or 60 Hz)", "missing_field");
  }
  if (job.field_winding && !series && job.armature.field !== "shunt") {
    issue(["field_winding"], "a permanent-magnet motor has no field winding: remove field_winding, or set armature.field to series or shunt", "unknown_key");
  }
  const lr = job.field_winding?.locked_rotor;
  if (lr && lr.frequency === undefined && typeof t.supply === "object" && t.supply.kind === "ac") {
    issue(
      ["field_winding", "locked_rotor", "frequency"],
      "say whether the locked-rotor reading was on AC (frequency: 50 Hz) or DC (frequency: 0 Hz)",
      "missing_field",
    );
  }
}

/**
 * The slots must fit in the rotor: all slots' free area together less than the rotor's
 * cross-section π/4·D², a trapezoid slot no deeper than the rotor's radius (geometry; catches a
 * slot area written in the wrong unit, like 1e300 mm² on a 20 mm rotor).
 */
function checkSlotFitsRotor(a: { slots: number; rotor_diameter: number; slot: { area?: number; depth?: number } }, ctx: z.RefinementCtx) {
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
