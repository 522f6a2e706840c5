/**
 * The job form, generated from the job file's JSON Schema (itself generated from the zod schema,
 * src/job/schema.ts, with each field's help and unit): a fieldset per section, an input per field,
 * filled from the job file's own YAML document.
 *  - a list (`original.tests`, `wire_stock`) is a row per item, each with a remove button, and an
 *    add button that copies the item's <template> (paths `list[#]`, numbered by the page's script);
 *  - a union with a map among its variants (`target.supply`: a voltage or { value, kind, frequency };
 *    `target.tolerance`: a fraction or { below, above }; a wire: a name or { bare, overall }) is a
 *    choice of variant, and each variant's own fields; the variant shown is the one the file holds;
 *  - a union of maps told apart by a field fixed in each (`original.tests[]`: `kind` no_load or load,
 *    src/job/schema.ts `TEST_FORMS`) is a choice named by that value; each variant shows only its own
 *    fields, and carries the fixed value in a hidden control (unless the form may leave it out, as a
 *    no-load test may), so that choosing a form writes it;
 *  - a field that only one goal reads ("Goal kv: …" in its help) carries `data-goal` so the page
 *    shows it with that goal only; one that only one kind of field reads ("Shunt field only: …")
 *    carries `data-motor-field` so the page shows it with that `armature.field` only.
 * Pure: schema and document in, HTML out.
 */
import { isCollection, isMap, isScalar, isSeq, stringify, type Document, type Node } from "yaml";
import { esc } from "./html.js";

type Json = Record<string, unknown>;
type Path = (string | number)[];

const isObject = (x: unknown): x is Json => x !== null && typeof x === "object" && !Array.isArray(x);

/** The unit a bare number is read in, from the field's help ("a bare number is in mm"). */
export function unitOf(description: string): string {
  const m = /a bare number is in ([^.;]+)[.;]/.exec(description);
  if (m) return m[1];
  if (/Write a fraction/.test(description)) return "fraction";
  return "";
}

/** What the field holds in the file, as one line of text (YAML flow style for lists and maps). */
export function fieldText(doc: Document, path: Path): string {
  const node = doc.getIn(path, true) as Node | undefined;
  if (node === undefined || node === null) return "";
  if (isScalar(node)) return node.value === null || node.value === undefined ? "" : String(node.value);
  if (isCollection(node)) return stringify(node.toJSON(), { collectionStyle: "flow", lineWidth: 0 }).trim();
  return String(node);
}

/** `["original", "tests", 0, "supply"]` → "original.tests[0].supply"; a "#" index stays "#" (the row template's). */
export const pathText = (path: Path) => path.map((p, i) => (typeof p === "number" || p === "#" ? `[${p}]` : i ? `.${p}` : p)).join("");

const idOf = (p: string) => `f-${p.replace(/[^A-Za-z0-9_-]/g, "_")}`;
const label = (key: string | number) => String(key).replace(/_/g, " ");
const problemOut = (p: string) => `<output class="problem" data-for="${esc(p)}"></output>`;
const helpOf = (node: Json) => (typeof node.description === "string" ? node.description : "");

/** The goal a field belongs to, from its help ("Goal kv: …"); null for a field every goal reads. */
export function goalOf(node: Json): string | null {
  return /^Goal ([a-z_]+):/.exec(helpOf(node))?.[1] ?? null;
}

/** The kind of motor field a field belongs to, from its help ("Shunt field only: …" → shunt); null for every kind. */
export function motorFieldOf(node: Json): string | null {
  return /^([A-Z][a-z_]+) field only:/.exec(helpOf(node))?.[1].toLowerCase() ?? null;
}

/** The attributes that scope a field, a union or a fieldset to one goal or one kind of motor field (the page shows it then only). */
function scopeAttrs(node: Json): string {
  const goal = goalOf(node);
  const motor = motorFieldOf(node);
  return (goal ? ` data-goal="${esc(goal)}"` : "") + (motor ? ` data-motor-field="${esc(motor)}"` : "");
}

