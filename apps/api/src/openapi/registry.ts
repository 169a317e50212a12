import type { z } from 'zod';
import type { Role } from '@ohmprint/contracts';

export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface RouteDescription {
  method: HttpMethod;
  /** Express-style path under /api, e.g. `/lab/staff/:id/roles`. */
  path: string;
  summary: string;
  /** Feature name for grouping in the docs page. */
  tag: string;
  /** Roles allowed; empty means public (no sign-in). */
  roles: readonly Role[] | 'signed-in';
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
  /** Schema of the success body; omit for an empty (204) answer. */
  response?: z.ZodType;
  /** Success status; 200 by default (204 when there is no response schema). */
  status?: number;
  /** Body is not JSON (e.g. a PDF or multipart upload): the media type to list. */
  requestMediaType?: string;
  responseMediaType?: string;
}

const routes: RouteDescription[] = [];

/**
 * Adds a route to /api/openapi.json. Call it beside the router line that serves the route, with the
 * same schemas the route validates with, so the description cannot drift from the behaviour.
 */
export function registerRoute(route: RouteDescription): void {
  const existing = routes.findIndex((r) => r.method === route.method && r.path === route.path);
  if (existing >= 0) routes[existing] = route;
  else routes.push(route);
}

export function registeredRoutes(): readonly RouteDescription[] {
  return routes;
}
