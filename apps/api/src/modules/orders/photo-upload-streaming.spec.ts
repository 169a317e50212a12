import request from 'supertest';
import { useTestApp } from '../../testing';
import { startUpload, useOwnUploadFolder, withListeningApp } from '../../testing/upload-folders';
import { CONCURRENT_PHOTO_UPLOADS_PER_CLIENT } from './client-ordering.router';

jest.setTimeout(60_000);

const uploads = useOwnUploadFolder();
const t = useTestApp();

// The smallest valid PNG (1×1 pixel), so the photo check sees a real image signature.
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');
/** A PNG signature followed by 3 MB of varied bytes. */
const BIG_PNG = Buffer.concat([PNG, Buffer.from(Array.from({ length: 3 * 1048576 }, (_, i) => (i * 31 + 7) % 251))]);
const HALF_MB = 512 * 1024;

const admin = () => t.authFor('client-admin');
const productCount = async (): Promise<number> => (await t.db.query('SELECT count(*)::int AS n FROM product'))[0].n;

/** Starts registering a product with a label photo, sending its first megabyte; the rest goes with `finish`. */
async function startProduct(port: number, name: string, photo: Buffer, fileName: string, auth?: Record<string, string>) {
  const upload = startUpload(port, { path: '/api/client/products', headers: auth ?? (await admin()), fields: { name, matrix: 'wine' }, field: 'photo', fileName, contentType: 'image/png' });
  const first = Math.min(photo.length, 1048576);
  await upload.send(photo.subarray(0, first));
  return { ...upload, finish: async () => (await upload.send(photo.subarray(first)), upload.finish()) };
}

describe('label photos', () => {
  it('are written to a private folder as they arrive, stored byte for byte, and the folder is gone after the answer', async () => {
    const res = await withListeningApp(t.app, async (port) => {
      const upload = await startProduct(port, 'Streamed Label (demo)', BIG_PNG, 'label.png');
      await uploads.until(() => uploads.bytesOnDisk().some((n) => n >= HALF_MB), 'the photo’s first half megabyte is on disk');
      return upload.finish();
    });
    expect(res.status).toBe(201);
    const photo = await request(t.app).get(`/api/client/products/${res.body?.id}/photo`).set(await t.authFor('client-member')).buffer(true).parse((r, done) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(photo.headers['content-type']).toBe('image/png');
    expect(Buffer.compare(photo.body as Buffer, BIG_PNG)).toBe(0);
    expect(await uploads.leftAfterAnswer()).toEqual([]);
  });

  it('that are not PNG or JPEG, or too large, are refused as before, leaving no folder and no product', async () => {
    const before = await productCount();
    const gif = Buffer.concat([Buffer.from('GIF89a\x01\x00\x01\x00'), Buffer.alloc(2 * 1048576, 7)]);
    const refused = await withListeningApp(t.app, async (port) => {
      const upload = await startProduct(port, 'Gif Label (demo)', gif, 'label.gif');
      await uploads.until(() => uploads.bytesOnDisk().some((n) => n >= HALF_MB), 'the GIF’s first half megabyte is on disk');
      return upload.finish();
    });
    expect(refused.status).toBe(415);
    expect(refused.body?.detail).toContain('label.gif is not a PNG or JPEG image');
    expect(await uploads.leftAfterAnswer()).toEqual([]);
    const big = await request(t.app).post('/api/client/products').set(await admin())
      .field('name', 'Huge Label (demo)').field('matrix', 'wine').attach('photo', Buffer.concat([PNG, Buffer.alloc(5 * 1048576)]), 'huge.png');
    expect(big.status).toBe(413);
    expect(big.body.detail).toContain('larger than 5 MB');
    expect(await uploads.leftAfterAnswer()).toEqual([]);
    expect(await productCount()).toBe(before);
  });

  it('are taken two per client organisation at a time: a third is told to try again while another organisation’s photo goes through', async () => {
    await withListeningApp(t.app, async (port) => {
      const held = [];
      for (let i = 0; i < CONCURRENT_PHOTO_UPLOADS_PER_CLIENT; i++) held.push(await startProduct(port, `Held Label ${i} (demo)`, BIG_PNG, `held-${i}.png`));
      await uploads.until(() => uploads.folders().length === CONCURRENT_PHOTO_UPLOADS_PER_CLIENT, 'both held photos are being received');

      const third = await request(t.app).post('/api/client/products').set(await admin()).field('name', 'Third Label (demo)').field('matrix', 'wine').attach('photo', PNG, 'third.png');
      expect(third.status).toBe(429);
      expect(third.headers['retry-after']).toBe('2');
      expect(third.body.detail).toContain(`At most ${CONCURRENT_PHOTO_UPLOADS_PER_CLIENT} photo uploads of one client organisation`);

      const otherOrganisation = await request(t.app).post('/api/client/products').set(await t.authFor('client-admin', 'marlow'))
        .field('name', 'Other Organisation Label (demo)').field('matrix', 'wine').attach('photo', PNG, 'other.png');
      expect(otherOrganisation.status).toBe(201);
      // a product registered without a photo (JSON) is no upload and is not held back
      expect((await request(t.app).post('/api/client/products').set(await admin()).send({ name: 'No Photo Label (demo)', matrix: 'wine' })).status).toBe(201);

      expect((await Promise.all(held.map((h) => h.finish()))).map((r) => r.status)).toEqual(held.map(() => 201));
    });
    // with the held photos stored, the organisation may upload again
    const again = await request(t.app).post('/api/client/products').set(await admin()).field('name', 'Again Label (demo)').field('matrix', 'wine').attach('photo', PNG, 'again.png');
    expect(again.status).toBe(201);
    expect(await uploads.leftAfterAnswer()).toEqual([]);
  });
});
