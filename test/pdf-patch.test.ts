/**
 * The build's edits to what the card loads (scripts/pdf-patch.mjs): each still finds its places in
 * the installed packages (else the build stops), and a lazy table answers as the eager one does.
 * The card's bytes through the bundle equal the source's (test/bundle.process.test.ts).
 */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
// @ts-expect-error: a plain .mjs build script without types
import { PDF_PATCHES, patchPdfModule } from "../scripts/pdf-patch.mjs";

const ROOT = fileURLToPath(new URL("..", import.meta.url));
const FILES = ["node_modules/fontkit/dist/module.mjs", "node_modules/@noble/ciphers/esm/aes.js"].map((f) => join(ROOT, f));

describe("the build's edits to pdfkit's dependencies", () => {
  it("find every place they edit in the installed packages", () => {
    expect(PDF_PATCHES).toHaveLength(FILES.length);
    for (const f of FILES) {
      const text = readFileSync(f, "utf8");
      const out = patchPdfModule(text, f) as string;
      expect(out).not.toBe(text);
      expect(out).toMatch(/Made \?\?=/);
    }
  });

  it("stop the build when a package no longer reads as expected", () => {
    expect(() => patchPdfModule("export const x = 1;", FILES[0])).toThrow(/no longer reads/);
    expect(patchPdfModule("export const x = 1;", "/elsewhere/module.mjs")).toBe("export const x = 1;");
  });

  it("a lazy lookup table is made on its first use, once, and answers as the eager one", () => {
    const src = "const $ab12$var$trie = new (0, $Q$unicodetrie)(data);\nreturn [$ab12$var$trie, () => made];";
    const patched = patchPdfModule(src.repeat(1), FILES[0].replace("module.mjs", "x/module.mjs"));
    expect(patched).toBe(src); // a path no edit is for: unchanged
    const edit = PDF_PATCHES[0].edit(src) as { out: string; n: number };
    expect(edit.n).toBe(1);
    let made = 0;
    class Trie {
      constructor(readonly d: number[]) {
        made++;
      }
      get(c: number) {
        return this.d[c];
      }
    }
    const run = (code: string) => new Function("$Q$unicodetrie", "data", `let made = 0; ${code}`)(Trie, [7, 8, 9]) as [{ get(c: number): number }];
    made = 0;
    const [lazy] = run(edit.out);
    expect(made).toBe(0);
    expect([lazy.get(0), lazy.get(2)]).toEqual([7, 9]);
    expect(made).toBe(1);
    const [eager] = run(src);
    expect([eager.get(0), eager.get(2)]).toEqual([7, 9]);
  });
});
