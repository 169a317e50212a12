import request from 'supertest';
import * as cpuPool from '../../core/cpu-pool/cpu-pool';
import { useTestApp, type DemoLabKey } from '../../testing';
import { startUpload, useOwnUploadFolder, withListeningApp } from '../../testing/upload-folders';
import { kclExport } from './kcl-export.fixture';
import { CONCURRENT_RUN_UPLOADS_PER_LAB } from './router';

jest.setTimeout(60_000);

const uploads = useOwnUploadFolder();
const t = useTestApp();

async function newCell(name: string, lab: DemoLabKey = 'calder'): Promise<string> {
  const res = await request(t.app).post('/api/lab/cells').set(await t.authFor('lab-admin', lab)).send({ name, nominalConstantPerCm: 1 });
  expect(res.status).toBe(201);
  return res.body.cells.find((c: { name: string }) => c.name === name).id;
}

const RUN_FIELDS = { concentration: '0.01', basis: 'molal', temperatureC: '25' };
const runs = async (cellId: string): Promise<{ file_name: string; raw_file: Buffer }[]> =>
  t.db.query('SELECT file_name, raw_file FROM cell_calibration WHERE cell_id = $1 ORDER BY measured_at', [cellId]);

/** Starts a standard run upload and sends the first half of its file; the rest goes with `finish`. */
async function startRun(port: number, cellId: string, file: Buffer, fileName: string, lab: DemoLabKey = 'calder') {
  const upload = startUpload(port, { path: `/api/lab/cells/${cellId}/standard-runs`, headers: await t.authFor('analyst', lab), fields: RUN_FIELDS, field: 'file', fileName });
  const half = Math.floor(file.length / 2);
  await upload.send(file.subarray(0, half));
  return { ...upload, finish: async () => (await upload.send(file.subarray(half)), upload.finish()) };
}

