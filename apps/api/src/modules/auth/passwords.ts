import bcrypt from 'bcryptjs';
import { config } from '../../config';

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, config.auth.bcryptCost);
}

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}

/** Compared against when the e-mail is unknown, so a miss costs as long as a wrong password. */
export const UNKNOWN_USER_HASH = bcrypt.hashSync('ohmprint-no-such-user', config.auth.bcryptCost);
