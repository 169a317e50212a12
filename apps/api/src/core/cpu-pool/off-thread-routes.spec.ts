import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { createSpectrumIndex, fitModel, impedance, parseSpectrumFile } from '@ohmprint/spectral-engine';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { seedValidationDemo } from '../../../../../docker-free-scripts/seed/validation-demo';
import { measureDemoSample, useTestApp } from '../../testing';
import { probeOffThread, type OffThreadProbe } from '../../testing/off-thread-probe';
import { DEFAULT_METHOD } from '../../modules/libraries/default-method';
import { publishedLibrary } from '../../modules/libraries/published-library';
import { prepareReplicates } from '../../modules/measurements/prepared-replicates';
import { Replicate } from '../../modules/measurements/replicate.entity';
import { renderLabelPack } from '../../modules/orders/label-pack';
import { labelPackData } from '../../modules/orders/label-pack-data';
import { readCredential } from '../../modules/reports/signing/credential-details';
import { createSelfSignedCredential } from '../../modules/reports/signing/self-signed-credential';
import { kclExport } from '../../modules/validation/kcl-export.fixture';
import { closeCpuPool } from './cpu-pool';

// Seeding the demo libraries and studies takes seconds on a busy two-core machine.
jest.setTimeout(120_000);

const t = useTestApp();
afterAll(() => closeCpuPool());

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  await t.db.transaction((m) => seedValidationDemo(m));
});

/**
 * The work ran in the pool and the event loop kept answering: health came back while the task ran
 * and the loop never stalled for long (a generous bound for a loaded two-core machine: the same
 * work on the event loop would stall it for the whole task, and no health answer could interleave).
 */
function expectResponsive(probe: OffThreadProbe<unknown>): void {
  expect(probe.tasks).toBeGreaterThanOrEqual(1);
  expect(probe.healthAnswersDuringTask).toBeGreaterThanOrEqual(1);
  expect(probe.maxStallMs).toBeLessThan(1500);
}

const binary = (r: request.Test) =>
  r.buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  });

