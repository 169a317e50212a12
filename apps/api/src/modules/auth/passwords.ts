import bcrypt from 'bcryptjs';
import { config } from '../../config';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';

/** Hashed in a worker thread: bcrypt's own async API still computes on the event loop. */
export function hashPassword(password: string): Promise<string> {
  return runCpuTask('hashPassword', { password, cost: config.auth.bcryptCost });
}

/**
 * Password checks waiting for a worker beyond which a sign-in is refused at once (503, Retry-After)
 * instead of queueing: a flood then costs the pool a bounded backlog, never minutes of hashing.
 */
export const PASSWORD_QUEUE_LIMIT = 64;

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return runCpuTask('verifyPassword', { password, hash }, { queueLimit: PASSWORD_QUEUE_LIMIT });
}

/** Compared against when the e-mail is unknown, so a miss costs as long as a wrong password. */
export const UNKNOWN_USER_HASH = bcrypt.hashSync('ohmprint-no-such-user', config.auth.bcryptCost);
