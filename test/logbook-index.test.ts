/**
 * Learning reads only the job's family: the family index (src/logbook/family-index.ts) in the
 * user's cache folder, never in the logbook; brought up to date when records are added by hand or
 * removed; a damaged or missing index only means reading everything again.
 */
import { describe, expect, it } from "vitest";
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, utimesSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { cacheFolder, indexFile, recordsOfFamily, refreshIndex } from "../src/logbook/family-index.js";
import { byFileName, readLogbook } from "../src/logbook/store.js";
import { ROOT } from "./helpers/cli.js";
import { settle } from "./helpers/settle.js";

const DEMO = join(ROOT, "jobs/logbook");
const tmp = (p: string) => mkdtempSync(join(tmpdir(), p));

/** A logbook of the demo records, plus `extra` copies of the blind motor's record under new names. */
function logbook(extra = 0): string {
  const dir = tmp("armwind-index-book-");
  for (const f of readdirSync(DEMO)) writeFileSync(join(dir, f), readFileSync(join(DEMO, f)));
  const blind = readdirSync(DEMO).find((f) => f.startsWith("blind-motor-0031-"))!;
  const text = readFileSync(join(DEMO, blind), "utf8");
  for (let i = 0; i < extra; i++) writeFileSync(join(dir, `blind-motor-0031-2026-12-01-${i + 2}.yaml`), text);
  return dir;
}

