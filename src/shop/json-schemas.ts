/**
 * JSON Schemas (draft 2020-12) of the measured file and the shop profile, for editors, generated from
 * their zod schemas (the single sources of truth). Pure; templates/measured.schema.json and
 * templates/shop.schema.json are the committed copies (`npm run schema` writes them).
 */
import { z } from "zod";
import { measuredSchema } from "../logbook/measured.js";
import { shopJsonSchema } from "./schema.js";

export const MEASURED_SCHEMA_ID = "urn:armwind:measured-file:1";

export function measuredJsonSchemaText(): string {
  const s = z.toJSONSchema(measuredSchema, { io: "input", unrepresentable: "any" }) as Record<string, unknown>;
  return JSON.stringify({ ...s, $id: MEASURED_SCHEMA_ID, title: "armwind measured readings (version 1)" }, null, 2) + "\n";
}

export function shopJsonSchemaText(): string {
  return JSON.stringify(shopJsonSchema(), null, 2) + "\n";
}
