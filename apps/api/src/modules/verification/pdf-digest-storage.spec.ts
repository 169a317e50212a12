import { createHash } from 'node:crypto';
import { PassThrough } from 'node:stream';
import type { Request } from 'express';
import { claimedNumberIn, pdfDigestStorage, type PdfDigest } from './pdf-digest-storage';

/** The digest of `bytes` sent through the storage engine in chunks of `chunk` bytes. */
function digestOf(bytes: Buffer, chunk: number): Promise<PdfDigest> {
  const stream = new PassThrough();
  const done = new Promise<PdfDigest>((resolve, reject) =>
    pdfDigestStorage()._handleFile({} as Request, { stream } as unknown as Express.Multer.File, (err, info) => (err ? reject(err) : resolve((info as { digest: PdfDigest }).digest))),
  );
  for (let i = 0; i < bytes.length; i += chunk) stream.write(bytes.subarray(i, i + chunk));
  stream.end();
  return done;
}

describe('hashing an uploaded PDF as it streams in', () => {
  // A signed report's reason, somewhere in the middle of a larger file.
  const body = Buffer.concat([Buffer.from('%PDF-1.7\n'), Buffer.alloc(3000, 'a'), Buffer.from('/Reason (Test report CAL-2026-00042)'), Buffer.alloc(2000, 'b')]);

  it('gives the same SHA-256 and report number however the bytes are split', async () => {
    const whole = { sha256: createHash('sha256').update(body).digest('hex'), claimedNumber: claimedNumberIn(body.toString('latin1')) };
    expect(whole.claimedNumber).toBe('CAL-2026-00042');
    // Every chunk size from 1 to 64 bytes, so the reason falls across a boundary at every offset.
    for (let chunk = 1; chunk <= 64; chunk++) {
      expect(await digestOf(body, chunk)).toEqual({ size: body.length, sha256: whole.sha256, startsLikePdf: true, claimedNumber: 'CAL-2026-00042' });
    }
    expect((await digestOf(body, 65536)).claimedNumber).toBe('CAL-2026-00042');
  });

  it('says when a file does not start like a PDF, or names no report, even split in one-byte chunks', async () => {
    expect(await digestOf(Buffer.from('%PD'), 1)).toMatchObject({ startsLikePdf: false, claimedNumber: null, size: 3 });
    expect(await digestOf(Buffer.from('hello %PDF- world'), 2)).toMatchObject({ startsLikePdf: false });
    expect(await digestOf(Buffer.concat([Buffer.from('%PDF-'), Buffer.alloc(5, 0)]), 1)).toMatchObject({ startsLikePdf: true, claimedNumber: null });
  });
});
