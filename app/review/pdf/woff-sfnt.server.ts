import { inflateSync } from "node:zlib";

/**
 * WOFF 1.0 → the plain sfnt (TrueType/OpenType) it wraps, following the W3C "WOFF File Format
 * 1.0" recommendation: a 44-byte header, 20-byte table entries (tag, offset, compLength,
 * origLength, origChecksum), each table zlib-compressed when compLength < origLength.
 *
 * Why: fontkit reads a WOFF table by inflating it again on every access, so subsetting a large
 * font (DejaVu's glyf table) inflates it once per glyph and a PDF took seconds; an sfnt is read in place.
 */
export function woffToSfnt(woff: Buffer): Buffer {
  if (woff.length < 44 || woff.toString("latin1", 0, 4) !== "wOFF") throw new Error("Not a WOFF 1.0 font (the signature is not wOFF).");
  const flavor = woff.readUInt32BE(4);
  const numTables = woff.readUInt16BE(12);
  if (numTables === 0 || numTables > 100 || 44 + numTables * 20 > woff.length) throw new Error("WOFF table directory is damaged.");
  const tables: { tag: string; checksum: number; data: Buffer }[] = [];
  for (let i = 0; i < numTables; i++) {
    const at = 44 + i * 20;
    const tag = woff.toString("latin1", at, at + 4);
    const offset = woff.readUInt32BE(at + 4);
    const compLength = woff.readUInt32BE(at + 8);
    const origLength = woff.readUInt32BE(at + 12);
    const checksum = woff.readUInt32BE(at + 16);
    if (offset + compLength > woff.length) throw new Error(`WOFF table ${tag} runs past the end of the file.`);
    const raw = woff.subarray(offset, offset + compLength);
    const data = compLength < origLength ? inflateSync(raw, { maxOutputLength: origLength }) : Buffer.from(raw);
    if (data.length !== origLength) throw new Error(`WOFF table ${tag} inflates to ${data.length} bytes, not ${origLength}.`);
    tables.push({ tag, checksum, data });
  }
  tables.sort((a, b) => (a.tag < b.tag ? -1 : a.tag > b.tag ? 1 : 0));
  // sfnt offset table: version, numTables, searchRange, entrySelector, rangeShift (OpenType spec).
  const pow = 2 ** Math.floor(Math.log2(numTables));
  const head = Buffer.alloc(12 + numTables * 16);
  head.writeUInt32BE(flavor, 0);
  head.writeUInt16BE(numTables, 4);
  head.writeUInt16BE(pow * 16, 6);
  head.writeUInt16BE(Math.log2(pow), 8);
  head.writeUInt16BE(numTables * 16 - pow * 16, 10);
  const bodies: Buffer[] = [];
  let offset = head.length;
  tables.forEach((t, i) => {
    const at = 12 + i * 16;
    head.write(t.tag, at, 4, "latin1");
    head.writeUInt32BE(t.checksum, at + 4);
    head.writeUInt32BE(offset, at + 8);
    head.writeUInt32BE(t.data.length, at + 12);
    const padded = Buffer.alloc((t.data.length + 3) & ~3);
    t.data.copy(padded);
    bodies.push(padded);
    offset += padded.length;
  });
  return Buffer.concat([head, ...bodies]);
}
