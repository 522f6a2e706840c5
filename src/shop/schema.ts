/**
 * The shop profile (docs/contracts.md "The shop profile", version 1): what one shop and one bench share
 * across jobs — its name and the bench's, the wire on the shelf with the net mass left on each
 * spool, the paper, the logbook folder, the meter's resolution and the default limits. One zod
 * schema like the job file's; quantities parsed into SI by the job file's own `qty`.
 */
import { z } from "zod";
import { fraction, qty } from "../job/schema.js";
import { parseWireSpec } from "../wire/parse.js";

const TEMP = { min: -60, max: 250, minText: "-60 C", maxText: "250 C" };

const shelfWire = z
  .union([z.string(), z.number(), z.strictObject({ bare: z.union([z.number(), z.string()]), overall: z.union([z.number(), z.string()]).optional() })])
  .superRefine((v, ctx) => {
    const r = parseWireSpec(v, "stock");
    if (!r.ok) ctx.addIssue({ code: "custom", message: r.message, params: { code: "bad_wire" } });
  })
  .meta({ description: 'a wire as a job file writes it: "0.25 mm grade 2", "32 AWG heavy", or { bare, overall }' });

export const shopSchema = z.strictObject({
  $schema: z.string().optional(),
  version: z.literal(1).meta({ description: "shop profile version: 1" }),
  shop: z.string().min(1).max(120).optional().meta({ description: "the shop's name, printed in the card's header" }),
  bench: z
    .string()
    .regex(/^[A-Za-z0-9][A-Za-z0-9_-]{0,31}$/, "letters, digits, _ and - only, at most 32 (it goes into record file names)")
    .optional()
    .meta({ description: "this bench's name, unique within the shop: logbook record names carry it" }),
  paper: z.enum(["a4", "letter"]).optional().meta({ description: "paper for the card: a4 or letter" }),
  logbook: z.string().min(1).optional().meta({ description: "the logbook folder; a relative path is relative to this file" }),
  meter_resolution: qty("resistance", { positive: true })
    .optional()
    .meta({ description: "the resolution of the bench meter's lowest resistance range, e.g. 0.01 ohm" }),
  wire_shelf: z
    .array(
      z.strictObject({
        wire: shelfWire,
        spool_mass: qty("mass", { positive: true })
          .optional()
          .meta({ description: "net mass of wire left on the spool (the empty reel weighed and subtracted)" }),
      }),
    )
    .min(1)
    .optional()
    .meta({ description: "the wire on the shelf; a job's wire_stock replaces it" }),
  defaults: z
    .strictObject({
      limits: z
        .strictObject({
          copper_fill: fraction({ max: 0.9, positive: true }).optional(),
          space_fill: fraction({ max: 0.907, positive: true }).optional(),
          current_density: qty("current_density", { positive: true }).optional(),
          hot_stall_current: qty("current", { positive: true }).optional(),
        })
        .optional(),
      hot_temperature: qty("temperature", TEMP).optional(),
    })
    .optional()
    .meta({ description: "defaults for jobs that do not say: limits (merged key by key) and the hot temperature" }),
});

/** A shop profile as the code uses it (SI; wires as written). */
export type Shop = z.output<typeof shopSchema>;
/** A shop profile as written in the file. */
export type ShopInput = z.input<typeof shopSchema>;

/** Stable identifier of the profile's JSON Schema. */
export const SHOP_SCHEMA_ID = "urn:armwind:shop-profile:1";

/** The profile's JSON Schema (draft 2020-12) for editors, generated from the zod schema. */
export function shopJsonSchema(): Record<string, unknown> {
  const s = z.toJSONSchema(shopSchema, { io: "input", unrepresentable: "any" }) as Record<string, unknown>;
  return { $schema: "https://json-schema.org/draft/2020-12/schema", $id: SHOP_SCHEMA_ID, title: "armwind shop profile (armwind.yaml)", ...s };
}
