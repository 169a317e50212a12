import { IsNull, type EntityManager } from 'typeorm';
import { rolesInWords, type Role } from '@ohmprint/contracts';
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
  /**
   * Answer the same whether or not the address already has an account (a client admin must not
   * learn who uses Ohmprint elsewhere): a taken address gets an e-mail saying what to do instead
   * of a link, and the invitation simply stays open. Otherwise a taken address is a 409.
   */
  quietWhenTaken?: boolean;
}

/** "an analyst", "a lab admin and reviewer". */
function articled(words: string): string {
  return `${/^[aeiou]/i.test(words) ? 'an' : 'a'} ${words}`;
}

function invitationText(inv: NewInvitation, link: string): string {
  const where = inv.clientOrganisationName ? `${inv.clientOrganisationName}, a client of ${inv.labName},` : inv.labName;
  return (
    `Hello${inv.displayName ? ` ${inv.displayName}` : ''},\n\n` +
    `You are invited to join ${where} on Ohmprint as ${articled(rolesInWords(inv.roles))}.\n` +
    `Open this link within ${config.auth.invitationTtlDays} days to choose your password; it works once:\n\n${link}\n\n` +
    `If you did not expect this invitation, ignore this message.\n`
  );
}

/** For an address that already has an account: no link (it could not be used), but what to do. */
function alreadyRegisteredText(inv: NewInvitation): string {
  const where = inv.clientOrganisationName ? `${inv.clientOrganisationName}, a client of ${inv.labName},` : inv.labName;
  return (
    `Hello${inv.displayName ? ` ${inv.displayName}` : ''},\n\n` +
    `You were invited to join ${where} on Ohmprint as ${articled(rolesInWords(inv.roles))}.\n` +
    `This e-mail address already belongs to an Ohmprint account, and an address can hold only one account, ` +
    `so the invitation cannot be accepted with it. To join, ask the person who invited you to invite another ` +
    `address of yours. To use your existing account, sign in as usual; if you forgot its password, use ` +
    `"Forgot password" on the sign-in page.\n\nIf you did not expect this invitation, ignore this message.\n`
  );
}

/**
 * Invites a person by e-mail. An address can hold one account only, so a taken address is refused;
 * an earlier open invitation to the same address is revoked (only the newest link works).
 */
export async function sendInvitation(manager: EntityManager, inv: NewInvitation): Promise<Invitation> {
  const taken = await manager.exists(User, { where: { email: inv.email } });
  if (taken && !inv.quietWhenTaken) {
    throw ApiError.conflict(`${inv.email} already has an Ohmprint account.`, [{ field: inv.emailField, message: 'already has an Ohmprint account' }]);
  }
  // Only this lab's own open invitations to the address give way to the new one; another lab's
  // invitations are that lab's business.
  const superseded = await manager.find(Invitation, { where: { labId: inv.labId, email: inv.email, acceptedAt: IsNull(), revokedAt: IsNull() } });
  if (superseded.length) {
    await manager.update(Invitation, superseded.map((i) => i.id), { revokedAt: new Date() });
    for (const old of superseded) {
      await recordAudit(manager, {
        labId: inv.labId,
        actorUserId: inv.invitedByUserId,
        action: 'invitation.revoked',
        subjectType: 'invitation',
        subjectId: old.id,
        details: { email: old.email, reason: 'replaced by a newer invitation to the same address' },
      });
    }
  }
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
    text: taken ? alreadyRegisteredText(inv) : invitationText(inv, portalLink(inv.clientOrganisationId !== null, 'accept-invitation', token)),
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
