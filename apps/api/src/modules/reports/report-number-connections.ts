import { Pool, type PoolClient } from 'pg';
import { logger } from '../../core/logger';
import { dataSource } from '../../db/data-source';

/**
 * The connections report-number claims commit on: a small pool of their own, apart from the pool
 * whose connections the issuing transactions hold (so a burst of issuances never waits for a
 * connection that one of them is holding), and kept open between claims — opening a connection
 * (a new server process and a password exchange) costs more than the claim itself on a busy
 * machine. Idle connections close after a while and never keep the process alive.
 */
const CONNECTIONS = 4;
const IDLE_MS = 10_000;

let pool: Pool | null = null;
let poolFor = '';

function target(): { key: string; options: ConstructorParameters<typeof Pool>[0] } {
  const o = dataSource.options as { host?: string; port?: number; username?: string; password?: unknown; database?: string };
  return {
    key: `${o.host}:${o.port}/${o.database}/${o.username}`,
    options: { host: o.host, port: o.port, user: o.username, password: o.password as string, database: o.database, application_name: 'ohmprint-report-number' },
  };
}

/** A connection to the database the app's data source points at now (tests move it per file). */
export async function reportNumberConnection(): Promise<PoolClient> {
  const { key, options } = target();
  if (!pool || poolFor !== key) {
    void closeReportNumberConnections();
    pool = new Pool({ ...options, max: CONNECTIONS, idleTimeoutMillis: IDLE_MS, allowExitOnIdle: true });
    pool.on('error', (err) => logger.warn({ err }, 'an idle report-number connection was lost'));
    poolFor = key;
  }
  return pool.connect();
}

/** Closes the claim connections (a worker's shutdown, the end of a test file). */
export async function closeReportNumberConnections(): Promise<void> {
  const p = pool;
  pool = null;
  poolFor = '';
  await p?.end().catch(() => undefined);
}
