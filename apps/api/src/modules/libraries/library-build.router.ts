import type { Router } from 'express';
import {
  CreateLibraryDraftSchema,
  CrossProductCheckSchema,
  IdParamsSchema,
  LibraryDraftCreatedSchema,
  LibraryLotPageSchema,
  LibraryLotQuerySchema,
  LibraryOverviewSchema,
  LibraryProductPageSchema,
  LibraryPublicationSchema,
  LibraryProductQuerySchema,
  LibraryVersionDetailSchema,
  LotInclusionSchema,
  RetireLibraryVersionSchema,
  VersionLotParamsSchema,
  type CreateLibraryDraft,
  type LibraryLotQuery,
  type LibraryProductQuery,
  type LotInclusion,
  type RetireLibraryVersion,
} from '@ohmprint/contracts';
import type { Role } from '@ohmprint/contracts';
import { routeTable } from '../../core/route-table';
import { labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { crossProductCheck } from './cross-product';
import { createLibraryDraft, discardDraft, recalibrateDraft, retireVersion, setLotInclusion } from './library-build';
import { libraryLots } from './library-lots';
import { libraryOverview } from './library-overview';
import { libraryProducts } from './library-products';
import { publicationOf, requestPublication } from './library-publish-job';
import { libraryVersionDetail } from './library-views';

const tag = 'Reference libraries';
const READERS: Role[] = ['analyst', 'reviewer', 'lab-admin'];
const PUBLISHERS: Role[] = ['lab-admin', 'reviewer'];
const id = (params: unknown) => (params as { id: string }).id;

/** Building a library version: draft from reference lots, include/exclude, calibrate, publish, retire. */
export function libraryBuildRouter(): Router {
  const { router, route } = routeTable();

  route({ method: 'get', path: '/lab/library-products', tag, summary: 'The lab’s products with their measured reference lots and library versions', roles: READERS, query: LibraryProductQuerySchema, response: LibraryProductPageSchema }, async (_req, res) => {
    res.json(await libraryProducts(dataSource.manager, labIdOf(res.locals.auth), res.locals.query as LibraryProductQuery));
  });

  route({ method: 'post', path: '/lab/library-drafts', tag, summary: 'Start a draft version of a product’s library from its measured reference lots, under a method version', roles: ['analyst'], body: CreateLibraryDraftSchema, response: LibraryDraftCreatedSchema, status: 201 }, async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    res.status(201).json(await dataSource.transaction((m) => createLibraryDraft(m, labId, res.locals.auth.userId, res.locals.body as CreateLibraryDraft)));
  });

  route({ method: 'get', path: '/lab/library-versions/:id/lots', tag, summary: 'A page of a version’s lots with quality, leave-one-out distance and typicality', roles: READERS, params: IdParamsSchema, query: LibraryLotQuerySchema, response: LibraryLotPageSchema }, async (_req, res) => {
    res.json(await libraryLots(dataSource.manager, labIdOf(res.locals.auth), id(res.locals.params), res.locals.query as LibraryLotQuery));
  });

  route({ method: 'get', path: '/lab/library-versions/:id/overview', tag, summary: 'The band of the lots, the lots that stand out and the map (small whatever the size)', roles: READERS, params: IdParamsSchema, response: LibraryOverviewSchema }, async (_req, res) => {
    res.json(await libraryOverview(dataSource.manager, labIdOf(res.locals.auth), id(res.locals.params)));
  });

  route({ method: 'get', path: '/lab/library-versions/:id/cross-product', tag, summary: 'How well the method tells the producer’s products of this matrix apart', roles: READERS, params: IdParamsSchema, response: CrossProductCheckSchema }, async (_req, res) => {
    res.json(await crossProductCheck(dataSource.manager, labIdOf(res.locals.auth), id(res.locals.params)));
  });

  route({ method: 'put', path: '/lab/library-versions/:id/lots/:lotId/inclusion', tag, summary: 'Include or exclude a lot of a draft, with the reason (audited); the draft is recalibrated', roles: ['analyst'], params: VersionLotParamsSchema, body: LotInclusionSchema, response: LibraryVersionDetailSchema }, async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    const { id: versionId, lotId } = res.locals.params as { id: string; lotId: string };
    await dataSource.transaction((m) => setLotInclusion(m, labId, res.locals.auth.userId, versionId, lotId, res.locals.body as LotInclusion));
    res.json(await libraryVersionDetail(dataSource.manager, labId, versionId));
  });

  route({ method: 'post', path: '/lab/library-versions/:id/calibrate', tag, summary: 'Calibrate a draft from its included lots (thresholds, intervals, what blocks publishing)', roles: ['analyst', ...PUBLISHERS], params: IdParamsSchema, response: LibraryVersionDetailSchema }, async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    await dataSource.transaction((m) => recalibrateDraft(m, labId, id(res.locals.params)));
    res.json(await libraryVersionDetail(dataSource.manager, labId, id(res.locals.params)));
  });

  route({ method: 'post', path: '/lab/library-versions/:id/publish', tag, summary: 'Publish (freeze) a draft; 409 naming why when it has too few lots or a threshold interval is too wide. Above LIBRARY_PUBLISH_JOB_LOTS included lots a worker publishes it: 202 with the publication’s state (see …/publication)', roles: PUBLISHERS, params: IdParamsSchema, response: LibraryVersionDetailSchema }, async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    const { queued, publication } = await requestPublication(labId, id(res.locals.params), res.locals.auth.userId);
    if (queued) res.status(202).json(publication);
    else res.json(await libraryVersionDetail(dataSource.manager, labId, id(res.locals.params)));
  });

  route({ method: 'get', path: '/lab/library-versions/:id/publication', tag, summary: 'Where a version’s publication is: draft, queued, running (calibrating its lots), published, or failed with the reason', roles: READERS, params: IdParamsSchema, response: LibraryPublicationSchema }, async (_req, res) => {
    res.json(await publicationOf(dataSource.manager, labIdOf(res.locals.auth), id(res.locals.params)));
  });

  route({ method: 'post', path: '/lab/library-versions/:id/retire', tag, summary: 'Retire a published version: no new analyses; earlier ones stay reproducible', roles: PUBLISHERS, params: IdParamsSchema, body: RetireLibraryVersionSchema, response: LibraryVersionDetailSchema }, async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    await dataSource.transaction((m) => retireVersion(m, labId, res.locals.auth.userId, id(res.locals.params), (res.locals.body as RetireLibraryVersion).reason));
    res.json(await libraryVersionDetail(dataSource.manager, labId, id(res.locals.params)));
  });

  route({ method: 'delete', path: '/lab/library-versions/:id', tag, summary: 'Discard a draft version and its lots', roles: ['analyst', 'lab-admin'], params: IdParamsSchema }, async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    await dataSource.transaction((m) => discardDraft(m, labId, res.locals.auth.userId, id(res.locals.params)));
    res.status(204).end();
  });

  return router;
}
