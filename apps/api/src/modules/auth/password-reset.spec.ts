import request from 'supertest';
import { PasswordResetToken } from './password-reset-token.entity';
import { EmailOutbox } from '../mail/email-outbox.entity';
import { latestEmailTo, linkToken, useTestApp } from '../../testing';

const t = useTestApp();
const NEW_PASSWORD = 'a-brand-new-passphrase';

describe('password reset by e-mailed link', () => {
  it('mails a lab user a single-use link to the lab portal, which sets the password and ends old sign-ins', async () => {
    const { cookie } = await t.signIn('analyst@calder.test');
    const asked = await request(t.app).post('/api/auth/password-reset-requests').send({ email: 'analyst@calder.test' });
    expect(asked.status).toBe(202);

    const mail = await latestEmailTo(t.db, 'analyst@calder.test');
    expect(mail.subject).toBe('Reset your Ohmprint password');
    const { url, token } = linkToken(mail.text);
    expect(url).toMatch(/^http:\/\/127\.0\.0\.1:4300\/lab\/reset-password\?token=/);

    const reset = await request(t.app).post('/api/auth/password-resets').send({ token, newPassword: NEW_PASSWORD });
    expect(reset.status).toBe(204);
    expect((await request(t.app).post('/api/auth/refresh').set('Cookie', cookie)).status).toBe(401);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: 'analyst@calder.test', password: NEW_PASSWORD })).status).toBe(200);

    const again = await request(t.app).post('/api/auth/password-resets').send({ token, newPassword: 'yet-another-passphrase' });
    expect(again.status).toBe(410);
    expect(again.body.detail).toMatch(/already been used/);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: 'analyst@calder.test', password: NEW_PASSWORD })).status).toBe(200);
  });

  it('sends a client user to the client portal', async () => {
    await request(t.app).post('/api/auth/password-reset-requests').send({ email: 'member@sunvale.test' }).expect(202);
    const { url } = linkToken((await latestEmailTo(t.db, 'member@sunvale.test')).text);
    expect(url).toMatch(/^http:\/\/127\.0\.0\.1:4300\/reset-password\?token=/);
  });

  it('answers an unknown address the same way and queues nothing', async () => {
    const before = await t.db.manager.count(EmailOutbox);
    const res = await request(t.app).post('/api/auth/password-reset-requests').send({ email: 'nobody@nowhere.test' });
    expect(res.status).toBe(202);
    expect(await t.db.manager.count(EmailOutbox)).toBe(before);
  });

  it('refuses an expired link and leaves the password unchanged', async () => {
    await request(t.app).post('/api/auth/password-reset-requests').send({ email: 'reviewer@calder.test' }).expect(202);
    const { token } = linkToken((await latestEmailTo(t.db, 'reviewer@calder.test')).text);
    await t.db.manager.update(PasswordResetToken, { userId: await t.userIdFor('reviewer') }, { expiresAt: new Date(Date.now() - 1000) });
    const res = await request(t.app).post('/api/auth/password-resets').send({ token, newPassword: NEW_PASSWORD });
    expect(res.status).toBe(410);
    expect(res.body.detail).toMatch(/expired/);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: 'reviewer@calder.test', password: NEW_PASSWORD })).status).toBe(401);
  });

  it('refuses a made-up token and a too-short password with field errors', async () => {
    const bogus = await request(t.app).post('/api/auth/password-resets').send({ token: 'x'.repeat(43), newPassword: NEW_PASSWORD });
    expect(bogus.status).toBe(400);
    expect(bogus.body.errors).toEqual([{ field: 'token', message: 'is not a valid reset token' }]);
    const short = await request(t.app).post('/api/auth/password-resets').send({ token: 'x'.repeat(43), newPassword: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.errors).toEqual([{ field: 'newPassword', message: 'must be at least 10 characters' }]);
  });
});