describe('KCl standard run files', () => {
  it('are written to a private folder as they arrive, kept byte for byte, and the folder is gone after the answer', async () => {
    const cellId = await newCell('Streaming cell');
    const file = Buffer.from(kclExport(705));
    await withListeningApp(t.app, async (port) => {
      const upload = await startRun(port, cellId, file, 'kcl-streamed.csv');
      await uploads.until(() => uploads.bytesOnDisk().some((n) => n > 0), 'the first half of the run file is on disk');
      const res = await upload.finish();
      expect(res.status).toBe(201);
    });
    const stored = await runs(cellId);
    expect(stored.map((r) => r.file_name)).toEqual(['kcl-streamed.csv']);
    expect(Buffer.compare(stored[0].raw_file, file)).toBe(0);
    expect(await uploads.leftAfterAnswer()).toEqual([]);
  });

  it('that cannot be read, or are too large, are refused naming the field, leaving no folder and no run', async () => {
    const cellId = await newCell('Refusing streaming cell');
    await withListeningApp(t.app, async (port) => {
      const upload = await startRun(port, cellId, Buffer.from(`Freq / Hz;Zre / Ohm;-Zim / Ohm\n1000;abc;1\n${'\n'.repeat(4096)}`), 'garbled.csv');
      await uploads.until(() => uploads.bytesOnDisk().some((n) => n > 0), 'the first half of the run file is on disk');
      const res = await upload.finish();
      expect(res.status).toBe(400);
      expect(res.body?.errors?.[0].field).toBe('file');
      expect(res.body?.detail).toContain('garbled.csv');
    });
    expect(await uploads.leftAfterAnswer()).toEqual([]);
    const huge = await request(t.app).post(`/api/lab/cells/${cellId}/standard-runs`).set(await t.authFor('analyst'))
      .field(RUN_FIELDS).attach('file', Buffer.concat([Buffer.from(kclExport(700)), Buffer.alloc(5 * 1048576, 0x20)]), 'huge.csv');
    expect(huge.status).toBe(413);
    expect(huge.body.detail).toContain('larger than 5 MB');
    expect(await uploads.leftAfterAnswer()).toEqual([]);
    expect(await runs(cellId)).toEqual([]);
  });

  it('are taken two per lab at a time: a third is told to try again while another lab’s run goes through', async () => {
    const cellId = await newCell('Busy cell');
    const otherLabCell = await newCell('Other lab cell', 'marlow');
    const file = Buffer.from(kclExport(702));
    await withListeningApp(t.app, async (port) => {
      const held = [];
      for (let i = 0; i < CONCURRENT_RUN_UPLOADS_PER_LAB; i++) held.push(await startRun(port, cellId, file, `held-${i}.csv`));
      await uploads.until(() => uploads.folders().length === CONCURRENT_RUN_UPLOADS_PER_LAB, 'both held runs are being received');

      const third = await request(t.app).post(`/api/lab/cells/${cellId}/standard-runs`).set(await t.authFor('lab-admin')).field(RUN_FIELDS).attach('file', file, 'third.csv');
      expect(third.status).toBe(429);
      expect(third.headers['retry-after']).toBe('2');
      expect(third.body.detail).toContain(`At most ${CONCURRENT_RUN_UPLOADS_PER_LAB} standard run uploads of one lab`);

      const otherLab = await request(t.app).post(`/api/lab/cells/${otherLabCell}/standard-runs`).set(await t.authFor('analyst', 'marlow')).field(RUN_FIELDS).attach('file', file, 'other-lab.csv');
      expect(otherLab.status).toBe(201);

      expect((await Promise.all(held.map((h) => h.finish()))).map((r) => r.status)).toEqual(held.map(() => 201));
    });
    // the held runs were recorded, and with them finished the lab may upload again
    const again = await request(t.app).post(`/api/lab/cells/${cellId}/standard-runs`).set(await t.authFor('analyst')).field(RUN_FIELDS).attach('file', file, 'again.csv');
    expect(again.status).toBe(201);
    expect((await runs(cellId)).map((r) => r.file_name).sort()).toEqual(['again.csv', 'held-0.csv', 'held-1.csv']);
    expect(await uploads.leftAfterAnswer()).toEqual([]);
  });

  it('are parsed in the CPU pool with no lock on the cell and no transaction open meanwhile, other labs answered at once', async () => {
    const cellId = await newCell('Unlocked cell');
    const otherLab = await t.authFor('lab-admin', 'marlow');
    const real = cpuPool.runCpuTask;
    let handedOver = false;
    let release = () => {};
    const held = new Promise<void>((r) => (release = r));
    const spy = jest.spyOn(cpuPool, 'runCpuTask').mockImplementation((async (name: string, input: unknown, options?: unknown) => {
      if (name === 'readStandardRun') {
        handedOver = true;
        await held;
      }
      return (real as (n: string, i: unknown, o?: unknown) => Promise<unknown>)(name, input, options);
    }) as typeof cpuPool.runCpuTask);
    try {
      const recording = request(t.app).post(`/api/lab/cells/${cellId}/standard-runs`).set(await t.authFor('analyst')).field(RUN_FIELDS).attach('file', Buffer.from(kclExport(704)), 'held.csv').then((r) => r);
      await uploads.until(() => handedOver, 'the run file is handed to the CPU pool');

      const locked = await t.db.transaction((m) => m.query(`SELECT id FROM measurement_cell WHERE id = $1 FOR UPDATE NOWAIT`, [cellId]));
      expect(locked).toEqual([{ id: cellId }]);
      const [open] = await t.db.query(`SELECT count(*)::int AS n FROM pg_stat_activity WHERE datname = current_database() AND state LIKE 'idle in transaction%'`);
      expect(open.n).toBe(0);
      expect((await request(t.app).get('/api/health')).status).toBe(200);
      expect((await request(t.app).get('/api/lab/bench').set(otherLab)).status).toBe(200);

      release();
      const res = await recording;
      expect(res.status).toBe(201);
      expect(res.body.runs.map((r: { fileName: string }) => r.fileName)).toEqual(['held.csv']);
    } finally {
      release();
      spy.mockRestore();
    }
    expect(await uploads.leftAfterAnswer()).toEqual([]);
  });
});
