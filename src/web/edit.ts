/**
 * Field edits from the job form applied to the job file's own text, so that comments, key order,
 * alignment and the user's way of writing stay exactly as they were. The `yaml` package's Document
 * API finds each value's place in the text (its source range); the edit replaces only those
 * characters, removes only a removed key's lines, or adds a key's line under its parent. Lists
 * (`original.tests[1]`, `wire_stock[3]`) take an item at their end and lose one by its lines (a
 * block list) or its entry (a one-line [ … ] list); a one-line { … } map takes or loses a key in place.
 * Pure: text in, text out.
 */
import { isMap, isPair, isScalar, isSeq, parseDocument, stringify, type Document, type Node, type Pair, type YAMLMap, type YAMLSeq } from "yaml";
import { ArmwindError } from "../errors.js";

/** One field of the form: its dotted path (`armature.slot.area`, `wire_stock[2]`) and the text typed ("" removes the key). */
export interface FieldEdit {
  path: string;
  text: string;
}

/** A dotted path with bracketed indices as keys and indices: "wire_stock[2]" → ["wire_stock", 2]. */
export function splitPath(path: string): (string | number)[] {
  const parts: (string | number)[] = [];
  for (const m of path.matchAll(/([^.[\]]+)|\[(\d+)\]/g)) parts.push(m[2] !== undefined ? Number(m[2]) : m[1]);
  return parts;
}

function parse(text: string): Document {
  const doc = parseDocument(text);
  if (doc.errors.length) {
    const e = doc.errors[0];
    const at = e.linePos?.[0];
    throw new ArmwindError({ code: "bad_yaml", path: "", message: e.message.split("\n")[0], line: at?.line, column: at?.col });
  }
  return doc;
}

/** The value as it goes on its line: what was typed when it is one line of valid YAML, else flow style. */
function inline(edit: FieldEdit): string {
  const typed = parseDocument(edit.text);
  if (typed.errors.length) {
    throw new ArmwindError({
      code: "bad_yaml",
      path: edit.path,
      message: `"${edit.text}" is not a value YAML can read: ${typed.errors[0].message.split("\n")[0]}`,
    });
  }
  const t = edit.text.trim();
  if (!t.includes("\n") && !t.includes(" #") && !t.startsWith("#")) return t;
  return stringify(typed.toJS(), { collectionStyle: "flow", lineWidth: 0 }).trim();
}

const lineStart = (text: string, at: number) => text.lastIndexOf("\n", at - 1) + 1;
const lineEnd = (text: string, at: number) => {
  const i = text.indexOf("\n", at);
  return i < 0 ? text.length : i;
};

/** The pair that holds `key` in a map node. */
function pairOf(map: YAMLMap, key: string | number): Pair | undefined {
  return map.items.find((p) => isPair(p) && isScalar(p.key) && String(p.key.value) === String(key)) as Pair | undefined;
}

/** Insert `key: value` as the last entry of the block map at `parentPath` (created too when missing). */
function insert(text: string, doc: Document, parentPath: (string | number)[], key: string, value: string): string {
  const parent = parentPath.length ? (doc.getIn(parentPath, true) as Node | undefined) : (doc.contents as Node | null);
  if (parent === undefined || parent === null) {
    // the parent is missing too: add it, with this key under it
    const up = parentPath.slice(0, -1);
    const name = String(parentPath[parentPath.length - 1]);
    return insert(text, doc, up, name, `\n${" ".repeat(2 * parentPath.length)}${key}: ${value}`);
  }
  if (isMap(parent) && parent.flow && parent.range && !value.startsWith("\n")) return insertFlow(text, parent.items, parent.range, `${key}: ${value}`, "}");
  if (!isMap(parent) || parent.flow || !parent.range) {
    throw new ArmwindError({
      code: "bad_yaml",
      path: [...parentPath, key].join("."),
      message: "cannot add a key here from the form (the section is not a map of keys); edit the file",
    });
  }
  const last = parent.items[parent.items.length - 1] as Pair<Node, Node> | undefined;
  if (!last || !isScalar(last.key) || !last.key.range)
    throw new ArmwindError({ code: "bad_yaml", path: parentPath.join("."), message: "cannot add to an empty map from the form" });
  const indent = last.key.range[0] - lineStart(text, last.key.range[0]);
  const end = last.value?.range ? lineEnd(text, Math.max(last.value.range[1] - 1, last.key.range[1])) : lineEnd(text, last.key.range[1]);
  return text.slice(0, end) + `\n${" ".repeat(indent)}${key}:${value.startsWith("\n") ? "" : " "}${value}` + text.slice(end);
}

/** An entry added at the end of a one-line { … } or [ … ] collection, before its closing bracket. */
function insertFlow(text: string, items: unknown[], range: [number, number, number?], entry: string, close: "}" | "]"): string {
  const end = text.lastIndexOf(close, range[1] - 1);
  if (!items.length) {
    const pad = close === "}" ? " " : "";
    return `${text.slice(0, range[0] + 1)}${pad}${entry}${pad}${text.slice(end)}`;
  }
  let at = end;
  while (at > range[0] && /\s/.test(text[at - 1])) at--;
  return `${text.slice(0, at)}, ${entry}${text.slice(at)}`;
}

