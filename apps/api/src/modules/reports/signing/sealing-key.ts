import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { config } from '../../../config';

let cached: Buffer | null = null;

/**
 * The key that seals signing credentials at rest: SIGNING_CREDENTIAL_KEY (64 hex characters) when
 * set, which production requires; otherwise a development key generated once into the git-ignored
 * data folder, like the other local secrets.
 */
export function credentialSealingKey(): Buffer {
  if (cached) return cached;
  const fromEnv = process.env.SIGNING_CREDENTIAL_KEY;
  if (fromEnv) {
    if (!/^[0-9a-fA-F]{64}$/.test(fromEnv)) throw new Error('SIGNING_CREDENTIAL_KEY must be 64 hexadecimal characters (32 bytes).');
    cached = Buffer.from(fromEnv, 'hex');
    return cached;
  }
  if (config.production) throw new Error('SIGNING_CREDENTIAL_KEY is required in production to seal signing credentials.');
  const dir = resolve(config.dataDir);
  const file = join(dir, 'signing-credential.key');
  if (!existsSync(file)) {
    mkdirSync(dir, { recursive: true });
    try {
      writeFileSync(file, randomBytes(32).toString('hex'), { mode: 0o600, flag: 'wx' });
    } catch (error) {
      // Another process created it first; read theirs.
      if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
    }
  }
  cached = Buffer.from(readFileSync(file, 'utf8').trim(), 'hex');
  return cached;
}
