import { Router } from 'express';
import {
  ChangePasswordRequestSchema,
  MeSchema,
  SessionResponseSchema,
  UpdateMeRequestSchema,
  type ChangePasswordRequest,
  type UpdateMeRequest,
} from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { validate } from '../../core/validate';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { User } from '../accounts/user.entity';
import { recordAudit } from '../audit/record-audit';
import { loadAccount } from '../auth/load-auth-context';
import { hashPassword, verifyPassword } from '../auth/passwords';
import { endAccessTokensOf, revokeAllSessionsOf } from '../auth/refresh-sessions';
import { requireAuth } from '../auth/require-auth';
import { checkPasswordChangeAllowed, countWrongCurrentPassword } from '../auth/sign-in-limiter';
import { openSession } from '../auth/session-response';

const tag = 'My account';

export function meRouter(): Router {
  const router = Router();
  router.use(requireAuth);

  registerRoute({ method: 'get', path: '/me', tag, summary: 'The signed-in user, their roles, lab and client organisation', roles: 'signed-in', response: MeSchema });
  router.get('/', (_req, res) => {
    res.json(res.locals.me);
  });

  registerRoute({ method: 'patch', path: '/me', tag, summary: 'Change my display name', roles: 'signed-in', body: UpdateMeRequestSchema, response: MeSchema });
  router.patch('/', validate({ body: UpdateMeRequestSchema }), async (_req, res) => {
    const { displayName } = res.locals.body as UpdateMeRequest;
    const { userId, labId } = res.locals.auth;
    await dataSource.transaction(async (manager) => {
      await manager.update(User, userId, { displayName });
      await recordAudit(manager, { labId, actorUserId: userId, action: 'account.display-name-changed', subjectType: 'user', subjectId: userId, details: { displayName } });
    });
    res.json({ ...res.locals.me, displayName });
  });

  registerRoute({
    method: 'post',
    path: '/me/password',
    tag,
    summary: 'Change my password: every other sign-in ends, this one continues with a fresh session',
    roles: 'signed-in',
    body: ChangePasswordRequestSchema,
    response: SessionResponseSchema,
  });
  router.post('/password', validate({ body: ChangePasswordRequestSchema }), async (req, res) => {
    const { currentPassword, newPassword } = res.locals.body as ChangePasswordRequest;
    const { userId, labId } = res.locals.auth;
    await checkPasswordChangeAllowed(userId);
    const user = await dataSource.manager.findOneByOrFail(User, { id: userId });
    if (!(await verifyPassword(currentPassword, user.passwordHash))) {
      await countWrongCurrentPassword(userId);
      throw ApiError.badRequest('The current password is not correct; the password was not changed.', [{ field: 'currentPassword', message: 'is not correct' }]);
    }
    const passwordHash = await hashPassword(newPassword);
    const session = await dataSource.transaction(async (manager) => {
      await manager.update(User, userId, { passwordHash });
      await endAccessTokensOf(manager, userId);
      await revokeAllSessionsOf(manager, userId, 'password-changed');
      await recordAudit(manager, { labId, actorUserId: userId, action: 'account.password-changed', subjectType: 'user', subjectId: userId });
      const account = await loadAccount(manager, userId);
      if (!account) throw ApiError.unauthorized('This account no longer exists.');
      return openSession(manager, req, res, account);
    });
    res.json(session);
  });

  return router;
}
