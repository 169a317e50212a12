import type { EntityManager } from 'typeorm';
import { NEAREST_LOTS, sameLotCode, type Analysis as AnalysisView, type AnalysisListItem, type AnalysisListQuery, type Page } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { cappedCount, escapeLike, sparseSearchIds, pageParams, toCappedPage, totalCapFor, type CappedTotal } from '../../core/paging';
import { referenceBandOf } from '../libraries/reference-band';
import { revokedReportOf } from './revoked-report';

/**
 * The result as a reader gets it: an analysis from before results were slimmed kept every lot's
 * distance, so only its nearest are returned (the rest page through the lot-distances route).
 */
function slimResult(result: AnalysisView['result']): AnalysisView['result'] {
  if (result.lotCount !== undefined) return result;
  const nearest = [...result.distances].sort((a, b) => a.distance - b.distance || a.lotCode.localeCompare(b.lotCode)).slice(0, NEAREST_LOTS);
  return { ...result, distances: nearest, lotCount: result.distances.length };
}

const iso = (d: Date | null) => d?.toISOString() ?? null;

export async function analysisView(manager: EntityManager, labId: string, analysisId: string): Promise<AnalysisView> {
  const [a]: {
    id: string; status: AnalysisView['status']; result: AnalysisView['result']; method: AnalysisView['method']; engine_version: string; remarks: string; sample_spectrum: AnalysisView['sampleSpectrum'];
    created_at: Date; submitted_at: Date | null; sample_id: string; sample_code: string; claimed_lot: string | null; version_id: string; version: number; version_status: string; product_name: string;
    analyst_id: string; analyst_name: string;
  }[] = await manager.query(
    `SELECT a.id, a.status, a.result, a.method, a.sample_spectrum, a.engine_version, a.remarks, a.created_at, a.submitted_at,
            s.id AS sample_id, s.code AS sample_code, s.claimed_lot, v.id AS version_id, v.version, v.status AS version_status, p.name AS product_name,
            u.id AS analyst_id, u.display_name AS analyst_name
     FROM analysis a
     JOIN sample s ON s.id = a.sample_id
     JOIN library_version v ON v.id = a.library_version_id
     JOIN reference_library l ON l.id = v.library_id JOIN product p ON p.id = l.product_id
     JOIN app_user u ON u.id = a.analyst_user_id
     WHERE a.id = $1 AND a.lab_id = $2`,
    [analysisId, labId],
  );
  if (!a) throw ApiError.notFound('Analysis');
  const reviews: { id: string; decision: 'approved' | 'returned'; comments: string; decided_at: Date; reviewer_id: string; reviewer_name: string }[] = await manager.query(
    `SELECT r.id, r.decision, r.comments, r.decided_at, u.id AS reviewer_id, u.display_name AS reviewer_name
     FROM analysis_review r JOIN app_user u ON u.id = r.reviewer_user_id
     WHERE r.analysis_id = $1 AND r.lab_id = $2 ORDER BY r.decided_at`,
    [analysisId, labId],
  );
  const temperatures: { replicate_number: number; file_name: string; temperature_c: number; temperature_source: 'entered' | 'file' | 'entered-over-file' }[] = await manager.query(
    `SELECT replicate_number, file_name, temperature_c, temperature_source FROM replicate WHERE lab_id = $1 AND id = ANY($2::uuid[]) ORDER BY replicate_number`,
    [labId, a.result.replicateIds],
  );
  const follows = await revokedReportOf(manager, labId, a.sample_id);
  const referenceBand = await referenceBandOf(manager, labId, a.version_id);
  // The nearest lot and the mapped ones: the same lots as the result's nearest distances.
  const producerLotCodes = await producerLotCodesOf(manager, labId, [
    ...(a.result.nearest ? [a.result.nearest.lotId] : []),
    ...a.result.map.lots.map((l) => l.lotId),
  ]);
  return {
    id: a.id,
    sample: { id: a.sample_id, code: a.sample_code },
    libraryVersion: { id: a.version_id, version: a.version, productName: a.product_name, retired: a.version_status === 'retired' },
    status: a.status,
    result: slimResult(a.result),
    method: a.method,
    sampleSpectrum: a.sample_spectrum,
    engineVersion: a.engine_version,
    remarks: a.remarks,
    analyst: { id: a.analyst_id, displayName: a.analyst_name },
    createdAt: a.created_at.toISOString(),
    submittedAt: iso(a.submitted_at),
    producerLotCodes,
    claimedLot: claimedLotMatch(a.claimed_lot, a.result.nearest ? (producerLotCodes[a.result.nearest.lotId] ?? null) : null),
    measurementTemperatures: temperatures.map((t) => ({ replicateNumber: t.replicate_number, fileName: t.file_name, temperatureC: t.temperature_c, source: t.temperature_source })),
    // only an analysis run after the revocation is the new one; the revoked report's own analysis is not
    followsRevokedReport: follows && a.created_at.toISOString() > follows.revokedAt ? follows.number : null,
    referenceBand,
    reviews: reviews.map((r) => ({ id: r.id, decision: r.decision, comments: r.comments, reviewer: { id: r.reviewer_id, displayName: r.reviewer_name }, decidedAt: r.decided_at.toISOString() })),
  };
}

