import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { demoFiles } from '../../../../../docker-free-scripts/seed/lab-demo-files';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { approveAndIssue, useTestApp } from '../../testing';
import { addCredits, creditBalance, removeCredits } from '../credits/credit-ledger';

// Seeding the demo libraries and running a whole analysis take seconds on a busy two-core machine.
jest.setTimeout(90_000);

const t = useTestApp();
const CODE = /^OP-[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{2}$/;
// The smallest valid PNG (1×1 pixel), so the photo check sees a real image signature.
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');

let scope: { labId: string; clientOrganisationId: string };
let ridgeline: string;

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  const [row] = await t.db.query(
    `SELECT cm.lab_id, cm.client_organisation_id FROM client_membership cm JOIN app_user u ON u.id = cm.user_id WHERE u.email = 'admin@hollinridge.test'`,
  );
  scope = { labId: row.lab_id, clientOrganisationId: row.client_organisation_id };
  [{ id: ridgeline }] = await t.db.query(`SELECT id FROM product WHERE name = 'Ridgeline Red (demo)'`);
});

const admin = () => t.authFor('client-admin');
const balance = () => creditBalance(t.db.manager, scope);
/** Sets the organisation's spendable credits to exactly `n` through the ledger, as a lab admin's adjustment would. */
async function holdExactly(n: number): Promise<void> {
  const { available } = await balance();
  if (available < n) await t.db.transaction((m) => addCredits(m, scope, n - available, 'adjustment', { reason: 'Test set-up', actorUserId: null }));
  if (available > n) await t.db.transaction((m) => removeCredits(m, scope, available - n, 'adjustment', { reason: 'Test set-up', actorUserId: null }));
}
const oneSample = (extra: Record<string, unknown> = {}) => ({
  obtainedWhere: 'Corner shop, Harbour Street (invented)',
  obtainedOn: '2026-11-20',
  labelText: 'Ridgeline Red 2023, 750 mL',
  lotClaimed: 'L24-140',
  notes: '',
  ...extra,
});
const placeCheck = async (samples = [oneSample()]) =>
  request(t.app).post('/api/client/orders').set(await admin()).send({ productId: ridgeline, samples });
const ledgerFor = (orderId: string) =>
  t.db.query('SELECT kind, available_change, reserved_change, sample_id FROM credit_ledger_entry WHERE order_id = $1 ORDER BY entry_no', [orderId]);
const arrival = {
  carrier: 'Invented Courier Co.',
  trackingNumber: 'INV-1',
  arrivedAt: new Date(Date.now() - 60_000).toISOString(),
  temperatureC: 7,
  sealIntact: true,
  containerCondition: 'intact',
  volumeMl: 750,
};

