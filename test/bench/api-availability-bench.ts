/**
 * Availability figures, printed as JSON lines (`npm run bench`): how /api/health and the samples
 * list answer (p99, budget 250 ms) while the API is abused within its limits —
 *   - a sign-in flood with a new random e-mail per request, 6 connections from one address;
 *   - the same flood spread over many addresses, as a proxy's X-Forwarded-For shows them when
 *     TRUST_PROXY is on (a second app instance with the setting, on its own port);
 *   - the largest measurement upload the limits allow (20 files × the most points per file);
 * with the event loop's delay (p99) and longest stall, the API process's peak resident memory
 * (budget 512 MB), the worker pool's and the database pool's longest queues and the load average.
 * The API is the built one (dist/), in a process of its own as `npm start` runs it, with a probe
 * preloaded that reports those figures per phase (support/api-process-probe.cjs); the load and the
 * timing probes run in a client process of their own (support/availability-client.ts). Runs against
 * a freshly migrated database of its own, seeded with the invented demo, and drops it afterwards.
 * Figures, not pass/fail: the budgets are printed beside them.
 */
import { fork } from 'node:child_process';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import type { ClientPhase, ClientResult } from './support/availability-client';
import { startBuiltProcess, type BuiltProcess } from './support/built-processes';
import { BENCH_PASSWORD, demoBenchDatabase } from './support/demo-database';
import { line, mb, percentile, round } from './support/figures';

process.env.LOG_LEVEL = 'silent';
process.env.OUTBOX_WORKER = 'false';

const FLOOD_SECONDS = 10;
const CONNECTIONS = 6;
const p99 = (v: number[]) => (v.length ? round(percentile(v, 0.99)) : null);
const max = (v: number[]) => (v.length ? round(Math.max(...v)) : null);

