/**
 * The build's fast path for string-width (scripts/string-width-patch.mjs) answers "as wide as its
 * length" for strings of `ONE_COLUMN` characters without segmenting them. Checked here against each
 * unpatched copy in the bundle (yargs', cliui's and wrap-ansi's string-width, the reference): every
 * such character is one column, and so is each character of random strings of them.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { existsSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
// @ts-expect-error: a plain .mjs build script without types
import { ONE_COLUMN, patchStringWidth } from "../scripts/string-width-patch.mjs";

const ROOT = fileURLToPath(new URL("..", import.meta.url));
/** Each copy's index.js, where npm put it (the build bundles these three). */
const COPIES = ["node_modules/string-width", "node_modules/cliui/node_modules/string-width", "node_modules/wrap-ansi/node_modules/string-width"].map((d) =>
  join(ROOT, d, "index.js"),
);

const oneColumn = new RegExp(ONE_COLUMN as string);
const members: string[] = [];
for (let c = 0; c < 0x10000; c++) if (oneColumn.test(String.fromCharCode(c))) members.push(String.fromCharCode(c));

describe("string-width's fast path keeps every width", () => {
  for (const file of COPIES) {
    it(`every one-column character is one column in ${file.replace(/.*node_modules\//, "")}`, async () => {
      const width = (await import(pathToFileURL(file).href)).default as (s: string) => number;
      expect(existsSync(file)).toBe(true);
      expect(members.length).toBeGreaterThan(1000);
      expect(members.filter((ch) => width(ch) !== 1).map((ch) => ch.codePointAt(0)?.toString(16))).toEqual([]);
      fc.assert(
        fc.property(fc.array(fc.constantFrom(...members), { minLength: 1, maxLength: 40 }), (chars) => width(chars.join("")) === chars.length),
        { numRuns: 2000 },
      );
    });
  }

  it("the characters that emoji-regex reads as emoji are left to the full path", () => {
    for (const ch of ["©", "®", "‼", "⁉", "↔", "↩", "\u00ad", "\u0301", "中"]) expect(oneColumn.test(ch), ch).toBe(false);
  });

  it("a copy that no longer reads as expected stops the build", () => {
    expect(() => patchStringWidth("export default function stringWidth() {}", "x/index.js")).toThrow(/no longer reads/);
  });
});
