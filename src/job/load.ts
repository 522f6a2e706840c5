/**
 * YAML in, validated data out, or problems that each name file:line:column and a field path.
 * Used for job files and for measured files (any zod schema). The only I/O-free part of reading a
 * file: the CLI reads the text and hands it here.
 */
import { LineCounter, parseDocument, isMap, isSeq, isScalar, isPair, visit, type Alias, type Node, type Document } from "yaml";
import type { z } from "zod";
import { ArmwindError, type Problem } from "../errors.js";
import { formatPath, nearest, type PathPart } from "./paths.js";

export interface Located<T> {
  value: T;
  /** Line and column (1-based) of the node at a field path, or of its nearest existing parent. */
  locate: (path: readonly PathPart[]) => { line: number; column: number };
  /** The raw parsed YAML (plain JS), before validation. */
  raw: unknown;
}

/**
 * Parse options for a value validated once per process (a job file, a logbook record): without
 * zod's JIT, which compiles a parser per object schema (new Function) on its first use and so
 * costs more than it saves here (measured: 6 ms less on a job, 5 ms less on five records, no
 * slower over a thousand records). The same checks, issues and output.
 */
export const PARSE_ONCE = { jitless: true } as const;

/** Parse YAML text and validate it with `schema`; throws ArmwindError (status 1) with every problem located. */
export function loadYaml<S extends z.ZodType>(
  text: string,
  file: string,
  schema: S,
  prepare?: (raw: Record<string, unknown>) => Record<string, unknown>,
): Located<z.output<S>> {
  const lc = new LineCounter();
  const doc = parseDocument(text, { lineCounter: lc, prettyErrors: false, uniqueKeys: true, strict: true });
  const pos = (offset: number) => {
    const p = lc.linePos(offset);
    return { line: p.line, column: p.col };
  };
  if (doc.errors.length > 0) {
    throw new ArmwindError(
      doc.errors.slice(0, 1).map((e) => {
        const at = pos(e.pos[0]);
        return {
          code: "bad_yaml",
          message:
            e.code === "MULTIPLE_DOCS"
              ? "the file holds more than one YAML document (a line --- starts another here); one file holds one document: remove this part or give it its own file"
              : yamlMessage(e.message),
          path: "",
          file,
          ...at,
        };
      }),
    );
  }
  let raw: unknown;
  try {
    raw = doc.toJS({ maxAliasCount: 100 });
  } catch (e) {
    // the yaml library throws (rather than reporting) an alias with no anchor before it, and an
    // alias count that suggests a resource-exhaustion file: both are the file's fault
    throw new ArmwindError(aliasProblem(doc, e, file, pos));
  }
  const locate = (path: readonly PathPart[]) => locateIn(doc, path, pos);
  if (raw === null || raw === undefined || typeof raw !== "object" || Array.isArray(raw)) {
    throw new ArmwindError({
      code: "bad_yaml",
      message: `the file must be a YAML mapping of keys (version: 1, id: …), got ${raw === null || raw === undefined ? "nothing" : Array.isArray(raw) ? "a list" : "a single value"}`,
      path: "",
      file,
      line: 1,
      column: 1,
    });
  }
  // defaults from elsewhere (the shop profile) are filled in where the file is silent
  if (prepare) raw = prepare(raw as Record<string, unknown>);
  const result = schema.safeParse(raw, PARSE_ONCE);
  if (!result.success) {
    const raws = issuesToProblems(result.error.issues, schema, raw);
    // a misspelt required key is also missing under its right name: the "did you mean" line says both
    const misspelt = new Set(raws.filter((p) => p.suggests).map((p) => formatPath([...p.parts.slice(0, -1), p.suggests as string])));
    const problems = raws
      .filter((p) => !(p.code === "missing_field" && misspelt.has(formatPath(p.parts))))
      .map((p) => {
        const parts = p.parts;
        const at = p.keyNode ? locateKey(doc, parts, pos) : locate(parts);
        return { code: p.code, message: p.message, path: formatPath(parts), file, ...at } satisfies Problem;
      });
    // one line per field; stable order by position in the file
    problems.sort((a, b) => a.line - b.line || a.column - b.column);
    throw new ArmwindError(dedupe(problems).map((p) => ({ ...p, message: oneLine(p.message) })));
  }
  return { value: result.data, locate, raw };
}

