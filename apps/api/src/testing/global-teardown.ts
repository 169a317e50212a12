import { dropDatabase, withMaintenanceConnection } from './maintenance-db';

/** Drops this run's template and any per-file database a crashed file left behind. */
export default async function globalTeardown(): Promise<void> {
  const template = process.env.OHMPRINT_TEST_TEMPLATE;
  if (!template) return;
  await withMaintenanceConnection(async (client) => {
    const { rows } = await client.query<{ datname: string }>('SELECT datname FROM pg_database WHERE datname = $1 OR datname LIKE $2', [template, `${template}\\_f%`]);
    for (const { datname } of rows) await dropDatabase(client, datname);
  });
}
