import type { Router } from 'express';
import { z } from 'zod';
import {
  ClientOrganisationListQuerySchema,
  ClientOrganisationSchema,
  CreateClientOrganisationRequestSchema,
  IdParamsSchema,
  InvitationSchema,
  pageOf,
  type CreateClientOrganisationRequest,
  type ListQuery,
} from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { recordAudit } from '../audit/record-audit';
import { toInvitationDto } from '../invitations/invitation-dto';
import { sendInvitation } from '../invitations/send-invitation';
import { Lab } from '../labs/lab.entity';
import { ClientOrganisation } from './client-organisation.entity';
import { findOrganisation, listOrganisations } from './organisation-queries';
import { routeTable } from '../../core/route-table';

const tag = 'Client organisations';
const roles = ['lab-admin'] as const;
const CreatedSchema = z.object({ organisation: ClientOrganisationSchema, invitation: InvitationSchema });

export function clientOrganisationsRouter(): Router {
  const { router, route } = routeTable();

  route({ method: 'get', path: '/lab/client-organisations', tag, summary: 'List the lab’s client organisations', roles, query: ClientOrganisationListQuerySchema, response: pageOf(ClientOrganisationSchema) }, async (_req, res) => {
    res.json(await listOrganisations(dataSource.manager, labIdOf(res.locals.auth), res.locals.query as ListQuery));
  });

  route({ method: 'get', path: '/lab/client-organisations/:id', tag, summary: 'One client organisation', roles, params: IdParamsSchema, response: ClientOrganisationSchema }, async (_req, res) => {
    const organisation = await findOrganisation(dataSource.manager, labIdOf(res.locals.auth), (res.locals.params as { id: string }).id);
    if (!organisation) throw ApiError.notFound('Client organisation');
    res.json(organisation);
  });

  route({
    method: 'post',
    path: '/lab/client-organisations',
    tag,
    summary: 'Add a client organisation and invite its first admin',
    roles,
    body: CreateClientOrganisationRequestSchema,
    response: CreatedSchema,
    status: 201,
  }, async (_req, res) => {
    const input = res.locals.body as CreateClientOrganisationRequest;
    const auth = res.locals.auth;
    const labId = labIdOf(auth);
    const created = await dataSource.transaction(async (manager) => {
      const lab = await manager.findOneByOrFail(Lab, { id: labId });
      const [clash] = await manager.query('SELECT 1 FROM client_organisation WHERE lab_id = $1 AND lower(name) = lower($2)', [labId, input.name]);
      if (clash) throw ApiError.conflict(`A client organisation named ${input.name} already exists.`, [{ field: 'name', message: 'is already used by another client organisation' }]);
      const organisation = await manager.save(ClientOrganisation, manager.create(ClientOrganisation, { labId, name: input.name, contactEmail: input.contactEmail ?? input.firstAdmin.email }));
      await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'client-organisation.created', subjectType: 'client-organisation', subjectId: organisation.id, details: { name: input.name } });
      const invitation = await sendInvitation(manager, {
        labId,
        labName: lab.name,
        clientOrganisationId: organisation.id,
        clientOrganisationName: organisation.name,
        email: input.firstAdmin.email,
        displayName: input.firstAdmin.displayName,
        roles: ['client-admin'],
        invitedByUserId: auth.userId,
        emailField: 'firstAdmin.email',
        // The same answer whether or not the address has an account elsewhere on the platform.
        quietWhenTaken: true,
      });
      return { organisation: await findOrganisation(manager, labId, organisation.id), invitation: toInvitationDto(invitation) };
    });
    res.status(201).json(created);
  });

  return router;
}
