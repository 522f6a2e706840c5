/**
 * The store under pressure: twenty `armwind log` processes at once for the same job and date leave
 * twenty complete records and nothing else; a process killed in the middle of its write leaves no
 * record; while writers run, every file under a record's name is already complete.
 * Runs the installed command (bin/armwind.mjs, built by the test setup) as a user would.
 */
import { spawn } from "node:child_process";
import { mkdtempSync, readdirSync, readFileSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { parse } from "yaml";
import { CLI, ROOT } from "./helpers/cli.js";
import { readLogbook } from "../src/logbook/store.js";
import { recordSchema } from "../src/logbook/record.js";

const BLIND = join(ROOT, "jobs/blind-motor-0031.yaml");
const MEASURED = join(ROOT, "jobs/measured/blind-motor-0031.yaml");

function log(dir: string, env: Record<string, string> = {}) {
  const child = spawn(process.execPath, [CLI, "log", BLIND, "--measured", MEASURED, "--logbook", dir, "--no-learn", "--again"], {
    cwd: ROOT,
    // --again: every writer logs the same readings (the store is what is tested); one bench name
    env: { ...process.env, NO_COLOR: "1", ARMWIND_BENCH: "race", ...env },
    stdio: ["ignore", "pipe", "pipe"],
  });
  let stderr = "";
  child.stderr.on("data", (d) => (stderr += d));
  const done = new Promise<{ code: number | null; signal: NodeJS.Signals | null; stderr: string }>((resolve) =>
    child.on("close", (code, signal) => resolve({ code, signal, stderr })),
  );
  return { child, done };
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe("the logbook store", () => {
  it("twenty writers at once leave twenty complete records and nothing else", async () => {
    const dir = mkdtempSync(join(tmpdir(), "armwind-race-"));
    const runs = Array.from({ length: 20 }, () => log(dir));
    // watch the folder while they run: anything under a record's name must already be whole
    let watching = true;
    const seenIncomplete: string[] = [];
    // a name seen whole is not read again (records are never rewritten), so the watcher does not starve the writers
    const seenWhole = new Set<string>();
    const watcher = (async () => {
      while (watching) {
        let names: string[] = [];
        try {
          names = readdirSync(dir);
        } catch {
          names = [];
        }
        for (const n of names) {
          if (n.startsWith(".") || seenWhole.has(n)) continue;
          try {
            const r = recordSchema.safeParse(parse(readFileSync(join(dir, n), "utf8")));
            if (!r.success) seenIncomplete.push(n);
            else seenWhole.add(n);
          } catch {
            seenIncomplete.push(n);
          }
        }
        await sleep(5);
      }
    })();
    const results = await Promise.all(runs.map((r) => r.done));
    watching = false;
    await watcher;
    for (const r of results) expect(r.code, r.stderr).toBe(0);
    const names = readdirSync(dir).sort((a, b) => a.localeCompare(b, "en", { numeric: true }));
    expect(names).toEqual(Array.from({ length: 20 }, (_, i) => `blind-motor-0031-2026-12-01-race-${i + 1}.yaml`));
    const book = readLogbook(dir);
    expect(book.records).toHaveLength(20);
    expect(book.warnings).toEqual([]);
    expect(seenIncomplete).toEqual([]);
  });

  it("a writer killed in the middle of its write leaves no record", async () => {
    const dir = mkdtempSync(join(tmpdir(), "armwind-kill-"));
    // ARMWIND_LOG_HOLD_MS: the store sleeps with half of its temporary file written
    const { child, done } = log(dir, { ARMWIND_LOG_HOLD_MS: "60000" });
    let tmp: string | undefined;
    for (let i = 0; i < 2000 && !tmp; i++) {
      await sleep(10);
      try {
        tmp = readdirSync(dir).find((n) => n.endsWith(".tmp") && statSync(join(dir, n)).size > 0);
      } catch {
        /* folder not made yet */
      }
    }
    expect(tmp, "the writer never got to its temporary file").toBeDefined();
    child.kill("SIGKILL");
    const r = await done;
    expect(r.signal).toBe("SIGKILL");
    // the half-written temporary file is hidden and not a record; no record name was taken
    expect(readdirSync(dir).filter((n) => !n.startsWith("."))).toEqual([]);
    const book = readLogbook(dir);
    expect(book.records).toEqual([]);
    expect(book.warnings).toEqual([]);
    // and the next writer takes n = 1
    const next = await log(dir).done;
    expect(next.code).toBe(0);
    expect(readdirSync(dir).filter((n) => !n.startsWith("."))).toEqual(["blind-motor-0031-2026-12-01-race-1.yaml"]);
  });
});
