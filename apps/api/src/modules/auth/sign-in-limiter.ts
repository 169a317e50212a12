import type { NextFunction, Request, Response } from 'express';
import { ipKeyGenerator, rateLimit, type Options } from 'express-rate-limit';
import pLimit from 'p-limit';
import { config } from '../../config';
import { ApiError } from '../../core/api-error';
import { PostgresRateStore } from '../../core/postgres-rate-store';
import { dataSource } from '../../db/data-source';

/**
 * Failures counted in PostgreSQL (`rate_limit_window`, shared by every API process) under a key,
 * checked before any password is hashed. Only failures count, and they are counted after the
 * answer is known, so many correct sign-ins at once never lock anyone out. Concurrent wrong
 * guesses can overshoot a limit by at most the number in flight; the global limit bounds those.
 */
export class FailureLimit {
  private readonly store: PostgresRateStore;

  constructor(
    prefix: string,
    readonly limit: number,
    readonly windowMinutes: number,
  ) {
    this.store = new PostgresRateStore(dataSource, prefix);
    this.store.init({ windowMs: windowMinutes * 60_000 } as Options);
  }

  /** True when `key` has reached the limit in the current window. */
  async reached(key: string): Promise<boolean> {
    const info = await this.store.get(key);
    return (info?.totalHits ?? 0) >= this.limit;
  }

  async fail(key: string): Promise<void> {
    await this.store.increment(key);
  }

  /** Every hit counts (a throughput limit); true when this one is over the limit. */
  async hitIsOver(key: string): Promise<boolean> {
    return (await this.store.increment(key)).totalHits > this.limit;
  }
}

function tooMany(title: string, detail: string, windowMinutes: number): ApiError {
  return new ApiError(429, title, `${detail}; wait ${windowMinutes} minutes and try again.`, {
    type: 'rate-limited',
    headers: { 'Retry-After': String(windowMinutes * 60) },
  });
}

const normalisedEmail = (req: Request): string => (typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase().slice(0, 254) : '');
const addressOf = (req: Request): string => ipKeyGenerator(req.ip ?? '');

let limits: { global: FailureLimit; address: FailureLimit; addressAndEmail: FailureLimit; account: FailureLimit } | undefined;
function signInLimits() {
  const { signInWindowMinutes: window, signInMaxFailures, signInMaxFailuresPerAddress, signInMaxFailuresPerAccount, signInGlobalPerMinute } = config.auth;
  limits ??= {
    // All attempts, every caller: bounds the hashing work a flood from many addresses can cause.
    global: new FailureLimit('sign-in-all:', signInGlobalPerMinute, 1),
    // Failures from one address whatever the e-mail: a flood of random e-mails is throttled.
    address: new FailureLimit('sign-in-ip:', signInMaxFailuresPerAddress, window),
    // Failures for one e-mail from one address: a person mistyping does not lock out their office.
    addressAndEmail: new FailureLimit('sign-in:', signInMaxFailures, window),
    // Failures for one account from anywhere: slows guessing spread over many addresses.
    account: new FailureLimit('sign-in-account:', signInMaxFailuresPerAccount, window),
  };
  return limits;
}

let limitCounting: pLimit.Limit | undefined;
/**
 * Sign-in limits are counted in PostgreSQL, one query after another, by at most half the
 * database pool at once: a flood of sign-ins (anonymous, and mostly refused) waits here for its
 * turn instead of taking every pooled connection from the signed-in people's lists and saves.
 */
function countingLimits<T>(work: () => Promise<T>): Promise<T> {
  limitCounting ??= pLimit(Math.max(1, Math.floor(((dataSource.options as { poolSize?: number }).poolSize ?? config.database.poolSize) / 2)));
  return limitCounting(work);
}

/** Checks every sign-in limit before the password is looked at. */
export function signInLimiter() {
  return async (req: Request, _res: Response, next: NextFunction): Promise<void> => {
    const l = signInLimits();
    const address = addressOf(req);
    const email = normalisedEmail(req);
    const reached = await countingLimits(async () => {
      if (await l.global.hitIsOver('all')) return 'busy' as const;
      return [await l.address.reached(address), await l.addressAndEmail.reached(`${address}|${email}`), email ? await l.account.reached(email) : false] as const;
    });
    if (reached === 'busy') {
      return next(tooMany('Sign-in busy', 'Too many sign-in attempts are arriving at the moment', 1));
    }
    const [byAddress, byPair, byAccount] = reached;
    if (byAddress) return next(tooMany('Too many failed sign-ins', 'Too many failed sign-in attempts from this network address', l.address.windowMinutes));
    if (byPair) return next(tooMany('Too many failed sign-ins', 'Too many failed sign-in attempts for this e-mail address', l.addressAndEmail.windowMinutes));
    if (byAccount) return next(tooMany('Too many failed sign-ins', 'Too many failed sign-in attempts for this account', l.account.windowMinutes));
    next();
  };
}

/** Counts one failed sign-in against the address, the address with the e-mail, and the account. */
export async function countFailedSignIn(req: Request, email: string): Promise<void> {
  const l = signInLimits();
  const address = addressOf(req);
  const normalised = email.trim().toLowerCase();
  await countingLimits(async () => {
    await l.address.fail(address);
    await l.addressAndEmail.fail(`${address}|${normalised}`);
    await l.account.fail(normalised);
  });
}

let passwordChange: FailureLimit | undefined;
/** Wrong current passwords when changing one's password, per account: a stolen session cannot guess on. */
export async function checkPasswordChangeAllowed(userId: string): Promise<void> {
  passwordChange ??= new FailureLimit('password-change:', config.auth.signInMaxFailures, config.auth.signInWindowMinutes);
  if (await passwordChange.reached(userId)) {
    throw tooMany('Too many wrong passwords', 'Too many wrong current passwords were given for this account', passwordChange.windowMinutes);
  }
}

export async function countWrongCurrentPassword(userId: string): Promise<void> {
  passwordChange ??= new FailureLimit('password-change:', config.auth.signInMaxFailures, config.auth.signInWindowMinutes);
  await passwordChange.fail(userId);
}

/** Reset links are limited whether or not the address exists, so nobody can flood an inbox. */
export function resetRequestLimiter() {
  const windowMinutes = config.auth.signInWindowMinutes;
  return rateLimit({
    windowMs: windowMinutes * 60_000,
    limit: config.auth.signInMaxFailures,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PostgresRateStore(dataSource, 'password-reset:'),
    keyGenerator: (req: Request) => `${addressOf(req)}|${normalisedEmail(req)}`,
    handler: (_req, _res, next) => {
      next(tooMany('Too many reset requests', 'Too many password-reset requests for this e-mail address', windowMinutes));
    },
  });
}
