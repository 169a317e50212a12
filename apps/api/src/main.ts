import type { Server } from 'node:http';
import { createApp } from './app';
import { config } from './config';
import { closeCpuPool } from './core/cpu-pool/cpu-pool';
import { logger } from './core/logger';
import { startJobs, stopJobs } from './core/jobs/jobs';
import { dataSource } from './db/data-source';
import { sweepStaleUploadDirs } from './modules/samples/temp-upload-dir';

async function main(): Promise<void> {
  await dataSource.initialize();
  const pending = await dataSource.showMigrations();
  if (pending) logger.warn('the database has pending migrations: run npm run db:migrate');

  const swept = await sweepStaleUploadDirs();
  if (swept.length) logger.info({ folders: swept.length }, 'removed upload folders a stopped process left behind');

  // The API only enqueues jobs; worker processes (worker.ts) run them.
  await startJobs({ maxConnections: 2 });
  const app = createApp();
  const server: Server = app.listen(config.port, config.host, () => {
    logger.info({ url: `http://${config.host}:${config.port}` }, 'Ohmprint API listening');
  });

  let stopping = false;
  const shutdown = (signal: string): void => {
    if (stopping) return;
    stopping = true;
    logger.info({ signal }, 'shutting down');
    const hardStop = setTimeout(() => {
      logger.error('graceful shutdown timed out; exiting');
      process.exit(1);
    }, config.shutdownTimeoutMs);
    hardStop.unref();
    server.close(async () => {
      await stopJobs();
      await closeCpuPool();
      await dataSource.destroy();
      logger.info('stopped');
      process.exit(0);
    });
    server.closeIdleConnections();
  };
  process.on('SIGTERM', () => shutdown('SIGTERM'));
  process.on('SIGINT', () => shutdown('SIGINT'));
}

main().catch((err) => {
  logger.fatal({ err }, 'the API could not start');
  process.exit(1);
});
