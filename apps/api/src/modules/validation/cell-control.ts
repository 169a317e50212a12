import type { EntityManager } from 'typeorm';
import { controlChart, type ControlChart } from '@ohmprint/spectral-engine';
import type { CellControlStatus, ControlChartView, ControlRuleName, StandardRun } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { dataSource } from '../../db/data-source';

/** Written beside the chart so the screen and the PDF state the rule they apply. */
export const BASELINE_RULE =
  'Centre line and limits come from the cell’s first 10 standard runs (rules apply from the 5th): centre = their mean, σ = their mean moving range ÷ 1.128, limits = centre ± 3σ.';

/** Ohmprint’s run rules (common SPC practice for individuals charts). */
export const CONTROL_RULE_TEXT: Record<ControlRuleName, string> = {
  'beyond-3-sigma': 'One run outside the ±3σ limits',
  'run-one-side': 'Eight runs in a row on one side of the centre line',
  trend: 'Six runs in a row each higher (or each lower) than the last',
};

interface RunRow {
  id: string;
  standard_name: string;
  concentration: number | null;
  concentration_basis: 'molal' | 'molar' | null;
  standard_temperature_c: number;
  standard_conductivity_us_per_cm: number;
  conductivity_source: string | null;
  plateau_resistance_ohm: number;
  resistance_source: 'plateau' | 'entered';
  cell_constant_per_cm: number;
  file_name: string | null;
  measured_at: Date;
  by_id: string;
  by_name: string;
}

interface CellRow {
  id: string;
  name: string;
  nominal_constant_per_cm: number;
}

async function cellOf(manager: EntityManager, labId: string, cellId: string): Promise<CellRow> {
  const [cell] = await manager.query(`SELECT id, name, nominal_constant_per_cm FROM measurement_cell WHERE id = $1 AND lab_id = $2`, [cellId, labId]);
  if (!cell) throw ApiError.notFound('Cell');
  return cell;
}

/** Oldest first; runs recorded in one instant order by id so the chart is stable. */
async function runsOf(manager: EntityManager, labId: string, cellId: string): Promise<RunRow[]> {
  return manager.query(
    `SELECT c.id, c.standard_name, c.concentration, c.concentration_basis, c.standard_temperature_c,
            c.standard_conductivity_us_per_cm, c.conductivity_source, c.plateau_resistance_ohm, c.resistance_source,
            c.cell_constant_per_cm, c.file_name, c.measured_at, u.id AS by_id, u.display_name AS by_name
     FROM cell_calibration c JOIN app_user u ON u.id = c.measured_by_user_id
     WHERE c.lab_id = $1 AND c.cell_id = $2 ORDER BY c.measured_at, c.created_at, c.id`,
    [labId, cellId],
  );
}

export function statusOf(cellName: string, chart: ControlChart): CellControlStatus {
  if (chart.centre === null) {
    return { state: 'establishing', message: `${cellName} has ${chart.baselineCount} standard run(s); its control limits are set from the 5th run on.`, brokenRules: [] };
  }
  const last = chart.points[chart.points.length - 1];
  if (chart.inControl) return { state: 'in-control', message: `${cellName} is in control: its newest standard run breaks no rule.`, brokenRules: [] };
  const broken = last.signals.map((s) => ({ rule: s.rule, message: s.message }));
  return {
    state: 'out-of-control',
    message: `${cellName} is out of control (${broken.map((b) => `${CONTROL_RULE_TEXT[b.rule].toLowerCase()}: ${b.message}`).join('; ')}). Measurements on it are refused until a new KCl standard run is back in control.`,
    brokenRules: broken,
  };
}

