/**
 * The installed command (bin/armwind.mjs running the bundle dist/armwind.cjs with its code cache,
 * built by scripts/build.mjs) prints and writes exactly what the source does in-process: plan text,
 * `--json`, help, a located error, and the card's bytes for a fixed date (SOURCE_DATE_EPOCH). The
 * speed work (bundling, the code cache, leaving out the WOFF2 decoder) must not change an output.
 */
import { describe, expect, it } from "vitest";
import { existsSync, mkdtempSync, readdirSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { basename, join } from "node:path";
import { ROOT, demoJobFiles, runCli, runMain } from "./helpers/cli.js";

const FIXED = { SOURCE_DATE_EPOCH: "1796083200" };
const tmp = () => mkdtempSync(join(tmpdir(), "armwind-bundle-"));

describe("the bundle and the source give the same outputs", () => {
  for (const job of demoJobFiles()) {
    it(`plan, plan --json and the card for ${basename(job)}`, async () => {
      for (const args of [
        ["plan", job],
        ["plan", job, "--json"],
      ]) {
        const real = runCli(args, { env: FIXED });
        const src = await runMain(args, { env: FIXED });
        expect(real.stdout, args.join(" ")).toBe(src.stdout);
        expect(real.stderr).toBe(src.stderr);
        expect(real.status).toBe(src.status);
        expect(real.stdout.length).toBeGreaterThan(200);
      }
      const [a, b] = [tmp(), tmp()];
      expect(runCli(["card", job, "-o", a], { env: FIXED }).status).toBeLessThan(3);
      expect((await runMain(["card", job, "-o", b], { env: FIXED })).status).toBeLessThan(3);
      const files = readdirSync(a).sort();
      expect(files).toEqual(readdirSync(b).sort());
      expect(files.some((f) => f.endsWith(".pdf"))).toBe(true);
      for (const f of files) expect(readFileSync(join(a, f)).equals(readFileSync(join(b, f))), f).toBe(true);
    });
  }

  it("help, version and a located error", async () => {
    const bad = join(ROOT, "jobs/nonexistent.yaml");
    for (const args of [["--help"], ["card", "--help"], ["--version"], ["plan", bad], ["plna"]]) {
      const real = runCli(args);
      const src = await runMain(args);
      expect({ ...real, args }).toEqual({ ...src, args });
    }
  });
});

describe("what the bundle leaves out", () => {
  it("holds no brotli decoder (WOFF2 only; the card embeds TrueType unpacked from WOFF 1.0)", () => {
    const bundle = readFileSync(join(ROOT, "dist/armwind.cjs"), "utf8");
    expect(bundle).toContain("WOFF2 fonts are not supported");
    // the decoder's dictionary and its table of transforms would be tens of kilobytes of numbers
    expect(bundle).not.toMatch(/BrotliDecompressBuffer|BrotliBitReader/);
    expect(existsSync(join(ROOT, "dist/armwind.cjs.cache"))).toBe(true);
  });

  it("has two code caches, each accepted by this Node: the card's, and the main one for every other command", async () => {
    // @ts-expect-error: the loader is plain JavaScript without types
    const { CACHE, CARD_CACHE, cacheFor, loadBundle } = await import("../bin/bundle.mjs");
    expect(cacheFor(["card", "job.yaml"])).toBe(CARD_CACHE);
    expect(cacheFor(["plan", "job.yaml"])).toBe(CACHE);
    for (const cache of [CACHE, CARD_CACHE]) expect(loadBundle({ cache }).cacheRejected, cache).toBe(false);
  });
});
