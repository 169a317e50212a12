import type { EntityManager } from 'typeorm';
import type { Spectrum } from '@ohmprint/spectral-engine';
import type { CrossProductCheck, Matrix } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import { decodeLotSpectrum } from './lot-spectrum-bytes';

interface VersionRow {
  id: string;
  version: number;
  status: string;
  grid_hz: number[];
  product_id: string;
  product_name: string;
}

const sameGrid = (a: number[], b: number[]) => a.length === b.length && a.every((f, i) => Math.abs(f - b[i]) <= 1e-9 * f);

/**
 * How well the method tells the producer's products of one matrix apart: this version's lots
 * together with the included lots of each sibling product's newest version (published, else
 * draft) on the same grid; for every lot, the product of its nearest other lot. A confusion table
 * with everything on the diagonal means the method separates them.
 */
export async function crossProductCheck(manager: EntityManager, labId: string, versionId: string): Promise<CrossProductCheck> {
  const [self]: (VersionRow & { client_id: string; matrix: Matrix })[] = await manager.query(
    `SELECT v.id, v.version, v.status, v.grid_hz, p.id AS product_id, p.name AS product_name, p.client_organisation_id AS client_id, p.matrix
     FROM library_version v JOIN reference_library l ON l.id = v.library_id JOIN product p ON p.id = l.product_id
     WHERE v.id = $1 AND v.lab_id = $2`,
    [versionId, labId],
  );
  if (!self) throw ApiError.notFound('Library version');
  const siblings: VersionRow[] = await manager.query(
    `SELECT DISTINCT ON (p.id) v.id, v.version, v.status, v.grid_hz, p.id AS product_id, p.name AS product_name
     FROM product p JOIN reference_library l ON l.product_id = p.id JOIN library_version v ON v.library_id = l.id
     WHERE p.lab_id = $1 AND p.client_organisation_id = $2 AND p.matrix = $3 AND p.id <> $4 AND v.status IN ('published', 'draft')
     ORDER BY p.id, (v.status = 'published') DESC, v.version DESC`,
    [labId, self.client_id, self.matrix, self.product_id],
  );
  const notCompared: CrossProductCheck['notCompared'] = [];
  const versions = [self, ...siblings.filter((s) => {
    if (sameGrid(s.grid_hz, self.grid_hz)) return true;
    notCompared.push({ name: s.product_name, reason: `version ${s.version} is on another grid (a different method band or number of points)` });
    return false;
  })].sort((a, b) => (a.id === self.id ? -1 : b.id === self.id ? 1 : a.product_name.localeCompare(b.product_name)));
  const grid = Float64Array.from(self.grid_hz);
  const lots: { code: string; product: number; spectrum: Spectrum }[] = [];
  const products: CrossProductCheck['products'] = [];
  for (const [p, v] of versions.entries()) {
    const rows: { lot_code: string; spectrum: Buffer }[] = await manager.query(
      `SELECT lot_code, spectrum FROM reference_lot WHERE library_version_id = $1 AND lab_id = $2 AND included ORDER BY lot_code, id`,
      [v.id, labId],
    );
    products.push({ id: v.product_id, name: v.product_name, libraryVersionId: v.id, version: v.version, status: v.status, lotCount: rows.length });
    for (const r of rows) lots.push({ code: r.lot_code, product: p, spectrum: decodeLotSpectrum(r.spectrum, grid) });
  }
  const confusion = products.map(() => products.map(() => 0));
  const confused: CrossProductCheck['confused'] = [];
  if (products.length >= 2 && lots.length >= 2) {
    // The search index is built and searched in a worker thread (seconds for a large library).
    const hits = await runCpuTask('nearestOthers', { spectra: lots.map((l) => l.spectrum) });
    lots.forEach((lot, i) => {
      const hit = hits[i];
      if (!hit) return;
      const other = lots[hit.index];
      confusion[lot.product][other.product] += 1;
      if (other.product !== lot.product) {
        confused.push({ lotCode: lot.code, product: products[lot.product].name, nearestProduct: products[other.product].name, nearestLotCode: other.code, distance: hit.distance });
      }
    });
  }
  const total = confusion.flat().reduce((a, b) => a + b, 0);
  const agreeing = confusion.reduce((sum, row, i) => sum + row[i], 0);
  return { matrix: self.matrix, products, confusion, agreement: products.length >= 2 && total ? agreeing / total : null, confused, notCompared };
}
