import { IsNull, type EntityManager } from 'typeorm';
import { averageReplicates, replicateAgreement, type Spectrum } from '@ohmprint/spectral-engine';
import { MATRIX_LABELS, type Chemistry, type CreateLibraryDraft, type LibraryDraftCreated, type LotInclusion, type LotQuality, type MethodSettings, type ReferenceLotDeclaration } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { recordAudit } from '../audit/record-audit';
import { methodGrid, prepareReplicates } from '../measurements/prepared-replicates';
import { Replicate } from '../measurements/replicate.entity';
import { LibraryVersion } from './library-version.entity';
import { calibrateVersion, createDraftVersion, libraryOf, type NewLot } from './library-versions';
import { decodeLotSpectrum } from './lot-spectrum-bytes';
import { methodVersionOf } from './method-versions';
import { ReferenceLot } from './reference-lot.entity';

/** Reference-lot samples past intake (received and accepted) can become lots once measured. */
const USABLE_STATES = ['accepted', 'measuring', 'analysed', 'in-review', 'reported', 'returned-for-rework'];

interface CandidateSample {
  id: string;
  code: string;
  reference_lot: ReferenceLotDeclaration;
}

/** A lot's quality under the method, and the problems that set it aside. */
export function lotQuality(replicates: readonly Replicate[], spectra: readonly Spectrum[], method: MethodSettings): LotQuality {
  const kk = replicates.map((r) => r.kramersKronig?.maxResidualPercent).filter((x): x is number => Number.isFinite(x));
  const kkMax = kk.length ? Math.max(...kk) : null;
  const agreement = spectra.length >= 2 ? replicateAgreement(spectra).maxDistance : null;
  const problems: string[] = [];
  if (spectra.length < method.minimumReplicates) problems.push(`${spectra.length} usable replicate(s); the method asks for at least ${method.minimumReplicates}`);
  if (kkMax !== null && kkMax > method.kkResidualLimitPercent) problems.push(`Kramers–Kronig residual ${kkMax.toFixed(2)} % above the limit of ${method.kkResidualLimitPercent} %`);
  if (agreement !== null && agreement > method.replicateDistanceLimit) problems.push(`replicates differ by ${agreement.toPrecision(3)}, above the limit of ${method.replicateDistanceLimit}`);
  return { replicates: spectra.length, kkMaxResidualPercent: kkMax, replicateMaxDistance: agreement, problems };
}

function uniqueCode(code: string, sampleCode: string, taken: Set<string>): string {
  const chosen = taken.has(code) ? `${code} (${sampleCode})` : code;
  taken.add(chosen);
  return chosen;
}

/**
 * A draft version of the product's library under a method version: one lot per measured
 * reference-lot sample (its included replicates prepared by the method and averaged), with the
 * lot's quality; a lot that misses the method's quality limits starts excluded, with the reason.
 * Lots of the latest version that came before enrolment (no sample) are carried over when the
 * grid is the same. Calibrated at once so the screen can show where it stands.
 */
