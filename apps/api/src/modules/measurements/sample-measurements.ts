import type { EntityManager } from 'typeorm';
import { replicateAgreement } from '@ohmprint/spectral-engine';
import type { ExcludeReplicate, MethodSettings, ReplicateAgreementSummary, SampleMeasurements, SpectrumPoints } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { recordAudit } from '../audit/record-audit';
import { labMethod } from '../libraries/lab-method';
import { findLabSample, requireSampleState } from '../samples/sample-access';
import { prepareReplicates } from './prepared-replicates';
import { Replicate } from './replicate.entity';
import { replicateViews } from './replicate-view';

/** Agreement of the included replicates that cover the band; null below two of them. */
export function agreementOf(replicates: readonly Replicate[], method: MethodSettings): ReplicateAgreementSummary | null {
  const usable = prepareReplicates(replicates.filter((r) => !r.excluded), method).filter((p) => p.spectrum !== null);
  if (usable.length < 2) return null;
  const a = replicateAgreement(usable.map((p) => p.spectrum!));
  return {
    replicateCount: usable.length,
    maxPairDistance: a.maxDistance,
    meanPairDistance: a.meanDistance,
    limit: method.replicateDistanceLimit,
    passed: a.maxDistance <= method.replicateDistanceLimit,
  };
}

export async function sampleMeasurements(manager: EntityManager, labId: string, sampleId: string): Promise<SampleMeasurements> {
  await findLabSample(manager, labId, sampleId);
  const [views, replicates, method] = await Promise.all([
    replicateViews(manager, labId, sampleId),
    manager.find(Replicate, { where: { labId, sampleId }, order: { replicateNumber: 'ASC' } }),
    labMethod(manager, labId),
  ]);
  return { sampleId, replicates: views, agreement: agreementOf(replicates, method) };
}

export async function replicateSpectrum(manager: EntityManager, labId: string, sampleId: string, replicateId: string): Promise<SpectrumPoints> {
  const r = await manager.findOne(Replicate, { where: { id: replicateId, sampleId, labId } });
  if (!r) throw ApiError.notFound('Replicate');
  return { frequencyHz: r.frequencyHz, re: r.re, im: r.im };
}

/** Takes a replicate out of later analyses; the reason is kept and audited. */
export async function excludeReplicate(manager: EntityManager, auth: AuthContext, labId: string, sampleId: string, replicateId: string, body: ExcludeReplicate): Promise<void> {
  const sample = await findLabSample(manager, labId, sampleId, true);
  requireSampleState(sample, ['measuring', 'analysed', 'returned-for-rework'], 'excluding a replicate');
  const r = await manager.findOne(Replicate, { where: { id: replicateId, sampleId, labId } });
  if (!r) throw ApiError.notFound('Replicate');
  if (r.excluded) throw ApiError.conflict(`Replicate ${r.replicateNumber} is already excluded (${r.exclusionReason}).`);
  await manager.update(Replicate, { id: r.id, labId }, { excluded: true, exclusionReason: body.reason, excludedByUserId: auth.userId, excludedAt: new Date() });
  await recordAudit(manager, {
    labId,
    actorUserId: auth.userId,
    action: 'measurement.replicate-excluded',
    subjectType: 'replicate',
    subjectId: r.id,
    details: { sampleCode: sample.code, replicateNumber: r.replicateNumber, fileName: r.fileName, reason: body.reason },
  });
}
