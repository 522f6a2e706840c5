/**
 * Changes the build makes to what the card loads, so that loading it computes no table the card
 * never reads. Unchanged behaviour: each table is made on first use, from the same data.
 *  - fontkit builds three Unicode lookup tables (inflated from base64 data) for its Arabic, Indic
 *    and universal shaping engines when its module is evaluated; the card's Latin text never
 *    reaches those engines.
 *  - @noble/ciphers computes its AES tables when its module is evaluated; pdfkit uses AES only to
 *    encrypt a PDF, which the card never asks for.
 * test/pdf-patch.test.ts checks that each edit still finds its text and that the lazy tables
 * answer as the eager ones do.
 */

/** `const X$var$trie = new (0, unicodetrie)(data)` → a table with the same `get`, made on its first call. */
function lazyTries(text) {
  const eager = /const (\$\w+\$var\$trie) = new \(0, (\$\w+\$unicodetrie)\)\(/g;
  let n = 0;
  const out = text.replace(eager, (_, name, ctor) => {
    n++;
    return `let ${name}Made; const ${name} = { get: (c) => (${name}Made ??= ${name}Make()).get(c) }; const ${name}Make = () => new (0, ${ctor})(`;
  });
  return { out, n };
}

/** `const tableEncoding = genTtable(…)` (and tableDecoding) → the same object, made on first access to any of its fields. */
function lazyAesTables(text) {
  const eager = /const (table(?:En|De)coding) = \/\* @__PURE__ \*\/ (genTtable\([^\n]*\));\n/g;
  let n = 0;
  const out = text.replace(eager, (_, name, call) => {
    n++;
    return `let ${name}Made; const ${name} = new Proxy({}, { get: (_, k) => (${name}Made ??= ${call})[k] });\n`;
  });
  return { out, n };
}

/** The edits by file: a pattern for the path, the edit, and how many places it must find. */
export const PDF_PATCHES = [
  { file: /[\\/]fontkit[\\/]dist[\\/]module\.mjs$/, edit: lazyTries, expect: 3 },
  { file: /[\\/]@noble[\\/]ciphers[\\/]esm[\\/]aes\.js$/, edit: lazyAesTables, expect: 2 },
];

/** The patched text of `path` (unchanged when no patch is for it); throws when a patched file no longer reads as expected. */
export function patchPdfModule(text, path) {
  const p = PDF_PATCHES.find((x) => x.file.test(path));
  if (!p) return text;
  const { out, n } = p.edit(text);
  if (n !== p.expect) throw new Error(`build: ${path} no longer reads as scripts/pdf-patch.mjs expects (${n} places, not ${p.expect})`);
  return out;
}
