/**
 * The job form, generated from the job file's JSON Schema (itself generated from the zod schema,
 * src/job/schema.ts, with each field's help and unit): a fieldset per section, an input per field,
 * filled from the job file's own YAML document. Pure: schema and document in, HTML out.
 */
import { isCollection, isScalar, stringify, type Document, type Node } from "yaml";
import { esc } from "./html.js";

type Json = Record<string, unknown>;

const isObject = (x: unknown): x is Json => x !== null && typeof x === "object" && !Array.isArray(x);

/** The unit a bare number is read in, from the field's help ("a bare number is in mm"). */
export function unitOf(description: string): string {
  const m = /a bare number is in ([^.;]+)[.;]/.exec(description);
  if (m) return m[1];
  if (/Write a fraction/.test(description)) return "fraction";
  return "";
}

/** What the field holds in the file, as one line of text (YAML flow style for lists and maps). */
export function fieldText(doc: Document, path: (string | number)[]): string {
  const node = doc.getIn(path, true) as Node | undefined;
  if (node === undefined || node === null) return "";
  if (isScalar(node)) return node.value === null || node.value === undefined ? "" : String(node.value);
  if (isCollection(node)) return stringify(node.toJSON(), { collectionStyle: "flow", lineWidth: 0 }).trim();
  return String(node);
}

const pathText = (path: (string | number)[]) => path.map((p, i) => (typeof p === "number" ? `[${p}]` : i ? `.${p}` : p)).join("");

function leaf(node: Json, path: (string | number)[], doc: Document, required: boolean): string {
  const p = pathText(path);
  const help = typeof node.description === "string" ? node.description : "";
  const anyOf = Array.isArray(node.anyOf) ? (node.anyOf as Json[]) : [];
  const unit = unitOf(help) || anyOf.map((b) => unitOf(String(b.description ?? ""))).find(Boolean) || "";
  const examples = (node.examples as unknown[] | undefined) ?? anyOf.flatMap((b) => (b.examples as unknown[] | undefined) ?? []);
  const value = fieldText(doc, path);
  const id = `f-${p.replace(/[^A-Za-z0-9_-]/g, "_")}`;
  const key = String(path[path.length - 1]);
  let input: string;
  const choices = Array.isArray(node.enum) ? (node.enum as unknown[]).map(String) : node.type === "boolean" ? ["true", "false"] : null;
  if (choices) {
    const opts = ["", ...choices]
      .map((c) => `<option value="${esc(c)}"${c === value ? " selected" : ""}>${c ? esc(c) : required ? "(choose)" : "(default)"}</option>`)
      .join("");
    input = `<select id="${id}" name="${esc(p)}" data-field="${esc(p)}">${opts}</select>`;
  } else {
    const mode = node.type === "integer" ? ` inputmode="numeric"` : "";
    const ph = examples.length ? ` placeholder="${esc(String(examples[0]))}"` : "";
    input = `<input id="${id}" name="${esc(p)}" data-field="${esc(p)}" value="${esc(value)}"${ph}${mode} autocomplete="off" spellcheck="false">`;
  }
  return (
    `<div class="field" data-path="${esc(p)}"><label for="${id}">${esc(key.replace(/_/g, " "))}${required ? "" : ' <span class="opt">optional</span>'}</label>` +
    `<span class="input">${input}${unit ? `<span class="unit">${esc(unit)}</span>` : ""}</span>` +
    (help ? `<small class="help">${esc(help)}</small>` : "") +
    `<output class="problem" data-for="${esc(p)}"></output></div>`
  );
}

function section(node: Json, path: (string | number)[], doc: Document): string {
  const props = node.properties as Record<string, Json>;
  const required = new Set((node.required as string[] | undefined) ?? []);
  const parts: string[] = [];
  for (const [k, v] of Object.entries(props)) {
    if (k === "$schema" || k === "version") continue;
    const sub = [...path, k];
    if (isObject(v) && isObject(v.properties) && !Array.isArray(v.anyOf)) {
      const help = typeof v.description === "string" ? `<small class="help">${esc(v.description)}</small>` : "";
      parts.push(
        `<fieldset data-path="${esc(pathText(sub))}"><legend>${esc(k.replace(/_/g, " "))}</legend>${help}${section(v, sub, doc)}<output class="problem" data-for="${esc(pathText(sub))}"></output></fieldset>`,
      );
    } else parts.push(leaf(v, sub, doc, required.has(k)));
  }
  return parts.join("\n");
}

/** The whole form's fields for a job document. */
export function jobForm(schema: Json, doc: Document): string {
  return section(schema, [], doc);
}