/** The branches of a union that are maps (each its own group of fields); the others are one text box. */
const mapBranches = (node: Json) => ((node.anyOf as Json[] | undefined) ?? []).filter((b) => isObject(b.properties));
const isUnionWithMap = (node: Json) => Array.isArray(node.anyOf) && mapBranches(node).length > 0;
const isList = (node: Json) => node.type === "array" && isObject(node.items);

interface Ctx {
  doc: Document | null;
  /** Added to the ids inside a union's second and later variants: two forms may hold fields of the same path. */
  idSuffix?: string;
}

/** The value a map branch fixes for field `key` (`const`, or an enum of one), else undefined. */
function fixedValue(branch: Json, key: string): string | undefined {
  const prop = (branch.properties as Record<string, Json> | undefined)?.[key];
  if (!isObject(prop)) return undefined;
  if (typeof prop.const === "string") return prop.const;
  return Array.isArray(prop.enum) && prop.enum.length === 1 ? String(prop.enum[0]) : undefined;
}

/** The field that tells a union's maps apart (each map fixes a different value of it), or null. */
export function discriminatorOf(node: Json): string | null {
  const maps = mapBranches(node);
  if (maps.length < 2 || maps.length !== (node.anyOf as Json[]).length) return null;
  const keys = Object.keys(maps[0].properties as Json);
  const key = keys.find((k) => {
    const values = maps.map((b) => fixedValue(b, k));
    return values.every((v) => v !== undefined) && new Set(values).size === values.length;
  });
  return key ?? null;
}

function input(node: Json, p: string, value: string, required: boolean, idSuffix = ""): string {
  const id = idOf(p) + idSuffix;
  const title = helpOf(node) ? ` title="${esc(helpOf(node))}"` : "";
  const anyOf = Array.isArray(node.anyOf) ? (node.anyOf as Json[]) : [];
  const choices = Array.isArray(node.enum) ? (node.enum as unknown[]).map(String) : node.type === "boolean" ? ["true", "false"] : null;
  if (choices) {
    const opts = ["", ...choices]
      .map((c) => `<option value="${esc(c)}"${c === value ? " selected" : ""}>${c ? esc(c) : required ? "(choose)" : "(default)"}</option>`)
      .join("");
    return `<select id="${id}" name="${esc(p)}" data-field="${esc(p)}"${title}>${opts}</select>`;
  }
  const examples = (node.examples as unknown[] | undefined) ?? anyOf.flatMap((b) => (b.examples as unknown[] | undefined) ?? []);
  const mode = node.type === "integer" ? ` inputmode="numeric"` : "";
  const ph = examples.length ? ` placeholder="${esc(String(examples[0]))}"` : "";
  return `<input id="${id}" name="${esc(p)}" data-field="${esc(p)}" value="${esc(value)}"${ph}${mode}${title} autocomplete="off" spellcheck="false">`;
}

function unitText(node: Json, help: string): string {
  const anyOf = Array.isArray(node.anyOf) ? (node.anyOf as Json[]) : [];
  return unitOf(help) || anyOf.map((b) => unitOf(String(b.description ?? ""))).find(Boolean) || "";
}

function leaf(node: Json, path: Path, ctx: Ctx, required: boolean, name: string | number = path[path.length - 1]): string {
  const p = pathText(path);
  const sfx = ctx.idSuffix ?? "";
  const help = helpOf(node);
  const unit = unitText(node, help);
  const value = ctx.doc ? fieldText(ctx.doc, path) : "";
  return (
    `<div class="field" data-path="${esc(p)}"${scopeAttrs(node)}><label for="${idOf(p) + sfx}">${esc(label(name))}${required ? "" : ' <span class="opt">optional</span>'}</label>` +
    `<span class="input">${input(node, p, value, required, sfx)}${unit ? `<span class="unit">${esc(unit)}</span>` : ""}</span>` +
    (help ? `<small class="help">${esc(help)}</small>` : "") +
    problemOut(p) +
    `</div>`
  );
}

