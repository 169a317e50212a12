/**
 * Availability figures, printed as JSON lines (`npm run bench`): how /api/health and the samples
 * list answer (p99, budget 250 ms) while the API is abused within its limits —
 *   - a sign-in flood with a new random e-mail per request, 6 connections from one address;
 *   - the same flood spread over many addresses, as a proxy's X-Forwarded-For shows them when
 *     TRUST_PROXY is on (a second app instance with the setting, on its own port);
 *   - the largest measurement upload the limits allow (20 files × the most points per file);
 * with the event loop's delay (p99) and longest stall (perf_hooks monitorEventLoopDelay), the
 * process's peak resident memory (budget 512 MB; the API runs in this process), the worker pool's
 * and the database pool's longest queues and the load average. The load and the probes run in a
 * client process of their own (support/availability-client.ts), so the API's event loop is its own. Runs against a freshly migrated
 * database of its own, seeded with the invented demo, and drops it afterwards. Figures, not
 * pass/fail: the budgets are printed beside them.
 */
import { fork } from 'node:child_process';
import type { AddressInfo } from 'node:net';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import type { ClientPhase, ClientResult } from './support/availability-client';
import { BENCH_PASSWORD, demoBenchDatabase } from './support/demo-database';
import { line, mb, percentile, round } from './support/figures';

process.env.LOG_LEVEL = 'silent';
process.env.OUTBOX_WORKER = 'false';

const FLOOD_SECONDS = 10;
const CONNECTIONS = 6;
const p99 = (v: number[]) => (v.length ? round(percentile(v, 0.99)) : null);
const max = (v: number[]) => (v.length ? round(Math.max(...v)) : null);

/** The process's resident memory, sampled every 50 ms: the peak over the whole run and over each phase. */
let rssPeak = 0;
let phasePeak = 0;
/** Of the peak, how much is the JavaScript heap and how much buffers outside it (each sampled at its own peak). */
let heapPeak = 0;
let externalPeak = 0;
const rssTimer = setInterval(() => {
  const m = process.memoryUsage();
  rssPeak = Math.max(rssPeak, m.rss);
  phasePeak = Math.max(phasePeak, m.rss);
  heapPeak = Math.max(heapPeak, m.heapUsed);
  externalPeak = Math.max(externalPeak, m.external);
}, 50);
rssTimer.unref();

