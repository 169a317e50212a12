import { request as httpRequest, type ClientRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { useTestApp } from '../../testing';
import { useOwnUploadFolder } from '../../testing/upload-folders';
import { CONCURRENT_PHOTO_UPLOADS_PER_LAB } from './router';

// Seeding the demo libraries in beforeAll takes seconds on a busy two-core machine.
jest.setTimeout(30_000);

// Photo uploads of this file stream to a temporary folder of its own, so what is left behind can be counted.
const uploads = useOwnUploadFolder();

const t = useTestApp();

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
});

const sampleId = async (code: string): Promise<string> => (await t.db.query('SELECT id FROM sample WHERE code = $1', [code]))[0].id;

const arrival = {
  carrier: 'Invented Courier Co.',
  trackingNumber: 'DEMO-TRACK-1',
  arrivedAt: new Date(Date.now() - 3_600_000).toISOString(),
  temperatureC: 6.5,
  sealIntact: true,
  containerCondition: 'intact',
  volumeMl: 750,
};

// The smallest valid PNG (1×1 pixel), so the photo check sees a real image signature.
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');

describe('intake', () => {
  it('finds a sample by the code a scanner types, whatever the case, with what was ordered', async () => {
    const res = await request(t.app).get('/api/lab/samples/by-code/%20op-3vnc-8p%0D').set(await t.authFor('intake-technician'));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ code: 'OP-3VNC-8P', state: 'awaiting-arrival', product: { name: 'Ridgeline Red (demo)' }, clientOrganisation: { name: 'Hollin Ridge Cellars' } });
    expect(res.body.description.claimedLot).toBe('L24-140');
  });

  it('records arrival and photos, accepts into storage, and keeps each step on the custody timeline', async () => {
    const intake = await t.authFor('intake-technician');
    const id = await sampleId('OP-3VNC-8P');
    const arrived = await request(t.app).post(`/api/lab/samples/${id}/arrival`).set(intake).send(arrival);
    expect(arrived.status).toBe(200);
    expect(arrived.body).toMatchObject({ state: 'received', intake: { carrier: 'Invented Courier Co.', sealIntact: true, volumeMl: 750 } });
    const [order] = await t.db.query('SELECT o.status FROM test_order o JOIN sample s ON s.order_id = o.id WHERE s.id = $1', [id]);
    expect(order.status).toBe('in-progress');

    const photos = await request(t.app).post(`/api/lab/samples/${id}/photos`).set(intake).attach('photos', PNG, 'parcel.png');
    expect(photos.status).toBe(201);
    expect(photos.body).toEqual([expect.objectContaining({ fileName: 'parcel.png', contentType: 'image/png', sizeBytes: PNG.length })]);
    const image = await request(t.app).get(`/api/lab/samples/${id}/photos/${photos.body[0].id}`).set(await t.authFor('analyst'));
    expect(image.status).toBe(200);
    expect(image.headers['content-type']).toBe('image/png');

    const accepted = await request(t.app).post(`/api/lab/samples/${id}/accept`).set(intake).send({ storageLocation: 'Cold room 2, shelf A' });
    expect(accepted.body).toMatchObject({ state: 'accepted', storageLocation: 'Cold room 2, shelf A' });

    const timeline = await request(t.app).get(`/api/lab/samples/${id}/custody`).set(intake);
    expect(timeline.body.events.map((e: { kind: string; location: string }) => [e.kind, e.location])).toEqual([
      ['received', 'Intake bench'],
      ['accepted', 'Intake bench'],
      ['stored', 'Cold room 2, shelf A'],
    ]);
    expect(timeline.body.events[0].actor.displayName).toBe('Ira Intake (demo)');
  });

  it('keeps the photos of one upload in the order they were sent', async () => {
    const id = await sampleId('OP-7K3M-Q9');
    const names = ['seal-close-up.png', 'address-label.png', 'bottle-front.png', 'capsule.png'];
    let upload = request(t.app).post(`/api/lab/samples/${id}/photos`).set(await t.authFor('intake-technician'));
    for (const name of names) upload = upload.attach('photos', PNG, name);
    const res = await upload;
    expect(res.status).toBe(201);
    expect(res.body.slice(-4).map((p: { fileName: string }) => p.fileName)).toEqual(names);
    const detail = await request(t.app).get(`/api/lab/samples/${id}`).set(await t.authFor('analyst'));
    expect(detail.body.photos.slice(-4).map((p: { fileName: string }) => p.fileName)).toEqual(names);
  });

  it('streams photos through a private folder that is gone after the answer, storing every byte as sent', async () => {
    const intake = await t.authFor('intake-technician');
    const id = await sampleId('OP-7K3M-Q9');
    // a PNG signature followed by 3 MB of varied bytes: stored and served back unchanged
    const big = Buffer.concat([PNG, Buffer.from(Array.from({ length: 3 * 1048576 }, (_, i) => (i * 31 + 7) % 251))]);
    const res = await request(t.app).post(`/api/lab/samples/${id}/photos`).set(intake).attach('photos', big, 'pallet.png');
    expect(res.status).toBe(201);
    const back = await request(t.app).get(`/api/lab/samples/${id}/photos/${res.body.at(-1).id}`).set(intake).buffer(true).parse((r, done) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(Buffer.compare(back.body as Buffer, big)).toBe(0);
    expect(await uploads.leftAfterAnswer()).toEqual([]);
  });

  it('takes two photo uploads of one lab at a time: a third at the same moment is told to try again, before its body is read', async () => {
    const intake = await t.authFor('intake-technician');
    const id = await sampleId('OP-7K3M-Q9');
    const server = t.app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    const { port } = server.address() as AddressInfo;
    const boundary = 'intake-spec-boundary';
    const held: ClientRequest[] = [];
    try {
      /** Starts an upload whose body is never finished: the request stays in flight. */
      const hold = () => {
        const req = httpRequest({ host: '127.0.0.1', port, method: 'POST', path: `/api/lab/samples/${id}/photos`, headers: { ...intake, 'content-type': `multipart/form-data; boundary=${boundary}` } });
        req.on('error', () => undefined);
        req.write(`--${boundary}\r\nContent-Disposition: form-data; name="photos"; filename="slow.png"\r\nContent-Type: image/png\r\n\r\n`);
        req.write(PNG);
        held.push(req);
      };
      for (let i = 0; i < CONCURRENT_PHOTO_UPLOADS_PER_LAB; i++) hold();
      // wait until both are inside the route (the server has begun writing their files)
      await uploads.until(() => uploads.folders().length >= CONCURRENT_PHOTO_UPLOADS_PER_LAB, 'both held photo uploads are being received');
      expect(uploads.folders()).toHaveLength(CONCURRENT_PHOTO_UPLOADS_PER_LAB);
      const third = await fetch(`http://127.0.0.1:${port}/api/lab/samples/${id}/photos`, { method: 'POST', headers: intake, body: (() => { const f = new FormData(); f.append('photos', new Blob([PNG]), 'third.png'); return f; })() });
      expect(third.status).toBe(429);
      expect(third.headers.get('retry-after')).toBe('2');
      expect(((await third.json()) as { detail: string }).detail).toContain('At most 2 photo uploads of one lab');
    } finally {
      for (const req of held) req.destroy();
      await new Promise((r) => server.close(r));
    }
    // the cut-off uploads leave no folder behind
    expect(await uploads.leftAfterAnswer()).toEqual([]);
  });

  it('refuses a file that is not an image, by name, and saves none of the batch', async () => {
    const intake = await t.authFor('intake-technician');
    const id = await sampleId('OP-1PYF-9C');
    const res = await request(t.app)
      .post(`/api/lab/samples/${id}/photos`)
      .set(intake)
      .attach('photos', PNG, 'good.png')
      .attach('photos', Buffer.from('not a picture'), 'notes.txt');
    expect(res.status).toBe(400);
    expect(res.body.detail).toContain('notes.txt');
    expect((await t.db.query('SELECT count(*)::int AS n FROM intake_photo WHERE sample_id = $1', [id]))[0].n).toBe(0);
    expect(await uploads.leftAfterAnswer()).toEqual([]);
  });

  it('rejects with a reason and queues an e-mail to every client admin of the ordering organisation', async () => {
    const id = await sampleId('OP-1PYF-9C');
    const res = await request(t.app).post(`/api/lab/samples/${id}/reject`).set(await t.authFor('intake-technician')).send({ reason: 'Cap broken in transit; contents leaked.' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ state: 'rejected', rejectionReason: 'Cap broken in transit; contents leaked.' });
    const mail: { to_address: string; subject: string; text_body: string }[] = await t.db.query(`SELECT to_address, subject, text_body FROM email_outbox WHERE subject LIKE '%OP-1PYF-9C%'`);
    expect(mail.map((m) => m.to_address)).toEqual(['admin@sunvale.test']);
    expect(mail[0].text_body).toContain('Cap broken in transit');
    const again = await request(t.app).post(`/api/lab/samples/${id}/accept`).set(await t.authFor('intake-technician')).send({ storageLocation: 'Shelf' });
    expect(again.status).toBe(409);
  });

  it('needs a reason to reject, and says which field is missing', async () => {
    const id = await sampleId('OP-5QGZ-1M');
    const res = await request(t.app).post(`/api/lab/samples/${id}/reject`).set(await t.authFor('intake-technician')).send({});
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([expect.objectContaining({ field: 'reason' })]);
  });

  it('lists the work queue oldest first, filtered by state and searched', async () => {
    const res = await request(t.app).get('/api/lab/samples?state=accepted,awaiting-arrival&pageSize=100').set(await t.authFor('analyst'));
    expect(res.status).toBe(200);
    const ages = res.body.items.map((i: { ageDays: number }) => i.ageDays);
    expect(ages).toEqual([...ages].sort((a, b) => b - a));
    expect(res.body.items.every((i: { state: string }) => ['accepted', 'awaiting-arrival'].includes(i.state))).toBe(true);
    const milk = await request(t.app).get('/api/lab/samples?q=whole%20milk').set(await t.authFor('analyst'));
    expect(milk.body.items.map((i: { code: string }) => i.code)).toEqual(['OP-8MJA-4T']);
    // Seeded as arrived 8 days ago against the lab's 7-day target: a day late.
    expect(milk.body.items[0]).toMatchObject({ turnaroundDays: 7, overdue: true });
    expect(milk.body.items[0].ageDays).toBeCloseTo(8, 0);
  });

  it('sorts the work queue by due date, soonest first or last', async () => {
    const analyst = await t.authFor('analyst');
    const soonest = await request(t.app).get('/api/lab/samples?sort=due&dir=asc&pageSize=100').set(analyst);
    const dues = soonest.body.items.map((i: { dueAt: string }) => Date.parse(i.dueAt));
    expect(dues.length).toBeGreaterThan(2);
    expect(dues).toEqual([...dues].sort((a, b) => a - b));
    const latest = await request(t.app).get('/api/lab/samples?sort=due&dir=desc&pageSize=100').set(analyst);
    expect(latest.body.items.map((i: { dueAt: string }) => Date.parse(i.dueAt))).toEqual([...dues].sort((a, b) => b - a));
  });
});

