import type { EntityManager } from 'typeorm';
import { MODEL_CATALOG, pearson } from '@ohmprint/spectral-engine';
import { CHEMISTRY_FIELD_NAMES, CHEMISTRY_FIELDS, type CorrelationCell, type CorrelationStudy } from '@ohmprint/contracts';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import { publishedLibrary } from '../libraries/published-library';

/**
 * Pearson r, two-sided p and n of each parameter with each chemistry value, over the lots where
 * both are known (pairwise-complete). A pair with fewer than three lots, or a constant side, has
 * no r (null) but keeps its n.
 */
export function correlationTable(parameters: Record<string, (number | null)[]>, chemistry: Record<string, (number | null)[]>): CorrelationCell[] {
  const cells: CorrelationCell[] = [];
  for (const [parameter, pv] of Object.entries(parameters)) {
    for (const [field, cv] of Object.entries(chemistry)) {
      const x: number[] = [];
      const y: number[] = [];
      pv.forEach((v, i) => {
        const c = cv[i];
        if (v !== null && c !== null && c !== undefined && Number.isFinite(v) && Number.isFinite(c)) {
          x.push(v);
          y.push(c);
        }
      });
      let r: number | null = null;
      let p: number | null = null;
      if (x.length >= 3) {
        try {
          ({ r, p } = pearson(x, y));
        } catch (err) {
          if (!(err instanceof RangeError)) throw err;
        }
      }
      cells.push({ parameter, chemistry: field, r, p, n: x.length });
    }
  }
  return cells;
}

/** Lots fitted per worker task: the thread is handed back between batches, so sign-ins and uploads keep their turn. */
const FIT_BATCH = 50;

/**
 * Fitted parameters of each lot of a published (frozen) version under its method's model, fitted
 * once and cached in `lot_fit`.
 */
async function lotFits(manager: EntityManager, labId: string, versionId: string): Promise<{ model: string; fits: Map<string, Record<string, number> | null> }> {
  const library = await publishedLibrary(manager, labId, versionId);
  const model = library.method.model;
  const cached: { lot_id: string; parameters: Record<string, number> | null }[] = await manager.query(
    `SELECT f.lot_id, f.parameters FROM lot_fit f JOIN reference_lot l ON l.id = f.lot_id
     WHERE f.lab_id = $1 AND l.library_version_id = $2 AND f.model = $3`,
    [labId, versionId, model],
  );
  const fits = new Map(cached.map((c) => [c.lot_id, c.parameters]));
  const missing = library.lots.map((lot, i) => ({ lot, i })).filter(({ lot }) => !fits.has(lot.id));
  for (let start = 0; start < missing.length; start += FIT_BATCH) {
    const batch = missing.slice(start, start + FIT_BATCH);
    // Fitted in a worker thread; the event loop only stores the answers.
    const results = await runCpuTask('fitLots', { spectra: batch.map(({ i }) => library.spectra[i]), model });
    for (const [k, { lot }] of batch.entries()) {
      const { parameters, reason } = results[k];
      await manager.query(`INSERT INTO lot_fit (lab_id, lot_id, model, parameters, reason) VALUES ($1, $2, $3, $4, $5) ON CONFLICT DO NOTHING`, [
        labId, lot.id, model, parameters ? JSON.stringify(parameters) : null, reason,
      ]);
      fits.set(lot.id, parameters);
    }
  }
  return { model, fits };
}

/** Each fitted parameter of the version's lots against each chemistry value recorded for them. */
export async function correlationStudy(manager: EntityManager, labId: string, versionId: string): Promise<CorrelationStudy> {
  const library = await publishedLibrary(manager, labId, versionId);
  const { model, fits } = await lotFits(manager, labId, versionId);
  const chemistryRows: { id: string; chemistry: Record<string, number> }[] = await manager.query(
    `SELECT id, chemistry FROM reference_lot WHERE library_version_id = $1 AND lab_id = $2`,
    [versionId, labId],
  );
  const chemistryOf = new Map(chemistryRows.map((r) => [r.id, r.chemistry ?? {}]));
  const catalog = MODEL_CATALOG.find((m) => m.name === model);
  const parameterNames = catalog?.parameters.map((p) => p.name) ?? Object.keys([...fits.values()].find((f) => f) ?? {});
  const recorded = CHEMISTRY_FIELD_NAMES.filter((f) => library.lots.some((l) => typeof chemistryOf.get(l.id)?.[f] === 'number'));
  const parameters = Object.fromEntries(parameterNames.map((name) => [name, library.lots.map((l) => fits.get(l.id)?.[name] ?? null)]));
  const chemistry = Object.fromEntries(recorded.map((f) => [f, library.lots.map((l) => chemistryOf.get(l.id)?.[f] ?? null)]));
  return {
    libraryVersionId: versionId,
    productName: library.productName,
    version: library.version,
    model,
    parameters: parameterNames.map((name) => ({ name, unit: (catalog?.parameters.find((p) => p.name === name)?.unit ?? '').replace('Ω', 'Ω·cm') })),
    chemistry: recorded.map((f) => ({ field: f, label: CHEMISTRY_FIELDS[f].label, unit: CHEMISTRY_FIELDS[f].unit })),
    cells: correlationTable(parameters, chemistry),
    lots: library.lots.map((l) => ({
      lotCode: l.lotCode,
      parameters: Object.fromEntries(parameterNames.map((n) => [n, fits.get(l.id)?.[n] ?? null])),
      chemistry: Object.fromEntries(recorded.map((f) => [f, chemistryOf.get(l.id)?.[f] ?? null])),
    })),
    lotsNotFitted: library.lots.filter((l) => !fits.get(l.id)).map((l) => l.lotCode),
  };
}
