import { randomBytes } from 'node:crypto';
import { dropDatabase, quoteIdent, withMaintenanceConnection } from './maintenance-db';

function templateName(): string {
  const template = process.env.OHMPRINT_TEST_TEMPLATE;
  if (!template) throw new Error('OHMPRINT_TEST_TEMPLATE is not set: run API tests through jest (its globalSetup builds the template).');
  return template;
}

/** A fresh database for one test file, cloned from the migrated and seeded template. */
export async function createTestDatabase(): Promise<string> {
  const template = templateName();
  const name = `${template}_f${randomBytes(5).toString('hex')}`;
  await withMaintenanceConnection(async (client) => {
    for (let attempt = 1; ; attempt++) {
      try {
        await client.query(`CREATE DATABASE ${quoteIdent(name)} TEMPLATE ${quoteIdent(template)}`);
        return;
      } catch (err) {
        // Another file cloning the same template at this instant; PostgreSQL asks us to try again.
        if (attempt >= 20 || !/being accessed by other users/.test(String((err as Error).message))) throw err;
        await new Promise((r) => setTimeout(r, 100 * attempt));
      }
    }
  });
  return name;
}

export async function dropTestDatabase(name: string): Promise<void> {
  await withMaintenanceConnection((client) => dropDatabase(client, name));
}