/** A cell's control chart: every standard run, the limits, the rules and the status. */
export async function cellControlChart(manager: EntityManager, labId: string, cellId: string): Promise<ControlChartView> {
  const cell = await cellOf(manager, labId, cellId);
  const runs = await runsOf(manager, labId, cellId);
  const chart = controlChart(runs.map((r) => r.cell_constant_per_cm));
  const refusals: { refused_at: Date; sample_code: string; rule: string }[] = await manager.query(
    `SELECT refused_at, sample_code, rule FROM cell_upload_refusal WHERE lab_id = $1 AND cell_id = $2 ORDER BY refused_at DESC, id LIMIT 50`,
    [labId, cellId],
  );
  return {
    cell: { id: cell.id, name: cell.name, nominalConstantPerCm: cell.nominal_constant_per_cm },
    centre: chart.centre,
    sigma: chart.sigma,
    upperLimit: chart.upperLimit,
    lowerLimit: chart.lowerLimit,
    baselineCount: chart.baselineCount,
    baselineRule: BASELINE_RULE,
    rules: (Object.keys(CONTROL_RULE_TEXT) as ControlRuleName[]).map((rule) => ({ rule, description: CONTROL_RULE_TEXT[rule] })),
    status: statusOf(cell.name, chart),
    runs: runs.map((r, i): StandardRun => ({
      id: r.id,
      standardName: r.standard_name,
      concentration: r.concentration,
      basis: r.concentration_basis,
      temperatureC: r.standard_temperature_c,
      standardConductivityUsPerCm: r.standard_conductivity_us_per_cm,
      conductivitySource: r.conductivity_source,
      plateauResistanceOhm: r.plateau_resistance_ohm,
      resistanceSource: r.resistance_source,
      cellConstantPerCm: r.cell_constant_per_cm,
      fileName: r.file_name,
      measuredAt: r.measured_at.toISOString(),
      measuredBy: { id: r.by_id, displayName: r.by_name },
      inBaseline: chart.points[i].inBaseline,
      signals: chart.points[i].signals.map((s) => ({ rule: s.rule, message: s.message })),
    })),
    refusals: refusals.map((r) => ({ at: r.refused_at.toISOString(), sampleCode: r.sample_code, rule: r.rule })),
  };
}

/** Control status of every cell of the lab, for the bench and the measurement screen. */
export async function cellStatuses(manager: EntityManager, labId: string): Promise<Map<string, CellControlStatus>> {
  const rows: { cell_id: string; name: string; constants: number[] }[] = await manager.query(
    `SELECT m.id AS cell_id, m.name,
            COALESCE(array_agg(c.cell_constant_per_cm ORDER BY c.measured_at, c.created_at, c.id) FILTER (WHERE c.id IS NOT NULL), '{}') AS constants
     FROM measurement_cell m LEFT JOIN cell_calibration c ON c.cell_id = m.id AND c.lab_id = m.lab_id
     WHERE m.lab_id = $1 GROUP BY m.id, m.name`,
    [labId],
  );
  return new Map(rows.map((r) => [r.cell_id, statusOf(r.name, controlChart(r.constants))]));
}

/**
 * Refuses a measurement on a cell whose newest standard run breaks a control rule: 409 naming the
 * cell and the rule. The refusal is remembered on the cell's chart (outside the upload's own
 * transaction, which rolls back).
 */
export async function requireCellInControl(manager: EntityManager, labId: string, cellId: string, sampleCode: string): Promise<void> {
  const cell = await cellOf(manager, labId, cellId);
  const constants = (await runsOf(manager, labId, cellId)).map((r) => r.cell_constant_per_cm);
  const status = statusOf(cell.name, controlChart(constants));
  if (status.state !== 'out-of-control') return;
  const rules = status.brokenRules.map((b) => CONTROL_RULE_TEXT[b.rule].toLowerCase()).join('; ');
  await dataSource.query(`INSERT INTO cell_upload_refusal (lab_id, cell_id, sample_code, rule) VALUES ($1, $2, $3, $4)`, [labId, cellId, sampleCode, rules]);
  throw new ApiError(409, 'Cell out of control', status.message, {
    type: 'cell-out-of-control',
    errors: [{ field: 'cellId', message: `${cell.name} is out of control: ${rules}` }],
    extensions: { cellId, cellName: cell.name, rule: status.brokenRules.map((b) => b.rule).join(',') },
  });
}
