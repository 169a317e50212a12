import type { Router } from 'express';
import { HealthSchema, type Health } from '@ohmprint/contracts';
import { dataSource } from '../../db/data-source';
import { API_VERSION } from '../../version';
import { routeTable } from '../../core/route-table';

export function healthRouter(): Router {
  const { router, route } = routeTable();
  route({ method: 'get', path: '/health', tag: 'Health', summary: 'Liveness and database reachability (503 when the database is down)', roles: [], response: HealthSchema }, async (_req, res) => {
    let database: Health['database'] = 'ok';
    try {
      await dataSource.query('SELECT 1');
    } catch {
      database = 'unreachable';
    }
    const body: Health = { status: database === 'ok' ? 'ok' : 'degraded', database, version: API_VERSION };
    res.status(database === 'ok' ? 200 : 503).json(body);
  });
  return router;
}
