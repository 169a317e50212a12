import { MessageChannel } from 'node:worker_threads';
import type { EntityManager } from 'typeorm';
import { ENGINE_VERSION, relativeWidth, type calibrate, type Calibration, type Spectrum } from '@ohmprint/spectral-engine';
import type { Chemistry, LotQuality, MethodSettings } from '@ohmprint/contracts';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import { ApiError } from '../../core/api-error';
import { recordAudit } from '../audit/record-audit';
import { LibraryVersion } from './library-version.entity';
import { decodeLotSpectrum, encodeLotSpectrum } from './lot-spectrum-bytes';
import { storeReferenceBand } from './reference-band';
import { ReferenceLibrary } from './reference-library.entity';
import { ReferenceLot } from './reference-lot.entity';

export interface PublishBlocker {
  code: string;
  message: string;
}

export interface NewLot {
  lotCode: string;
  producedOn: string | null;
  note?: string;
  /** Normalised, on the version's grid. */
  spectrum: Spectrum;
  sampleId?: string | null;
  /** The producer's own code for the lot, from its reference-lot declaration. */
  producerLotCode?: string | null;
  chemistry?: Chemistry;
  included?: boolean;
  exclusionReason?: string | null;
  quality?: LotQuality;
}

/** The product's library, created on first use. */
export async function libraryOf(manager: EntityManager, labId: string, productId: string): Promise<ReferenceLibrary> {
  const existing = await manager.findOne(ReferenceLibrary, { where: { labId, productId } });
  if (existing) return existing;
  const inserted = await manager.insert(ReferenceLibrary, { labId, productId });
  return { id: inserted.identifiers[0].id as string, labId, productId };
}

/** A draft version holding `lots`, with a copy of the method they were prepared under. */
export async function createDraftVersion(
  manager: EntityManager,
  labId: string,
  libraryId: string,
  method: MethodSettings,
  grid: Float64Array,
  lots: NewLot[],
  methodVersionId: string | null = null,
): Promise<string> {
  const [{ next }] = await manager.query(`SELECT COALESCE(max(version), 0) + 1 AS next FROM library_version WHERE lab_id = $1 AND library_id = $2`, [labId, libraryId]);
  const inserted = await manager.insert(LibraryVersion, { labId, libraryId, version: Number(next), status: 'draft', method, gridHz: Array.from(grid), calibration: null, engineVersion: ENGINE_VERSION, methodVersionId });
  const versionId = inserted.identifiers[0].id as string;
  for (let i = 0; i < lots.length; i += 500) {
    await manager.insert(
      ReferenceLot,
      lots.slice(i, i + 500).map((l) => ({
        labId,
        libraryVersionId: versionId,
        lotCode: l.lotCode,
        producedOn: l.producedOn,
        note: l.note ?? '',
        spectrum: encodeLotSpectrum(l.spectrum),
        sampleId: l.sampleId ?? null,
        producerLotCode: l.producerLotCode ?? null,
        chemistry: l.chemistry ?? {},
        included: l.included ?? true,
        exclusionReason: l.exclusionReason ?? null,
        quality: l.quality ?? {},
      })),
    );
  }
  return versionId;
}

/** Lots compared so far by a running calibration (each lot against every other, leave-one-out). */
export type CalibrationProgress = (lotsDone: number, lotCount: number) => void;

/**
 * `calibrate` in the worker pool; with `onProgress`, told on this thread how many lots are compared
 * while it runs (a message port handed to the worker with the task).
 */
export async function calibrateInPool(args: Parameters<typeof calibrate>, onProgress?: CalibrationProgress): Promise<Calibration> {
  if (!onProgress) return runCpuTask('calibrateLibrary', { args });
  const { port1, port2 } = new MessageChannel();
  port1.on('message', (m: { lotsDone: number; lotCount: number }) => onProgress(m.lotsDone, m.lotCount));
  try {
    return await runCpuTask('calibrateLibrary', { args, progress: port2 }, { transferList: [port2] });
  } finally {
    port1.close();
  }
}