/** The producer's own codes of the given library lots (those that have one), by lot id. */
export async function producerLotCodesOf(manager: EntityManager, labId: string, lotIds: readonly string[]): Promise<Record<string, string>> {
  if (!lotIds.length) return {};
  const rows: { id: string; code: string }[] = await manager.query(
    `SELECT r.id, COALESCE(r.producer_lot_code, s.reference_lot->>'lotCode') AS code
     FROM reference_lot r LEFT JOIN sample s ON s.id = r.sample_id AND s.lab_id = r.lab_id
     WHERE r.lab_id = $1 AND r.id = ANY($2::uuid[])`,
    [labId, [...new Set(lotIds)]],
  );
  return Object.fromEntries(rows.filter((r) => r.code).map((r) => [r.id, r.code]));
}

/** The client's claimed lot and whether the nearest lot's producer code is that lot; null when none was claimed. */
export function claimedLotMatch(claimed: string | null, nearestProducerCode: string | null): AnalysisView['claimedLot'] {
  const lotCode = claimed?.trim() ?? '';
  if (!lotCode) return null;
  return { lotCode, nearestIsClaimed: nearestProducerCode === null ? null : sameLotCode(lotCode, nearestProducerCode) };
}

const SORT: Record<AnalysisListQuery['sort'], string> = { createdAt: 'a.created_at', submittedAt: 'a.submitted_at', sample: 's.code', status: 'a.status' };

/** Analyses of the lab; the review queue is this list filtered to `submitted`. */
export async function listAnalyses(manager: EntityManager, labId: string, query: AnalysisListQuery): Promise<Page<AnalysisListItem>> {
  const params: unknown[] = [labId];
  const where = ['a.lab_id = $1'];
  if (query.status) {
    params.push(query.status);
    where.push(`a.status = $${params.length}`);
  }
  if (query.sampleId) {
    params.push(query.sampleId);
    where.push(`a.sample_id = $${params.length}`);
  }
  if (query.q) {
    // each alternative on its own table's index (trigram for the code), not one OR across a join
    params.push(escapeLike(query.q));
    const p = `$${params.length}`;
    const products = `SELECT p2.id FROM product p2 WHERE p2.lab_id = $1 AND p2.name ILIKE ${p}`;
    const analysts = `SELECT u2.id FROM app_user u2 WHERE u2.lab_id = $1 AND u2.display_name ILIKE ${p}`;
    const arms = [
      `SELECT x.id FROM analysis x JOIN sample s2 ON s2.id = x.sample_id WHERE x.lab_id = $1 AND s2.lab_id = $1 AND s2.code ILIKE ${p}`,
      `SELECT x.id FROM analysis x JOIN sample s2 ON s2.id = x.sample_id WHERE x.lab_id = $1 AND s2.lab_id = $1 AND s2.product_id IN (${products})`,
      `SELECT x.id FROM analysis x WHERE x.lab_id = $1 AND x.analyst_user_id IN (${analysts})`,
    ];
    const ids = await sparseSearchIds(manager, arms, params);
    if (ids) params[params.length - 1] = ids;
    where.push(ids
      ? `a.id = ANY(${p}::uuid[])`
      : `(a.analyst_user_id IN (${analysts}) OR EXISTS (SELECT 1 FROM sample s2
           WHERE s2.id = a.sample_id AND (s2.code ILIKE ${p} OR s2.product_id IN (${products}))))`);
  }
  const { skip, take } = pageParams(query);
  // the sample's code orders through a join; the other sorts walk an index of analysis alone
  const bySample = query.sort === 'sample';
  // the tie-breaker runs the same way as the sort, so an index of (lab, column, id) serves either
  // direction; only the submission time can be empty, and empty ones come last
  const dir = query.dir === 'asc' ? 'ASC' : 'DESC';
  const order = `${SORT[query.sort]} ${dir}${query.sort === 'submittedAt' ? ' NULLS LAST' : ''}, a.id ${dir}`;
  const [rows, counted]: [{ id: string; sample_id: string; sample_code: string; product_name: string; status: AnalysisListItem['status']; verdict: AnalysisListItem['verdict']; analyst_id: string; analyst_name: string; created_at: Date; submitted_at: Date | null }[], CappedTotal] =
    await Promise.all([manager.query(
      `SELECT a.id, s.id AS sample_id, s.code AS sample_code, p.name AS product_name, a.status, a.verdict,
              u.id AS analyst_id, u.display_name AS analyst_name, a.created_at, a.submitted_at
       FROM (SELECT a.* FROM analysis a JOIN (SELECT a.id FROM analysis a ${bySample ? 'JOIN sample s ON s.id = a.sample_id' : ''} WHERE ${where.join(' AND ')}
             ORDER BY ${order} LIMIT $${params.length + 1} OFFSET $${params.length + 2}) page USING (id)) a
       JOIN sample s ON s.id = a.sample_id
       JOIN test_order o ON o.id = s.order_id JOIN product p ON p.id = o.product_id
       JOIN app_user u ON u.id = a.analyst_user_id
       ORDER BY ${order}`,
      [...params, take, skip],
    ), cappedCount(manager, `FROM analysis a WHERE ${where.join(' AND ')}`, params, totalCapFor(query))]);
  return toCappedPage(
    rows.map((r) => ({
      id: r.id,
      sampleId: r.sample_id,
      sampleCode: r.sample_code,
      productName: r.product_name,
      status: r.status,
      verdict: r.verdict,
      analyst: { id: r.analyst_id, displayName: r.analyst_name },
      createdAt: r.created_at.toISOString(),
      submittedAt: iso(r.submitted_at),
    })),
    counted,
    query,
  );
}
