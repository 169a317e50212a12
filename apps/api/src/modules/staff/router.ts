import { Router } from 'express';
import {
  ChangeStaffRolesRequestSchema,
  IdParamsSchema,
  InvitationSchema,
  InviteStaffRequestSchema,
  pageOf,
  StaffListQuerySchema,
  StaffMemberSchema,
  listQuery,
  type ChangeStaffRolesRequest,
  type InviteStaffRequest,
  type ListQuery,
} from '@ohmprint/contracts';
import { IsNull } from 'typeorm';
import { ApiError } from '../../core/api-error';
import { pageParams, toPage } from '../../core/paging';
import { labIdOf } from '../../core/tenancy';
import { validate } from '../../core/validate';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { LabRoleMembership } from '../accounts/lab-role-membership.entity';
import { User } from '../accounts/user.entity';
import { recordAudit } from '../audit/record-audit';
import { revokeAllSessionsOf } from '../auth/refresh-sessions';
import { requireRole } from '../auth/require-auth';
import { toInvitationDto } from '../invitations/invitation-dto';
import { Invitation } from '../invitations/invitation.entity';
import { sendInvitation } from '../invitations/send-invitation';
import { withdrawInvitation } from '../invitations/withdraw-invitation';
import { Lab } from '../labs/lab.entity';
import { assertStillActiveAdmin, findStaffMember, listStaff, otherActiveAdmins } from './staff-queries';

const tag = 'Lab staff';
const roles = ['lab-admin'] as const;
const StaffInvitationListQuerySchema = listQuery(['createdAt', 'email'], 'desc');

