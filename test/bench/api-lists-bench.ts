/**
 * List routes at 100× the demo (`npm run bench`): a fresh database seeded by `seed100x` (60,000
 * samples and the rows that follow them), then for every list route of both portals the first
 * page, a deep page (page 2,000 or the last one, whichever comes first), a search matching many
 * rows and one matching few. Each figure is one JSON line with p50/p95 over RUNS requests through
 * HTTP; sign-in is done once per user. Budget: p50 under 50 ms for any page and any search.
 *
 * `LISTS_BENCH_DATABASE=<name>` keeps the database afterwards (created, migrated and seeded the first
 * time, reused as it is after that), so plans can be read with EXPLAIN beside the figures.
 */
import type { AddressInfo } from 'node:net';
import { performance } from 'node:perf_hooks';
import { BENCH_PASSWORD } from './support/demo-database';
import { line, round, stats } from './support/figures';

process.env.LOG_LEVEL = 'silent';
process.env.OUTBOX_WORKER = 'false';

const RUNS = Number(process.env.LISTS_BENCH_RUNS ?? 15);
const BUDGET_P50_MS = 50;


type Who = 'labAdmin' | 'analyst' | 'reviewer' | 'clientAdmin';

interface ListRoute {
  path: string;
  who: Who;
  /** rows the unfiltered list holds, for the deep page (SQL with $1 = lab id, $2 = the big client's id, $3 = the client admin's id) */
  rows: string;
  many?: string;
  /** a search matching a few hundred rows: more than a page, fewer than the search's count cap */
  some?: string;
  few?: string;
  extra?: string;
}