function aliasProblem(doc: Document, e: unknown, file: string, pos: (offset: number) => { line: number; column: number }): Problem {
  const aliases: Alias[] = [];
  visit(doc, {
    Alias(_key, node) {
      aliases.push(node);
    },
  });
  const unresolved = aliases.find((a) => {
    try {
      return a.resolve(doc) === undefined;
    } catch {
      return true;
    }
  });
  const at = unresolved ?? aliases[0];
  const where = at?.range ? pos(at.range[0]) : { line: 1, column: 1 };
  const message = unresolved
    ? `not valid YAML: the alias *${unresolved.source} has no anchor &${unresolved.source} before it`
    : aliases.length > 0
      ? "not valid YAML: too many aliases (*name) expand here, refused as a resource-exhaustion risk; write the values out"
      : yamlMessage(e instanceof Error ? e.message : String(e));
  return { code: "bad_yaml", message, path: "", file, ...where };
}

/**
 * A message is one line: values quoted from the file may hold line breaks (a block scalar) or runs
 * of spaces; show breaks as \n, collapse the spaces, and cut a very long message short.
 */
export function oneLine(message: string): string {
  const flat = message
    .replace(/\r\n|[\r\n\u2028\u2029]/g, "\\n")
    .replace(/[\t\v\f ]{2,}|\t/g, " ")
    // other control characters (a NUL, an escape that would drive the terminal) shown as \u0000
    .replace(/\p{Cc}/gu, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, "0")}`);
  return flat.length > 300 ? `${flat.slice(0, 297)}…` : flat;
}

function dedupe(ps: Problem[]): Problem[] {
  const seen = new Set<string>();
  return ps.filter((p) => {
    const k = `${p.path}|${p.message}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}

function yamlMessage(m: string): string {
  const first = m.split("\n")[0].replace(/ at line \d+, column \d+:?$/, "");
  return `not valid YAML: ${first.charAt(0).toLowerCase()}${first.slice(1)}`;
}

function nodeAt(doc: Document, path: readonly PathPart[]): { node: Node | null; depth: number } {
  let node: unknown = doc.contents;
  let depth = 0;
  for (const part of path) {
    if (isMap(node)) {
      const pair = node.items.find((it) => isScalar(it.key) && String(it.key.value) === String(part));
      if (!pair) break;
      node = pair.value;
    } else if (isSeq(node) && typeof part === "number") {
      if (part >= node.items.length) break;
      node = node.items[part];
    } else break;
    depth++;
  }
  return { node: (node as Node | null) ?? null, depth };
}

function locateIn(doc: Document, path: readonly PathPart[], pos: (o: number) => { line: number; column: number }) {
  // walk as deep as the file goes, remembering the last node that has a position
  let node: unknown = doc.contents;
  let best: Node | null = (doc.contents as Node | null) ?? null;
  for (const part of path) {
    let next: unknown;
    if (isMap(node)) {
      const pair = node.items.find((it) => isScalar(it.key) && String(it.key.value) === String(part));
      if (!pair) break;
      next = pair.value ?? pair.key;
      if (pair.value === null && isScalar(pair.key)) best = pair.key as Node;
    } else if (isSeq(node) && typeof part === "number") {
      next = node.items[part];
    } else break;
    if (next === undefined || next === null) break;
    node = next;
    if ((node as Node).range) best = node as Node;
  }
  const off = best?.range?.[0] ?? 0;
  return pos(off);
}

function locateKey(doc: Document, path: readonly PathPart[], pos: (o: number) => { line: number; column: number }) {
  const parent = nodeAt(doc, path.slice(0, -1));
  const key = path[path.length - 1];
  if (parent.depth === path.length - 1 && isMap(parent.node)) {
    const pair = parent.node.items.find((it) => isPair(it) && isScalar(it.key) && String(it.key.value) === String(key));
    const k = pair?.key as Node | undefined;
    if (k?.range) return pos(k.range[0]);
  }
  return locateIn(doc, path, pos);
}

interface RawProblem {
  code: string;
  message: string;
  parts: PathPart[];
  keyNode?: boolean;
  /** For an unknown key: the known key it is probably a slip for. */
  suggests?: string;
}

type Issue = z.core.$ZodIssue;

function valueAt(raw: unknown, parts: readonly PathPart[]): unknown {
  let v: unknown = raw;
  for (const p of parts) {
    if (v === null || typeof v !== "object") return undefined;
    v = (v as Record<string, unknown>)[p as string];
  }
  return v;
}

function describe(v: unknown): string {
  if (v === undefined) return "nothing";
  if (v === null) return "an empty value";
  if (Array.isArray(v)) return "a list";
  if (typeof v === "object") return "a mapping";
  if (typeof v === "string") return `the text "${v.length > 40 ? v.slice(0, 37) + "…" : v}"`;
  return `${typeof v} ${String(v)}`;
}

