import type { Request, Response } from 'express';
import type { SessionResponse, SignInRequest } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { dataSource } from '../../db/data-source';
import { User } from '../accounts/user.entity';
import { recordAudit } from '../audit/record-audit';
import { assertAccountMaySignIn } from './account-access';
import { loadAccount } from './load-auth-context';
import { UNKNOWN_USER_HASH, verifyPassword } from './passwords';
import { openSession } from './session-response';
import { countFailedSignIn } from './sign-in-limiter';

const WRONG_CREDENTIALS = 'The e-mail address or password is incorrect.';

export async function signIn(req: Request, res: Response, input: SignInRequest): Promise<SessionResponse> {
  const user = await dataSource.manager.findOne(User, { where: { email: input.email } });
  const passwordOk = await verifyPassword(input.password, user?.passwordHash ?? UNKNOWN_USER_HASH);
  if (!user || !passwordOk) {
    await countFailedSignIn(req, input.email);
    await recordAudit(dataSource.manager, {
      labId: user?.labId ?? null,
      actorUserId: null,
      action: 'auth.sign-in-failed',
      subjectType: 'user',
      subjectId: user?.id ?? null,
      details: { email: input.email, ip: req.ip },
    });
    throw ApiError.unauthorized(WRONG_CREDENTIALS);
  }
  const account = await loadAccount(dataSource.manager, user.id);
  if (!account) throw ApiError.unauthorized(WRONG_CREDENTIALS);
  assertAccountMaySignIn(account);
  return dataSource.transaction(async (manager) => {
    await manager.update(User, user.id, { lastSignInAt: new Date() });
    await recordAudit(manager, { labId: user.labId, actorUserId: user.id, action: 'auth.signed-in', subjectType: 'user', subjectId: user.id, details: { ip: req.ip } });
    return openSession(manager, req, res, account);
  });
}
