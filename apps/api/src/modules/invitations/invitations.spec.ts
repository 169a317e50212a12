import request from 'supertest';
import { AuditEvent } from '../audit/audit-event.entity';
import { Invitation } from './invitation.entity';
import { EmailOutbox } from '../mail/email-outbox.entity';
import { latestEmailTo, linkToken, useTestApp } from '../../testing';

const t = useTestApp();
const PASSWORD = 'invited-person-passphrase';

describe('staff invitations', () => {
  it('lets a lab admin invite a person with two roles, who accepts, is signed in and holds both roles', async () => {
    const admin = await t.authFor('lab-admin');
    const sent = await request(t.app).post('/api/lab/staff/invitations').set(admin).send({ email: 'New.Analyst@Calder.test', roles: ['analyst', 'reviewer'] });
    expect(sent.status).toBe(201);
    expect(sent.body).toMatchObject({ email: 'new.analyst@calder.test', roles: ['analyst', 'reviewer'], status: 'pending' });
    expect(sent.body.token).toBeUndefined();

    const mail = await latestEmailTo(t.db, 'new.analyst@calder.test');
    expect(mail.subject).toBe('Your invitation to Calder Analytical on Ohmprint');
    const { url, token } = linkToken(mail.text);
    expect(url).toMatch(/^http:\/\/127\.0\.0\.1:4300\/lab\/accept-invitation\?token=/);

    const preview = await request(t.app).post('/api/invitations/preview').send({ token });
    expect(preview.body).toMatchObject({ email: 'new.analyst@calder.test', displayName: null, labName: 'Calder Analytical', clientOrganisationName: null, roles: ['analyst', 'reviewer'] });

    const accepted = await request(t.app).post('/api/invitations/accept').send({ token, displayName: 'Nova Analyst', password: PASSWORD });
    expect(accepted.status).toBe(201);
    expect(accepted.body.user).toMatchObject({ email: 'new.analyst@calder.test', displayName: 'Nova Analyst', roles: ['analyst', 'reviewer'], lab: { name: 'Calder Analytical' } });
    expect(String(accepted.headers['set-cookie'])).toMatch(/ohmprint_refresh=/);

    const again = await request(t.app).post('/api/invitations/accept').send({ token, displayName: 'Someone Else', password: PASSWORD });
    expect(again.status).toBe(410);
    expect(again.body.detail).toMatch(/already been accepted/);

    expect(await t.db.manager.count(AuditEvent, { where: { action: 'invitation.sent' } })).toBeGreaterThanOrEqual(1);
    expect(await t.db.manager.count(AuditEvent, { where: { action: 'invitation.accepted' } })).toBe(1);
  });

  it('answers a lab admin the same whether or not the address has an account anywhere, and tells its holder how to join', async () => {
    const admin = await t.authFor('lab-admin');
    const strip = (b: Record<string, unknown>) => ({ ...b, id: '<id>', email: '<email>', createdAt: '<time>', expiresAt: '<time>' });
    const known = await request(t.app).post('/api/lab/staff/invitations').set(admin).send({ email: 'analyst@marlow.test', roles: ['analyst'] });
    const unknown = await request(t.app).post('/api/lab/staff/invitations').set(admin).send({ email: 'nobody.yet@elsewhere.test', roles: ['analyst'] });
    expect(known.status).toBe(201);
    expect(unknown.status).toBe(201);
    expect(Object.keys(known.body).sort()).toEqual(Object.keys(unknown.body).sort());
    expect(strip(known.body)).toEqual(strip(unknown.body));
    // The same in the lab's list of open invitations.
    const open = await request(t.app).get('/api/lab/staff/invitations?pageSize=100').set(admin);
    const listed = (e: string) => strip(open.body.items.find((i: { email: string }) => i.email === e));
    expect(listed('analyst@marlow.test')).toEqual(listed('nobody.yet@elsewhere.test'));
    // The holder of the existing account is told by e-mail how to join; the new address gets its link.
    const toKnown = await latestEmailTo(t.db, 'analyst@marlow.test');
    expect(toKnown.subject).toBe((await latestEmailTo(t.db, 'nobody.yet@elsewhere.test')).subject);
    expect(toKnown.text).toMatch(/To join, ask the person who invited you to invite another address/);
    expect(linkToken((await latestEmailTo(t.db, 'nobody.yet@elsewhere.test')).text).token).toBeTruthy();
    // Both audited alike in the lab's log.
    for (const b of [known.body, unknown.body]) {
      const audit = await t.db.manager.findOneByOrFail(AuditEvent, { action: 'invitation.sent', subjectId: b.id });
      expect(Object.keys(audit.details as object).sort()).toEqual(['clientOrganisationId', 'email', 'roles']);
    }
    // A new client organisation's first admin: the same uniform answer.
    const org = await request(t.app).post('/api/lab/client-organisations').set(admin).send({ name: 'Quiet Cellars (test)', firstAdmin: { email: 'analyst@marlow.test' } });
    expect(org.status).toBe(201);
  });

  it('refuses an empty or unknown role list', async () => {
    const admin = await t.authFor('lab-admin');
    const none = await request(t.app).post('/api/lab/staff/invitations').set(admin).send({ email: 'x@calder.test', roles: [] });
    expect(none.body.errors).toEqual([{ field: 'roles', message: 'must name at least one role' }]);
    const client = await request(t.app).post('/api/lab/staff/invitations').set(admin).send({ email: 'x@calder.test', roles: ['client-admin'] });
    expect(client.status).toBe(400);
    expect(client.body.errors[0].field).toBe('roles.0');
  });

  it('only the newest invitation to an address works; expired ones are refused', async () => {
    const admin = await t.authFor('lab-admin');
    await request(t.app).post('/api/lab/staff/invitations').set(admin).send({ email: 'twice@calder.test', roles: ['analyst'] }).expect(201);
    const first = linkToken((await latestEmailTo(t.db, 'twice@calder.test')).text).token;
    await request(t.app).post('/api/lab/staff/invitations').set(admin).send({ email: 'twice@calder.test', roles: ['reviewer'] }).expect(201);
    const second = linkToken((await latestEmailTo(t.db, 'twice@calder.test')).text).token;

    const old = await request(t.app).post('/api/invitations/accept').send({ token: first, displayName: 'Twice', password: PASSWORD });
    expect(old.status).toBe(410);
    expect(old.body.detail).toMatch(/replaced or withdrawn/);

    await t.db.manager.update(Invitation, { email: 'twice@calder.test' }, { expiresAt: new Date(Date.now() - 1000) });
    const late = await request(t.app).post('/api/invitations/accept').send({ token: second, displayName: 'Twice', password: PASSWORD });
    expect(late.status).toBe(410);
    expect(late.body.detail).toMatch(/expired/);
  });

  it('refuses malformed, oversized, wrong-typed and unauthenticated invitations with problems, creating nothing', async () => {
    const admin = await t.authFor('lab-admin');
    const before = { invitations: await t.db.manager.count(Invitation), mails: await t.db.manager.count(EmailOutbox) };
    const malformed = await request(t.app).post('/api/lab/staff/invitations').set(admin).set('Content-Type', 'application/json').send('{"email": "a@calder.test", "roles": [');
    const oversized = await request(t.app).post('/api/lab/staff/invitations').set(admin).send({ email: 'big@calder.test', roles: ['analyst'], padding: 'p'.repeat(300 * 1024) });
    const wrongType = await request(t.app).post('/api/lab/staff/invitations').set(admin).send({ email: ['a@calder.test'], roles: 'analyst' });
    const anonymous = await request(t.app).post('/api/lab/staff/invitations').send({ email: 'anon@calder.test', roles: ['analyst'] });
    expect([malformed.status, oversized.status, wrongType.status, anonymous.status]).toEqual([400, 413, 400, 401]);
    for (const res of [malformed, oversized, wrongType, anonymous]) expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(wrongType.body.errors).toEqual([
      { field: 'email', message: 'must be a string (got a list)' },
      { field: 'roles', message: 'must be a list (got string "analyst")' },
    ]);
    expect({ invitations: await t.db.manager.count(Invitation), mails: await t.db.manager.count(EmailOutbox) }).toEqual(before);
  });

  it('withdraws an open invitation: its link stops working; another lab cannot withdraw it', async () => {
    const admin = await t.authFor('lab-admin');
    const sent = await request(t.app).post('/api/lab/staff/invitations').set(admin).send({ email: 'withdrawn@calder.test', roles: ['reviewer'] });
    const { token } = linkToken((await latestEmailTo(t.db, 'withdrawn@calder.test')).text);
    expect((await request(t.app).delete(`/api/lab/staff/invitations/${sent.body.id}`).set(await t.authFor('lab-admin', 'marlow'))).status).toBe(404);
    expect((await request(t.app).delete(`/api/client/team/invitations/${sent.body.id}`).set(await t.authFor('client-admin'))).status).toBe(404);
    expect((await request(t.app).delete(`/api/lab/staff/invitations/${sent.body.id}`).set(admin)).status).toBe(204);
    const accept = await request(t.app).post('/api/invitations/accept').send({ token, displayName: 'Too Late', password: PASSWORD });
    expect(accept.status).toBe(410);
    const open = await request(t.app).get('/api/lab/staff/invitations').set(admin);
    expect(open.body.items.map((i: { email: string }) => i.email)).not.toContain('withdrawn@calder.test');
  });

  it('refuses an invalid token with a field error', async () => {
    const res = await request(t.app).post('/api/invitations/preview').send({ token: 'y'.repeat(43) });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ field: 'token', message: 'is not a valid invitation token' }]);
  });
});