/** The engine's calibration of a version's included lots (in the stored order, the order analyses read them in). */
export async function calibrateVersion(manager: EntityManager, labId: string, version: LibraryVersion, onProgress?: CalibrationProgress): Promise<Calibration> {
  const rows: { spectrum: Buffer }[] = await manager.query(
    `SELECT spectrum FROM reference_lot WHERE library_version_id = $1 AND lab_id = $2 AND included ORDER BY lot_code, id`,
    [version.id, labId],
  );
  const grid = Float64Array.from(version.gridHz);
  const m = version.method;
  // Calibration compares every lot with every other and bootstraps the thresholds: a worker thread does it.
  return calibrateInPool(
    [
      rows.map((r) => decodeLotSpectrum(r.spectrum, grid)),
      { lowerQuantile: m.lowerQuantile, upperQuantile: m.upperQuantile, minimumLots: m.minimumLots, thresholdEstimator: m.thresholdEstimator ?? 'empirical-type7' },
    ],
    onProgress,
  );
}

const percentOf = (x: number) => `${Math.round(x * 100)} %`;

/** Why a draft with this calibration cannot be published; empty when it can. */
export function publishBlockers(method: MethodSettings, calibration: Calibration | null): PublishBlocker[] {
  if (!calibration) return [{ code: 'not-calibrated', message: 'The draft has not been calibrated yet.' }];
  const blockers: PublishBlocker[] = [];
  if (calibration.lotCount < method.minimumLots) {
    blockers.push({ code: 'too-few-lots', message: `${calibration.lotCount} lots are included; the method needs at least ${method.minimumLots}.` });
  } else if (calibration.noVerdictReason) {
    blockers.push({ code: 'no-thresholds', message: `No thresholds could be set: ${calibration.noVerdictReason}.` });
  }
  const limit = method.maxThresholdIntervalWidth;
  const pairs = [
    [`T${Math.round(method.lowerQuantile * 100)}`, calibration.lowerThreshold, calibration.lowerInterval],
    [`T${Math.round(method.upperQuantile * 100)}`, calibration.upperThreshold, calibration.upperInterval],
  ] as const;
  if (limit !== undefined) {
    for (const [name, threshold, interval] of pairs) {
      if (threshold === null || !interval) continue;
      const width = relativeWidth(threshold, interval);
      if (width > limit) {
        blockers.push({
          code: 'interval-too-wide',
          message: `The ${percentOf(calibration.bootstrap?.confidenceLevel ?? 0.95)} interval of ${name} (${interval[0].toPrecision(3)} to ${interval[1].toPrecision(3)}) spans ${percentOf(width)} of ${name}; the method allows at most ${percentOf(limit)}. Add lots or review the outliers.`,
        });
      }
    }
  }
  return blockers;
}

/**
 * Recalibrates a draft from its included lots and freezes it. Refused (409, naming every reason)
 * below the method's minimum number of lots, without thresholds, or when a threshold's interval
 * is wider than the method allows.
 */
export async function publishVersion(manager: EntityManager, labId: string, versionId: string, userId: string, onProgress?: CalibrationProgress, onStoring?: () => void): Promise<void> {
  const version = await manager.findOne(LibraryVersion, { where: { id: versionId, labId }, lock: { mode: 'pessimistic_write' } });
  if (!version) throw ApiError.notFound('Library version');
  if (version.status !== 'draft') throw ApiError.conflict(`Version ${version.version} is already ${version.status}.`);
  const calibration = await calibrateVersion(manager, labId, version, onProgress);
  const blockers = publishBlockers(version.method, calibration);
  if (blockers.length) {
    throw new ApiError(409, 'Library version cannot be published', `Version ${version.version} cannot be published: ${blockers.map((b) => b.message).join(' ')}`, {
      type: 'library-not-publishable',
      extensions: { reasons: blockers.map((b) => b.code).join(',') },
    });
  }
  onStoring?.();
  await manager.update(LibraryVersion, { id: versionId, labId }, { calibration, status: 'published', publishedAt: new Date(), publishedByUserId: userId, engineVersion: ENGINE_VERSION });
  await storeReferenceBand(manager, labId, versionId);
  await recordAudit(manager, {
    labId,
    actorUserId: userId,
    action: 'library.version-published',
    subjectType: 'library_version',
    subjectId: versionId,
    details: {
      version: version.version,
      lots: calibration.lotCount,
      estimator: calibration.thresholdEstimator ?? 'empirical-type7',
      t95: calibration.lowerThreshold,
      t99: calibration.upperThreshold,
      t95Interval: calibration.lowerInterval ?? null,
      t99Interval: calibration.upperInterval ?? null,
    },
  });
}
