/**
 * The demo cards through a real PDF renderer: poppler's pdftoppm (Debian poppler-utils, which
 * .ci/run installs) renders every page without an error message, and every page has ink on it.
 */
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { mkdtempSync, readdirSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { basename, join } from "node:path";
import { demoJobFiles, runCli } from "./helpers/cli.js";

const havePdftoppm = spawnSync("pdftoppm", ["-v"]).status === 0;

/** Share of dark pixels (below mid grey) in a binary PGM (P5) image: Netpbm's PGM format. */
function inkShare(pgm: Buffer): number {
  const header = /^P5\s+(\d+)\s+(\d+)\s+(\d+)\s/.exec(pgm.toString("latin1", 0, 40));
  if (!header) throw new Error("not a binary PGM");
  const [w, h] = [Number(header[1]), Number(header[2])];
  const pixels = pgm.subarray(header[0].length);
  let dark = 0;
  for (let i = 0; i < w * h; i++) if (pixels[i] < 128) dark++;
  return dark / (w * h);
}

describe("cards render with poppler", () => {
  it("pdftoppm is installed (Debian poppler-utils; .ci/run installs it)", () => {
    expect(havePdftoppm, "install poppler-utils: apt-get install poppler-utils").toBe(true);
  });
  for (const job of demoJobFiles()) {
    it.runIf(havePdftoppm)(`every page of ${basename(job)} renders without errors and has ink`, () => {
      const dir = mkdtempSync(join(tmpdir(), "armwind-render-"));
      expect(runCli(["card", job, "-o", dir]).status).toBe(0);
      const pdf = readdirSync(dir).find((f) => f.endsWith(".pdf"))!;
      const r = spawnSync("pdftoppm", ["-gray", "-r", "30", join(dir, pdf), join(dir, "page")], { encoding: "utf8" });
      expect(r.status).toBe(0);
      expect(r.stderr).toBe("");
      const pages = readdirSync(dir).filter((f) => f.startsWith("page") && f.endsWith(".pgm"));
      expect(pages.length).toBeGreaterThanOrEqual(5);
      for (const p of pages) expect(inkShare(readFileSync(join(dir, p))), p).toBeGreaterThan(0.005);
    });
  }
});
