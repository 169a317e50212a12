import type { EntityManager } from 'typeorm';
import { modelLabel, THRESHOLD_ESTIMATOR_NAMES } from '@ohmprint/spectral-engine';
import { weightingText } from '@ohmprint/contracts';
import { claimedLotMatch, producerLotCodesOf } from '../analyses/analysis-views';
import type { MeasurementTemperature, ReportContent } from '../reports/pdf/report-data';
import { revokedReportOf } from '../analyses/revoked-report';
import type { Analysis } from '../analyses/analysis.entity';
import { publishedLibrary } from '../libraries/published-library';
import { referenceBandOf } from '../libraries/reference-band';
import { envelopeOfBand } from './report-summaries';

interface ContextRow {
  code: string;
  obtained_where: string;
  obtained_on: string;
  label_text: string;
  claimed_lot: string;
  received_at: Date | null;
  product_name: string;
  matrix: string;
  client_id: string;
  client_name: string;
  client_email: string | null;
  placed_by_name: string;
  placed_by_email: string;
  lab_name: string;
  lab_address: string;
  lab_contact_email: string;
  lab_is_demo: boolean;
  accreditation_body: string | null;
  accreditation_number: string | null;
  analyst_name: string;
  carrier: string | null;
  seal_intact: boolean | null;
  container_condition: string | null;
  volume_ml: number | null;
  temperature_c: number | null;
  tested_from: Date;
  tested_to: Date;
}

