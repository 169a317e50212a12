import type { NextFunction, Request, Response } from 'express';
import { ROLE_LABELS, type Role } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { dataSource } from '../../db/data-source';
import { verifyAccessToken } from './access-token';
import { assertAccountMaySignIn } from './account-access';
import { loadAccount } from './load-auth-context';

async function authenticate(req: Request, res: Response): Promise<void> {
  const header = req.headers.authorization;
  const match = header?.match(/^Bearer\s+(\S+)$/i);
  if (!match) throw ApiError.unauthorized('Sign in first: send the access token as "Authorization: Bearer <token>".');
  const token = verifyAccessToken(match[1]);
  const account = await loadAccount(dataSource.manager, token.userId, token.familyId);
  if (!account) throw ApiError.unauthorized('The account of this access token no longer exists; sign in again.');
  // A deactivated person or suspended lab is told why first; then, on every request, a password
  // change or reset and a revoked sign-in end their tokens at once.
  assertAccountMaySignIn(account);
  if (account.tokenVersion !== token.tokenVersion) throw ApiError.unauthorized('The password of this account was changed or reset since this token was issued; sign in again.');
  if (account.sessionEnded) throw ApiError.unauthorized('This sign-in has ended (signed out, or revoked after its token was used twice); sign in again.');
  res.locals.auth = account.auth;
  res.locals.me = account.me;
}

/** Verifies the access token and puts the caller in `res.locals.auth`. */
export async function requireAuth(req: Request, res: Response, next: NextFunction): Promise<void> {
  await authenticate(req, res);
  next();
}

/** Signed in and holding at least one of `roles` (authenticates first when needed). */
export function requireRole(...roles: Role[]) {
  return async (req: Request, res: Response, next: NextFunction): Promise<void> => {
    if (!res.locals.auth) await authenticate(req, res);
    if (!res.locals.auth.roles.some((r) => roles.includes(r))) {
      throw ApiError.forbidden(`Only these roles may do this: ${roles.map((r) => ROLE_LABELS[r].toLowerCase()).join(', ')}.`);
    }
    next();
  };
}
