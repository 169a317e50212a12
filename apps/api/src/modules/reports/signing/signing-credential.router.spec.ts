import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import type { EntityManager } from 'typeorm';
import { runCpuTask } from '../../../core/cpu-pool/cpu-pool';
import { useTestApp } from '../../../testing';
import { demoReportContent } from '../pdf/demo-report-content';
import { issueReport } from '../issue-report';
import { insertSubmittedAnalysis } from '../submitted-analysis.fixture';
import { createSelfSignedCredential } from './self-signed-credential';

jest.setTimeout(30_000);
const t = useTestApp();

const p12 = createSelfSignedCredential({ labName: 'Calder Analytical (demo upload)', passphrase: 'uploaded passphrase' });
const post = async (file: Buffer | null, passphrase: string, role: Parameters<typeof t.authFor>[0] = 'lab-admin', lab: 'calder' | 'marlow' = 'calder') => {
  const req = request(t.app).post('/api/lab/signing-credential').set(await t.authFor(role, lab)).field('passphrase', passphrase);
  return file ? req.attach('file', file, 'signing.p12') : req;
};

describe('the signing credential routes', () => {
  it('starts with no credential in a fresh lab', async () => {
    const res = await request(t.app).get('/api/lab/signing-credential').set(await t.authFor('lab-admin'));
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ credential: null });
  });

  it('refuses a wrong passphrase, naming the field, and keeps nothing', async () => {
    const res = await post(p12, 'not it');
    expect(res.status).toBe(400);
    expect(res.body.errors[0].field).toBe('passphrase');
    expect((await request(t.app).get('/api/lab/signing-credential').set(await t.authFor('lab-admin'))).body).toEqual({ credential: null });
  });

  it('asks for the file when none is attached', async () => {
    const res = await post(null, 'uploaded passphrase');
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ field: 'file', message: 'is required' }]);
  });

  it('stores an uploaded PKCS#12 and shows its public facts only', async () => {
    const res = await post(p12, 'uploaded passphrase');
    expect(res.status).toBe(201);
    expect(res.body.credential).toMatchObject({ origin: 'uploaded', subject: expect.stringContaining('CN=Calder Analytical (demo upload) report signing') });
    expect(res.body.credential.fingerprintSha256).toMatch(/^([0-9A-F]{2}:){31}[0-9A-F]{2}$/);
    const shown = await request(t.app).get('/api/lab/signing-credential').set(await t.authFor('lab-admin'));
    expect(Object.keys(shown.body.credential).sort()).toEqual(['createdAt', 'fingerprintSha256', 'id', 'issuer', 'notAfter', 'notBefore', 'origin', 'serialNumber', 'subject']);
    const [row] = await t.db.query('SELECT sealed_p12 FROM signing_credential WHERE id = $1', [res.body.credential.id]);
    expect(Buffer.compare(row.sealed_p12, p12)).not.toBe(0);
    const [audit] = await t.db.query(`SELECT action FROM audit_event WHERE subject_id = $1`, [res.body.credential.id]);
    expect(audit.action).toBe('signing-credential.uploaded');
  });

  it('holds no database transaction while the file’s keys are derived (the worker pool first, then a short transaction)', async () => {
    // Keep the pool busy so the derivation waits its turn; meanwhile look for open transactions.
    const busy = Promise.all(Array.from({ length: 10 }, () => runCpuTask('hashPassword', { password: 'keep the pool busy', cost: 12 })));
    let poolDone = false;
    void busy.finally(() => (poolDone = true));
    const answer = post(p12, 'uploaded passphrase').then((r) => r);
    const idleInTransaction: number[] = [];
    while (!poolDone) {
      const [{ n }] = await t.db.query(`SELECT count(*)::int AS n FROM pg_stat_activity WHERE datname = current_database() AND state = 'idle in transaction' AND now() - xact_start > interval '1 second' AND pid <> pg_backend_pid()`);
      idleInTransaction.push(n);
      await new Promise((r) => setTimeout(r, 20));
    }
    expect(idleInTransaction.length).toBeGreaterThan(5);
    expect(Math.max(...idleInTransaction)).toBe(0);
    expect((await answer).status).toBe(201);
  });

  it('signs the next report with the uploaded credential', async () => {
    const a = await insertSubmittedAnalysis(t.db.manager, { labName: 'Calder Analytical', clientName: 'Sunvale Juice Works', analystEmail: 'analyst@calder.test', reviewerEmail: 'reviewer@calder.test' });
    const report = await t.db.transaction((manager: EntityManager) =>
      issueReport(manager, { labId: a.labId, analysisId: a.analysisId, sampleId: a.sampleId, clientOrganisationId: a.clientOrganisationId, actorUserId: a.reviewerUserId, content: demoReportContent() }),
    );
    const [row] = await t.db.query('SELECT pdf FROM test_report WHERE id = $1', [report.id]);
    const dir = mkdtempSync(join(tmpdir(), 'ohmprint-cred-'));
    try {
      writeFileSync(join(dir, 'r.pdf'), row.pdf);
      const out = execFileSync('pdfsig', [join(dir, 'r.pdf')], { encoding: 'utf8' });
      expect(out).toContain('Signer Certificate Common Name: Calder Analytical (demo upload) report signing');
      expect(out).toContain('Signature is Valid.');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it("is for the lab admin only, and another lab sees only its own", async () => {
    expect((await post(p12, 'uploaded passphrase', 'reviewer')).status).toBe(403);
    expect((await request(t.app).get('/api/lab/signing-credential').set(await t.authFor('analyst'))).status).toBe(403);
    expect((await request(t.app).get('/api/lab/signing-credential')).status).toBe(401);
    const marlow = await request(t.app).get('/api/lab/signing-credential').set(await t.authFor('lab-admin', 'marlow'));
    expect(marlow.body).toEqual({ credential: null });
  });
});
