import request from 'supertest';
import type { Role } from '@ohmprint/contracts';
import { useTestApp } from '../testing';

/**
 * Issue 10, "bad input that gives 500 instead of a clear 4xx", walked over EVERY route the API
 * describes (its OpenAPI document), not a hand-picked few: a NUL character or a lone surrogate in
 * `?q=` or in any text field, and an e-mail address of several kilobytes (past PostgreSQL's btree
 * row limit of about 2.7 KB), each answer a 4xx naming the field. Multipart routes: thousands of
 * fields or a megabyte-long field answer 413 naming the limit that holds on that route.
 */
jest.setTimeout(120_000);
const t = useTestApp();

interface JsonSchema {
  type?: string | string[];
  format?: string;
  properties?: Record<string, JsonSchema>;
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
}
interface Operation {
  summary: string;
  description: string;
  parameters: { name: string; in: string }[];
  requestBody?: { content: Record<string, { schema: JsonSchema }> };
}
interface RouteOf {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  op: Operation;
}

const ANY_UUID = '00000000-0000-4000-8000-000000000000';
const LONE = '\uD800';
let routes: RouteOf[] = [];
const tokens = new Map<string, Record<string, string>>();

beforeAll(async () => {
  const doc = (await request(t.app).get('/api/openapi.json')).body as { paths: Record<string, Record<string, Operation>> };
  routes = Object.entries(doc.paths).flatMap(([path, ops]) => Object.entries(ops).map(([method, op]) => ({ method: method as RouteOf['method'], path, op })));
});

/** A signed-in caller holding the first role the route allows (none for public routes). */
async function callerOf(op: Operation): Promise<Record<string, string>> {
  const who = /^Allowed: (.*)\.$/.exec(op.description)?.[1] ?? 'public';
  if (who === 'public') return {};
  const role = (who === 'any signed-in user' ? 'analyst' : who.split(', ')[0]) as Role;
  if (!tokens.has(role)) tokens.set(role, await t.authFor(role));
  return tokens.get(role)!;
}

const concrete = (path: string) => path.replace(/\{[^}]+\}/g, ANY_UUID);
const isText = (s: JsonSchema): boolean => (s.type === 'string' && s.format !== 'binary') || [...(s.anyOf ?? []), ...(s.oneOf ?? [])].some(isText);
/** The top-level fields of a body schema (every branch of a union). */
function fieldsOf(schema: JsonSchema | undefined): Record<string, JsonSchema> {
  if (!schema) return {};
  return Object.assign({}, schema.properties ?? {}, ...[...(schema.anyOf ?? []), ...(schema.oneOf ?? [])].map(fieldsOf));
}
const jsonBodyOf = (op: Operation) => op.requestBody?.content['application/json']?.schema;
const multipartBodyOf = (op: Operation) => op.requestBody?.content['multipart/form-data']?.schema;

function send(r: RouteOf, auth: Record<string, string>, url = concrete(r.path)) {
  return request(t.app)[r.method](url).set(auth);
}

/** Each failure is listed with its route, so one run shows every route that still answers wrongly. */
function summary(res: request.Response): { status: number; fields: string[] } {
  return { status: res.status, fields: (res.body?.errors ?? []).map((e: { field: string }) => e.field) };
}

