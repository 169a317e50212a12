import request from 'supertest';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { demoFiles } from '../../../../../docker-free-scripts/seed/lab-demo-files';
import { useTestApp } from '../../testing';

// Seeding the demo libraries in beforeAll takes seconds on a busy two-core machine.
jest.setTimeout(60_000);

const t = useTestApp();
let bench: { instrumentId: string; cellId: string };

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  const res = await request(t.app).get('/api/lab/bench').set(await t.authFor('analyst'));
  bench = { instrumentId: res.body.instruments[0].id, cellId: res.body.cells[0].id };
});

const filesOf = (code: string) => demoFiles().filter((f) => f.sampleCode === code);
type Fields = { temperatureC?: string; confirmations?: unknown };

function upload(code: string, auth: Record<string, string>, files: { fileName: string; text: string }[], fields: Fields = {}) {
  let req = request(t.app).post(`/api/lab/samples/${code}/measurements`).set(auth).field('instrumentId', bench.instrumentId).field('cellId', bench.cellId);
  if (fields.temperatureC !== undefined) req = req.field('temperatureC', fields.temperatureC);
  if (fields.confirmations !== undefined) req = req.field('confirmations', typeof fields.confirmations === 'string' ? fields.confirmations : JSON.stringify(fields.confirmations));
  for (const f of files) req = req.attach('files', Buffer.from(f.text), f.fileName);
  return req;
}

const replicateCount = async (code: string): Promise<number> =>
  (await t.db.query(`SELECT count(*)::int AS n FROM replicate r JOIN sample s ON s.id = r.sample_id WHERE s.code = $1`, [code]))[0].n;

/** A file of the demo shape with the given metadata lines and no sample code anywhere. */
function plainExport(fileName: string, metadata: string[]): { fileName: string; text: string } {
  const body = filesOf('OP-7K3M-Q9')[0].text.split('\n').filter((l) => !l.startsWith('#'));
  return { fileName, text: [...metadata, ...body].join('\n') };
}