describe('intake guardrails', () => {
  it('asks for a reason before accepting warm, unsealed, old milk, and keeps the reason', async () => {
    const intake = await t.authFor('intake-technician');
    const id = await sampleId('OP-2DKE-7W');
    await t.db.query(`UPDATE sample SET obtained_on = (now() - interval '20 days')::date WHERE id = $1`, [id]);
    const arrived = await request(t.app).post(`/api/lab/samples/${id}/arrival`).set(intake)
      .send({ ...arrival, temperatureC: 31, sealIntact: false, containerCondition: 'damaged' });
    expect(arrived.status).toBe(200);
    // Ohmprint's default for milk (common practice, stated as such): 0–8 °C on arrival, tested within 10 days.
    expect(arrived.body.intakeWarnings).toEqual([
      { field: 'sealIntact', message: 'The seal was broken on arrival.' },
      { field: 'containerCondition', message: 'The container arrived damaged.' },
      { field: 'temperatureC', message: 'It arrived at 31 °C, outside 0–8 °C for milk.' },
      { field: 'obtainedOn', message: expect.stringMatching(/^It was obtained (19|20) days before arrival; milk is tested within 10 days\.$/) },
    ]);

    const refused = await request(t.app).post(`/api/lab/samples/${id}/accept`).set(intake).send({ storageLocation: 'Cold room 1' });
    expect(refused.status).toBe(409);
    expect(refused.body.type).toBe('urn:ohmprint:problem:intake-warnings');
    expect(refused.body.detail).toContain('31 °C');
    expect(refused.body.errors.map((e: { field: string }) => e.field)).toEqual(['sealIntact', 'containerCondition', 'temperatureC', 'obtainedOn', 'overrideReason']);
    expect((await t.db.query('SELECT state FROM sample WHERE id = $1', [id]))[0].state).toBe('received');

    const reason = 'Client confirmed by phone that this is the only bottle; tested as received.';
    const accepted = await request(t.app).post(`/api/lab/samples/${id}/accept`).set(intake).send({ storageLocation: 'Cold room 1', overrideReason: reason });
    expect(accepted.status).toBe(200);
    const [audit] = await t.db.query(`SELECT details FROM audit_event WHERE action = 'sample.accepted' AND subject_id = $1`, [id]);
    expect(audit.details).toMatchObject({ overrideReason: reason, warnings: expect.arrayContaining(['The seal was broken on arrival.']) });
    const timeline = await request(t.app).get(`/api/lab/samples/${id}/custody`).set(intake);
    expect(timeline.body.events.find((e: { kind: string }) => e.kind === 'accepted').reason).toContain(reason);
  });

  it('lets a lab admin set the lab’s own limits, says where the values come from, and keeps other labs apart', async () => {
    const defaults = await request(t.app).get('/api/lab/intake-limits').set(await t.authFor('intake-technician'));
    expect(defaults.status).toBe(200);
    expect(defaults.body.source).toMatch(/common practice/);
    expect(defaults.body.limits.find((l: { matrix: string }) => l.matrix === 'wine')).toEqual({ matrix: 'wine', minArrivalC: 2, maxArrivalC: 25, maxAgeDays: 3650 });

    const admin = await t.authFor('lab-admin');
    const bad = await request(t.app).put('/api/lab/intake-limits').set(admin).send({ limits: [{ matrix: 'wine', minArrivalC: 20, maxArrivalC: 10, maxAgeDays: 30 }] });
    expect(bad.status).toBe(400);
    expect(bad.body.errors).toEqual([expect.objectContaining({ field: 'limits.0.maxArrivalC' })]);
    expect((await request(t.app).put('/api/lab/intake-limits').set(await t.authFor('analyst')).send({ limits: [] })).status).toBe(403);

    const set = await request(t.app).put('/api/lab/intake-limits').set(admin).send({ limits: [{ matrix: 'wine', minArrivalC: 8, maxArrivalC: 18, maxAgeDays: 400 }] });
    expect(set.status).toBe(200);
    expect(set.body.source).toBe('Set by the lab.');
    expect(set.body.limits.find((l: { matrix: string }) => l.matrix === 'wine')).toMatchObject({ minArrivalC: 8, maxArrivalC: 18 });
    expect(set.body.limits.find((l: { matrix: string }) => l.matrix === 'milk')).toMatchObject({ minArrivalC: 0, maxArrivalC: 8 });
    const other = await request(t.app).get('/api/lab/intake-limits').set(await t.authFor('lab-admin', 'marlow'));
    expect(other.body.limits.find((l: { matrix: string }) => l.matrix === 'wine')).toMatchObject({ minArrivalC: 2, maxArrivalC: 25 });
  });
});