/** Which variant of a union the file holds: the map variant whose keys it uses, else the one-line one. */
function variantHeld(node: Json, path: Path, ctx: Ctx): number {
  const held = ctx.doc?.getIn(path, true) as Node | undefined;
  const maps = mapBranches(node);
  const hasScalar = maps.length < (node.anyOf as Json[]).length;
  const disc = discriminatorOf(node);
  if (disc !== null) {
    // the form the file's fixed field names; absent, the form whose fixed field may be left out (its default)
    const value = isMap(held) ? fieldText(ctx.doc as Document, [...path, disc]) : "";
    const k = value
      ? maps.findIndex((b) => fixedValue(b, disc) === value)
      : maps.findIndex((b) => !((b.required as string[] | undefined) ?? []).includes(disc));
    return Math.max(0, k);
  }
  if (!isMap(held)) return 0;
  const keys = held.items.map((i) => String((i.key as { value?: unknown })?.value ?? i.key));
  const k = maps.findIndex((b) => keys.every((x) => x in (b.properties as Json)));
  return (hasScalar ? 1 : 0) + Math.max(0, k);
}

/** The short name of a variant, for the choice: "one value (V)" for the one-line form, the fields of a map. */
function variantName(b: Json, unit: string): string {
  if (isObject(b.properties)) return `{ ${Object.keys(b.properties).join(", ")} }`;
  return `one value${unit ? ` (${unit})` : ""}`;
}

/** A union with a map among its variants: a choice of variant, then the variant's own fields. */
function union(node: Json, path: Path, ctx: Ctx, required: boolean, name: string | number = path[path.length - 1]): string {
  const p = pathText(path);
  const help = helpOf(node);
  const branches = node.anyOf as Json[];
  const maps = mapBranches(node);
  const scalars = branches.filter((b) => !isObject(b.properties));
  const variants: { name: string; body: string }[] = [];
  const held = variantHeld(node, path, ctx);
  if (scalars.length) {
    const first = scalars[0];
    const merged: Json = { ...first, type: undefined, anyOf: scalars, description: first.description };
    const heldScalar = held === 0 && ctx.doc ? fieldText(ctx.doc, path) : "";
    const unit = unitText(merged, String(first.description ?? ""));
    variants.push({
      name: variantName(first, unit),
      body: `<span class="input">${input(merged, p, heldScalar, required)}${unit ? `<span class="unit">${esc(unit)}</span>` : ""}</span>`,
    });
  }
  const disc = discriminatorOf(node);
  maps.forEach((b) => {
    const k = variants.length;
    const inner: Ctx = { doc: k === held ? ctx.doc : null, idSuffix: k ? `-v${k}` : "" };
    if (disc === null) {
      variants.push({ name: variantName(b, ""), body: `<div class="subfields">${section(b, path, inner)}</div>` });
      return;
    }
    // the fixed field is the choice itself: a hidden control carries its value where the form needs it
    // written (a form that may leave it out, its default, writes nothing), the form shows the rest
    const fixed = fixedValue(b, disc)!;
    const { [disc]: _, ...rest } = b.properties as Json;
    const needed = ((b.required as string[] | undefined) ?? []).includes(disc);
    const hidden = needed ? `<input type="hidden" data-field="${esc(pathText([...path, disc]))}" data-fixed value="${esc(fixed)}">` : "";
    variants.push({ name: label(fixed), body: `<div class="subfields">${hidden}${section({ ...b, properties: rest }, path, inner)}</div>` });
  });
  const choice = variants
    .map(
      (v, i) =>
        `<label class="variant-choice"><input type="radio" name="${esc(`variant:${p}`)}" value="${i}" data-variant-of="${esc(p)}"${i === held ? " checked" : ""}> ${esc(v.name)}</label>`,
    )
    .join("");
  const bodies = variants.map((v, i) => `<div class="variant" data-variant="${i}"${i === held ? "" : " hidden"}>${v.body}</div>`).join("");
  return (
    `<div class="field union" data-union="${esc(p)}" data-path="${esc(p)}"${scopeAttrs(node)}>` +
    `<span class="label">${esc(label(name))}${required ? "" : ' <span class="opt">optional</span>'}</span>` +
    `<div class="variants" role="radiogroup" aria-label="${esc(label(name))}: its form">${choice}</div>${bodies}` +
    (help ? `<small class="help">${esc(help)}</small>` : "") +
    problemOut(p) +
    `</div>`
  );
}

