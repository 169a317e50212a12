// Preloaded into a built API process by the availability bench (`node --require` this file
// dist/.../main.js, forked with an IPC channel), so the figures are those of the API as `npm start`
// runs it: compiled, alone in its process, with its own worker threads. Plain CommonJS because a
// preload runs before anything could compile TypeScript. On {cmd: 'phase-start'} it resets its
// peaks; on {cmd: 'phase-end'} it answers with the phase's figures. Watches the process's memory
// (resident, JavaScript heap, buffers outside it), the event loop's delay, the CPU pool's queue,
// the database pool's waiting requests and the CPU the process used.
// Worker threads inherit the preload: only the main thread probes.
if (require('node:worker_threads').isMainThread) startProbe();

function startProbe() {
  const { join } = require('node:path');
  const { monitorEventLoopDelay } = require('node:perf_hooks');

  const dist = join(process.argv[1], '..');
  const { cpuPoolLoad, cpuWorkerCount } = require(join(dist, 'core', 'cpu-pool', 'cpu-pool.js'));
  const { dataSource } = require(join(dist, 'db', 'data-source.js'));

  let peaks = { rss: 0, heapUsed: 0, external: 0, cpuQueue: 0, dbWaiting: 0 };
  let wholeRunRss = 0;
  let loop = null;
  let cpuAtStart = process.cpuUsage();

  function dbWaiting() {
    const pool = dataSource.isInitialized ? dataSource.driver.master : null;
    return pool ? pool.waitingCount : 0;
  }

  const sampler = setInterval(() => {
    const m = process.memoryUsage();
    peaks.rss = Math.max(peaks.rss, m.rss);
    peaks.heapUsed = Math.max(peaks.heapUsed, m.heapUsed);
    peaks.external = Math.max(peaks.external, m.external);
    peaks.cpuQueue = Math.max(peaks.cpuQueue, cpuPoolLoad().queued);
    peaks.dbWaiting = Math.max(peaks.dbWaiting, dbWaiting());
    wholeRunRss = Math.max(wholeRunRss, m.rss);
  }, 20);
  sampler.unref();

  process.on('message', (message) => {
    if (!message || typeof message !== 'object') return;
    if (message.cmd === 'phase-start') {
      peaks = { rss: process.memoryUsage().rss, heapUsed: 0, external: 0, cpuQueue: 0, dbWaiting: 0 };
      loop = monitorEventLoopDelay({ resolution: 10 });
      loop.enable();
      cpuAtStart = process.cpuUsage();
      process.send({ cmd: 'phase-started' });
    } else if (message.cmd === 'phase-end') {
      loop.disable();
      const cpu = process.cpuUsage(cpuAtStart);
      process.send({
        cmd: 'phase-figures',
        figures: {
          eventLoopDelayP99Ms: loop.percentile(99) / 1e6,
          eventLoopStallMaxMs: loop.max / 1e6,
          rssPeakBytes: peaks.rss,
          heapUsedPeakBytes: peaks.heapUsed,
          externalPeakBytes: peaks.external,
          cpuQueuePeak: peaks.cpuQueue,
          dbPoolWaitingPeak: peaks.dbWaiting,
          cpuSeconds: (cpu.user + cpu.system) / 1e6,
          wholeRunRssPeakBytes: wholeRunRss,
          cpuWorkers: cpuWorkerCount(),
        },
      });
    }
  });
}