describe('a file that names another sample', () => {
  it('is refused with 409 naming the file, the code and the line; nothing is saved', async () => {
    const [milk] = filesOf('OP-8MJA-4T');
    const res = await upload('OP-6TBS-3H', await t.authFor('analyst'), [milk]);
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({ type: 'urn:ohmprint:problem:other-sample', problem: 'other-sample', fileName: milk.fileName, namedCode: 'OP-8MJA-4T', line: 3 });
    expect(res.body.detail).toContain(`${milk.fileName}: names sample OP-8MJA-4T in line 3`);
    expect(res.body.errors).toEqual([{ field: `files[${milk.fileName}]`, message: expect.stringContaining('not OP-6TBS-3H') }]);
    expect(await replicateCount('OP-6TBS-3H')).toBe(0);
  });

  it('does not stop the good files of the same upload', async () => {
    const [apple] = filesOf('OP-6TBS-3H');
    const [milk] = filesOf('OP-8MJA-4T');
    const res = await upload('OP-6TBS-3H', await t.authFor('analyst'), [apple, milk]);
    expect(res.status).toBe(201);
    expect(res.body.saved.map((r: { fileName: string }) => r.fileName)).toEqual([apple.fileName]);
    expect(res.body.saved[0]).toMatchObject({
      temperatureC: 20.5,
      temperatureSource: 'file',
      declared: { identity: 'matches', fileNameCodes: ['OP-6TBS-3H'], sample: { codes: ['OP-6TBS-3H'], line: 3 }, instrument: { text: 'Bench analyser 1 (demo) (Invented IA-200)', line: 2 } },
    });
    expect(res.body.rejected).toEqual([
      { fileName: milk.fileName, line: 3, column: null, problem: 'other-sample', namedCode: 'OP-8MJA-4T', fileTemperatureC: 19, message: expect.stringContaining('names sample OP-8MJA-4T') },
    ]);
  });

  it('is kept when the analyst confirms with a reason, and the confirmation is audited', async () => {
    const [, milk2] = filesOf('OP-8MJA-4T');
    const analyst = await t.authFor('analyst');
    const reason = 'Bench PC mislabelled the export; cup 6TBS-3H was on the cell';
    const tooShort = await upload('OP-6TBS-3H', analyst, [milk2], { confirmations: [{ fileName: milk2.fileName, about: 'sample-code', reason: 'ok' }] });
    expect(tooShort.status).toBe(400);
    expect(tooShort.body.errors[0].field).toMatch(/^confirmations/);
    const notJson = await upload('OP-6TBS-3H', analyst, [milk2], { confirmations: '{"fileName":' });
    expect(notJson.status).toBe(400);

    const res = await upload('OP-6TBS-3H', analyst, [milk2], { confirmations: [{ fileName: milk2.fileName, about: 'sample-code', reason }] });
    expect(res.status).toBe(201);
    expect(res.body.saved[0].declared).toMatchObject({ identity: 'other-sample-confirmed', otherCodes: ['OP-8MJA-4T'], identityReason: reason });
    const [audit] = await t.db.query(`SELECT actor_user_id, details FROM audit_event WHERE action = 'measurement.other-sample-confirmed'`);
    expect(audit.actor_user_id).not.toBeNull();
    expect(audit.details).toMatchObject({ code: 'OP-6TBS-3H', fileName: milk2.fileName, reason, namedCodes: ['OP-8MJA-4T'], replicateId: res.body.saved[0].id });
  });

  it('is accepted when it names no code at all', async () => {
    const res = await upload('OP-7K3M-Q9', await t.authFor('analyst'), [plainExport('sweep-0001.csv', ['# Sample name: red wine, bottle 2', '# Temperature: 22.5 °C'])]);
    expect(res.status).toBe(201);
    expect(res.body.saved[0].declared).toMatchObject({ identity: 'no-code', otherCodes: [], sample: { text: 'red wine, bottle 2', codes: [] } });
  });

  it('is refused when only its file name names another sample', async () => {
    const res = await upload('OP-7K3M-Q9', await t.authFor('analyst'), [plainExport('OP-9RWD-6F_rep1.csv', ['# Temperature: 22.5 C'])]);
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({ fileName: 'OP-9RWD-6F_rep1.csv', namedCode: 'OP-9RWD-6F', line: null });
    expect(res.body.detail).toContain('in its file name');
  });
});

describe('the measurement temperature', () => {
  it('comes from the file; a typed value within the method limit is ignored', async () => {
    const res = await upload('OP-4HXT-2B', await t.authFor('analyst'), filesOf('OP-4HXT-2B').slice(0, 1), { temperatureC: '18.3' });
    expect(res.status).toBe(201);
    // The file's third line says "Temperature: 18 C"; the method allows 0.5 °C by default.
    expect(res.body.saved[0]).toMatchObject({ temperatureC: 18, temperatureSource: 'file', declared: { temperature: { value: 18, unit: 'degC', line: 3 } } });
  });

  it('refuses a typed value further from the file than the limit, naming the file, unless a reason is given (audited)', async () => {
    const analyst = await t.authFor('analyst');
    const [, rep2] = filesOf('OP-4HXT-2B');
    const res = await upload('OP-4HXT-2B', analyst, [rep2], { temperatureC: '20' });
    expect(res.status).toBe(400);
    expect(res.body).toMatchObject({ type: 'urn:ohmprint:problem:measurement-temperature', problem: 'temperature-mismatch', fileName: rep2.fileName, line: 3, fileTemperatureC: 18 });
    expect(res.body.errors[0]).toEqual({ field: `files[${rep2.fileName}]`, message: expect.stringContaining('line 3 states 18 °C, but 20 °C was entered') });

    const reason = 'Probe of the analyser reads 2 °C low; calibrated thermometer in the cup read 20.0 °C';
    const kept = await upload('OP-4HXT-2B', analyst, [rep2], { temperatureC: '20', confirmations: [{ fileName: rep2.fileName, about: 'temperature', reason }] });
    expect(kept.status).toBe(201);
    expect(kept.body.saved[0]).toMatchObject({ temperatureC: 20, temperatureSource: 'entered-over-file', declared: { temperatureReason: reason } });
    const [audit] = await t.db.query(`SELECT details FROM audit_event WHERE action = 'measurement.temperature-confirmed'`);
    expect(audit.details).toMatchObject({ fileName: rep2.fileName, fileTemperatureC: 18, enteredTemperatureC: 20, reason });
  });

  it('is the typed one for a file that states none, and is required then', async () => {
    const analyst = await t.authFor('analyst');
    const silent = plainExport('no-temperature.csv', ['# Sample: OP-7K3M-Q9']);
    const missing = await upload('OP-7K3M-Q9', analyst, [silent]);
    expect(missing.status).toBe(400);
    expect(missing.body).toMatchObject({ problem: 'temperature-missing', fileName: 'no-temperature.csv' });
    const res = await upload('OP-7K3M-Q9', analyst, [silent], { temperatureC: '22.4' });
    expect(res.status).toBe(201);
    expect(res.body.saved[0]).toMatchObject({ temperatureC: 22.4, temperatureSource: 'entered' });
  });

  it('reads kelvin and refuses a temperature no liquid on the bench has', async () => {
    const analyst = await t.authFor('analyst');
    const kelvin = await upload('OP-7K3M-Q9', analyst, [plainExport('k.csv', ['# Temperature [K]: 295.65'])]);
    expect(kelvin.status).toBe(201);
    expect(kelvin.body.saved[0].temperatureC).toBeCloseTo(22.5, 9); // 295.65 K − 273.15 (SI definition)
    const hot = await upload('OP-7K3M-Q9', analyst, [plainExport('hot.csv', ['# Temperature: 295.65 °C'])]);
    expect(hot.status).toBe(400);
    expect(hot.body).toMatchObject({ problem: 'temperature-out-of-range', fileName: 'hot.csv', line: 1 });
  });
});

