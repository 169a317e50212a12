import { Router } from 'express';
import { authRouter } from './auth/router';
import { healthRouter } from './health/router';

/** Every feature's router, one line each. Paths are under /api. */
export function apiRoutes(): Router {
  const api = Router();
  api.use('/health', healthRouter());
  api.use('/auth', authRouter());
  return api;
}
