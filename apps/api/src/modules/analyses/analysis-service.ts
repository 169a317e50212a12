import type { EntityManager } from 'typeorm';
import { In } from 'typeorm';
import { ENGINE_VERSION } from '@ohmprint/spectral-engine';
import type { ReproduceCheck } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { recordAudit } from '../audit/record-audit';
import { publishedLibrary } from '../libraries/published-library';
import { Replicate } from '../measurements/replicate.entity';
import { findLabSample, moveSample, requireSampleState } from '../samples/sample-access';
import { Analysis } from './analysis.entity';
import { refreshOrderStatus } from '../orders/order-progress';
import { compareAnalyses } from './compare-analyses';
import { analyseOffThread } from './analyse-off-thread';
import { otherPublishedLibraries } from './does-not-belong';
import { requireRevokedIfReported } from './revoked-report';
import { storedLotDistances, storeLotDistances } from './lot-distances';
import { timed } from './analysis-stages';

/** Runs a new analysis of the sample's included replicates; an earlier draft is superseded. */
export async function runAnalysis(manager: EntityManager, auth: AuthContext, labId: string, sampleId: string, libraryVersionId: string): Promise<string> {
  const sample = await timed('sample-checks', async () => {
    const found = await findLabSample(manager, labId, sampleId, true);
    requireSampleState(found, ['measuring', 'analysed', 'returned-for-rework', 'reported'], 'running an analysis');
    await requireRevokedIfReported(manager, found, 'running a new analysis');
    return found;
  });
  const library = await timed('library-load', () => publishedLibrary(manager, labId, libraryVersionId));
  // the version's status read fresh (a cached library may have been retired since), with the order, in one round trip
  const [{ status, ...order }] = await timed('version-and-order', () =>
    manager.query(
      `SELECT v.status, o.product_id, o.client_organisation_id FROM library_version v JOIN test_order o ON o.id = $3 AND o.lab_id = v.lab_id WHERE v.id = $1 AND v.lab_id = $2`,
      [libraryVersionId, labId, sample.orderId],
    ),
  );
  if (status === 'retired') {
    throw new ApiError(409, 'Library version retired', `Library version ${library.version} of ${library.productName} is retired; analyse against a current version.`, { type: 'library-version-retired' });
  }
  if (order.product_id !== library.productId) {
    throw ApiError.badRequest(`Library version ${library.version} is of ${library.productName}, not of the product this sample was ordered for.`, [
      { field: 'libraryVersionId', message: 'belongs to another product' },
    ]);
  }
  const replicates = await timed('replicates-read', () => manager.find(Replicate, { where: { labId, sampleId, excluded: false }, order: { replicateNumber: 'ASC' } }));
  if (!replicates.length) throw ApiError.conflict(`Sample ${sample.code} has no included replicates; upload measurements first.`);
  const others = await timed('other-libraries-load', () => otherPublishedLibraries(manager, labId, library.productId, order.client_organisation_id));
  const computed = await timed('worker-round-trip', () => analyseOffThread(replicates, library, others));
  const id = await timed('analysis-insert', async () => {
    await manager.update(Analysis, { labId, sampleId, status: 'draft' }, { status: 'superseded' });
    const inserted = await manager.insert(Analysis, {
      labId,
      sampleId,
      libraryVersionId,
      status: 'draft',
      verdict: computed.result.verdict,
      replicateIds: replicates.map((r) => r.id),
      method: library.method,
      engineVersion: ENGINE_VERSION,
      result: computed.result,
      sampleSpectrum: computed.sampleSpectrum,
      remarks: '',
      analystUserId: auth.userId,
      createdAt: new Date(),
    });
    return inserted.identifiers[0].id as string;
  });
  await timed('lot-distances-write', () => storeLotDistances(manager, labId, id, computed.lotCount, computed.rankedBytes));
  await timed('sample-move-and-audit', async () => {
    const wasReported = sample.state === 'reported';
    await moveSample(manager, sample, 'analysed');
    if (wasReported) await refreshOrderStatus(manager, labId, sample.orderId);
    await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'analysis.run', subjectType: 'analysis', subjectId: id, details: { sampleCode: sample.code, libraryVersionId, verdict: computed.result.verdict } });
  });
  return id;
}

