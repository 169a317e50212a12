import 'reflect-metadata';
import { join } from 'node:path';
import { DataSource } from 'typeorm';
import { config } from '../config';

/**
 * The one DataSource. Entities are found by glob so a feature adds a `*.entity.ts` file and nothing
 * else; the schema only ever changes through the migrations folder.
 */
export const dataSource = new DataSource({
  type: 'postgres',
  host: config.database.host,
  port: config.database.port,
  username: config.database.username,
  password: config.database.password,
  database: config.database.database,
  poolSize: config.database.poolSize,
  entities: [join(__dirname, '..', 'modules', '**', '*.entity.{ts,js}')],
  migrations: [join(__dirname, '..', 'migrations', '*.{ts,js}')],
  migrationsTableName: 'schema_migrations',
  synchronize: false,
  migrationsRun: false,
  logging: ['error'],
  // The API's queries are short: just-in-time compilation costs tens of milliseconds each time a
  // large table's estimate crosses its threshold, more than the queries themselves.
  extra: { options: '-c jit=off' },
});
