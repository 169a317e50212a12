import type { EntityManager } from 'typeorm';
import { LRUCache } from 'lru-cache';
import type { Calibration, Spectrum } from '@ohmprint/spectral-engine';
import type { MethodSettings } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { config } from '../../config';
import { randomUUID } from 'node:crypto';
import { types as pgTypes } from 'pg';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import { libraryBytes, spectraOver } from './library-packing';

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
  /**
   * This load of the version (new each time the cache loads it): a worker thread's kept copy
   * answers only for the load it was given, so nothing it kept outlives what the cache holds.
   */
  loadKey: string;
}

export { libraryBytes };

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

/** The version as the cache holds it for this lab, without loading it; null when it is not held. */
export function cachedLibrary(labId: string, versionId: string): PublishedLibrary | null {
  const held = cache.get(versionId);
  return held && held.labId === labId ? held : null;
}

/** Bytes the cache holds now, for the benchmark. */
export function libraryCacheBytes(): number {
  return cache.calculatedSize;
}

/**
 * The lots' spectra (bytea, sent by PostgreSQL as hex text) written straight into one buffer, lot
 * after lot, as each row arrives: hex to bytes is native code, done a row at a time between socket
 * reads rather than in one long pass, and the bytes go to a worker thread by transfer, where they
 * become the shared float64 array (`decodeLibrarySpectra`). The request thread never reads a
 * number of them. `expected` (the tally's lot count) sizes the buffer; it grows if more rows come.
 */
async function lotRows(manager: EntityManager, labId: string, versionId: string, n: number, expected: number): Promise<{ lots: { id: string; lotCode: string }[]; bytes: Uint8Array }> {
  const runner = manager.queryRunner ?? manager.connection.createQueryRunner();
  const own = !manager.queryRunner;
  const perLot = 16 * n;
  let bytes = Buffer.from(new ArrayBuffer(Math.max(8, perLot * expected)));
  let written = 0;
  const into = (hex: string): number => {
    // '\\x', then two hex digits a byte
    if (hex.length !== 2 + 2 * perLot || !hex.startsWith('\\x')) throw new RangeError(`a lot spectrum for a ${n}-point grid has ${perLot} bytes, not ${(hex.length - 2) / 2}`);
    if (bytes.length < perLot * (written + 1)) {
      const grown = Buffer.from(new ArrayBuffer(Math.max(2 * bytes.length, perLot * (written + 1))));
      bytes.copy(grown, 0, 0, perLot * written);
      bytes = grown;
    }
    if (bytes.write(hex.substring(2), perLot * written, perLot, 'hex') !== perLot) throw new RangeError(`lot ${written + 1} of library version ${versionId} has a malformed spectrum`);
    return written++;
  };
  try {
    const client = (await runner.connect()) as PgClient;
    const { rows }: { rows: { id: string; lot_code: string; spectrum: number }[] } = await client.query({
      text: `SELECT id, lot_code, spectrum FROM reference_lot WHERE library_version_id = $1 AND lab_id = $2 AND included ORDER BY lot_code, id`,
      values: [versionId, labId],
      types: { getTypeParser: (oid: number, format?: string) => (oid === BYTEA_OID ? into : pgTypes.getTypeParser(oid, format as 'text')) },
    });
    const lots = rows.map((r, i) => {
      if (r.spectrum !== i) throw new Error(`library version ${versionId}: lot ${i + 1}'s spectrum arrived out of order`);
      return { id: r.id, lotCode: r.lot_code };
    });
    return { lots, bytes: new Uint8Array(bytes.buffer, 0, perLot * rows.length) };
  } finally {
    if (own) await runner.release();
  }
}
const BYTEA_OID = 17;
interface PgClient {
  query(config: { text: string; values: unknown[]; types: { getTypeParser: (oid: number, format?: string) => (value: string) => unknown } }): Promise<{ rows: never[] }>;
}

/** A published (or retired) version of the lab's library, with its included lots decoded; 409 for a draft, 404 for another lab's. */
export async function publishedLibrary(manager: EntityManager, labId: string, versionId: string): Promise<PublishedLibrary> {
  const cached = cache.get(versionId);
  if (cached && cached.labId === labId) return cached;
  const [v]: { id: string; version: number; method: MethodSettings; grid_hz: number[]; calibration: Calibration; published_at: Date; product_id: string; product_name: string; status: string; included_lots: number | null }[] =
    await manager.query(
      `SELECT v.id, v.version, v.method, v.grid_hz, v.calibration, v.published_at, v.status, p.id AS product_id, p.name AS product_name, t.included_lots
       FROM library_version v JOIN reference_library l ON l.id = v.library_id JOIN product p ON p.id = l.product_id
       LEFT JOIN library_version_tally t ON t.library_version_id = v.id
       WHERE v.id = $1 AND v.lab_id = $2`,
      [versionId, labId],
    );
  if (!v) throw ApiError.notFound('Library version');
  // A retired version stays readable here so its analyses can be reproduced; new analyses check the status themselves.
  if (v.status === 'draft') throw ApiError.conflict(`Library version ${v.version} of ${v.product_name} is a draft; analyses use published versions only.`);
  const grid = Float64Array.from(v.grid_hz);
  const n = grid.length;
  const { lots, bytes } = await lotRows(manager, labId, versionId, n, v.included_lots ?? 0);
  const count = lots.length;
  // the bytes move to a worker (transferred, not copied); the floats come back in shared memory
  const packed = count && n ? await runCpuTask('decodeLibrarySpectra', { bytes, values: 2 * n * count }, { transferList: [bytes.buffer as ArrayBuffer] }) : new Float64Array(new SharedArrayBuffer(8)).subarray(0, 0);
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
    lots,
    packed,
    loadKey: randomUUID(),
  } as Omit<PublishedLibrary, 'spectra'> as PublishedLibrary;
  // 100,000 views at 50,000 lots: made when a reader on this thread first asks (analyses never do; their worker has its own)
  let views: Spectrum[] | undefined;
  Object.defineProperty(library, 'spectra', { enumerable: false, get: () => (views ??= spectraOver(packed, grid)) });
  cache.set(versionId, library);
  return library;
}
