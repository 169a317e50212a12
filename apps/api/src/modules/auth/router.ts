import { Router } from 'express';
import {
  PasswordResetRequestSchema,
  PasswordResetSchema,
  SessionResponseSchema,
  SignInRequestSchema,
  type PasswordReset,
  type PasswordResetRequest,
  type SignInRequest,
} from '@ohmprint/contracts';
import { z } from 'zod';
import { validate } from '../../core/validate';
import { ApiError } from '../../core/api-error';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { recordAudit } from '../audit/record-audit';
import { signAccessToken } from './access-token';
import { assertAccountMaySignIn } from './account-access';
import { loadAccount } from './load-auth-context';
import { requestPasswordReset, resetPassword } from './password-reset';
import { clearRefreshCookie, refreshCookieOf, setRefreshCookie } from './refresh-cookie';
import { endSession, revokeFamily, rotateRefreshToken } from './refresh-sessions';
import { signIn } from './sign-in';
import { resetRequestLimiter, signInLimiter } from './sign-in-limiter';

const tag = 'Sign-in';
const AcceptedSchema = z.object({ message: z.string() });

export function authRouter(): Router {
  const router = Router();

  registerRoute({ method: 'post', path: '/auth/sign-in', tag, summary: 'Sign in with e-mail and password (sets the refresh cookie)', roles: [], body: SignInRequestSchema, response: SessionResponseSchema });
  router.post('/sign-in', signInLimiter(), validate({ body: SignInRequestSchema }), async (req, res) => {
    res.json(await signIn(req, res, res.locals.body as SignInRequest));
  });

  registerRoute({ method: 'post', path: '/auth/refresh', tag, summary: 'Exchange the refresh cookie for a new access token (rotates the cookie)', roles: [], response: SessionResponseSchema });
  router.post('/refresh', async (req, res) => {
    const presented = refreshCookieOf(req);
    if (!presented) throw ApiError.unauthorized('No sign-in session cookie was sent; sign in again.');
    let rotated;
    try {
      rotated = await rotateRefreshToken(presented, req.headers['user-agent']);
    } catch (err) {
      clearRefreshCookie(res);
      throw err;
    }
    const account = await loadAccount(dataSource.manager, rotated.owner.userId);
    try {
      if (!account) throw ApiError.unauthorized('This account no longer exists.');
      assertAccountMaySignIn(account);
    } catch (err) {
      await revokeFamily(dataSource.manager, rotated.familyId, 'account-refused');
      clearRefreshCookie(res);
      throw err;
    }
    setRefreshCookie(res, rotated.token);
    res.json({ accessToken: signAccessToken(account.auth.userId, { familyId: rotated.familyId, tokenVersion: account.tokenVersion }), user: account.me });
  });

  registerRoute({ method: 'post', path: '/auth/sign-out', tag, summary: 'End this sign-in (revokes its refresh tokens, clears the cookie)', roles: [] });
  router.post('/sign-out', async (req, res) => {
    const presented = refreshCookieOf(req);
    if (presented) {
      await dataSource.transaction(async (manager) => {
        const session = await endSession(manager, presented);
        if (session) {
          await recordAudit(manager, { labId: session.labId, actorUserId: session.userId, action: 'auth.signed-out', subjectType: 'user', subjectId: session.userId });
        }
      });
    }
    clearRefreshCookie(res);
    res.status(204).end();
  });

  registerRoute({ method: 'post', path: '/auth/password-reset-requests', tag, summary: 'E-mail a single-use password-reset link', roles: [], body: PasswordResetRequestSchema, response: AcceptedSchema, status: 202 });
  router.post('/password-reset-requests', resetRequestLimiter(), validate({ body: PasswordResetRequestSchema }), async (_req, res) => {
    await requestPasswordReset((res.locals.body as PasswordResetRequest).email);
    res.status(202).json({ message: 'If an active account uses this address, a reset link is on its way.' });
  });

  registerRoute({ method: 'post', path: '/auth/password-resets', tag, summary: 'Set a new password with the e-mailed token (ends every sign-in)', roles: [], body: PasswordResetSchema });
  router.post('/password-resets', validate({ body: PasswordResetSchema }), async (_req, res) => {
    const { token, newPassword } = res.locals.body as PasswordReset;
    await resetPassword(token, newPassword);
    res.status(204).end();
  });

  return router;
}
