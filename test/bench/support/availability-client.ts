/**
 * The client side of the availability bench, in a process of its own (forked by
 * api-availability-bench.ts): it runs one phase's load — a sign-in flood or measurement uploads —
 * and meanwhile probes /api/health and the samples list, then sends the timings back. Kept out of
 * the API's process so the figures measure the API, not the bench's own fetches, form building
 * and response parsing sharing the API's event loop.
 */
import { performance } from 'node:perf_hooks';

export interface ClientPhase {
  base: string;
  /** Headers of the signed-in analyst who probes the samples list and uploads. */
  analyst: Record<string, string>;
  load:
    | { kind: 'flood'; target: string; seconds: number; connections: number; body: 'random-email' | { email: string; password: string }; spreadAddresses: boolean }
    | { kind: 'uploads'; sampleIds: string[]; instrumentId: string; cellId: string; files: number; fileText: string };
}

export interface ClientResult {
  health: number[];
  list: number[];
  loadMs: number;
  extra: Record<string, unknown>;
}

const randomEmail = () => ({ email: `nobody-${Math.random().toString(36).slice(2)}@flood.test`, password: 'guess-guess-guess' });
const randomAddress = () => `198.51.100.${1 + Math.floor(Math.random() * 254)}, 203.0.113.${1 + Math.floor(Math.random() * 254)}`;

async function flood(load: Extract<ClientPhase['load'], { kind: 'flood' }>): Promise<Record<string, unknown>> {
  const statuses: Record<string, number> = {};
  const until = performance.now() + load.seconds * 1000;
  await Promise.all(
    Array.from({ length: load.connections }, async () => {
      while (performance.now() < until) {
        const body = load.body === 'random-email' ? randomEmail() : load.body;
        const headers: Record<string, string> = { 'content-type': 'application/json', ...(load.spreadAddresses ? { 'x-forwarded-for': randomAddress() } : {}) };
        const res = await fetch(`${load.target}/auth/sign-in`, { method: 'POST', headers, body: JSON.stringify(body) });
        await res.arrayBuffer();
        statuses[res.status] = (statuses[res.status] ?? 0) + 1;
      }
    }),
  );
  return { connections: load.connections, seconds: load.seconds, statuses };
}

async function uploads(phase: ClientPhase, load: Extract<ClientPhase['load'], { kind: 'uploads' }>): Promise<Record<string, unknown>> {
  const file = new Blob([load.fileText]);
  const answers = await Promise.all(
    load.sampleIds.map(async (id) => {
      const form = new FormData();
      form.set('instrumentId', load.instrumentId);
      form.set('cellId', load.cellId);
      form.set('temperatureC', '22');
      for (let i = 0; i < load.files; i++) form.append('files', file, `largest-${i}.csv`);
      // An upload refused at once (429, before its body is read) closes the connection: the client
      // may see the reset before it reads the answer.
      const res = await fetch(`${phase.base}/lab/samples/${id}/measurements`, { method: 'POST', headers: phase.analyst, body: form }).catch(() => null);
      if (!res) return { status: 'connection closed while sending (refused before its body was read)', saved: 0 };
      const body = (await res.json()) as { saved?: unknown[] };
      return { status: res.status, saved: body.saved?.length ?? 0 };
    }),
  );
  return answers.length === 1 ? answers[0] : { uploads: answers.length, statuses: answers.map((a) => a.status), saved: answers.map((a) => a.saved) };
}

async function run(phase: ClientPhase): Promise<ClientResult> {
  const health: number[] = [];
  const list: number[] = [];
  let running = true;
  const prober = (async () => {
    while (running) {
      let t = performance.now();
      await fetch(`${phase.base}/health`).then((r) => r.arrayBuffer());
      health.push(performance.now() - t);
      t = performance.now();
      await fetch(`${phase.base}/lab/samples?pageSize=25`, { headers: phase.analyst }).then((r) => r.arrayBuffer());
      list.push(performance.now() - t);
      await new Promise((r) => setTimeout(r, 20));
    }
  })();
  const start = performance.now();
  const extra = phase.load.kind === 'flood' ? await flood(phase.load) : await uploads(phase, phase.load);
  const loadMs = performance.now() - start;
  running = false;
  await prober;
  return { health, list, loadMs, extra };
}

process.on('message', (phase: ClientPhase) => {
  run(phase).then(
    (result) => process.send!(result),
    (err: unknown) => process.send!({ error: String(err instanceof Error ? err.stack : err) }),
  );
});
