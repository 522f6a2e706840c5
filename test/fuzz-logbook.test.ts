/**
 * Fuzzed logbook folders and shop folders (issue 14): the demo logbook copied, then mutated —
 * numbers in records replaced by absurd ones, keys dropped, files cut short or filled with junk,
 * FIFOs, links to /dev/zero, to folders and to nowhere, files over the size limit, folders and
 * temporary files under record names, records renamed to another job — and read as `history` and
 * a learning `plan` read them. The rule: nothing hangs or throws; every entry named like a record
 * is either a record or a warning naming it; what is listed is within its physical range; the plan
 * still comes out with finite figures. A few of the folders also go through the real command (a
 * spawn with a time limit), with a shop profile that is a FIFO, a link to /dev/zero, a folder or a
 * file over the limit.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, renameSync, symlinkSync, truncateSync, writeFileSync } from "node:fs";
import { spawnSync } from "node:child_process";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { CLI, ROOT, loadJobFile } from "./helpers/cli.js";
import { readLogbook } from "../src/logbook/store.js";
import { learnFromRecords } from "../src/logbook/learn.js";
import { planJob } from "../src/design/plan.js";
import { planJson } from "../src/cli/plan-json.js";
import { RECORD_RANGES, COUNTS } from "../src/job/ranges.js";

const LOGBOOK = join(ROOT, "jobs", "logbook");
const NAMES = readdirSync(LOGBOOK).sort();
const TEXTS = NAMES.map((n) => readFileSync(join(LOGBOOK, n), "utf8"));
const BLIND = join(ROOT, "jobs", "blind-motor-0031.yaml");
const blindJob = loadJobFile(BLIND);

const ABSURD = [1e300, -1e300, 1e308, -1, 0, 1e9, 2 ** 53, 1e-300, "NaN", null, "x", true, [], {}] as const;

const mutation = fc.oneof(
  fc.record({ op: fc.constant("number" as const), rec: fc.nat(), leaf: fc.nat(), value: fc.constantFrom(...ABSURD) }),
  fc.record({ op: fc.constant("drop" as const), rec: fc.nat(), leaf: fc.nat() }),
  fc.record({ op: fc.constant("cut" as const), rec: fc.nat(), at: fc.double({ min: 0, max: 1, noNaN: true }) }),
  fc.record({ op: fc.constant("junk" as const), rec: fc.nat(), bytes: fc.uint8Array({ maxLength: 64 }) }),
  fc.record({
    op: fc.constantFrom("fifo" as const, "zero" as const, "dir" as const, "dangling" as const, "linkdir" as const, "huge" as const, "tmp" as const),
    n: fc.nat({ max: 50 }),
  }),
  fc.record({ op: fc.constant("rename" as const), rec: fc.nat() }),
);
type Mutation = typeof mutation extends fc.Arbitrary<infer T> ? T : never;

/** Paths of every leaf of a JSON value. */
function leaves(v: unknown, path: (string | number)[] = []): (string | number)[][] {
  if (v !== null && typeof v === "object") return Object.entries(v).flatMap(([k, x]) => leaves(x, [...path, Array.isArray(v) ? Number(k) : k]));
  return [path];
}

function setAt(root: unknown, path: (string | number)[], value: unknown, drop = false) {
  let o = root as Record<string | number, unknown>;
  for (const p of path.slice(0, -1)) o = o[p] as Record<string | number, unknown>;
  const last = path[path.length - 1];
  if (drop) delete o[last];
  else o[last] = value;
}

/** The demo logbook in a new folder, mutated. Returns the folder and the record-like names it made. */
function mutatedBook(ms: Mutation[]): string {
  const dir = join(mkdtempSync(join(tmpdir(), "armwind-fuzz-book-")), "book");
  mkdirSync(dir);
  NAMES.forEach((n, i) => writeFileSync(join(dir, n), TEXTS[i]));
  for (const m of ms) {
    const fresh = `blind-motor-0031-2026-11-${String(10 + ("n" in m ? m.n % 18 : 0)).padStart(2, "0")}-${"n" in m ? m.n : 0}.yaml`;
    try {
      switch (m.op) {
        case "number":
        case "drop": {
          const name = NAMES[m.rec % NAMES.length];
          const text = TEXTS[m.rec % NAMES.length];
          const j = JSON.parse(text.slice(text.indexOf("{")));
          const ls = leaves(j).filter((p) => p.length > 0);
          setAt(j, ls[m.leaf % ls.length], m.op === "number" ? m.value : undefined, m.op === "drop");
          writeFileSync(join(dir, name), JSON.stringify(j));
          break;
        }
        case "cut": {
          const i = m.rec % NAMES.length;
          writeFileSync(join(dir, NAMES[i]), TEXTS[i].slice(0, Math.floor(TEXTS[i].length * m.at)));
          break;
        }
        case "junk":
          writeFileSync(join(dir, NAMES[m.rec % NAMES.length]), Buffer.from(m.bytes));
          break;
        case "fifo":
          spawnSync("mkfifo", [join(dir, fresh)]);
          break;
        case "zero":
          symlinkSync("/dev/zero", join(dir, fresh));
          break;
        case "dir":
          mkdirSync(join(dir, fresh));
          break;
        case "dangling":
          symlinkSync(join(dir, "nowhere"), join(dir, fresh));
          break;
        case "linkdir":
          symlinkSync(tmpdir(), join(dir, fresh));
          break;
        case "huge":
          writeFileSync(join(dir, fresh), "{");
          truncateSync(join(dir, fresh), 5 * 1024 * 1024);
          break;
        case "tmp":
          writeFileSync(join(dir, `.${fresh}.somehost.${m.n + 1}.0123456789ab.tmp`), TEXTS[0].slice(0, 100));
          break;
        case "rename": {
          const i = m.rec % NAMES.length;
          renameSync(join(dir, NAMES[i]), join(dir, `robot-3slot-0007-2026-12-0${(m.rec % 9) + 1}-${m.rec + 7}.yaml`));
          break;
        }
      }
    } catch {
      // a name already taken by an earlier mutation: skip
    }
  }
  return dir;
}

