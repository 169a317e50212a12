// The API and the job worker as `npm start` runs them: the compiled files under dist/, each in a
// process of its own, logging to .data/logs/<name>.log. A bench that wants the API's own figures
// (memory, event loop, queues) starts it with the probe preloaded (support/api-process-probe.cjs).
import { fork, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, openSync } from 'node:fs';
import { createServer, type AddressInfo } from 'node:net';
import { join } from 'node:path';

const ROOT = join(__dirname, '..', '..', '..');
const DIST = join(ROOT, 'dist', 'api', 'apps', 'api', 'src');

/** What the probe reports for one phase (see api-process-probe.cjs). */
export interface ProcessFigures {
  eventLoopDelayP99Ms: number;
  eventLoopStallMaxMs: number;
  rssPeakBytes: number;
  heapUsedPeakBytes: number;
  externalPeakBytes: number;
  cpuQueuePeak: number;
  dbPoolWaitingPeak: number;
  cpuSeconds: number;
  wholeRunRssPeakBytes: number;
  cpuWorkers: number;
}

export interface BuiltProcess {
  child: ChildProcess;
  pid: number;
  /** `http://127.0.0.1:<port>/api` for an API process. */
  base: string;
  /** Probed processes only: resets the probe's peaks; `phaseEnd` answers the figures since. */
  phaseStart: () => Promise<void>;
  phaseEnd: () => Promise<ProcessFigures>;
  stop: () => Promise<void>;
}

export async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const { port } = server.address() as AddressInfo;
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}

/**
 * Starts `main.js` (the API, waited for until /api/health answers) or `worker.js` with the given
 * environment on top of this one. `profileDir`: every thread writes a V8 CPU profile there on exit.
 */
export async function startBuiltProcess(
  script: 'main.js' | 'worker.js',
  name: string,
  env: Record<string, string>,
  options: { probe?: boolean; profileDir?: string } = {},
): Promise<BuiltProcess> {
  if (!existsSync(join(DIST, script))) throw new Error(`${join(DIST, script)} is missing: npm run build:api`);
  const port = script === 'main.js' ? await freePort() : 0;
  mkdirSync(join(ROOT, '.data', 'logs'), { recursive: true });
  const log = join(ROOT, '.data', 'logs', `${name}.log`);
  const out = openSync(log, 'w');
  const execArgv = [
    ...(options.probe ? ['--require', join(__dirname, 'api-process-probe.cjs')] : []),
    ...(options.profileDir ? ['--cpu-prof', `--cpu-prof-dir=${options.profileDir}`] : []),
  ];
  const child = fork(join(DIST, script), [], {
    env: { ...process.env, ...env, ...(port ? { PORT: String(port) } : {}) },
    execArgv,
    stdio: ['ignore', out, out, 'ipc'],
  });
  const base = `http://127.0.0.1:${port}/api`;
  if (script === 'main.js') {
    for (let i = 0; ; i++) {
      if (await fetch(`${base}/health`).then((r) => r.ok).catch(() => false)) break;
      if (child.exitCode !== null || i > 300) throw new Error(`${name} did not start; see ${log}`);
      await new Promise((r) => setTimeout(r, 100));
    }
  }
  const ask = <T>(cmd: string, answer: string) =>
    new Promise<T>((resolve) => {
      const onMessage = (m: { cmd: string; figures?: T }) => {
        if (m.cmd !== answer) return;
        child.off('message', onMessage);
        resolve(m.figures as T);
      };
      child.on('message', onMessage);
      child.send({ cmd });
    });
  return {
    child,
    pid: child.pid!,
    base,
    phaseStart: () => ask<void>('phase-start', 'phase-started'),
    phaseEnd: () => ask<ProcessFigures>('phase-end', 'phase-figures'),
    stop: () => new Promise<void>((r) => (child.exitCode !== null ? r() : (child.once('exit', () => r()), child.kill('SIGTERM')))),
  };
}
