import request from 'supertest';
import { DEFAULT_METHOD } from '../modules/libraries/default-method';
import { DEMO_CELL_CONSTANT } from '../../../../docker-free-scripts/seed/lab-demo-files';
import { demoRandom, demoSweeps, DEMO_PROFILES, seedFrom, suspectParameters } from '../../../../docker-free-scripts/seed/lab-demo-spectra';
import type { TestApp } from './test-app';

const CODE_CHARS = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';

/** A sample code the schema accepts, unique per (prefix, n). */
function codeOf(prefix: string, n: number): string {
  const a = CODE_CHARS[Math.floor(n / CODE_CHARS.length) % CODE_CHARS.length];
  const b = CODE_CHARS[n % CODE_CHARS.length];
  return `OP-${prefix.padEnd(2, 'X').slice(0, 2)}${a}${b}-RF`;
}

export interface EnrolledLots {
  productId: string;
  sampleCodes: string[];
}

/**
 * A new product of a demo client with `count` enrolled reference lots, each accepted and measured
 * through the upload route (two invented replicates of the named demo profile at 20 °C). Sample
 * codes start with the two-character `prefix`.
 */
export async function enrolReferenceLots(
  t: TestApp,
  options: { productName: string; matrix: string; client: string; profile: string; count: number; prefix: string; chemistry?: boolean },
): Promise<EnrolledLots> {
  const [lab] = await t.db.query(`SELECT id FROM lab WHERE name = 'Calder Analytical'`);
  const [client] = await t.db.query(`SELECT id FROM client_organisation WHERE lab_id = $1 AND name = $2`, [lab.id, options.client]);
  const [placer] = await t.db.query(`SELECT placed_by_user_id AS id FROM test_order WHERE client_organisation_id = $1 LIMIT 1`, [client.id]);
  const [product] = await t.db.query(`INSERT INTO product (lab_id, client_organisation_id, name, matrix) VALUES ($1, $2, $3, $4) RETURNING id`, [lab.id, client.id, options.productName, options.matrix]);
  const [order] = await t.db.query(`INSERT INTO test_order (lab_id, client_organisation_id, product_id, status, placed_by_user_id) VALUES ($1, $2, $3, 'in-progress', $4) RETURNING id`, [
    lab.id,
    client.id,
    product.id,
    placer.id,
  ]);
  const analyst = await t.authFor('analyst');
  const bench = (await request(t.app).get('/api/lab/bench').set(analyst)).body;
  const profile = DEMO_PROFILES[options.profile];
  const sampleCodes: string[] = [];
  for (let i = 0; i < options.count; i++) {
    const code = codeOf(options.prefix, i);
    const declaration = {
      lotCode: `${options.prefix}-LOT-${String(i + 1).padStart(3, '0')}`,
      producedOn: `2026-0${1 + (i % 9)}-1${i % 10}`,
      volumeMl: 500,
      ...(options.chemistry && i % 2 === 0 ? { chemistry: { pH: 3.4 + i * 0.01 } } : {}),
    };
    await t.db.query(
      `INSERT INTO sample (lab_id, order_id, code, state, obtained_where, obtained_on, kind, reference_lot, received_at)
       VALUES ($1, $2, $3, 'accepted', 'Producer (invented test lot)', '2026-10-01', 'reference-lot', $4, now())`,
      [lab.id, order.id, code, JSON.stringify(declaration)],
    );
    const rng = demoRandom(seedFrom(`test-lot:${options.prefix}:${i}`));
    const sweeps = demoSweeps(suspectParameters(profile, { kind: 'none' }, rng), profile.model, {
      cellConstantPerCm: DEMO_CELL_CONSTANT,
      temperatureC: 20,
      referenceTemperatureC: DEFAULT_METHOD.referenceTemperatureC,
      coefficientPerC: DEFAULT_METHOD.temperatureCoefficientPerC,
    }, 2, rng);
    let upload = request(t.app).post(`/api/lab/samples/${code}/measurements`).set(analyst).field('instrumentId', bench.instruments[0].id).field('cellId', bench.cells[0].id).field('temperatureC', '20');
    sweeps.forEach((s, r) => {
      const rows = Array.from(s.frequencyHz, (f, k) => `${f},${s.re[k]},${s.im[k]}`);
      upload = upload.attach('files', Buffer.from(["Frequency (Hz),Z' (Ohm),Z'' (Ohm)", ...rows].join('\n') + '\n'), `lot-${i + 1}-rep${r + 1}.csv`);
    });
    const res = await upload;
    if (res.status !== 201) throw new Error(`uploading reference lot ${code} answered ${res.status}: ${JSON.stringify(res.body)}`);
    sampleCodes.push(code);
  }
  return { productId: product.id, sampleCodes };
}
