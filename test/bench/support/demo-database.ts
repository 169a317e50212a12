import { execFileSync } from 'node:child_process';
import { join } from 'node:path';

/** The password every seeded demo account has in a bench database (invented, not a secret). */
export const BENCH_PASSWORD = 'bench-password-not-secret';

export interface BenchDatabase {
  name: string;
  /** Drops the database at the end (connections the API left open, e.g. its report-number claim pool, are ended). */
  drop(): Promise<void>;
}

/**
 * A bench's own database: created, migrated (job schema included) and seeded with the invented demo
 * in a child process, so the bench process holds only what it measures (the API's memory is not
 * inflated by migrations and seeding).
 */
export async function demoBenchDatabase(prefix: string): Promise<BenchDatabase> {
  const { withMaintenanceConnection, quoteIdent } = await import('../../../apps/api/src/testing/maintenance-db');
  const name = `${prefix}_${process.pid}`;
  await withMaintenanceConnection((c) => c.query(`CREATE DATABASE ${quoteIdent(name)}`));
  const drop = async () => {
    await withMaintenanceConnection((c) => c.query(`DROP DATABASE IF EXISTS ${quoteIdent(name)} WITH (FORCE)`));
  };
  try {
    execFileSync(join(__dirname, '..', '..', '..', 'node_modules', '.bin', 'tsx'), [join(__dirname, 'seed-demo-database.ts'), name], { stdio: 'inherit' });
  } catch (err) {
    await drop();
    throw err;
  }
  return { name, drop };
}
