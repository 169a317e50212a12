import { IsNull, type EntityManager } from 'typeorm';
import { ApiError } from '../../core/api-error';
import { recordAudit } from '../audit/record-audit';
import { Invitation } from './invitation.entity';

/**
 * Withdraws an open invitation of this lab (and, for client invitations, this organisation; `null`
 * means a staff invitation). Someone else's invitation answers 404.
 */
export async function withdrawInvitation(manager: EntityManager, scope: { labId: string; clientOrganisationId: string | null }, id: string, actorUserId: string): Promise<void> {
  const invitation = await manager.findOne(Invitation, {
    where: { id, labId: scope.labId, clientOrganisationId: scope.clientOrganisationId ?? IsNull() },
    lock: { mode: 'pessimistic_write' },
  });
  if (!invitation) throw ApiError.notFound('Invitation');
  if (invitation.acceptedAt) throw ApiError.conflict('This invitation has already been accepted; deactivate the account instead.');
  if (invitation.revokedAt) return;
  await manager.update(Invitation, id, { revokedAt: new Date() });
  await recordAudit(manager, { labId: scope.labId, actorUserId, action: 'invitation.withdrawn', subjectType: 'invitation', subjectId: id, details: { email: invitation.email } });
}
