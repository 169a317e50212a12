import { dataSource } from './data-source';
import { logger } from '../core/logger';

/** `npm run db:migrate`: applies pending migrations, each in its own transaction. */
async function migrate(): Promise<void> {
  await dataSource.initialize();
  try {
    const applied = await dataSource.runMigrations({ transaction: 'each' });
    logger.info({ applied: applied.map((m) => m.name) }, applied.length ? 'migrations applied' : 'database schema is up to date');
  } finally {
    await dataSource.destroy();
  }
}

migrate().catch((err) => {
  logger.fatal({ err }, 'migration failed');
  process.exitCode = 1;
});