function finiteNumbers(v: unknown): boolean {
  if (typeof v === "number") return Number.isFinite(v);
  if (v !== null && typeof v === "object") return Object.values(v).every(finiteNumbers);
  return true;
}

describe("fuzzed logbook folders, read as history and a learning plan read them", () => {
  it("never hang or throw; every record-like name is a record or a warning; what is kept is in range; the plan is finite", () => {
    fc.assert(
      fc.property(fc.array(mutation, { minLength: 1, maxLength: 6 }), (ms) => {
        const dir = mutatedBook(ms);
        const book = readLogbook(dir);
        const named = readdirSync(dir).filter((n) => !n.startsWith(".") && n.endsWith(".yaml"));
        const accounted = new Set([...book.records.map((r) => r.file), ...book.warnings.map((w) => w.file)]);
        for (const n of named) expect(accounted.has(n), n).toBe(true);
        for (const { record: r } of book.records) {
          expect(r.derived.mean_turn_length_mm).toBeLessThanOrEqual(RECORD_RANGES.mean_turn_length_mm.max);
          expect(r.winding.turns).toBeLessThanOrEqual(COUNTS.turns.max);
          expect(r.measured.temperature_c).toBeLessThanOrEqual(RECORD_RANGES.temperature_c.max);
        }
        for (const w of book.warnings) expect(w.message).not.toMatch(/[\r\n]/);
        const learned = learnFromRecords(blindJob, book.records);
        const plan = planJob(blindJob, learned.options ? { logbook: learned.options } : {});
        expect(finiteNumbers(planJson(plan))).toBe(true);
      }),
      { numRuns: 120 },
    );
  });
});

/** The real command with a time limit on the child. */
function run(args: string[], cwd: string) {
  const r = spawnSync(process.execPath, [CLI, ...args], {
    cwd,
    encoding: "utf8",
    timeout: 30_000,
    killSignal: "SIGKILL",
    env: { ...process.env, NO_COLOR: "1", ARMWIND_LOGBOOK: "", ARMWIND_SHOP: "" },
  });
  if (r.error) throw new Error(`armwind ${args.join(" ")} in ${cwd}: ${r.error.message} (a hang)`);
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

const shopKind = fc.constantFrom("none", "fifo", "zero", "dir", "huge", "junk", "good");

function shopFolder(kind: string, dir: string): string {
  const f = join(dir, "armwind.yaml");
  if (kind === "fifo") spawnSync("mkfifo", [f]);
  else if (kind === "zero") symlinkSync("/dev/zero", f);
  else if (kind === "dir") mkdirSync(f);
  else if (kind === "huge") {
    writeFileSync(f, "version: 1\n");
    truncateSync(f, 2 * 1024 * 1024);
  } else if (kind === "junk") writeFileSync(f, "version: [1\n\u0000");
  else if (kind === "good") writeFileSync(f, `version: 1\nshop: Fuzz Rewinds (invented)\nbench: fuzz-1\nlogbook: book\n`);
  return f;
}

describe("fuzzed logbook and shop folders through the real command", () => {
  it("history --json and plan --json finish with one shape; warnings and errors are one line each", () => {
    fc.assert(
      fc.property(fc.array(mutation, { minLength: 1, maxLength: 5 }), shopKind, (ms, kind) => {
        const book = mutatedBook(ms);
        const home = join(book, "..");
        shopFolder(kind, home);
        for (const args of [
          ["history", "--json", "--logbook", book],
          ["plan", BLIND, "--json", "--logbook", book],
        ]) {
          const r = run(args, home);
          expect(r.stderr, r.stderr).not.toMatch(/ {4}at |node:internal|internal error/);
          for (const line of r.stderr.trim().split("\n").filter(Boolean)) expect(line).toMatch(/\[[a-z_]+\]$/);
          const j = JSON.parse(r.stdout);
          expect(typeof j.ok).toBe("boolean");
          if (r.status === 1) {
            // only a profile that cannot be read stops a command, with its problem located in the profile
            expect(["huge", "junk"]).toContain(kind);
            expect(j.errors[0].file).toMatch(/armwind\.yaml$/);
          } else {
            expect([0, 2]).toContain(r.status);
          }
        }
      }),
      { numRuns: 4 },
    );
  });
});