function pdfText(pdf: Buffer): string {
  const dir = mkdtempSync(join(tmpdir(), 'off-thread-'));
  try {
    writeFileSync(join(dir, 'a.pdf'), pdf);
    return execFileSync('pdftotext', ['-layout', join(dir, 'a.pdf'), '-'], { encoding: 'utf8' });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** The PDF without its creation time and the file identifier made from it: all that differs between two renderings of the same data. */
const withoutDates = (pdf: Buffer) => pdf.toString('latin1').replace(/\(D:\d{14}Z\)/g, '').replace(/\/ID \[<[0-9a-f]+> <[0-9a-f]+>\]/, '');

async function aPublishedVersion(productName: string): Promise<{ versionId: string; labId: string }> {
  const [v] = await t.db.query(
    `SELECT v.id, v.lab_id FROM library_version v JOIN reference_library l ON l.id = v.library_id JOIN product p ON p.id = l.product_id
     WHERE p.name = $1 AND v.status = 'published' ORDER BY v.version DESC LIMIT 1`,
    [productName],
  );
  return { versionId: v.id, labId: v.lab_id };
}

describe('CPU work answered from the worker pool, with the event loop free', () => {
  it('renders the label pack in a worker, byte for byte as on the request thread', async () => {
    const member = await t.authFor('client-member');
    const orders = await request(t.app).get('/api/client/orders?pageSize=50').set(member);
    const order = orders.body.items.find((o: { status: string }) => o.status !== 'cancelled');
    const probe = await probeOffThread(t.app, 'labelPack', () => binary(request(t.app).get(`/api/client/orders/${order.id}/label-pack`).set(member)));
    expect(probe.result.status).toBe(200);
    expectResponsive(probe);
    const [scope] = await t.db.query(`SELECT o.lab_id AS "labId", o.client_organisation_id AS "clientOrganisationId" FROM test_order o WHERE o.id = $1`, [order.id]);
    const inProcess = await renderLabelPack(await labelPackData(t.db.manager, scope, order.id));
    expect(withoutDates(probe.result.body as Buffer)).toBe(withoutDates(inProcess));
  });

  it('fits the library’s lots in a worker for the correlation study, with the engine’s own parameters', async () => {
    const { versionId, labId } = await aPublishedVersion('Ridgeline Red (demo)');
    await t.db.query(`DELETE FROM lot_fit WHERE lab_id = $1`, [labId]);
    const admin = await t.authFor('lab-admin');
    const probe = await probeOffThread(t.app, 'fitLots', () => request(t.app).get(`/api/lab/validation/library-versions/${versionId}/correlation`).set(admin));
    expect(probe.result.status).toBe(200);
    expectResponsive(probe);
    const library = await publishedLibrary(t.db.manager, labId, versionId);
    const byCode = new Map(probe.result.body.lots.map((l: { lotCode: string; parameters: Record<string, number | null> }) => [l.lotCode, l.parameters]));
    library.lots.forEach((lot, i) => {
      const fit = fitModel(library.spectra[i], library.method.model, { restarts: 1 });
      const expected = Object.fromEntries(probe.result.body.parameters.map((p: { name: string }) => [p.name, fit.converged ? fit.parameters[p.name] : null]));
      expect(byCode.get(lot.lotCode)).toEqual(expected);
    });
  });

  it('renders the validation summary PDF in a worker, with the same text as on the request thread', async () => {
    const { versionId } = await aPublishedVersion('Ridgeline Red (demo)');
    const admin = await t.authFor('lab-admin');
    const probe = await probeOffThread(t.app, 'validationSummary', () => binary(request(t.app).get(`/api/lab/validation/library-versions/${versionId}/summary.pdf`).set(admin)));
    expect(probe.result.status).toBe(200);
    expectResponsive(probe);
    const text = pdfText(probe.result.body as Buffer);
    expect(text).toContain('Method validation summary');
    expect(text).toContain('Ridgeline Red (demo)');
  });

  it('fits the method preview in a worker, with the engine’s own fit', async () => {
    await measureDemoSample(t, 'OP-9RWD-6F');
    const admin = await t.authFor('lab-admin');
    const choices = await request(t.app).get('/api/lab/methods/preview-replicates').set(admin);
    const pick = choices.body.find((c: { sampleCode: string }) => c.sampleCode === 'OP-9RWD-6F');
    // The finest grid a method allows, so the fit lasts long enough for health to be asked meanwhile.
    const settings = { ...DEFAULT_METHOD, model: 'cole-cole', gridPoints: 400 };
    const probe = await probeOffThread(t.app, 'previewFit', () => request(t.app).post('/api/lab/methods/model-preview').set(admin).send({ replicateId: pick.replicateId, settings }));
    expect(probe.result.status).toBe(200);
    expectResponsive(probe);
    const replicate = await t.db.manager.findOneByOrFail(Replicate, { id: pick.replicateId });
    const [prepared] = prepareReplicates([replicate], settings);
    const fit = fitModel(prepared.spectrum!, 'cole-cole', { restarts: 3 });
    if (!fit.converged) throw new Error('the reference fit did not converge');
    expect(probe.result.body.parameters.map((p: { name: string; value: number }) => [p.name, p.value])).toEqual(fit.parameterNames.map((n) => [n, fit.parameters[n]]));
    expect(probe.result.body.fitted.re).toEqual(Array.from(impedance('cole-cole', fit.parameters, prepared.spectrum!.frequencyHz).re));
  });

  it('parses a KCl standard run and fits its resistance in a worker, recording the engine’s own R', async () => {
    const admin = await t.authFor('lab-admin');
    const made = await request(t.app).post('/api/lab/cells').set(admin).send({ name: 'Off-thread cell', nominalConstantPerCm: 1 });
    const cellId = made.body.cells.find((c: { name: string }) => c.name === 'Off-thread cell').id;
    // No point within 1° of 0° phase, so the resistance comes from an R + CPE fit.
    const text = kclExport(650, 10, 1000);
    const probe = await probeOffThread(t.app, 'readStandardRun', () =>
      request(t.app).post(`/api/lab/cells/${cellId}/standard-runs`).set(admin).field({ concentration: '0.01', basis: 'molal', temperatureC: '25' }).attach('file', Buffer.from(text), 'kcl.csv'));
    expect(probe.result.status).toBe(201);
    expectResponsive(probe);
    const run = probe.result.body.runs.at(-1);
    const fit = fitModel(parseSpectrumFile(text), 'r-cpe', { restarts: 1 });
    if (!fit.converged) throw new Error('the reference fit did not converge');
    expect(run.resistanceSource).toBe('fit');
    expect(run.plateauResistanceOhm).toBe(fit.parameters.r);
  });

  it('opens an uploaded PKCS#12 file in a worker (key derivation off the event loop), describing it as before', async () => {
    const p12 = createSelfSignedCredential({ labName: 'Calder Analytical (off-thread upload)', passphrase: 'off-thread passphrase' });
    const admin = await t.authFor('lab-admin');
    const probe = await probeOffThread(t.app, 'openCredential', () =>
      request(t.app).post('/api/lab/signing-credential').set(admin).field('passphrase', 'off-thread passphrase').attach('file', p12, 'signing.p12'));
    expect(probe.result.status).toBe(201);
    expectResponsive(probe);
    const expected = readCredential(p12, 'off-thread passphrase');
    expect(probe.result.body.credential).toMatchObject({ subject: expected.subject, fingerprintSha256: expected.fingerprintSha256, serialNumber: expected.serialNumber });
    // A wrong passphrase is still a 400 naming the field, from the worker's answer.
    const wrong = await request(t.app).post('/api/lab/signing-credential').set(admin).field('passphrase', 'not it').attach('file', p12, 'signing.p12');
    expect(wrong.status).toBe(400);
    expect(wrong.body.errors[0].field).toBe('passphrase');
  });

  it('builds the search index for the cross-product check in a worker, with the same nearest lots', async () => {
    const [row] = await t.db.query(
      `SELECT v.id, v.lab_id FROM library_version v JOIN reference_library l ON l.id = v.library_id JOIN product p ON p.id = l.product_id
       WHERE v.status = 'published' AND EXISTS (
         SELECT 1 FROM product q JOIN reference_library ql ON ql.product_id = q.id JOIN library_version qv ON qv.library_id = ql.id
         WHERE q.lab_id = p.lab_id AND q.client_organisation_id = p.client_organisation_id AND q.matrix = p.matrix AND q.id <> p.id
           AND qv.status IN ('published', 'draft') AND qv.grid_hz = v.grid_hz)
       LIMIT 1`,
    );
    if (!row) throw new Error('the demo has no two products of one matrix and client on one grid');
    const analyst = await t.authFor('analyst');
    const probe = await probeOffThread(t.app, 'nearestOthers', () => request(t.app).get(`/api/lab/library-versions/${row.id}/cross-product`).set(analyst));
    expect(probe.result.status).toBe(200);
    expectResponsive(probe);
    // The same confusion on the request thread: every included lot of the compared versions, nearest other lot.
    const lots: { lot_code: string; version: string }[] = [];
    const spectra = [];
    for (const p of probe.result.body.products as { libraryVersionId: string }[]) {
      const rows: { lot_code: string; spectrum: Buffer }[] = await t.db.query(
        `SELECT lot_code, spectrum FROM reference_lot WHERE library_version_id = $1 AND included ORDER BY lot_code, id`, [p.libraryVersionId]);
      const [{ grid_hz }] = await t.db.query(`SELECT grid_hz FROM library_version WHERE id = $1`, [p.libraryVersionId]);
      const { decodeLotSpectrum } = await import('../../modules/libraries/lot-spectrum-bytes');
      for (const r of rows) {
        lots.push({ lot_code: r.lot_code, version: p.libraryVersionId });
        spectra.push(decodeLotSpectrum(r.spectrum, Float64Array.from(grid_hz)));
      }
    }
    const index = createSpectrumIndex(spectra);
    const product = (i: number) => (probe.result.body.products as { libraryVersionId: string }[]).findIndex((p) => p.libraryVersionId === lots[i].version);
    const confusion = probe.result.body.products.map(() => probe.result.body.products.map(() => 0));
    spectra.forEach((s, i) => {
      const hit = index.nearest(s, 2).find((h) => h.index !== i)!;
      confusion[product(i)][product(hit.index)] += 1;
    });
    expect(probe.result.body.confusion).toEqual(confusion);
  });
});
