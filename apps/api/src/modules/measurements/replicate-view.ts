import type { EntityManager } from 'typeorm';
import type { Replicate as ReplicateView } from '@ohmprint/contracts';

interface ReplicateRow {
  id: string;
  replicate_number: number;
  file_name: string;
  instrument_id: string;
  instrument_name: string;
  cell_id: string;
  cell_name: string;
  cell_constant_per_cm: number;
  cell_constant_source: ReplicateView['cellConstantSource'];
  calibration_id: string | null;
  temperature_c: number;
  temperature_source: ReplicateView['temperatureSource'];
  declared: ReplicateView['declared'];
  point_count: number;
  f_min: number;
  f_max: number;
  kramers_kronig: ReplicateView['kramersKronig'];
  excluded: boolean;
  exclusion_reason: string | null;
  via: ReplicateView['via'];
  uploaded_by_id: string | null;
  uploaded_by_name: string | null;
  uploaded_at: Date;
}

/** The sample's replicates as the portal lists them (no spectra: those come one at a time). */
export async function replicateViews(manager: EntityManager, labId: string, sampleId: string, ids?: string[]): Promise<ReplicateView[]> {
  const rows: ReplicateRow[] = await manager.query(
    `SELECT r.id, r.replicate_number, r.file_name, i.id AS instrument_id, i.name AS instrument_name,
            c.id AS cell_id, c.name AS cell_name, r.cell_constant_per_cm, r.cell_constant_source, r.calibration_id,
            r.temperature_c, r.temperature_source, r.declared, cardinality(r.frequency_hz) AS point_count,
            r.frequency_hz[1] AS f_min, r.frequency_hz[cardinality(r.frequency_hz)] AS f_max,
            r.kramers_kronig, r.excluded, r.exclusion_reason, r.via,
            u.id AS uploaded_by_id, u.display_name AS uploaded_by_name, r.uploaded_at
     FROM replicate r
     JOIN instrument i ON i.id = r.instrument_id
     JOIN measurement_cell c ON c.id = r.cell_id
     LEFT JOIN app_user u ON u.id = r.uploaded_by_user_id
     WHERE r.lab_id = $1 AND r.sample_id = $2 ${ids ? 'AND r.id = ANY($3::uuid[])' : ''}
     ORDER BY r.replicate_number`,
    ids ? [labId, sampleId, ids] : [labId, sampleId],
  );
  return rows.map((r) => ({
    id: r.id,
    replicateNumber: r.replicate_number,
    fileName: r.file_name,
    instrument: { id: r.instrument_id, name: r.instrument_name },
    cell: { id: r.cell_id, name: r.cell_name },
    cellConstantPerCm: r.cell_constant_per_cm,
    cellConstantSource: r.cell_constant_source,
    calibrationId: r.calibration_id,
    temperatureC: r.temperature_c,
    temperatureSource: r.temperature_source,
    declared: r.declared,
    pointCount: r.point_count,
    minFrequencyHz: r.f_min,
    maxFrequencyHz: r.f_max,
    kramersKronig: r.kramers_kronig,
    excluded: r.excluded,
    exclusionReason: r.exclusion_reason,
    via: r.via,
    uploadedBy: r.uploaded_by_id ? { id: r.uploaded_by_id, displayName: r.uploaded_by_name ?? '' } : null,
    uploadedAt: r.uploaded_at.toISOString(),
  }));
}
