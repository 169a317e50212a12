import { dataSource } from './data-source';
import { logger } from '../core/logger';
import { installJobSchema } from '../core/jobs/jobs';

/** `npm run db:migrate`: applies pending migrations, each in its own transaction. */
async function migrate(): Promise<void> {
  await dataSource.initialize();
  try {
    const applied = await dataSource.runMigrations({ transaction: 'each' });
    logger.info({ applied: applied.map((m) => m.name) }, applied.length ? 'migrations applied' : 'database schema is up to date');
    // pg-boss keeps its own schema (pgboss) and versions it itself.
    await installJobSchema();
    logger.info('job queues ready');
  } finally {
    await dataSource.destroy();
  }
}

migrate().catch((err) => {
  logger.fatal({ err }, 'migration failed');
  process.exitCode = 1;
});
