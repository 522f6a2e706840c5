#!/usr/bin/env node
/**
 * The build (`npm run build`, and `npm install` through `prepare`):
 *  1. `tsc -p tsconfig.build.json` → dist/ (module per file; kept for tools that import the compiled modules),
 *     and the card's two fonts unpacked from WOFF into dist/card-fonts/ (src/card/fonts.ts);
 *  2. esbuild bundles the CLI into one script, dist/armwind.cjs, which bin/armwind.mjs runs:
 *     every dependency inside except what must stay on disk (see `external`); modules loaded with
 *     `await import()` (each command, the card, pdfkit) are compiled in but run only when asked;
 *     fontkit's brotli decoder (WOFF2 only; the card embeds TrueType unpacked from WOFF 1.0) is
 *     replaced by a stub that refuses WOFF2;
 *  3. V8 code caches for the bundle, made by running the commands in a process each
 *     (scripts/code-cache.mjs): dist/armwind.cjs.cache (help, plan, history) and
 *     dist/armwind.cjs.card.cache (a card); bin/armwind.mjs hands the one for its command line to
 *     vm.Script (Node 20 has no module compile cache).
 * ARMWIND_NO_CODE_CACHE=1 skips step 3.
 */
import { execFileSync } from "node:child_process";
import { readFileSync, rmSync } from "node:fs";
import { dirname, join, relative, resolve } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { patchPdfModule } from "./pdf-patch.mjs";
import { patchStringWidth } from "./string-width-patch.mjs";

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), "..");
const DIST = join(ROOT, "dist");

execFileSync(process.execPath, [join(ROOT, "node_modules/typescript/bin/tsc"), "-p", join(ROOT, "tsconfig.build.json")], { stdio: "inherit", cwd: ROOT });

// the card's fonts unpacked once here, not at every card (src/card/fonts.ts reads them when they match their WOFF files)
await (await import(pathToFileURL(join(DIST, "card/fonts.js")).href)).writeUnpackedFonts();

const esbuild = await import("esbuild");

/** `import.meta.url` of each bundled file: its own place on disk, found from the bundle's folder at run time. */
const metaUrl = {
  name: "import-meta-url",
  setup(build) {
    build.onLoad({ filter: /\.(m?[jt]s|cjs)$/ }, (args) => {
      const text = readFileSync(args.path, "utf8");
      if (!text.includes("import.meta")) return undefined;
      const rel = relative(DIST, args.path).split("\\").join("/");
      const url = `__armwindUrl(${JSON.stringify(rel)})`;
      const contents = text.replaceAll("import.meta.url", url).replaceAll("import.meta.dirname", `__armwindDir(${JSON.stringify(rel)})`);
      const ext = args.path.split(".").pop();
      return { contents, loader: ext === "ts" ? "ts" : "js", resolveDir: dirname(args.path) };
    });
  },
};

/** fontkit's brotli decoder serves WOFF2 only; the card never loads a WOFF2 font. */
const noBrotli = {
  name: "no-brotli",
  setup(build) {
    build.onResolve({ filter: /^brotli(\/decompress(\.js)?)?$/ }, () => ({ path: "brotli", namespace: "armwind-stub" }));
    build.onLoad({ filter: /.*/, namespace: "armwind-stub" }, () => ({
      contents: 'export default function decompress() { throw new Error("WOFF2 fonts are not supported (armwind embeds WOFF 1.0 and TrueType fonts)"); }',
      loader: "js",
    }));
  },
};

/** string-width, measured only for help text, evaluated without its start-up costs (scripts/string-width-patch.mjs). */
const lazyStringWidth = {
  name: "lazy-string-width",
  setup(build) {
    build.onLoad({ filter: /[\\/]string-width[\\/]index\.js$/ }, (args) => ({
      contents: patchStringWidth(readFileSync(args.path, "utf8"), args.path),
      loader: "js",
      resolveDir: dirname(args.path),
    }));
  },
};

/** fontkit's shaping tables and the AES tables, made on first use (scripts/pdf-patch.mjs). */
const lazyPdfTables = {
  name: "lazy-pdf-tables",
  setup(build) {
    build.onLoad({ filter: /[\\/](fontkit[\\/]dist[\\/]module\.mjs|@noble[\\/]ciphers[\\/]esm[\\/]aes\.js)$/ }, (args) => ({
      contents: patchPdfModule(readFileSync(args.path, "utf8"), args.path),
      loader: "js",
      resolveDir: dirname(args.path),
    }));
  },
};

for (const f of ["armwind.cjs.cache", "armwind.cjs.card.cache"]) rmSync(join(DIST, f), { force: true });
const result = await esbuild.build({
  entryPoints: [join(ROOT, "src/cli/main.ts")],
  outfile: join(DIST, "armwind.cjs"),
  bundle: true,
  platform: "node",
  target: "node20",
  format: "cjs",
  plugins: [lazyStringWidth, lazyPdfTables, metaUrl, noBrotli],
  logLevel: "warning",
  legalComments: "none",
  minifyWhitespace: true,
  // a file's own place from the bundle's folder (a module's local `require` may shadow the bundle's, so these are named apart)
  // (function declarations at the end, so that "use strict" stays the bundle's first statement)
  footer: {
    js: [
      'function __armwindUrl(rel) { return require("node:url").pathToFileURL(require("node:path").join(__armwindDist, rel)).href; }',
      'function __armwindDir(rel) { return require("node:path").dirname(require("node:path").join(__armwindDist, rel)); }',
    ].join("\n"),
  },
  metafile: true,
});
const bytes = result.metafile.outputs[relative(ROOT, join(DIST, "armwind.cjs"))]?.bytes;

if (process.env.ARMWIND_NO_CODE_CACHE !== "1") {
  for (const which of ["main", "card"]) execFileSync(process.execPath, [join(ROOT, "scripts/code-cache.mjs"), which], { stdio: "inherit", cwd: ROOT });
}
console.log(`build: dist/ (tsc) and dist/armwind.cjs (${bytes ? (bytes / 1024).toFixed(0) + " KiB" : "bundle"})`);
