import { Client } from 'pg';

/** A connection to the `postgres` database, for creating and dropping test databases. */
export async function withMaintenanceConnection<T>(work: (client: Client) => Promise<T>): Promise<T> {
  const client = new Client({
    host: process.env.DATABASE_HOST ?? '127.0.0.1',
    port: Number(process.env.DATABASE_PORT ?? 54329),
    user: process.env.DATABASE_USER ?? 'ohmprint',
    password: process.env.DATABASE_PASSWORD,
    database: 'postgres',
  });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

export const TEMPLATE_PREFIX = 'ohmprint_tpl_';

/** Names are generated here (never from input), so quoting them is safe. */
export function quoteIdent(name: string): string {
  if (!/^[a-z0-9_]+$/.test(name)) throw new Error(`unexpected database name ${name}`);
  return `"${name}"`;
}

/**
 * Plain DROP (not WITH FORCE): PostgreSQL stops an autovacuum worker by itself, whereas FORCE would
 * need rights over that worker. A session still closing gets a few retries.
 */
export async function dropDatabase(client: Client, name: string): Promise<void> {
  for (let attempt = 1; ; attempt++) {
    try {
      await client.query(`DROP DATABASE IF EXISTS ${quoteIdent(name)}`);
      return;
    } catch (err) {
      if (attempt >= 20 || !/being accessed by other users/.test(String((err as Error).message))) throw err;
      await new Promise((r) => setTimeout(r, 100 * attempt));
    }
  }
}
