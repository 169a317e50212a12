import { randomUUID } from 'node:crypto';
import type { Request, Response } from 'express';
import type { EntityManager } from 'typeorm';
import type { SessionResponse } from '@ohmprint/contracts';
import { signAccessToken } from './access-token';
import type { Account } from './load-auth-context';
import { setRefreshCookie } from './refresh-cookie';
import { issueRefreshToken } from './refresh-sessions';

/** Opens a new sign-in for an account: refresh cookie set, access token and `Me` returned. */
export async function openSession(manager: EntityManager, req: Request, res: Response, account: Account): Promise<SessionResponse> {
  const familyId = randomUUID();
  const refresh = await issueRefreshToken(manager, { userId: account.auth.userId, labId: account.auth.labId }, req.headers['user-agent'], familyId);
  setRefreshCookie(res, refresh);
  return { accessToken: signAccessToken(account.auth.userId, { familyId, tokenVersion: account.tokenVersion }), user: account.me };
}