describe('products', () => {
  it('registers a product with a label photo, says it has no library yet, and edits it', async () => {
    const created = await request(t.app).post('/api/client/products').set(await admin())
      .field('name', 'Harbour Verjuice (demo)').field('matrix', 'other-liquid').field('description', 'Pressed from unripe grapes')
      .attach('photo', PNG, 'label.png');
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Harbour Verjuice (demo)', matrix: 'other-liquid', libraryState: 'none', hasPhoto: true, publishedLibraryVersion: null });
    const photo = await request(t.app).get(`/api/client/products/${created.body.id}/photo`).set(await t.authFor('client-member'));
    expect(photo.status).toBe(200);
    expect(photo.headers['content-type']).toBe('image/png');

    const edited = await request(t.app).put(`/api/client/products/${created.body.id}`).set(await admin())
      .send({ name: 'Harbour Verjuice, white (demo)', matrix: 'vinegar', description: '' });
    expect(edited.body).toMatchObject({ name: 'Harbour Verjuice, white (demo)', matrix: 'vinegar', hasPhoto: true });
    const again = await request(t.app).post('/api/client/products').set(await admin()).send({ name: 'harbour verjuice, WHITE (demo)', matrix: 'wine' });
    expect(again.status).toBe(409);
    expect(again.body.errors).toEqual([{ field: 'name', message: 'is already used by another product' }]);
  });

  it('shows a product with a published library as such', async () => {
    const list = await request(t.app).get('/api/client/products?q=Ridgeline').set(await admin());
    expect(list.body.items[0]).toMatchObject({ libraryState: 'published', publishedLibraryVersion: { version: expect.any(Number) } });
  });

  it('refuses a label photo that is not PNG or JPEG, or too large, and saves nothing', async () => {
    const before = (await t.db.query('SELECT count(*)::int AS n FROM product'))[0].n;
    const gif = await request(t.app).post('/api/client/products').set(await admin())
      .field('name', 'Gif Label (demo)').field('matrix', 'wine').attach('photo', Buffer.from('GIF89a\x01\x00\x01\x00'), 'label.gif');
    expect(gif.status).toBe(415);
    expect(gif.body.detail).toContain('label.gif is not a PNG or JPEG image');
    const huge = Buffer.concat([PNG, Buffer.alloc(5 * 1048576)]);
    const big = await request(t.app).post('/api/client/products').set(await admin())
      .field('name', 'Huge Label (demo)').field('matrix', 'wine').attach('photo', huge, 'huge.png');
    expect(big.status).toBe(413);
    expect(big.body.detail).toContain('larger than 5 MB');
    expect((await t.db.query('SELECT count(*)::int AS n FROM product'))[0].n).toBe(before);
  });

  it('refuses NUL bytes, huge strings and unknown matrices with the field named', async () => {
    const nul = await request(t.app).post('/api/client/products').set(await admin()).send({ name: 'Bad\u0000Name', matrix: 'wine' });
    expect(nul.status).toBe(400);
    expect(nul.body.errors[0].field).toBe('name');
    const long = await request(t.app).post('/api/client/products').set(await admin()).send({ name: 'x'.repeat(100_000), matrix: 'wine' });
    expect(long.status).toBeGreaterThanOrEqual(400);
    expect(long.status).toBeLessThan(500);
    const matrix = await request(t.app).post('/api/client/products').set(await admin()).send({ name: 'Odd (demo)', matrix: 'lava' });
    expect(matrix.status).toBe(400);
    expect(matrix.body.errors[0].field).toBe('matrix');
  });

  it('lets a client member read products but not register or edit them; another lab’s client sees none of them', async () => {
    const member = await t.authFor('client-member');
    expect((await request(t.app).get('/api/client/products').set(member)).status).toBe(200);
    expect((await request(t.app).post('/api/client/products').set(member).send({ name: 'Member (demo)', matrix: 'wine' })).status).toBe(403);
    expect((await request(t.app).put(`/api/client/products/${ridgeline}`).set(member).send({ name: 'X', matrix: 'wine' })).status).toBe(403);
    expect((await request(t.app).post('/api/client/products').set(await t.authFor('analyst')).send({ name: 'Lab (demo)', matrix: 'wine' })).status).toBe(403);
    const other = await t.authFor('client-admin', 'marlow');
    expect((await request(t.app).put(`/api/client/products/${ridgeline}`).set(other).send({ name: 'Taken', matrix: 'wine' })).status).toBe(404);
    expect((await request(t.app).get(`/api/client/products/${ridgeline}/photo`).set(other)).status).toBe(404);
  });
});

