import request from 'supertest';
import { IsNull } from 'typeorm';
import { latestEmailTo, linkToken, useTestApp } from '../../testing';
import { signAccessToken } from '../auth/access-token';
import { AuditEvent } from '../audit/audit-event.entity';
import { Invitation } from './invitation.entity';

const t = useTestApp();

describe('invitations stay in their lab', () => {
  it('a new invitation revokes only the same lab’s open invitations to the address, and audits it', async () => {
    const address = 'wanted.person@elsewhere.test';
    const marlow = await request(t.app).post('/api/lab/staff/invitations').set(await t.authFor('lab-admin', 'marlow')).send({ email: address, roles: ['analyst'] });
    expect(marlow.status).toBe(201);
    const clientAdmin = await t.authFor('client-admin');
    const first = await request(t.app).post('/api/client/team/invitations').set(clientAdmin).send({ email: address });
    const second = await request(t.app).post('/api/client/team/invitations').set(clientAdmin).send({ email: address });
    expect([first.status, second.status]).toEqual([201, 201]);

    // Marlow's staff invitation is untouched; Calder's earlier one gave way to its newer one.
    expect(await t.db.manager.findOneByOrFail(Invitation, { id: marlow.body.id })).toMatchObject({ revokedAt: null });
    expect((await t.db.manager.findOneByOrFail(Invitation, { id: first.body.id })).revokedAt).not.toBeNull();
    expect(await t.db.manager.count(Invitation, { where: { email: address, revokedAt: IsNull() } })).toBe(2);
    const audit = await t.db.manager.findOneByOrFail(AuditEvent, { action: 'invitation.revoked', subjectId: first.body.id });
    const [calder] = await t.db.query(`SELECT lab_id FROM app_user WHERE id = $1`, [await t.userIdFor('client-admin')]);
    expect(audit.labId).toBe(calder.lab_id);
    expect(await t.db.manager.countBy(AuditEvent, { action: 'invitation.revoked', subjectId: marlow.body.id })).toBe(0);
  });

  it('tells a client admin nothing about whether an address has an account elsewhere; the e-mail says what to do', async () => {
    const clientAdmin = await t.authFor('client-admin');
    const known = await request(t.app).post('/api/client/team/invitations').set(clientAdmin).send({ email: 'analyst@marlow.test' });
    const unknown = await request(t.app).post('/api/client/team/invitations').set(clientAdmin).send({ email: 'brand.new@nowhere.test' });
    expect([known.status, unknown.status]).toEqual([201, 201]);
    const shape = (b: Record<string, unknown>) => Object.keys(b).sort();
    expect(shape(known.body)).toEqual(shape(unknown.body));
    expect(known.body).toMatchObject({ status: 'pending', roles: unknown.body.roles });

    const toKnown = await latestEmailTo(t.db, 'analyst@marlow.test');
    expect(toKnown.subject).toBe((await latestEmailTo(t.db, 'brand.new@nowhere.test')).subject);
    expect(toKnown.text).toMatch(/already belongs to an Ohmprint account/);
    expect(toKnown.text).not.toMatch(/token=/);
    expect(linkToken((await latestEmailTo(t.db, 'brand.new@nowhere.test')).text).token).toBeTruthy();
  });
});

describe('the last lab admin', () => {
  it('two admins deactivating each other at the same moment leave the lab with an active admin, every time', async () => {
    const adminA = await t.userIdFor('lab-admin');
    const [{ lab_id: labId }] = await t.db.query(`SELECT lab_id FROM app_user WHERE id = $1`, [adminA]);
    const inviter = await t.authFor('lab-admin');
    await request(t.app).post('/api/lab/staff/invitations').set(inviter).send({ email: 'second.admin@calder.test', roles: ['lab-admin'] }).expect(201);
    const { token } = linkToken((await latestEmailTo(t.db, 'second.admin@calder.test')).text);
    const accepted = await request(t.app).post('/api/invitations/accept').send({ token, displayName: 'Second Admin', password: 'second-admin-passphrase' });
    expect(accepted.status).toBe(201);
    const adminB: string = accepted.body.user.id;

    for (let round = 0; round < 5; round++) {
      await t.db.query(`UPDATE app_user SET status = 'active' WHERE id = ANY($1)`, [[adminA, adminB]]);
      const [ab, ba] = await Promise.all([
        request(t.app).post(`/api/lab/staff/${adminB}/deactivation`).set({ Authorization: `Bearer ${signAccessToken(adminA)}` }),
        request(t.app).post(`/api/lab/staff/${adminA}/deactivation`).set({ Authorization: `Bearer ${signAccessToken(adminB)}` }),
      ]);
      const statuses = [ab.status, ba.status].sort();
      // One deactivation goes through; the other is refused (the caller was just deactivated, or is the last admin).
      expect(statuses[0]).toBe(200);
      expect([401, 403, 409]).toContain(statuses[1]);
      const [{ n }] = await t.db.query(
        `SELECT count(*)::int AS n FROM lab_role_membership r JOIN app_user u ON u.id = r.user_id WHERE r.lab_id = $1 AND r.role = 'lab-admin' AND u.status = 'active'`,
        [labId],
      );
      expect(n).toBe(1);
    }
  });
});
