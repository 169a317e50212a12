import type { Request } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { config } from '../../config';
import { ApiError } from '../../core/api-error';
import { PostgresRateStore } from '../../core/postgres-rate-store';
import { dataSource } from '../../db/data-source';

/**
 * Counts failed sign-ins per address and e-mail (successful ones are not counted), so guessing a
 * password is slow while a colleague on the same network is not locked out.
 * The counts live in PostgreSQL, shared by every API process.
 */
export function signInLimiter() {
  return limiter('sign-in:', true, 'Too many failed sign-ins', 'Too many failed sign-in attempts for this e-mail address');
}

/** Reset links are limited whether or not the address exists, so nobody can flood an inbox. */
export function resetRequestLimiter() {
  return limiter('password-reset:', false, 'Too many reset requests', 'Too many password-reset requests for this e-mail address');
}

function limiter(prefix: string, onlyFailures: boolean, title: string, what: string) {
  const windowMinutes = config.auth.signInWindowMinutes;
  return rateLimit({
    windowMs: windowMinutes * 60_000,
    limit: config.auth.signInMaxFailures,
    skipSuccessfulRequests: onlyFailures,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PostgresRateStore(dataSource, prefix),
    keyGenerator: (req: Request) => {
      const email = typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : '';
      return `${ipKeyGenerator(req.ip ?? '')}|${email}`;
    },
    handler: (_req, _res, next) => {
      next(new ApiError(429, title, `${what}; wait ${windowMinutes} minutes and try again.`, { type: 'rate-limited' }));
    },
  });
}