export async function createLibraryDraft(manager: EntityManager, labId: string, userId: string, input: CreateLibraryDraft): Promise<LibraryDraftCreated> {
  const [product]: { id: string; name: string; matrix: string }[] = await manager.query(`SELECT id, name, matrix FROM product WHERE id = $1 AND lab_id = $2`, [input.productId, labId]);
  if (!product) throw ApiError.notFound('Product');
  const { version: methodVersion, method } = await methodVersionOf(manager, labId, input.methodVersionId);
  if (method.matrix !== product.matrix) {
    const words = (m: string) => MATRIX_LABELS[m as keyof typeof MATRIX_LABELS]?.toLowerCase() ?? m;
    throw ApiError.badRequest(`Method “${method.name}” is for ${words(method.matrix)}; ${product.name} is ${words(product.matrix)}.`, [
      { field: 'methodVersionId', message: `is a method for ${words(method.matrix)}` },
    ]);
  }
  const library = await libraryOf(manager, labId, product.id);
  await manager.query(`SELECT id FROM reference_library WHERE id = $1 FOR UPDATE`, [library.id]);
  const [draft] = await manager.query(`SELECT version FROM library_version WHERE lab_id = $1 AND library_id = $2 AND status = 'draft'`, [labId, library.id]);
  if (draft) throw ApiError.conflict(`Version ${draft.version} of ${product.name} is still a draft; publish or continue it before starting another.`);

  const settings = methodVersion.settings;
  const grid = methodGrid(settings);
  const samples: CandidateSample[] = await manager.query(
    `SELECT s.id, s.code, s.reference_lot FROM sample s JOIN test_order o ON o.id = s.order_id
     WHERE s.lab_id = $1 AND o.product_id = $2 AND s.kind = 'reference-lot' AND s.state = ANY($3::text[])
     ORDER BY s.code`,
    [labId, product.id, USABLE_STATES],
  );
  const lots: NewLot[] = [];
  const skipped: LibraryDraftCreated['skipped'] = [];
  const taken = new Set<string>();
  for (const sample of samples) {
    const replicates = await manager.find(Replicate, { where: { labId, sampleId: sample.id, excluded: false }, order: { replicateNumber: 'ASC' } });
    if (!replicates.length) {
      skipped.push({ sampleCode: sample.code, reason: 'no measured replicates yet' });
      continue;
    }
    const prepared = prepareReplicates(replicates, settings, grid);
    const spectra = prepared.flatMap((p) => (p.spectrum ? [p.spectrum] : []));
    if (!spectra.length) {
      skipped.push({ sampleCode: sample.code, reason: prepared.map((p) => p.coverageProblem).join('; ') });
      continue;
    }
    const quality = lotQuality(replicates, spectra, settings);
    const declared = sample.reference_lot;
    lots.push({
      lotCode: uniqueCode(declared.lotCode, sample.code, taken),
      producedOn: declared.producedOn ?? null,
      spectrum: spectra.length === 1 ? spectra[0] : averageReplicates(spectra),
      sampleId: sample.id,
      producerLotCode: declared.lotCode ?? null,
      chemistry: (declared.chemistry ?? {}) as Chemistry,
      included: quality.problems.length === 0,
      exclusionReason: quality.problems.length ? `Set aside by the method's quality limits: ${quality.problems.join('; ')}.` : null,
      quality,
    });
  }
  const previous: { id: string; grid_hz: number[] }[] = await manager.query(
    `SELECT id, grid_hz FROM library_version WHERE lab_id = $1 AND library_id = $2 ORDER BY version DESC LIMIT 1`,
    [labId, library.id],
  );
  if (previous.length) {
    const legacy = await manager.find(ReferenceLot, { where: { labId, libraryVersionId: previous[0].id, sampleId: IsNull() }, order: { lotCode: 'ASC' } });
    const sameGrid = previous[0].grid_hz.length === grid.length && previous[0].grid_hz.every((f, i) => Math.abs(f - grid[i]) <= 1e-9 * f);
    for (const lot of legacy) {
      if (!sameGrid) {
        skipped.push({ sampleCode: lot.lotCode, reason: 'an earlier lot without a stored measurement, on another grid: it cannot be carried over' });
        continue;
      }
      lots.push({
        lotCode: uniqueCode(lot.lotCode, 'earlier', taken),
        producedOn: lot.producedOn,
        note: lot.note,
        producerLotCode: lot.producerLotCode,
        spectrum: decodeLotSpectrum(lot.spectrum, grid),
        chemistry: lot.chemistry,
        included: lot.included,
        exclusionReason: lot.exclusionReason,
        quality: 'problems' in lot.quality ? (lot.quality as LotQuality) : undefined,
      });
    }
  }
  const versionId = await createDraftVersion(manager, labId, library.id, settings, grid, lots, methodVersion.id);
  await recalibrateDraft(manager, labId, versionId);
  const [{ version }] = await manager.query(`SELECT version FROM library_version WHERE id = $1`, [versionId]);
  await recordAudit(manager, {
    labId,
    actorUserId: userId,
    action: 'library.draft-created',
    subjectType: 'library_version',
    subjectId: versionId,
    details: { product: product.name, version, methodVersionId: methodVersion.id, lots: lots.length, excluded: lots.filter((l) => l.included === false).length, skipped },
  });
  return { id: versionId, version: Number(version), lotCount: lots.length, skipped };
}

