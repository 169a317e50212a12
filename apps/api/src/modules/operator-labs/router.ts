import type { Router } from 'express';
import { z } from 'zod';
import {
  ChangeLabStatusRequestSchema,
  CreateLabRequestSchema,
  IdParamsSchema,
  InvitationSchema,
  LabListQuerySchema,
  LabSummarySchema,
  pageOf,
  type ChangeLabStatusRequest,
  type CreateLabRequest,
  type ListQuery,
} from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { dataSource } from '../../db/data-source';
import { recordAudit } from '../audit/record-audit';
import { RefreshSession } from '../auth/refresh-session.entity';
import { toInvitationDto } from '../invitations/invitation-dto';
import { sendInvitation } from '../invitations/send-invitation';
import { Lab } from '../labs/lab.entity';
import { IsNull } from 'typeorm';
import { findLab, listLabs } from './lab-queries';
import { routeTable } from '../../core/route-table';

const tag = 'Platform: labs';
const roles = ['platform-operator'] as const;
const CreatedSchema = z.object({ lab: LabSummarySchema, invitation: InvitationSchema });

export function operatorLabsRouter(): Router {
  const { router, route } = routeTable();

  route({ method: 'get', path: '/operator/labs', tag, summary: 'List lab tenants', roles, query: LabListQuerySchema, response: pageOf(LabSummarySchema) }, async (_req, res) => {
    res.json(await listLabs(dataSource.manager, res.locals.query as ListQuery));
  });

  route({ method: 'get', path: '/operator/labs/:id', tag, summary: 'One lab tenant', roles, params: IdParamsSchema, response: LabSummarySchema }, async (_req, res) => {
    const lab = await findLab(dataSource.manager, (res.locals.params as { id: string }).id);
    if (!lab) throw ApiError.notFound('Lab');
    res.json(lab);
  });

  route({ method: 'post', path: '/operator/labs', tag, summary: 'Create a lab tenant and invite its first lab admin', roles, body: CreateLabRequestSchema, response: CreatedSchema, status: 201 }, async (_req, res) => {
    const input = res.locals.body as CreateLabRequest;
    const auth = res.locals.auth;
    const created = await dataSource.transaction(async (manager) => {
      const [clash] = await manager.query('SELECT 1 FROM lab WHERE lower(name) = lower($1)', [input.name]);
      if (clash) throw ApiError.conflict(`A lab named ${input.name} already exists.`, [{ field: 'name', message: 'is already used by another lab' }]);
      const lab = await manager.save(
        Lab,
        manager.create(Lab, {
          name: input.name,
          legalName: input.legalName,
          address: input.address,
          accreditationBody: input.accreditationBody ?? null,
          accreditationNumber: input.accreditationNumber ?? null,
          turnaroundTargetDays: input.turnaroundTargetDays,
        }),
      );
      await recordAudit(manager, { labId: lab.id, actorUserId: auth.userId, action: 'lab.created', subjectType: 'lab', subjectId: lab.id, details: { name: lab.name } });
      const invitation = await sendInvitation(manager, {
        labId: lab.id,
        labName: lab.name,
        clientOrganisationId: null,
        clientOrganisationName: null,
        email: input.firstAdmin.email,
        displayName: input.firstAdmin.displayName,
        roles: ['lab-admin'],
        invitedByUserId: auth.userId,
        emailField: 'firstAdmin.email',
      });
      return { lab: await findLab(manager, lab.id), invitation: toInvitationDto(invitation) };
    });
    res.status(201).json(created);
  });

  route({
    method: 'patch',
    path: '/operator/labs/:id',
    tag,
    summary: 'Suspend or reactivate a lab (suspension signs all its users out and blocks sign-in)',
    roles,
    params: IdParamsSchema,
    body: ChangeLabStatusRequestSchema,
    response: LabSummarySchema,
  }, async (_req, res) => {
    const { id } = res.locals.params as { id: string };
    const { status, reason } = res.locals.body as ChangeLabStatusRequest;
    const auth = res.locals.auth;
    const updated = await dataSource.transaction(async (manager) => {
      const lab = await manager.findOne(Lab, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!lab) throw ApiError.notFound('Lab');
      if (lab.status !== status) {
        await manager.update(Lab, id, { status });
        if (status === 'suspended') {
          await manager.update(RefreshSession, { labId: id, revokedAt: IsNull() }, { revokedAt: new Date(), revokedReason: 'lab-suspended' });
        }
        await recordAudit(manager, { labId: id, actorUserId: auth.userId, action: status === 'suspended' ? 'lab.suspended' : 'lab.reactivated', subjectType: 'lab', subjectId: id, details: { reason } });
      }
      return findLab(manager, id);
    });
    res.json(updated);
  });

  return router;
}
