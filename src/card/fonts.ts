/**
 * The card's fonts: DejaVu Sans regular and bold from @fontsource/dejavu-sans (WOFF 1.0 files),
 * unpacked once into plain TrueType (sfnt) buffers. pdfkit's font engine reads WOFF tables
 * lazily and inflates them again on every new glyph, which made a card take seconds; the unpacked
 * buffers give the same glyphs at once. WOFF 1.0 layout: W3C "WOFF File Format 1.0" (2012),
 * sections 3–5 (header, table directory, zlib-compressed tables).
 */
import { createRequire } from "node:module";
import { mkdirSync, readFileSync, rmSync, statSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { inflateSync } from "node:zlib";

const require = createRequire(import.meta.url);

/** DejaVu Sans (Bitstream Vera licence) carries Ω, °, ±, ², ×, − and the arrows the card prints. */
export const FONT_FILES = {
  regular: require.resolve("@fontsource/dejavu-sans/files/dejavu-sans-latin-400-normal.woff"),
  bold: require.resolve("@fontsource/dejavu-sans/files/dejavu-sans-latin-700-normal.woff"),
};

/**
 * Unpack a WOFF 1.0 file into the sfnt (TrueType/OpenType) it wraps, less the tables in `drop`
 * and, with `glyphNames: false`, the glyph names of its 'post' table; anything else is returned unchanged.
 */
export function woffToSfnt(woff: Buffer, drop: readonly string[] = [], opts: { glyphNames?: boolean } = {}): Buffer {
  if (woff.length < 44 || woff.toString("latin1", 0, 4) !== "wOFF") return woff;
  const flavor = woff.readUInt32BE(4);
  const stored = woff.readUInt16BE(12);
  const tables: { tag: string; checksum: number; data: Buffer }[] = [];
  for (let i = 0; i < stored; i++) {
    const at = 44 + i * 20;
    const tag = woff.toString("latin1", at, at + 4);
    const offset = woff.readUInt32BE(at + 4);
    const compLength = woff.readUInt32BE(at + 8);
    const origLength = woff.readUInt32BE(at + 12);
    const checksum = woff.readUInt32BE(at + 16);
    const raw = woff.subarray(offset, offset + compLength);
    const data = compLength < origLength ? inflateSync(raw) : Buffer.from(raw);
    if (data.length !== origLength) throw new Error(`internal error: WOFF table ${tag} unpacks to ${data.length} bytes, not ${origLength}`);
    if (drop.includes(tag)) continue;
    if (tag === "post" && opts.glyphNames === false && data.length > POST_HEADER && data.readUInt32BE(0) === 0x00020000) {
      const post = postWithoutNames(data);
      tables.push({ tag, checksum: tableChecksum(post), data: post });
    } else tables.push({ tag, checksum, data });
  }
  const numTables = tables.length;
  tables.sort((a, b) => (a.tag < b.tag ? -1 : a.tag > b.tag ? 1 : 0));
  const pad4 = (n: number) => (n + 3) & ~3;
  const headerLen = 12 + 16 * numTables;
  const total = headerLen + tables.reduce((s, t) => s + pad4(t.data.length), 0);
  const out = Buffer.alloc(total);
  let p2 = 1;
  let log = 0;
  while (p2 * 2 <= numTables) {
    p2 *= 2;
    log++;
  }
  out.writeUInt32BE(flavor, 0);
  out.writeUInt16BE(numTables, 4);
  out.writeUInt16BE(p2 * 16, 6);
  out.writeUInt16BE(log, 8);
  out.writeUInt16BE(numTables * 16 - p2 * 16, 10);
  let offset = headerLen;
  tables.forEach((t, i) => {
    const rec = 12 + i * 16;
    out.write(t.tag, rec, 4, "latin1");
    out.writeUInt32BE(t.checksum, rec + 4);
    out.writeUInt32BE(offset, rec + 8);
    out.writeUInt32BE(t.data.length, rec + 12);
    t.data.copy(out, offset);
    offset += pad4(t.data.length);
  });
  return out;
}

/** The 'post' table's header: version, italic angle, underline position and thickness, fixed pitch, four memory hints (OpenType spec, 'post'). */
const POST_HEADER = 32;

/**
 * A 'post' table of version 2.0 cut to its header as version 3.0, which names no glyphs. The card
 * reads only the header (italic angle, fixed pitch); the names (every glyph's, read whole by the
 * font engine on first use of the table) cost a tenth of a card, and no table of the embedded
 * subset is made from them.
 */
function postWithoutNames(post: Buffer): Buffer {
  const out = Buffer.from(post.subarray(0, POST_HEADER));
  out.writeUInt32BE(0x00030000, 0);
  return out;
}

/** A table's checksum: the sum of its big-endian 32-bit words, zero-padded, modulo 2^32 (OpenType spec, "Calculating checksums"). */
function tableChecksum(data: Buffer): number {
  let sum = 0;
  for (let i = 0; i < data.length; i += 4) {
    const word = (data[i] << 24) | ((data[i + 1] ?? 0) << 16) | ((data[i + 2] ?? 0) << 8) | (data[i + 3] ?? 0);
    sum = (sum + (word >>> 0)) >>> 0;
  }
  return sum;
}

/**
 * OpenType layout tables the card does without: glyph substitution and positioning (ligatures,
 * mark placement, kerning). The card prints Latin text, numbers and symbols that need none of
 * them, and setting them up for every text run was a fifth of the time a card takes.
 */
export const SHAPING_TABLES = ["GSUB", "GPOS", "GDEF", "kern"];

let fonts: { regular: Buffer; bold: Buffer } | null = null;

type Weight = keyof typeof FONT_FILES;

/** The card's font of `weight` unpacked from its WOFF file: what `cardFonts` gives. */
export const unpackFont = (weight: Weight): Buffer => woffToSfnt(readFileSync(FONT_FILES[weight]), SHAPING_TABLES, { glyphNames: false });

/** Where the build keeps the unpacked fonts (scripts/build.mjs), beside the bundle. */
export const UNPACKED_DIR = fileURLToPath(new URL("../../dist/card-fonts/", import.meta.url));

/** The unpacked font's file for the WOFF file as it is now: named by the WOFF's size and modification time, so a changed WOFF is never matched. */
function unpackedFile(weight: Weight): string {
  const st = statSync(FONT_FILES[weight]);
  return join(UNPACKED_DIR, `${weight}-${st.size}-${Math.round(st.mtimeMs)}.ttf`);
}

/** Write both unpacked fonts for the build (the folder emptied first); returns the files. */
export function writeUnpackedFonts(): string[] {
  rmSync(UNPACKED_DIR, { recursive: true, force: true });
  mkdirSync(UNPACKED_DIR, { recursive: true });
  return (Object.keys(FONT_FILES) as Weight[]).map((w) => {
    const file = unpackedFile(w);
    writeFileSync(file, unpackFont(w));
    return file;
  });
}

/**
 * The two fonts as sfnt buffers, once per process: read as the build unpacked them when it did so
 * from the same WOFF files (unpacking both is about 15 ms of every card), else unpacked here.
 * test/card-layout.test.ts checks that the build's files are what unpacking gives.
 */
export function cardFonts(): { regular: Buffer; bold: Buffer } {
  if (!fonts) {
    const load = (w: Weight) => {
      try {
        return readFileSync(unpackedFile(w));
      } catch {
        return unpackFont(w); // not built, or built from another WOFF
      }
    };
    fonts = { regular: load("regular"), bold: load("bold") };
  }
  return fonts;
}
