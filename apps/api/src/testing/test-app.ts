import type { Express } from 'express';
import request from 'supertest';
import type { Role, SessionResponse } from '@ohmprint/contracts';
import { createApp } from '../app';
import { closeCpuPool } from '../core/cpu-pool/cpu-pool';
import { closeReportNumberConnections } from '../modules/reports/report-number-connections';
import { QUEUES, startJobs, stopJobs, unfinishedJobs, type JobName } from '../core/jobs/jobs';
import { config } from '../config';
import { jobHandlers } from '../job-handlers';
import { dataSource } from '../db/data-source';
import { signAccessToken } from '../modules/auth/access-token';
import { User } from '../modules/accounts/user.entity';
import { DEMO_PASSWORD, demoEmail, type DemoLabKey } from './demo-accounts';
import { createTestDatabase, dropTestDatabase } from './test-database';

export interface TestApp {
  /** The Express app, for `request(t.app)`. */
  readonly app: Express;
  /** The DataSource, initialised on this file's own database. */
  readonly db: typeof dataSource;
  readonly databaseName: string;
  /** An access token for the demo account holding `role` (minted directly: no HTTP round trip). */
  tokenFor(role: Role, lab?: DemoLabKey): Promise<string>;
  /** `{ Authorization: 'Bearer …' }` for the demo account holding `role`. */
  authFor(role: Role, lab?: DemoLabKey): Promise<Record<string, string>>;
  /** The user id of the demo account holding `role`. */
  userIdFor(role: Role, lab?: DemoLabKey): Promise<string>;
  /**
   * Waits until this file's queued jobs (report issuance, publications, analyses; e-mail only
   * when the outbox worker is on) have run: the file's own in-process worker runs them.
   */
  jobsIdle(timeoutMs?: number): Promise<void>;
  /** A real sign-in through the API: the JSON answer and the refresh cookie. */
  signIn(email: string, password?: string): Promise<{ body: SessionResponse; cookie: string }>;
}

/**
 * One app and one fresh database per test file: call at the top of a spec file. The database is
 * cloned from the migrated, account-seeded template before the file's tests and dropped after.
 */
export function useTestApp(): TestApp {
  let app: Express | undefined;
  let databaseName = '';
  const ids = new Map<string, string>();

  beforeAll(async () => {
    databaseName = await createTestDatabase();
    // Tests provoke refusals on purpose (frozen rows, append-only tables); they assert the errors, so TypeORM need not print them. (An empty list, not false: setOptions ignores a falsy value.)
    dataSource.setOptions({ database: databaseName, poolSize: 4, logging: [] });
    await dataSource.initialize();
    app = createApp();
    // Each file runs its own worker in-process, on its own database, for the queues it may fill.
    await startJobs({ handlers: jobHandlers({ email: config.mail.workerEnabled }), pollingIntervalSeconds: 1, maxConnections: 2 });
  });

  afterAll(async () => {
    await stopJobs(5);
    await closeCpuPool();
    await closeReportNumberConnections();
    if (dataSource.isInitialized) await dataSource.destroy();
    if (databaseName) await dropTestDatabase(databaseName);
  });

  const userIdFor = async (role: Role, lab: DemoLabKey = 'calder'): Promise<string> => {
    const email = demoEmail(role, lab);
    let id = ids.get(email);
    if (!id) {
      id = (await dataSource.manager.findOneOrFail(User, { where: { email } })).id;
      ids.set(email, id);
    }
    return id;
  };

  return {
    get app() {
      if (!app) throw new Error('the test app starts in beforeAll; use it inside tests');
      return app;
    },
    db: dataSource,
    get databaseName() {
      return databaseName;
    },
    userIdFor,
    async tokenFor(role, lab) {
      return signAccessToken(await userIdFor(role, lab));
    },
    async authFor(role, lab) {
      return { Authorization: `Bearer ${signAccessToken(await userIdFor(role, lab))}` };
    },
    async jobsIdle(timeoutMs = 20000) {
      const names = (Object.keys(QUEUES) as JobName[]).filter((n) => n !== 'email-send' || config.mail.workerEnabled);
      const until = Date.now() + timeoutMs;
      while ((await unfinishedJobs(dataSource.manager, names)) > 0) {
        if (Date.now() > until) throw new Error(`jobs still unfinished after ${timeoutMs} ms`);
        await new Promise((r) => setTimeout(r, 50));
      }
    },
    async signIn(email, password = DEMO_PASSWORD) {
      const res = await request(this.app).post('/api/auth/sign-in').send({ email, password });
      if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}: ${JSON.stringify(res.body)}`);
      const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('ohmprint_refresh='));
      if (!cookie) throw new Error('sign-in set no refresh cookie');
      return { body: res.body as SessionResponse, cookie: cookie.split(';')[0] };
    },
  };
}