describe('client onboarding', () => {
  it('a lab admin adds a producer and invites its first admin, who then invites a colleague', async () => {
    const created = await request(t.app)
      .post('/api/lab/client-organisations')
      .set(await t.authFor('lab-admin'))
      .send({ name: 'Pebblebrook Vinegar Co (demo)', firstAdmin: { email: 'boss@pebblebrook.test', displayName: 'Pip Brook' } });
    expect(created.status).toBe(201);
    expect(created.body.organisation).toMatchObject({ name: 'Pebblebrook Vinegar Co (demo)', contactEmail: 'boss@pebblebrook.test', memberCount: 0 });
    expect(created.body.invitation).toMatchObject({ email: 'boss@pebblebrook.test', roles: ['client-admin'] });

    const { url, token } = linkToken((await latestEmailTo(t.db, 'boss@pebblebrook.test')).text);
    expect(url).toMatch(/^http:\/\/127\.0\.0\.1:4300\/accept-invitation\?token=/);
    const accepted = await request(t.app).post('/api/invitations/accept').send({ token, displayName: 'Pip Brook', password: PASSWORD });
    expect(accepted.body.user).toMatchObject({ roles: ['client-admin'], clientOrganisation: { name: 'Pebblebrook Vinegar Co (demo)' } });
    const boss = { Authorization: `Bearer ${accepted.body.accessToken}` };

    const invited = await request(t.app).post('/api/client/team/invitations').set(boss).send({ email: 'clerk@pebblebrook.test' });
    expect(invited.status).toBe(201);
    expect(invited.body.roles).toEqual(['client-member']);
    const clerkToken = linkToken((await latestEmailTo(t.db, 'clerk@pebblebrook.test')).text).token;
    const clerk = await request(t.app).post('/api/invitations/accept').send({ token: clerkToken, displayName: 'Cleo Clerk', password: PASSWORD });
    expect(clerk.body.user.roles).toEqual(['client-member']);

    const team = await request(t.app).get('/api/client/team?sort=displayName').set(boss);
    expect(team.body.items.map((m: { displayName: string }) => m.displayName)).toEqual(['Cleo Clerk', 'Pip Brook']);
    expect(team.body.total).toBe(2);
  });

  it('refuses a second organisation with the same name in the lab', async () => {
    const res = await request(t.app)
      .post('/api/lab/client-organisations')
      .set(await t.authFor('lab-admin'))
      .send({ name: 'sunvale juice works', firstAdmin: { email: 'dup@sunvale.test' } });
    expect(res.status).toBe(409);
    expect(res.body.errors).toEqual([{ field: 'name', message: 'is already used by another client organisation' }]);
  });

  it('shows the invitee the name the lab typed for them', async () => {
    const created = await request(t.app)
      .post('/api/lab/client-organisations')
      .set(await t.authFor('lab-admin'))
      .send({ name: 'Fernhill Vinegar Co (demo)', firstAdmin: { email: 'ivo@fernhill.test', displayName: 'Ivo Fern' } });
    expect(created.status).toBe(201);
    const { token } = linkToken((await latestEmailTo(t.db, 'ivo@fernhill.test')).text);
    const preview = await request(t.app).post('/api/invitations/preview').send({ token });
    expect(preview.body).toMatchObject({ email: 'ivo@fernhill.test', displayName: 'Ivo Fern' });
  });
});
