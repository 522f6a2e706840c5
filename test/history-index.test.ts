/**
 * History reads only what changed: the history summary (src/logbook/history-index.ts) in the user's
 * cache folder, never in the logbook, trusted for a file only while the file's size, times and inode
 * are those it was made from; the rows are those of a whole read, whatever the summary's state.
 */
import { describe, expect, it } from "vitest";
import { copyFileSync, mkdtempSync, readdirSync, readFileSync, rmSync, utimesSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { historyOfFolder, summaryFile } from "../src/logbook/history-index.js";
import { historyRows } from "../src/logbook/history.js";
import { readLogbook } from "../src/logbook/store.js";
import { ROOT } from "./helpers/cli.js";
import { settle } from "./helpers/settle.js";

const DEMO = join(ROOT, "jobs/logbook");
const tmp = (p: string) => mkdtempSync(join(tmpdir(), p));

function logbook(): string {
  const dir = tmp("armwind-summary-book-");
  for (const f of readdirSync(DEMO)) copyFileSync(join(DEMO, f), join(dir, f));
  writeFileSync(join(dir, "broken-2026-12-01-1.yaml"), "{ this is not: [ a record");
  settle(dir);
  return dir;
}

/** What a whole read gives: the rows in file-name order, and the warnings. */
function wholeRead(dir: string) {
  const book = readLogbook(dir);
  return { rows: historyRows(book.records).sort((a, b) => (a.file < b.file ? -1 : 1)), warnings: book.warnings };
}

const blindFile = (dir: string) => readdirSync(dir).find((f) => f.startsWith("blind-motor-0031-"))!;

describe("the history summary", () => {
  it("gives a whole read's rows and warnings, made afresh and then from the summary, which lives in the cache folder", () => {
    const dir = logbook();
    const cache = tmp("armwind-summary-cache-");
    const listing = readdirSync(dir).sort();
    const first = historyOfFolder(dir, cache);
    expect(first.changed).toBe(true);
    expect({ rows: first.rows, warnings: first.book.warnings }).toEqual(wholeRead(dir));
    const again = historyOfFolder(dir, cache);
    expect(again.changed).toBe(false);
    expect(JSON.stringify(again.rows)).toBe(JSON.stringify(first.rows));
    expect(again.book.warnings).toEqual(first.book.warnings);
    expect(readdirSync(dir).sort()).toEqual(listing);
    expect(readdirSync(cache)).toContain(summaryFile(cache, dir).split("/").pop());
  });

  it("trusts an entry while its file's stamp holds, and reads the file again once it changes", () => {
    const dir = logbook();
    const cache = tmp("armwind-summary-cache-");
    historyOfFolder(dir, cache);
    // the summary is what is read: alter a cached row (the file itself unchanged)
    const name = blindFile(dir);
    const file = summaryFile(cache, dir);
    const summary = JSON.parse(readFileSync(file, "utf8"));
    summary.entries[name].row.job_id = "from-the-summary";
    writeFileSync(file, JSON.stringify(summary));
    expect(historyOfFolder(dir, cache).rows.find((r) => r.file === name)?.job_id).toBe("from-the-summary");
    // an edit in place of the same size: a new modification time, read again
    const text = readFileSync(join(dir, name), "utf8");
    writeFileSync(join(dir, name), text.replace("Runs quietly", "Runs QUIETLY"));
    utimesSync(join(dir, name), new Date(), new Date(Date.now() + 5000));
    const after = historyOfFolder(dir, cache);
    expect(after.changed).toBe(true);
    expect({ rows: after.rows, warnings: after.book.warnings }).toEqual(wholeRead(dir));
  });

  it("follows records added, removed, mended and damaged", () => {
    const dir = logbook();
    const cache = tmp("armwind-summary-cache-");
    historyOfFolder(dir, cache);
    const blind = blindFile(dir);
    copyFileSync(join(dir, blind), join(dir, blind.replace(/-1\.yaml$/, "-2.yaml")));
    rmSync(join(dir, readdirSync(dir).find((f) => f.startsWith("robot-"))!));
    writeFileSync(join(dir, "broken-2026-12-01-1.yaml"), readFileSync(join(DEMO, blind)).toString().replace("blind-motor-0031", "broken"));
    writeFileSync(join(dir, readdirSync(dir).find((f) => f.startsWith("drill-"))!), "{ damaged since");
    const after = historyOfFolder(dir, cache);
    expect(after.changed).toBe(true);
    expect({ rows: after.rows, warnings: after.book.warnings }).toEqual(wholeRead(dir));
    settle(dir);
    expect(historyOfFolder(dir, cache).changed).toBe(true); // settled now: kept
    expect(historyOfFolder(dir, cache).changed).toBe(false);
  });

  it("reads a record changed within the last two seconds every time, and keeps it once settled (a change in the same tick could leave its stamp as it was)", () => {
    const dir = logbook();
    const cache = tmp("armwind-summary-cache-");
    historyOfFolder(dir, cache);
    const name = blindFile(dir);
    writeFileSync(join(dir, name), readFileSync(join(dir, name), "utf8").replace('"family": "blind-5slot"', '"family": "blind-5slox"'));
    expect(historyOfFolder(dir, cache).changed).toBe(true);
    const summary = () => JSON.parse(readFileSync(summaryFile(cache, dir), "utf8")) as { entries: Record<string, unknown> };
    expect(summary().entries[name]).toBeUndefined();
    // a second alteration of the same size, as within one tick of a coarse clock, is still seen: the file is read
    writeFileSync(join(dir, name), readFileSync(join(dir, name), "utf8").replace('"family": "blind-5slox"', '"family": "blind-5sloy"'));
    expect(historyOfFolder(dir, cache).rows.find((r) => r.file === name)?.family).toBe("blind-5sloy");
    settle(dir);
    historyOfFolder(dir, cache);
    expect(summary().entries[name]).toBeDefined();
  });

  it("a damaged or foreign summary only means reading every record again", () => {
    const dir = logbook();
    const cache = tmp("armwind-summary-cache-");
    const want = historyOfFolder(dir, cache);
    for (const text of ["{ not json", JSON.stringify({ version: 1, dir: "/elsewhere", entries: {} }), JSON.stringify({ version: 1, dir, entries: { x: 1 } })]) {
      writeFileSync(summaryFile(cache, dir), text);
      const got = historyOfFolder(dir, cache);
      expect(got.changed).toBe(true);
      expect(JSON.stringify(got.rows)).toBe(JSON.stringify(want.rows));
    }
  });

  it("an unwritable cache folder costs only the time", () => {
    const dir = logbook();
    const blocker = join(tmp("armwind-summary-cache-"), "a-file");
    writeFileSync(blocker, "");
    const got = historyOfFolder(dir, join(blocker, "sub"));
    expect({ rows: got.rows, warnings: got.book.warnings }).toEqual(wholeRead(dir));
  });
});
