import type { EntityManager } from 'typeorm';
import { LRUCache } from 'lru-cache';
import type { Calibration, Spectrum } from '@ohmprint/spectral-engine';
import type { MethodSettings } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { config } from '../../config';
import { spectraOver } from './library-packing';

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
  /** Views over `packed`, one per lot. */
  spectra: Spectrum[];
  /** Every lot's spectrum in one shared buffer: lot by lot, N real parts then N imaginary parts. */
  packed: Float64Array;
}

/**
 * What a decoded library costs in memory, estimated: its spectra (8 bytes a value), each lot's
 * id, code and two typed-array views (about 400 bytes together), and the calibration distances.
 */
export function libraryBytes(library: PublishedLibrary): number {
  return library.packed.byteLength + library.lots.length * 400 + library.calibration.nearestDistances.length * 16 + 4096;
}

/** A cache of decoded libraries capped by their estimated bytes, least recently used out first. */
export function createLibraryCache(maxBytes: number): LRUCache<string, PublishedLibrary> {
  return new LRUCache<string, PublishedLibrary>({
    maxSize: maxBytes,
    // A library larger than the whole cap is still served, just not kept.
    maxEntrySize: maxBytes,
    sizeCalculation: (library) => Math.max(1, libraryBytes(library)),
  });
}

/**
 * Published versions are frozen (a trigger refuses changes), so a decoded copy can be kept in
 * memory and shared by every analysis against it, up to `LIBRARY_CACHE_MAX_MB` in all.
 */
const cache = createLibraryCache(config.libraryCacheMaxBytes);

/** Bytes the cache holds now, for the benchmark. */
export function libraryCacheBytes(): number {
  return cache.calculatedSize;
}

function decodeInto(packed: Float64Array, offset: number, bytes: Buffer, n: number): void {
  if (bytes.length !== 16 * n) throw new RangeError(`a lot spectrum for a ${n}-point grid has ${16 * n} bytes, not ${bytes.length}`);
  for (let i = 0; i < 2 * n; i++) packed[offset + i] = bytes.readDoubleLE(8 * i);
}

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
  const n = grid.length;
  const packed = new Float64Array(new SharedArrayBuffer(Math.max(8, 16 * n * rows.length))).subarray(0, 2 * n * rows.length);
  rows.forEach((r, i) => decodeInto(packed, 2 * n * i, r.spectrum, n));
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
    spectra: spectraOver(packed, grid),
    packed,
  };
  cache.set(versionId, library);
  return library;
}
