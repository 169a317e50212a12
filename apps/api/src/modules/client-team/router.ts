import { Router } from 'express';
import { IsNull } from 'typeorm';
import {
  ClientTeamListQuerySchema,
  ClientTeamMemberSchema,
  IdParamsSchema,
  InvitationSchema,
  InviteClientMemberRequestSchema,
  listQuery,
  pageOf,
  type InviteClientMemberRequest,
  type ListQuery,
} from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { pageParams, toPage } from '../../core/paging';
import { clientOrganisationIdOf, labIdOf } from '../../core/tenancy';
import { validate } from '../../core/validate';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { User } from '../accounts/user.entity';
import { recordAudit } from '../audit/record-audit';
import { revokeAllSessionsOf } from '../auth/refresh-sessions';
import { requireRole } from '../auth/require-auth';
import { ClientOrganisation } from '../client-organisations/client-organisation.entity';
import { toInvitationDto } from '../invitations/invitation-dto';
import { Invitation } from '../invitations/invitation.entity';
import { sendInvitation } from '../invitations/send-invitation';
import { withdrawInvitation } from '../invitations/withdraw-invitation';
import { Lab } from '../labs/lab.entity';
import { findTeamMember, listTeam } from './team-queries';

const tag = 'Client team';
const TeamInvitationListQuerySchema = listQuery(['createdAt', 'email'], 'desc');

export function clientTeamRouter(): Router {
  const router = Router();

  registerRoute({ method: 'get', path: '/client/team', tag, summary: 'List my organisation’s members', roles: ['client-admin', 'client-member'], query: ClientTeamListQuerySchema, response: pageOf(ClientTeamMemberSchema) });
  router.get('/', requireRole('client-admin', 'client-member'), validate({ query: ClientTeamListQuerySchema }), async (_req, res) => {
    const auth = res.locals.auth;
    res.json(await listTeam(dataSource.manager, labIdOf(auth), clientOrganisationIdOf(auth), res.locals.query as ListQuery));
  });

  registerRoute({ method: 'get', path: '/client/team/invitations', tag, summary: 'Open invitations to my organisation', roles: ['client-admin'], query: TeamInvitationListQuerySchema, response: pageOf(InvitationSchema) });
  router.get('/invitations', requireRole('client-admin'), validate({ query: TeamInvitationListQuerySchema }), async (_req, res) => {
    const auth = res.locals.auth;
    const query = res.locals.query as ListQuery;
    const { skip, take } = pageParams(query);
    const [items, total] = await dataSource.manager.findAndCount(Invitation, {
      where: { labId: labIdOf(auth), clientOrganisationId: clientOrganisationIdOf(auth), acceptedAt: IsNull(), revokedAt: IsNull() },
      order: { [query.sort]: query.dir.toUpperCase() as 'ASC' | 'DESC', id: 'ASC' },
      skip,
      take,
    });
    res.json(toPage(items.map(toInvitationDto), total, query));
  });

  registerRoute({ method: 'post', path: '/client/team/invitations', tag, summary: 'Invite a colleague to my organisation', roles: ['client-admin'], body: InviteClientMemberRequestSchema, response: InvitationSchema, status: 201 });
  router.post('/invitations', requireRole('client-admin'), validate({ body: InviteClientMemberRequestSchema }), async (_req, res) => {
    const input = res.locals.body as InviteClientMemberRequest;
    const auth = res.locals.auth;
    const labId = labIdOf(auth);
    const organisationId = clientOrganisationIdOf(auth);
    const invitation = await dataSource.transaction(async (manager) => {
      const lab = await manager.findOneByOrFail(Lab, { id: labId });
      const organisation = await manager.findOneByOrFail(ClientOrganisation, { id: organisationId, labId });
      return sendInvitation(manager, {
        labId,
        labName: lab.name,
        clientOrganisationId: organisation.id,
        clientOrganisationName: organisation.name,
        email: input.email,
        roles: [input.role],
        invitedByUserId: auth.userId,
        emailField: 'email',
        quietWhenTaken: true,
      });
    });
    res.status(201).json(toInvitationDto(invitation));
  });

  registerRoute({ method: 'delete', path: '/client/team/invitations/:id', tag, summary: 'Withdraw an open invitation to my organisation', roles: ['client-admin'], params: IdParamsSchema });
  router.delete('/invitations/:id', requireRole('client-admin'), validate({ params: IdParamsSchema }), async (_req, res) => {
    const auth = res.locals.auth;
    const scope = { labId: labIdOf(auth), clientOrganisationId: clientOrganisationIdOf(auth) };
    await dataSource.transaction((manager) => withdrawInvitation(manager, scope, (res.locals.params as { id: string }).id, auth.userId));
    res.status(204).end();
  });

  registerRoute({ method: 'delete', path: '/client/team/:id', tag, summary: 'Remove a colleague from my organisation (their account is deactivated)', roles: ['client-admin'], params: IdParamsSchema });
  router.delete('/:id', requireRole('client-admin'), validate({ params: IdParamsSchema }), async (_req, res) => {
    const { id } = res.locals.params as { id: string };
    const auth = res.locals.auth;
    const labId = labIdOf(auth);
    const organisationId = clientOrganisationIdOf(auth);
    if (id === auth.userId) throw ApiError.conflict('You cannot remove yourself; ask another client admin of your organisation.');
    await dataSource.transaction(async (manager) => {
      const member = await findTeamMember(manager, labId, organisationId, id);
      if (!member) throw ApiError.notFound('Team member');
      await manager.update(User, { id, labId }, { status: 'deactivated' });
      await revokeAllSessionsOf(manager, id, 'removed-from-team');
      await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'client-team.member-removed', subjectType: 'user', subjectId: id, details: { email: member.email, clientOrganisationId: organisationId } });
    });
    res.status(204).end();
  });

  return router;
}