async function findAnalysis(manager: EntityManager, labId: string, analysisId: string, lock = false): Promise<Analysis> {
  const a = await manager.findOne(Analysis, { where: { id: analysisId, labId }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
  if (!a) throw ApiError.notFound('Analysis');
  return a;
}

function requireOwnDraft(a: Analysis, auth: AuthContext, doing: string): void {
  if (a.status !== 'draft') throw ApiError.conflict(`This analysis is ${a.status}; only a draft allows ${doing}.`);
  if (a.analystUserId !== auth.userId) throw ApiError.forbidden(`Only the analyst who ran this analysis may do ${doing}.`);
}

export async function updateRemarks(manager: EntityManager, auth: AuthContext, labId: string, analysisId: string, remarks: string): Promise<void> {
  const a = await findAnalysis(manager, labId, analysisId, true);
  requireOwnDraft(a, auth, 'editing the remarks');
  await manager.update(Analysis, { id: a.id, labId }, { remarks });
}

/** Draft → submitted, sample → in review. */
export async function submitForReview(manager: EntityManager, auth: AuthContext, labId: string, analysisId: string): Promise<void> {
  const a = await findAnalysis(manager, labId, analysisId, true);
  requireOwnDraft(a, auth, 'submitting it for review');
  const sample = await findLabSample(manager, labId, a.sampleId, true);
  await manager.update(Analysis, { id: a.id, labId }, { status: 'submitted', submittedAt: new Date() });
  await moveSample(manager, sample, 'in-review');
  await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'analysis.submitted', subjectType: 'analysis', subjectId: a.id, details: { sampleCode: sample.code, verdict: a.verdict } });
}

/** Recomputes from the stored inputs (same replicates, same frozen library version) and compares. */
export async function reproduceAnalysis(manager: EntityManager, labId: string, analysisId: string): Promise<ReproduceCheck> {
  const a = await findAnalysis(manager, labId, analysisId);
  const library = await publishedLibrary(manager, labId, a.libraryVersionId);
  const replicates = await manager.find(Replicate, { where: { labId, id: In(a.replicateIds) }, order: { replicateNumber: 'ASC' } });
  if (replicates.length !== a.replicateIds.length) throw ApiError.conflict('Some replicates this analysis used are no longer stored; it cannot be reproduced.');
  // Exactly the replicates it ran on, even if one was excluded afterwards.
  const [order] = await manager.query(
    `SELECT o.client_organisation_id FROM sample s JOIN test_order o ON o.id = s.order_id WHERE s.id = $1 AND s.lab_id = $2`,
    [a.sampleId, labId],
  );
  const others = await otherPublishedLibraries(manager, labId, library.productId, order.client_organisation_id);
  const recomputed = await analyseOffThread(replicates, library, others, { lotOrder: true });
  const stored = await storedLotDistances(manager, labId, a.id);
  const lotDistances = recomputed.lotDistances as Float64Array;
  const all = Array.from(lotDistances, (distance, i) => ({ lotId: library.lots[i].id, lotCode: library.lots[i].lotCode, distance }));
  // An analysis from before results were slimmed kept every lot's distance in its result, in lot order.
  const againstResult = a.result.lotCount === undefined ? { ...recomputed.result, distances: all } : recomputed.result;
  const { differences, maxAbsoluteDifference } = compareAnalyses(a.result, againstResult, stored && { stored, recomputed: lotDistances });
  return {
    reproduced: differences.length === 0,
    storedEngineVersion: a.engineVersion,
    currentEngineVersion: ENGINE_VERSION,
    maxAbsoluteDifference,
    differences,
  };
}
