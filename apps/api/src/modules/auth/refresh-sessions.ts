import { randomUUID } from 'node:crypto';
import { IsNull, type EntityManager } from 'typeorm';
import { config } from '../../config';
import { ApiError } from '../../core/api-error';
import { dataSource } from '../../db/data-source';
import { recordAudit } from '../audit/record-audit';
import { RefreshSession } from './refresh-session.entity';
import { hashToken, newSecureToken } from './secure-token';

export interface SessionOwner {
  userId: string;
  labId: string | null;
}

/** Starts (or continues) a family of refresh tokens; returns the raw token for the cookie. */
export async function issueRefreshToken(manager: EntityManager, owner: SessionOwner, userAgent: string | undefined, familyId: string = randomUUID()): Promise<string> {
  const token = newSecureToken();
  await manager.insert(RefreshSession, {
    userId: owner.userId,
    labId: owner.labId,
    familyId,
    tokenHash: hashToken(token),
    expiresAt: new Date(Date.now() + config.auth.refreshTtlDays * 86400_000),
    userAgent: userAgent?.slice(0, 300) ?? null,
  });
  return token;
}

export async function revokeFamily(manager: EntityManager, familyId: string, reason: string): Promise<void> {
  await manager.update(RefreshSession, { familyId, revokedAt: IsNull() }, { revokedAt: new Date(), revokedReason: reason });
}

/** Moves the user's token version on: every access token issued before stops working at once. */
export async function endAccessTokensOf(manager: EntityManager, userId: string): Promise<void> {
  await manager.query('UPDATE app_user SET token_version = token_version + 1 WHERE id = $1', [userId]);
}

/** Ends every sign-in of a user, e.g. after a password change or deactivation. */
export async function revokeAllSessionsOf(manager: EntityManager, userId: string, reason: string): Promise<void> {
  await manager.update(RefreshSession, { userId, revokedAt: IsNull() }, { revokedAt: new Date(), revokedReason: reason });
}

/**
 * Exchanges a refresh token for a new one in the same family. A token that was already rotated (longer
 * than the grace period ago) is a copy in someone else's hands: the whole family is revoked
 * (committed before answering 401).
 */
type Rotation = { ok: true; token: string; owner: SessionOwner; familyId: string } | { ok: false; error: string };

export async function rotateRefreshToken(token: string, userAgent: string | undefined): Promise<{ token: string; owner: SessionOwner; familyId: string }> {
  const outcome = await dataSource.transaction(async (manager): Promise<Rotation> => {
    const session = await manager.findOne(RefreshSession, { where: { tokenHash: hashToken(token) }, lock: { mode: 'pessimistic_write' } });
    if (!session) return { ok: false, error: 'The sign-in session is not recognised; sign in again.' };
    if (session.revokedAt) return { ok: false, error: 'This sign-in session has ended; sign in again.' };
    // Two tabs refreshing with the same cookie at once is not theft: within the grace period the late
    // one gets its own token in the family instead of ending everyone's sign-in.
    const concurrent = session.rotatedAt && Date.now() - session.rotatedAt.getTime() <= config.auth.refreshReuseGraceSeconds * 1000;
    if (session.rotatedAt && !concurrent) {
      await revokeFamily(manager, session.familyId, 'reuse-detected');
      await recordAudit(manager, {
        labId: session.labId,
        actorUserId: session.userId,
        action: 'auth.refresh-token-reused',
        subjectType: 'user',
        subjectId: session.userId,
        details: { familyId: session.familyId },
      });
      return { ok: false, error: 'An old sign-in token was used again, so every token of this sign-in has been revoked. Sign in again.' };
    }
    if (session.expiresAt.getTime() <= Date.now()) return { ok: false, error: 'The sign-in session has expired; sign in again.' };
    if (!session.rotatedAt) await manager.update(RefreshSession, session.id, { rotatedAt: new Date() });
    const owner = { userId: session.userId, labId: session.labId };
    return { ok: true, token: await issueRefreshToken(manager, owner, userAgent, session.familyId), owner, familyId: session.familyId };
  });
  if (!outcome.ok) throw ApiError.unauthorized(outcome.error);
  return outcome;
}

/** Sign-out: the presented token's family ends; unknown tokens are ignored (sign-out always succeeds). */
export async function endSession(manager: EntityManager, token: string): Promise<RefreshSession | null> {
  const session = await manager.findOne(RefreshSession, { where: { tokenHash: hashToken(token) } });
  if (session) await revokeFamily(manager, session.familyId, 'signed-out');
  return session;
}
