import type { EntityManager } from 'typeorm';
import type { Calibration as EngineCalibration } from '@ohmprint/spectral-engine';
import { methodDifferences, type Calibration, type LibraryItem, type LibraryListQuery, type LibraryVersionDetail, type LibraryVersionSummary, type MethodSettings, type Page } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { cappedCount, escapeLike, pageParams, toCappedPage, totalCapFor } from '../../core/paging';
import { publishBlockers } from './library-versions';

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
  superseded_by: number | null;
  retired_at: Date | null;
}

const VERSION_SQL = `
  SELECT v.id, v.library_id, v.version, v.status, v.calibration, v.published_at, v.engine_version, v.retired_at,
         u.id AS published_by_id, u.display_name AS published_by_name,
         (SELECT count(*)::int FROM reference_lot r WHERE r.library_version_id = v.id AND r.included) AS lot_count,
         CASE WHEN v.status = 'draft' THEN NULL ELSE
           (SELECT min(n.version) FROM library_version n WHERE n.library_id = v.library_id AND n.version > v.version AND n.status = 'published') END AS superseded_by
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
    supersededBy: v.superseded_by,
    retiredAt: v.retired_at?.toISOString() ?? null,
    thresholdEstimator: v.calibration ? (v.calibration.thresholdEstimator ?? 'empirical-type7') : null,
  };
}

/** The contract's view of the engine's calibration. */
export function calibrationView(c: EngineCalibration | null): Calibration | null {
  if (!c || c.lowerThreshold === null || c.upperThreshold === null) return null;
  const interval = (i: readonly [number, number] | null | undefined): [number, number] | null => (i ? [i[0], i[1]] : null);
  return {
    t95: c.lowerThreshold,
    t99: c.upperThreshold,
    lotCount: c.lotCount,
    distances: [...c.nearestDistances].sort((a, b) => a - b),
    estimator: c.thresholdEstimator ?? 'empirical-type7',
    t95Interval: interval(c.lowerInterval),
    t99Interval: interval(c.upperInterval),
    bootstrap: c.bootstrap ? { ...c.bootstrap } : null,
    fit: c.fit ? { mu: c.fit.mu, sigma: c.fit.sigma } : null,
  };
}

/** The list's versions: counts and thresholds from `library_version_tally`, no calibration read. */
const LIST_VERSION_SQL = `
  SELECT v.id, v.library_id, v.version, v.status, v.published_at, v.engine_version, v.retired_at,
         u.id AS published_by_id, u.display_name AS published_by_name, t.included_lots AS lot_count,
         t.t95, t.t99, t.threshold_estimator,
         CASE WHEN v.status = 'draft' THEN NULL ELSE
           (SELECT min(n.version) FROM library_version n WHERE n.library_id = v.library_id AND n.version > v.version AND n.status = 'published') END AS superseded_by
  FROM library_version v JOIN library_version_tally t ON t.library_version_id = v.id LEFT JOIN app_user u ON u.id = v.published_by_user_id`;

interface ListVersionRow extends Omit<VersionRow, 'calibration'> {
  t95: number | null;
  t99: number | null;
  threshold_estimator: LibraryVersionSummary['thresholdEstimator'];
}

function listSummary(v: ListVersionRow): LibraryVersionSummary {
  return {
    ...summary({ ...v, calibration: null }),
    t95: v.t95,
    t99: v.t99,
    thresholdEstimator: v.threshold_estimator,
  };
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
  const from = `FROM reference_library l JOIN product p ON p.id = l.product_id JOIN client_organisation co ON co.id = p.client_organisation_id
     WHERE l.lab_id = $1 ${search}`;
  const [rows, counted] = await Promise.all([
    manager.query(
      `SELECT l.id, p.id AS product_id, p.name AS product_name, p.matrix, co.id AS client_id, co.name AS client_name ${from}
       ORDER BY ${LIBRARY_SORT[query.sort]} ${query.dir === 'asc' ? 'ASC' : 'DESC'}, l.id
       LIMIT $${params.length + 1} OFFSET $${params.length + 2}`,
      [...params, take, skip],
    ) as Promise<{ id: string; product_id: string; product_name: string; matrix: LibraryItem['product']['matrix']; client_id: string; client_name: string }[]>,
    cappedCount(manager, from, params, totalCapFor(query)),
  ]);
  const versions: ListVersionRow[] = rows.length
    ? await manager.query(`${LIST_VERSION_SQL} WHERE v.lab_id = $1 AND v.library_id = ANY($2::uuid[]) ORDER BY v.version DESC`, [labId, rows.map((r) => r.id)])
    : [];
  const items = rows.map(
    (r): LibraryItem => ({
      id: r.id,
      product: { id: r.product_id, name: r.product_name, matrix: r.matrix },
      clientOrganisation: { id: r.client_id, name: r.client_name },
      versions: versions.filter((v) => v.library_id === r.id).map(listSummary),
    }),
  );
  return toCappedPage(items, counted, query);
}

interface DetailRow extends VersionRow {
  method: MethodSettings;
  grid_hz: number[];
  product_id: string;
  product_name: string;
  matrix: LibraryVersionDetail['product']['matrix'];
  client_id: string;
  client_name: string;
  method_version_id: string | null;
  method_id: string | null;
  method_name: string | null;
  method_version: number | null;
  retirement_reason: string | null;
  retired_by_id: string | null;
  retired_by_name: string | null;
}

async function versionChanges(manager: EntityManager, labId: string, v: DetailRow, lotCodes: string[]): Promise<LibraryVersionDetail['changes']> {
  const [prev]: { id: string; version: number; method: MethodSettings; calibration: EngineCalibration | null }[] = await manager.query(
    `SELECT id, version, method, calibration FROM library_version WHERE lab_id = $1 AND library_id = $2 AND version < $3 ORDER BY version DESC LIMIT 1`,
    [labId, v.library_id, v.version],
  );
  if (!prev) return null;
  const before: { lot_code: string }[] = await manager.query(`SELECT lot_code FROM reference_lot WHERE lab_id = $1 AND library_version_id = $2 AND included`, [labId, prev.id]);
  const was = new Set(before.map((r) => r.lot_code));
  const now = new Set(lotCodes);
  return {
    previousVersion: prev.version,
    previousVersionId: prev.id,
    lotsAdded: lotCodes.filter((c) => !was.has(c)),
    lotsRemoved: [...was].filter((c) => !now.has(c)).sort(),
    methodDifferences: methodDifferences(prev.method, v.method),
    t95: { before: prev.calibration?.lowerThreshold ?? null, after: v.calibration?.lowerThreshold ?? null },
    t99: { before: prev.calibration?.upperThreshold ?? null, after: v.calibration?.upperThreshold ?? null },
  };
}

export async function libraryVersionDetail(manager: EntityManager, labId: string, versionId: string): Promise<LibraryVersionDetail> {
  const [v]: DetailRow[] = await manager.query(
    `SELECT x.*, v2.method, v2.grid_hz, v2.retirement_reason, v2.method_version_id, p.id AS product_id, p.name AS product_name, p.matrix,
            co.id AS client_id, co.name AS client_name, mv.method_id, m.name AS method_name, mv.version AS method_version,
            ru.id AS retired_by_id, ru.display_name AS retired_by_name
     FROM (${VERSION_SQL} WHERE v.id = $1 AND v.lab_id = $2) x
     JOIN library_version v2 ON v2.id = x.id
     JOIN reference_library l ON l.id = x.library_id JOIN product p ON p.id = l.product_id
     JOIN client_organisation co ON co.id = p.client_organisation_id
     LEFT JOIN method_version mv ON mv.id = v2.method_version_id LEFT JOIN method m ON m.id = mv.method_id
     LEFT JOIN app_user ru ON ru.id = v2.retired_by_user_id`,
    [versionId, labId],
  );
  if (!v) throw ApiError.notFound('Library version');
  const lots: { id: string; lot_code: string; produced_on: string | null; note: string; included: boolean; exclusion_reason: string | null }[] = await manager.query(
    `SELECT id, lot_code, to_char(produced_on, 'YYYY-MM-DD') AS produced_on, note, included, exclusion_reason
     FROM reference_lot WHERE library_version_id = $1 AND lab_id = $2 ORDER BY lot_code, id`,
    [versionId, labId],
  );
  const included = lots.filter((l) => l.included);
  return {
    ...summary(v),
    libraryId: v.library_id,
    product: { id: v.product_id, name: v.product_name, matrix: v.matrix },
    clientOrganisation: { id: v.client_id, name: v.client_name },
    method: v.method,
    calibration: calibrationView(v.calibration),
    lots: lots.map((l) => ({ id: l.id, lotCode: l.lot_code, producedOn: l.produced_on, note: l.note, included: l.included, exclusionReason: l.exclusion_reason })),
    methodVersion: v.method_version_id && v.method_id ? { id: v.method_version_id, methodId: v.method_id, name: v.method_name ?? '', version: v.method_version ?? 0 } : null,
    retirementReason: v.retirement_reason,
    retiredBy: v.retired_by_id ? { id: v.retired_by_id, displayName: v.retired_by_name ?? '' } : null,
    includedLotCount: included.length,
    excludedLotCount: lots.length - included.length,
    publishBlockers: v.status === 'draft' ? publishBlockers(v.method, v.calibration) : [],
    changes: await versionChanges(manager, labId, v, included.map((l) => l.lot_code)),
  };
}
