import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { inflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { woffToSfnt } from './woff';

const require = createRequire(import.meta.url);
const woff = readFileSync(require.resolve('@fontsource/public-sans/files/public-sans-latin-400-normal.woff'));

// Layouts from the W3C WOFF File Format 1.0 (header 44 bytes, directory entries 20) and the OpenType
// specification's table directory (offset table 12 bytes, records 16, tables 4-byte aligned).
describe('a WOFF font unwrapped into its plain font', () => {
  const sfnt = woffToSfnt(woff);
  const numTables = woff.readUInt16BE(12);

  it('keeps the flavor, the table count and the binary-search fields', () => {
    expect(sfnt.readUInt32BE(0)).toBe(woff.readUInt32BE(4));
    expect(sfnt.readUInt16BE(4)).toBe(numTables);
    const searchRange = sfnt.readUInt16BE(6);
    expect(searchRange).toBe(2 ** Math.floor(Math.log2(numTables)) * 16);
    expect(sfnt.readUInt16BE(10)).toBe(numTables * 16 - searchRange);
  });

  it('holds every table inflated, byte for byte, at 4-byte aligned offsets', () => {
    for (let i = 0; i < numTables; i++) {
      const w = 44 + i * 20;
      const s = 12 + i * 16;
      expect(sfnt.readUInt32BE(s)).toBe(woff.readUInt32BE(w));
      const offset = sfnt.readUInt32BE(s + 8);
      expect(offset % 4).toBe(0);
      const raw = woff.subarray(woff.readUInt32BE(w + 4), woff.readUInt32BE(w + 4) + woff.readUInt32BE(w + 8));
      const expected = woff.readUInt32BE(w + 8) < woff.readUInt32BE(w + 12) ? inflateSync(raw) : raw;
      expect(Buffer.compare(sfnt.subarray(offset, offset + sfnt.readUInt32BE(s + 12)), expected)).toBe(0);
    }
  });

  it('refuses what is not WOFF 1.0', () => {
    expect(() => woffToSfnt(sfnt)).toThrow(/not a WOFF/);
  });
});
