import type { EntityManager } from 'typeorm';
import { useTestApp } from '../../testing';
import * as cpuPool from '../../core/cpu-pool/cpu-pool';
import { demoReportContent } from './pdf/demo-report-content';
import { issueReport, type IssuanceStep } from './issue-report';
import { insertSubmittedAnalysis, type SubmittedAnalysis } from './submitted-analysis.fixture';

jest.setTimeout(90_000);
const t = useTestApp();
const CALDER = { labName: 'Calder Analytical', clientName: 'Hollin Ridge Cellars', analystEmail: 'analyst@calder.test', reviewerEmail: 'reviewer@calder.test' };
const year = new Date().getUTCFullYear();

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

const seq = (n: number) => `CAL-${year}-${String(n).padStart(6, '0')}`;

describe('report numbers', () => {
  afterEach(() => jest.restoreAllMocks());

  it('does not hold the lab’s counter while a report renders: a second approval finishes while the first is still rendering', async () => {
    // The lab's first issuance also creates its development signing credential; that one goes alone.
    expect((await approve(await insertSubmittedAnalysis(t.db.manager, CALDER))).number).toBe(seq(1));
    const [slow, quick] = [await insertSubmittedAnalysis(t.db.manager, CALDER), await insertSubmittedAnalysis(t.db.manager, CALDER)];
    const run = cpuPool.runCpuTask;
    let release!: () => void;
    const held = new Promise<void>((r) => (release = r));
    let rendering!: () => void;
    const started = new Promise<void>((r) => (rendering = r));
    let first = true;
    jest.spyOn(cpuPool, 'runCpuTask').mockImplementation((async (name: string, input: unknown) => {
      if (name === 'renderAndSign' && first) {
        first = false;
        rendering();
        await held;
      }
      return run(name as never, input as never);
    }) as typeof run);

    const slowIssue = approve(slow);
    await started;
    let timer: NodeJS.Timeout | undefined;
    const waited = new Promise<never>((_, fail) => (timer = setTimeout(() => fail(new Error('the second approval waited for the first')), 45_000)));
    const quickReport = await Promise.race([approve(quick), waited]).finally(() => {
      clearTimeout(timer);
      release();
    });
    const slowReport = await slowIssue;
    expect([slowReport.number, quickReport.number]).toEqual([seq(2), seq(3)]);
  });

  it('hands a number whose issuance failed to the next report: no gap, no duplicate, also under concurrency', async () => {
    const [{ n: before }] = await t.db.query(`SELECT count(*)::int AS n FROM test_report WHERE number LIKE 'CAL-%'`);
    const failed = await insertSubmittedAnalysis(t.db.manager, CALDER);
    await expect(
      approve(failed, [
        async () => {
          throw new Error('credits could not be consumed');
        },
      ]),
    ).rejects.toThrow('credits could not be consumed');

    const four = await Promise.all([1, 2, 3, 4].map(() => insertSubmittedAnalysis(t.db.manager, CALDER)));
    const issued = await Promise.all(four.map((a) => approve(a)));
    expect(issued.map((r) => r.number).sort()).toEqual([1, 2, 3, 4].map((i) => seq(before + i)));
    const claims = await t.db.query(`SELECT value, state FROM report_number_claim WHERE lab_id = $1 AND year = $2 ORDER BY value`, [four[0].labId, year]);
    expect(claims).toEqual(Array.from({ length: before + 4 }, (_, i) => ({ value: i + 1, state: 'issued' })));
  });
});