const familyOf = (dir: string, name: string) =>
  (JSON.parse(readFileSync(join(dir, name), "utf8").replace(/^#.*\n/gm, "")) as { job: { family: string | null } }).job.family;

describe("records of one family", () => {
  it("gives the same records as reading everything and filtering, before and after the index exists", () => {
    const dir = logbook(3);
    const cache = tmp("armwind-index-cache-");
    const all = readLogbook(dir).records;
    for (const family of ["blind-5slot", ...new Set(all.map((r) => r.record.job.family).filter((f): f is string => f !== null))]) {
      const want = all.filter((r) => r.record.job.family === family).map((r) => r.file);
      expect(recordsOfFamily(dir, family, cache).records.map((r) => r.file)).toEqual(want);
      expect(recordsOfFamily(dir, family, cache).records.map((r) => r.file)).toEqual(want);
    }
    expect(recordsOfFamily(dir, "blind-5slot", cache).records).toHaveLength(4);
  });

  it("with the index made, does not read other families' records (a damaged one of another family gives no warning)", () => {
    const dir = logbook();
    const cache = tmp("armwind-index-cache-");
    recordsOfFamily(dir, "blind-5slot", cache);
    const other = readdirSync(dir).find((f) => !f.startsWith("blind-motor") && familyOf(dir, f) !== "blind-5slot")!;
    writeFileSync(join(dir, other), "{ not a record");
    expect(recordsOfFamily(dir, "blind-5slot", cache).warnings).toEqual([]);
    // without the index, everything is read again and the damage shows
    rmSync(cache, { recursive: true });
    expect(recordsOfFamily(dir, "blind-5slot", cache).warnings.map((w) => w.file)).toEqual([other]);
  });

  it("places another family's record by the family its text names, without validating it: its damage is that family's warning", () => {
    const dir = logbook();
    const cache = tmp("armwind-index-cache-");
    const other = readdirSync(dir).find((f) => !f.startsWith("blind-motor") && familyOf(dir, f) !== null)!;
    const family = familyOf(dir, other)!;
    writeFileSync(join(dir, other), readFileSync(join(dir, other), "utf8").replace(/"slots": \d+/, '"slots": -5'));
    // a fresh index: the blind family's plan does not read it in full, so gives no warning
    expect(recordsOfFamily(dir, "blind-5slot", cache).warnings).toEqual([]);
    expect(JSON.parse(readFileSync(indexFile(cache, dir), "utf8")).families[other]).toBe(family);
    // its own family's plan reads it and warns
    expect(recordsOfFamily(dir, family, cache).warnings.map((w) => w.file)).toEqual([other]);
  });

  it("sees a record added by hand or by a merge, and forgets a removed one", () => {
    const dir = logbook();
    const cache = tmp("armwind-index-cache-");
    expect(recordsOfFamily(dir, "blind-5slot", cache).records).toHaveLength(1);
    const blind = readdirSync(dir).find((f) => f.startsWith("blind-motor-0031-"))!;
    writeFileSync(join(dir, "blind-motor-0031-2026-12-01-7.yaml"), readFileSync(join(dir, blind)));
    expect(recordsOfFamily(dir, "blind-5slot", cache).records.map((r) => r.file)).toEqual([blind, "blind-motor-0031-2026-12-01-7.yaml"]);
    rmSync(join(dir, blind));
    expect(recordsOfFamily(dir, "blind-5slot", cache).records.map((r) => r.file)).toEqual(["blind-motor-0031-2026-12-01-7.yaml"]);
    expect(Object.keys(JSON.parse(readFileSync(indexFile(cache, dir), "utf8")).families)).not.toContain(blind);
  });

  it("keeps the index in the cache folder, never in the logbook; a damaged index is rebuilt", () => {
    const dir = logbook();
    const cache = tmp("armwind-index-cache-");
    const before = readdirSync(dir).sort();
    recordsOfFamily(dir, "blind-5slot", cache);
    expect(readdirSync(dir).sort()).toEqual(before);
    expect(existsSync(indexFile(cache, dir))).toBe(true);
    writeFileSync(indexFile(cache, dir), "garbage");
    writeFileSync(indexFile(cache, dir, "blind-5slot"), "garbage");
    expect(recordsOfFamily(dir, "blind-5slot", cache).records).toHaveLength(1);
    expect(JSON.parse(readFileSync(indexFile(cache, dir), "utf8")).version).toBe(3);
    expect(JSON.parse(readFileSync(indexFile(cache, dir, "blind-5slot"), "utf8")).names).toHaveLength(1);
  });

  it("an unwritable cache folder costs only time", () => {
    const dir = logbook();
    const blocker = join(tmp("armwind-index-cache-"), "file");
    writeFileSync(blocker, "x");
    expect(recordsOfFamily(dir, "blind-5slot", join(blocker, "sub")).records).toHaveLength(1);
  });
});

describe("the family's share keeps its records as validated", () => {
  /** The share's JSON, and a way to write it back. */
  const shareOf = (cache: string, dir: string) => {
    const file = indexFile(cache, dir, "blind-5slot");
    return { json: JSON.parse(readFileSync(file, "utf8")), save: (j: unknown) => writeFileSync(file, JSON.stringify(j)) };
  };
  const keOf = (dir: string, cache: string) => recordsOfFamily(dir, "blind-5slot", cache).records.map((r) => r.record.derived.ke_v_s_per_rad);

  it("takes a settled record from the share while its file's stamp holds, and reads the file again once it changes", () => {
    const dir = logbook(1);
    settle(dir);
    const cache = tmp("armwind-index-cache-");
    const want = keOf(dir, cache); // builds the index
    expect(keOf(dir, cache)).toEqual(want); // reads the files, keeps them
    const { json, save } = shareOf(cache, dir);
    expect(Object.keys(json.records)).toHaveLength(2);
    // what is read now is the share: alter a kept record (the files themselves unchanged)
    for (const k of Object.keys(json.records)) json.records[k].record.derived.ke_v_s_per_rad = 1.25;
    save(json);
    expect(keOf(dir, cache)).toEqual([1.25, 1.25]);
    // one file touched (a new modification time): that one is read again
    const name = Object.keys(json.records)[0];
    utimesSync(join(dir, name), new Date(Date.now() - 30_000), new Date(Date.now() - 30_000));
    expect(keOf(dir, cache).sort()).toEqual([1.25, want[0]].sort());
  });

  it("does not keep a record changed within the last two seconds, nor use a share of another armwind version", () => {
    const dir = logbook(1);
    const cache = tmp("armwind-index-cache-");
    keOf(dir, cache);
    keOf(dir, cache);
    expect(shareOf(cache, dir).json.records).toEqual({});
    settle(dir);
    const want = keOf(dir, cache);
    const { json, save } = shareOf(cache, dir);
    for (const k of Object.keys(json.records)) json.records[k].record.derived.ke_v_s_per_rad = 1.25;
    json.armwind = "0.0.0-other";
    save(json);
    expect(keOf(dir, cache)).toEqual(want);
  });

  it("skips listing a settled folder whose stamp is the share's, and still sees a record added or removed", () => {
    const dir = logbook();
    const cache = tmp("armwind-index-cache-");
    keOf(dir, cache);
    expect(shareOf(cache, dir).json.folder).toBeUndefined(); // the folder was just written: listed every time
    settle(dir);
    utimesSync(dir, new Date(Date.now() - 60_000), new Date(Date.now() - 60_000));
    keOf(dir, cache);
    expect(shareOf(cache, dir).json.folder).toEqual(expect.any(String));
    const blind = readdirSync(dir).find((f) => f.startsWith("blind-motor-0031-"))!;
    writeFileSync(join(dir, "blind-motor-0031-2026-12-01-9.yaml"), readFileSync(join(dir, blind)));
    expect(recordsOfFamily(dir, "blind-5slot", cache).records.map((r) => r.file)).toEqual([blind, "blind-motor-0031-2026-12-01-9.yaml"]);
    rmSync(join(dir, blind));
    expect(recordsOfFamily(dir, "blind-5slot", cache).records.map((r) => r.file)).toEqual(["blind-motor-0031-2026-12-01-9.yaml"]);
  });
});

describe("history refreshes the index", () => {
  it("a record edited in place into the family is found after a whole read", () => {
    const dir = logbook();
    const cache = tmp("armwind-index-cache-");
    expect(recordsOfFamily(dir, "blind-5slot", cache).records).toHaveLength(1);
    const other = readdirSync(dir).find((f) => familyOf(dir, f) !== "blind-5slot" && familyOf(dir, f) !== null)!;
    writeFileSync(join(dir, other), readFileSync(join(dir, other), "utf8").replace(/"family": "[^"]*"/, '"family": "blind-5slot"'));
    // same listing: the share still holds (the edit is not seen) …
    expect(recordsOfFamily(dir, "blind-5slot", cache).records).toHaveLength(1);
    // … until a whole read rewrites the index
    refreshIndex(
      dir,
      readLogbook(dir).records.map((r) => [r.file, r.record.job.family] as [string, string | null]),
      cache,
    );
    expect(recordsOfFamily(dir, "blind-5slot", cache).records.map((r) => r.file)).toContain(other);
  });
});

describe("the cache folder (XDG Base Directory Specification)", () => {
  it("is $ARMWIND_CACHE_DIR, else $XDG_CACHE_HOME/armwind, else the platform's place", () => {
    expect(cacheFolder({ ARMWIND_CACHE_DIR: "/c" })).toBe("/c");
    expect(cacheFolder({ XDG_CACHE_HOME: "/x" })).toBe("/x/armwind");
    expect(cacheFolder({}, "linux")).toMatch(/\/\.cache\/armwind$/);
    expect(cacheFolder({}, "darwin")).toMatch(/Library\/Caches\/armwind$/);
  });
});

describe("file name order", () => {
  it("one collator orders as localeCompare with numeric collation does", () => {
    const names = ["a-2026-01-01-10.yaml", "a-2026-01-01-2.yaml", "a-2026-01-01-1.yaml", "B-2026-01-01-1.yaml", "b-2026-01-01-1.yaml"];
    expect([...names].sort(byFileName)).toEqual([...names].sort((x, y) => x.localeCompare(y, "en", { numeric: true })));
    expect([...names].sort(byFileName).slice(0, 3)).toEqual(["a-2026-01-01-1.yaml", "a-2026-01-01-2.yaml", "a-2026-01-01-10.yaml"]);
  });
});
