import { Router } from 'express';
import { HealthSchema, type Health } from '@ohmprint/contracts';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { API_VERSION } from '../../version';

export function healthRouter(): Router {
  const router = Router();
  registerRoute({ method: 'get', path: '/health', tag: 'Health', summary: 'Liveness and database reachability (503 when the database is down)', roles: [], response: HealthSchema });
  router.get('/', async (_req, res) => {
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
