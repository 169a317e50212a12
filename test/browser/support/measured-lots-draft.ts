import type { Client } from 'pg';
import { DEFAULT_METHOD } from '../../../apps/api/src/modules/libraries/default-method';
import { DEMO_CELL_CONSTANT } from '../../../docker-free-scripts/seed/lab-demo-files';
import { demoRandom, demoSweeps, DEMO_PROFILES, seedFrom, suspectParameters } from '../../../docker-free-scripts/seed/lab-demo-spectra';
import { url } from './browser';
import { accessTokenFor } from './desk';
import { apiAs } from './lab-api';

export interface MeasuredLotsDraft {
  draftId: string;
  orderId: string;
}

/**
 * A new juice product of Calder's client Sunvale, `lots` of its lots enrolled and measured through
 * the upload route (two invented sweeps each: sample codes `OP-<codePrefix>NN-RF`, lot codes
 * `<lotPrefix>-NNN`), a method of its own, and an analyst's draft library of those lots.
 */
export async function measuredLotsDraft(db: Client, o: { product: string; lots: number; codePrefix: string; lotPrefix: string; seed: string; methodName: string }): Promise<MeasuredLotsDraft> {
  const { rows: [lab] } = await db.query(`SELECT id FROM lab WHERE name = 'Calder Analytical'`);
  const { rows: [client] } = await db.query(`SELECT id FROM client_organisation WHERE lab_id = $1 AND name = 'Sunvale Juice Works'`, [lab.id]);
  const { rows: [placer] } = await db.query(`SELECT placed_by_user_id AS id FROM test_order WHERE client_organisation_id = $1 LIMIT 1`, [client.id]);
  const { rows: [product] } = await db.query(`INSERT INTO product (lab_id, client_organisation_id, name, matrix) VALUES ($1, $2, $3, 'juice') RETURNING id`, [lab.id, client.id, o.product]);
  const { rows: [order] } = await db.query(`INSERT INTO test_order (lab_id, client_organisation_id, product_id, status, placed_by_user_id) VALUES ($1, $2, $3, 'in-progress', $4) RETURNING id`, [lab.id, client.id, product.id, placer.id]);
  const token = await accessTokenFor('analyst@calder.test');
  const bench = (await (await fetch(url('/api/lab/bench'), { headers: { Authorization: `Bearer ${token}` } })).json()) as { instruments: { id: string }[]; cells: { id: string }[] };
  const profile = DEMO_PROFILES['cloudy-apple'];
  for (let i = 0; i < o.lots; i++) {
    const code = `OP-${o.codePrefix}${String(i).padStart(2, '0')}-RF`;
    await db.query(
      `INSERT INTO sample (lab_id, order_id, code, state, obtained_where, obtained_on, kind, reference_lot, received_at)
       VALUES ($1, $2, $3, 'accepted', 'Producer (invented test lot)', '2026-10-01', 'reference-lot', $4, now())`,
      [lab.id, order.id, code, JSON.stringify({ lotCode: `${o.lotPrefix}-${String(i + 1).padStart(3, '0')}`, producedOn: `2026-0${1 + (i % 9)}-15`, volumeMl: 500 })],
    );
    const rng = demoRandom(seedFrom(`${o.seed}:${i}`));
    const conditions = { cellConstantPerCm: DEMO_CELL_CONSTANT, temperatureC: 20, referenceTemperatureC: 20, coefficientPerC: 0.02 };
    const form = new FormData();
    form.append('instrumentId', bench.instruments[0].id);
    form.append('cellId', bench.cells[0].id);
    form.append('temperatureC', '20');
    const fileStem = o.product.split(' ')[1].toLowerCase();
    demoSweeps(suspectParameters(profile, { kind: 'none' }, rng), profile.model, conditions, 2, rng).forEach((s, r) => {
      const rows = Array.from(s.frequencyHz, (f, k) => `${f},${s.re[k]},${s.im[k]}`);
      form.append('files', new Blob([["Frequency (Hz),Z' (Ohm),Z'' (Ohm)", ...rows].join('\n') + '\n']), `${fileStem}-${i + 1}-rep${r + 1}.csv`);
    });
    const res = await fetch(url(`/api/lab/samples/${code}/measurements`), { method: 'POST', headers: { Authorization: `Bearer ${token}` }, body: form });
    if (res.status !== 201) throw new Error(`uploading ${code} answered ${res.status}: ${await res.text()}`);
  }
  const method = await apiAs('admin@calder.test', '/api/lab/methods', { method: 'POST', body: JSON.stringify({ name: o.methodName, matrix: 'juice', settings: { ...DEFAULT_METHOD, model: 'cole-cole' } }) });
  if (method.status !== 201) throw new Error(`method answered ${method.status}: ${await method.text()}`);
  const draft = await apiAs('analyst@calder.test', '/api/lab/library-drafts', { method: 'POST', body: JSON.stringify({ productId: product.id, methodVersionId: ((await method.json()) as { id: string }).id }) });
  if (draft.status !== 201) throw new Error(`draft answered ${draft.status}: ${await draft.text()}`);
  return { draftId: ((await draft.json()) as { id: string }).id, orderId: order.id };
}
