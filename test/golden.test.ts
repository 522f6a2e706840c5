/**
 * The outputs a rewinder acts on, kept as reviewed references (test/golden/): every demo job's plan
 * text, `plan --json` and the card's bytes (a SHA-256, for a fixed date), made in-process. Speed
 * work must leave them as they are; a change that means to move a figure or a line rewrites them
 * with `UPDATE_GOLDEN=1 npx vitest run test/golden.test.ts`, and the diff of test/golden/ is part
 * of the review (the commit says which figures moved and why).
 */
import { createHash } from "node:crypto";
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { basename, join } from "node:path";
import { describe, expect, it } from "vitest";
import { ROOT, demoJobFiles, runMain } from "./helpers/cli.js";

const GOLDEN = join(ROOT, "test/golden");
const UPDATE = process.env.UPDATE_GOLDEN === "1";
/** 2026-12-01 00:00 UTC: the date the cards print; no meter, paper or shop setting of the machine running the test. */
const FIXED = { SOURCE_DATE_EPOCH: "1796083200", ARMWIND_METER_RESOLUTION: "", ARMWIND_PAPER: "", ARMWIND_SHOP: "" };

function check(name: string, actual: string): void {
  const file = join(GOLDEN, name);
  if (UPDATE) {
    mkdirSync(GOLDEN, { recursive: true });
    writeFileSync(file, actual);
    return;
  }
  expect(existsSync(file), `${name} is missing: UPDATE_GOLDEN=1 makes it`).toBe(true);
  expect(actual, `${name} changed; if on purpose, UPDATE_GOLDEN=1 and say why in the commit`).toBe(readFileSync(file, "utf8"));
}

describe("outputs unchanged unless meant (test/golden/)", () => {
  for (const job of demoJobFiles()) {
    const id = basename(job, ".yaml");
    it(id, async () => {
      const text = await runMain(["plan", job, "--no-learn"], { env: FIXED, cwd: ROOT });
      check(`${id}.plan.txt`, text.stdout);
      const json = await runMain(["plan", job, "--no-learn", "--json"], { env: FIXED, cwd: ROOT });
      check(`${id}.plan.json`, json.stdout);
      const out = mkdtempSync(join(tmpdir(), "armwind-golden-"));
      await runMain(["card", job, "--no-learn", "-o", join(out, `${id}.pdf`)], { env: FIXED, cwd: ROOT });
      const hashes = readdirSync(out)
        .sort()
        .map(
          (f) =>
            `${createHash("sha256")
              .update(readFileSync(join(out, f)))
              .digest("hex")}  ${f}\n`,
        )
        .join("");
      check(`${id}.card.sha256`, hashes);
    });
  }
});
