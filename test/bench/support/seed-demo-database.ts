/** `tsx seed-demo-database.ts <database>`: migrates the (empty) database and seeds the invented demo; see demo-database.ts. */
import { BENCH_PASSWORD } from './demo-database';

process.env.LOG_LEVEL = 'silent';

async function main(database: string): Promise<void> {
  const { dataSource } = await import('../../../apps/api/src/db/data-source');
  dataSource.setOptions({ database, poolSize: 2 });
  await dataSource.initialize();
  try {
    await dataSource.runMigrations({ transaction: 'each' });
    await (await import('../../../apps/api/src/core/jobs/jobs')).installJobSchema();
    const { hashPassword } = await import('../../../apps/api/src/modules/auth/passwords');
    const { seedAccounts } = await import('../../../docker-free-scripts/seed/accounts');
    const { seedLabDemo } = await import('../../../docker-free-scripts/seed/lab-demo');
    const hash = await hashPassword(BENCH_PASSWORD);
    await dataSource.transaction((m) => seedAccounts(m, hash));
    await dataSource.transaction((m) => seedLabDemo(m));
  } finally {
    await dataSource.destroy();
    await (await import('../../../apps/api/src/core/cpu-pool/cpu-pool')).closeCpuPool();
  }
}

main(process.argv[2]).catch((err) => {
  console.error(err);
  process.exitCode = 1;
});