/** Remove the entry spanning [from, to) of a one-line collection, with the comma that joins it to its neighbour. */
function removeFlow(text: string, from: number, to: number, isLast: boolean): string {
  if (!isLast) {
    const m = /^\s*,\s*/.exec(text.slice(to));
    return text.slice(0, from) + text.slice(to + (m ? m[0].length : 0));
  }
  const before = /,\s*$/.exec(text.slice(0, from));
  return text.slice(0, before ? from - before[0].length : from) + text.slice(to);
}

/** Remove an item of a list: a block item's lines (from its dash to its end), or a one-line list's entry. */
function removeItem(text: string, seq: YAMLSeq, i: number): string {
  const item = seq.items[i] as Node | undefined;
  if (!item?.range) return text;
  if (seq.flow) return removeFlow(text, item.range[0], item.range[1], i === seq.items.length - 1);
  const from = lineStart(text, item.range[0]);
  const to = lineEnd(text, Math.max(item.range[1] - 1, item.range[0]));
  return text.slice(0, from) + text.slice(Math.min(to + 1, text.length));
}

/** Add an item at the end of a list: a new `- item` line under the last one, or an entry before a one-line list's `]`. */
function appendItem(text: string, seq: YAMLSeq, value: string): string {
  if (seq.flow || !seq.items.length) {
    if (!seq.range || !seq.flow) throw new ArmwindError({ code: "bad_yaml", path: "", message: "cannot add to an empty list from the form" });
    return insertFlow(text, seq.items, seq.range, value, "]");
  }
  const first = seq.items[0] as Node;
  const last = seq.items[seq.items.length - 1] as Node;
  const dash = text.lastIndexOf("-", first.range![0]);
  const indent = dash - lineStart(text, dash);
  const end = lineEnd(text, Math.max(last.range![1] - 1, last.range![0]));
  return `${text.slice(0, end)}\n${" ".repeat(indent)}- ${value}${text.slice(end)}`;
}

/** Remove a key of a map (its lines in a block map, its entry in a one-line map) or an item of a list. */
function remove(text: string, doc: Document, path: (string | number)[]): string {
  const parent = (path.length > 1 ? doc.getIn(path.slice(0, -1), true) : doc.contents) as Node | null;
  const key = path[path.length - 1];
  // the last row of a list goes with its key: a list left empty would read as null (or break minItems); no key is "none"
  if (isSeq(parent) && typeof key === "number")
    return parent.items.length === 1 && key === 0 && path.length > 1 ? remove(text, doc, path.slice(0, -1)) : removeItem(text, parent, key);
  if (!isMap(parent)) return text;
  const pair = pairOf(parent, key);
  if (!pair || !isScalar(pair.key) || !pair.key.range) return text;
  const value = pair.value as Node | null;
  if (parent.flow) {
    const to = value?.range ? value.range[1] : pair.key.range[1];
    return removeFlow(text, pair.key.range[0], to, parent.items[parent.items.length - 1] === pair);
  }
  const from = lineStart(text, pair.key.range[0]);
  const to = lineEnd(text, value?.range ? Math.max(value.range[1] - 1, pair.key.range[1]) : pair.key.range[1]);
  return text.slice(0, from) + text.slice(Math.min(to + 1, text.length));
}

/** Apply one edit to the text. */
function applyOne(text: string, edit: FieldEdit): string {
  const path = splitPath(edit.path);
  if (!path.length) return text;
  const doc = parse(text);
  if (edit.text.trim() === "") return remove(text, doc, path);
  const value = inline(edit);
  const node = doc.getIn(path, true) as Node | undefined;
  if (node?.range) {
    const [start, end] = node.range;
    return text.slice(0, start) + value + text.slice(end);
  }
  const key = path[path.length - 1];
  if (typeof key === "number") {
    const list = doc.getIn(path.slice(0, -1), true) as Node | undefined;
    const size = isSeq(list) ? list.items.length : 0;
    if (key !== size) throw new ArmwindError({ code: "bad_yaml", path: edit.path, message: `the list has ${size} items: a new one goes at [${size}]` });
    if (isSeq(list)) return appendItem(text, list, value);
    if (list !== undefined && list !== null) throw new ArmwindError({ code: "bad_yaml", path: edit.path, message: "this field is not a list in the file" });
    return insert(text, doc, path.slice(0, -2), String(path[path.length - 2]), `[${value}]`);
  }
  return insert(text, doc, path.slice(0, -1), key, value);
}

/** Apply the form's edits to a job file's text, one after another; a field left empty removes its key. */
export function applyEdits(text: string, edits: FieldEdit[]): string {
  parse(text);
  let out = text;
  for (const e of edits) out = applyOne(out, e);
  parse(out);
  return out;
}
