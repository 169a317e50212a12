import { inflateSync } from 'node:zlib';

/**
 * Unpacks a WOFF 1.0 file into the plain TrueType/OpenType font it wraps (W3C WOFF 1.0, §4–5).
 * pdfkit's font parser inflates WOFF tables in pure JavaScript for every document, which was most
 * of a report's rendering time; unpacking once per process with Node's zlib removes that cost.
 */
export function woffToSfnt(woff: Buffer): Buffer {
  if (woff.readUInt32BE(0) !== 0x774f4646) throw new Error('not a WOFF file (signature is not "wOFF")');
  const flavor = woff.readUInt32BE(4);
  const numTables = woff.readUInt16BE(12);
  const tables = Array.from({ length: numTables }, (_, i) => {
    const at = 44 + i * 20;
    const tag = woff.readUInt32BE(at);
    const offset = woff.readUInt32BE(at + 4);
    const compLength = woff.readUInt32BE(at + 8);
    const origLength = woff.readUInt32BE(at + 12);
    const checksum = woff.readUInt32BE(at + 16);
    const stored = woff.subarray(offset, offset + compLength);
    const data = compLength < origLength ? inflateSync(stored) : stored;
    if (data.length !== origLength) throw new Error(`WOFF table ${i} unpacks to ${data.length} bytes, expected ${origLength}`);
    return { tag, checksum, data };
  });
  let power = 1;
  while (power * 2 <= numTables) power *= 2;
  const headerLength = 12 + numTables * 16;
  const padded = (n: number) => (n + 3) & ~3;
  const total = tables.reduce((sum, t) => sum + padded(t.data.length), headerLength);
  const out = Buffer.alloc(total);
  out.writeUInt32BE(flavor, 0);
  out.writeUInt16BE(numTables, 4);
  out.writeUInt16BE(power * 16, 6);
  out.writeUInt16BE(Math.log2(power), 8);
  out.writeUInt16BE(numTables * 16 - power * 16, 10);
  let offset = headerLength;
  tables.forEach((t, i) => {
    const record = 12 + i * 16;
    out.writeUInt32BE(t.tag, record);
    out.writeUInt32BE(t.checksum, record + 4);
    out.writeUInt32BE(offset, record + 8);
    out.writeUInt32BE(t.data.length, record + 12);
    t.data.copy(out, offset);
    offset += padded(t.data.length);
  });
  return out;
}