async function main(): Promise<void> {
  const db = await demoBenchDatabase('ohmprint_bench_avail');
  const { dataSource } = await import('../../apps/api/src/db/data-source');
  dataSource.setOptions({ database: db.name, poolSize: 8 });
  await dataSource.initialize();
  const apis: BuiltProcess[] = [];
  try {
    const [ctx] = await dataSource.query(
      `SELECT p.lab_id, (SELECT id FROM app_user WHERE email = 'analyst@calder.test') AS analyst_id,
              (SELECT order_id FROM sample WHERE code = 'OP-7K3M-Q9') AS order_id
       FROM product p WHERE p.name = 'Ridgeline Red (demo)'`,
    );

    const { signAccessToken } = await import('../../apps/api/src/modules/auth/access-token');
    const env = { DATABASE_NAME: db.name, OUTBOX_WORKER: 'false', LOG_LEVEL: 'warn' };
    const api = await startBuiltProcess('main.js', 'bench-availability-api', env, { probe: true });
    apis.push(api);
    const base = api.base;
    // The same API as it runs behind a proxy that names each client in X-Forwarded-For.
    const proxiedApi = await startBuiltProcess('main.js', 'bench-availability-api-behind-proxy', { ...env, TRUST_PROXY: 'loopback' }, { probe: true });
    apis.push(proxiedApi);
    const analyst = { Authorization: `Bearer ${signAccessToken(ctx.analyst_id)}` };
    const bench = await (await fetch(`${base}/lab/bench`, { headers: analyst })).json();

    // The load and the timing probes run in a client process of their own.
    const client = fork(join(__dirname, 'support', 'availability-client.ts'), { stdio: 'inherit' });
    const inClient = (phase: ClientPhase) =>
      new Promise<ClientResult>((resolve, reject) => {
        client.once('message', (m: ClientResult | { error: string }) => ('error' in m ? reject(new Error(m.error)) : resolve(m)));
        client.send(phase);
      });
    /** Runs one phase in the client while the API process under load watches its event loop, memory, CPU pool queue and database pool. */
    const probe = async (name: string, load: ClientPhase['load'], facts: Record<string, unknown> = {}, target: BuiltProcess = api) => {
      await target.phaseStart();
      const loadBefore = loadavg()[0];
      // the probes ask the process under load
      const answer = await inClient({ base: target.base, analyst, load });
      const f = await target.phaseEnd();
      const { health, list, loadMs, extra } = answer;
      const worst = Math.max(p99(health) ?? 0, p99(list) ?? 0);
      line({
        bench: name,
        loadMs: round(loadMs),
        ...facts,
        ...extra,
        healthP99Ms: p99(health),
        healthMaxMs: max(health),
        samplesListP99Ms: p99(list),
        samplesListMaxMs: max(list),
        probes: health.length,
        eventLoopDelayP99Ms: round(f.eventLoopDelayP99Ms),
        eventLoopStallMaxMs: round(f.eventLoopStallMaxMs),
        rssPeakMb: mb(f.rssPeakBytes),
        heapUsedPeakMb: mb(f.heapUsedPeakBytes),
        externalPeakMb: mb(f.externalPeakBytes),
        cpuQueuePeak: f.cpuQueuePeak,
        dbPoolWaitingPeak: f.dbPoolWaitingPeak,
        apiCpuSeconds: round(f.cpuSeconds),
        loadAverage1mAtStartAndEnd: [round(loadBefore), round(loadavg()[0])],
        budgetP99Ms: 250,
        budgetRssMb: 512,
        withinBudget: worst <= 250 && mb(f.rssPeakBytes) < 512,
        cpuWorkers: f.cpuWorkers,
      });
    };

    const floodOf = (target: string, body: 'random-email' | { email: string; password: string }, spreadAddresses = false): ClientPhase['load'] => ({ kind: 'flood', target, seconds: FLOOD_SECONDS, connections: CONNECTIONS, body, spreadAddresses });

    await dataSource.query(`DELETE FROM rate_limit_window`);
    await probe('availability-sign-in-flood-one-address', floodOf(base, 'random-email'));
    await dataSource.query(`DELETE FROM rate_limit_window`);
    await probe('availability-sign-in-flood-spread-over-addresses', floodOf(proxiedApi.base, 'random-email', true), {}, proxiedApi);
    await dataSource.query(`DELETE FROM rate_limit_window`);
    // Correct passwords are never refused by the failure limits: every request is a real bcrypt check.
    await probe('availability-sign-in-flood-correct-passwords', floodOf(base, { email: 'analyst@calder.test', password: BENCH_PASSWORD }));
    await dataSource.query(`DELETE FROM rate_limit_window`);

    const { MEASUREMENT_LIMITS } = await import('../../apps/api/src/modules/measurements/upload-measurements');
    const { newSampleCode } = await import('../../apps/api/src/modules/samples/sample-code');
    const largest = (() => {
      const rows = ["Frequency (Hz);Z' (Ω);Z'' (Ω)"];
      for (let i = 0; i < MEASUREMENT_LIMITS.pointsPerFile; i++) {
        const f = 10 * Math.pow(1e5, i / (MEASUREMENT_LIMITS.pointsPerFile - 1));
        rows.push(`${f.toPrecision(8)};${(100 + 50 / (1 + f / 1000)).toFixed(4)};${(-30 / (1 + f / 1000)).toFixed(4)}`);
      }
      return rows.join('\n');
    })();
    const newSamples = async (n: number): Promise<string[]> => {
      const ids: string[] = [];
      for (let i = 0; i < n; i++) {
        const [s] = await dataSource.query(
          `INSERT INTO sample (lab_id, order_id, code, state, obtained_where, obtained_on, received_at) VALUES ($1, $2, $3, 'accepted', 'Bench (invented)', '2026-11-30', now()) RETURNING id`,
          [ctx.lab_id, ctx.order_id, newSampleCode()],
        );
        ids.push(s.id);
      }
      return ids;
    };
    const uploadsOf = (sampleIds: string[]): ClientPhase['load'] => ({ kind: 'uploads', sampleIds, instrumentId: bench.instruments[0].id, cellId: bench.cells[0].id, files: MEASUREMENT_LIMITS.files, fileText: largest });
    const uploadFacts = { files: MEASUREMENT_LIMITS.files, pointsPerFile: MEASUREMENT_LIMITS.pointsPerFile, uploadMb: round((largest.length * MEASUREMENT_LIMITS.files) / 1048576) };
    await probe('availability-maximal-upload', uploadsOf(await newSamples(1)), uploadFacts);
    await probe('availability-three-maximal-uploads-at-once', uploadsOf(await newSamples(3)), uploadFacts);
    client.kill();
    const wholeRun = await Promise.all(apis.map(async (a) => { await a.phaseStart(); return (await a.phaseEnd()).wholeRunRssPeakBytes; }));
    line({ bench: 'availability-api-rss-peak', rssPeakMb: mb(Math.max(...wholeRun)), budgetRssMb: 512, withinBudget: mb(Math.max(...wholeRun)) < 512, note: 'the built API process (dist/, as npm start runs it, its worker threads included), peak over every phase above; the proxied instance took only the spread sign-in flood' });
  } finally {
    await Promise.all(apis.map((a) => a.stop()));
    await dataSource.destroy();
    await db.drop();
  }
}

main().catch((err) => {
  console.error(err);
  process.exitCode = 1;
});
