import type { Invitation as InvitationDto } from '@ohmprint/contracts';
import type { Invitation } from './invitation.entity';

export function invitationStatus(inv: Invitation, now = Date.now()): InvitationDto['status'] {
  if (inv.acceptedAt) return 'accepted';
  if (inv.revokedAt) return 'revoked';
  return inv.expiresAt.getTime() <= now ? 'expired' : 'pending';
}

export function toInvitationDto(inv: Invitation): InvitationDto {
  return {
    id: inv.id,
    email: inv.email,
    roles: inv.roles,
    status: invitationStatus(inv),
    expiresAt: inv.expiresAt.toISOString(),
    createdAt: inv.createdAt.toISOString(),
  };
}
