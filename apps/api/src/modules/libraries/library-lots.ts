import type { EntityManager } from 'typeorm';
import type { Calibration } from '@ohmprint/spectral-engine';
import type { Chemistry, LibraryLot, LibraryLotQuery, LotQuality, Page } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { toPage } from '../../core/paging';

interface LotRow {
  id: string;
  lot_code: string;
  produced_on: string | null;
  sample_code: string | null;
  included: boolean;
  exclusion_reason: string | null;
  quality: LotQuality | Record<string, never>;
  chemistry: Chemistry;
}

const NO_QUALITY: LotQuality = { replicates: 0, kkMaxResidualPercent: null, replicateMaxDistance: null, problems: [] };

/**
 * One page of a version's lots with each lot's leave-one-out distance, nearest lot and
 * typicality from the stored calibration. The rows without spectra are small, so filtering and
 * sorting by distance run over them in memory and only the page goes out, whatever the size.
 */
export async function libraryLots(manager: EntityManager, labId: string, versionId: string, query: LibraryLotQuery): Promise<Page<LibraryLot>> {
  const [v]: { calibration: Calibration | null }[] = await manager.query(`SELECT calibration FROM library_version WHERE id = $1 AND lab_id = $2`, [versionId, labId]);
  if (!v) throw ApiError.notFound('Library version');
  const rows: LotRow[] = await manager.query(
    `SELECT r.id, r.lot_code, to_char(r.produced_on, 'YYYY-MM-DD') AS produced_on, s.code AS sample_code, r.included, r.exclusion_reason, r.quality, r.chemistry
     FROM reference_lot r LEFT JOIN sample s ON s.id = r.sample_id
     WHERE r.library_version_id = $1 AND r.lab_id = $2 ORDER BY r.lot_code, r.id`,
    [versionId, labId],
  );
  // The calibration lists included lots in this same order (lot code, id).
  const c = v.calibration;
  const included = rows.filter((r) => r.included);
  const position = new Map(included.map((r, i) => [r.id, i]));
  const calibrated = c !== null && c.nearestDistances.length === included.length;
  const t99 = c?.upperThreshold ?? null;
  let lots = rows.map((r): LibraryLot => {
    const i = position.get(r.id);
    const distance = calibrated && i !== undefined ? c.nearestDistances[i] : null;
    const others = calibrated && i !== undefined ? c.nearestDistances.filter((_, j) => j !== i) : [];
    return {
      id: r.id,
      lotCode: r.lot_code,
      producedOn: r.produced_on,
      sampleCode: r.sample_code,
      included: r.included,
      exclusionReason: r.exclusion_reason,
      quality: 'problems' in r.quality ? (r.quality as LotQuality) : NO_QUALITY,
      chemistry: r.chemistry,
      looDistance: distance,
      nearestLotCode: calibrated && i !== undefined ? included[c.nearestLots[i]].lot_code : null,
      typicality: distance !== null && others.length ? others.filter((d) => d > distance).length / others.length : null,
      outlier: distance !== null && t99 !== null && distance > t99,
    };
  });
  if (query.included !== 'all') lots = lots.filter((l) => l.included === (query.included === 'included'));
  if (query.q) {
    const q = query.q.toLowerCase();
    lots = lots.filter((l) => l.lotCode.toLowerCase().includes(q) || (l.sampleCode ?? '').toLowerCase().includes(q));
  }
  const dir = query.dir === 'asc' ? 1 : -1;
  const key: Record<LibraryLotQuery['sort'], (l: LibraryLot) => number | string> = {
    lotCode: (l) => l.lotCode,
    distance: (l) => l.looDistance ?? -1,
    producedOn: (l) => l.producedOn ?? '',
  };
  lots.sort((a, b) => {
    const x = key[query.sort](a);
    const y = key[query.sort](b);
    return (x < y ? -1 : x > y ? 1 : a.lotCode.localeCompare(b.lotCode)) * dir;
  });
  const start = (query.page - 1) * query.pageSize;
  return toPage(lots.slice(start, start + query.pageSize), lots.length, query);
}
