/**
 * WOFF 1.0 → SFNT (TrueType/OpenType) in memory, with node's native zlib.
 *
 * Why: fontkit reads a WOFF by inflating a table with a JavaScript inflater every time the table is
 * read, which made a card take seconds; an SFNT buffer is read directly. Format: W3C "WOFF File
 * Format 1.0" (Recommendation, 2012), sections 3–5; SFNT offset table per the OpenType spec.
 */
import { inflateSync } from "node:zlib";

export function woffToSfnt(woff: Buffer): Buffer {
  if (woff.toString("latin1", 0, 4) !== "wOFF") throw new Error("not a WOFF 1.0 font");
  const flavor = woff.readUInt32BE(4);
  const numTables = woff.readUInt16BE(12);
  const tables: { tag: Buffer; checksum: number; data: Buffer }[] = [];
  for (let i = 0; i < numTables; i++) {
    const e = 44 + i * 20;
    const tag = woff.subarray(e, e + 4);
    const offset = woff.readUInt32BE(e + 4);
    const compLength = woff.readUInt32BE(e + 8);
    const origLength = woff.readUInt32BE(e + 12);
    const checksum = woff.readUInt32BE(e + 16);
    const raw = woff.subarray(offset, offset + compLength);
    const data = compLength < origLength ? inflateSync(raw) : Buffer.from(raw);
    if (data.length !== origLength) throw new Error(`WOFF table ${tag.toString("latin1")} inflates to ${data.length} bytes, expected ${origLength}`);
    tables.push({ tag, checksum, data });
  }
  // OpenType offset table: searchRange = 16·2^⌊log2 n⌋, entrySelector = ⌊log2 n⌋, rangeShift = 16·n − searchRange
  const entrySelector = Math.floor(Math.log2(numTables));
  const searchRange = 16 * 2 ** entrySelector;
  const headerLength = 12 + 16 * numTables;
  let size = headerLength;
  for (const t of tables) size += (t.data.length + 3) & ~3;
  const out = Buffer.alloc(size);
  out.writeUInt32BE(flavor, 0);
  out.writeUInt16BE(numTables, 4);
  out.writeUInt16BE(searchRange, 6);
  out.writeUInt16BE(entrySelector, 8);
  out.writeUInt16BE(numTables * 16 - searchRange, 10);
  let offset = headerLength;
  tables.forEach((t, i) => {
    const r = 12 + i * 16;
    t.tag.copy(out, r);
    out.writeUInt32BE(t.checksum, r + 4);
    out.writeUInt32BE(offset, r + 8);
    out.writeUInt32BE(t.data.length, r + 12);
    t.data.copy(out, offset);
    offset += (t.data.length + 3) & ~3;
  });
  return out;
}
