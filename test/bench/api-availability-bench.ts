/**
 * Availability figures, printed as JSON lines (`npm run bench`): how /api/health and the samples
 * list answer (p99, budget 250 ms) while the API is abused within its limits —
 *   - a sign-in flood with a new random e-mail per request, 6 connections from one address;
 *   - the same flood spread over many addresses, as a proxy's X-Forwarded-For shows them when
 *     TRUST_PROXY is on (a second app instance with the setting, on its own port);
 *   - the largest measurement upload the limits allow (20 files × the most points per file);
 * with the event loop's longest stall (perf_hooks monitorEventLoopDelay) and the process's peak
 * resident memory (budget 512 MB; the API runs in this process). Runs against a freshly migrated
 * database of its own, seeded with the invented demo, and drops it afterwards. Figures, not
 * pass/fail: the budgets are printed beside them.
 */
import type { AddressInfo } from 'node:net';
import { monitorEventLoopDelay, performance } from 'node:perf_hooks';
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
const rssTimer = setInterval(() => {
  const rss = process.memoryUsage().rss;
  rssPeak = Math.max(rssPeak, rss);
  phasePeak = Math.max(phasePeak, rss);
}, 50);
rssTimer.unref();

async function main(): Promise<void> {
  const { withMaintenanceConnection, quoteIdent } = await import('../../apps/api/src/testing/maintenance-db');
  const database = `ohmprint_bench_avail_${process.pid}`;
  await withMaintenanceConnection((c) => c.query(`CREATE DATABASE ${quoteIdent(database)}`));
  const { dataSource } = await import('../../apps/api/src/db/data-source');
  dataSource.setOptions({ database, poolSize: 8 });
  await dataSource.initialize();
  const servers: import('node:http').Server[] = [];
  try {
    await dataSource.runMigrations({ transaction: 'each' });
    const { hashPassword } = await import('../../apps/api/src/modules/auth/passwords');
    const { seedAccounts } = await import('../../docker-free-scripts/seed/accounts');
    const { seedLabDemo } = await import('../../docker-free-scripts/seed/lab-demo');
    await dataSource.transaction(async (m) => seedAccounts(m, await hashPassword('bench-password-not-secret')));
    await dataSource.transaction((m) => seedLabDemo(m));
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

    /** Probes /api/health and the samples list while `load` runs, with the loop's delay and the memory peak. */
    const probe = async (name: string, load: () => Promise<Record<string, unknown>>) => {
      const health: number[] = [];
      const list: number[] = [];
      let running = true;
      phasePeak = process.memoryUsage().rss;
      const loop = monitorEventLoopDelay({ resolution: 10 });
      loop.enable();
      const prober = (async () => {
        while (running) {
          let t = performance.now();
          await fetch(`${base}/health`).then((r) => r.arrayBuffer());
          health.push(performance.now() - t);
          t = performance.now();
          await fetch(`${base}/lab/samples?pageSize=25`, { headers: analyst }).then((r) => r.arrayBuffer());
          list.push(performance.now() - t);
          await new Promise((r) => setTimeout(r, 20));
        }
      })();
      const start = performance.now();
      const extra = await load();
      const ms = performance.now() - start;
      running = false;
      await prober;
      loop.disable();
      const worst = Math.max(p99(health) ?? 0, p99(list) ?? 0);
      line({
        bench: name,
        loadMs: round(ms),
        ...extra,
        healthP99Ms: p99(health),
        healthMaxMs: max(health),
        samplesListP99Ms: p99(list),
        samplesListMaxMs: max(list),
        probes: health.length,
        eventLoopDelayP99Ms: round(loop.percentile(99) / 1e6),
        eventLoopStallMaxMs: round(loop.max / 1e6),
        rssPeakMb: mb(phasePeak),
        budgetP99Ms: 250,
        budgetRssMb: 512,
        withinBudget: worst <= 250 && mb(phasePeak) < 512,
        cpuWorkers: cpuWorkerCount(),
      });
    };

    const flood = async (target: string, body: () => object, headers: () => Record<string, string> = () => ({})) => {
      const statuses: Record<string, number> = {};
      const until = performance.now() + FLOOD_SECONDS * 1000;
      await Promise.all(
        Array.from({ length: CONNECTIONS }, async () => {
          while (performance.now() < until) {
            const res = await fetch(`${target}/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json', ...headers() }, body: JSON.stringify(body()) });
            await res.arrayBuffer();
            statuses[res.status] = (statuses[res.status] ?? 0) + 1;
          }
        }),
      );
      return { connections: CONNECTIONS, seconds: FLOOD_SECONDS, statuses };
    };
    const randomEmail = () => ({ email: `nobody-${Math.random().toString(36).slice(2)}@flood.test`, password: 'guess-guess-guess' });
    const randomAddress = () => `198.51.100.${1 + Math.floor(Math.random() * 254)}, 203.0.113.${1 + Math.floor(Math.random() * 254)}`;

    await dataSource.query(`DELETE FROM rate_limit_window`);
    await probe('availability-sign-in-flood-one-address', () => flood(base, randomEmail));
    await dataSource.query(`DELETE FROM rate_limit_window`);
    await probe('availability-sign-in-flood-spread-over-addresses', () => flood(proxied, randomEmail, () => ({ 'x-forwarded-for': randomAddress() })));
    await dataSource.query(`DELETE FROM rate_limit_window`);
    // Correct passwords are never refused by the failure limits: every request is a real bcrypt check.
    await probe('availability-sign-in-flood-correct-passwords', () => flood(base, () => ({ email: 'analyst@calder.test', password: 'bench-password-not-secret' })));
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
    const maximalUpload = async () => {
      const [s] = await dataSource.query(
        `INSERT INTO sample (lab_id, order_id, code, state, obtained_where, obtained_on, received_at) VALUES ($1, $2, $3, 'accepted', 'Bench (invented)', '2026-11-30', now()) RETURNING id`,
        [ctx.lab_id, ctx.order_id, newSampleCode()],
      );
      const form = new FormData();
      form.set('instrumentId', bench.instruments[0].id);
      form.set('cellId', bench.cells[0].id);
      form.set('temperatureC', '22');
      for (let i = 0; i < MEASUREMENT_LIMITS.files; i++) form.append('files', new Blob([largest]), `largest-${i}.csv`);
      const res = await fetch(`${base}/lab/samples/${s.id}/measurements`, { method: 'POST', headers: analyst, body: form });
      const body = (await res.json()) as { saved?: unknown[] };
      return { status: res.status, saved: body.saved?.length ?? 0 };
    };
    const uploadFacts = { files: MEASUREMENT_LIMITS.files, pointsPerFile: MEASUREMENT_LIMITS.pointsPerFile, uploadMb: round((largest.length * MEASUREMENT_LIMITS.files) / 1048576) };
    await probe('availability-maximal-upload', async () => ({ ...uploadFacts, ...(await maximalUpload()) }));
    await probe('availability-three-maximal-uploads-at-once', async () => {
      const answers = await Promise.all([maximalUpload(), maximalUpload(), maximalUpload()]);
      return { ...uploadFacts, uploads: 3, statuses: answers.map((a) => a.status) };
    });
    line({ bench: 'availability-api-rss-peak', rssPeakMb: mb(rssPeak), budgetRssMb: 512, withinBudget: mb(rssPeak) < 512, note: 'the API runs in the bench process; peak over every phase above' });
    await closeCpuPool();
  } finally {
    await Promise.all(servers.map((s) => new Promise((r) => s.close(r))));
    await dataSource.destroy();
    await withMaintenanceConnection((c) => c.query(`DROP DATABASE IF EXISTS ${quoteIdent(database)}`));
  }
}

main().catch((err) => {
  console.error(err);
  process.exitCode = 1;
});