/** Walk a zod schema down a path to find the object shape there, for "did you mean". */
export function shapeAt(schema: z.ZodType, parts: readonly PathPart[]): string[] {
  let s: z.ZodType | undefined = schema;
  const unwrap = (x: z.ZodType): z.ZodType => {
    for (let i = 0; i < 20; i++) {
      const def = (x as unknown as { def: Record<string, unknown> }).def;
      if (def.type === "optional" || def.type === "default" || def.type === "prefault" || def.type === "nullable" || def.type === "readonly")
        x = def.innerType as z.ZodType;
      else if (def.type === "pipe") x = def.in as z.ZodType;
      else break;
    }
    return x;
  };
  for (const p of parts) {
    if (!s) return [];
    s = unwrap(s);
    const def = (s as unknown as { def: Record<string, unknown> }).def;
    if (def.type === "object") s = (def.shape as Record<string, z.ZodType>)[p as string];
    else if (def.type === "array") s = def.element as z.ZodType;
    else if (def.type === "union") {
      const opts = (def.options as z.ZodType[]).map(unwrap).filter((o) => (o as unknown as { def: { type: string } }).def.type === "object");
      s = opts.length ? (opts[0] as unknown as { def: { shape: Record<string, z.ZodType> } }).def.shape[p as string] : undefined;
    } else return [];
  }
  if (!s) return [];
  s = unwrap(s);
  const def = (s as unknown as { def: Record<string, unknown> }).def;
  if (def.type === "object") return Object.keys(def.shape as object);
  if (def.type === "union") {
    for (const o of def.options as z.ZodType[]) {
      const d = (unwrap(o) as unknown as { def: Record<string, unknown> }).def;
      if (d.type === "object") return Object.keys(d.shape as object);
    }
  }
  return [];
}

/** What one zod issue is about: its path (symbols as text), the raw value there, the schema and the raw document. */
interface IssueAt {
  parts: PathPart[];
  value: unknown;
  schema: z.ZodType;
  raw: unknown;
}

/**
 * Keys the schema does not know (`unrecognized_keys`): one `unknown_key` each, located at the key,
 * with the nearest known key (edit distance, src/job/paths.ts `nearest`) or the known keys listed;
 * a key that starts with a digit is a number split at a comma inside { }.
 */
function unknownKeys(issue: Extract<Issue, { code: "unrecognized_keys" }>, at: IssueAt): RawProblem[] {
  const known = shapeAt(at.schema, at.parts);
  return issue.keys.map((key) => {
    const near = nearest(key, known);
    return {
      code: "unknown_key",
      parts: [...at.parts, key],
      keyNode: true,
      suggests: near,
      message: /^\d/.test(key)
        ? `unknown key "${key}": it looks like the end of a number split at a comma; inside { } a comma separates entries, so write numbers without thousands separators (11000 rpm, not 11,000 rpm)`
        : `unknown key "${key}"${near ? `; did you mean "${near}"?` : known.length ? `; known keys here: ${known.filter((k) => k !== "$schema").join(", ")}` : ""}`,
    };
  });
}

/** A value of the wrong type (`invalid_type`): `missing_field` when nothing is there, else `wrong_type` naming what was found. */
function invalidType(issue: Extract<Issue, { code: "invalid_type" }>, at: IssueAt): RawProblem[] {
  const expected = expectedText(issue.expected, at.schema, at.parts);
  if (at.value === undefined) return [{ code: "missing_field", parts: at.parts, message: `missing; ${expected} is required here` }];
  return [{ code: "wrong_type", parts: at.parts, message: `expected ${expected}, got ${describe(at.value)}` }];
}

/** A value outside a fixed set (`invalid_value`): `bad_choice`, listing the choices and the nearest one to what was written. */
function invalidValue(issue: Extract<Issue, { code: "invalid_value" }>, at: IssueAt): RawProblem[] {
  const opts = issue.values.map((v) => String(v));
  const near = typeof at.value === "string" ? nearest(at.value, opts) : undefined;
  return [
    {
      code: "bad_choice",
      parts: at.parts,
      message:
        at.value === undefined
          ? `missing; one of ${opts.join(", ")} is required here`
          : `${describe(at.value)} is not allowed; use ${opts.length === 1 ? opts[0] : `one of ${opts.join(", ")}`}${near ? ` (did you mean "${near}"?)` : ""}`,
    },
  ];
}

/**
 * A size or number out of bounds (`too_small`, `too_big`): `out_of_range`, worded for a text (its
 * length), a list (its items), a count (the bound); a quantity's own message otherwise.
 */