async function lockedDraft(manager: EntityManager, labId: string, versionId: string, doing: string): Promise<LibraryVersion> {
  const version = await manager.findOne(LibraryVersion, { where: { id: versionId, labId }, lock: { mode: 'pessimistic_write' } });
  if (!version) throw ApiError.notFound('Library version');
  if (version.status !== 'draft') throw ApiError.conflict(`Version ${version.version} is ${version.status} and frozen; ${doing} needs a draft.`);
  return version;
}

/** Stores the engine's calibration of the draft's included lots (the draft stays a draft). */
export async function recalibrateDraft(manager: EntityManager, labId: string, versionId: string): Promise<void> {
  const version = await lockedDraft(manager, labId, versionId, 'calibrating');
  const calibration = await calibrateVersion(manager, labId, version);
  await manager.update(LibraryVersion, { id: versionId, labId }, { calibration });
}

/** Includes or excludes one lot of a draft, with the reason in the audit log; then recalibrates. */
export async function setLotInclusion(manager: EntityManager, labId: string, userId: string, versionId: string, lotId: string, input: LotInclusion): Promise<void> {
  const version = await lockedDraft(manager, labId, versionId, 'including or excluding lots');
  const lot = await manager.findOne(ReferenceLot, { where: { id: lotId, labId, libraryVersionId: versionId } });
  if (!lot) throw ApiError.notFound('Lot');
  if (lot.included === input.included) throw ApiError.conflict(`Lot ${lot.lotCode} is already ${lot.included ? 'included' : 'excluded'}.`);
  await manager.update(ReferenceLot, { id: lotId, labId }, { included: input.included, exclusionReason: input.included ? null : input.reason });
  await recordAudit(manager, {
    labId,
    actorUserId: userId,
    action: input.included ? 'library.lot-included' : 'library.lot-excluded',
    subjectType: 'reference_lot',
    subjectId: lotId,
    details: { lotCode: lot.lotCode, version: version.version, libraryVersionId: versionId, reason: input.reason },
  });
  await recalibrateDraft(manager, labId, versionId);
}

/**
 * Retires a published version: it takes no new analyses, but stays readable, and analyses (and
 * reports) that used it can still be reproduced. Only the retirement columns change; the
 * database refuses anything else on a published version.
 */
export async function retireVersion(manager: EntityManager, labId: string, userId: string, versionId: string, reason: string): Promise<void> {
  const version = await manager.findOne(LibraryVersion, { where: { id: versionId, labId }, lock: { mode: 'pessimistic_write' } });
  if (!version) throw ApiError.notFound('Library version');
  if (version.status !== 'published') throw ApiError.conflict(`Version ${version.version} is ${version.status}; only a published version can be retired.`);
  await manager.update(LibraryVersion, { id: versionId, labId }, { status: 'retired', retiredAt: new Date(), retiredByUserId: userId, retirementReason: reason });
  await recordAudit(manager, { labId, actorUserId: userId, action: 'library.version-retired', subjectType: 'library_version', subjectId: versionId, details: { version: version.version, reason } });
}

/** Discards a draft and its lots (nothing relies on a draft); audited. */
export async function discardDraft(manager: EntityManager, labId: string, userId: string, versionId: string): Promise<void> {
  const version = await lockedDraft(manager, labId, versionId, 'discarding');
  await manager.delete(ReferenceLot, { labId, libraryVersionId: versionId });
  await manager.delete(LibraryVersion, { id: versionId, labId });
  await recordAudit(manager, { labId, actorUserId: userId, action: 'library.draft-discarded', subjectType: 'library_version', subjectId: versionId, details: { version: version.version } });
}
