import type { Request, Router } from 'express';
import { z } from 'zod';
import {
  BenchEquipmentSchema,
  ControlChartSchema,
  CorrelationStudySchema,
  CreateCellSchema,
  CreateInstrumentSchema,
  DetectionStudySchema,
  IdParamsSchema,
  OngoingPerformanceSchema,
  RepeatabilityStudySchema,
  StandardRunFieldsSchema,
  ValidationFlagsSchema,
  type Role,
} from '@ohmprint/contracts';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import { routeTable } from '../../core/route-table';
import { labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { benchEquipment } from '../measurements/bench-equipment';
import { LAB_STAFF } from '../samples/lab-roles';
import { tenantBoundedUpload } from '../samples/tenant-bounded-upload';
import { cellControlChart } from './cell-control';
import { correlationStudy } from './correlation';
import { toCsv } from './csv';
import { repeatabilityStudy } from './repeatability';
import { createCell, createInstrument, prepareStandardRun, recordStandardRun } from './standard-runs';
import { detectionStudy, ongoingPerformance, setValidationFlags, validationFlags } from './studies';

const tag = 'Validation';
/** Who may open the method-validation screens. */
const VALIDATORS: readonly Role[] = ['lab-admin', 'analyst', 'reviewer'];
const RUN_LIMITS = { fileSizeBytes: 5 * 1048576, files: 1 };
export const CONCURRENT_RUN_UPLOADS_PER_LAB = 2;
const StandardRunBodySchema = z.object({ ...StandardRunFieldsSchema.shape, file: z.string().optional().meta({ format: 'binary', description: 'The standard’s instrument export (text), at most 5 MB' }) });

const idOf = (res: { locals: Record<string, unknown> }) => (res.locals.params as { id: string }).id;
const lab = (res: { locals: Record<string, unknown> }) => labIdOf(res.locals.auth as Parameters<typeof labIdOf>[0]);
const dated = (name: string) => `${name}-${new Date().toISOString().slice(0, 10)}`;
/** The run's file as multer wrote it to disk (read by the worker that parses it). */
const runFileOf = ({ file }: Request) => (file ? { originalname: file.originalname, path: file.path } : undefined);

/** Instruments, cells, KCl standard runs and control charts; method validation studies and downloads. */
export function validationRouter(): Router {
  const { router, route } = routeTable();
  // Run files stream to a private temporary folder (removed when the answer is sent), two uploads per lab at once.
  const upload = tenantBoundedUpload({ limits: RUN_LIMITS, select: (m) => m.single('file'), perTenant: CONCURRENT_RUN_UPLOADS_PER_LAB,
    what: 'standard run uploads of one lab', tenantOf: lab });

  route({ method: 'post', path: '/lab/instruments', tag, summary: 'Add an impedance analyser to the bench', roles: ['lab-admin'], body: CreateInstrumentSchema, response: BenchEquipmentSchema, status: 201 }, async (_req, res) => {
    const labId = lab(res);
    res.status(201).json(await dataSource.transaction(async (m) => {
      await createInstrument(m, res.locals.auth, labId, res.locals.body);
      return benchEquipment(m, labId);
    }));
  });

  route({ method: 'post', path: '/lab/cells', tag, summary: 'Add a conductivity cell to the bench', roles: ['lab-admin'], body: CreateCellSchema, response: BenchEquipmentSchema, status: 201 }, async (_req, res) => {
    const labId = lab(res);
    res.status(201).json(await dataSource.transaction(async (m) => {
      await createCell(m, res.locals.auth, labId, res.locals.body);
      return benchEquipment(m, labId);
    }));
  });

  route({ method: 'get', path: '/lab/cells/:id/control-chart', tag, summary: 'The cell constant over time: every KCl standard run, centre line, ±3σ limits, run rules and whether the cell may be used', roles: LAB_STAFF, params: IdParamsSchema, response: ControlChartSchema }, async (_req, res) => {
    res.json(await cellControlChart(dataSource.manager, lab(res), idOf(res)));
  });

  route({
    method: 'post', path: '/lab/cells/:id/standard-runs', tag,
    summary: 'Record a KCl standard run (multipart: the spectrum in "file", concentration, basis, temperature): K = κ_standard(T) · R from the resistive plateau (or R of an R + CPE fit)',
    roles: ['analyst', 'lab-admin'], params: IdParamsSchema, body: StandardRunBodySchema, requestMediaType: 'multipart/form-data', response: ControlChartSchema, status: 201,
    before: upload,
  }, async (req, res) => {
    const { file: _file, ...fields } = res.locals.body;
    const labId = lab(res);
    // Checked and parsed (in the CPU pool) first; the cell is locked only for the short write.
    const run = await prepareStandardRun(dataSource.manager, labId, idOf(res), StandardRunFieldsSchema.parse(fields), runFileOf(req));
    res.status(201).json(await dataSource.transaction((m) => recordStandardRun(m, res.locals.auth, labId, idOf(res), run)));
  });

  route({ method: 'get', path: '/lab/cells/:id/standard-runs.csv', tag, summary: 'The cell’s standard runs as CSV', roles: LAB_STAFF, params: IdParamsSchema, responseMediaType: 'text/csv' }, async (_req, res) => {
    const c = await cellControlChart(dataSource.manager, lab(res), idOf(res));
    const csv = toCsv(
      ['measured_at', 'standard', 'temperature_c', 'conductivity_us_per_cm', 'conductivity_source', 'resistance_ohm', 'resistance_from', 'cell_constant_per_cm', 'file', 'by', 'broken_rules'],
      c.runs.map((r) => [r.measuredAt, r.standardName, r.temperatureC, r.standardConductivityUsPerCm, r.conductivitySource, r.plateauResistanceOhm, r.resistanceSource, r.cellConstantPerCm, r.fileName, r.measuredBy.displayName, r.signals.map((s) => s.rule).join(' ')]),
    );
    res.attachment(`${dated(`standard-runs-${c.cell.name}`)}.csv`).type('text/csv').send(csv);
  });

  route({ method: 'get', path: '/lab/validation/library-versions/:id/correlation', tag, summary: 'Pearson r, p and n of each fitted model parameter with each chemistry value recorded for the version’s lots', roles: VALIDATORS, params: IdParamsSchema, response: CorrelationStudySchema }, async (_req, res) => {
    res.json(await correlationStudy(dataSource.manager, lab(res), idOf(res)));
  });

  route({ method: 'get', path: '/lab/validation/library-versions/:id/correlation.csv', tag, summary: 'Each lot’s fitted parameters and chemistry, then the r/p/n table, as CSV', roles: VALIDATORS, params: IdParamsSchema, responseMediaType: 'text/csv' }, async (_req, res) => {
    const c = await correlationStudy(dataSource.manager, lab(res), idOf(res));
    const lots = toCsv(['lot', ...c.parameters.map((p) => p.name), ...c.chemistry.map((f) => f.field)], c.lots.map((l) => [l.lotCode, ...c.parameters.map((p) => l.parameters[p.name]), ...c.chemistry.map((f) => l.chemistry[f.field])]));
    const table = toCsv(['parameter', 'chemistry', 'r', 'p', 'n'], c.cells.map((x) => [x.parameter, x.chemistry, x.r, x.p, x.n]));
    res.attachment(`${dated(`correlation-${c.productName}-v${c.version}`)}.csv`).type('text/csv').send(`${lots}\r\n${table}`);
  });

  route({ method: 'get', path: '/lab/validation/library-versions/:id/repeatability', tag, summary: 'Replicate distances within samples against distances between the version’s lots', roles: VALIDATORS, params: IdParamsSchema, response: RepeatabilityStudySchema }, async (_req, res) => {
    res.json(await repeatabilityStudy(dataSource.manager, lab(res), idOf(res)));
  });

  route({ method: 'get', path: '/lab/validation/library-versions/:id/summary.pdf', tag, summary: 'The validation summary for the lab’s file (vector PDF)', roles: VALIDATORS, params: IdParamsSchema, responseMediaType: 'application/pdf' }, async (_req, res) => {
    const labId = lab(res);
    const m = dataSource.manager;
    const correlation = await correlationStudy(m, labId, idOf(res));
    const [{ product_id: productId }] = await m.query(`SELECT l.product_id FROM library_version v JOIN reference_library l ON l.id = v.library_id WHERE v.id = $1 AND v.lab_id = $2`, [idOf(res), labId]);
    const [{ name: labName }] = await m.query(`SELECT name FROM lab WHERE id = $1`, [labId]);
    const cellIds: { id: string }[] = await m.query(`SELECT id FROM measurement_cell WHERE lab_id = $1 ORDER BY lower(name) LIMIT 8`, [labId]);
    // Rendered in a worker thread (vector charts of every study can take a while).
    const pdf = Buffer.from(await runCpuTask('validationSummary', { data: {
      labName,
      generatedAt: new Date().toISOString(),
      correlation,
      repeatability: await repeatabilityStudy(m, labId, idOf(res)),
      detection: await detectionStudy(m, labId, productId),
      performance: await ongoingPerformance(m, labId),
      cells: await Promise.all(cellIds.map((c) => cellControlChart(m, labId, c.id))),
    } }));
    res.attachment(`${dated(`validation-${correlation.productName}-v${correlation.version}`)}.pdf`).type('application/pdf').send(pdf);
  });

  route({ method: 'get', path: '/lab/validation/products/:id/detection', tag, summary: 'Detection study: per admixture and level, the share called not consistent, inconclusive and consistent', roles: VALIDATORS, params: IdParamsSchema, response: DetectionStudySchema }, async (_req, res) => {
    res.json(await detectionStudy(dataSource.manager, lab(res), idOf(res)));
  });

  route({ method: 'get', path: '/lab/validation/products/:id/detection.csv', tag, summary: 'The detection study as CSV', roles: VALIDATORS, params: IdParamsSchema, responseMediaType: 'text/csv' }, async (_req, res) => {
    const d = await detectionStudy(dataSource.manager, lab(res), idOf(res));
    const rows = d.series.flatMap((s) => s.levels.map((l) => [s.admixture, s.admixtureName, l.levelPercent, l.total, l.counts.notConsistent, l.counts.inconclusive, l.counts.consistent, l.counts.noVerdict, l.notConsistentShare, l.reliablyDetected ? 'yes' : 'no']));
    res.attachment(`${dated(`detection-${d.productName}`)}.csv`).type('text/csv').send(toCsv(['admixture', 'admixture_name', 'level_percent', 'trials', 'not_consistent', 'inconclusive', 'consistent', 'no_verdict', 'not_consistent_share', 'reliably_detected'], rows));
  });

  route({ method: 'get', path: '/lab/validation/ongoing-performance', tag, summary: 'Authentic lots re-submitted blind: how often called not consistent against the rate the decision rule promises', roles: VALIDATORS, response: OngoingPerformanceSchema }, async (_req, res) => {
    res.json(await ongoingPerformance(dataSource.manager, lab(res)));
  });

  route({ method: 'get', path: '/lab/samples/:id/validation-flags', tag, summary: 'Whether the sample is a blind check or a declared mixture', roles: LAB_STAFF, params: IdParamsSchema, response: ValidationFlagsSchema }, async (_req, res) => {
    res.json(await validationFlags(dataSource.manager, lab(res), idOf(res)));
  });

  route({ method: 'put', path: '/lab/samples/:id/validation-flags', tag, summary: 'Mark a sample as a blind check of an authentic lot, or as a deliberate mixture for the detection study (audited)', roles: ['analyst', 'lab-admin'], params: IdParamsSchema, body: ValidationFlagsSchema, response: ValidationFlagsSchema }, async (_req, res) => {
    res.json(await dataSource.transaction((m) => setValidationFlags(m, res.locals.auth, lab(res), idOf(res), res.locals.body)));
  });

  return router;
}
