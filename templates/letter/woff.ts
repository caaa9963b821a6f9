import { inflateSync } from 'node:zlib';

/**
 * A WOFF 1.0 font unwrapped into the plain TrueType/OpenType font inside it (W3C WOFF File Format
 * 1.0, sections 3–5): the same tables, inflated. pdfkit reads WOFF through fontkit, which inflates
 * the whole `glyf` table again for every glyph it copies into a document's subset; handed the plain
 * font, it copies bytes. The letter then renders in a few milliseconds instead of hundreds
 * (bench/letter-pdf.ts). Metadata and private blocks are not part of the font and are dropped.
 */
export function woffToSfnt(woff: Buffer): Buffer {
  if (woff.readUInt32BE(0) !== 0x774f4646) throw new Error('not a WOFF 1.0 font');
  const flavor = woff.readUInt32BE(4);
  const numTables = woff.readUInt16BE(12);
  const tables = Array.from({ length: numTables }, (_, i) => {
    const at = 44 + i * 20;
    const offset = woff.readUInt32BE(at + 4);
    const compLength = woff.readUInt32BE(at + 8);
    const origLength = woff.readUInt32BE(at + 12);
    const raw = woff.subarray(offset, offset + compLength);
    const data = compLength < origLength ? inflateSync(raw) : raw;
    if (data.length !== origLength) throw new Error('WOFF table of the wrong length');
    return { tag: woff.readUInt32BE(at), checksum: woff.readUInt32BE(at + 16), data };
  });
  // The offset table's binary-search fields (OpenType spec, "Table Directory").
  const entrySelector = Math.floor(Math.log2(numTables));
  const searchRange = 2 ** entrySelector * 16;
  const headerLength = 12 + numTables * 16;
  const padded = (n: number) => (n + 3) & ~3;
  const out = Buffer.alloc(headerLength + tables.reduce((sum, t) => sum + padded(t.data.length), 0));
  out.writeUInt32BE(flavor, 0);
  out.writeUInt16BE(numTables, 4);
  out.writeUInt16BE(searchRange, 6);
  out.writeUInt16BE(entrySelector, 8);
  out.writeUInt16BE(numTables * 16 - searchRange, 10);
  let offset = headerLength;
  tables.forEach((t, i) => {
    const at = 12 + i * 16;
    out.writeUInt32BE(t.tag, at);
    out.writeUInt32BE(t.checksum, at + 4);
    out.writeUInt32BE(offset, at + 8);
    out.writeUInt32BE(t.data.length, at + 12);
    t.data.copy(out, offset);
    offset += padded(t.data.length);
  });
  return out;
}
