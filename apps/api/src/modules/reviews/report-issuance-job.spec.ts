import request from 'supertest';
import { issuedReport, useTestApp } from '../../testing';
import { demoReportContent } from '../reports/pdf/demo-report-content';
import { insertSubmittedAnalysis, type SubmittedAnalysis } from '../reports/submitted-analysis.fixture';
import * as sampleAccess from '../samples/sample-access';
import * as reportContent from './report-content';
import { issueApprovedReport } from './report-issuance-job';

jest.setTimeout(120_000);
const t = useTestApp();
const CALDER = { labName: 'Calder Analytical', clientName: 'Hollin Ridge Cellars', analystEmail: 'analyst@calder.test', reviewerEmail: 'reviewer@calder.test' };
const year = new Date().getUTCFullYear();
const seq = (n: number) => `CAL-${year}-${String(n).padStart(6, '0')}`;

/** The fixture's analysis has no stored result to print, so the report's content is the demo's, under the sample's code. */
function withDemoContent(a: SubmittedAnalysis): void {
  jest.spyOn(reportContent, 'reportContentFor').mockImplementation(async (_m, analysis) => {
    const code = analysis.id === a.analysisId ? a.sampleCode : (await t.db.query('SELECT s.code FROM sample s JOIN analysis x ON x.sample_id = s.id WHERE x.id = $1', [analysis.id]))[0].code;
    return { content: demoReportContent({ sample: { ...demoReportContent().sample, code } }), clientOrganisationId: a.clientOrganisationId };
  });
}

async function approve(a: SubmittedAnalysis) {
  return request(t.app).post(`/api/lab/analyses/${a.analysisId}/approve`).set(await t.authFor('reviewer')).send({ comments: 'Agreed.' });
}

async function countsFor(analysisId: string) {
  const [row] = await t.db.query(
    `SELECT (SELECT count(*)::int FROM test_report WHERE analysis_id = $1::uuid) AS reports,
            (SELECT count(*)::int FROM audit_event WHERE action = 'report.issued' AND details->>'analysisId' = $1::text) AS audits,
            (SELECT count(*)::int FROM report_number_claim WHERE state = 'held') AS held_claims`,
    [analysisId],
  );
  return row;
}

describe('report issuance as a job', () => {
  afterEach(() => jest.restoreAllMocks());

  it('answers the approval at once and shows the report as issuing, then issued with its number; the sample is reported only then', async () => {
    const a = await insertSubmittedAnalysis(t.db.manager, CALDER);
    withDemoContent(a);
    // Before the approval there is no report to follow: 409 naming where the analysis is.
    const early = await request(t.app).get(`/api/lab/analyses/${a.analysisId}/issuance`).set(await t.authFor('reviewer'));
    expect(early.status).toBe(409);
    expect(early.body.detail).toBe('This analysis is submitted; it has no approval, so no report is being issued.');
    const res = await approve(a);
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ analysisId: a.analysisId, state: 'issuing', report: null, detail: null });
    const report = await issuedReport(t, a.analysisId);
    expect(report.number).toBe(seq(1));
    const [sample] = await t.db.query('SELECT state FROM sample WHERE id = $1', [a.sampleId]);
    expect(sample.state).toBe('reported');
    const [review] = await t.db.query(`SELECT report_id FROM analysis_review WHERE analysis_id = $1 AND decision = 'approved'`, [a.analysisId]);
    expect(review.report_id).toBe(report.id);
    // Another lab's reviewer cannot follow it.
    expect((await request(t.app).get(`/api/lab/analyses/${a.analysisId}/issuance`).set(await t.authFor('reviewer', 'marlow'))).status).toBe(404);
  });

  it('issues once however often the job runs: a repeated job answers the report already issued', async () => {
    const a = await insertSubmittedAnalysis(t.db.manager, CALDER);
    withDemoContent(a);
    expect((await approve(a)).status).toBe(202);
    const first = await issuedReport(t, a.analysisId);
    const again = await Promise.all([issueApprovedReport({ labId: a.labId, analysisId: a.analysisId }), issueApprovedReport({ labId: a.labId, analysisId: a.analysisId })]);
    expect(again.map((r) => [r.number, r.already])).toEqual([[first.number, true], [first.number, true]]);
    expect(await countsFor(a.analysisId)).toEqual({ reports: 1, audits: 1, held_claims: 0 });
    const mails = await t.db.query(`SELECT count(*)::int AS n FROM email_outbox WHERE subject = $1`, [`Test report ${first.number} is ready`]);
    expect(mails[0].n).toBeGreaterThan(0);
    const notices = await t.db.query(`SELECT to_address, count(*)::int AS n FROM email_outbox WHERE subject = $1 GROUP BY to_address HAVING count(*) > 1`, [`Test report ${first.number} is ready`]);
    expect(notices).toEqual([]);
  });

  it('survives a crash after signing and before commit: the retry issues one report under the number the failed attempt had claimed', async () => {
    const a = await insertSubmittedAnalysis(t.db.manager, CALDER);
    withDemoContent(a);
    const [{ last_value: before }] = await t.db.query('SELECT last_value FROM report_number_sequence WHERE year = $1', [year]);
    const move = sampleAccess.moveSample;
    let crashes = 0;
    // The report is rendered, signed and inserted; the transaction dies before it commits.
    jest.spyOn(sampleAccess, 'moveSample').mockImplementation(async (...args) => {
      if (crashes++ === 0) throw new Error('worker lost its database connection');
      return move(...args);
    });
    expect((await approve(a)).status).toBe(202);
    const report = await issuedReport(t, a.analysisId, 60_000);
    expect(crashes).toBe(2);
    expect(report.number).toBe(seq(before + 1));
    const [{ last_value: after }] = await t.db.query('SELECT last_value FROM report_number_sequence WHERE year = $1', [year]);
    expect(after).toBe(before + 1);
    expect(await countsFor(a.analysisId)).toEqual({ reports: 1, audits: 1, held_claims: 0 });
  });

  it('issues four approvals made at once under four consecutive numbers', async () => {
    const four = await Promise.all([0, 1, 2, 3].map(() => insertSubmittedAnalysis(t.db.manager, CALDER)));
    jest.spyOn(reportContent, 'reportContentFor').mockImplementation(async (_m, analysis) => {
      const a = four.find((x) => x.analysisId === analysis.id)!;
      return { content: demoReportContent({ sample: { ...demoReportContent().sample, code: a.sampleCode } }), clientOrganisationId: a.clientOrganisationId };
    });
    const [{ last_value: before }] = await t.db.query('SELECT last_value FROM report_number_sequence WHERE year = $1', [year]);
    const answers = await Promise.all(four.map(approve));
    expect(answers.map((r) => r.status)).toEqual([202, 202, 202, 202]);
    const numbers = (await Promise.all(four.map((a) => issuedReport(t, a.analysisId)))).map((r) => r.number).sort();
    expect(numbers).toEqual([1, 2, 3, 4].map((i) => seq(before + i)));
  });

  it('refuses to show an issuance for an analysis nobody approved', async () => {
    const a = await insertSubmittedAnalysis(t.db.manager, CALDER);
    const res = await request(t.app).get(`/api/lab/analyses/${a.analysisId}/issuance`).set(await t.authFor('reviewer'));
    expect(res.status).toBe(409);
    expect((await request(t.app).post(`/api/lab/analyses/${a.analysisId}/issuance/retry`).set(await t.authFor('reviewer'))).status).toBe(409);
  });
});
