import { createHash, randomBytes } from 'node:crypto';

/** A fresh 256-bit token for links and cookies, URL-safe. */
export function newSecureToken(): string {
  return randomBytes(32).toString('base64url');
}

/** Tokens are stored only as SHA-256, so a database leak reveals no usable link or session. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}
