/**
 * Changes the build makes to string-width (three copies in the bundle: yargs, cliui and wrap-ansi
 * each pin their own), which yargs uses only to lay out help text. Unchanged widths, less start-up:
 *  - its Intl.Segmenter (ICU's break rules, about 17 ms for the first) and yargs' copy's RGI emoji
 *    expression (about 19 ms to compile) are made on first use, not when the module is evaluated;
 *  - a string made only of characters one column wide in every copy (`ONE_COLUMN`: printable
 *    ASCII and Latin-1 without the soft hyphen, © and ®; Latin extended; Greek capitals and small
 *    letters; general punctuation, arrows, mathematical operators and box drawing less the few
 *    that emoji-regex reads as emoji) is as wide as its length, without segmenting it: help text
 *    (Ω, …, –, ×, °) then never loads the segmenter at all. test/string-width-patch.test.ts checks
 *    every such character and random strings of them against the unpatched copies.
 */
export const ONE_COLUMN =
  "^[\\u0020-\\u007E\\u00A0-\\u00A8\\u00AA-\\u00AC\\u00AF-\\u02FF\\u0391-\\u03A1\\u03A3-\\u03A9\\u03B1-\\u03C9\\u2010-\\u2027\\u2030-\\u203B\\u203D-\\u2048\\u204A-\\u205E\\u2190-\\u2193\\u219A-\\u21A8\\u21AB-\\u22FF\\u2500-\\u257F]*$";

const EDITS = [
  {
    eager: "const segmenter = new Intl.Segmenter();",
    lazy: "let segmenterMade; const segmenter = { segment: (s) => (segmenterMade ??= new Intl.Segmenter()).segment(s) };",
    everyCopy: true,
  },
  {
    eager: "const rgiEmojiRegex = /^\\p{RGI_Emoji}$/v;",
    lazy: 'let rgiEmojiMade; const rgiEmojiRegex = { test: (s) => (rgiEmojiMade ??= new RegExp("^\\\\p{RGI_Emoji}$", "v")).test(s) };',
    everyCopy: false,
  },
  {
    // after ANSI escapes are stripped and the empty string answered
    eager: "if (string.length === 0) {\n\t\treturn 0;\n\t}\n",
    lazy: `if (string.length === 0) {\n\t\treturn 0;\n\t}\n\tif (ambiguousIsNarrow && /${ONE_COLUMN}/.test(string)) {\n\t\treturn string.length;\n\t}\n`,
    everyCopy: true,
  },
];

/** The patched text of a string-width `index.js`; throws when a copy no longer reads as expected. */
export function patchStringWidth(text, path) {
  for (const e of EDITS) {
    if (!text.includes(e.eager)) {
      if (e.everyCopy) throw new Error(`build: ${path} no longer reads as scripts/string-width-patch.mjs expects (${e.eager.split("\n")[0]})`);
      continue;
    }
    text = text.replace(e.eager, e.lazy);
  }
  return text;
}
