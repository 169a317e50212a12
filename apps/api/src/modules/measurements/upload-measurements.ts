import type { EntityManager } from 'typeorm';
import type { Spectrum } from '@ohmprint/spectral-engine';
import { fieldInWords, type KramersKronigSummary, type MeasurementUploadFields, type MeasurementUploadResult, type RejectedFile, type SampleState } from '@ohmprint/contracts';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import type { SpectrumLiterals } from '../../core/cpu-pool/cpu-tasks';
import { ApiError } from '../../core/api-error';
import { recordAudit } from '../audit/record-audit';
import { DEFAULT_METHOD } from '../libraries/default-method';
import { labMethod } from '../libraries/lab-method';
import { requireRevokedIfReported } from '../analyses/revoked-report';
import { refreshOrderStatus } from '../orders/order-progress';
import { findLabSample, moveSample, requireSampleState } from '../samples/sample-access';
import { Sample } from '../samples/sample.entity';
import { CellCalibration } from './cell-calibration.entity';
import { Instrument } from './instrument.entity';
import { checkExportIdentity, type AcceptedExport } from './export-identity';
import { MeasurementCell } from './measurement-cell.entity';
import { Replicate } from './replicate.entity';
import { replicateViews } from './replicate-view';
import { requireCellInControl } from '../validation/cell-control';

/** Who is posting: a signed-in analyst, or a bench computer holding an instrument key. */
export type Uploader = { kind: 'user'; userId: string } | { kind: 'instrument-key'; keyId: string };

export interface UploadedExport {
  originalname: string;
  buffer: Buffer;
}

/**
 * Limits of one upload, each named in the refusal when exceeded. An impedance sweep has tens to a
 * few hundred frequencies (common practice); 5,000 rows leaves room for any real export while a
 * hostile file stops early instead of costing seconds of CPU and hundreds of MB.
 */
export const MEASUREMENT_LIMITS = { pointsPerFile: 5_000, files: 20, fileSizeBytes: 5 * 1048576 } as const;

/** Measurement uploads of one lab handled at once per API process; the next is refused with Retry-After. */
export const CONCURRENT_UPLOADS_PER_LAB = 2;

const MEASURABLE: readonly SampleState[] = ['accepted', 'measuring', 'analysed', 'returned-for-rework', 'reported'];
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A sample named by id (the portal) or by its printed code (a bench computer). */
async function sampleByReference(manager: EntityManager, labId: string, reference: string): Promise<Sample> {
  if (UUID.test(reference)) return findLabSample(manager, labId, reference, true);
  const found = await manager.findOne(Sample, { where: { labId, code: reference.trim().toUpperCase() }, lock: { mode: 'pessimistic_write' } });
  if (!found) throw ApiError.notFound(`Sample ${reference}`);
  return found;
}

async function cellConstantFor(manager: EntityManager, labId: string, fields: MeasurementUploadFields): Promise<{ k: number; calibrationId: string | null }> {
  if (fields.cellConstantSource === 'entered') return { k: fields.cellConstantPerCm as number, calibrationId: null };
  const latest = await manager.findOne(CellCalibration, { where: { labId, cellId: fields.cellId }, order: { measuredAt: 'DESC' } });
  if (!latest) {
    throw ApiError.badRequest('This cell has no KCl calibration yet: record one, or enter the cell constant.', [
      { field: 'cellConstantSource', message: 'the cell has no calibration; enter the cell constant instead' },
    ]);
  }
  return { k: latest.cellConstantPerCm, calibrationId: latest.id };
}

/** Nothing saved: 409 when a file names another sample (a confirmation can settle it), 400 otherwise. */
function nothingSaved(rejected: RejectedFile[]): ApiError {
  const errors = rejected.map((r) => ({ field: `files[${r.fileName}]`, message: r.message }));
  const detail = `No file was saved. ${rejected.map((r) => r.message).join(' ')}`;
  const other = rejected.find((r) => r.problem === 'other-sample');
  if (other) {
    return new ApiError(409, 'A file names another sample', detail, {
      type: 'other-sample',
      errors,
      extensions: { problem: other.problem, fileName: other.fileName, namedCode: other.namedCode, line: other.line },
    });
  }
  const temperature = rejected.find((r) => r.problem !== 'unreadable');
  return new ApiError(400, 'Invalid request', detail, {
    type: temperature ? 'measurement-temperature' : 'invalid-request',
    errors,
    ...(temperature ? { extensions: { problem: temperature.problem, fileName: temperature.fileName, line: temperature.line, fileTemperatureC: temperature.fileTemperatureC } } : {}),
  });
}

/**
 * Saves one replicate per readable file whose identity and temperature check out; each other file
 * is reported under its own name (the engine's line and column for an unreadable one; the code
 * and line for one naming another sample; the temperatures for a mismatch) and does not stop the
 * others. The sample moves to `measuring`. Nothing is saved when no file is accepted.
 */