describe('check orders', () => {
  it('refuses checks of a product without a published library, saying so', async () => {
    await holdExactly(5);
    const created = await request(t.app).post('/api/client/products').set(await admin()).send({ name: 'Unlibraried Rosé (demo)', matrix: 'wine' });
    const res = await request(t.app).post('/api/client/orders').set(await admin()).send({ productId: created.body.id, samples: [oneSample()] });
    expect(res.status).toBe(409);
    expect(res.body.type).toBe('urn:ohmprint:problem:no-published-library');
    expect(res.body.detail).toContain('has no published reference library yet');
    expect(await balance()).toMatchObject({ available: 5 });
  });

  it('refuses an order the credits cannot cover, naming the shortfall, and keeps nothing', async () => {
    await holdExactly(1);
    const orders = (await t.db.query('SELECT count(*)::int AS n FROM test_order'))[0].n;
    const res = await placeCheck([oneSample(), oneSample(), oneSample()]);
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({ type: 'urn:ohmprint:problem:insufficient-credits', needed: 3, available: 1, shortfall: 2 });
    expect((await t.db.query('SELECT count(*)::int AS n FROM test_order'))[0].n).toBe(orders);
    expect(await balance()).toMatchObject({ available: 1 });
  });

  it('runs the whole lifecycle: placed with credits held per sample, shipped, received, reported, credit spent', async () => {
    await holdExactly(3);
    const before = await balance();
    const placed = await placeCheck();
    expect(placed.status).toBe(201);
    const order = placed.body;
    expect(order).toMatchObject({ status: 'placed', kind: 'check', creditsReserved: 1, shipment: null });
    const [sample] = order.samples;
    expect(sample.code).toMatch(CODE);
    expect(sample).toMatchObject({ kind: 'check', credits: 1, creditState: 'reserved', description: { claimedLot: 'L24-140' } });
    expect(await balance()).toEqual({ available: before.available - 1, reserved: before.reserved + 1 });
    expect(await ledgerFor(order.id)).toEqual([{ kind: 'reserve', available_change: -1, reserved_change: 1, sample_id: sample.id }]);
    const mails: { to_address: string; html_body: string; reply_to: string | null }[] = await t.db.query(
      `SELECT to_address, html_body, reply_to FROM email_outbox WHERE subject LIKE 'Order placed%' AND text_body LIKE $1`, [`%${sample.code}%`]);
    const mail = mails.find((m) => m.to_address === 'admin@hollinridge.test');
    expect(mail?.html_body).toContain(`<code>${sample.code}</code>`);
    expect(mail?.reply_to).toBe('lab@calder.test');
    const [notice] = await t.db.query(`SELECT event, link FROM client_notification WHERE event = 'order-placed' AND link = $1`, [`/orders/${order.id}`]);
    expect(notice).toEqual({ event: 'order-placed', link: `/orders/${order.id}` });

    const shipped = await request(t.app).post(`/api/client/orders/${order.id}/shipment`).set(await admin()).send({ carrier: 'Invented Parcel Ltd', trackingNumber: 'IPL-42' });
    expect(shipped.body.shipment).toMatchObject({ carrier: 'Invented Parcel Ltd', trackingNumber: 'IPL-42' });
    const intake = await t.authFor('intake-technician');
    const atIntake = await request(t.app).get(`/api/lab/samples/by-code/${sample.code}`).set(intake);
    expect(atIntake.body).toMatchObject({ kind: 'check', shipment: { carrier: 'Invented Parcel Ltd', trackingNumber: 'IPL-42' } });

    expect((await request(t.app).post(`/api/lab/samples/${sample.id}/arrival`).set(intake).send(arrival)).status).toBe(200);
    expect((await request(t.app).post(`/api/lab/samples/${sample.id}/accept`).set(intake).send({ storageLocation: 'Cold room 1' })).status).toBe(200);
    const cancel = await request(t.app).post(`/api/client/orders/${order.id}/cancel`).set(await admin());
    expect(cancel.status).toBe(409);
    expect(cancel.body.detail).toContain(`already received ${sample.code}`);

    // The analyst measures it with a demo sample's invented exports, relabelled with this sample's code.
    const analyst = await t.authFor('analyst');
    const bench = (await request(t.app).get('/api/lab/bench').set(analyst)).body;
    const files = demoFiles().filter((f) => f.sampleCode === 'OP-4HXT-2B');
    let upload = request(t.app).post(`/api/lab/samples/${sample.id}/measurements`).set(analyst)
      .field('instrumentId', bench.instruments[0].id).field('cellId', bench.cells[0].id).field('temperatureC', String(files[0].temperatureC));
    for (const f of files) upload = upload.attach('files', Buffer.from(f.text.replaceAll('OP-4HXT-2B', sample.code)), f.fileName.replace('OP-4HXT-2B', sample.code));
    expect((await upload).status).toBe(201);
    const [{ version_id }] = await t.db.query(
      `SELECT v.id AS version_id FROM reference_library l JOIN library_version v ON v.library_id = l.id AND v.status = 'published' WHERE l.product_id = $1`, [ridgeline]);
    const analysis = await request(t.app).post(`/api/lab/samples/${sample.id}/analyses`).set(analyst).send({ libraryVersionId: version_id });
    expect(analysis.status).toBe(201);
    expect((await request(t.app).post(`/api/lab/analyses/${analysis.body.id}/submit`).set(analyst)).status).toBe(200);
    await approveAndIssue(t, analysis.body.id);

    expect(await balance()).toEqual({ available: before.available - 1, reserved: before.reserved });
    expect(await ledgerFor(order.id)).toEqual([
      { kind: 'reserve', available_change: -1, reserved_change: 1, sample_id: sample.id },
      { kind: 'consume', available_change: 0, reserved_change: -1, sample_id: sample.id },
    ]);
    const view = await request(t.app).get(`/api/client/orders/${order.id}`).set(await t.authFor('client-member'));
    expect(view.body).toMatchObject({ status: 'completed', samples: [{ state: 'reported', creditState: 'consumed' }] });
  });

  it('gives the credits back when the client cancels before the lab receives the samples', async () => {
    await holdExactly(2);
    const placed = await placeCheck([oneSample(), oneSample({ lotClaimed: 'L24-141' })]);
    expect(placed.status).toBe(201);
    expect(await balance()).toMatchObject({ available: 0 });
    const cancelled = await request(t.app).post(`/api/client/orders/${placed.body.id}/cancel`).set(await admin());
    expect(cancelled.status).toBe(200);
    expect(cancelled.body).toMatchObject({ status: 'cancelled', samples: [{ creditState: 'released' }, { creditState: 'released' }] });
    expect(await balance()).toMatchObject({ available: 2 });
    expect((await ledgerFor(placed.body.id)).map((e: { kind: string }) => e.kind)).toEqual(['reserve', 'reserve', 'release', 'release']);
    expect((await request(t.app).post(`/api/client/orders/${placed.body.id}/cancel`).set(await admin())).status).toBe(409);
    const arrive = await request(t.app).post(`/api/lab/samples/${placed.body.samples[0].id}/arrival`).set(await t.authFor('intake-technician')).send(arrival);
    expect(arrive.status).toBe(409);
    expect(arrive.body.detail).toContain('cancelled');
  });

  it('gives the credit back when intake rejects the sample, and closes an order with nothing left to test', async () => {
    await holdExactly(1);
    const before = await balance();
    const placed = await placeCheck();
    const [sample] = placed.body.samples;
    const intake = await t.authFor('intake-technician');
    await request(t.app).post(`/api/lab/samples/${sample.id}/arrival`).set(intake).send({ ...arrival, containerCondition: 'leaking' });
    const rejected = await request(t.app).post(`/api/lab/samples/${sample.id}/reject`).set(intake).send({ reason: 'The bottle leaked in transit.' });
    expect(rejected.status).toBe(200);
    expect(await balance()).toEqual(before);
    const view = await request(t.app).get(`/api/client/orders/${placed.body.id}`).set(await admin());
    expect(view.body).toMatchObject({ status: 'closed', samples: [{ state: 'rejected', creditState: 'released', rejectionReason: 'The bottle leaked in transit.' }] });
    expect((await ledgerFor(placed.body.id)).map((e: { kind: string; sample_id: string }) => [e.kind, e.sample_id])).toEqual([['reserve', sample.id], ['release', sample.id]]);
  });

  it('creates exactly five of twenty concurrent one-sample orders on five credits', async () => {
    await holdExactly(5);
    const auth = await admin();
    const answers = await Promise.all(Array.from({ length: 20 }, () =>
      request(t.app).post('/api/client/orders').set(auth).send({ productId: ridgeline, samples: [oneSample()] })));
    const statuses = answers.map((a) => a.status).sort();
    expect(statuses.filter((s) => s === 201)).toHaveLength(5);
    expect(statuses.filter((s) => s === 409)).toHaveLength(15);
    expect((await balance()).available).toBe(0);
    const codes = answers.filter((a) => a.status === 201).map((a) => a.body.samples[0].code);
    expect(new Set(codes).size).toBe(5);
  });

  it('refuses bad sample descriptions with the field named, NUL bytes and huge text included', async () => {
    await holdExactly(1);
    const nul = await placeCheck([oneSample({ obtainedWhere: 'Shop\u0000' })]);
    expect(nul.status).toBe(400);
    expect(nul.body.errors[0].field).toBe('samples.0.obtainedWhere');
    const future = await placeCheck([oneSample({ obtainedOn: '2999-01-01' })]);
    expect(future.status).toBe(400);
    expect(future.body.errors[0].field).toBe('samples.0.obtainedOn');
    const huge = await placeCheck([oneSample({ labelText: 'x'.repeat(50_000) })]);
    expect(huge.status).toBeGreaterThanOrEqual(400);
    expect(huge.status).toBeLessThan(500);
    const none = await request(t.app).post('/api/client/orders').set(await admin()).send({ productId: ridgeline, samples: [] });
    expect(none.status).toBe(400);
    expect(await balance()).toMatchObject({ available: 1 });
  });

  it('lets a client member read orders but not order, ship or cancel; another lab’s client gets 404', async () => {
    await holdExactly(1);
    const placed = await placeCheck();
    const id = placed.body.id;
    const member = await t.authFor('client-member');
    expect((await request(t.app).get(`/api/client/orders/${id}`).set(member)).status).toBe(200);
    expect((await request(t.app).post('/api/client/orders').set(member).send({ productId: ridgeline, samples: [oneSample()] })).status).toBe(403);
    expect((await request(t.app).post('/api/client/reference-orders').set(member).send({ productId: ridgeline, lots: [] })).status).toBe(403);
    expect((await request(t.app).post(`/api/client/orders/${id}/cancel`).set(member)).status).toBe(403);
    expect((await request(t.app).post(`/api/client/orders/${id}/shipment`).set(member).send({ carrier: 'X' })).status).toBe(403);
    expect((await request(t.app).put(`/api/client/orders/${id}/samples/${placed.body.samples[0].id}/photo`).set(member).attach('photo', PNG, 'a.png')).status).toBe(403);
    expect((await request(t.app).post('/api/client/orders').set(await t.authFor('lab-admin')).send({ productId: ridgeline, samples: [oneSample()] })).status).toBe(403);
    expect((await request(t.app).get('/api/client/order-prices')).status).toBe(401);

    const other = await t.authFor('client-admin', 'marlow');
    expect((await request(t.app).get(`/api/client/orders/${id}`).set(other)).status).toBe(404);
    expect((await request(t.app).post(`/api/client/orders/${id}/cancel`).set(other)).status).toBe(404);
    expect((await request(t.app).post(`/api/client/orders/${id}/shipment`).set(other).send({ carrier: 'X' })).status).toBe(404);
    expect((await request(t.app).get(`/api/client/orders/${id}/label-pack`).set(other)).status).toBe(404);
    expect((await request(t.app).put(`/api/client/orders/${id}/samples/${placed.body.samples[0].id}/photo`).set(other).attach('photo', PNG, 'a.png')).status).toBe(404);
    const theirs = await request(t.app).post('/api/client/orders').set(other).send({ productId: ridgeline, samples: [oneSample()] });
    expect(theirs.status).toBe(404);
    expect(theirs.body.errors[0].field).toBe('productId');
  });

  it('stores a photo of an ordered sample for its organisation only; wrong types are refused', async () => {
    await holdExactly(1);
    const placed = await placeCheck();
    const path = `/api/client/orders/${placed.body.id}/samples/${placed.body.samples[0].id}/photo`;
    expect((await request(t.app).put(path).set(await admin()).attach('photo', Buffer.from('%PDF-1.7'), 'scan.pdf')).status).toBe(415);
    expect((await request(t.app).put(path).set(await admin()).attach('photo', PNG, 'bottle.png')).status).toBe(204);
    const photo = await request(t.app).get(path).set(await t.authFor('client-member'));
    expect(photo.headers['content-type']).toBe('image/png');
    expect((await request(t.app).get(`/api/client/orders/${placed.body.id}`).set(await admin())).body.samples[0].hasPhoto).toBe(true);
  });
});

