import { randomInt } from 'node:crypto';
import type { EntityManager } from 'typeorm';

/**
 * For the reports tests: the rows an approval needs (product, order, sample, draft library
 * version, analysis awaiting review) inserted directly, so these tests do not depend on the
 * intake and analysis screens. Invented demo values.
 */
export interface SubmittedAnalysis {
  labId: string;
  clientOrganisationId: string;
  sampleId: string;
  sampleCode: string;
  analysisId: string;
  reviewerUserId: string;
}

const CODE_ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';
const code = (n: number) => Array.from({ length: n }, () => CODE_ALPHABET[randomInt(CODE_ALPHABET.length)]).join('');

export async function insertSubmittedAnalysis(
  manager: EntityManager,
  who: { labName: string; clientName: string; analystEmail: string; reviewerEmail: string },
): Promise<SubmittedAnalysis> {
  const [lab] = await manager.query('SELECT id FROM lab WHERE name = $1', [who.labName]);
  const [client] = await manager.query('SELECT id FROM client_organisation WHERE lab_id = $1 AND name = $2', [lab.id, who.clientName]);
  const [analyst] = await manager.query('SELECT id FROM app_user WHERE email = $1', [who.analystEmail]);
  const [reviewer] = await manager.query('SELECT id FROM app_user WHERE email = $1', [who.reviewerEmail]);
  const [product] = await manager.query(
    `INSERT INTO product (lab_id, client_organisation_id, name, matrix) VALUES ($1, $2, $3, 'wine') RETURNING id`,
    [lab.id, client.id, `Demo wine ${code(6)}`],
  );
  const [order] = await manager.query(
    'INSERT INTO test_order (lab_id, client_organisation_id, product_id, placed_by_user_id) VALUES ($1, $2, $3, $4) RETURNING id',
    [lab.id, client.id, product.id, analyst.id],
  );
  const sampleCode = `OP-${code(4)}-${code(2)}`;
  const [sample] = await manager.query(
    `INSERT INTO sample (lab_id, order_id, code, state, obtained_where, obtained_on, received_at)
     VALUES ($1, $2, $3, 'in-review', 'Demo shop', '2026-11-20', now()) RETURNING id`,
    [lab.id, order.id, sampleCode],
  );
  const [library] = await manager.query('INSERT INTO reference_library (lab_id, product_id) VALUES ($1, $2) RETURNING id', [lab.id, product.id]);
  const [version] = await manager.query(
    `INSERT INTO library_version (lab_id, library_id, version, method, grid_hz, engine_version)
     VALUES ($1, $2, 1, '{}'::jsonb, ARRAY[10, 100, 1000]::float8[], '0.1.0') RETURNING id`,
    [lab.id, library.id],
  );
  const [analysis] = await manager.query(
    `INSERT INTO analysis (lab_id, sample_id, library_version_id, status, verdict, replicate_ids, method, engine_version, result, sample_spectrum, analyst_user_id, submitted_at)
     VALUES ($1, $2, $3, 'submitted', 'consistent', '{}', '{}'::jsonb, '0.1.0', '{}'::jsonb, '{}'::jsonb, $4, now()) RETURNING id`,
    [lab.id, sample.id, version.id, analyst.id],
  );
  return { labId: lab.id, clientOrganisationId: client.id, sampleId: sample.id, sampleCode, analysisId: analysis.id, reviewerUserId: reviewer.id };
}
