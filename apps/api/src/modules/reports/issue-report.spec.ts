import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import type { EntityManager } from 'typeorm';
import { useTestApp } from '../../testing';
import { signAccessToken } from '../auth/access-token';
import * as cpuPool from '../../core/cpu-pool/cpu-pool';
import { demoReportContent } from './pdf/demo-report-content';
import { SCREENING_CAUTION } from './pdf/report-wording';
import { issueReport, type IssuanceStep } from './issue-report';
import { insertSubmittedAnalysis, type SubmittedAnalysis } from './submitted-analysis.fixture';

// Rendering and signing take about a second each on this machine; the default 5 s is too tight under load.
jest.setTimeout(30_000);
const t = useTestApp();
const dir = mkdtempSync(join(tmpdir(), 'ohmprint-issue-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const CALDER = { labName: 'Calder Analytical', clientName: 'Hollin Ridge Cellars', analystEmail: 'analyst@calder.test', reviewerEmail: 'reviewer@calder.test' };

/** What the reviewer's approve action does: approve the analysis and issue its report, atomically. */
function approve(a: SubmittedAnalysis, steps: IssuanceStep[] = []) {
  return t.db.transaction(async (manager: EntityManager) => {
    await manager.query(`UPDATE analysis SET status = 'approved' WHERE id = $1 AND status = 'submitted'`, [a.analysisId]);
    return issueReport(manager, {
      labId: a.labId,
      analysisId: a.analysisId,
      sampleId: a.sampleId,
      clientOrganisationId: a.clientOrganisationId,
      actorUserId: a.reviewerUserId,
      content: demoReportContent({ sample: { ...demoReportContent().sample, code: a.sampleCode } }),
      steps,
    });
  });
}

async function counts(a: SubmittedAnalysis) {
  const [row] = await t.db.query(
    `SELECT (SELECT status FROM analysis WHERE id = $1) AS analysis_status,
            (SELECT count(*)::int FROM test_report WHERE lab_id = $2) AS reports,
            (SELECT count(*)::int FROM report_number_claim WHERE lab_id = $2 AND state = 'issued') AS numbers_used,
            (SELECT count(*)::int FROM email_outbox WHERE lab_id = $2 AND subject LIKE 'Test report%') AS emails,
            (SELECT count(*)::int FROM audit_event WHERE lab_id = $2 AND action = 'report.issued') AS audits`,
    [a.analysisId, a.labId],
  );
  return row as { analysis_status: string; reports: number; numbers_used: number; emails: number; audits: number };
}

describe('issuing a report on approval', () => {
  it('leaves nothing behind when signing fails after rendering, and the analysis still awaits review', async () => {
    const a = await insertSubmittedAnalysis(t.db.manager, CALDER);
    const before = await counts(a);
    // Rendering and signing run in a worker thread: the failure is injected where the API hands them over.
    const run = cpuPool.runCpuTask;
    const spy = jest.spyOn(cpuPool, 'runCpuTask').mockImplementation(((name: string, input: never) =>
      name === 'renderAndSign' ? Promise.reject(new Error('signing device unavailable')) : run(name as never, input)) as typeof run);
    await expect(approve(a)).rejects.toThrow('signing device unavailable');
    expect(spy.mock.calls.filter(([name]) => name === 'renderAndSign')).toHaveLength(1);
    spy.mockRestore();
    expect(await counts(a)).toEqual({ ...before, analysis_status: 'submitted' });
  });

  it('leaves nothing behind when a later step of the same transaction fails', async () => {
    const a = await insertSubmittedAnalysis(t.db.manager, CALDER);
    const before = await counts(a);
    const failingStep: IssuanceStep = async () => {
      throw new Error('credits could not be consumed');
    };
    await expect(approve(a, [failingStep])).rejects.toThrow('credits could not be consumed');
    expect(await counts(a)).toEqual({ ...before, analysis_status: 'submitted' });
  });

  it('numbers, signs, hashes, stores, audits and e-mails the client in one go', async () => {
    const a = await insertSubmittedAnalysis(t.db.manager, CALDER);
    const seen: string[] = [];
    const report = await approve(a, [async (_m, r) => void seen.push(r.number)]);
    const year = new Date().getUTCFullYear();
    // The two failed attempts above used no number: this is the lab's first.
    expect(report.number).toBe(`CAL-${year}-000001`);
    expect(seen).toEqual([report.number]);
    const [stored] = await t.db.query('SELECT pdf, sha256, status FROM test_report WHERE id = $1', [report.id]);
    expect(stored.status).toBe('issued');
    expect(createHash('sha256').update(stored.pdf).digest('hex')).toBe(stored.sha256);
    const file = join(dir, 'issued.pdf');
    writeFileSync(file, stored.pdf);
    expect(execFileSync('pdfsig', [file], { encoding: 'utf8' })).toContain('Signature is Valid.');
    const text = execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' });
    expect(text).toContain(report.number);
    expect(text).toContain(a.sampleCode);
    const after = await counts(a);
    expect(after).toMatchObject({ analysis_status: 'approved', reports: 1, numbers_used: 1, audits: 1 });
    const mails = await t.db.query('SELECT to_address, text_body FROM email_outbox WHERE lab_id = $1 AND subject = $2', [a.labId, `Test report ${report.number} is ready`]);
    expect(mails.map((m: { to_address: string }) => m.to_address)).toEqual(['admin@hollinridge.test', 'member@hollinridge.test']);
    expect(mails[0].text_body).toContain(`/verify?report=${report.number}&code=`);
    expect(mails[0].text_body).toContain(SCREENING_CAUTION);
  });

  it('gives the next report the next number', async () => {
    const a = await insertSubmittedAnalysis(t.db.manager, CALDER);
    const report = await approve(a);
    expect(report.number).toBe(`CAL-${new Date().getUTCFullYear()}-000002`);
  });

  it('gives another lab its own prefix and sequence', async () => {
    const a = await insertSubmittedAnalysis(t.db.manager, { labName: 'Marlow Test House', clientName: 'Greyfield Preserves', analystEmail: 'analyst@marlow.test', reviewerEmail: 'reviewer@marlow.test' });
    const report = await approve(a);
    expect(report.number).toBe(`MAR-${new Date().getUTCFullYear()}-000001`);
  });
});

describe('lab and client report routes', () => {
  let a: SubmittedAnalysis;
  let reportId: string;
  let number: string;
  beforeAll(async () => {
    a = await insertSubmittedAnalysis(t.db.manager, CALDER);
    const r = await approve(a);
    reportId = r.id;
    number = r.number;
  });

  const tokenOf = async (email: string) => {
    const [u] = await t.db.query('SELECT id FROM app_user WHERE email = $1', [email]);
    return { Authorization: `Bearer ${signAccessToken(u.id)}` };
  };

  it('lists and shows the lab its reports with verification details', async () => {
    const list = await request(t.app).get('/api/lab/reports').query({ q: number }).set(await t.authFor('analyst'));
    expect(list.status).toBe(200);
    expect(list.body.items.map((r: { number: string }) => r.number)).toEqual([number]);
    const one = await request(t.app).get(`/api/lab/reports/${reportId}`).set(await t.authFor('reviewer'));
    expect(one.status).toBe(200);
    expect(one.body).toMatchObject({ number, status: 'issued', clientOrganisation: { name: 'Hollin Ridge Cellars' } });
    expect(one.body.verificationCode).toMatch(/^[2-9A-Z]{4}-[2-9A-Z]{4}-[2-9A-Z]{4}$/);
  });

  it('downloads the PDF exactly as issued, with its digest', async () => {
    const res = await request(t.app).get(`/api/lab/reports/${reportId}/pdf`).set(await t.authFor('lab-admin')).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const [stored] = await t.db.query('SELECT sha256 FROM test_report WHERE id = $1', [reportId]);
    expect(createHash('sha256').update(res.body as Buffer).digest('hex')).toBe(stored.sha256);
    expect(res.headers['repr-digest']).toBe(`sha-256=:${Buffer.from(stored.sha256, 'hex').toString('base64')}:`);
  });

  it('answers 404 to another lab and to a client of another organisation, on every report route', async () => {
    const marlow = await t.authFor('lab-admin', 'marlow');
    for (const path of [`/api/lab/reports/${reportId}`, `/api/lab/reports/${reportId}/pdf`]) {
      expect((await request(t.app).get(path).set(marlow)).status).toBe(404);
    }
    expect((await request(t.app).post(`/api/lab/reports/${reportId}/revoke`).set(marlow).send({ reason: 'not ours to revoke' })).status).toBe(404);
    expect((await request(t.app).post(`/api/lab/reports/${reportId}/amend`).set(marlow).send({ reason: 'not ours to amend', corrections: { remarks: 'x' } })).status).toBe(404);
    const marlowList = await request(t.app).get('/api/lab/reports').set(marlow);
    expect(marlowList.body.items.map((r: { number: string }) => r.number)).not.toContain(number);
    const brightwater = await tokenOf('member@brightwater.test');
    expect((await request(t.app).get(`/api/client/reports/${reportId}/pdf`).set(brightwater)).status).toBe(404);
    expect((await request(t.app).get('/api/client/reports').set(brightwater)).body.items).toEqual([]);
  });

  it("lets the client's members list and download their own report", async () => {
    const member = await t.authFor('client-member');
    const list = await request(t.app).get('/api/client/reports').set(member);
    expect(list.status).toBe(200);
    expect(list.body.items.map((r: { number: string }) => r.number)).toContain(number);
    expect(list.body.items[0]).not.toHaveProperty('verificationCode');
    expect((await request(t.app).get(`/api/client/reports/${reportId}/pdf`).set(member)).status).toBe(200);
  });

  it('refuses the wrong roles and anonymous callers', async () => {
    expect((await request(t.app).get('/api/lab/reports')).status).toBe(401);
    expect((await request(t.app).get('/api/lab/reports').set(await t.authFor('client-admin'))).status).toBe(403);
    expect((await request(t.app).get('/api/client/reports').set(await t.authFor('analyst'))).status).toBe(403);
    expect((await request(t.app).post(`/api/lab/reports/${reportId}/revoke`).set(await t.authFor('analyst')).send({ reason: 'analysts may not revoke' })).status).toBe(403);
    expect((await request(t.app).post(`/api/lab/reports/${reportId}/amend`).set(await t.authFor('intake-technician')).send({ reason: 'intake may not amend', corrections: { remarks: 'x' } })).status).toBe(403);
    expect((await request(t.app).get('/api/lab/reports').set(await t.authFor('platform-operator'))).status).toBe(403);
  });

  it('says which field is wrong in an amendment without changing anything', async () => {
    const res = await request(t.app).post(`/api/lab/reports/${reportId}/amend`).set(await t.authFor('reviewer')).send({ reason: 'x', corrections: {} });
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['corrections', 'reason']);
    expect((await request(t.app).get(`/api/lab/reports/${reportId}`).set(await t.authFor('reviewer'))).body.status).toBe('issued');
  });

  it('amends: a new revision names the one it replaces, which then reads as superseded', async () => {
    const res = await request(t.app)
      .post(`/api/lab/reports/${reportId}/amend`)
      .set(await t.authFor('reviewer'))
      .send({ reason: 'Claimed lot misread at intake; corrected from the label photo.', corrections: { sample: { claimedLot: 'L2025-119' } } });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ number: `${number}-R1`, revision: 1, status: 'issued', replacesNumber: number, amendmentReason: 'Claimed lot misread at intake; corrected from the label photo.' });
    const old = await request(t.app).get(`/api/lab/reports/${reportId}`).set(await t.authFor('reviewer'));
    expect(old.body).toMatchObject({ status: 'superseded', supersededByNumber: `${number}-R1` });
    const [row] = await t.db.query('SELECT pdf FROM test_report WHERE id = $1', [res.body.id]);
    const file = join(dir, 'amended.pdf');
    writeFileSync(file, row.pdf);
    const text = execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    expect(text).toContain(`This report replaces report ${number}`);
    expect(text).toContain('L2025-119');
    expect(execFileSync('pdfsig', [file], { encoding: 'utf8' })).toContain('Signature is Valid.');
    const [audit] = await t.db.query(`SELECT details FROM audit_event WHERE action = 'report.amended' AND subject_id = $1`, [res.body.id]);
    expect(audit.details).toMatchObject({ replaces: number });
    const again = await request(t.app).post(`/api/lab/reports/${reportId}/amend`).set(await t.authFor('reviewer')).send({ reason: 'amending the old one again', corrections: { remarks: 'x' } });
    expect(again.status).toBe(409);
    expect(again.body.detail).toContain(`${number}-R1`);
  });

  it('revokes with a reason, audited, and refuses to revoke twice', async () => {
    const b = await insertSubmittedAnalysis(t.db.manager, CALDER);
    const r = await approve(b);
    const res = await request(t.app).post(`/api/lab/reports/${r.id}/revoke`).set(await t.authFor('lab-admin')).send({ reason: 'Sample found to be mislabelled at intake.' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'revoked', revocationReason: 'Sample found to be mislabelled at intake.', revokedBy: 'Alex Calder-Admin (demo)' });
    const [audit] = await t.db.query(`SELECT details FROM audit_event WHERE action = 'report.revoked' AND subject_id = $1`, [r.id]);
    expect(audit.details).toEqual({ number: r.number, reason: 'Sample found to be mislabelled at intake.' });
    expect((await request(t.app).post(`/api/lab/reports/${r.id}/revoke`).set(await t.authFor('lab-admin')).send({ reason: 'second time round' })).status).toBe(409);
  });
});
