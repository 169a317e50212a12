import { IsNull, type EntityManager } from 'typeorm';
import { config } from '../../config';
import { ApiError } from '../../core/api-error';
import { dataSource } from '../../db/data-source';
import { User } from '../accounts/user.entity';
import { recordAudit } from '../audit/record-audit';
import { enqueueEmail } from '../mail/enqueue-email';
import { ClientMembership } from '../client-organisations/client-membership.entity';
import { hashPassword } from './passwords';
import { PasswordResetToken } from './password-reset-token.entity';
import { portalLink } from './portal-links';
import { endAccessTokensOf, revokeAllSessionsOf } from './refresh-sessions';
import { hashToken, newSecureToken } from './secure-token';

/** E-mails a single-use link to an active account; unknown addresses get the same answer (no enumeration). */
export async function requestPasswordReset(email: string): Promise<void> {
  await dataSource.transaction(async (manager) => {
    const user = await manager.findOne(User, { where: { email, status: 'active' } });
    if (!user) return;
    const token = newSecureToken();
    await manager.insert(PasswordResetToken, {
      userId: user.id,
      labId: user.labId,
      tokenHash: hashToken(token),
      expiresAt: new Date(Date.now() + config.auth.passwordResetTtlMinutes * 60_000),
    });
    const isClient = (await manager.count(ClientMembership, { where: { userId: user.id } })) > 0;
    const link = portalLink(isClient, 'reset-password', token);
    await enqueueEmail(manager, {
      labId: user.labId,
      to: user.email,
      subject: 'Reset your Ohmprint password',
      text:
        `Hello ${user.displayName},\n\nSomeone (hopefully you) asked to reset the password of your Ohmprint account.\n` +
        `Open this link within ${config.auth.passwordResetTtlMinutes} minutes to choose a new one; it works once:\n\n${link}\n\n` +
        `If you did not ask for this, ignore this message: your password stays as it is.\n`,
    });
    await recordAudit(manager, { labId: user.labId, actorUserId: null, action: 'auth.password-reset-requested', subjectType: 'user', subjectId: user.id });
  });
}

async function claimResetToken(manager: EntityManager, token: string): Promise<PasswordResetToken> {
  const row = await manager.findOne(PasswordResetToken, { where: { tokenHash: hashToken(token) }, lock: { mode: 'pessimistic_write' } });
  if (!row) throw ApiError.badRequest('This password-reset link is not valid. Ask for a new one.', [{ field: 'token', message: 'is not a valid reset token' }]);
  if (row.usedAt) throw ApiError.gone('This password-reset link has already been used. Ask for a new one.');
  if (row.expiresAt.getTime() <= Date.now()) throw ApiError.gone('This password-reset link has expired. Ask for a new one.');
  return row;
}

/** Sets the new password, spends the link (and any other open links) and ends every sign-in. */
export async function resetPassword(token: string, newPassword: string): Promise<void> {
  const passwordHash = await hashPassword(newPassword);
  await dataSource.transaction(async (manager) => {
    const row = await claimResetToken(manager, token);
    const user = await manager.findOne(User, { where: { id: row.userId } });
    if (!user || user.status !== 'active') throw ApiError.gone('This account is no longer active.');
    await manager.update(User, user.id, { passwordHash });
    await endAccessTokensOf(manager, user.id);
    await manager.update(PasswordResetToken, { userId: user.id, usedAt: IsNull() }, { usedAt: new Date() });
    await revokeAllSessionsOf(manager, user.id, 'password-reset');
    await recordAudit(manager, { labId: user.labId, actorUserId: user.id, action: 'auth.password-reset', subjectType: 'user', subjectId: user.id });
  });
}
