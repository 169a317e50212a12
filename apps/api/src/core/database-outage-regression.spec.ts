import { Client } from 'pg';
import request from 'supertest';
import { config } from '../config';
import { useTestApp } from '../testing';

/**
 * Issue 10: "During a PostgreSQL restart, requests get 500 rather than 503" and "Database messages
 * are echoed to the caller in development" — here through real routes of the real app: a request
 * whose connection is cut while its query runs (what a restart or failover does), and a query the
 * database itself refuses, naming its own tables and columns.
 */
const t = useTestApp();

/** A connection of our own to this file's database (as the API's role). */
async function sideConnection(): Promise<Client> {
  const client = new Client({
    host: process.env.DATABASE_HOST ?? '127.0.0.1',
    port: Number(process.env.DATABASE_PORT ?? 54329),
    user: process.env.DATABASE_USER ?? 'ohmprint',
    password: process.env.DATABASE_PASSWORD,
    database: t.databaseName,
  });
  await client.connect();
  return client;
}

async function until(check: () => Promise<boolean>, what: string): Promise<void> {
  for (let i = 0; i < 200; i++) {
    if (await check()) return;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`timed out waiting for ${what}`);
}

describe('a database restart in the middle of a request', () => {
  it('answers 503 with Retry-After (not 500) when the connection is cut while the query runs, changes nothing, and works again after', async () => {
    const auth = await t.authFor('analyst');
    const userId = await t.userIdFor('analyst');
    const side = await sideConnection();
    try {
      // Hold the user's row, so the rename below is certainly mid-query when the connection is cut.
      await side.query('BEGIN');
      await side.query('SELECT 1 FROM app_user WHERE id = $1 FOR UPDATE', [userId]);
      const pending = request(t.app).patch('/api/me').set(auth).send({ displayName: 'Cut Off Mid-Request' }).then((r) => r);
      await until(async () => {
        const { rows } = await side.query(`SELECT count(*)::int AS n FROM pg_stat_activity WHERE datname = $1 AND wait_event_type = 'Lock' AND pid <> pg_backend_pid()`, [t.databaseName]);
        return rows[0].n > 0;
      }, 'the request to wait on the row');
      // What a restart does to every other session: terminated (SQLSTATE 57P01).
      await side.query(`SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = $1 AND pid <> pg_backend_pid()`, [t.databaseName]);
      const res = await pending;
      expect(res.status).toBe(503);
      expect(res.headers['retry-after']).toBe('5');
      expect(res.body.type).toBe('urn:ohmprint:problem:service-unavailable');
      expect(res.body.detail).toMatch(/nothing was changed/);
      expect(JSON.stringify(res.body)).not.toMatch(/terminat|administrator|57P01/i);
      await side.query('ROLLBACK');
    } finally {
      await side.end();
    }
    const [row] = await t.db.query('SELECT display_name FROM app_user WHERE id = $1', [userId]);
    expect(row.display_name).not.toBe('Cut Off Mid-Request');
    // The pool drops the dead connections and the next request is served.
    expect((await request(t.app).get('/api/me').set(auth)).status).toBe(200);
  });
});

describe('what the database says stays in the log', () => {
  it('answers a query the database refuses with a plain 500 and the request id, naming none of its tables or columns (outside production too)', async () => {
    expect(config.production).toBe(false);
    const auth = await t.authFor('lab-admin');
    await t.db.query('ALTER TABLE client_organisation RENAME COLUMN name TO name_hidden_by_test');
    try {
      const res = await request(t.app).get('/api/lab/client-organisations?q=Sun').set(auth);
      expect(res.status).toBe(500);
      expect(res.body.requestId).toBeTruthy();
      expect(res.body.detail).toContain(res.body.requestId);
      expect(JSON.stringify(res.body)).not.toMatch(/client_organisation|name_hidden_by_test|column|relation|does not exist|SELECT/i);
    } finally {
      await t.db.query('ALTER TABLE client_organisation RENAME COLUMN name_hidden_by_test TO name');
    }
    expect((await request(t.app).get('/api/lab/client-organisations?q=Sun').set(auth)).status).toBe(200);
  });
});
