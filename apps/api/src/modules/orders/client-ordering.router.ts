import type { Request, Response, Router } from 'express';
import { z } from 'zod';
import {
  IdParamsSchema,
  NewCheckOrderSchema,
  NewReferenceOrderSchema,
  OrderPricesSchema,
  OrderShipmentSchema,
  OrderSummarySchema,
  ProductInputSchema,
  ProductSummarySchema,
  type NewCheckOrder,
  type NewReferenceOrder,
  type OrderShipment,
  type ProductInput,
  type Role,
} from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { routeTable } from '../../core/route-table';
import { clientOrganisationIdOf, labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { creditBalance } from '../credits/credit-ledger';
import { imageOnDisk } from '../intake/image-on-disk';
import { tenantBoundedUpload } from '../samples/tenant-bounded-upload';
import type { ClientScope } from './client-views';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import { labelPackData } from './label-pack-data';
import { cancelOrder, placeCheckOrder, placeReferenceOrder, recordShipment } from './order-placement';
import { createProduct, LABEL_PHOTO_MAX_BYTES, productPhoto, updateProduct } from './product-service';
import { samplePhoto, saveSamplePhoto } from './sample-photo';

const tag = 'Client orders';
const CLIENTS: Role[] = ['client-admin', 'client-member'];
const ADMIN: Role[] = ['client-admin'];
const scopeOf = (res: Response): ClientScope => ({ labId: labIdOf(res.locals.auth), clientOrganisationId: clientOrganisationIdOf(res.locals.auth) });
const idOf = (res: Response): string => (res.locals.params as { id: string }).id;
const PHOTO_LIMITS = { fileSizeBytes: LABEL_PHOTO_MAX_BYTES, files: 1 };
export const CONCURRENT_PHOTO_UPLOADS_PER_CLIENT = 2;
const photoOf = async (req: Request) => (req.file ? imageOnDisk(req.file) : undefined);
const SamplePhotoParamsSchema = z.object({ id: z.uuid({ message: 'must be a UUID' }), sampleId: z.uuid({ message: 'must be a UUID' }) });
const PhotoBodySchema = z.object({ photo: z.string().meta({ format: 'binary', description: 'PNG or JPEG, at most 5 MB' }) });

function sendImage(res: Response, image: { contentType: string; fileName: string; content: Buffer }): void {
  res.setHeader('Content-Disposition', `inline; filename="${encodeURIComponent(image.fileName)}"`);
  res.setHeader('Cache-Control', 'private, no-cache');
  res.type(image.contentType).send(image.content);
}

/** What a client admin does to order: products, enrolment, checks, shipping, cancelling, labels. */
export function clientOrderingRouter(): Router {
  const { router, route } = routeTable();
  // Label and sample photos stream to a private temporary folder (removed when the answer is sent), two uploads per client organisation at once.
  const photoUpload = tenantBoundedUpload({ limits: PHOTO_LIMITS, select: (m) => m.single('photo'), perTenant: CONCURRENT_PHOTO_UPLOADS_PER_CLIENT,
    what: 'photo uploads of one client organisation', tenantOf: (res) => clientOrganisationIdOf(res.locals.auth) });

  route({ method: 'post', path: '/client/products', tag, status: 201, roles: ADMIN, before: photoUpload, body: ProductInputSchema,
    requestMediaType: 'multipart/form-data',
    summary: 'Register a product (JSON, or multipart with an optional label photo in "photo": PNG or JPEG, ≤ 5 MB)',
    response: ProductSummarySchema }, async (req, res) => {
    const body = res.locals.body as ProductInput;
    const photo = await photoOf(req);
    res.status(201).json(await dataSource.transaction((m) => createProduct(m, res.locals.auth, scopeOf(res), body, photo)));
  });

  route({ method: 'put', path: '/client/products/:id', tag, roles: ADMIN, before: photoUpload, params: IdParamsSchema, body: ProductInputSchema,
    requestMediaType: 'multipart/form-data',
    summary: 'Edit a product (JSON, or multipart with a replacement label photo in "photo")', response: ProductSummarySchema }, async (req, res) => {
    const body = res.locals.body as ProductInput;
    const photo = await photoOf(req);
    res.json(await dataSource.transaction((m) => updateProduct(m, res.locals.auth, scopeOf(res), idOf(res), body, photo)));
  });

  route({ method: 'get', path: '/client/products/:id/photo', tag, roles: CLIENTS, params: IdParamsSchema, responseMediaType: 'image/*',
    summary: 'A product’s label photo' }, async (_req, res) => {
    sendImage(res, await productPhoto(dataSource.manager, scopeOf(res), idOf(res)));
  });

  route({ method: 'get', path: '/client/order-prices', tag, roles: CLIENTS, response: OrderPricesSchema,
    summary: 'What a check sample and a reference lot cost in credits, and the organisation’s balance' }, async (_req, res) => {
    const scope = scopeOf(res);
    const [lab] = await dataSource.query('SELECT credits_per_check_sample, credits_per_reference_lot FROM lab WHERE id = $1', [scope.labId]);
    const balance = await creditBalance(dataSource.manager, scope);
    res.json({ creditsPerCheckSample: lab.credits_per_check_sample, creditsPerReferenceLot: lab.credits_per_reference_lot, ...balance });
  });

  route({ method: 'post', path: '/client/orders', tag, status: 201, roles: ADMIN, body: NewCheckOrderSchema, response: OrderSummarySchema,
    summary: 'Order checks of suspect samples of a product with a published library; credits are reserved (409 naming the shortfall)' },
  async (_req, res) => {
    const body = res.locals.body as NewCheckOrder;
    res.status(201).json(await dataSource.transaction((m) => placeCheckOrder(m, res.locals.auth, scopeOf(res), body)));
  });

  route({ method: 'post', path: '/client/reference-orders', tag, status: 201, roles: ADMIN, body: NewReferenceOrderSchema, response: OrderSummarySchema,
    summary: 'Enrol authentic reference lots of a product; priced per lot, they arrive at intake as reference-lot samples' },
  async (_req, res) => {
    const body = res.locals.body as NewReferenceOrder;
    res.status(201).json(await dataSource.transaction((m) => placeReferenceOrder(m, res.locals.auth, scopeOf(res), body)));
  });

  route({ method: 'post', path: '/client/orders/:id/cancel', tag, roles: ADMIN, params: IdParamsSchema, response: OrderSummarySchema,
    summary: 'Cancel an order before the lab receives its samples; held credits are returned' }, async (_req, res) => {
    res.json(await dataSource.transaction((m) => cancelOrder(m, res.locals.auth, scopeOf(res), idOf(res))));
  });

  route({ method: 'post', path: '/client/orders/:id/shipment', tag, roles: ADMIN, params: IdParamsSchema, body: OrderShipmentSchema,
    response: OrderSummarySchema, summary: 'Record the carrier and tracking number of the parcel (shown at the lab’s intake)' }, async (_req, res) => {
    const body = res.locals.body as OrderShipment;
    res.json(await dataSource.transaction((m) => recordShipment(m, res.locals.auth, scopeOf(res), idOf(res), body)));
  });

  route({ method: 'get', path: '/client/orders/:id/label-pack', tag, roles: CLIENTS, params: IdParamsSchema, responseMediaType: 'application/pdf',
    summary: 'Label pack (PDF): a label with code and QR per sample, the lab’s shipping address and instructions, a custody form' },
  async (_req, res) => {
    const data = await labelPackData(dataSource.manager, scopeOf(res), idOf(res));
    if (data.cancelled) throw ApiError.conflict('This order is cancelled; its samples must not be sent.');
    // Rendered in a worker thread: a pack of many samples never holds up other requests.
    const pdf = Buffer.from(await runCpuTask('labelPack', { data }));
    res.setHeader('Content-Disposition', `attachment; filename="label-pack-${data.orderRef}.pdf"`);
    res.type('application/pdf').send(pdf);
  });

  route({ method: 'put', path: '/client/orders/:id/samples/:sampleId/photo', tag, roles: ADMIN, before: photoUpload,
    params: SamplePhotoParamsSchema, body: PhotoBodySchema.partial(), requestMediaType: 'multipart/form-data',
    summary: 'Add or replace the photo of an ordered sample (PNG or JPEG, ≤ 5 MB)' }, async (req, res) => {
    const p = res.locals.params as z.infer<typeof SamplePhotoParamsSchema>;
    const photo = await photoOf(req);
    await dataSource.transaction((m) => saveSamplePhoto(m, res.locals.auth, scopeOf(res), p.id, p.sampleId, photo));
    res.status(204).end();
  });

  route({ method: 'get', path: '/client/orders/:id/samples/:sampleId/photo', tag, roles: CLIENTS, params: SamplePhotoParamsSchema,
    responseMediaType: 'image/*', summary: 'The photo the client added to an ordered sample' }, async (_req, res) => {
    const p = res.locals.params as z.infer<typeof SamplePhotoParamsSchema>;
    sendImage(res, await samplePhoto(dataSource.manager, scopeOf(res), p.id, p.sampleId));
  });

  return router;
}
