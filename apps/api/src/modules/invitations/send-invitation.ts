import { IsNull, type EntityManager } from 'typeorm';
import type { Role } from '@ohmprint/contracts';
import { config } from '../../config';
import { ApiError } from '../../core/api-error';
import { User } from '../accounts/user.entity';
import { recordAudit } from '../audit/record-audit';
import { portalLink } from '../auth/portal-links';
import { hashToken, newSecureToken } from '../auth/secure-token';
import { enqueueLabEmail } from '../notifications/lab-email';
import { Invitation } from './invitation.entity';

export interface NewInvitation {
  labId: string;
  labName: string;
  clientOrganisationId: string | null;
  clientOrganisationName: string | null;
  email: string;
  displayName?: string;
  roles: Role[];
  invitedByUserId: string;
  /** Where the e-mail address came from in the request, for the error if it is taken. */
  emailField: string;
}

function invitationText(inv: NewInvitation, link: string): string {
  const where = inv.clientOrganisationName ? `${inv.clientOrganisationName}, a client of ${inv.labName},` : inv.labName;
  return (
    `Hello${inv.displayName ? ` ${inv.displayName}` : ''},\n\n` +
    `You are invited to join ${where} on Ohmprint as ${inv.roles.join(', ')}.\n` +
    `Open this link within ${config.auth.invitationTtlDays} days to choose your password; it works once:\n\n${link}\n\n` +
    `If you did not expect this invitation, ignore this message.\n`
  );
}

/**
 * Invites a person by e-mail. An address can hold one account only, so a taken address is refused;
 * an earlier open invitation to the same address is revoked (only the newest link works).
 */
export async function sendInvitation(manager: EntityManager, inv: NewInvitation): Promise<Invitation> {
  if (await manager.exists(User, { where: { email: inv.email } })) {
    throw ApiError.conflict(`${inv.email} already has an Ohmprint account.`, [{ field: inv.emailField, message: 'already has an Ohmprint account' }]);
  }
  await manager.update(Invitation, { email: inv.email, acceptedAt: IsNull(), revokedAt: IsNull() }, { revokedAt: new Date() });
  const token = newSecureToken();
  const invitation = await manager.save(
    Invitation,
    manager.create(Invitation, {
      labId: inv.labId,
      clientOrganisationId: inv.clientOrganisationId,
      email: inv.email,
      displayName: inv.displayName ?? null,
      roles: inv.roles,
      tokenHash: hashToken(token),
      invitedByUserId: inv.invitedByUserId,
      expiresAt: new Date(Date.now() + config.auth.invitationTtlDays * 86400_000),
    }),
  );
  await enqueueLabEmail(manager, inv.labId, inv.email, {
    subject: `Your invitation to ${inv.clientOrganisationName ?? inv.labName} on Ohmprint`,
    text: invitationText(inv, portalLink(inv.clientOrganisationId !== null, 'accept-invitation', token)),
  });
  await recordAudit(manager, {
    labId: inv.labId,
    actorUserId: inv.invitedByUserId,
    action: 'invitation.sent',
    subjectType: 'invitation',
    subjectId: invitation.id,
    details: { email: inv.email, roles: inv.roles, clientOrganisationId: inv.clientOrganisationId },
  });
  return invitation;
}