function outOfRange(issue: Extract<Issue, { code: "too_small" | "too_big" }>, at: IssueAt): RawProblem[] {
  const { parts, value } = at;
  const isCount = issue.origin === "number" || issue.origin === "int";
  const bound = (issue as { minimum?: unknown; maximum?: unknown }).minimum ?? (issue as { maximum?: unknown }).maximum;
  let message: string = issue.message;
  if (issue.origin === "string" && issue.code === "too_big") {
    message = `the text is ${typeof value === "string" ? value.length : "too many"} characters long; at most ${String(bound)} are read here`;
  } else if (issue.origin === "array" && issue.code === "too_big") {
    message = `the list has ${Array.isArray(value) ? value.length : "too many"} items; at most ${String(bound)} are read here`;
  } else if (issue.origin === "array" && issue.code === "too_small") {
    message = `the list is empty; give at least ${String(bound)} item, or leave the key out`;
  } else if (isCount) {
    message = `${describe(value)} is ${issue.code === "too_small" ? "too small" : "too large"}; it must be ${issue.code === "too_small" ? "at least" : "at most"} ${String(bound)}`;
  }
  return [{ code: "out_of_range", parts, message }];
}

/** A rule of our own (`custom`): its code from the issue's params (the schema's stable codes), else `invalid`. */
function customProblem(issue: Extract<Issue, { code: "custom" }>, at: IssueAt): RawProblem[] {
  return [{ code: (issue.params as { code?: string } | undefined)?.code ?? "invalid", parts: at.parts, message: issue.message }];
}

/**
 * No branch of a union fits (`invalid_union`). Our unions are "number or text" quantities, wires and
 * supplies: a custom message inside wins; nothing there is `missing_field`; a mapping written for the
 * map branch gets that branch's own problems (at their full paths); else `wrong_type` with how to write one.
 */
function unionProblem(issue: Extract<Issue, { code: "invalid_union" }>, at: IssueAt): RawProblem[] {
  const { parts, value } = at;
  const inner = issue.errors.flat().find((e) => e.code === "custom");
  if (inner) return [{ code: (inner.params as { code?: string } | undefined)?.code ?? "invalid", parts, message: inner.message }];
  if (value === undefined) return [{ code: "missing_field", parts, message: "missing; a value is required here" }];
  const objectBranch = issue.errors.find((errs) => errs.every((e) => e.path.length > 0));
  if (objectBranch && value !== null && typeof value === "object" && !Array.isArray(value)) {
    return issuesToProblems(
      objectBranch.map((e) => ({ ...e, path: [...issue.path, ...e.path] })),
      at.schema,
      at.raw,
    );
  }
  return [{ code: "wrong_type", parts, message: `${describe(value)} is not a valid value here; ${unionHint(parts)}` }];
}

/** One zod issue as the problems a person reads: each kind of issue by its own step above. */
function issueProblems(issue: Issue, at: IssueAt): RawProblem[] {
  switch (issue.code) {
    case "unrecognized_keys":
      return unknownKeys(issue, at);
    case "invalid_type":
      return invalidType(issue, at);
    case "invalid_value":
      return invalidValue(issue, at);
    case "too_small":
    case "too_big":
      return outOfRange(issue, at);
    case "invalid_format":
      return [{ code: "bad_format", parts: at.parts, message: `${describe(at.value)}: ${issue.message}` }];
    case "custom":
      return customProblem(issue, at);
    case "invalid_union":
      return unionProblem(issue, at);
    default:
      return [{ code: "invalid", parts: at.parts, message: issue.message }];
  }
}

/**
 * zod's issues → problems with a stable code, a field path and a message that says what would be
 * right (docs/contracts.md, errors; the codes are listed in the README), in the issues' order.
 */
function issuesToProblems(issues: readonly Issue[], schema: z.ZodType, raw: unknown): RawProblem[] {
  return issues.flatMap((issue) => {
    const parts = issue.path.map((p) => (typeof p === "symbol" ? String(p) : p)) as PathPart[];
    return issueProblems(issue, { parts, value: valueAt(raw, parts), schema, raw });
  });
}

function unionHint(parts: readonly PathPart[]): string {
  const last = String(parts[parts.length - 1] ?? "");
  if (last === "wire" || parts.includes("wire_stock"))
    return 'write a wire like "0.25 mm grade 2", "33 AWG heavy", "36 SWG" or { bare: 0.25 mm, overall: 0.282 mm }';
  if (last === "supply") return 'write a supply like "12 V" or { value: 230 V, kind: ac, frequency: 50 Hz }';
  return 'write a number with a unit, like "12 mm"';
}

function expectedText(expected: string, schema: z.ZodType, parts: readonly PathPart[]): string {
  switch (expected) {
    case "object":
      return "a mapping of keys" + (shapeAt(schema, parts).length ? ` (${shapeAt(schema, parts).slice(0, 6).join(", ")}…)` : "");
    case "array":
      return "a list";
    case "string":
      return "a text";
    case "number":
      return "a number";
    case "int":
      return "a whole number";
    case "boolean":
      return "true or false";
    default:
      return expected;
  }
}
