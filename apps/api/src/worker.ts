import { config } from './config';
import { closeCpuPool, useEveryCoreForCpuTasks, warmThreadsForReports } from './core/cpu-pool/cpu-pool';
import { closeReportNumberConnections } from './modules/reports/report-number-connections';
import { startStalledIssuanceSweep } from './modules/reviews/stalled-issuances';
import { startJobs, stopJobs } from './core/jobs/jobs';
import { logger } from './core/logger';
import { dataSource } from './db/data-source';
import { jobHandlers } from './job-handlers';
import { createMailTransport } from './modules/mail/mail-transport';
import { startOutboxWorker } from './modules/mail/outbox-worker';

/**
 * The worker process (`npm start` runs one beside the API): runs queued jobs (report issuance,
 * e-mail, large publications and analyses). Any number of workers may share one database; each
 * job runs in one of them at a time.
 */
async function main(): Promise<void> {
  useEveryCoreForCpuTasks();
  const warming = warmThreadsForReports().then(
    (threads) => logger.info({ threads }, 'report renderer warm in every thread'),
    (err: unknown) => logger.warn({ err }, 'warming the report renderer failed; the first reports warm it'),
  );
  await dataSource.initialize();
  await startJobs({ handlers: jobHandlers({ email: config.mail.workerEnabled }), supervise: true, maxConnections: 6 });
  // An issuance whose worker died mid-job goes to another worker within seconds, not at the queue's expiry.
  const stalled = startStalledIssuanceSweep(config.jobs.issuanceStalledAfterSeconds);
  // The sweep sends what no job did: retries after an outage, messages queued without a job.
  const sweep = config.mail.workerEnabled ? startOutboxWorker(dataSource, createMailTransport()) : undefined;
  logger.info('Ohmprint worker running');

  let stopping = false;
  const shutdown = (signal: string): void => {
    if (stopping) return;
    stopping = true;
    logger.info({ signal }, 'worker shutting down');
    const hardStop = setTimeout(() => {
      logger.error('graceful worker shutdown timed out; exiting');
      process.exit(1);
    }, config.shutdownTimeoutMs + 5000);
    hardStop.unref();
    void (async () => {
      await sweep?.stop();
      await stalled.stop();
      await stopJobs(Math.max(1, Math.floor(config.shutdownTimeoutMs / 1000)));
      await warming;
      await closeCpuPool();
      await closeReportNumberConnections();
      await dataSource.destroy();
      logger.info('worker stopped');
      process.exit(0);
    })();
  };
  process.on('SIGTERM', () => shutdown('SIGTERM'));
  process.on('SIGINT', () => shutdown('SIGINT'));
}

main().catch((err) => {
  logger.fatal({ err }, 'the worker could not start');
  process.exit(1);
});
