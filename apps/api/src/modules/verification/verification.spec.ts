import express from 'express';
import request from 'supertest';
import type { EntityManager } from 'typeorm';
import { useTestApp } from '../../testing';
import { errorMiddleware } from '../../core/error-middleware';
import { demoReportContent } from '../reports/pdf/demo-report-content';
import { issueReport } from '../reports/issue-report';
import { insertSubmittedAnalysis } from '../reports/submitted-analysis.fixture';
import { formatVerificationCode } from '../reports/verification-code';
import type { TestReport } from '../reports/test-report.entity';
import { verificationRouter } from './verification.router';

jest.setTimeout(30_000);
const t = useTestApp();

const CALDER = { labName: 'Calder Analytical', clientName: 'Hollin Ridge Cellars', analystEmail: 'analyst@calder.test', reviewerEmail: 'reviewer@calder.test' };

async function issued(): Promise<TestReport & { pdf: Buffer }> {
  const a = await insertSubmittedAnalysis(t.db.manager, CALDER);
  const report = await t.db.transaction((manager: EntityManager) =>
    issueReport(manager, { labId: a.labId, analysisId: a.analysisId, sampleId: a.sampleId, clientOrganisationId: a.clientOrganisationId, actorUserId: a.reviewerUserId, content: demoReportContent() }),
  );
  const [row] = await t.db.query('SELECT pdf FROM test_report WHERE id = $1', [report.id]);
  return { ...report, pdf: row.pdf };
}

const verify = (report: string, code: string) => request(t.app).get('/api/public/verify').query({ report, code });
const upload = (pdf: Buffer, fields: Record<string, string> = {}) => {
  const req = request(t.app).post('/api/public/verify/upload');
  for (const [k, v] of Object.entries(fields)) req.field(k, v);
  return req.attach('file', pdf, { filename: 'report.pdf', contentType: 'application/pdf' });
};

describe('public verification by number and code', () => {
  let report: TestReport & { pdf: Buffer };
  beforeAll(async () => {
    report = await issued();
  });

  it('confirms a report in force with its key facts, without sign-in', async () => {
    const res = await verify(report.number, formatVerificationCode(report.verificationCode));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      outcome: 'valid',
      report: { number: report.number, lab: 'Calder Analytical (demo)', productName: 'Ridge Reserve Red', sampleCode: 'S-HRC-00042', verdict: 'consistent' },
      file: null,
    });
  });

  it('accepts the code as people type it: lower case, without hyphens', async () => {
    const res = await verify(report.number.toLowerCase(), report.verificationCode.toLowerCase());
    expect(res.body.outcome).toBe('valid');
  });

  it('gives a wrong code exactly the answer an unknown number gets', async () => {
    const wrong = report.verificationCode.startsWith('2') ? `3${report.verificationCode.slice(1)}` : `2${report.verificationCode.slice(1)}`;
    const a = await verify(report.number, wrong);
    const b = await verify('CAL-1999-999999', report.verificationCode);
    expect(a.status).toBe(200);
    expect(a.body).toEqual(b.body);
    expect(a.body).toMatchObject({ outcome: 'not-found', report: null });
  });

  it('names the field when the number or code is malformed', async () => {
    const res = await verify('not a number', 'short');
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['code', 'report']);
  });

  it('says superseded and names the replacement once the report is amended', async () => {
    const r = await issued();
    const amend = await request(t.app)
      .post(`/api/lab/reports/${r.id}/amend`)
      .set(await t.authFor('reviewer'))
      .send({ reason: 'Remarks completed after review.', corrections: { remarks: 'Replicates agreed within 0.3 %.' } });
    expect(amend.status).toBe(201);
    const res = await verify(r.number, r.verificationCode);
    expect(res.body).toMatchObject({ outcome: 'superseded', supersededBy: `${r.number}-R1` });
    const [next] = await t.db.query('SELECT verification_code FROM test_report WHERE number = $1', [`${r.number}-R1`]);
    expect((await verify(`${r.number}-R1`, next.verification_code)).body.outcome).toBe('valid');
    expect(res.body.message).toContain('use that one instead');

    // once the replacement is revoked, the original must not send the reader to it
    const [r1] = await t.db.query('SELECT id FROM test_report WHERE number = $1', [`${r.number}-R1`]);
    await request(t.app).post(`/api/lab/reports/${r1.id}/revoke`).set(await t.authFor('lab-admin')).send({ reason: 'Sent to the wrong contact.' });
    const after = await verify(r.number, r.verificationCode);
    expect(after.body).toMatchObject({ outcome: 'superseded', supersededBy: `${r.number}-R1` });
    expect(after.body.message).toBe(`Report ${r.number} was genuine but was replaced by report ${r.number}-R1, which the laboratory has since revoked; no revision of this report is in force.`);
  });

  it('says revoked, with the reason', async () => {
    const r = await issued();
    await request(t.app).post(`/api/lab/reports/${r.id}/revoke`).set(await t.authFor('lab-admin')).send({ reason: 'Wrong sample measured.' });
    const res = await verify(r.number, r.verificationCode);
    expect(res.body).toMatchObject({ outcome: 'revoked', revocation: { reason: 'Wrong sample measured.' } });
  });
});

