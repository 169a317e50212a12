import type { EntityManager } from 'typeorm';
import type { Calibration, Spectrum } from '@ohmprint/spectral-engine';
import type { MethodSettings } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { decodeLotSpectrum } from './lot-spectrum-bytes';

export interface PublishedLibrary {
  versionId: string;
  version: number;
  labId: string;
  productId: string;
  productName: string;
  method: MethodSettings;
  grid: Float64Array;
  calibration: Calibration;
  publishedAt: Date;
  lots: { id: string; lotCode: string }[];
  spectra: Spectrum[];
}

/**
 * Published versions are frozen (a trigger refuses changes), so a decoded copy can be kept in
 * memory and shared by every analysis against it. Bounded so an instance never holds more
 * than a handful of large libraries.
 */
const cache = new Map<string, PublishedLibrary>();
const CACHE_LIMIT = 16;

/** A published (or retired) version of the lab's library, with its included lots decoded; 409 for a draft, 404 for another lab's. */
export async function publishedLibrary(manager: EntityManager, labId: string, versionId: string): Promise<PublishedLibrary> {
  const cached = cache.get(versionId);
  if (cached && cached.labId === labId) return cached;
  const [v]: { id: string; version: number; method: MethodSettings; grid_hz: number[]; calibration: Calibration; published_at: Date; product_id: string; product_name: string; status: string }[] =
    await manager.query(
      `SELECT v.id, v.version, v.method, v.grid_hz, v.calibration, v.published_at, v.status, p.id AS product_id, p.name AS product_name
       FROM library_version v JOIN reference_library l ON l.id = v.library_id JOIN product p ON p.id = l.product_id
       WHERE v.id = $1 AND v.lab_id = $2`,
      [versionId, labId],
    );
  if (!v) throw ApiError.notFound('Library version');
  // A retired version stays readable here so its analyses can be reproduced; new analyses check the status themselves.
  if (v.status === 'draft') throw ApiError.conflict(`Library version ${v.version} of ${v.product_name} is a draft; analyses use published versions only.`);
  const rows: { id: string; lot_code: string; spectrum: Buffer }[] = await manager.query(
    `SELECT id, lot_code, spectrum FROM reference_lot WHERE library_version_id = $1 AND lab_id = $2 AND included ORDER BY lot_code, id`,
    [versionId, labId],
  );
  const grid = Float64Array.from(v.grid_hz);
  const library: PublishedLibrary = {
    versionId: v.id,
    version: v.version,
    labId,
    productId: v.product_id,
    productName: v.product_name,
    method: v.method,
    grid,
    calibration: v.calibration,
    publishedAt: v.published_at,
    lots: rows.map((r) => ({ id: r.id, lotCode: r.lot_code })),
    spectra: rows.map((r) => decodeLotSpectrum(r.spectrum, grid)),
  };
  if (cache.size >= CACHE_LIMIT) cache.delete(cache.keys().next().value as string);
  cache.set(versionId, library);
  return library;
}
