import type { EntityManager } from 'typeorm';
import { ENGINE_VERSION, type Spectrum } from '@ohmprint/spectral-engine';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import type { MethodSettings } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { recordAudit } from '../audit/record-audit';
import { LibraryVersion } from './library-version.entity';
import { decodeLotSpectrum, encodeLotSpectrum } from './lot-spectrum-bytes';
import { ReferenceLibrary } from './reference-library.entity';
import { ReferenceLot } from './reference-lot.entity';

export interface NewLot {
  lotCode: string;
  producedOn: string | null;
  note?: string;
  /** Normalised, on the version's grid. */
  spectrum: Spectrum;
}

/** The product's library, created on first use. */
export async function libraryOf(manager: EntityManager, labId: string, productId: string): Promise<ReferenceLibrary> {
  const existing = await manager.findOne(ReferenceLibrary, { where: { labId, productId } });
  if (existing) return existing;
  const inserted = await manager.insert(ReferenceLibrary, { labId, productId });
  return { id: inserted.identifiers[0].id as string, labId, productId };
}

/** A draft version holding `lots`, with a copy of the method they were prepared under. */
export async function createDraftVersion(manager: EntityManager, labId: string, libraryId: string, method: MethodSettings, grid: Float64Array, lots: NewLot[]): Promise<string> {
  const [{ next }] = await manager.query(`SELECT COALESCE(max(version), 0) + 1 AS next FROM library_version WHERE lab_id = $1 AND library_id = $2`, [labId, libraryId]);
  const inserted = await manager.insert(LibraryVersion, { labId, libraryId, version: Number(next), status: 'draft', method, gridHz: Array.from(grid), calibration: null, engineVersion: ENGINE_VERSION });
  const versionId = inserted.identifiers[0].id as string;
  for (let i = 0; i < lots.length; i += 500) {
    await manager.insert(
      ReferenceLot,
      lots.slice(i, i + 500).map((l) => ({ labId, libraryVersionId: versionId, lotCode: l.lotCode, producedOn: l.producedOn, note: l.note ?? '', spectrum: encodeLotSpectrum(l.spectrum) })),
    );
  }
  return versionId;
}

/**
 * Calibrates a draft with the engine (lots in the stored order, the order analyses read them in)
 * and freezes it. Refused below the method's minimum number of lots.
 */
export async function publishVersion(manager: EntityManager, labId: string, versionId: string, userId: string): Promise<void> {
  const version = await manager.findOne(LibraryVersion, { where: { id: versionId, labId }, lock: { mode: 'pessimistic_write' } });
  if (!version) throw ApiError.notFound('Library version');
  if (version.status === 'published') throw ApiError.conflict(`Version ${version.version} is already published.`);
  const rows: { spectrum: Buffer }[] = await manager.query(`SELECT spectrum FROM reference_lot WHERE library_version_id = $1 AND lab_id = $2 ORDER BY lot_code, id`, [versionId, labId]);
  if (rows.length < version.method.minimumLots) {
    throw ApiError.conflict(`Version ${version.version} holds ${rows.length} lots; the method needs at least ${version.method.minimumLots} before it can be published.`);
  }
  const grid = Float64Array.from(version.gridHz);
  // Calibration compares every lot with every other: a worker thread does it.
  const calibration = await runCpuTask('calibrateLibrary', {
    args: [rows.map((r) => decodeLotSpectrum(r.spectrum, grid)), { lowerQuantile: version.method.lowerQuantile, upperQuantile: version.method.upperQuantile, minimumLots: version.method.minimumLots }],
  });
  await manager.update(LibraryVersion, { id: versionId, labId }, { calibration, status: 'published', publishedAt: new Date(), publishedByUserId: userId, engineVersion: ENGINE_VERSION });
  await recordAudit(manager, {
    labId,
    actorUserId: userId,
    action: 'library.version-published',
    subjectType: 'library_version',
    subjectId: versionId,
    details: { version: version.version, lots: rows.length, t95: calibration.lowerThreshold, t99: calibration.upperThreshold },
  });
}
