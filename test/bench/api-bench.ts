/**
 * API figures for the lab workflow, printed as JSON lines (`npm run bench`):
 *   - one sample's analysis against a published 1,000-lot library, through HTTP (budget 150 ms);
 *   - a reviewer's approval, which issues the signed PDF report (budget 1.5 s);
 * Runs against a freshly migrated database of its own, seeded with the invented demo, and drops
 * it afterwards. Figures, not pass/fail: the budgets are printed beside them.
 */
import { performance } from 'node:perf_hooks';
import { demoBenchDatabase } from './support/demo-database';
import { line, round, stats } from './support/figures';
import { approveAndWait, startInProcessJobs, stopInProcessJobs } from './support/bench-jobs';
import { startBenchApi } from './support/bench-api';

process.env.LOG_LEVEL = 'silent';
process.env.OUTBOX_WORKER = 'false';

const ANALYSIS_RUNS = 20;
const REPORT_RUNS = 5;
const LIBRARY_LOTS = 1000;


async function main(): Promise<void> {
  const db = await demoBenchDatabase('ohmprint_bench');
  const { dataSource } = await import('../../apps/api/src/db/data-source');
  dataSource.setOptions({ database: db.name, poolSize: 4 });
  await dataSource.initialize();
  let server: import('node:http').Server | undefined;
  try {
    // Approvals queue the report as a job: this bench runs a worker in its own process, as tests do.
    await startInProcessJobs();

    const { DEMO_PROFILES, demoLots } = await import('../../docker-free-scripts/seed/lab-demo-spectra');
    const { DEFAULT_METHOD } = await import('../../apps/api/src/modules/libraries/default-method');
    const { methodGrid } = await import('../../apps/api/src/modules/measurements/prepared-replicates');
    const { createDraftVersion, libraryOf, publishVersion } = await import('../../apps/api/src/modules/libraries/library-versions');
    const [ctx] = await dataSource.query(
      `SELECT p.id AS product_id, p.lab_id, (SELECT id FROM app_user WHERE email = 'admin@calder.test') AS admin_id,
              (SELECT id FROM app_user WHERE email = 'analyst@calder.test') AS analyst_id,
              (SELECT id FROM app_user WHERE email = 'reviewer@calder.test') AS reviewer_id
       FROM product p WHERE p.name = 'Ridgeline Red (demo)'`,
    );
    const method = { ...DEFAULT_METHOD, model: DEMO_PROFILES['ridgeline-red'].model };
    const grid = methodGrid(method);
    const t0 = performance.now();
    const versionId = await dataSource.transaction(async (m) => {
      const library = await libraryOf(m, ctx.lab_id, ctx.product_id);
      const id = await createDraftVersion(m, ctx.lab_id, library.id, method, grid, demoLots(DEMO_PROFILES['ridgeline-red'], grid, LIBRARY_LOTS, 'bench-ridgeline-red'));
      await publishVersion(m, ctx.lab_id, id, ctx.admin_id);
      return id;
    });
    line({ bench: 'publish-library', lots: LIBRARY_LOTS, ms: round(performance.now() - t0), note: 'store, calibrate (leave-one-out) and freeze' });

    const { demoFiles } = await import('../../docker-free-scripts/seed/lab-demo-files');
    const api = await startBenchApi(ctx);
    server = api.server;
    const { base, analyst, reviewer } = api;
    const call = async (method: string, path: string, auth: Record<string, string>, body?: unknown) => (await api.call(method, path, auth, body)).json;
    const bench = await call('GET', '/lab/bench', analyst);
    const files = demoFiles().filter((f) => f.sampleCode === 'OP-7K3M-Q9');

    /** A fresh accepted sample of the product with the authentic-like demo replicates uploaded. */
    const { newSampleCode } = await import('../../apps/api/src/modules/samples/sample-code');
    const [order] = await dataSource.query(`SELECT order_id FROM sample WHERE code = 'OP-7K3M-Q9'`);
    const measuredSample = async (): Promise<string> => {
      const code = newSampleCode();
      const [s] = await dataSource.query(
        `INSERT INTO sample (lab_id, order_id, code, state, obtained_where, obtained_on, received_at) VALUES ($1, $2, $3, 'accepted', 'Bench (invented)', '2026-11-30', now()) RETURNING id`,
        [ctx.lab_id, order.order_id, code],
      );
      const form = new FormData();
      form.set('instrumentId', bench.instruments[0].id);
      form.set('cellId', bench.cells[0].id);
      form.set('temperatureC', String(files[0].temperatureC));
      // The files name their sample; each fresh sample gets files that name it.
      for (const f of files) form.append('files', new Blob([f.text.replaceAll('OP-7K3M-Q9', code)]), f.fileName.replace('OP-7K3M-Q9', code));
      const res = await fetch(`${base}/lab/samples/${s.id}/measurements`, { method: 'POST', headers: analyst, body: form });
      if (res.status !== 201) throw new Error(`upload answered ${res.status}: ${await res.text()}`);
      return s.id;
    };

    const sampleId = await measuredSample();
    const timings: number[] = [];
    let first = 0;
    let verdict = '';
    for (let i = 0; i <= ANALYSIS_RUNS; i++) {
      const start = performance.now();
      const a = await call('POST', `/lab/samples/${sampleId}/analyses`, analyst, { libraryVersionId: versionId });
      const ms = performance.now() - start;
      verdict = a.result.verdict;
      if (i === 0) first = ms;
      else timings.push(ms);
    }
    const analysis = stats(timings);
    line({ bench: 'analysis-at-api', lots: LIBRARY_LOTS, ...analysis, firstMs: round(first), firstNote: 'includes loading and decoding the library', verdict, budgetMs: 150, withinBudget: analysis.p50Ms <= 150 });

    // The same work without HTTP and the database, to show where the time goes.
    const { computeAnalysis } = await import('../../apps/api/src/modules/analyses/compute-analysis');
    const { publishedLibrary } = await import('../../apps/api/src/modules/libraries/published-library');
    const { Replicate } = await import('../../apps/api/src/modules/measurements/replicate.entity');
    const library = await publishedLibrary(dataSource.manager, ctx.lab_id, versionId);
    const replicates = await dataSource.manager.find(Replicate, { where: { sampleId, excluded: false } });
    const engineOnly: number[] = [];
    for (let i = 0; i < ANALYSIS_RUNS; i++) {
      const start = performance.now();
      computeAnalysis(replicates, library);
      engineOnly.push(performance.now() - start);
    }
    line({ bench: 'analysis-computation-only', lots: LIBRARY_LOTS, ...stats(engineOnly), note: 'normalise, resample, average, distances, verdict, map, fit' });

    const reportTimings: number[] = [];
    let firstReport = 0;
    for (let i = 0; i <= REPORT_RUNS; i++) {
      const id = await measuredSample();
      const a = await call('POST', `/lab/samples/${id}/analyses`, analyst, { libraryVersionId: versionId });
      await call('POST', `/lab/analyses/${a.id}/submit`, analyst);
      const start = performance.now();
      await approveAndWait(base, reviewer, a.id);
      const ms = performance.now() - start;
      if (i === 0) firstReport = ms;
      else reportTimings.push(ms);
    }
    const report = stats(reportTimings);
    line({ bench: 'approve-and-issue-signed-report', ...report, firstMs: round(firstReport), firstNote: "includes creating the lab's development signing credential", budgetMs: 1500, withinBudget: report.p50Ms <= 1500 });

    // Availability under load (sign-in floods, the largest upload, memory) is measured in api-availability-bench.ts.

    // Four approvals at once against one alone, with a real worker process: api-jobs-bench.ts.
  } finally {
    await stopInProcessJobs();
    await (await import('../../apps/api/src/core/cpu-pool/cpu-pool')).closeCpuPool();
    await new Promise((r) => (server ? server.close(r) : r(undefined)));
    await dataSource.destroy();
    await db.drop();
  }
}

main().catch((err) => {
  console.error(err);
  process.exitCode = 1;
});
