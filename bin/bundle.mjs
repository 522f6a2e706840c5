/**
 * Load the CLI bundle (dist/armwind.cjs, built by scripts/build.mjs) through vm.Script with the V8
 * code cache made at build time (dist/armwind.cjs.cache), so that start-up skips compiling what
 * the cache holds. A missing or rejected cache (another Node version) only costs that time.
 */
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import vm from "node:vm";

export const BUNDLE = join(dirname(fileURLToPath(import.meta.url)), "..", "dist", "armwind.cjs");
export const CACHE = `${BUNDLE}.cache`;
/** The card's own cache (pdfkit, fontkit and the pages compiled too): read only for a command line that names `card`. */
export const CARD_CACHE = `${BUNDLE}.card.cache`;

/** The cache for a command line: the card's when it names `card`, else the main one. */
export const cacheFor = (args) => (args.includes("card") ? CARD_CACHE : CACHE);

/**
 * Compile the bundle (with the cache when there is one: `options.cache`, a file, else the one for
 * this process's command line; `false` for none) and return its exports (`main`).
 */
export function loadBundle(options = {}) {
  // the entry's "#!" line is only valid at the very start of a file
  const source = readFileSync(BUNDLE, "utf8").replace(/^#!/, "//");
  let cachedData;
  if (options.cache !== false) {
    try {
      cachedData = readFileSync(options.cache ?? cacheFor(process.argv.slice(2)));
    } catch {
      cachedData = undefined;
    }
  }
  const script = new vm.Script(`(function (exports, require, module, __filename, __dirname, __armwindDist) {"use strict";${source}\n})`, {
    filename: BUNDLE,
    cachedData,
    importModuleDynamically: vm.constants.USE_MAIN_CONTEXT_DEFAULT_LOADER,
  });
  const module = { exports: {} };
  script.runInThisContext().call(module.exports, module.exports, createRequire(BUNDLE), module, BUNDLE, dirname(BUNDLE), dirname(BUNDLE));
  return { exports: module.exports, script, cacheRejected: cachedData ? script.cachedDataRejected === true : null };
}
