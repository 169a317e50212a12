// Engine benchmarks: runs every test/bench/engine/*.bench.ts in turn; each prints one JSON line per figure.
import { readdirSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { join } from 'node:path';

interface BenchModule {
  run(): Promise<void>;
}

async function main(): Promise<void> {
  const folder = join(__dirname, 'engine');
  const files = readdirSync(folder)
    .filter((name) => name.endsWith('.bench.ts'))
    .sort();
  // Figures on a shared machine swing with its load: print it beside them.
  console.log(JSON.stringify({ bench: 'engine-bench.ts', figure: 'load average (1 min) at start', value: loadavg()[0], cores: availableParallelism() }));
  let failed = 0;
  for (const file of files) {
    const started = performance.now();
    try {
      const bench = (await import(join(folder, file))) as BenchModule;
      await bench.run();
    } catch (error) {
      failed++;
      console.log(JSON.stringify({ bench: file, figure: 'benchmark failed', value: null, error: (error as Error).stack ?? String(error) }));
    }
    console.log(JSON.stringify({ bench: file, figure: 'wall time of this benchmark file', value: Math.round(performance.now() - started), unit: 'ms', loadAverage: loadavg()[0] }));
  }
  if (failed > 0) process.exitCode = 1;
}

void main();
