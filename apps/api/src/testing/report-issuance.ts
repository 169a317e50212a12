import request from 'supertest';
import type { ApprovalResult } from '@ohmprint/contracts';
import type { TestApp } from './test-app';

/**
 * Approves a submitted analysis as the demo reviewer (202: the report is queued) and waits, as the
 * review screen does, until the file's in-process worker has issued it; the issued report.
 */
export async function approveAndIssue(t: TestApp, analysisId: string, comments = 'Agreed.'): Promise<{ id: string; number: string }> {
  const res = await request(t.app).post(`/api/lab/analyses/${analysisId}/approve`).set(await t.authFor('reviewer')).send({ comments });
  if (res.status !== 202) throw new Error(`approving ${analysisId} answered ${res.status}: ${JSON.stringify(res.body)}`);
  return issuedReport(t, analysisId);
}

/** Polls `GET /lab/analyses/:id/issuance` until the report is issued (throws if it failed or took too long). */
export async function issuedReport(t: TestApp, analysisId: string, ms = 90_000): Promise<{ id: string; number: string }> {
  const reviewer = await t.authFor('reviewer');
  const until = Date.now() + ms;
  for (;;) {
    const res = await request(t.app).get(`/api/lab/analyses/${analysisId}/issuance`).set(reviewer);
    const body = res.body as ApprovalResult;
    if (res.status !== 200) throw new Error(`issuance of ${analysisId} answered ${res.status}: ${JSON.stringify(res.body)}`);
    if (body.state === 'issued' && body.report) return body.report;
    if (body.state === 'failed') throw new Error(`issuance of ${analysisId} failed: ${body.detail}`);
    if (Date.now() > until) {
      const [job] = await t.db.query(`SELECT state, retry_count, output FROM pgboss.job WHERE name = 'report-issue' AND singleton_key = $1 ORDER BY created_on DESC LIMIT 1`, [analysisId]);
      throw new Error(`the report of ${analysisId} was not issued within ${ms} ms; its job: ${JSON.stringify(job)}`);
    }
    await new Promise((r) => setTimeout(r, 100));
  }
}