describe('every list route and its search', () => {
  it('answers a NUL character in ?q= with 400 naming q, on every route that searches', async () => {
    const searching = routes.filter((r) => r.method === 'get' && r.op.parameters.some((p) => p.in === 'query' && p.name === 'q'));
    // The issue counted 12 list routes with a search; every one the API describes is here.
    expect(searching.length).toBeGreaterThanOrEqual(12);
    const wrong: unknown[] = [];
    for (const r of searching) {
      const res = await send(r, await callerOf(r.op), `${concrete(r.path)}?q=ab%00cd`);
      const got = summary(res);
      if (got.status !== 400 || !got.fields.includes('q') || !/NUL/.test(JSON.stringify(res.body.errors))) wrong.push({ route: r.path, ...got });
    }
    expect(wrong).toEqual([]);
  });

  it('never answers 500 to a search for a lone surrogate written as bytes, on every route that searches', async () => {
    const searching = routes.filter((r) => r.method === 'get' && r.op.parameters.some((p) => p.in === 'query' && p.name === 'q'));
    const wrong: unknown[] = [];
    for (const r of searching) {
      // %ED%A0%80 is U+D800 encoded as UTF-8: not text at all.
      const res = await send(r, await callerOf(r.op), `${concrete(r.path)}?q=ab%ED%A0%80cd`);
      if (res.status >= 500) wrong.push({ route: r.path, ...summary(res) });
    }
    expect(wrong).toEqual([]);
  });
  it('never answers 500 to a search of several kilobytes (an e-mail address pasted whole, say), on every route that searches', async () => {
    const searching = routes.filter((r) => r.method === 'get' && r.op.parameters.some((p) => p.in === 'query' && p.name === 'q'));
    const wrong: unknown[] = [];
    for (const r of searching) {
      const res = await send(r, await callerOf(r.op), `${concrete(r.path)}?q=${encodeURIComponent(`${'a'.repeat(3000)}@calder.test`)}`);
      if (res.status >= 500) wrong.push({ route: r.path, ...summary(res) });
    }
    expect(wrong).toEqual([]);
  });
});

describe('every JSON body', () => {
  it('answers a NUL character or a lone surrogate in any text field with 400 naming that field', async () => {
    const withText = routes.filter((r) => Object.values(fieldsOf(jsonBodyOf(r.op))).some(isText));
    expect(withText.length).toBeGreaterThan(30);
    const wrong: unknown[] = [];
    for (const r of withText) {
      const auth = await callerOf(r.op);
      for (const [field, schema] of Object.entries(fieldsOf(jsonBodyOf(r.op)))) {
        if (!isText(schema)) continue;
        for (const [bad, words] of [[`a\u0000b`, /NUL/], [`a${LONE}b`, /surrogate/]] as const) {
          const res = await send(r, auth).send({ [field]: bad });
          const named = (res.body?.errors ?? []).find((e: { field: string }) => e.field === field);
          if (res.status !== 400 || !named || !words.test(named.message)) wrong.push({ route: `${r.method.toUpperCase()} ${r.path}`, field, ...summary(res) });
        }
      }
    }
    expect(wrong).toEqual([]);
  });

  it('answers an e-mail address of 3,000 characters with 400 naming the field, on every route that takes one', async () => {
    const email = `${'a'.repeat(3000)}@calder.test`;
    const withEmail = routes.flatMap((r) => Object.keys(fieldsOf(jsonBodyOf(r.op))).filter((f) => /email/i.test(f)).map((field) => ({ r, field })));
    // sign-in, reset request, staff, client team, client organisation and new lab invitations at least
    expect(withEmail.length).toBeGreaterThanOrEqual(5);
    const wrong: unknown[] = [];
    for (const { r, field } of withEmail) {
      const res = await send(r, await callerOf(r.op)).send({ [field]: email });
      if (res.status !== 400 || !summary(res).fields.includes(field)) wrong.push({ route: `${r.method.toUpperCase()} ${r.path}`, field, ...summary(res) });
    }
    expect(wrong).toEqual([]);
  });
});

describe('every path with an id or code in it', () => {
  it('answers a NUL character in a path parameter with 400, never a 500', async () => {
    const withParams = routes.filter((r) => /\{[^}]+\}/.test(r.path));
    expect(withParams.length).toBeGreaterThan(50);
    const wrong: unknown[] = [];
    for (const r of withParams) {
      const url = r.path.replace(/\{[^}]+\}/, 'OP%00X').replace(/\{[^}]+\}/g, ANY_UUID);
      const res = await send(r, await callerOf(r.op), url);
      if (res.status !== 400 || !summary(res).fields.some((f) => f === '(path)' || r.op.parameters.some((p) => p.in === 'path' && p.name === f))) wrong.push({ route: `${r.method.toUpperCase()} ${r.path}`, ...summary(res) });
    }
    expect(wrong).toEqual([]);
  });
});

