/**
 * Every key of templates/card-layout.json is read when the demo cards are drawn (issue 11): the
 * layout file holds the card's look and nothing else (bench tolerances live only in
 * src/bench/rules.ts). The layout is handed to the card behind a proxy that records each key read.
 */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { parse } from "yaml";
import { jobSchema } from "../src/job/schema.js";
import { planJob } from "../src/design/plan.js";
import { renderCard } from "../src/card/render.js";
import { LAYOUT_FILE, type CardLayout } from "../src/card/layout.js";
import { demoJobFiles } from "./helpers/cli.js";

/** Dotted paths of every key in a JSON value (comments `$…` left out); arrays are leaves. */
function keyPaths(v: unknown, prefix = ""): string[] {
  if (typeof v !== "object" || v === null || Array.isArray(v)) return [];
  return Object.entries(v).flatMap(([k, x]) => (k.startsWith("$") ? [] : [`${prefix}${k}`, ...keyPaths(x, `${prefix}${k}.`)]));
}

/** A deep proxy over `v` that adds the dotted path of every property read to `seen`. */
function recording<T>(v: T, seen: Set<string>, prefix = ""): T {
  if (typeof v !== "object" || v === null || Array.isArray(v)) return v;
  return new Proxy(v as object, {
    get(target, key, receiver) {
      const x = Reflect.get(target, key, receiver);
      if (typeof key !== "string") return x;
      seen.add(`${prefix}${key}`);
      return recording(x, seen, `${prefix}${key}.`);
    },
  }) as T;
}

describe("templates/card-layout.json", () => {
  it("every key in it is used by the card (none left over, e.g. bench tolerances)", async () => {
    const raw = JSON.parse(readFileSync(LAYOUT_FILE, "utf8")) as CardLayout;
    const seen = new Set<string>();
    const layout = recording(raw, seen);
    for (const file of demoJobFiles())
      for (const paper of ["a4", "letter"] as const) {
        const plan = planJob(jobSchema.parse(parse(readFileSync(file, "utf8"))));
        await renderCard(plan, { paper, date: "2026-12-01", version: "test", layout });
      }
    const unused = keyPaths(raw).filter((k) => !seen.has(k));
    expect(unused).toEqual([]);
  });
  it("the check can fail: a key nobody reads is reported", () => {
    const seen = new Set<string>();
    const l = recording({ a: { b: 1, c: 2 } }, seen);
    expect(l.a.b).toBe(1);
    expect(keyPaths({ a: { b: 1, c: 2 } }).filter((k) => !seen.has(k))).toEqual(["a.c"]);
  });
});
