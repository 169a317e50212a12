// Two API processes and two workers (the built dist, as `npm start` runs them) against one
// database: the lab loop through HTTP, with concurrent approvals spread over both APIs, then a
// worker killed in the middle of an issuance. Nothing may be issued, e-mailed or charged twice,
// and nothing may be lost.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, openSync } from 'node:fs';
import { createServer, type AddressInfo } from 'node:net';
import { join } from 'node:path';
import { Client } from 'pg';
import { demoFiles } from '../../../../../docker-free-scripts/seed/lab-demo-files';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { dataSource } from '../../db/data-source';
import { signAccessToken } from '../../modules/auth/access-token';
import { addCredits } from '../../modules/credits/credit-ledger';
import { clearMailbox, readMailbox } from '../../testing/mailbox';
import { createTestDatabase, dropTestDatabase } from '../../testing/test-database';

jest.setTimeout(600_000);

const ROOT = join(__dirname, '..', '..', '..', '..', '..');
const DIST = join(ROOT, 'dist', 'api', 'apps', 'api', 'src');
const SAMPLES = 4;
const children: ChildProcess[] = [];
let databaseName = '';
let apis: string[] = [];
/** Worker processes by the name their database sessions carry (`application_name`). */
const workers = new Map<string, ChildProcess>();

async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const { port } = server.address() as AddressInfo;
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}

function start(name: string, script: string, env: NodeJS.ProcessEnv): ChildProcess {
  mkdirSync(join(ROOT, '.data', 'logs'), { recursive: true });
  const out = openSync(join(ROOT, '.data', 'logs', `multi-process-${name}.log`), 'w');
  const child = spawn(process.execPath, [join(DIST, script)], { env, stdio: ['ignore', out, out] });
  children.push(child);
  return child;
}