describe('label pack', () => {
  it('prints every sample code, the lab’s shipping address and a custody form', async () => {
    await holdExactly(3);
    const placed = await placeCheck([oneSample(), oneSample({ lotClaimed: 'L24-141' }), oneSample({ lotClaimed: 'L24-142', container: 'Green glass bottle' })]);
    await t.db.query(`UPDATE lab SET shipping_address = 'Sample reception, Unit 4\nInvented Science Park\nCalderbridge CB1 2AB', shipping_instructions = 'Ring the bell at gate B.' WHERE id = $1`, [scope.labId]);
    const res = await request(t.app).get(`/api/client/orders/${placed.body.id}/label-pack`).set(await t.authFor('client-member'))
      .buffer(true).parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const dir = mkdtempSync(join(tmpdir(), 'label-pack-'));
    writeFileSync(join(dir, 'pack.pdf'), res.body as Buffer);
    const text = execFileSync('pdftotext', ['-layout', join(dir, 'pack.pdf'), '-'], { encoding: 'utf8' });
    for (const s of placed.body.samples) expect(text.split(s.code).length - 1).toBeGreaterThanOrEqual(3);
    expect(text).toContain('Invented Science Park');
    expect(text).toContain('Ring the bell at gate B.');
    expect(text).toContain('Chain-of-custody form');
    expect(text).toContain('Sent by (producer)');
    expect(text).toContain('Received by (lab)');
    expect(text).toContain('Ridgeline Red (demo)');
  });
});

