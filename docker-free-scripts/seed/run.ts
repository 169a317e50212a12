import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { config } from '../../apps/api/src/config';
import { logger } from '../../apps/api/src/core/logger';
import { dataSource } from '../../apps/api/src/db/data-source';
import { hashPassword } from '../../apps/api/src/modules/auth/passwords';
import { seedAccounts } from './accounts';
import { DEMO_PASSWORD } from './accounts-demo-data';
import { demoAccountsTable } from './demo-accounts-table';
import { seedLabDemo } from './lab-demo';
import { seedBillingDemo } from './billing-demo';

/** `npm run db:seed`: the invented demo, idempotent. Each part is one line here. */
async function seed(): Promise<void> {
  await dataSource.initialize();
  try {
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    await dataSource.transaction((manager) => seedAccounts(manager, passwordHash));
    await dataSource.transaction((manager) => seedLabDemo(manager));
    await dataSource.transaction((manager) => seedBillingDemo(manager));
    mkdirSync(config.dataDir, { recursive: true });
    writeFileSync(join(config.dataDir, 'demo-accounts.txt'), demoAccountsTable(config.publicBaseUrl));
    logger.info('demo seed complete');
  } finally {
    await dataSource.destroy();
  }
}

seed().catch((err) => {
  logger.fatal({ err }, 'seeding failed');
  process.exitCode = 1;
});
