import { z } from 'zod';
import { ProblemSchema } from '@ohmprint/contracts';
import { API_VERSION } from '../version';
import { registeredRoutes, type RouteDescription } from './registry';

type JsonSchema = Record<string, unknown>;

function jsonSchema(schema: z.ZodType, io: 'input' | 'output'): JsonSchema {
  const { $schema: _ignored, ...rest } = z.toJSONSchema(schema, { io, unrepresentable: 'any' }) as JsonSchema;
  return rest;
}

/** `/lab/staff/:id` → `/lab/staff/{id}` */
function openApiPath(path: string): string {
  return `/api${path}`.replace(/:([A-Za-z_]\w*)/g, '{$1}');
}

function parameters(route: RouteDescription): unknown[] {
  const list: unknown[] = [];
  for (const [where, schema] of [['path', route.params], ['query', route.query]] as const) {
    if (!schema) continue;
    const js = jsonSchema(schema, 'input') as { properties?: Record<string, JsonSchema>; required?: string[] };
    for (const [name, prop] of Object.entries(js.properties ?? {})) {
      list.push({ name, in: where, required: where === 'path' || (js.required ?? []).includes(name), schema: prop });
    }
  }
  return list;
}

function operation(route: RouteDescription): Record<string, unknown> {
  const isPublic = route.roles !== 'signed-in' && route.roles.length === 0;
  const who = route.roles === 'signed-in' ? 'any signed-in user' : isPublic ? 'public' : route.roles.join(', ');
  const status = String(route.status ?? (route.response || route.responseMediaType ? 200 : 204));
  const problem = { 'application/problem+json': { schema: { $ref: '#/components/schemas/Problem' } } };
  const responses: Record<string, unknown> = {
    [status]: {
      description: 'Success',
      ...(route.response ? { content: { 'application/json': { schema: jsonSchema(route.response, 'output') } } } : {}),
      ...(route.responseMediaType ? { content: { [route.responseMediaType]: {} } } : {}),
    },
    '400': { description: 'Invalid input (field-level errors)', content: problem },
  };
  if (!isPublic) {
    responses['401'] = { description: 'Not signed in or token invalid', content: problem };
    responses['403'] = { description: 'Role not allowed', content: problem };
    responses['404'] = { description: 'Not found (also for another tenant’s records)', content: problem };
  }
  return {
    summary: route.summary,
    description: `Allowed: ${who}.`,
    tags: [route.tag],
    parameters: parameters(route),
    ...(route.body
      ? { requestBody: { required: true, content: { [route.requestMediaType ?? 'application/json']: { schema: jsonSchema(route.body, 'input') } } } }
      : {}),
    ...(isPublic ? { security: [] } : {}),
    responses,
  };
}

/** The OpenAPI 3.1 description of every registered route, built from the shared zod schemas. */
export function buildOpenApiDocument(): Record<string, unknown> {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const route of registeredRoutes()) {
    const key = openApiPath(route.path);
    paths[key] = { ...(paths[key] ?? {}), [route.method]: operation(route) };
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Ohmprint API',
      version: API_VERSION,
      description: `Impedance-fingerprint screening for contract testing labs. Errors are application/problem+json.`,
    },
    servers: [{ url: '/' }],
    security: [{ bearer: [] }],
    components: {
      securitySchemes: { bearer: { type: 'http', scheme: 'bearer', bearerFormat: 'JWT' } },
      schemas: { Problem: jsonSchema(ProblemSchema, 'output') },
    },
    paths,
  };
}
