// Benches that approve analyses run a job worker in their own process, as the tests do: approval
// answers 202 and a worker renders, signs and stores the report.

/** Installs pg-boss's schema in the bench database and starts the report worker (no e-mail). */
export async function startInProcessJobs(): Promise<void> {
  const jobs = await import('../../../apps/api/src/core/jobs/jobs');
  await jobs.installJobSchema();
  await jobs.startJobs({ handlers: (await import('../../../apps/api/src/job-handlers')).jobHandlers({ email: false }), pollingIntervalSeconds: 1 });
}

export async function stopInProcessJobs(): Promise<void> {
  await (await import('../../../apps/api/src/core/jobs/jobs')).stopJobs(5);
}

/** Approves (202) and follows the issuance until the worker has issued the signed report. */
export async function approveAndWait(base: string, reviewer: Record<string, string>, analysisId: string, comments = 'Bench approval'): Promise<{ id: string; number: string }> {
  const json = { ...reviewer, 'content-type': 'application/json' };
  const approved = await fetch(`${base}/lab/analyses/${analysisId}/approve`, { method: 'POST', headers: json, body: JSON.stringify({ comments }) });
  if (approved.status !== 202) throw new Error(`approving ${analysisId} answered ${approved.status}: ${await approved.text()}`);
  for (;;) {
    const res = await fetch(`${base}/lab/analyses/${analysisId}/issuance`, { headers: reviewer });
    const s = (await res.json()) as { state: string; report: { id: string; number: string } | null; detail: string | null };
    if (s.state === 'issued' && s.report) return s.report;
    if (s.state === 'failed') throw new Error(`issuance of ${analysisId} failed: ${s.detail}`);
    await new Promise((r) => setTimeout(r, 20));
  }
}
