import type { EntityManager } from 'typeorm';
import type { BenchEquipment, CellCalibration as CellCalibrationView, RecordCellCalibration } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { recordAudit } from '../audit/record-audit';
import { cellConstantPerCm } from './cell-constant';
import { CellCalibration } from './cell-calibration.entity';
import { cellStatuses } from '../validation/cell-control';

interface CalibrationRow {
  id: string;
  cell_id: string;
  standard_name: string;
  standard_conductivity_us_per_cm: number;
  standard_temperature_c: number;
  plateau_resistance_ohm: number;
  cell_constant_per_cm: number;
  measured_at: Date;
  by_id: string;
  by_name: string;
}

const calibrationView = (c: CalibrationRow): CellCalibrationView => ({
  id: c.id,
  standardName: c.standard_name,
  standardConductivityUsPerCm: c.standard_conductivity_us_per_cm,
  standardTemperatureC: c.standard_temperature_c,
  plateauResistanceOhm: c.plateau_resistance_ohm,
  cellConstantPerCm: c.cell_constant_per_cm,
  measuredAt: c.measured_at.toISOString(),
  measuredBy: { id: c.by_id, displayName: c.by_name },
});

/** The lab's instruments and cells, each cell with its newest KCl calibration. */
export async function benchEquipment(manager: EntityManager, labId: string): Promise<BenchEquipment> {
  const instruments: { id: string; name: string; model: string; serial_number: string }[] = await manager.query(
    `SELECT id, name, model, serial_number FROM instrument WHERE lab_id = $1 ORDER BY lower(name)`,
    [labId],
  );
  const cells: { id: string; name: string; nominal_constant_per_cm: number }[] = await manager.query(
    `SELECT id, name, nominal_constant_per_cm FROM measurement_cell WHERE lab_id = $1 ORDER BY lower(name)`,
    [labId],
  );
  const latest: CalibrationRow[] = await manager.query(
    `SELECT DISTINCT ON (c.cell_id) c.*, u.id AS by_id, u.display_name AS by_name
     FROM cell_calibration c JOIN app_user u ON u.id = c.measured_by_user_id
     WHERE c.lab_id = $1 ORDER BY c.cell_id, c.measured_at DESC`,
    [labId],
  );
  const control = await cellStatuses(manager, labId);
  return {
    instruments: instruments.map((i) => ({ id: i.id, name: i.name, model: i.model, serialNumber: i.serial_number })),
    cells: cells.map((c) => {
      const cal = latest.find((l) => l.cell_id === c.id);
      return { id: c.id, name: c.name, nominalConstantPerCm: c.nominal_constant_per_cm, latestCalibration: cal ? calibrationView(cal) : null, control: control.get(c.id) ?? null };
    }),
  };
}

/** A new KCl check of a cell; later uploads that ask for "latest calibration" use it. */
export async function recordCellCalibration(manager: EntityManager, auth: AuthContext, labId: string, cellId: string, body: RecordCellCalibration): Promise<BenchEquipment> {
  const [cell] = await manager.query(`SELECT id FROM measurement_cell WHERE id = $1 AND lab_id = $2`, [cellId, labId]);
  if (!cell) throw ApiError.notFound('Cell');
  const measuredAt = body.measuredAt ? new Date(body.measuredAt) : new Date();
  if (measuredAt.getTime() > Date.now() + 5 * 60_000) throw ApiError.badRequest('The measurement time is in the future; enter when the calibration was measured.', [{ field: 'measuredAt', message: 'must not be in the future' }]);
  const k = cellConstantPerCm(body.standardConductivityUsPerCm, body.plateauResistanceOhm);
  const inserted = await manager.insert(CellCalibration, { ...body, labId, cellId, cellConstantPerCm: k, measuredAt, measuredByUserId: auth.userId });
  await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'cell.calibrated', subjectType: 'measurement_cell', subjectId: cellId, details: { calibrationId: inserted.identifiers[0].id, cellConstantPerCm: k } });
  return benchEquipment(manager, labId);
}