describe('every multipart upload', () => {
  const multipartRoutes = () => routes.filter((r) => r.method !== 'get' && r.op.requestBody?.content['multipart/form-data']);

  it('refuses more text fields than the limit with 413 saying the limit, and takes as many as it says', async () => {
    const all = multipartRoutes();
    // measurements, intake photos, standard runs, signing credential, logo, public PDF check, products
    expect(all.length).toBeGreaterThanOrEqual(7);
    const wrong: unknown[] = [];
    for (const r of all) {
      const route = `${r.method.toUpperCase()} ${r.path}`;
      let req = send(r, await callerOf(r.op));
      for (let i = 0; i < 1500; i++) req = req.field(`extra${i}`, 'x');
      const res = await req;
      const stated = Number(/At most (\d+) text fields/.exec(String(res.body.detail))?.[1]);
      if (res.status !== 413 || res.body.type !== 'urn:ohmprint:problem:too-many-fields' || !stated) {
        wrong.push({ route, status: res.status, type: res.body.type, detail: res.body.detail });
        continue;
      }
      // as many fields as the message allows are not refused for their number
      let within = send(r, await callerOf(r.op));
      for (let i = 0; i < stated; i++) within = within.field(`extra${i}`, 'x');
      const ok = await within;
      if (ok.body.type === 'urn:ohmprint:problem:too-many-fields') wrong.push({ route, stated, refusedAt: stated, detail: ok.body.detail });
    }
    expect(wrong).toEqual([]);
  });

  it('refuses a megabyte-long text field with 413 naming the field and the size limit, and takes a field of that size', async () => {
    const wrong: unknown[] = [];
    for (const r of multipartRoutes()) {
      const route = `${r.method.toUpperCase()} ${r.path}`;
      const res = await send(r, await callerOf(r.op)).field('remarks', 'x'.repeat(1024 * 1024));
      const stated = Number(/text field \(field "remarks"\) is longer than (\d+) KB/.exec(String(res.body.detail))?.[1]);
      if (res.status !== 413 || res.body.type !== 'urn:ohmprint:problem:field-too-long' || !stated) {
        wrong.push({ route, status: res.status, type: res.body.type, detail: res.body.detail });
        continue;
      }
      const ok = await send(r, await callerOf(r.op)).field('remarks', 'x'.repeat(stated * 1024));
      if (ok.body.type === 'urn:ohmprint:problem:field-too-long') wrong.push({ route, stated: `${stated} KB`, detail: ok.body.detail });
    }
    expect(wrong).toEqual([]);
  });

  it('refuses a NUL character in any text field of a form with 400 naming the field', async () => {
    const wrong: unknown[] = [];
    for (const r of multipartRoutes()) {
      const auth = await callerOf(r.op);
      const fields = Object.entries(fieldsOf(multipartBodyOf(r.op)));
      // file fields: those the schema marks binary, and those the summary names in quotes ('field "file"')
      const named = [...r.op.summary.matchAll(/"(\w+)"/g)].map((m) => m[1]);
      const fileFields = [...new Set([...fields.filter(([, s]) => s.format === 'binary').map(([name]) => name), ...named.filter((n) => !fields.some(([f, s]) => f === n && isText(s)))])];
      for (const [field, schema] of fields) {
        if (!isText(schema)) continue;
        // a small file in each file field, so the route reaches its form fields
        let req = send(r, auth).field(field, 'bench\u0000two');
        for (const f of fileFields) req = req.attach(f, Buffer.from('not much'), 'small.txt');
        const res = await req;
        if (res.status !== 400 || !summary(res).fields.includes(field)) wrong.push({ route: `${r.method.toUpperCase()} ${r.path}`, field, ...summary(res) });
      }
    }
    expect(wrong).toEqual([]);
  });
});
