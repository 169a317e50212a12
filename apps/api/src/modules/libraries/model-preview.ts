import type { EntityManager } from 'typeorm';
import { MODEL_CATALOG, modelLabel } from '@ohmprint/spectral-engine';
import type { ModelCatalog, ModelPreview, ModelPreviewRequest, PreviewReplicate } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import { prepareReplicates } from '../measurements/prepared-replicates';
import { Replicate } from '../measurements/replicate.entity';
import { checkModel } from './method-versions';

/** Starts beyond the engine's guess: the preview is tried on one spectrum, so a few more cost little. */
const PREVIEW_RESTARTS = 3;
/** Spectra offered for the preview: the lab's most recent. */
const PREVIEW_CHOICES = 25;

export function modelCatalog(): ModelCatalog {
  return MODEL_CATALOG.map((m) => ({ name: m.name, label: m.label, parameters: m.parameters.map((p) => p.name) }));
}

export async function previewReplicates(manager: EntityManager, labId: string): Promise<PreviewReplicate[]> {
  const rows: { id: string; code: string; replicate_number: number; file_name: string; uploaded_at: Date }[] = await manager.query(
    `SELECT r.id, s.code, r.replicate_number, r.file_name, r.uploaded_at FROM replicate r JOIN sample s ON s.id = r.sample_id
     WHERE r.lab_id = $1 AND NOT r.excluded ORDER BY r.uploaded_at DESC, r.id LIMIT ${PREVIEW_CHOICES}`,
    [labId],
  );
  return rows.map((r) => ({ replicateId: r.id, sampleCode: r.code, replicateNumber: r.replicate_number, fileName: r.file_name, uploadedAt: r.uploaded_at.toISOString() }));
}

/**
 * The method's model fitted to one real spectrum of the lab, prepared exactly as the method would
 * prepare it (cell constant, temperature, grid), with the fitted curve on the same grid.
 */
export async function previewModel(manager: EntityManager, labId: string, input: ModelPreviewRequest): Promise<ModelPreview> {
  checkModel(input.settings);
  const replicate = await manager.findOne(Replicate, { where: { id: input.replicateId, labId } });
  if (!replicate) throw ApiError.notFound('Replicate');
  const [{ code }] = await manager.query(`SELECT code FROM sample WHERE id = $1 AND lab_id = $2`, [replicate.sampleId, labId]);
  const [prepared] = prepareReplicates([replicate], input.settings);
  if (!prepared.spectrum) {
    throw ApiError.badRequest(`This spectrum does not cover the method's band: ${prepared.coverageProblem}`, [{ field: 'replicateId', message: 'does not cover the band' }]);
  }
  const s = prepared.spectrum;
  const model = input.settings.model;
  // Fitted in a worker thread: several restarts on a long spectrum never hold up other requests.
  const { fit, fitted } = await runCpuTask('previewFit', { spectrum: s, model, restarts: PREVIEW_RESTARTS });
  return {
    model,
    modelLabel: modelLabel(model),
    sampleCode: code,
    replicateNumber: replicate.replicateNumber,
    converged: fit.converged,
    reason: fit.converged ? null : fit.reason,
    chiSquare: fit.converged ? fit.chiSquare : null,
    parameters: fit.converged
      ? fit.parameterNames.map((name) => ({
          name,
          value: fit.parameters[name],
          standardError: Number.isFinite(fit.standardErrors[name]) ? fit.standardErrors[name] : null,
          unit: (MODEL_CATALOG.find((m) => m.name === model)?.parameters.find((p) => p.name === name)?.unit ?? '').replace('Ω', 'Ω·cm'),
        }))
      : [],
    impedanceUnit: 'Ω·cm',
    frequencyHz: Array.from(s.frequencyHz),
    measured: { re: Array.from(s.re), im: Array.from(s.im) },
    fitted: fitted ? { re: Array.from(fitted.re), im: Array.from(fitted.im) } : null,
  };
}
