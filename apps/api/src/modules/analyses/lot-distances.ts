import type { EntityManager } from 'typeorm';
import type { AnalysisResult, LotDistancePage } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { cachedLibrary } from '../libraries/published-library';

/** Bytes per lot in `analysis_lot_distance.ranked`: uint32 lot index, float64 distance (little-endian). */
const ENTRY = 12;

/** Every lot's distance, nearest first, as stored: `ranking` holds lot indices in that order. */
export function encodeRanked(ranking: ArrayLike<number>, distances: ArrayLike<number>): Buffer {
  const buf = Buffer.alloc(ENTRY * ranking.length);
  const view = new DataView(buf.buffer, buf.byteOffset, buf.byteLength);
  for (let r = 0, o = 0; r < ranking.length; r++, o += ENTRY) {
    view.setUint32(o, ranking[r], true);
    view.setFloat64(o + 4, distances[ranking[r]], true);
  }
  return buf;
}

function decodeEntries(bytes: Buffer): { index: number; distance: number }[] {
  const out: { index: number; distance: number }[] = [];
  for (let o = 0; o + ENTRY <= bytes.length; o += ENTRY) out.push({ index: bytes.readUInt32LE(o), distance: bytes.readDoubleLE(o + 4) });
  return out;
}

/** Stores every lot's distance as `encodeRanked` packed them (in the worker thread). */
export async function storeLotDistances(manager: EntityManager, labId: string, analysisId: string, lotCount: number, ranked: Uint8Array): Promise<void> {
  const bytes = Buffer.from(ranked.buffer, ranked.byteOffset, ranked.byteLength);
  await manager.query(`INSERT INTO analysis_lot_distance (analysis_id, lab_id, lot_count, ranked) VALUES ($1, $2, $3, $4)`, [analysisId, labId, lotCount, bytes]);
}

/** Every lot's distance in the version's lot order, as stored; null for an analysis from before they were stored apart. */
export async function storedLotDistances(manager: EntityManager, labId: string, analysisId: string): Promise<Float64Array | null> {
  const [row]: { lot_count: number; ranked: Buffer }[] = await manager.query(`SELECT lot_count, ranked FROM analysis_lot_distance WHERE analysis_id = $1 AND lab_id = $2`, [analysisId, labId]);
  if (!row) return null;
  const out = new Float64Array(row.lot_count);
  for (const e of decodeEntries(row.ranked)) out[e.index] = e.distance;
  return out;
}

/**
 * One page of every lot's distance to the sample, nearest first (ties in the version's lot order:
 * lot code, then id). Only the page's bytes are read from the database, and only its lots' codes.
 * An analysis from before distances were stored apart pages through the full list its result kept.
 */
export async function lotDistancePage(manager: EntityManager, labId: string, analysisId: string, after: number, limit: number): Promise<LotDistancePage> {
  const [a]: { library_version_id: string; result: AnalysisResult | null; lot_count: number | null; page: Buffer | null }[] = await manager.query(
    `SELECT a.library_version_id, CASE WHEN d.analysis_id IS NULL THEN a.result END AS result, d.lot_count,
            substring(d.ranked FROM $3::int * ${ENTRY} + 1 FOR $4::int * ${ENTRY}) AS page
     FROM analysis a LEFT JOIN analysis_lot_distance d ON d.analysis_id = a.id AND d.lab_id = a.lab_id
     WHERE a.id = $1 AND a.lab_id = $2`,
    [analysisId, labId, after, limit],
  );
  if (!a) throw ApiError.notFound('Analysis');
  if (a.lot_count === null || a.page === null) {
    const all = [...(a.result?.distances ?? [])].sort((x, y) => x.distance - y.distance || x.lotCode.localeCompare(y.lotCode) || x.lotId.localeCompare(y.lotId));
    const items = all.slice(after, after + limit).map((d, i) => ({ ...d, rank: after + i + 1 }));
    return { items, total: all.length, next: after + items.length < all.length ? after + items.length : null };
  }
  const entries = decodeEntries(a.page);
  // the version's lots in their order, from the library cache when it holds the version (no count over every lot)
  const held = cachedLibrary(labId, a.library_version_id);
  const lots: { idx: number; id: string; lot_code: string }[] = held
    ? entries.filter((e) => e.index < held.lots.length).map((e) => ({ idx: e.index, id: held.lots[e.index].id, lot_code: held.lots[e.index].lotCode }))
    : entries.length
    ? await manager.query(
        `SELECT idx::int, id, lot_code FROM (
           SELECT id, lot_code, (row_number() OVER (ORDER BY lot_code, id) - 1) AS idx
           FROM reference_lot WHERE library_version_id = $1 AND lab_id = $2 AND included
         ) t WHERE idx = ANY($3::int[])`,
        [a.library_version_id, labId, entries.map((e) => e.index)],
      )
    : [];
  const byIndex = new Map(lots.map((l) => [l.idx, l]));
  const items = entries.map((e, i) => {
    const lot = byIndex.get(e.index);
    if (!lot) throw new Error(`lot ${e.index} of library version ${a.library_version_id} is missing`);
    return { lotId: lot.id, lotCode: lot.lot_code, distance: e.distance, rank: after + i + 1 };
  });
  return { items, total: a.lot_count, next: after + items.length < a.lot_count ? after + items.length : null };
}
