import type { Request, Response } from 'express';
import type { EntityManager } from 'typeorm';
import type { AcceptInvitationRequest, ClientRole, InvitationPreview, LabRole, SessionResponse } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { dataSource } from '../../db/data-source';
import { LabRoleMembership } from '../accounts/lab-role-membership.entity';
import { User } from '../accounts/user.entity';
import { recordAudit } from '../audit/record-audit';
import { loadAccount } from '../auth/load-auth-context';
import { hashPassword } from '../auth/passwords';
import { hashToken } from '../auth/secure-token';
import { openSession } from '../auth/session-response';
import { ClientMembership } from '../client-organisations/client-membership.entity';
import { ClientOrganisation } from '../client-organisations/client-organisation.entity';
import { Lab } from '../labs/lab.entity';
import { invitationStatus } from './invitation-dto';
import { Invitation } from './invitation.entity';

async function openInvitation(manager: EntityManager, token: string, lock: boolean): Promise<{ invitation: Invitation; lab: Lab }> {
  const invitation = await manager.findOne(Invitation, { where: { tokenHash: hashToken(token) }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
  if (!invitation) throw ApiError.badRequest('This invitation link is not valid. Ask for a new invitation.', [{ field: 'token', message: 'is not a valid invitation token' }]);
  const status = invitationStatus(invitation);
  if (status === 'accepted') throw ApiError.gone('This invitation has already been accepted. Sign in instead.');
  if (status === 'revoked') throw ApiError.gone('This invitation was replaced or withdrawn. Use the newest invitation e-mail, or ask for a new one.');
  if (status === 'expired') throw ApiError.gone('This invitation has expired. Ask the person who invited you for a new one.');
  const lab = await manager.findOneByOrFail(Lab, { id: invitation.labId });
  if (lab.status === 'suspended') {
    throw new ApiError(403, 'Lab suspended', `${lab.name} is suspended on Ohmprint; the invitation can be accepted once it is reactivated.`, { type: 'lab-suspended' });
  }
  return { invitation, lab };
}

export async function previewInvitation(token: string): Promise<InvitationPreview> {
  const { invitation, lab } = await openInvitation(dataSource.manager, token, false);
  const organisation = invitation.clientOrganisationId ? await dataSource.manager.findOneBy(ClientOrganisation, { id: invitation.clientOrganisationId }) : null;
  return {
    email: invitation.email,
    displayName: invitation.displayName,
    labName: lab.name,
    clientOrganisationName: organisation?.name ?? null,
    roles: invitation.roles,
    expiresAt: invitation.expiresAt.toISOString(),
  };
}

/** Creates the account with the invited roles, spends the invitation and signs the new user in. */
export async function acceptInvitation(req: Request, res: Response, input: AcceptInvitationRequest): Promise<SessionResponse> {
  const passwordHash = await hashPassword(input.password);
  return dataSource.transaction(async (manager) => {
    const { invitation } = await openInvitation(manager, input.token, true);
    if (await manager.exists(User, { where: { email: invitation.email } })) {
      throw ApiError.conflict(`${invitation.email} already has an Ohmprint account. Sign in instead.`);
    }
    const user = await manager.save(User, manager.create(User, { labId: invitation.labId, email: invitation.email, displayName: input.displayName, passwordHash }));
    if (invitation.clientOrganisationId) {
      await manager.insert(ClientMembership, {
        labId: invitation.labId,
        clientOrganisationId: invitation.clientOrganisationId,
        userId: user.id,
        role: invitation.roles[0] as ClientRole,
      });
    } else {
      for (const role of invitation.roles) await manager.insert(LabRoleMembership, { labId: invitation.labId, userId: user.id, role: role as LabRole });
    }
    await manager.update(Invitation, invitation.id, { acceptedAt: new Date(), acceptedUserId: user.id });
    await recordAudit(manager, {
      labId: invitation.labId,
      actorUserId: user.id,
      action: 'invitation.accepted',
      subjectType: 'invitation',
      subjectId: invitation.id,
      details: { email: invitation.email, roles: invitation.roles },
    });
    const account = await loadAccount(manager, user.id);
    if (!account) throw new Error('the new account could not be read back');
    return openSession(manager, req, res, account);
  });
}