async function main(): Promise<void> {
  const { withMaintenanceConnection, quoteIdent, dropDatabase } = await import('../../apps/api/src/testing/maintenance-db');
  const reuse = process.env.LISTS_BENCH_DATABASE;
  const database = reuse ?? `ohmprint_lists_bench_${process.pid}`;
  const exists = reuse
    ? (await withMaintenanceConnection((c) => c.query(`SELECT 1 FROM pg_database WHERE datname = $1`, [reuse]))).rowCount === 1
    : false;
  if (!exists) await withMaintenanceConnection((c) => c.query(`CREATE DATABASE ${quoteIdent(database)}`));
  const { dataSource } = await import('../../apps/api/src/db/data-source');
  dataSource.setOptions({ database, poolSize: 4 });
  await dataSource.initialize();
  let server: import('node:http').Server | undefined;
  try {
    const { hashPassword } = await import('../../apps/api/src/modules/auth/passwords');
    const { seed100x } = await import('./seed-100x');
    const password = BENCH_PASSWORD;
    const passwordHash = await hashPassword(password);
    if (!exists) await dataSource.runMigrations({ transaction: 'each' });
    const t0 = performance.now();
    const tenant = await dataSource.transaction((m) => seed100x(m, { passwordHash }));
    await dataSource.query(`UPDATE app_user SET password_hash = $1 WHERE lab_id = $2`, [passwordHash, tenant.labId]);
    line({ bench: 'seed-100x', samples: tenant.samples, seconds: round((performance.now() - t0) / 1000) });
    // A lab's tables are vacuumed by autovacuum within a minute of a bulk write; the bench measures
    // that steady state (index-only scans need the visibility map), not the minute after seeding.
    const t1 = performance.now();
    await dataSource.query('VACUUM (ANALYZE)');
    line({ bench: 'vacuum-analyze', seconds: round((performance.now() - t1) / 1000) });

    const { createApp } = await import('../../apps/api/src/app');
    server = createApp().listen(0, '127.0.0.1');
    await new Promise((r) => server!.once('listening', r));
    const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api`;
    const auth = {} as Record<Who, Record<string, string>>;
    for (const who of ['labAdmin', 'analyst', 'reviewer', 'clientAdmin'] as Who[]) {
      const res = await fetch(`${base}/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: tenant.emails[who], password }) });
      const body = (await res.json()) as { accessToken?: string };
      if (!res.ok || !body.accessToken) throw new Error(`sign-in of ${who} answered ${res.status}: ${JSON.stringify(body)}`);
      auth[who] = { Authorization: `Bearer ${body.accessToken}` };
    }
    const [few] = await dataSource.query(
      `SELECT (SELECT code FROM sample WHERE lab_id = $1 ORDER BY code OFFSET 1234 LIMIT 1) AS code,
              (SELECT number FROM test_report WHERE lab_id = $1 ORDER BY number OFFSET 1234 LIMIT 1) AS report`,
      [tenant.labId],
    );
    const routes: ListRoute[] = [
      { path: '/lab/samples', who: 'analyst', rows: `SELECT count(*) FROM sample WHERE lab_id = $1`, many: 'demo', some: 'Tonic 5 (demo)', few: few.code },
      { path: '/lab/samples', who: 'analyst', extra: 'state=received,in-review&sort=age', rows: `SELECT count(*) FROM sample WHERE lab_id = $1 AND state IN ('received','in-review')`, many: 'demo', few: few.code },
      { path: '/lab/analyses', who: 'analyst', rows: `SELECT count(*) FROM analysis WHERE lab_id = $1`, many: 'demo', few: few.code },
      { path: '/lab/analyses', who: 'reviewer', extra: 'status=submitted', rows: `SELECT count(*) FROM analysis WHERE lab_id = $1 AND status = 'submitted'`, many: 'demo', few: few.code },
      { path: '/lab/reports', who: 'reviewer', rows: `SELECT count(*) FROM test_report WHERE lab_id = $1`, many: 'demo', few: few.report },
      { path: '/lab/audit-events', who: 'labAdmin', rows: `SELECT count(*) FROM audit_event WHERE lab_id = $1`, many: 'sample', few: 'order.plac' },
      { path: '/lab/payments', who: 'labAdmin', rows: `SELECT count(*) FROM payment WHERE lab_id = $1`, many: 'demo', few: 'cs_demo_zz_123' },
      { path: '/lab/credit-accounts', who: 'labAdmin', rows: `SELECT count(*) FROM client_organisation WHERE lab_id = $1`, many: 'demo', few: 'Kestrel' },
      { path: '/lab/libraries', who: 'analyst', rows: `SELECT count(*) FROM reference_library WHERE lab_id = $1`, many: 'demo', few: 'Ridge' },
      { path: '/lab/staff', who: 'labAdmin', rows: `SELECT count(*) FROM app_user WHERE lab_id = $1 AND id NOT IN (SELECT user_id FROM client_membership)`, many: 'staff', few: 'staff17@' },
      { path: '/lab/client-organisations', who: 'labAdmin', rows: `SELECT count(*) FROM client_organisation WHERE lab_id = $1`, many: 'demo', few: 'Kestrel' },
      { path: '/client/orders', who: 'clientAdmin', rows: `SELECT count(*) FROM test_order WHERE lab_id = $1 AND client_organisation_id = $2`, many: 'demo', few: few.code },
      { path: '/client/reports', who: 'clientAdmin', rows: `SELECT count(*) FROM test_report WHERE lab_id = $1 AND client_organisation_id = $2`, many: 'demo', few: few.report },
      { path: '/client/notifications', who: 'clientAdmin', rows: `SELECT count(*) FROM client_notification WHERE lab_id = $1 AND user_id = $3` },
      { path: '/client/ledger', who: 'clientAdmin', rows: `SELECT count(*) FROM credit_ledger_entry WHERE lab_id = $1 AND client_organisation_id = $2`, many: 'Reserved', few: few.code },
      { path: '/client/payments', who: 'clientAdmin', rows: `SELECT count(*) FROM payment WHERE lab_id = $1 AND client_organisation_id = $2`, many: 'demo', few: 'cs_demo_zz_123' },
      { path: '/client/products', who: 'clientAdmin', rows: `SELECT count(*) FROM product WHERE lab_id = $1 AND client_organisation_id = $2`, many: 'demo', few: 'Ridge' },
      { path: '/client/team', who: 'clientAdmin', rows: `SELECT count(*) FROM client_membership WHERE lab_id = $1 AND client_organisation_id = $2`, few: 'client@' },
      { path: '/lab/library-products', who: 'analyst', rows: `SELECT count(*) FROM product WHERE lab_id = $1`, many: 'demo', few: 'Ridge' },
    ];
    const call = async (url: string, who: Who) => {
      const res = await fetch(url, { headers: auth[who] });
      const json = (await res.json()) as { items?: unknown[]; total?: number; totalIsLowerBound?: boolean };
      if (!res.ok) throw new Error(`GET ${url} answered ${res.status}: ${JSON.stringify(json)}`);
      return json;
    };
    let worst = 0;
    for (const route of routes) {
      const [{ count }] = await dataSource.query(route.rows.replace(/\$2/g, `'${tenant.bigClientId}'`).replace(/\$3/g, `'${tenant.users.clientAdmin}'`), [tenant.labId]);
      const deepPage = Math.max(1, Math.min(2000, Math.ceil(Number(count) / 20)));
      const cases: [string, string][] = [['first page', 'page=1'], [`page ${deepPage}`, `page=${deepPage}`]];
      if (route.many) cases.push(['search, many', `q=${encodeURIComponent(route.many)}`]);
      if (route.some) cases.push(['search, some', `q=${encodeURIComponent(route.some)}`]);
      if (route.few) cases.push(['search, few', `q=${encodeURIComponent(route.few)}`]);
      for (const [label, query] of cases) {
        const url = `${base}${route.path}?pageSize=20&${route.extra ? `${route.extra}&` : ''}${query}`;
        const first = await call(url, route.who); // warm
        const ms: number[] = [];
        for (let i = 0; i < RUNS; i++) {
          const t = performance.now();
          await call(url, route.who);
          ms.push(performance.now() - t);
        }
        const s = stats(ms);
        worst = Math.max(worst, s.p50Ms);
        line({
          bench: 'list', route: `GET /api${route.path}${route.extra ? `?${route.extra}` : ''}`, case: label, rows: Number(count),
          items: first.items?.length ?? 0, total: first.totalIsLowerBound ? `${first.total}+` : first.total, ...s,
          budgetP50Ms: BUDGET_P50_MS,
        });
      }
    }
    line({ bench: 'lists-worst-p50', ms: worst, budgetP50Ms: BUDGET_P50_MS });
  } finally {
    await new Promise<void>((r) => (server ? server.close(() => r()) : r()));
    await dataSource.destroy();
    await (await import('../../apps/api/src/core/cpu-pool/cpu-pool')).closeCpuPool();
    if (!reuse) await withMaintenanceConnection((c) => dropDatabase(c, database));
  }
}

main().catch((err) => {
  console.error(err);
  process.exitCode = 1;
});
