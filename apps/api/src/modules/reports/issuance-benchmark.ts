import { performance } from 'node:perf_hooks';
import type { DataSource, EntityManager } from 'typeorm';
import { demoReportContent, demoReportData } from './pdf/demo-report-content';
import { renderReportPdf } from './pdf/render-report-pdf';
import { createSelfSignedCredential } from './signing/self-signed-credential';
import { signPdf } from './signing/sign-pdf';
import { issueReport } from './issue-report';
import { insertSubmittedAnalysis } from './submitted-analysis.fixture';

/**
 * Timings for test/bench/api-bench.ts (target: a signed report issued in under 1.5 s).
 * `timeRenderAndSign` needs no database; `timeIssuance` issues real reports for invented demo
 * analyses in the demo lab Calder Analytical of the database `dataSource` points at.
 */
export interface RenderSignTiming {
  renderMs: number;
  signMs: number;
  bytes: number;
}

export async function timeRenderAndSign(runs: number): Promise<RenderSignTiming[]> {
  const passphrase = 'benchmark only';
  const p12 = createSelfSignedCredential({ labName: 'Calder Analytical (demo)', passphrase });
  const data = demoReportData();
  const timings: RenderSignTiming[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    const pdf = await renderReportPdf(data);
    const t1 = performance.now();
    const signed = await signPdf(pdf, p12, passphrase, { reason: `Test report ${data.reportNumber}`, signerName: data.lab.name, location: 'bench', contactInfo: '', signingTime: new Date() });
    timings.push({ renderMs: t1 - t0, signMs: performance.now() - t1, bytes: signed.length });
  }
  return timings;
}

/** Milliseconds per issuance: number, render, sign, store, audit and e-mail in one transaction. */
export async function timeIssuance(dataSource: DataSource, runs: number): Promise<number[]> {
  const who = { labName: 'Calder Analytical', clientName: 'Hollin Ridge Cellars', analystEmail: 'analyst@calder.test', reviewerEmail: 'reviewer@calder.test' };
  const timings: number[] = [];
  for (let i = 0; i < runs; i++) {
    const a = await insertSubmittedAnalysis(dataSource.manager, who);
    const t0 = performance.now();
    await dataSource.transaction(async (manager: EntityManager) => {
      await manager.query(`UPDATE analysis SET status = 'approved' WHERE id = $1`, [a.analysisId]);
      await issueReport(manager, { labId: a.labId, analysisId: a.analysisId, sampleId: a.sampleId, clientOrganisationId: a.clientOrganisationId, actorUserId: a.reviewerUserId, content: demoReportContent() });
    });
    timings.push(performance.now() - t0);
  }
  return timings;
}
