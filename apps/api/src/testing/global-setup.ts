import { loadTestEnvironment } from './test-environment';
import { dropDatabase, quoteIdent, TEMPLATE_PREFIX, withMaintenanceConnection } from './maintenance-db';

function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

/**
 * Once per jest run: a template database with every migration and the demo accounts. Each test file
 * clones it (CREATE DATABASE … TEMPLATE), which takes a fraction of a second. The template's name
 * carries this run's pid, so engineers running jest side by side never collide; databases left by
 * runs that died are dropped here.
 */
export default async function globalSetup(): Promise<void> {
  loadTestEnvironment();
  const template = `${TEMPLATE_PREFIX}${process.pid}`;
  await withMaintenanceConnection(async (client) => {
    const { rows } = await client.query<{ datname: string }>(`SELECT datname FROM pg_database WHERE datname LIKE 'ohmprint\\_tpl\\_%'`);
    for (const { datname } of rows) {
      const pid = Number(datname.slice(TEMPLATE_PREFIX.length).split('_')[0]);
      if (pid === process.pid || !isAlive(pid)) await dropDatabase(client, datname);
    }
    await client.query(`CREATE DATABASE ${quoteIdent(template)}`);
  });

  // Imported only now: the config reads the environment prepared above.
  const { dataSource } = await import('../db/data-source');
  const { hashPassword } = await import('../modules/auth/passwords');
  const { seedAccounts } = await import('../../../../docker-free-scripts/seed/accounts');
  const { DEMO_PASSWORD } = await import('../../../../docker-free-scripts/seed/accounts-demo-data');
  dataSource.setOptions({ database: template, poolSize: 2 });
  await dataSource.initialize();
  try {
    await dataSource.runMigrations({ transaction: 'each' });
    // pg-boss's schema and queues, as `npm run db:migrate` installs them: every clone has them.
    const { installJobSchema } = await import('../core/jobs/jobs');
    await installJobSchema();
    const hash = await hashPassword(DEMO_PASSWORD);
    await dataSource.transaction((manager) => seedAccounts(manager, hash));
  } finally {
    await dataSource.destroy();
  }
  process.env.OHMPRINT_TEST_TEMPLATE = template;
}
