import { readFile } from 'node:fs/promises';
import type { EntityManager } from 'typeorm';
import { fieldInWords, SAMPLE_CODE_PATTERN, type KramersKronigSummary, type MeasurementUploadFields, type MeasurementUploadResult, type RejectedFile, type SampleState } from '@ohmprint/contracts';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import type { ParsedExport, SpectrumLiterals } from '../../core/cpu-pool/cpu-tasks';
import { ApiError } from '../../core/api-error';
import { dataSource } from '../../db/data-source';
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

/** One instrument export as multer left it in the upload's private temporary folder. */
export interface UploadedExport {
  originalname: string;
  path: string;
  size: number;
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

/** A sample named by id (the portal) or by its printed code (a bench computer); `lock` inside a transaction. */
async function sampleByReference(manager: EntityManager, labId: string, reference: string, lock: boolean): Promise<Sample> {
  if (UUID.test(reference)) return findLabSample(manager, labId, reference, lock);
  const found = await manager.findOne(Sample, { where: { labId, code: reference.trim().toUpperCase() }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
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

/** Everything an upload is checked against: the sample (locked inside a transaction), its bench and the lab's method. */
async function uploadTarget(manager: EntityManager, labId: string, sampleReference: string, fields: MeasurementUploadFields, lock: boolean) {
  const sample = await sampleByReference(manager, labId, sampleReference, lock);
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
  return { sample, k, calibrationId, method };
}

/**
 * Each export parsed in the worker pool straight from its temporary file, one file per task, so
 * other work (a sign-in's hash, a report) takes its turn between two files of a large upload.
 */
async function parseUploadedExports(files: UploadedExport[], kkLimitPercent: number): Promise<ParsedExport[]> {
  const results: ParsedExport[] = [];
  for (const f of files) {
    results.push(
      await runCpuTask('parseExportFile', {
        file: { name: f.originalname, path: f.path },
        maxPoints: MEASUREMENT_LIMITS.pointsPerFile,
        kkLimitPercent,
        codePattern: SAMPLE_CODE_PATTERN.source,
      }),
    );
  }
  return results;
}

/**
 * Saves one replicate per readable file whose identity and temperature check out; each other file
 * is reported under its own name (the engine's line and column for an unreadable one; the code
 * and line for one naming another sample; the temperatures for a mismatch) and does not stop the
 * others. The sample moves to `measuring`. Nothing is saved when no file is accepted.
 *
 * No database connection waits on the parsing: the sample and bench are checked first (read only,
 * so a wrong request is refused before any file is read), the files are parsed in the worker pool,
 * then one short transaction locks the sample, checks again and stores the replicates — each
 * file's bytes read from its temporary file just before its own row is written, so at most one
 * file is in memory at a time.
 */
export async function uploadMeasurements(uploader: Uploader, labId: string, sampleReference: string, fields: MeasurementUploadFields, files: UploadedExport[]): Promise<MeasurementUploadResult> {
  if (!files.length) throw ApiError.badRequest('Send one instrument export per replicate in the "files" field.', [{ field: 'files', message: 'is required' }]);
  const before = await uploadTarget(dataSource.manager, labId, sampleReference, fields, false);
  const results = await parseUploadedExports(files, before.method.kkResidualLimitPercent);
  return dataSource.transaction((manager) => storeUpload(manager, uploader, labId, sampleReference, fields, files, results));
}

async function storeUpload(
  manager: EntityManager,
  uploader: Uploader,
  labId: string,
  sampleReference: string,
  fields: MeasurementUploadFields,
  files: UploadedExport[],
  results: ParsedExport[],
): Promise<MeasurementUploadResult> {
  const { sample, k, calibrationId, method } = await uploadTarget(manager, labId, sampleReference, fields, true);
  const rejected: RejectedFile[] = [];
  const parsed: { file: UploadedExport; kramersKronig: KramersKronigSummary; literals: SpectrumLiterals; identity: AcceptedExport }[] = [];
  const confirmations = fields.confirmations ?? [];
  results.forEach((result, i) => {
    if (!result.ok) {
      rejected.push({ fileName: result.name, line: result.line, column: result.column, message: `${result.name}: ${result.message}`, problem: 'unreadable', namedCode: null, fileTemperatureC: null });
      return;
    }
    const checked = checkExportIdentity({
      sampleCode: sample.code,
      fileName: files[i].originalname,
      metadata: result.metadata,
      enteredTemperatureC: fields.temperatureC,
      mismatchLimitC: method.temperatureMismatchLimitC ?? DEFAULT_METHOD.temperatureMismatchLimitC,
      confirmations,
    });
    if (checked.ok) parsed.push({ file: files[i], kramersKronig: result.kramersKronig, literals: result.literals, identity: checked.value });
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
  const ids: string[] = [];
  for (const [i, row] of rows.entries()) {
    // One file's bytes in memory at a time, read back from the upload's temporary file.
    const inserted = await manager.insert(Replicate, { ...row, rawFile: await readFile(parsed[i].file.path) });
    ids.push(inserted.identifiers[0].id as string);
  }
  if (sample.state !== 'measuring') {
    const wasReported = sample.state === 'reported';
    await moveSample(manager, sample, 'measuring');
    if (wasReported) await refreshOrderStatus(manager, labId, sample.orderId);
  }
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
