import type { EntityManager } from 'typeorm';
import type { LibraryProduct, LibraryProductQuery, Page } from '@ohmprint/contracts';
import { cappedCount, escapeLike, pageParams, toCappedPage, totalCapFor } from '../../core/paging';

const SORT: Record<LibraryProductQuery['sort'], string> = { name: 'lower(p.name)', client: 'lower(co.name)' };

/** The lab's products with their measured reference lots and library versions, one page at a time. */
export async function libraryProducts(manager: EntityManager, labId: string, query: LibraryProductQuery): Promise<Page<LibraryProduct>> {
  const params: unknown[] = [labId];
  let search = '';
  if (query.q) {
    params.push(escapeLike(query.q));
    search = `AND (p.name ILIKE $2 OR co.name ILIKE $2)`;
  }
  const { skip, take } = pageParams(query);
  const from = `FROM product p JOIN client_organisation co ON co.id = p.client_organisation_id WHERE p.lab_id = $1 ${search}`;
  const [rows, total] = await Promise.all([
    manager.query(
      `SELECT p.id, p.name, p.matrix, co.name AS client_name,
              (SELECT count(*)::int FROM sample s
                WHERE s.lab_id = p.lab_id AND s.product_id = p.id AND s.kind = 'reference-lot'
                  AND EXISTS (SELECT 1 FROM replicate r WHERE r.sample_id = s.id AND NOT r.excluded)) AS measured
       ${from}
       ORDER BY ${SORT[query.sort]} ${query.dir === 'asc' ? 'ASC' : 'DESC'}, p.id LIMIT $${params.length + 1} OFFSET $${params.length + 2}`,
      [...params, take, skip],
    ) as Promise<{ id: string; name: string; matrix: LibraryProduct['matrix']; client_name: string; measured: number }[]>,
    cappedCount(manager, from, params, totalCapFor(query)),
  ]);
  const versions: { product_id: string; id: string; version: number; status: string; lot_count: number; superseded_by: number | null }[] = rows.length
    ? await manager.query(
        `SELECT l.product_id, v.id, v.version, v.status,
                (SELECT count(*)::int FROM reference_lot r WHERE r.library_version_id = v.id AND r.included) AS lot_count,
                CASE WHEN v.status = 'draft' THEN NULL ELSE (SELECT min(n.version) FROM library_version n WHERE n.library_id = v.library_id AND n.version > v.version AND n.status = 'published') END AS superseded_by
         FROM library_version v JOIN reference_library l ON l.id = v.library_id
         WHERE v.lab_id = $1 AND l.product_id = ANY($2::uuid[]) ORDER BY v.version DESC`,
        [labId, rows.map((r) => r.id)],
      )
    : [];
  const items = rows.map((r): LibraryProduct => ({
    productId: r.id,
    name: r.name,
    matrix: r.matrix,
    clientName: r.client_name,
    measuredLots: r.measured,
    versions: versions.filter((v) => v.product_id === r.id).map((v) => ({ id: v.id, version: v.version, status: v.status, lotCount: v.lot_count, supersededBy: v.superseded_by })),
  }));
  return toCappedPage(items, total, query);
}
