import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { woffToSfnt } from './woff-to-sfnt';

const woffPath = join(dirname(require.resolve('@fontsource/inter/package.json')), 'files', 'inter-greek-400-normal.woff');

/** OpenType's table checksum: the sum of the table's big-endian uint32 words, zero-padded, mod 2^32. */
function tableChecksum(data: Buffer): number {
  const padded = Buffer.concat([data, Buffer.alloc((4 - (data.length % 4)) % 4)]);
  let sum = 0;
  for (let i = 0; i < padded.length; i += 4) sum = (sum + padded.readUInt32BE(i)) >>> 0;
  return sum;
}

describe('unpacking WOFF fonts', () => {
  const woff = readFileSync(woffPath);
  const sfnt = woffToSfnt(woff);

  it('restores every table with the checksum the WOFF directory recorded for the original font', () => {
    // W3C WOFF 1.0 §5: origChecksum is the table's checksum in the original sfnt (OpenType spec, "Calculating checksums").
    const numTables = woff.readUInt16BE(12);
    expect(sfnt.readUInt16BE(4)).toBe(numTables);
    for (let i = 0; i < numTables; i++) {
      const record = 12 + i * 16;
      const tag = sfnt.toString('latin1', record, record + 4);
      const offset = sfnt.readUInt32BE(record + 8);
      const length = sfnt.readUInt32BE(record + 12);
      if (tag === 'head') continue; // its checksum is taken with checkSumAdjustment zeroed
      expect({ tag, sum: tableChecksum(sfnt.subarray(offset, offset + length)) }).toEqual({ tag, sum: woff.readUInt32BE(44 + i * 20 + 16) });
    }
  });

  it('writes the binary-search fields of the OpenType table directory', () => {
    // OpenType spec, "Table directory": searchRange = 2^floor(log2 n)·16, entrySelector = floor(log2 n), rangeShift = n·16 − searchRange.
    const n = sfnt.readUInt16BE(4);
    const power = 2 ** Math.floor(Math.log2(n));
    expect([sfnt.readUInt16BE(6), sfnt.readUInt16BE(8), sfnt.readUInt16BE(10)]).toEqual([power * 16, Math.log2(power), n * 16 - power * 16]);
  });

  it('refuses a file that is not WOFF', () => {
    expect(() => woffToSfnt(Buffer.from('OTTO and then some bytes of another format'))).toThrow(/not a WOFF file/);
  });
});