/** One item of a list: the item's own control(s) and a remove button. */
function listItem(items: Json, path: Path, ctx: Ctx, isNew: boolean): string {
  const p = pathText(path);
  const idx = path[path.length - 1];
  const name = `item ${typeof idx === "number" ? idx + 1 : "#"}`;
  const body = isUnionWithMap(items)
    ? union(items, path, ctx, true, name)
    : isObject(items.properties)
      ? `<fieldset class="item-fields"><legend>${esc(name)}</legend>${section(items, path, ctx)}${problemOut(p)}</fieldset>`
      : leaf(items, path, ctx, true, name);
  return `<div class="list-item" data-item="${esc(p)}"${isNew ? " data-new" : ""}>${body}<button type="button" class="remove" data-remove aria-label="remove ${esc(name)}">remove</button></div>`;
}

/** A list: a row per item, an add button, and the item's template for the page's script. */
function list(node: Json, path: Path, ctx: Ctx, required: boolean, id = ""): string {
  const p = pathText(path);
  const items = node.items as Json;
  const held = ctx.doc?.getIn(path, true) as Node | undefined;
  const count = isSeq(held) ? held.items.length : 0;
  const rows = Array.from({ length: count }, (_, i) => listItem(items, [...path, i], ctx, false)).join("");
  const template = listItem(items, [...path, "#"], { doc: null }, true);
  const help = helpOf(node);
  const max = typeof node.maxItems === "number" ? ` data-max="${node.maxItems}"` : "";
  return (
    `<fieldset class="list" data-list="${esc(p)}" data-path="${esc(p)}"${id ? ` id="${esc(id)}"` : ""}${max}><legend>${esc(label(path[path.length - 1]))}${required ? "" : ' <span class="opt">optional</span>'}</legend>` +
    (help ? `<small class="help">${esc(help)}</small>` : "") +
    `<div class="list-items">${rows}</div>` +
    `<template>${template}</template>` +
    `<button type="button" class="add" data-add="${esc(p)}">add ${esc(label(path[path.length - 1]).replace(/s$/, ""))}</button>` +
    problemOut(p) +
    `</fieldset>`
  );
}

function section(node: Json, path: Path, ctx: Ctx): string {
  const props = node.properties as Record<string, Json>;
  const required = new Set((node.required as string[] | undefined) ?? []);
  const parts: string[] = [];
  for (const [k, v] of Object.entries(props)) {
    if (k === "$schema" || k === "version") continue;
    const sub = [...path, k];
    const req = required.has(k);
    if (isObject(v) && isObject(v.properties) && !Array.isArray(v.anyOf)) {
      const help = helpOf(v) ? `<small class="help">${esc(helpOf(v))}</small>` : "";
      parts.push(
        `<fieldset data-path="${esc(pathText(sub))}"${path.length ? "" : ` id="sec-${esc(k)}"`}${scopeAttrs(v)}><legend>${esc(label(k))}</legend>${help}${section(v, sub, ctx)}${problemOut(pathText(sub))}</fieldset>`,
      );
    } else if (isList(v)) parts.push(list(v, sub, ctx, req, path.length ? "" : `sec-${k}`));
    else if (isUnionWithMap(v)) parts.push(union(v, sub, ctx, req));
    else parts.push(leaf(v, sub, ctx, req));
  }
  return parts.join("\n");
}

/** The whole form's fields for a job document. */
export function jobForm(schema: Json, doc: Document): string {
  return section(schema, [], { doc });
}

/** Links to the form's sections (each top-level map or list), for the bar above the form. */
export function sectionLinks(schema: Json): string {
  const props = schema.properties as Record<string, Json>;
  return Object.entries(props)
    .filter(([, v]) => (isObject(v.properties) && !Array.isArray(v.anyOf)) || isList(v))
    .map(([k]) => `<a href="#sec-${esc(k)}">${esc(label(k))}</a>`)
    .join("");
}