describe('chain of custody is append-only', () => {
  it('appends a movement with who, where and why', async () => {
    const id = await sampleId('OP-7K3M-Q9');
    const res = await request(t.app)
      .post(`/api/lab/samples/${id}/custody`)
      .set(await t.authFor('analyst'))
      .send({ kind: 'taken-for-measurement', location: 'Bench 1', reason: 'Replicate sweeps' });
    expect(res.status).toBe(201);
    expect(res.body.events.at(-1)).toMatchObject({ kind: 'taken-for-measurement', location: 'Bench 1', reason: 'Replicate sweeps', actor: { displayName: 'Ana Lyst (demo)' } });
  });

  it('keeps events of one moment in the order they were appended, whatever their ids', async () => {
    const id = await sampleId('OP-7K3M-Q9');
    const actor = await t.userIdFor('intake-technician');
    const [{ lab_id: labId }] = await t.db.query('SELECT lab_id FROM sample WHERE id = $1', [id]);
    const moment = '2030-01-01T09:00:00.000Z';
    // ids chosen so that sorting by id would put the later event first
    for (const [eventId, location] of [['ffffffff-0000-4000-8000-000000000001', 'Shelf B'], ['00000000-0000-4000-8000-000000000002', 'Shelf C']]) {
      await t.db.query(
        `INSERT INTO custody_event (id, lab_id, sample_id, kind, location, reason, actor_user_id, occurred_at, recorded_at)
         VALUES ($1, $2, $3, 'moved', $4, 'Invented reshuffle', $5, $6, $6)`,
        [eventId, labId, id, location, actor, moment],
      );
    }
    const res = await request(t.app).get(`/api/lab/samples/${id}/custody`).set(await t.authFor('analyst'));
    expect(res.body.events.slice(-2).map((e: { location: string }) => e.location)).toEqual(['Shelf B', 'Shelf C']);
  });

  it('offers no route to change or delete an event', async () => {
    const id = await sampleId('OP-7K3M-Q9');
    const [event] = await t.db.query('SELECT id FROM custody_event WHERE sample_id = $1 LIMIT 1', [id]);
    const admin = await t.authFor('lab-admin');
    for (const method of ['put', 'patch', 'delete'] as const) {
      const res = await request(t.app)[method](`/api/lab/samples/${id}/custody/${event.id}`).set(admin).send({ location: 'elsewhere' });
      expect(res.status).toBe(404);
      expect(res.body.type).toBe('urn:ohmprint:problem:no-such-route');
    }
  });

  it('is protected by the database itself against UPDATE and DELETE', async () => {
    const [event] = await t.db.query('SELECT id FROM custody_event LIMIT 1');
    await expect(t.db.query(`UPDATE custody_event SET location = 'forged' WHERE id = $1`, [event.id])).rejects.toThrow(/append-only/);
    await expect(t.db.query('DELETE FROM custody_event WHERE id = $1', [event.id])).rejects.toThrow(/append-only/);
  });
});
