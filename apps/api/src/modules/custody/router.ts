import type { Router } from 'express';
import { CustodyTimelineSchema, IdParamsSchema, RecordCustodyEventSchema, type RecordCustodyEvent } from '@ohmprint/contracts';
import { labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { LAB_STAFF } from '../samples/lab-roles';
import { custodyTimeline, recordMovement } from './custody-timeline';
import { routeTable } from '../../core/route-table';

const tag = 'Chain of custody';
const MOVERS = ['intake-technician', 'analyst', 'lab-admin'] as const;

/**
 * Chain of custody (mounted at /lab). Deliberately read and append only: there is no route to
 * change or remove an event, and the database refuses UPDATE and DELETE on the table.
 */
export function custodyRouter(): Router {
  const { router, route } = routeTable();
  const sampleId = (params: unknown) => (params as { id: string }).id;

  route({ method: 'get', path: '/lab/samples/:id/custody', tag, summary: 'The sample’s chain of custody as a timeline, oldest first', roles: LAB_STAFF, params: IdParamsSchema, response: CustodyTimelineSchema }, async (_req, res) => {
    res.json(await custodyTimeline(dataSource.manager, labIdOf(res.locals.auth), sampleId(res.locals.params)));
  });

  route({ method: 'post', path: '/lab/samples/:id/custody', tag, summary: 'Append a movement (who, when, where, why); events are never changed', roles: MOVERS, params: IdParamsSchema, body: RecordCustodyEventSchema, response: CustodyTimelineSchema, status: 201 }, async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    await dataSource.transaction((m) => recordMovement(m, res.locals.auth, labId, sampleId(res.locals.params), res.locals.body as RecordCustodyEvent));
    res.status(201).json(await custodyTimeline(dataSource.manager, labId, sampleId(res.locals.params)));
  });

  return router;
}