describe('public verification by upload', () => {
  let report: TestReport & { pdf: Buffer };
  beforeAll(async () => {
    report = await issued();
  });

  it('recognises the issued file by its SHA-256', async () => {
    const res = await upload(report.pdf);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ outcome: 'valid', report: { number: report.number }, file: { sha256: report.sha256, identical: true, claimedNumber: report.number } });
  });

  it('says a file with one byte changed matches no report, naming the number the file claims', async () => {
    const altered = Buffer.from(report.pdf);
    altered[Math.floor(altered.length / 2)] ^= 0x01;
    const res = await upload(altered);
    expect(res.body).toMatchObject({ outcome: 'no-match', report: null, file: { identical: false, claimedNumber: report.number } });
    expect(res.body.message).toContain('matches no report');
  });

  it('with the number and code, says the altered file is not the report issued under them', async () => {
    const altered = Buffer.from(report.pdf);
    altered[altered.length - 100] ^= 0x01;
    const res = await upload(altered, { report: report.number, code: report.verificationCode });
    expect(res.body).toMatchObject({ outcome: 'valid', report: { number: report.number }, file: { identical: false } });
    expect(res.body.message).toContain(`not the one issued as report ${report.number}`);
  });

  it('refuses a file that is not a PDF, naming the field', async () => {
    const res = await request(t.app).post('/api/public/verify/upload').attach('file', Buffer.from('hello'), 'note.txt');
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ field: 'file', message: 'must be a PDF' }]);
  });

  it('refuses a PDF over 20 MB', async () => {
    const big = Buffer.alloc(20 * 1024 * 1024 + 1, 0x20);
    big.write('%PDF-1.7');
    const res = await upload(big);
    expect(res.status).toBe(413);
  });
});

describe('rate limiting', () => {
  it('answers 429 with a problem once an address exceeds the limit', async () => {
    // the counts live in the database, shared with every verification router: start this one from zero
    await t.db.query(`DELETE FROM rate_limit_window WHERE key LIKE 'verify:%'`);
    const app = express();
    app.use('/verify', verificationRouter({ limit: 2, windowMs: 60_000 }));
    app.use(errorMiddleware);
    const ask = () => request(app).get('/verify').query({ report: 'CAL-2026-000001', code: '2345-6789-ABCD' });
    expect((await ask()).status).toBe(200);
    expect((await ask()).status).toBe(200);
    const third = await ask();
    expect(third.status).toBe(429);
    expect(third.headers['content-type']).toContain('application/problem+json');
  });
});
