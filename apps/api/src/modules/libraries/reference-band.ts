import type { EntityManager } from 'typeorm';
import type { ReferenceBandPoints, ReferenceBandView } from '@ohmprint/contracts';
import { decodeLotSpectrum } from './lot-spectrum-bytes';
import { publishedLibrary } from './published-library';
import { computeReferenceBand } from './reference-band-points';

async function insertBand(manager: EntityManager, labId: string, versionId: string, band: ReferenceBandPoints): Promise<void> {
  await manager.query(`INSERT INTO library_version_band (library_version_id, lab_id, band) VALUES ($1, $2, $3) ON CONFLICT (library_version_id) DO NOTHING`, [versionId, labId, JSON.stringify(band)]);
}

/** Computes and stores the band of a version being published, from its included lots. */
export async function storeReferenceBand(manager: EntityManager, labId: string, versionId: string): Promise<void> {
  const [v]: { grid_hz: number[] }[] = await manager.query(`SELECT grid_hz FROM library_version WHERE id = $1 AND lab_id = $2`, [versionId, labId]);
  const grid = Float64Array.from(v.grid_hz);
  const rows: { spectrum: Buffer }[] = await manager.query(`SELECT spectrum FROM reference_lot WHERE library_version_id = $1 AND lab_id = $2 AND included`, [versionId, labId]);
  await insertBand(manager, labId, versionId, computeReferenceBand(rows.map((r) => decodeLotSpectrum(r.spectrum, grid)), grid));
}

/**
 * The stored band of a published (or retired) version of the lab; a version published before
 * bands were stored gets its band computed and stored the first time it is asked for. Null for
 * a version without lots; 404 for another lab's, 409 for a draft.
 */
export async function referenceBandOf(manager: EntityManager, labId: string, versionId: string): Promise<ReferenceBandPoints | null> {
  const [stored]: { band: ReferenceBandPoints }[] = await manager.query(`SELECT band FROM library_version_band WHERE library_version_id = $1 AND lab_id = $2`, [versionId, labId]);
  if (stored) return stored.band.lotCount > 0 ? stored.band : null;
  const library = await publishedLibrary(manager, labId, versionId);
  const band = computeReferenceBand(library.spectra, library.grid);
  await insertBand(manager, labId, versionId, band);
  return band.lotCount > 0 ? band : null;
}

/** `GET /lab/library-versions/:id/reference-band`. */
export async function referenceBandView(manager: EntityManager, labId: string, versionId: string): Promise<ReferenceBandView | null> {
  const [v]: { version: number; method: { referenceTemperatureC: number; temperatureCoefficientPerC: number }; status: string; product_name: string }[] = await manager.query(
    `SELECT v.version, v.method, v.status, p.name AS product_name
     FROM library_version v JOIN reference_library l ON l.id = v.library_id JOIN product p ON p.id = l.product_id
     WHERE v.id = $1 AND v.lab_id = $2`,
    [versionId, labId],
  );
  if (!v) return null;
  const band = await referenceBandOf(manager, labId, versionId);
  if (!band) return null;
  return {
    libraryVersionId: versionId,
    productName: v.product_name,
    version: v.version,
    impedanceUnit: 'Ω·cm',
    referenceTemperatureC: v.method.referenceTemperatureC,
    temperatureCoefficientPerC: v.method.temperatureCoefficientPerC,
    band,
  };
}
