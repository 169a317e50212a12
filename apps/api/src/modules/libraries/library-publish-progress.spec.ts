import request from 'supertest';
import type { LibraryPublication } from '@ohmprint/contracts';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { config } from '../../config';
import { enrolReferenceLots, useTestApp } from '../../testing';
import { DEFAULT_METHOD } from './default-method';
import { decodeLotSpectrum, encodeLotSpectrum } from './lot-spectrum-bytes';
import { calibrateInPool } from './library-versions';

jest.setTimeout(240_000);

const t = useTestApp();
const threshold = config.jobs.libraryPublishLots;
afterAll(() => {
  config.jobs.libraryPublishLots = threshold;
});

/** A deterministic generator (mulberry32), so the invented lots are the same on every run. */
function seeded(seed: number): () => number {
  let a = seed;
  return () => {
    a = (a + 0x6d2b79f5) | 0;
    let x = Math.imul(a ^ (a >>> 15), 1 | a);
    x = (x + Math.imul(x ^ (x >>> 7), 61 | x)) ^ x;
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
}

describe('calibration progress from the worker pool', () => {
  it('tells how many lots are compared while the calibration runs, in order, ending at every lot', async () => {
    const random = seeded(7);
    const grid = Float64Array.from({ length: 24 }, (_, i) => 10 * 10 ** (i / 4));
    const lots = Array.from({ length: 6000 }, () => {
      const scale = 1 + random();
      return { frequencyHz: grid, re: grid.map((f) => scale * (100 + 50 / (1 + f / 1000)) * (1 + 0.02 * random())), im: grid.map((f) => -scale * (30 / (1 + f / 1000)) * (1 + 0.02 * random())) };
    });
    const seen: { lotsDone: number; lotCount: number; settled: boolean }[] = [];
    let settled = false;
    const calibrating = calibrateInPool([lots, { minimumLots: 5 }], (lotsDone, lotCount) => seen.push({ lotsDone, lotCount, settled }));
    void calibrating.finally(() => (settled = true));
    const calibration = await calibrating;
    expect(calibration.lotCount).toBe(6000);
    // Heard before the answer came back, never going backwards, the last one every lot.
    expect(seen.length).toBeGreaterThanOrEqual(2);
    expect(seen.every((s) => !s.settled && s.lotCount === 6000)).toBe(true);
    expect(seen.map((s) => s.lotsDone)).toEqual([...seen.map((s) => s.lotsDone)].sort((a, b) => a - b));
    expect(seen[0].lotsDone).toBeLessThan(6000);
    expect(seen.at(-1)!.lotsDone).toBe(6000);
  });

  it('calibrates exactly as without progress (same distances and thresholds)', async () => {
    const random = seeded(11);
    const grid = Float64Array.from({ length: 16 }, (_, i) => 10 * 10 ** (i / 3));
    const lots = Array.from({ length: 200 }, () => ({ frequencyHz: grid, re: grid.map(() => 100 + 10 * random()), im: grid.map(() => -20 - 5 * random()) }));
    const plain = await calibrateInPool([lots, { minimumLots: 5 }]);
    const told = await calibrateInPool([lots, { minimumLots: 5 }], () => undefined);
    expect(told).toEqual(plain);
  });
});

describe('a large library’s publication on the library screen', () => {
  it('shows the lots compared so far while the worker calibrates, then published', async () => {
    config.jobs.libraryPublishLots = 3;
    await t.db.transaction((m) => seedLabDemo(m));
    const { productId } = await enrolReferenceLots(t, { productName: 'Tarnwell Cider (progress test)', matrix: 'juice', client: 'Sunvale Juice Works', profile: 'cloudy-apple', count: 6, prefix: 'P' });
    const admin = await t.authFor('lab-admin');
    const methodVersionId = (await request(t.app).post('/api/lab/methods').set(admin).send({ name: 'Juice (progress test)', matrix: 'juice', settings: { ...DEFAULT_METHOD, model: 'cole-cole' } })).body.id;
    const draft = await request(t.app).post('/api/lab/library-drafts').set(await t.authFor('analyst')).send({ productId, methodVersionId });
    expect(draft.status).toBe(201);
    const versionId = draft.body.id as string;

    // Thousands more lots, each a measured lot with a little invented scatter, so the calibration takes a while.
    const [{ grid_hz }] = await t.db.query(`SELECT grid_hz FROM library_version WHERE id = $1`, [versionId]);
    const grid = Float64Array.from(grid_hz as number[]);
    const measured: { id: string; spectrum: Buffer }[] = await t.db.query(`SELECT id, spectrum FROM reference_lot WHERE library_version_id = $1`, [versionId]);
    const columns: string[] = (
      await t.db.query(`SELECT column_name FROM information_schema.columns WHERE table_name = 'reference_lot' AND column_name NOT IN ('id', 'lot_code', 'spectrum', 'created_at')`)
    ).map((c: { column_name: string }) => c.column_name);
    const random = seeded(3);
    const extra = 5000;
    for (let start = 0; start < extra; start += 1000) {
      const codes: string[] = [];
      const spectra: Buffer[] = [];
      const sources: string[] = [];
      for (let i = start; i < Math.min(extra, start + 1000); i++) {
        const source = measured[i % measured.length];
        const s = decodeLotSpectrum(source.spectrum, grid);
        spectra.push(encodeLotSpectrum({ re: s.re.map((v) => v * (1 + 0.03 * (random() - 0.5))), im: s.im.map((v) => v * (1 + 0.03 * (random() - 0.5))) }));
        codes.push(`PX-${String(i).padStart(5, '0')}`);
        sources.push(source.id);
      }
      await t.db.query(
        `INSERT INTO reference_lot (lot_code, spectrum, ${columns.join(', ')})
         SELECT n.code, n.spectrum, ${columns.map((c) => `r.${c}`).join(', ')}
         FROM unnest($1::text[], $2::bytea[], $3::uuid[]) AS n(code, spectrum, source) JOIN reference_lot r ON r.id = n.source`,
        [codes, spectra, sources],
      );
    }
    const lotCount = measured.length + extra;

    const published = await request(t.app).post(`/api/lab/library-versions/${versionId}/publish`).set(await t.authFor('reviewer'));
    expect(published.status).toBe(202);
    const seen: LibraryPublication[] = [];
    const until = Date.now() + 150_000;
    for (;;) {
      const res = await request(t.app).get(`/api/lab/library-versions/${versionId}/publication`).set(await t.authFor('analyst'));
      expect(res.status).toBe(200);
      seen.push(res.body);
      if (!['queued', 'running'].includes(res.body.state) || Date.now() > until) break;
      await new Promise((r) => setTimeout(r, 100));
    }
    const comparing = seen.filter((p) => p.state === 'running' && p.progress?.stage === 'comparing-lots').map((p) => p.progress!);
    // Seen part-way through the comparison, with the number of lots it compares.
    expect(comparing.length).toBeGreaterThan(0);
    expect(comparing.some((p) => p.lotsDone > 0 && p.lotsDone < lotCount)).toBe(true);
    expect(comparing.every((p) => p.lotCount === lotCount)).toBe(true);
    const done = seen.filter((p) => p.state === 'running').map((p) => p.progress?.lotsDone ?? 0);
    expect(done).toEqual([...done].sort((a, b) => a - b));
    expect(new Set(done).size).toBeGreaterThanOrEqual(2);
    // Not running any more: no progress figure, and the version ended published or with the method's reason.
    const last = seen.at(-1)!;
    expect(['published', 'failed']).toContain(last.state);
    expect(last.progress).toBeUndefined();
  });
});
