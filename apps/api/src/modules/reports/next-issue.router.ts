import type { Router } from 'express';
import { NextIssueSchema, type NextIssue } from '@ohmprint/contracts';
import { routeTable } from '../../core/route-table';
import { labIdOf } from '../../core/tenancy';
import { config } from '../../config';
import { dataSource } from '../../db/data-source';
import { ApiError } from '../../core/api-error';
import { Lab } from '../labs/lab.entity';
import { prefixCandidate } from './report-numbering';
import { currentCredential, describeCredential } from './signing/signing-credentials';

const tag = 'Reports';

/**
 * What the next approval will produce, read without taking anything: the report number the
 * counter would give now (no row is locked or written, so the number is not consumed and another
 * issuance may still take it first) and the credential that would sign.
 */
export async function nextIssue(labId: string, now = new Date()): Promise<NextIssue> {
  const manager = dataSource.manager;
  const lab = await manager.findOneBy(Lab, { id: labId });
  if (!lab) throw ApiError.notFound('The lab');
  const year = now.getUTCFullYear();
  const [row]: Array<{ prefix: string | null; last_value: number | null }> = await manager.query(
    `SELECT (SELECT prefix FROM report_numbering WHERE lab_id = $1) AS prefix,
            (SELECT last_value FROM report_number_sequence WHERE lab_id = $1 AND year = $2) AS last_value`,
    [labId, year],
  );
  const number = `${row.prefix ?? prefixCandidate(lab.name)}-${year}-${String((row.last_value ?? 0) + 1).padStart(6, '0')}`;
  const credential = await currentCredential(manager, labId);
  return {
    nextReportNumber: number,
    credential: credential ? describeCredential(credential) : null,
    // Without a credential, development creates a self-signed one on first issue; production refuses.
    withoutCredential: credential ? null : config.production ? 'refused' : 'development-self-signed',
  };
}

export function nextIssueRouter(): Router {
  const { router, route } = routeTable();
  route({ method: 'get', path: '/lab/report-numbers/next', tag,
    summary: 'The report number the next approval would take and the credential that would sign it (read-only: nothing is taken)',
    roles: ['reviewer', 'lab-admin'], response: NextIssueSchema }, async (_req, res) => {
    res.json(await nextIssue(labIdOf(res.locals.auth)));
  });
  return router;
}