export async function uploadMeasurements(
  manager: EntityManager,
  uploader: Uploader,
  labId: string,
  sampleReference: string,
  fields: MeasurementUploadFields,
  files: UploadedExport[],
): Promise<MeasurementUploadResult> {
  if (!files.length) throw ApiError.badRequest('Send one instrument export per replicate in the "files" field.', [{ field: 'files', message: 'is required' }]);
  const sample = await sampleByReference(manager, labId, sampleReference);
  requireSampleState(sample, MEASURABLE, 'uploading measurements');
  await requireRevokedIfReported(manager, sample, 'uploading measurements');
  const [instrument, cell] = await Promise.all([
    manager.findOne(Instrument, { where: { id: fields.instrumentId, labId } }),
    manager.findOne(MeasurementCell, { where: { id: fields.cellId, labId } }),
  ]);
  const missing = [
    ...(instrument ? [] : [{ field: 'instrumentId', message: 'is not an instrument of this lab' }]),
    ...(cell ? [] : [{ field: 'cellId', message: 'is not a cell of this lab' }]),
  ];
  if (missing.length) throw ApiError.badRequest(missing.map((m) => `${fieldInWords(m.field)} ${m.message}`).join('; ') + '.', missing);
  await requireCellInControl(manager, labId, fields.cellId, sample.code);
  const { k, calibrationId } = await cellConstantFor(manager, labId, fields);
  const method = await labMethod(manager, labId);

  // Parsing and the Kramers–Kronig check run in a worker thread; each bad file is reported alone.
  const results = await runCpuTask('parseExports', {
    files: files.map((f) => ({ name: f.originalname, bytes: new Uint8Array(f.buffer.buffer, f.buffer.byteOffset, f.buffer.byteLength) })),
    maxPoints: MEASUREMENT_LIMITS.pointsPerFile,
    kkLimitPercent: method.kkResidualLimitPercent,
  });
  const rejected: RejectedFile[] = [];
  const parsed: { file: UploadedExport; spectrum: Spectrum; kramersKronig: KramersKronigSummary; literals: SpectrumLiterals; identity: AcceptedExport }[] = [];
  const confirmations = fields.confirmations ?? [];
  results.forEach((result, i) => {
    if (!result.ok) {
      rejected.push({ fileName: result.name, line: result.line, column: result.column, message: `${result.name}: ${result.message}`, problem: 'unreadable', namedCode: null, fileTemperatureC: null });
      return;
    }
    const checked = checkExportIdentity({
      sampleCode: sample.code,
      fileName: files[i].originalname,
      text: files[i].buffer.toString('utf8'),
      enteredTemperatureC: fields.temperatureC,
      mismatchLimitC: method.temperatureMismatchLimitC ?? DEFAULT_METHOD.temperatureMismatchLimitC,
      confirmations,
    });
    if (checked.ok) parsed.push({ file: files[i], spectrum: result.spectrum, kramersKronig: result.kramersKronig, literals: result.literals, identity: checked.value });
    else rejected.push(checked.refusal);
  });
  if (!parsed.length) throw nothingSaved(rejected);

  const [{ max }] = await manager.query(`SELECT COALESCE(max(replicate_number), 0) AS max FROM replicate WHERE lab_id = $1 AND sample_id = $2`, [labId, sample.id]);
  const now = new Date();
  // The point columns go to the database as the array literals the worker wrote (see SpectrumLiterals).
  const asColumn = (literal: string) => literal as unknown as number[];
  const rows = parsed.map(({ file, literals, kramersKronig, identity }, i) => ({
    labId,
    sampleId: sample.id,
    replicateNumber: Number(max) + i + 1,
    fileName: file.originalname,
    rawFile: file.buffer,
    frequencyHz: asColumn(literals.frequencyHz),
    re: asColumn(literals.re),
    im: asColumn(literals.im),
    instrumentId: fields.instrumentId,
    cellId: fields.cellId,
    cellConstantPerCm: k,
    cellConstantSource: fields.cellConstantSource,
    calibrationId,
    temperatureC: identity.temperatureC,
    temperatureSource: identity.temperatureSource,
    declared: identity.declared,
    kramersKronig,
    via: uploader.kind === 'user' ? ('portal' as const) : ('instrument-key' as const),
    uploadedByUserId: uploader.kind === 'user' ? uploader.userId : null,
    instrumentKeyId: uploader.kind === 'instrument-key' ? uploader.keyId : null,
    uploadedAt: now,
  }));
  const inserted = await manager.insert(Replicate, rows);
  if (sample.state !== 'measuring') {
    const wasReported = sample.state === 'reported';
    await moveSample(manager, sample, 'measuring');
    if (wasReported) await refreshOrderStatus(manager, labId, sample.orderId);
  }
  const ids = inserted.identifiers.map((x) => x.id as string);
  const actorUserId = uploader.kind === 'user' ? uploader.userId : null;
  for (const [i, { file, identity }] of parsed.entries()) {
    for (const c of identity.confirmed) {
      const other = c.about === 'sample-code';
      await recordAudit(manager, {
        labId,
        actorUserId,
        action: other ? 'measurement.other-sample-confirmed' : 'measurement.temperature-confirmed',
        subjectType: 'sample',
        subjectId: sample.id,
        details: {
          code: sample.code,
          replicateId: ids[i],
          fileName: file.originalname,
          reason: c.reason,
          ...(other
            ? { namedCodes: identity.declared.otherCodes }
            : { fileTemperatureC: identity.declared.temperature?.celsius ?? null, enteredTemperatureC: identity.temperatureC }),
          ...(uploader.kind === 'instrument-key' ? { instrumentKeyId: uploader.keyId } : {}),
        },
      });
    }
  }
  await recordAudit(manager, {
    labId,
    actorUserId,
    action: 'measurement.uploaded',
    subjectType: 'sample',
    subjectId: sample.id,
    details: { code: sample.code, replicates: ids, files: rows.map((r) => r.fileName), rejected: rejected.map((r) => r.fileName), ...(uploader.kind === 'instrument-key' ? { instrumentKeyId: uploader.keyId } : {}) },
  });
  return { saved: await replicateViews(manager, labId, sample.id, ids), rejected };
}