export function staffRouter(): Router {
  const router = Router();
  router.use(requireRole(...roles));

  registerRoute({ method: 'get', path: '/lab/staff', tag, summary: 'List the lab’s staff with their roles', roles, query: StaffListQuerySchema, response: pageOf(StaffMemberSchema) });
  router.get('/', validate({ query: StaffListQuerySchema }), async (_req, res) => {
    res.json(await listStaff(dataSource.manager, labIdOf(res.locals.auth), res.locals.query as ListQuery));
  });

  registerRoute({ method: 'get', path: '/lab/staff/invitations', tag, summary: 'Open staff invitations', roles, query: StaffInvitationListQuerySchema, response: pageOf(InvitationSchema) });
  router.get('/invitations', validate({ query: StaffInvitationListQuerySchema }), async (_req, res) => {
    const query = res.locals.query as ListQuery;
    const { skip, take } = pageParams(query);
    const [items, total] = await dataSource.manager.findAndCount(Invitation, {
      where: { labId: labIdOf(res.locals.auth), clientOrganisationId: IsNull(), acceptedAt: IsNull(), revokedAt: IsNull() },
      order: { [query.sort]: query.dir.toUpperCase() as 'ASC' | 'DESC', id: 'ASC' },
      skip,
      take,
    });
    res.json(toPage(items.map(toInvitationDto), total, query));
  });

  registerRoute({ method: 'post', path: '/lab/staff/invitations', tag, summary: 'Invite a person to the lab with one or more roles (e-mailed link)', roles, body: InviteStaffRequestSchema, response: InvitationSchema, status: 201 });
  router.post('/invitations', validate({ body: InviteStaffRequestSchema }), async (_req, res) => {
    const input = res.locals.body as InviteStaffRequest;
    const auth = res.locals.auth;
    const labId = labIdOf(auth);
    const invitation = await dataSource.transaction(async (manager) => {
      const lab = await manager.findOneByOrFail(Lab, { id: labId });
      return sendInvitation(manager, {
        labId,
        labName: lab.name,
        clientOrganisationId: null,
        clientOrganisationName: null,
        email: input.email,
        roles: input.roles,
        invitedByUserId: auth.userId,
        emailField: 'email',
        // A lab admin must not learn whether an address has an account anywhere on the platform.
        quietWhenTaken: true,
      });
    });
    res.status(201).json(toInvitationDto(invitation));
  });

  registerRoute({ method: 'delete', path: '/lab/staff/invitations/:id', tag, summary: 'Withdraw an open staff invitation (its link stops working)', roles, params: IdParamsSchema });
  router.delete('/invitations/:id', validate({ params: IdParamsSchema }), async (_req, res) => {
    const auth = res.locals.auth;
    await dataSource.transaction((manager) => withdrawInvitation(manager, { labId: labIdOf(auth), clientOrganisationId: null }, (res.locals.params as { id: string }).id, auth.userId));
    res.status(204).end();
  });

  registerRoute({ method: 'put', path: '/lab/staff/:id/roles', tag, summary: 'Replace a staff member’s roles', roles, params: IdParamsSchema, body: ChangeStaffRolesRequestSchema, response: StaffMemberSchema });
  router.put('/:id/roles', validate({ params: IdParamsSchema, body: ChangeStaffRolesRequestSchema }), async (_req, res) => {
    const { id } = res.locals.params as { id: string };
    const { roles: next } = res.locals.body as ChangeStaffRolesRequest;
    const auth = res.locals.auth;
    const labId = labIdOf(auth);
    const updated = await dataSource.transaction(async (manager) => {
      await manager.query('SELECT pg_advisory_xact_lock(hashtext($1))', [`lab-admins:${labId}`]);
      const member = await findStaffMember(manager, labId, id);
      if (!member) throw ApiError.notFound('Staff member');
      if (member.roles.includes('lab-admin') && !next.includes('lab-admin') && member.status === 'active' && (await otherActiveAdmins(manager, labId, id)) === 0) {
        throw ApiError.conflict('The lab must keep at least one active lab admin; give the role to someone else first.', [{ field: 'roles', message: 'must keep lab-admin for the last lab admin' }]);
      }
      await manager.delete(LabRoleMembership, { labId, userId: id });
      for (const role of next) await manager.insert(LabRoleMembership, { labId, userId: id, role });
      await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'staff.roles-changed', subjectType: 'user', subjectId: id, details: { before: member.roles, after: next } });
      return findStaffMember(manager, labId, id);
    });
    res.json(updated);
  });

  registerRoute({ method: 'post', path: '/lab/staff/:id/deactivation', tag, summary: 'Deactivate a staff member (signs them out everywhere)', roles, params: IdParamsSchema, response: StaffMemberSchema });
  router.post('/:id/deactivation', validate({ params: IdParamsSchema }), async (_req, res) => {
    const { id } = res.locals.params as { id: string };
    const auth = res.locals.auth;
    const labId = labIdOf(auth);
    if (id === auth.userId) throw ApiError.conflict('You cannot deactivate your own account.');
    const updated = await dataSource.transaction(async (manager) => {
      await manager.query('SELECT pg_advisory_xact_lock(hashtext($1))', [`lab-admins:${labId}`]);
      // Under the lab's admin lock: the caller may have been deactivated a moment ago by the very
      // admin they are deactivating, and the lab must keep one active admin whatever the order.
      await assertStillActiveAdmin(manager, labId, auth.userId);
      const member = await findStaffMember(manager, labId, id);
      if (!member) throw ApiError.notFound('Staff member');
      if (member.status === 'deactivated') return member;
      if (member.roles.includes('lab-admin') && (await otherActiveAdmins(manager, labId, id)) === 0) {
        throw ApiError.conflict('The lab must keep at least one active lab admin; this is the last one.');
      }
      await manager.update(User, { id, labId }, { status: 'deactivated' });
      await revokeAllSessionsOf(manager, id, 'deactivated');
      await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'staff.deactivated', subjectType: 'user', subjectId: id, details: { email: member.email } });
      return findStaffMember(manager, labId, id);
    });
    res.json(updated);
  });

  registerRoute({ method: 'post', path: '/lab/staff/:id/reactivation', tag, summary: 'Reactivate a deactivated staff member', roles, params: IdParamsSchema, response: StaffMemberSchema });
  router.post('/:id/reactivation', validate({ params: IdParamsSchema }), async (_req, res) => {
    const { id } = res.locals.params as { id: string };
    const auth = res.locals.auth;
    const labId = labIdOf(auth);
    const updated = await dataSource.transaction(async (manager) => {
      const member = await findStaffMember(manager, labId, id);
      if (!member) throw ApiError.notFound('Staff member');
      if (member.status === 'active') return member;
      await manager.update(User, { id, labId }, { status: 'active' });
      await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'staff.reactivated', subjectType: 'user', subjectId: id, details: { email: member.email } });
      return findStaffMember(manager, labId, id);
    });
    res.json(updated);
  });

  return router;
}
