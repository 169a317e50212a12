// The API as a bench meets it: the app on a free loopback port, tokens for the demo analyst and
// reviewer, and one JSON call that fails with the API's own words.
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';

export interface BenchApi {
  server: Server;
  /** `http://127.0.0.1:<port>/api` */
  base: string;
  analyst: Record<string, string>;
  reviewer: Record<string, string>;
  /** A JSON request; the parsed answer and its size in bytes. */
  call: (method: string, path: string, auth: Record<string, string>, body?: unknown) => Promise<{ json: any; bytes: number }>; // eslint-disable-line @typescript-eslint/no-explicit-any
}

export async function startBenchApi(users: { analyst_id: string; reviewer_id: string }): Promise<BenchApi> {
  const { createApp } = await import('../../../apps/api/src/app');
  const { signAccessToken } = await import('../../../apps/api/src/modules/auth/access-token');
  const server = createApp().listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api`;
  const call: BenchApi['call'] = async (method, path, auth, body) => {
    const res = await fetch(`${base}${path}`, { method, headers: { ...auth, ...(body ? { 'content-type': 'application/json' } : {}) }, body: body ? JSON.stringify(body) : undefined });
    const text = await res.text();
    if (!res.ok) throw new Error(`${method} ${path} answered ${res.status}: ${text.slice(0, 400)}`);
    return { json: text ? JSON.parse(text) : null, bytes: Buffer.byteLength(text) };
  };
  return {
    server,
    base,
    analyst: { Authorization: `Bearer ${signAccessToken(users.analyst_id)}` },
    reviewer: { Authorization: `Bearer ${signAccessToken(users.reviewer_id)}` },
    call,
  };
}
