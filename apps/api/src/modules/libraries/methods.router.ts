import type { Router } from 'express';
import {
  CreateMethodSchema,
  IdParamsSchema,
  MethodListQuerySchema,
  MethodPageSchema,
  MethodVersionDetailSchema,
  MethodVersionInputSchema,
  ModelCatalogSchema,
  ModelPreviewRequestSchema,
  ModelPreviewSchema,
  PreviewReplicateListSchema,
  type CreateMethod,
  type MethodListQuery,
  type MethodVersionInput,
  type ModelPreviewRequest,
} from '@ohmprint/contracts';
import { routeTable } from '../../core/route-table';
import { labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { LAB_STAFF } from '../samples/lab-roles';
import { addMethodVersion, createMethod, editMethodVersion, listMethods, methodVersionDetail } from './method-versions';
import { modelCatalog, previewModel, previewReplicates } from './model-preview';

const tag = 'Methods';
const id = (params: unknown) => (params as { id: string }).id;

/** The lab's versioned methods (lab admins change them; all staff read them). */
export function methodsRouter(): Router {
  const { router, route } = routeTable();

  route({ method: 'get', path: '/lab/methods', tag, summary: 'The lab’s methods with their versions, newest first', roles: LAB_STAFF, query: MethodListQuerySchema, response: MethodPageSchema }, async (_req, res) => {
    res.json(await listMethods(dataSource.manager, labIdOf(res.locals.auth), res.locals.query as MethodListQuery));
  });

  route({ method: 'get', path: '/lab/methods/model-catalog', tag, summary: 'The engine’s built-in models', roles: LAB_STAFF, response: ModelCatalogSchema }, (_req, res) => {
    res.json(modelCatalog());
  });

  route({ method: 'get', path: '/lab/methods/preview-replicates', tag, summary: 'Recent measured spectra a model can be previewed on', roles: ['lab-admin', 'analyst'], response: PreviewReplicateListSchema }, async (_req, res) => {
    res.json(await previewReplicates(dataSource.manager, labIdOf(res.locals.auth)));
  });

  route({ method: 'post', path: '/lab/methods/model-preview', tag, summary: 'Fit a method’s model to one real spectrum, prepared as the method would prepare it', roles: ['lab-admin', 'analyst'], body: ModelPreviewRequestSchema, response: ModelPreviewSchema }, async (_req, res) => {
    res.json(await previewModel(dataSource.manager, labIdOf(res.locals.auth), res.locals.body as ModelPreviewRequest));
  });

  route({ method: 'post', path: '/lab/methods', tag, summary: 'A new method (its version 1)', roles: ['lab-admin'], body: CreateMethodSchema, response: MethodVersionDetailSchema, status: 201 }, async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    const versionId = await dataSource.transaction((m) => createMethod(m, labId, res.locals.auth.userId, res.locals.body as CreateMethod));
    res.status(201).json(await methodVersionDetail(dataSource.manager, labId, versionId));
  });

  route({ method: 'post', path: '/lab/methods/:id/versions', tag, summary: 'Change a method: a new version, with what differs from the previous one', roles: ['lab-admin'], params: IdParamsSchema, body: MethodVersionInputSchema, response: MethodVersionDetailSchema, status: 201 }, async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    const versionId = await dataSource.transaction((m) => addMethodVersion(m, labId, res.locals.auth.userId, id(res.locals.params), res.locals.body as MethodVersionInput));
    res.status(201).json(await methodVersionDetail(dataSource.manager, labId, versionId));
  });

  route({ method: 'get', path: '/lab/method-versions/:id', tag, summary: 'One method version: settings, whether it is locked, what differs from the previous one', roles: LAB_STAFF, params: IdParamsSchema, response: MethodVersionDetailSchema }, async (_req, res) => {
    res.json(await methodVersionDetail(dataSource.manager, labIdOf(res.locals.auth), id(res.locals.params)));
  });

  route({ method: 'put', path: '/lab/method-versions/:id', tag, summary: 'Correct a version nothing relies on yet (409 once a published library or an issued report uses it)', roles: ['lab-admin'], params: IdParamsSchema, body: MethodVersionInputSchema, response: MethodVersionDetailSchema }, async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    await dataSource.transaction((m) => editMethodVersion(m, labId, res.locals.auth.userId, id(res.locals.params), res.locals.body as MethodVersionInput));
    res.json(await methodVersionDetail(dataSource.manager, labId, id(res.locals.params)));
  });

  return router;
}
