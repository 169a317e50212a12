/**
 * Report issuance as a job, end to end (`npm run bench`): one approval alone against four at once,
 * each timed from the reviewer's POST until the issuance route says the signed report is issued.
 * Runs the built API and one worker as separate processes (as `npm start` does) on a freshly
 * migrated and demo-seeded database of its own, dropped afterwards. Prints JSON lines; the budget
 * (each of four concurrent approvals no slower than 1.5x a lone one) is printed beside the figure.
 */
import { availableParallelism } from 'node:os';
import { performance } from 'node:perf_hooks';
import { startBuiltProcess, type BuiltProcess } from './support/built-processes';
import { demoBenchDatabase } from './support/demo-database';
import { line, median, round } from './support/figures';
import { cpuMsOf, cpuMsOfCommand } from './support/process-cpu';

process.env.LOG_LEVEL = 'silent';

const LONE_RUNS = 5;
const WARM_UP_ISSUANCES = Number(process.env.BENCH_WARM_UP_ISSUANCES ?? 30);
const CONCURRENT_ROUNDS = 3;
/**
 * How often each approval asks the issuance route (the review screen asks each second). Every ask
 * costs the API and PostgreSQL CPU on the same two cores the worker renders on, and four approvals
 * ask four times as often as one: at 20 ms the asking alone took a sizeable share of the machine.
 */
const POLL_MS = Number(process.env.BENCH_POLL_MS ?? 50);

