/**
 * Make the V8 code cache for the CLI bundle (run by scripts/build.mjs): compile the bundle, run
 * the commands whose start-up matters (help, a plan, a card into a temporary folder) in this
 * process so that their functions are compiled, then write what V8 compiled to dist/armwind.cjs.cache.
 */
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { CACHE, loadBundle } from "../bin/bundle.mjs";

const { exports, script } = loadBundle({ cache: false });
const dir = mkdtempSync(join(tmpdir(), "armwind-cache-"));
const quiet = { out: () => {}, err: () => {}, stdin: () => "", env: { ...process.env, NO_COLOR: "1" }, cwd: process.cwd() };
try {
  await exports.main(["--help"], quiet);
  await exports.main(["plan", "jobs/blind-motor-0031.yaml", "--json", "--no-learn"], quiet);
  await exports.main(["card", "jobs/blind-motor-0031.yaml", "-o", dir, "--no-learn"], quiet);
} finally {
  rmSync(dir, { recursive: true, force: true });
}
writeFileSync(CACHE, script.createCachedData());
