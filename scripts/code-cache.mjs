/**
 * Make a V8 code cache for the CLI bundle (run by scripts/build.mjs, once per cache): compile the
 * bundle, run the commands whose start-up matters in this process so that their functions are
 * compiled, then write what V8 compiled. Two caches, because V8 reads the whole of a cache at
 * start-up and the card's part (pdfkit, fontkit, the pages) is as large as all the rest:
 *   main (dist/armwind.cjs.cache): help, a plan learning from the demo logbook, history;
 *   card (dist/armwind.cjs.card.cache): a card, for command lines that name `card`.
 * The demo logbook's family index and history summary go to a temporary cache folder.
 */
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { CACHE, CARD_CACHE, loadBundle } from "../bin/bundle.mjs";

const which = process.argv[2] === "card" ? "card" : "main";
const { exports, script } = loadBundle({ cache: false });
const dir = mkdtempSync(join(tmpdir(), "armwind-cache-"));
const quiet = { out: () => {}, err: () => {}, stdin: () => "", env: { ...process.env, NO_COLOR: "1", ARMWIND_CACHE_DIR: dir }, cwd: process.cwd() };
const job = "jobs/blind-motor-0031.yaml";
try {
  if (which === "card") {
    await exports.main(["card", job, "-o", dir], quiet);
  } else {
    await exports.main(["--help"], quiet);
    await exports.main(["plan", job, "--json"], quiet);
    await exports.main(["plan", job], quiet);
    await exports.main(["history"], quiet);
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
writeFileSync(which === "card" ? CARD_CACHE : CACHE, script.createCachedData());