async function until<T>(probe: () => Promise<T | undefined | null | false>, ms: number, what: string): Promise<T> {
  const deadline = Date.now() + ms;
  for (;;) {
    const value = await probe().catch(() => undefined);
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`${what} did not happen within ${ms} ms`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

const userId = async (email: string) => (await dataSource.query('SELECT id FROM app_user WHERE email = $1', [email]))[0].id as string;
const auth = async (email: string) => ({ authorization: `Bearer ${signAccessToken(await userId(email))}` });

/** A JSON (or multipart) call to API number `i % 2`; throws on an unexpected status. */
async function call<T>(i: number, email: string, method: string, path: string, body?: unknown, expected = [200, 201, 202]): Promise<T> {
  const multipart = body instanceof FormData;
  const res = await fetch(`${apis[i % apis.length]}${path}`, {
    method,
    headers: { ...(await auth(email)), ...(body && !multipart ? { 'content-type': 'application/json' } : {}) },
    body: body === undefined ? undefined : multipart ? body : JSON.stringify(body),
  });
  const text = await res.text();
  if (!expected.includes(res.status)) throw new Error(`${method} ${path} on API ${i % apis.length} answered ${res.status}: ${text}`);
  return (text ? JSON.parse(text) : undefined) as T;
}


const CLIENT_ADMIN = 'admin@hollinridge.test';

/**
 * The client orders `count` checks of Ridgeline Red (one credit each), and the lab takes each
 * through intake, measurement, analysis and submission, alternating between the two APIs.
 */
async function submittedChecks(count: number): Promise<{ order: { id: string; samples: Array<{ id: string; code: string }> }; analysisIds: string[] }> {
  const [{ id: ridgeline }] = await dataSource.query(`SELECT id FROM product WHERE name = 'Ridgeline Red (demo)'`);
  const sample = (i: number) => ({ obtainedWhere: `Shop ${i} (invented)`, obtainedOn: '2026-11-20', labelText: 'Ridgeline Red 2023, 750 mL', lotClaimed: 'L24-140', notes: '' });
  const order = await call<{ id: string; samples: Array<{ id: string; code: string }> }>(0, CLIENT_ADMIN, 'POST', '/api/client/orders', { productId: ridgeline, samples: Array.from({ length: count }, (_, i) => sample(i)) });
  expect(order.samples).toHaveLength(count);
  const arrival = { carrier: 'Invented Courier Co.', trackingNumber: 'INV-MP', arrivedAt: new Date(Date.now() - 60_000).toISOString(), temperatureC: 7, sealIntact: true, containerCondition: 'intact', volumeMl: 750 };
  const bench = await call<{ instruments: { id: string }[]; cells: { id: string }[] }>(0, 'analyst@calder.test', 'GET', '/api/lab/bench');
  const [{ version_id: versionId }] = await dataSource.query(`SELECT v.id AS version_id FROM reference_library l JOIN library_version v ON v.library_id = l.id AND v.status = 'published' WHERE l.product_id = $1`, [ridgeline]);
  const files = demoFiles().filter((f) => f.sampleCode === 'OP-7K3M-Q9');
  const analysisIds: string[] = [];
  for (const [i, s] of order.samples.entries()) {
    await call(i, 'intake@calder.test', 'POST', `/api/lab/samples/${s.id}/arrival`, arrival);
    await call(i + 1, 'intake@calder.test', 'POST', `/api/lab/samples/${s.id}/accept`, { storageLocation: 'Cold room 1' });
    const form = new FormData();
    form.append('instrumentId', bench.instruments[0].id);
    form.append('cellId', bench.cells[0].id);
    form.append('temperatureC', String(files[0].temperatureC));
    for (const f of files) form.append('files', new Blob([f.text.replaceAll('OP-7K3M-Q9', s.code)]), f.fileName.replace('OP-7K3M-Q9', s.code));
    await call(i, 'analyst@calder.test', 'POST', `/api/lab/samples/${s.id}/measurements`, form);
    const analysis = await call<{ id: string }>(i + 1, 'analyst@calder.test', 'POST', `/api/lab/samples/${s.id}/analyses`, { libraryVersionId: versionId });
    await call(i, 'analyst@calder.test', 'POST', `/api/lab/analyses/${analysis.id}/submit`);
    analysisIds.push(analysis.id);
  }
  return { order, analysisIds };
}

/** The report's issuance as the review screen sees it, once it is issued (or a failure). */
async function issuedReport(i: number, analysisId: string): Promise<{ id: string; number: string }> {
  return until(async () => {
    const s = await call<{ state: string; report: { id: string; number: string } | null }>(i, 'reviewer@calder.test', 'GET', `/api/lab/analyses/${analysisId}/issuance`);
    if (s.state === 'failed') throw new Error(`issuance of ${analysisId} failed`);
    return s.state === 'issued' ? s.report : null;
  }, 180_000, `the report of ${analysisId} being issued`);
}

beforeAll(async () => {
  for (const f of ['main.js', 'worker.js']) {
    if (!existsSync(join(DIST, f))) throw new Error(`${join(DIST, f)} is missing: build with \`npm run build:api\` (npm test does).`);
  }
  databaseName = await createTestDatabase();
  dataSource.setOptions({ database: databaseName, poolSize: 4, logging: [] });
  await dataSource.initialize();
  await dataSource.transaction((m) => seedLabDemo(m));
  // a stalled issuance is handed on after 2 s here (30 s by default) so the kill test stays short
  const env = { ...process.env, DATABASE_NAME: databaseName, OUTBOX_WORKER: 'true', OUTBOX_POLL_MS: '500', LOG_LEVEL: 'info', CPU_WORKERS: '1', ISSUANCE_STALLED_AFTER_SECONDS: '2' };
  const ports = [await freePort(), await freePort()];
  apis = ports.map((p) => `http://127.0.0.1:${p}`);
  ports.forEach((port, i) => start(`api-${i + 1}`, 'main.js', { ...env, PORT: String(port), PUBLIC_BASE_URL: apis[0] }));
  // PGAPPNAME names each worker's database sessions, so the test can tell which worker holds an issuance
  [1, 2].forEach((i) => workers.set(`ohmprint-worker-${i}`, start(`worker-${i}`, 'worker.js', { ...env, PUBLIC_BASE_URL: apis[0], PGAPPNAME: `ohmprint-worker-${i}` })));
  for (const api of apis) await until(async () => (await fetch(`${api}/api/health`)).ok, 180_000, `${api} answering /api/health`);
});

afterAll(async () => {
  await Promise.all(
    children.map(
      (c) =>
        new Promise<void>((resolve) => {
          if (c.exitCode !== null || c.signalCode !== null) return resolve();
          c.once('exit', () => resolve());
          c.kill('SIGTERM');
          setTimeout(() => c.kill('SIGKILL'), 15_000).unref();
        }),
    ),
  );
  if (dataSource.isInitialized) await dataSource.destroy();
  if (databaseName) await dropTestDatabase(databaseName);
});

describe('two API processes and two workers on one database', () => {
  it('run the lab loop with concurrent approvals: every report, e-mail and credit movement exactly once', async () => {
    const members: Array<{ email: string }> = await dataSource.query(
      `SELECT u.email FROM client_membership cm JOIN app_user u ON u.id = cm.user_id JOIN client_organisation o ON o.id = cm.client_organisation_id WHERE o.name = 'Hollin Ridge Cellars'`,
    );
    for (const m of members) await clearMailbox(m.email);
    const [scope] = await dataSource.query(`SELECT lab_id AS "labId", id AS "clientOrganisationId" FROM client_organisation WHERE name = 'Hollin Ridge Cellars'`);
    await dataSource.transaction((m) => addCredits(m, scope, SAMPLES, 'adjustment', { reason: 'Test set-up', actorUserId: null }));
    const priceBefore = await call<{ available: number; reserved: number }>(0, CLIENT_ADMIN, 'GET', '/api/client/order-prices');

    const { order, analysisIds } = await submittedChecks(SAMPLES);

    // Four approvals at once, two on each API; each answers at once (202), the workers issue.
    const approvals = await Promise.all(analysisIds.map((id, i) => call<{ state: string }>(i, 'reviewer@calder.test', 'POST', `/api/lab/analyses/${id}/approve`, { comments: 'Agreed.' }, [202])));
    expect(approvals.map((a) => a.state)).toEqual(['issuing', 'issuing', 'issuing', 'issuing']);
    // An approval sent again (a double click, a retry after a lost answer) is refused and queues nothing.
    await call(1, 'reviewer@calder.test', 'POST', `/api/lab/analyses/${analysisIds[0]}/approve`, { comments: 'Again.' }, [409]);
    const issued = await Promise.all(
      analysisIds.map((id, i) =>
        until(async () => {
          const s = await call<{ state: string; report: { id: string; number: string } | null }>(i + 1, 'reviewer@calder.test', 'GET', `/api/lab/analyses/${id}/issuance`);
          if (s.state === 'failed') throw new Error(`issuance of ${id} failed`);
          return s.state === 'issued' ? s.report : null;
        }, 180_000, `the report of ${id} being issued`),
      ),
    );

    // Reports: one per analysis, numbers unique and consecutive, no claim left held.
    const numbers = issued.map((r) => r!.number).sort();
    expect(new Set(numbers).size).toBe(SAMPLES);
    const values = numbers.map((n) => Number(n.slice(-6)));
    expect(values).toEqual(values.map((_, i) => values[0] + i));
    const [counts] = await dataSource.query(
      `SELECT (SELECT count(*)::int FROM test_report WHERE analysis_id = ANY($1::uuid[])) AS reports,
              (SELECT count(*)::int FROM audit_event WHERE action = 'report.issued' AND details->>'analysisId' = ANY($1::text[])) AS audits,
              (SELECT count(*)::int FROM report_number_claim WHERE state = 'held') AS held,
              (SELECT max(last_value)::int FROM report_number_sequence) AS last_number`,
      [analysisIds],
    );
    expect(counts).toEqual({ reports: SAMPLES, audits: SAMPLES, held: 0, last_number: values[values.length - 1] });

    // Credits: four reserved at ordering, each consumed exactly once at issue.
    const ledger: Array<{ kind: string; n: number }> = await dataSource.query(
      `SELECT kind, count(*)::int AS n FROM credit_ledger_entry WHERE order_id = $1 GROUP BY kind ORDER BY kind`, [order.id]);
    expect(ledger).toEqual([{ kind: 'consume', n: SAMPLES }, { kind: 'reserve', n: SAMPLES }]);
    const perSample: Array<{ n: number }> = await dataSource.query(
      `SELECT count(*)::int AS n FROM credit_ledger_entry WHERE order_id = $1 AND kind = 'consume' GROUP BY sample_id`, [order.id]);
    expect(perSample.map((r) => r.n)).toEqual([1, 1, 1, 1]);
    const priceAfter = await call<{ available: number; reserved: number }>(1, CLIENT_ADMIN, 'GET', '/api/client/order-prices');
    expect(priceAfter).toEqual({ ...priceAfter, available: priceBefore.available - SAMPLES, reserved: priceBefore.reserved });

    // E-mail: every "report ready" message sent once to each recipient, under one Message-ID each.
    await until(async () => (await dataSource.query(`SELECT count(*)::int AS n FROM email_outbox WHERE status = 'pending'`))[0].n === 0, 120_000, 'the outbox emptying');
    const outbox: Array<{ to_address: string; subject: string; attempts: number; status: string }> = await dataSource.query(
      `SELECT to_address, subject, attempts, status FROM email_outbox WHERE subject = ANY($1)`, [numbers.map((n) => `Test report ${n} is ready`)]);
    expect(outbox.length).toBeGreaterThanOrEqual(SAMPLES);
    expect(outbox.every((m) => m.status === 'sent' && m.attempts === 1)).toBe(true);
    await until(async () => {
      const caught = (await Promise.all(members.map((m) => readMailbox(m.email)))).flat().filter((m) => numbers.some((n) => m.subject === `Test report ${n} is ready`));
      return caught.length >= outbox.length;
    }, 30_000, 'the mail catcher receiving every message');
    const caught = (await Promise.all(members.map((m) => readMailbox(m.email)))).flat().filter((m) => numbers.some((n) => m.subject === `Test report ${n} is ready`));
    const keys = caught.map((m) => `${m.to.map((t) => t.address).join(',')}|${m.subject}`);
    expect(keys.sort()).toEqual(outbox.filter((m) => members.some((x) => x.email === m.to_address)).map((m) => `${m.to_address}|${m.subject}`).sort());
    expect(new Set(keys).size).toBe(keys.length);

    // Both workers took part or one did all: either way the job table ends with one completed issuance per analysis.
    // The report is visible a moment before the worker marks its job completed, so wait for the job table to settle.
    const issuanceJobs = `SELECT singleton_key AS key, state FROM pgboss.job WHERE name = 'report-issue' AND singleton_key = ANY($1)
                          UNION ALL SELECT singleton_key, state FROM pgboss.archive WHERE name = 'report-issue' AND singleton_key = ANY($1)`;
    await until(async () => {
      const rows: Array<{ state: string }> = await dataSource.query(issuanceJobs, [analysisIds]);
      return rows.every((r) => r.state === 'completed' || r.state === 'failed' || r.state === 'cancelled');
    }, 30_000, 'every issuance job settling');
    const jobs: Array<{ key: string; state: string }> = await dataSource.query(issuanceJobs, [analysisIds]);
    expect(jobs.map((j) => `${j.key}:${j.state}`).sort()).toEqual(analysisIds.map((id) => `${id}:completed`).sort());
  });
  it('finish an issuance on the other worker when the one issuing it is killed after signing: one report under the number it had claimed, no gap, one e-mail, one credit', async () => {
    const members: Array<{ email: string }> = await dataSource.query(
      `SELECT u.email FROM client_membership cm JOIN app_user u ON u.id = cm.user_id JOIN client_organisation o ON o.id = cm.client_organisation_id WHERE o.name = 'Hollin Ridge Cellars'`,
    );
    for (const m of members) await clearMailbox(m.email);
    const [scope] = await dataSource.query(`SELECT lab_id AS "labId", id AS "clientOrganisationId" FROM client_organisation WHERE name = 'Hollin Ridge Cellars'`);
    await dataSource.transaction((m) => addCredits(m, scope, 1, 'adjustment', { reason: 'Test set-up', actorUserId: null }));
    const { order, analysisIds: [analysisId] } = await submittedChecks(1);
    const [{ last: lastBefore }] = await dataSource.query(`SELECT coalesce(max(last_value), 0)::int AS last FROM report_number_sequence`);

    // Whoever takes the job renders and signs, then waits at the insert of the signed report while
    // the test holds the report table; that is where its worker dies, signed PDF in hand.
    const o = dataSource.options as { host?: string; port?: number; username?: string; password?: unknown; database?: string };
    const holder = new Client({ host: o.host, port: o.port, user: o.username, password: o.password as string, database: o.database });
    await holder.connect();
    let killed: { name: string; value: number } | undefined;
    try {
      await holder.query('BEGIN');
      await holder.query('LOCK TABLE test_report IN SHARE MODE');
      await call(0, 'reviewer@calder.test', 'POST', `/api/lab/analyses/${analysisId}/approve`, { comments: 'Agreed.' }, [202]);
      const stuck = await until(async () => {
        const rows: Array<{ name: string; value: number }> = await dataSource.query(
          `SELECT a.application_name AS name, c.value FROM pg_stat_activity a
             JOIN report_number_claim c ON c.holder_pid = a.pid AND c.state = 'held'
            WHERE a.application_name LIKE 'ohmprint-worker-%' AND a.wait_event_type = 'Lock' AND a.query LIKE 'INSERT INTO "test_report"%'`,
        );
        return rows[0];
      }, 120_000, 'a worker waiting to store the signed report');
      const victim = workers.get(stuck.name)!;
      const exited = new Promise<NodeJS.Signals | null>((resolve) => victim.once('exit', (_code, signal) => resolve(signal)));
      victim.kill('SIGKILL');
      expect(await exited).toBe('SIGKILL');
      killed = stuck;
    } finally {
      // the dead worker's session finds its client gone at its next answer, and PostgreSQL rolls it back
      await holder.query('COMMIT').catch(() => undefined);
      await holder.end();
    }

    // The other worker takes the job over and issues the report under the number the dead one had claimed.
    const report = await issuedReport(1, analysisId);
    expect(Number(report.number.slice(-6))).toBe(killed.value);
    const [counts] = await dataSource.query(
      `SELECT (SELECT count(*)::int FROM test_report WHERE analysis_id = $1) AS reports,
              (SELECT count(*)::int FROM audit_event WHERE action = 'report.issued' AND details->>'analysisId' = $1::text) AS audits,
              (SELECT count(*)::int FROM report_number_claim WHERE state = 'held') AS held,
              (SELECT count(*)::int FROM report_number_claim WHERE value = $2) AS claims_of_number,
              (SELECT max(last_value)::int FROM report_number_sequence) AS last_number`,
      [analysisId, killed.value],
    );
    // one number taken for one report: the counter moved by one, and the number is the one after the last
    expect(counts).toEqual({ reports: 1, audits: 1, held: 0, claims_of_number: 1, last_number: lastBefore + 1 });
    expect(killed.value).toBe(lastBefore + 1);

    const ledger: Array<{ kind: string; n: number }> = await dataSource.query(`SELECT kind, count(*)::int AS n FROM credit_ledger_entry WHERE order_id = $1 GROUP BY kind ORDER BY kind`, [order.id]);
    expect(ledger).toEqual([{ kind: 'consume', n: 1 }, { kind: 'reserve', n: 1 }]);

    const subject = `Test report ${report.number} is ready`;
    await until(async () => (await dataSource.query(`SELECT count(*)::int AS n FROM email_outbox WHERE status = 'pending'`))[0].n === 0, 120_000, 'the outbox emptying');
    const outbox: Array<{ to_address: string; attempts: number; status: string }> = await dataSource.query(`SELECT to_address, attempts, status FROM email_outbox WHERE subject = $1`, [subject]);
    expect(outbox.length).toBeGreaterThanOrEqual(1);
    expect(new Set(outbox.map((m) => m.to_address)).size).toBe(outbox.length);
    expect(outbox.every((m) => m.status === 'sent' && m.attempts === 1)).toBe(true);
    const expected = outbox.filter((m) => members.some((x) => x.email === m.to_address)).map((m) => m.to_address).sort();
    const caughtFor = async () => (await Promise.all(members.map((m) => readMailbox(m.email)))).flat().filter((m) => m.subject === subject).flatMap((m) => m.to.map((t) => t.address));
    await until(async () => (await caughtFor()).length >= expected.length, 30_000, 'the mail catcher receiving the message');
    expect((await caughtFor()).sort()).toEqual(expected);

    // The job was attempted twice (the killed attempt, then the other worker's) and completed once.
    const jobs: Array<{ state: string; retry_count: number }> = await dataSource.query(
      `SELECT state, retry_count FROM pgboss.job WHERE name = 'report-issue' AND singleton_key = $1
       UNION ALL SELECT state, retry_count FROM pgboss.archive WHERE name = 'report-issue' AND singleton_key = $1`,
      [analysisId],
    );
    expect(jobs).toEqual([{ state: 'completed', retry_count: 1 }]);
  });
});
