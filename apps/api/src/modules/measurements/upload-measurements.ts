import type { EntityManager } from 'typeorm';
import type { Spectrum } from '@ohmprint/spectral-engine';
import type { KramersKronigSummary, MeasurementUploadFields, MeasurementUploadResult, RejectedFile, SampleState } from '@ohmprint/contracts';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import { ApiError } from '../../core/api-error';
import { recordAudit } from '../audit/record-audit';
import { labMethod } from '../libraries/lab-method';
import { findLabSample, moveSample, requireSampleState } from '../samples/sample-access';
import { Sample } from '../samples/sample.entity';
import { CellCalibration } from './cell-calibration.entity';
import { Instrument } from './instrument.entity';
import { MeasurementCell } from './measurement-cell.entity';
import { Replicate } from './replicate.entity';
import { replicateViews } from './replicate-view';

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

const MEASURABLE: readonly SampleState[] = ['accepted', 'measuring', 'analysed', 'returned-for-rework'];
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

/**
 * Saves one replicate per readable file; each unreadable file is reported with the engine's
 * message (line and column) under its own name, and does not stop the others. The sample moves
 * to `measuring`. Nothing is saved when no file is readable.
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
  const [instrument, cell] = await Promise.all([
    manager.findOne(Instrument, { where: { id: fields.instrumentId, labId } }),
    manager.findOne(MeasurementCell, { where: { id: fields.cellId, labId } }),
  ]);
  const missing = [
    ...(instrument ? [] : [{ field: 'instrumentId', message: 'is not an instrument of this lab' }]),
    ...(cell ? [] : [{ field: 'cellId', message: 'is not a cell of this lab' }]),
  ];
  if (missing.length) throw ApiError.badRequest(missing.map((m) => `${m.field} ${m.message}`).join('; ') + '.', missing);
  const { k, calibrationId } = await cellConstantFor(manager, labId, fields);
  const method = await labMethod(manager, labId);

  // Parsing and the Kramers–Kronig check run in a worker thread; each bad file is reported alone.
  const results = await runCpuTask('parseExports', {
    files: files.map((f) => ({ name: f.originalname, bytes: new Uint8Array(f.buffer.buffer, f.buffer.byteOffset, f.buffer.byteLength) })),
    maxPoints: MEASUREMENT_LIMITS.pointsPerFile,
    kkLimitPercent: method.kkResidualLimitPercent,
  });
  const rejected: RejectedFile[] = [];
  const parsed: { file: UploadedExport; spectrum: Spectrum; kramersKronig: KramersKronigSummary }[] = [];
  results.forEach((result, i) => {
    if (result.ok) parsed.push({ file: files[i], spectrum: result.spectrum, kramersKronig: result.kramersKronig });
    else rejected.push({ fileName: result.name, line: result.line, column: result.column, message: `${result.name}: ${result.message}` });
  });
  if (!parsed.length) {
    throw ApiError.badRequest(
      `No file could be read, so nothing was saved. ${rejected.map((r) => r.message).join(' ')}`,
      rejected.map((r) => ({ field: `files[${r.fileName}]`, message: r.message })),
    );
  }

  const [{ max }] = await manager.query(`SELECT COALESCE(max(replicate_number), 0) AS max FROM replicate WHERE lab_id = $1 AND sample_id = $2`, [labId, sample.id]);
  const now = new Date();
  const rows = parsed.map(({ file, spectrum, kramersKronig }, i) => ({
    labId,
    sampleId: sample.id,
    replicateNumber: Number(max) + i + 1,
    fileName: file.originalname,
    rawFile: file.buffer,
    frequencyHz: Array.from(spectrum.frequencyHz),
    re: Array.from(spectrum.re),
    im: Array.from(spectrum.im),
    instrumentId: fields.instrumentId,
    cellId: fields.cellId,
    cellConstantPerCm: k,
    cellConstantSource: fields.cellConstantSource,
    calibrationId,
    temperatureC: fields.temperatureC,
    kramersKronig,
    via: uploader.kind === 'user' ? ('portal' as const) : ('instrument-key' as const),
    uploadedByUserId: uploader.kind === 'user' ? uploader.userId : null,
    instrumentKeyId: uploader.kind === 'instrument-key' ? uploader.keyId : null,
    uploadedAt: now,
  }));
  const inserted = await manager.insert(Replicate, rows);
  if (sample.state !== 'measuring') await moveSample(manager, sample, 'measuring');
  const ids = inserted.identifiers.map((x) => x.id as string);
  await recordAudit(manager, {
    labId,
    actorUserId: uploader.kind === 'user' ? uploader.userId : null,
    action: 'measurement.uploaded',
    subjectType: 'sample',
    subjectId: sample.id,
    details: { code: sample.code, replicates: ids, files: rows.map((r) => r.fileName), rejected: rejected.map((r) => r.fileName), ...(uploader.kind === 'instrument-key' ? { instrumentKeyId: uploader.keyId } : {}) },
  });
  return { saved: await replicateViews(manager, labId, sample.id, ids), rejected };
}