async function main(): Promise<void> {
  // Migrated and seeded in a child process: this process holds the API alone (its memory is the figure).
  const db = await demoBenchDatabase('ohmprint_bench_avail');
  const { dataSource } = await import('../../apps/api/src/db/data-source');
  dataSource.setOptions({ database: db.name, poolSize: 8 });
  await dataSource.initialize();
  const servers: import('node:http').Server[] = [];
  try {
    const [ctx] = await dataSource.query(
      `SELECT p.lab_id, (SELECT id FROM app_user WHERE email = 'analyst@calder.test') AS analyst_id,
              (SELECT order_id FROM sample WHERE code = 'OP-7K3M-Q9') AS order_id
       FROM product p WHERE p.name = 'Ridgeline Red (demo)'`,
    );

    const { createApp } = await import('../../apps/api/src/app');
    const { config } = await import('../../apps/api/src/config');
    const { signAccessToken } = await import('../../apps/api/src/modules/auth/access-token');
    const { cpuWorkerCount, closeCpuPool } = await import('../../apps/api/src/core/cpu-pool/cpu-pool');
    const listen = async () => {
      const server = createApp().listen(0, '127.0.0.1');
      servers.push(server);
      await new Promise((r) => server.once('listening', r));
      return `http://127.0.0.1:${(server.address() as AddressInfo).port}/api`;
    };
    const base = await listen();
    // The same API as it runs behind a proxy that names each client in X-Forwarded-For.
    (config as { trustProxy: unknown }).trustProxy = 'loopback';
    const proxied = await listen();
    const analyst = { Authorization: `Bearer ${signAccessToken(ctx.analyst_id)}` };
    const bench = await (await fetch(`${base}/lab/bench`, { headers: analyst })).json();

    const { cpuPoolLoad } = await import('../../apps/api/src/core/cpu-pool/cpu-pool');
    // The load and the probes run in a client process of their own; this process is the API alone.
    const client = fork(join(__dirname, 'support', 'availability-client.ts'), { stdio: 'inherit' });
    const inClient = (phase: ClientPhase) =>
      new Promise<ClientResult>((resolve, reject) => {
        client.once('message', (m: ClientResult | { error: string }) => ('error' in m ? reject(new Error(m.error)) : resolve(m)));
        client.send(phase);
      });
    /** The database pool's waiting requests (pg's Pool), for the figures: starvation shows here. */
    const dbPool = () => (dataSource.driver as unknown as { master: { waitingCount: number; totalCount: number } }).master;

    /** Runs one phase in the client while this process watches its event loop, memory, CPU pool queue and database pool. */
    const probe = async (name: string, load: ClientPhase['load'], facts: Record<string, unknown> = {}) => {
      phasePeak = process.memoryUsage().rss;
      heapPeak = 0;
      externalPeak = 0;
      const loop = monitorEventLoopDelay({ resolution: 10 });
      loop.enable();
      let cpuQueuePeak = 0;
      let dbWaitingPeak = 0;
      const watch = setInterval(() => {
        cpuQueuePeak = Math.max(cpuQueuePeak, cpuPoolLoad().queued);
        dbWaitingPeak = Math.max(dbWaitingPeak, dbPool().waitingCount);
      }, 10);
      const cpuBefore = process.cpuUsage();
      const loadBefore = loadavg()[0];
      const answer = await inClient({ base, analyst, load }).finally(() => {
        clearInterval(watch);
        loop.disable();
      });
      const { health, list, loadMs, extra } = answer;
      const cpu = process.cpuUsage(cpuBefore);
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
        eventLoopDelayP99Ms: round(loop.percentile(99) / 1e6),
        eventLoopStallMaxMs: round(loop.max / 1e6),
        rssPeakMb: mb(phasePeak),
        heapUsedPeakMb: mb(heapPeak),
        externalPeakMb: mb(externalPeak),
        cpuQueuePeak,
        dbPoolWaitingPeak: dbWaitingPeak,
        apiCpuSeconds: round((cpu.user + cpu.system) / 1e6),
        loadAverage1mAtStartAndEnd: [round(loadBefore), round(loadavg()[0])],
        budgetP99Ms: 250,
        budgetRssMb: 512,
        withinBudget: worst <= 250 && mb(phasePeak) < 512,
        cpuWorkers: cpuWorkerCount(),
      });
    };

    const floodOf = (target: string, body: 'random-email' | { email: string; password: string }, spreadAddresses = false): ClientPhase['load'] => ({ kind: 'flood', target, seconds: FLOOD_SECONDS, connections: CONNECTIONS, body, spreadAddresses });

    await dataSource.query(`DELETE FROM rate_limit_window`);
    await probe('availability-sign-in-flood-one-address', floodOf(base, 'random-email'));
    await dataSource.query(`DELETE FROM rate_limit_window`);
    await probe('availability-sign-in-flood-spread-over-addresses', floodOf(proxied, 'random-email', true));
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
    line({ bench: 'availability-api-rss-peak', rssPeakMb: mb(rssPeak), budgetRssMb: 512, withinBudget: mb(rssPeak) < 512, note: 'the API runs in the bench process (migrations and seeding ran in a child process); peak over every phase above' });
    await closeCpuPool();
  } finally {
    await Promise.all(servers.map((s) => new Promise((r) => s.close(r))));
    await dataSource.destroy();
    await db.drop();
  }
}

main().catch((err) => {
  console.error(err);
  process.exitCode = 1;
});