describe('who may confirm', () => {
  it('lets a bench computer confirm with a reason too, recorded against its key', async () => {
    const issued = await request(t.app).post('/api/lab/instrument-keys').set(await t.authFor('lab-admin')).send({ name: 'Bench PC 2' });
    const key = { Authorization: `Bearer ${issued.body.secret}` };
    const file = plainExport('OP-9RWD-6F_cup.csv', ['# Temperature: 22.5 C']);
    const res = await upload('OP-7K3M-Q9', key, [file], { confirmations: [{ fileName: file.fileName, about: 'sample-code', reason: 'Cup labels swapped at the bench; checked by weight' }] });
    expect(res.status).toBe(201);
    const [audit] = await t.db.query(`SELECT actor_user_id, details FROM audit_event WHERE action = 'measurement.other-sample-confirmed' AND details->>'fileName' = $1`, [file.fileName]);
    expect(audit).toMatchObject({ actor_user_id: null, details: { instrumentKeyId: issued.body.key.id } });
  });

  it('refuses confirmations from a reviewer and from another lab', async () => {
    const [milk] = filesOf('OP-8MJA-4T');
    const confirmations = [{ fileName: milk.fileName, about: 'sample-code', reason: 'I am sure this is right' }];
    expect((await upload('OP-6TBS-3H', await t.authFor('reviewer'), [milk], { confirmations })).status).toBe(403);
    expect((await upload('OP-6TBS-3H', await t.authFor('analyst', 'marlow'), [milk], { confirmations })).status).toBe(404);
    expect((await upload('OP-6TBS-3H', {}, [milk], { confirmations })).status).toBe(401);
  });
});

describe('the measurements list', () => {
  it('shows each replicate’s file name and what was read from it', async () => {
    const [sample] = await t.db.query(`SELECT id FROM sample WHERE code = 'OP-6TBS-3H'`);
    const res = await request(t.app).get(`/api/lab/samples/${sample.id}/measurements`).set(await t.authFor('reviewer'));
    expect(res.status).toBe(200);
    expect(res.body.replicates.map((r: { fileName: string; declared: { identity: string } }) => [r.fileName, r.declared.identity])).toEqual([
      ['OP-6TBS-3H_cloudy-apple_rep1.csv', 'matches'],
      ['OP-8MJA-4T_whole-milk_rep2.csv', 'other-sample-confirmed'],
    ]);
  });
});
