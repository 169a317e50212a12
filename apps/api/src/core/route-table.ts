import { Router, type RequestHandler } from 'express';
import { registerRoute, type RouteDescription } from '../openapi/registry';
import { requireAuth, requireRole } from '../modules/auth/require-auth';
import { validate } from './validate';

/** One route, declared once: its path, roles and schemas serve the router and the OpenAPI page alike. */
export interface RouteDeclaration extends RouteDescription {
  /**
   * Middleware that runs after sign-in and the role check and before validation: a multipart parser,
   * a rate limiter, an instrument-key check. Public and key-authenticated routes list their own
   * access check here and declare `roles: []`.
   */
  before?: RequestHandler[];
}

export interface RouteTable {
  /** Mount with `api.use(table.router)`: paths are declared in full, under /api. */
  readonly router: Router;
  route(declaration: RouteDeclaration, handler: RequestHandler): void;
}

function accessCheck(roles: RouteDescription['roles']): RequestHandler[] {
  if (roles === 'signed-in') return [requireAuth];
  if (roles.length === 0) return [];
  return [requireRole(...roles)];
}

/**
 * A feature's routes as a list of declarations. Each declaration mounts the route (sign-in and role
 * check, then `before`, then validation of params, query and body into `res.locals`, then the
 * handler) and registers the same description in the OpenAPI document, so the two cannot drift.
 *
 * ```ts
 * const { router, route } = routeTable();
 * route({ method: 'get', path: '/client/credits', tag, summary: 'The organisation’s credits',
 *   roles: CLIENTS, response: CreditBalanceSchema }, async (_req, res) => { … });
 * return router;
 * ```
 */
export function routeTable(): RouteTable {
  const router = Router();
  return {
    router,
    route(declaration, handler) {
      const { before = [], ...description } = declaration;
      registerRoute(description);
      const { body, query, params } = description;
      const validation = body || query || params ? [validate({ body, query, params })] : [];
      router[description.method](description.path, ...accessCheck(description.roles), ...before, ...validation, handler);
    },
  };
}
