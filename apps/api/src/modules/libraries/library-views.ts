import type { EntityManager } from 'typeorm';
import type { Calibration as EngineCalibration } from '@ohmprint/spectral-engine';
import type { Calibration, LibraryItem, LibraryListQuery, LibraryVersionDetail, LibraryVersionSummary, MethodSettings, Page } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { escapeLike, pageParams, toPage } from '../../core/paging';

interface VersionRow {
  id: string;
  library_id: string;
  version: number;
  status: LibraryVersionSummary['status'];
  lot_count: number;
  calibration: EngineCalibration | null;
  published_at: Date | null;
  published_by_id: string | null;
  published_by_name: string | null;
  engine_version: string;
}

const VERSION_SQL = `
  SELECT v.id, v.library_id, v.version, v.status, v.calibration, v.published_at, v.engine_version,
         u.id AS published_by_id, u.display_name AS published_by_name,
         (SELECT count(*)::int FROM reference_lot r WHERE r.library_version_id = v.id) AS lot_count
  FROM library_version v LEFT JOIN app_user u ON u.id = v.published_by_user_id`;

function summary(v: VersionRow): LibraryVersionSummary {
  return {
    id: v.id,
    version: v.version,
    status: v.status,
    lotCount: v.lot_count,
    t95: v.calibration?.lowerThreshold ?? null,
    t99: v.calibration?.upperThreshold ?? null,
    publishedAt: v.published_at?.toISOString() ?? null,
    publishedBy: v.published_by_id ? { id: v.published_by_id, displayName: v.published_by_name ?? '' } : null,
    engineVersion: v.engine_version,
  };
}

/** The contract's view of the engine's calibration. */
export function calibrationView(c: EngineCalibration | null): Calibration | null {
  if (!c || c.lowerThreshold === null || c.upperThreshold === null) return null;
  return { t95: c.lowerThreshold, t99: c.upperThreshold, lotCount: c.lotCount, distances: [...c.nearestDistances].sort((a, b) => a - b) };
}

const LIBRARY_SORT: Record<LibraryListQuery['sort'], string> = { product: 'lower(p.name)', client: 'lower(co.name)' };

export async function listLibraries(manager: EntityManager, labId: string, query: LibraryListQuery): Promise<Page<LibraryItem>> {
  const params: unknown[] = [labId];
  let search = '';
  if (query.q) {
    params.push(escapeLike(query.q));
    search = `AND (p.name ILIKE $2 OR co.name ILIKE $2)`;
  }
  const { skip, take } = pageParams(query);
  params.push(take, skip);
  const rows: { id: string; product_id: string; product_name: string; matrix: LibraryItem['product']['matrix']; client_id: string; client_name: string; total: string }[] = await manager.query(
    `SELECT l.id, p.id AS product_id, p.name AS product_name, p.matrix, co.id AS client_id, co.name AS client_name, count(*) OVER () AS total
     FROM reference_library l JOIN product p ON p.id = l.product_id JOIN client_organisation co ON co.id = p.client_organisation_id
     WHERE l.lab_id = $1 ${search}
     ORDER BY ${LIBRARY_SORT[query.sort]} ${query.dir === 'asc' ? 'ASC' : 'DESC'}, l.id
     LIMIT $${params.length - 1} OFFSET $${params.length}`,
    params,
  );
  const versions: VersionRow[] = rows.length
    ? await manager.query(`${VERSION_SQL} WHERE v.lab_id = $1 AND v.library_id = ANY($2::uuid[]) ORDER BY v.version DESC`, [labId, rows.map((r) => r.id)])
    : [];
  const items = rows.map(
    (r): LibraryItem => ({
      id: r.id,
      product: { id: r.product_id, name: r.product_name, matrix: r.matrix },
      clientOrganisation: { id: r.client_id, name: r.client_name },
      versions: versions.filter((v) => v.library_id === r.id).map(summary),
    }),
  );
  return toPage(items, rows.length ? Number(rows[0].total) : 0, query);
}

export async function libraryVersionDetail(manager: EntityManager, labId: string, versionId: string): Promise<LibraryVersionDetail> {
  const [v]: (VersionRow & { method: MethodSettings; product_id: string; product_name: string; matrix: LibraryVersionDetail['product']['matrix'] })[] = await manager.query(
    `SELECT x.*, v2.method, p.id AS product_id, p.name AS product_name, p.matrix
     FROM (${VERSION_SQL} WHERE v.id = $1 AND v.lab_id = $2) x
     JOIN library_version v2 ON v2.id = x.id
     JOIN reference_library l ON l.id = x.library_id JOIN product p ON p.id = l.product_id`,
    [versionId, labId],
  );
  if (!v) throw ApiError.notFound('Library version');
  const lots: { id: string; lot_code: string; produced_on: string | null; note: string }[] = await manager.query(
    `SELECT id, lot_code, to_char(produced_on, 'YYYY-MM-DD') AS produced_on, note FROM reference_lot WHERE library_version_id = $1 AND lab_id = $2 ORDER BY lot_code, id`,
    [versionId, labId],
  );
  return {
    ...summary(v),
    libraryId: v.library_id,
    product: { id: v.product_id, name: v.product_name, matrix: v.matrix },
    method: v.method,
    calibration: calibrationView(v.calibration),
    lots: lots.map((l) => ({ id: l.id, lotCode: l.lot_code, producedOn: l.produced_on, note: l.note })),
  };
}
