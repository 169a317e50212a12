import type { EntityManager } from 'typeorm';
import type { Page, ReportDetail, ReportListQuery, ReportSummary } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { cappedCount, escapeLike, sparseSearchIds, pageParams, toCappedPage, totalCapFor } from '../../core/paging';
import { formatVerificationCode, verificationUrl } from './verification-code';
import { TestReport } from './test-report.entity';

/** Whose reports a query may see: a lab's, or one client organisation's within its lab. */
export interface ReportScope {
  labId: string;
  clientOrganisationId?: string;
}

const SORT_COLUMNS: Record<ReportListQuery['sort'], string> = { issuedAt: 'r.issued_at', number: 'r.number', status: 'r.status' };

const SELECT = `
  SELECT r.id, r.number, r.revision, r.status, r.verdict, r.sample_code, r.product_name, r.analysis_id,
         r.client_organisation_id, co.name AS client_name, r.issued_at, r.sha256, r.pdf_size,
         rep.number AS replaces_number, sup.number AS superseded_by_number, r.amendment_reason,
         r.revoked_at, r.revocation_reason, r.verification_code,
         iu.display_name AS issued_by, ru.display_name AS revoked_by
    FROM test_report r
    JOIN client_organisation co ON co.id = r.client_organisation_id
    JOIN app_user iu ON iu.id = r.issued_by_user_id
    LEFT JOIN app_user ru ON ru.id = r.revoked_by_user_id
    LEFT JOIN test_report rep ON rep.id = r.replaces_report_id
    LEFT JOIN test_report sup ON sup.id = r.superseded_by_report_id`;

interface Row {
  id: string;
  number: string;
  revision: number;
  status: ReportSummary['status'];
  verdict: ReportSummary['verdict'];
  sample_code: string;
  product_name: string;
  analysis_id: string;
  client_organisation_id: string;
  client_name: string;
  issued_at: Date;
  sha256: string;
  pdf_size: number;
  replaces_number: string | null;
  superseded_by_number: string | null;
  amendment_reason: string | null;
  revoked_at: Date | null;
  revocation_reason: string | null;
  verification_code: string;
  issued_by: string;
  revoked_by: string | null;
}

function where(scope: ReportScope, params: unknown[]): string {
  params.push(scope.labId);
  let clause = `r.lab_id = $${params.length}`;
  if (scope.clientOrganisationId) {
    params.push(scope.clientOrganisationId);
    clause += ` AND r.client_organisation_id = $${params.length}`;
  }
  return clause;
}

function summary(row: Row): ReportSummary {
  return {
    id: row.id,
    number: row.number,
    revision: row.revision,
    status: row.status,
    verdict: row.verdict,
    sampleCode: row.sample_code,
    productName: row.product_name,
    clientOrganisation: { id: row.client_organisation_id, name: row.client_name },
    analysisId: row.analysis_id,
    issuedAt: row.issued_at.toISOString(),
    sha256: row.sha256,
    pdfSize: row.pdf_size,
    replacesNumber: row.replaces_number,
    supersededByNumber: row.superseded_by_number,
    amendmentReason: row.amendment_reason,
    revokedAt: row.revoked_at?.toISOString() ?? null,
    revocationReason: row.revocation_reason,
  };
}

/** A page of reports in scope, searchable by number, sample code, product or client. */
export async function listReports(manager: EntityManager, scope: ReportScope, query: ReportListQuery): Promise<Page<ReportSummary>> {
  const params: unknown[] = [];
  let clause = where(scope, params);
  if (query.status) {
    params.push(query.status);
    clause += ` AND r.status = $${params.length}`;
  }
  if (query.q) {
    params.push(escapeLike(query.q));
    const p = `$${params.length}`;
    // one arm per column, each on its own (trigram) index, rather than one OR tested on every report
    const clients = `SELECT c2.id FROM client_organisation c2 WHERE c2.lab_id = $1 AND c2.name ILIKE ${p}`;
    const arms = [
      `SELECT x.id FROM test_report x WHERE x.lab_id = $1 AND x.number ILIKE ${p}`,
      `SELECT x.id FROM test_report x WHERE x.lab_id = $1 AND x.sample_code ILIKE ${p}`,
      `SELECT x.id FROM test_report x WHERE x.lab_id = $1 AND x.product_name ILIKE ${p}`,
      `SELECT x.id FROM test_report x WHERE x.lab_id = $1 AND x.client_organisation_id IN (${clients})`,
    ];
    const ids = await sparseSearchIds(manager, arms, params);
    if (ids) params[params.length - 1] = ids;
    clause += ids
      ? ` AND r.id = ANY(${p}::uuid[])`
      : ` AND (r.number ILIKE ${p} OR r.sample_code ILIKE ${p} OR r.product_name ILIKE ${p} OR r.client_organisation_id IN (${clients}))`;
  }
  const { skip, take } = pageParams(query);
  const order = `${SORT_COLUMNS[query.sort]} ${query.dir === 'asc' ? 'ASC' : 'DESC'}, r.number ${query.dir === 'asc' ? 'ASC' : 'DESC'}`;
  // the page is chosen on test_report alone (an index walks the order), then joined for names
  const [rows, counted] = await Promise.all([
    manager.query(
      `${SELECT.replace('FROM test_report r', `FROM (SELECT r.* FROM test_report r JOIN (SELECT r.id FROM test_report r WHERE ${clause} ORDER BY ${order} LIMIT ${take} OFFSET ${skip}) page USING (id)) r`)} ORDER BY ${order}`,
      params,
    ) as Promise<Row[]>,
    cappedCount(manager, `FROM test_report r WHERE ${clause}`, params, totalCapFor(query)),
  ]);
  return toCappedPage(rows.map(summary), counted, query);
}

/** One report in scope with its verification details; another tenant's answers 404. */
export async function reportDetail(manager: EntityManager, scope: ReportScope, id: string): Promise<ReportDetail> {
  const params: unknown[] = [];
  const clause = where(scope, params);
  params.push(id);
  const rows: Row[] = await manager.query(`${SELECT} WHERE ${clause} AND r.id = $${params.length}`, params);
  if (!rows.length) throw ApiError.notFound('The report');
  const row = rows[0];
  const [{ remarks }]: Array<{ remarks: string | null }> = await manager.query(`SELECT content->>'remarks' AS remarks FROM test_report WHERE id = $1`, [row.id]);
  return {
    ...summary(row),
    remarks,
    verificationCode: formatVerificationCode(row.verification_code),
    verificationUrl: verificationUrl(row.number, row.verification_code),
    issuedBy: row.issued_by,
    revokedBy: row.revoked_by,
  };
}

/** The issued PDF bytes, for download. */
export async function reportPdf(manager: EntityManager, scope: ReportScope, id: string): Promise<{ number: string; pdf: Buffer; sha256: string }> {
  const qb = manager
    .getRepository(TestReport)
    .createQueryBuilder('r')
    .select(['r.number', 'r.sha256'])
    .addSelect('r.pdf')
    .where('r.id = :id AND r.lab_id = :labId', { id, labId: scope.labId });
  if (scope.clientOrganisationId) qb.andWhere('r.client_organisation_id = :org', { org: scope.clientOrganisationId });
  const report = await qb.getOne();
  if (!report) throw ApiError.notFound('The report');
  return { number: report.number, pdf: report.pdf, sha256: report.sha256 };
}
