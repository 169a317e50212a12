import type { EntityManager } from 'typeorm';
import { conductivityAt, kclConductivity } from '@ohmprint/spectral-engine';
import type { ControlChartView, CreateCell, CreateInstrument, StandardRunFields } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import type { StandardRunReading } from '../../core/cpu-pool/cpu-tasks';
import type { AuthContext } from '../auth/auth-context';
import { recordAudit } from '../audit/record-audit';
import { cellControlChart } from './cell-control';

/** Postgres unique violation, e.g. a second instrument with the same name. */
function isUniqueViolation(err: unknown): boolean {
  return typeof err === 'object' && err !== null && (err as { code?: string }).code === '23505';
}

export async function createInstrument(manager: EntityManager, auth: AuthContext, labId: string, body: CreateInstrument): Promise<{ id: string }> {
  try {
    const [row] = await manager.query(`INSERT INTO instrument (lab_id, name, model, serial_number) VALUES ($1, $2, $3, $4) RETURNING id`, [labId, body.name, body.model, body.serialNumber]);
    await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'instrument.created', subjectType: 'instrument', subjectId: row.id, details: { ...body } });
    return { id: row.id };
  } catch (err) {
    if (isUniqueViolation(err)) throw ApiError.conflict(`An instrument named “${body.name}” already exists.`, [{ field: 'name', message: 'is already used by another instrument' }]);
    throw err;
  }
}

export async function createCell(manager: EntityManager, auth: AuthContext, labId: string, body: CreateCell): Promise<{ id: string }> {
  try {
    const [row] = await manager.query(`INSERT INTO measurement_cell (lab_id, name, nominal_constant_per_cm) VALUES ($1, $2, $3) RETURNING id`, [labId, body.name, body.nominalConstantPerCm]);
    await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'cell.created', subjectType: 'measurement_cell', subjectId: row.id, details: { ...body } });
    return { id: row.id };
  } catch (err) {
    if (isUniqueViolation(err)) throw ApiError.conflict(`A cell named “${body.name}” already exists.`, [{ field: 'name', message: 'is already used by another cell' }]);
    throw err;
  }
}

/** A standard run checked and read (off the event loop), ready to store. */
export interface PreparedStandardRun {
  fields: StandardRunFields;
  fileName: string;
  measuredAt: Date;
  standard: ReturnType<typeof kclConductivity>;
  reading: StandardRunReading;
}

/**
 * Checks a KCl standard run in the order a user meets the refusals (the cell, the file, the time,
 * the standard's conductivity at the run's temperature: the certificate's value at 25 °C, or the
 * tabulated one, by linear compensation), then parses the spectrum and finds the resistance in the
 * CPU pool. Runs before any transaction, so no row lock or connection is held while the CPU works.
 */
export async function prepareStandardRun(
  manager: EntityManager,
  labId: string,
  cellId: string,
  fields: StandardRunFields,
  file: { originalname: string; path: string } | undefined,
): Promise<PreparedStandardRun> {
  const [cell] = await manager.query(`SELECT id FROM measurement_cell WHERE id = $1 AND lab_id = $2`, [cellId, labId]);
  if (!cell) throw ApiError.notFound('Cell');
  if (!file) throw ApiError.badRequest('Attach the standard’s spectrum in the "file" field.', [{ field: 'file', message: 'is required' }]);
  const measuredAt = fields.measuredAt ? new Date(fields.measuredAt) : new Date();
  if (measuredAt.getTime() > Date.now() + 5 * 60_000) throw ApiError.badRequest('The measurement time is in the future; enter when the standard was measured.', [{ field: 'measuredAt', message: 'must not be in the future' }]);
  let standard;
  try {
    standard = fields.certifiedConductivityAt25UsPerCm
      ? conductivityAt(fields.certifiedConductivityAt25UsPerCm, fields.temperatureC, undefined, 'certificate of the standard')
      : kclConductivity(fields.concentration, fields.basis, fields.temperatureC);
  } catch (err) {
    if (!(err instanceof RangeError)) throw err;
    throw ApiError.badRequest(`${err.message}.`, [{ field: 'certifiedConductivityAt25UsPerCm', message: 'enter the value at 25 °C from the standard’s certificate' }]);
  }
  // The file is read from its temporary path in the worker, only after the checks that need no bytes.
  const reading = await runCpuTask('readStandardRun', { file: { name: file.originalname, path: file.path } });
  return { fields, fileName: file.originalname, measuredAt, standard, reading };
}

/**
 * Records a prepared KCl standard run under a lock on its cell: K = κ·R, the file and its spectrum.
 * Returns the cell's chart with the new run on it.
 */
export async function recordStandardRun(manager: EntityManager, auth: AuthContext, labId: string, cellId: string, run: PreparedStandardRun): Promise<ControlChartView> {
  const [cell] = await manager.query(`SELECT id FROM measurement_cell WHERE id = $1 AND lab_id = $2 FOR UPDATE`, [cellId, labId]);
  if (!cell) throw ApiError.notFound('Cell');
  const { fields, standard, reading } = run;
  const { resistanceOhm, source, how, literals, bytes } = reading;
  const k = standard.conductivityUsPerCm * 1e-6 * resistanceOhm;
  const [row] = await manager.query(
    `INSERT INTO cell_calibration (lab_id, cell_id, standard_name, standard_conductivity_us_per_cm, standard_temperature_c,
        plateau_resistance_ohm, cell_constant_per_cm, measured_at, measured_by_user_id, concentration, concentration_basis,
        conductivity_source, resistance_source, file_name, raw_file, frequency_hz, re, im)
     VALUES ($1,$2,$3,$4,$5,$6,$7,$8,$9,$10,$11,$12,$18,$13,$14,$15,$16,$17) RETURNING id`,
    [
      labId, cellId, `KCl ${fields.concentration} mol/${fields.basis === 'molal' ? 'kg' : 'L'}`, standard.conductivityUsPerCm, fields.temperatureC,
      resistanceOhm, k, run.measuredAt, auth.userId, fields.concentration, fields.basis,
      `${standard.source}; ${standard.temperatureFormula}`, run.fileName, Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength),
      literals.frequencyHz, literals.re, literals.im, source,
    ],
  );
  await recordAudit(manager, {
    labId, actorUserId: auth.userId, action: 'cell.standard-run', subjectType: 'measurement_cell', subjectId: cellId,
    details: { calibrationId: row.id, cellConstantPerCm: k, resistanceOhm, resistanceFrom: how, conductivityUsPerCm: standard.conductivityUsPerCm },
  });
  return cellControlChart(manager, labId, cellId);
}