describe('reference enrolment orders', () => {
  it('enrols declared lots at the lab’s price; intake sees reference lots with what was declared', async () => {
    await t.db.query('UPDATE lab SET credits_per_reference_lot = 2 WHERE id = $1', [scope.labId]);
    await holdExactly(4);
    const product = await request(t.app).post('/api/client/products').set(await admin()).send({ name: 'Estate Blanc (demo)', matrix: 'wine' });
    const res = await request(t.app).post('/api/client/reference-orders').set(await admin()).send({
      productId: product.body.id,
      lots: [
        { lotCode: 'EB-23-01', producedOn: '2023-10-02', volumeMl: 750, chemistry: { alcoholPercentVolume: 12.5, pH: 3.3 } },
        { lotCode: 'EB-23-02', producedOn: '2023-10-09', volumeMl: 750 },
      ],
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ kind: 'reference-enrolment', creditsReserved: 4 });
    expect(res.body.samples.map((s: { kind: string; credits: number }) => [s.kind, s.credits])).toEqual([['reference-lot', 2], ['reference-lot', 2]]);
    expect(await balance()).toMatchObject({ available: 0 });
    const lot = res.body.samples.find((s: { referenceLot: { lotCode: string } }) => s.referenceLot.lotCode === 'EB-23-01');
    const atIntake = await request(t.app).get(`/api/lab/samples/by-code/${lot.code}`).set(await t.authFor('intake-technician'));
    expect(atIntake.body).toMatchObject({ kind: 'reference-lot', referenceLot: { lotCode: 'EB-23-01', volumeMl: 750, chemistry: { alcoholPercentVolume: 12.5, pH: 3.3 } } });
    const listed = await request(t.app).get(`/api/client/products?q=Estate`).set(await admin());
    expect(listed.body.items[0].libraryState).toBe('building');

    const bad = await request(t.app).post('/api/client/reference-orders').set(await admin()).send({
      productId: product.body.id, lots: [{ lotCode: 'EB-X', producedOn: '2023-10-02', volumeMl: 750, chemistry: { pH: 22 } }],
    });
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0]).toEqual({ field: 'lots.0.chemistry.pH', message: 'pH is at most 14' });
  });
});