async function main(): Promise<void> {
  const db = await demoBenchDatabase('ohmprint_bench_jobs');
  const database = db.name;
  const { dataSource } = await import('../../apps/api/src/db/data-source');
  dataSource.setOptions({ database, poolSize: 4 });
  await dataSource.initialize();
  const children: BuiltProcess[] = [];
  try {
    const env = { DATABASE_NAME: database, OUTBOX_WORKER: 'false', LOG_LEVEL: 'warn' };
    // BENCH_PROFILE_DIR=<dir>: each process (and each of its threads) writes a V8 CPU profile there when it stops
    const profileDir = process.env.BENCH_PROFILE_DIR;
    const api = await startBuiltProcess('main.js', 'bench-jobs-api', env, { profileDir });
    children.push(api);
    children.push(await startBuiltProcess('worker.js', 'bench-jobs-worker', { ...env, PORT: new URL(api.base).port }, { profileDir }));
    const base = api.base;

    const { signAccessToken } = await import('../../apps/api/src/modules/auth/access-token');
    const { demoFiles } = await import('../../docker-free-scripts/seed/lab-demo-files');
    const { newSampleCode } = await import('../../apps/api/src/modules/samples/sample-code');
    const [ctx] = await dataSource.query(
      `SELECT s.lab_id, s.order_id, (SELECT id FROM app_user WHERE email = 'analyst@calder.test') AS analyst_id,
              (SELECT id FROM app_user WHERE email = 'reviewer@calder.test') AS reviewer_id,
              (SELECT v.id FROM library_version v JOIN reference_library l ON l.id = v.library_id JOIN product p ON p.id = l.product_id
                WHERE p.name = 'Ridgeline Red (demo)' AND v.status = 'published' ORDER BY v.version DESC LIMIT 1) AS version_id
         FROM sample s WHERE s.code = 'OP-7K3M-Q9'`,
    );
    const analyst = { Authorization: `Bearer ${signAccessToken(ctx.analyst_id)}` };
    const reviewer = { Authorization: `Bearer ${signAccessToken(ctx.reviewer_id)}` };
    const call = async (method: string, path: string, auth: Record<string, string>, body?: unknown) => {
      const multipart = body instanceof FormData;
      const res = await fetch(`${base}${path}`, { method, headers: { ...auth, ...(body && !multipart ? { 'content-type': 'application/json' } : {}) }, body: body === undefined ? undefined : multipart ? body : JSON.stringify(body) });
      const json = await res.json();
      if (!res.ok) throw new Error(`${method} ${path} answered ${res.status}: ${JSON.stringify(json)}`);
      return json;
    };
    const bench = await call('GET', '/lab/bench', analyst);
    const files = demoFiles().filter((f) => f.sampleCode === 'OP-7K3M-Q9');
    /** A fresh accepted sample, measured with the demo's authentic-like replicates, analysed and submitted. */
    const submitted = async (): Promise<string> => {
      const code = newSampleCode();
      const [s] = await dataSource.query(
        `INSERT INTO sample (lab_id, order_id, code, state, obtained_where, obtained_on, received_at) VALUES ($1, $2, $3, 'accepted', 'Bench (invented)', '2026-11-30', now()) RETURNING id`,
        [ctx.lab_id, ctx.order_id, code],
      );
      const form = new FormData();
      form.set('instrumentId', bench.instruments[0].id);
      form.set('cellId', bench.cells[0].id);
      form.set('temperatureC', String(files[0].temperatureC));
      for (const f of files) form.append('files', new Blob([f.text.replaceAll('OP-7K3M-Q9', code)]), f.fileName.replace('OP-7K3M-Q9', code));
      await call('POST', `/lab/samples/${s.id}/measurements`, analyst, form);
      const a = await call('POST', `/lab/samples/${s.id}/analyses`, analyst, { libraryVersionId: ctx.version_id });
      await call('POST', `/lab/analyses/${a.id}/submit`, analyst);
      return a.id as string;
    };
    /** `committedMs`: from the POST until pg-boss marked the job completed (just after the report committed), read from the database's clock on this machine, so no poll interval rounds it. */
    type Timing = { answerMs: number; issuedMs: number; committedMs: number; stages: Record<string, number> };
    /** The stages the issuance job timed (its output), read once pg-boss has marked the job completed. */
    const stagesOf = async (id: string): Promise<{ stages: Record<string, number>; completedAtMs: number }> => {
      for (let i = 0; ; i++) {
        const [job]: Array<{ output: { stagesMs?: Record<string, number> } | null; completed_ms: number }> = await dataSource.query(
          `SELECT output, extract(epoch FROM completed_on) * 1000 AS completed_ms FROM pgboss.job WHERE name = 'report-issue' AND singleton_key = $1 AND state = 'completed'
           UNION ALL SELECT output, extract(epoch FROM completed_on) * 1000 FROM pgboss.archive WHERE name = 'report-issue' AND singleton_key = $1 AND state = 'completed'`,
          [id],
        );
        if (job?.output?.stagesMs) return { stages: job.output.stagesMs, completedAtMs: Number(job.completed_ms) };
        if (i > 500) throw new Error(`the issuance job of ${id} did not complete`);
        await new Promise((r) => setTimeout(r, 10));
      }
    };
    /** POST approve (answered 202 at once), then poll the issuance every POLL_MS until issued: both times. */
    const approveUntilIssued = async (id: string): Promise<{ id: string; answerMs: number; issuedMs: number; startedAtMs: number }> => {
      const startedAtMs = Date.now();
      const start = performance.now();
      await call('POST', `/lab/analyses/${id}/approve`, reviewer, { comments: 'Bench approval' });
      const answerMs = performance.now() - start;
      for (;;) {
        const s = await call('GET', `/lab/analyses/${id}/issuance`, reviewer);
        if (s.state === 'issued') return { id, answerMs, issuedMs: performance.now() - start, startedAtMs };
        if (s.state === 'failed') throw new Error(`issuance of ${id} failed`);
        await new Promise((r) => setTimeout(r, POLL_MS));
      }
    };
    /**
     * The timings with the job's stages, read only after every approval of the round is issued (reading
     * them sooner would load the machine while the other issuances of the round still run).
     */
    const withStages = async (timed: Array<{ id: string; answerMs: number; issuedMs: number; startedAtMs: number }>): Promise<Timing[]> =>
      Promise.all(
        timed.map(async ({ id, answerMs, issuedMs, startedAtMs }) => {
          const { stages, completedAtMs } = await stagesOf(id);
          // what the job does not see: the approval's answer, the job's wait, and the poll that noticed the report
          return { answerMs, issuedMs, committedMs: completedAtMs - startedAtMs, stages: { ...stages, outsideJob: round(issuedMs - (stages.pickup ?? 0) - (stages.total ?? 0)) } };
        }),
      );
    const approveToIssued = async (id: string): Promise<Timing> => (await withStages([await approveUntilIssued(id)]))[0];
    /** The median of each stage over a set of issuances (milliseconds). */
    const stageMedians = (timings: Timing[]) => {
      const names = [...new Set(timings.flatMap((t) => Object.keys(t.stages)))];
      return Object.fromEntries(names.map((n) => [n, round(median(timings.map((t) => t.stages[n] ?? 0)))]));
    };

    // Untimed: the lab's first issuance creates its development signing credential, and the next ones
    // let V8 compile the issuing code in the API and the worker (a worker runs for days; a bench's
    // first issuances would otherwise pay for compiling it, on the same two cores). Measured: after 8
    // a lone issuance's job took about 65 ms, after 30 about 55.
    for (let i = 0; i < WARM_UP_ISSUANCES; i++) await approveToIssued(await submitted());
    const lone: Timing[] = [];
    for (let i = 0; i < LONE_RUNS; i++) lone.push(await approveToIssued(await submitted()));
    const loneMedian = median(lone.map((l) => l.issuedMs));
    const loneCommitted = median(lone.map((l) => l.committedMs));
    line({ bench: 'jobs-lone-approval-to-issued-report', n: LONE_RUNS, committedMedianMs: round(loneCommitted), medianMs: round(loneMedian), minMs: round(Math.min(...lone.map((l) => l.issuedMs))), maxMs: round(Math.max(...lone.map((l) => l.issuedMs))), approvalAnswerMedianMs: round(median(lone.map((l) => l.answerMs))) });
    line({ bench: 'jobs-lone-issuance-stages', n: LONE_RUNS, medianMs: stageMedians(lone) });

    // Where the machine's CPU goes during the four-at-once rounds, per issuance: what bounds the ratio on two cores.
    const [apiProcess, workerProcess] = children;
    const cpuNow = () => ({ api: cpuMsOf(apiProcess.pid), worker: cpuMsOf(workerProcess.pid), postgres: cpuMsOfCommand('postgres'), bench: process.cpuUsage().user / 1000 + process.cpuUsage().system / 1000 });
    const cpuSpent: Record<string, number> = {};
    let concurrentWallMs = 0;
    const slowest: number[] = [];
    const all: number[] = [];
    const answers: number[] = [];
    const concurrent: Timing[] = [];
    for (let r = 0; r < CONCURRENT_ROUNDS; r++) {
      // Prepared one after another (the API admits two uploads per lab at a time); only the approvals run at once.
      const four: string[] = [];
      for (let k = 0; k < 4; k++) four.push(await submitted());
      const roundStart = performance.now();
      const cpuBefore = cpuNow();
      const issued = await Promise.all(four.map(approveUntilIssued));
      concurrentWallMs += performance.now() - roundStart;
      // read once the jobs are marked completed, so their last bookkeeping counts too
      const timings = await withStages(issued);
      const cpuAfter = cpuNow();
      for (const k of Object.keys(cpuBefore) as Array<keyof typeof cpuBefore>) cpuSpent[k] = (cpuSpent[k] ?? 0) + cpuAfter[k] - cpuBefore[k];
      slowest.push(Math.max(...timings.map((t) => t.issuedMs)));
      all.push(...timings.map((t) => t.issuedMs));
      answers.push(...timings.map((t) => t.answerMs));
      concurrent.push(...timings);
    }
    const issuances = CONCURRENT_ROUNDS * 4;
    // from the four POSTs until their jobs are marked completed; 10 ms ticks
    line({
      bench: 'jobs-concurrent-cpu-per-issuance',
      n: issuances,
      cpuMs: Object.fromEntries(Object.entries(cpuSpent).map(([k, v]) => [k, round(v / issuances)])),
      wallMsPerRound: round(concurrentWallMs / CONCURRENT_ROUNDS),
    });
    line({ bench: 'jobs-concurrent-issuance-stages', n: concurrent.length, medianMs: stageMedians(concurrent), slowestOfEachFourMs: concurrent.filter((_, i) => i % 4 === 0).map((_, r) => { const four = concurrent.slice(r * 4, r * 4 + 4); return four.reduce((a, b) => (b.issuedMs > a.issuedMs ? b : a)).stages; }) });
    const slowestMedian = median(slowest);
    const slowestCommitted = median(Array.from({ length: CONCURRENT_ROUNDS }, (_, r) => Math.max(...concurrent.slice(r * 4, r * 4 + 4).map((t) => t.committedMs))));
    const loneAnswer = median(lone.map((l) => l.answerMs));
    line({
      bench: 'jobs-four-concurrent-approvals-to-issued-reports',
      pollMs: POLL_MS,
      rounds: CONCURRENT_ROUNDS,
      eachMedianMs: round(median(all)),
      slowestOfFourMedianMs: round(slowestMedian),
      loneMedianMs: round(loneMedian),
      slowestVsLone: round(slowestMedian / loneMedian),
      // the same without the poll's rounding: POST until the job was marked completed
      committedSlowestOfFourMedianMs: round(slowestCommitted),
      committedLoneMedianMs: round(loneCommitted),
      committedSlowestVsLone: round(slowestCommitted / loneCommitted),
      // the soonest four issuances can all be done: their CPU (every process) spread over every core
      cpuFloorForFourMs: round((4 * Object.values(cpuSpent).reduce((a, b) => a + b, 0)) / issuances / availableParallelism()),
      cores: availableParallelism(),
      approvalAnswerMaxMs: round(Math.max(...answers)),
      approvalAnswerMedianMs: round(median(answers)),
      approvalAnswerVsLone: round(median(answers) / loneAnswer),
      budget: 'each of four concurrent approvals no slower than 1.5x a lone one',
      withinBudget: slowestMedian <= 1.5 * loneMedian,
      note: 'one API and one worker process; the worker renders and signs in its piscina pool (every core, threads kept warm). Nothing serialises the four (no lock is held while a report renders and signs): they share the machine, so the slowest ends near cpuFloorForFourMs, the CPU the four need over the cores there are. A lone issuance is itself mostly CPU, so on two cores four take at least about twice as long as one whatever each costs; the poll-based ratio also moves with where the poll falls (a lone report issued just after a poll waits for the next one, 50 ms later)',
    });
  } finally {
    await Promise.all(children.map((c) => c.stop()));
    await dataSource.destroy();
    await db.drop();
  }
}

main().catch((err) => {
  console.error(err);
  process.exitCode = 1;
});
