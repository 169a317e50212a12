import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

const ROOT = join(__dirname, '..', '..', '..', '..');

/**
 * Test settings: the local secrets from .data/secrets.env (written by the scripts) when the shell
 * did not export them, a cheap bcrypt cost, quiet logs and no background mail worker.
 */
export function loadTestEnvironment(): void {
  const file = join(ROOT, '.data', 'secrets.env');
  const secrets: Record<string, string> = {};
  if (existsSync(file)) {
    for (const line of readFileSync(file, 'utf8').split('\n')) {
      const m = line.match(/^([A-Z0-9_]+)=(.*)$/);
      if (m) secrets[m[1]] = m[2];
    }
  }
  const env = process.env;
  env.NODE_ENV = 'test';
  env.DATABASE_PASSWORD ??= secrets.PG_APP_PASSWORD;
  env.JWT_ACCESS_SECRET ??= secrets.JWT_ACCESS_SECRET;
  env.BCRYPT_COST = '4';
  env.OUTBOX_WORKER = 'false';
  env.LOG_LEVEL ??= 'silent';
  env.PORTALS_DIR = join(ROOT, '.data', 'no-portals-under-test');
  env.PUBLIC_BASE_URL = 'http://127.0.0.1:4300';
}
