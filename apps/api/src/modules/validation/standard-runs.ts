import type { EntityManager } from 'typeorm';
import { cellConstantFromStandard, conductivityAt, fitModel, kclConductivity, parseSpectrumFile, SpectrumImportError, type Spectrum } from '@ohmprint/spectral-engine';
import type { ControlChartView, CreateCell, CreateInstrument, StandardRunFields } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
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

/**
 * The standard's resistance from its spectrum: the median real part where the phase is within 1°
 * of 0° (the resistive plateau); without such a plateau, R of an R + CPE fit over the whole sweep.
 */
export function standardResistance(spectrum: Spectrum): { resistanceOhm: number; source: 'plateau' | 'fit'; how: string } {
  try {
    const c = cellConstantFromStandard(spectrum, { standardConductivityUSPerCm: 1 });
    return { resistanceOhm: c.plateauResistanceOhm, source: 'plateau', how: `plateau of ${c.plateauFrequenciesHz.length} point(s) with |phase| ≤ 1°` };
  } catch (err) {
    if (!(err instanceof RangeError)) throw err;
  }
  const fit = fitModel(spectrum, 'r-cpe', { restarts: 1 });
  if (!fit.converged) throw ApiError.badRequest(`The standard's spectrum has no resistive plateau and an R + CPE fit did not converge (${fit.reason}).`, [{ field: 'file', message: 'no plateau and no usable fit' }]);
  return { resistanceOhm: fit.parameters.r, source: 'fit', how: 'R of an R + CPE fit (no point within 1° of 0°)' };
}

/**
 * Records a KCl standard run: the conductivity of the standard at the run's temperature (the
 * certificate's value at 25 °C, or the tabulated one, by linear compensation), the resistance from
 * the uploaded spectrum, and K = κ·R. Returns the cell's chart with the new run on it.
 */
export async function recordStandardRun(
  manager: EntityManager,
  auth: AuthContext,
  labId: string,
  cellId: string,
  fields: StandardRunFields,
  file: { originalname: string; content(): Promise<Buffer> } | undefined,
): Promise<ControlChartView> {
  const [cell] = await manager.query(`SELECT id FROM measurement_cell WHERE id = $1 AND lab_id = $2 FOR UPDATE`, [cellId, labId]);
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
  // Read from its temporary file only now, after the checks that need no bytes.
  const bytes = await file.content();
  let spectrum: Spectrum;
  try {
    spectrum = parseSpectrumFile(bytes.toString('utf8'));
  } catch (err) {
    if (!(err instanceof SpectrumImportError)) throw err;
    throw ApiError.badRequest(`${file.originalname}: ${err.message}`, [{ field: 'file', message: `${file.originalname}: ${err.message}` }]);
  }
  const { resistanceOhm, source, how } = standardResistance(spectrum);
  const k = standard.conductivityUsPerCm * 1e-6 * resistanceOhm;
  const [row] = await manager.query(
    `INSERT INTO cell_calibration (lab_id, cell_id, standard_name, standard_conductivity_us_per_cm, standard_temperature_c,
        plateau_resistance_ohm, cell_constant_per_cm, measured_at, measured_by_user_id, concentration, concentration_basis,
        conductivity_source, resistance_source, file_name, raw_file, frequency_hz, re, im)
     VALUES ($1,$2,$3,$4,$5,$6,$7,$8,$9,$10,$11,$12,$18,$13,$14,$15,$16,$17) RETURNING id`,
    [
      labId, cellId, `KCl ${fields.concentration} mol/${fields.basis === 'molal' ? 'kg' : 'L'}`, standard.conductivityUsPerCm, fields.temperatureC,
      resistanceOhm, k, measuredAt, auth.userId, fields.concentration, fields.basis,
      `${standard.source}; ${standard.temperatureFormula}`, file.originalname, bytes,
      Array.from(spectrum.frequencyHz), Array.from(spectrum.re), Array.from(spectrum.im), source,
    ],
  );
  await recordAudit(manager, {
    labId, actorUserId: auth.userId, action: 'cell.standard-run', subjectType: 'measurement_cell', subjectId: cellId,
    details: { calibrationId: row.id, cellConstantPerCm: k, resistanceOhm, resistanceFrom: how, conductivityUsPerCm: standard.conductivityUsPerCm },
  });
  return cellControlChart(manager, labId, cellId);
}