/** What the report says about an approved analysis, read from the workflow's own records. */
export async function reportContentFor(manager: EntityManager, analysis: Analysis, reviewerName: string): Promise<{ content: ReportContent; clientOrganisationId: string }> {
  const [c]: ContextRow[] = await manager.query(
    `SELECT s.code, s.obtained_where, to_char(s.obtained_on, 'YYYY-MM-DD') AS obtained_on, s.label_text, s.claimed_lot, s.received_at,
            p.name AS product_name, p.matrix, co.id AS client_id, co.name AS client_name, co.contact_email AS client_email,
            pb.display_name AS placed_by_name, pb.email AS placed_by_email,
            l.name AS lab_name, l.address AS lab_address, l.contact_email AS lab_contact_email, l.is_demo AS lab_is_demo, l.accreditation_body, l.accreditation_number,
            an.display_name AS analyst_name,
            i.carrier, i.seal_intact, i.container_condition, i.volume_ml, i.temperature_c,
            (SELECT min(r.uploaded_at) FROM replicate r WHERE r.id = ANY($3::uuid[])) AS tested_from,
            (SELECT max(r.uploaded_at) FROM replicate r WHERE r.id = ANY($3::uuid[])) AS tested_to
     FROM sample s
     JOIN test_order o ON o.id = s.order_id JOIN product p ON p.id = o.product_id
     JOIN client_organisation co ON co.id = o.client_organisation_id
     JOIN app_user pb ON pb.id = o.placed_by_user_id
     JOIN lab l ON l.id = s.lab_id
     JOIN app_user an ON an.id = $4
     LEFT JOIN sample_intake i ON i.sample_id = s.id
     WHERE s.id = $1 AND s.lab_id = $2`,
    [analysis.sampleId, analysis.labId, analysis.result.replicateIds, analysis.analystUserId],
  );
  const library = await publishedLibrary(manager, analysis.labId, analysis.libraryVersionId);
  const temperatures: { replicate_number: number; file_name: string; temperature_c: number; temperature_source: MeasurementTemperature['source'] }[] = await manager.query(
    `SELECT replicate_number, file_name, temperature_c, temperature_source FROM replicate WHERE lab_id = $1 AND id = ANY($2::uuid[]) ORDER BY replicate_number`,
    [analysis.labId, analysis.result.replicateIds],
  );
  const follows = await revokedReportOf(manager, analysis.labId, analysis.sampleId);
  const r = analysis.result;
  const m = analysis.method;
  const [methodVersion]: { name: string; version: number }[] = await manager.query(
    `SELECT m.name, mv.version FROM library_version lv
     JOIN method_version mv ON mv.id = lv.method_version_id AND mv.lab_id = lv.lab_id
     JOIN method m ON m.id = mv.method_id AND m.lab_id = mv.lab_id
     WHERE lv.id = $1 AND lv.lab_id = $2`,
    [analysis.libraryVersionId, analysis.labId],
  );
  const producerCodes = r.nearest ? await producerLotCodesOf(manager, analysis.labId, [r.nearest.lotId]) : {};
  const nearestProducerCode = r.nearest ? (producerCodes[r.nearest.lotId] ?? null) : null;
  const condition = c.container_condition
    ? `Seal ${c.seal_intact ? 'intact' : 'broken'}; container ${c.container_condition}; ${c.volume_ml} ml; ${c.temperature_c} °C on arrival${c.carrier ? ` (${c.carrier})` : ''}`
    : 'Not recorded';
  const content: ReportContent = {
    lab: {
      name: c.lab_name,
      address: c.lab_address.split(/\s*(?:\n|,)\s*/).filter(Boolean),
      accreditation: c.accreditation_body && c.accreditation_number ? { body: c.accreditation_body, number: c.accreditation_number } : null,
      contactEmail: c.lab_contact_email || null,
    },
    client: { name: c.client_name, contactName: c.placed_by_name, contactEmail: c.client_email ?? c.placed_by_email },
    sample: {
      code: c.code,
      productName: c.product_name,
      matrix: c.matrix,
      claimedLot: c.claimed_lot || null,
      obtainedWhere: c.obtained_where || null,
      obtainedOn: c.obtained_on,
      labelText: c.label_text || null,
      receivedAt: (c.received_at ?? analysis.createdAt).toISOString(),
      conditionOnReceipt: condition,
    },
    method: {
      name: 'Impedance fingerprint screening against a reference library (Canberra distance)',
      methodVersion: methodVersion ? { name: methodVersion.name, version: Number(methodVersion.version) } : null,
      bandHz: { min: m.bandMinHz, max: m.bandMaxHz },
      gridPoints: m.gridPoints,
      referenceTemperatureC: m.referenceTemperatureC,
      temperatureCoefficientPerC: m.temperatureCoefficientPerC,
      modelName: modelLabel(m.model) === m.model ? m.model : `${modelLabel(m.model)} (${m.model})`,
      quantiles: { lower: m.lowerQuantile, upper: m.upperQuantile },
      library: { productName: library.productName, version: String(library.version), lotCount: library.lots.length, publishedAt: library.publishedAt.toISOString() },
      engineVersion: analysis.engineVersion,
      replicateCount: r.replicateIds.length,
      measurementTemperatures: temperatures.map((t) => ({ replicateNumber: t.replicate_number, fileName: t.file_name, temperatureC: t.temperature_c, source: t.temperature_source })),
      deviations: r.qualityFlags.filter((f) => f.code === 'too-few-replicates' || f.code === 'band-not-covered').map((f) => f.message),
      thresholds: r.thresholds
        ? {
            estimator: THRESHOLD_ESTIMATOR_NAMES[r.thresholds.estimator],
            lotCount: r.thresholds.lotCount,
            t95Interval: r.thresholds.t95Interval,
            t99Interval: r.thresholds.t99Interval,
            confidenceLevel: r.thresholds.confidenceLevel,
            resamples: r.thresholds.resamples,
          }
        : null,
    },
    results: {
      verdict: r.verdict,
      nearestDistance: r.nearest?.distance ?? null,
      nearestLot: r.nearest?.lotCode ?? null,
      nearestLotProducerCode: nearestProducerCode,
      claimedLotCheck: claimedLotMatch(c.claimed_lot, nearestProducerCode),
      t95: r.t95,
      t99: r.t99,
      typicality: r.typicality,
      fittedParameters: r.fit?.parameters ?? [],
      goodnessOfFit: r.fit?.converged ? r.fit.chiSquare : null,
      fitWeighting: r.fit?.weighting ? weightingText(r.fit.weighting) : null,
      qualityFlags: r.qualityFlags.map((f) => ({ severity: 'warning' as const, message: f.reportMessage ?? f.message })),
    },
    plots: {
      impedanceUnit: 'Ω·cm',
      sample: analysis.sampleSpectrum,
      // Both summaries, not the lots: the band stored when the version was published and the analysis's bins.
      referenceEnvelope: envelopeOfBand(await referenceBandOf(manager, analysis.labId, analysis.libraryVersionId)),
      calibrationHistogram: { binEdges: r.histogram.binEdges, counts: r.histogram.counts },
      map: r.map.lots.length ? { lots: r.map.lots.map((l) => ({ label: l.lotCode, x: l.x, y: l.y })), sample: { x: r.map.sample[0], y: r.map.sample[1] } } : null,
    },
    testedFrom: (c.tested_from ?? analysis.createdAt).toISOString().slice(0, 10),
    testedTo: (c.tested_to ?? analysis.createdAt).toISOString().slice(0, 10),
    analyst: { name: c.analyst_name, role: 'Analyst' },
    authorisedBy: { name: reviewerName, role: 'Reviewer' },
    remarks: analysis.remarks || null,
    follows: follows && { reportNumber: follows.number, reason: follows.reason, revokedAt: follows.revokedAt },
    demo: c.lab_is_demo,
  };
  return { content, clientOrganisationId: c.client_id };
}
