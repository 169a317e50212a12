// Top-10 search of one 64-frequency spectrum over 100,000 references, on two library shapes: tight
// (40 invented products, thousands of lots each) and broad (every spectrum its own, one reference
// near the query). The packed index against SciPy's cdist(metric='canberra') + argpartition on the
// same data, in the same run, printed side by side.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createSpectrumIndex, logGrid, type Spectrum } from '../../../libs/spectral-engine/src/index';
import { broadLibrary, median, syntheticLibrary } from './synthetic-library';

const COUNT = 100_000;
const POINTS = 64;
const K = 10;
const REPEATS = 15;

interface ShapeFigures {
  readonly shape: string;
  readonly oursMs: number;
  readonly scipyMs: number | null;
  readonly ratio: number | null;
  readonly identical: boolean | null;
}

function measure(shape: string, library: Spectrum[], query: Spectrum): ShapeFigures {
  const width = 2 * POINTS;
  const common = { bench: 'search.bench.ts', shape, references: COUNT, frequencies: POINTS, k: K };
  const buildTimes: number[] = [];
  let index = createSpectrumIndex(library);
  for (let i = 0; i < 3; i++) {
    const t0 = performance.now();
    index = createSpectrumIndex(library);
    buildTimes.push(performance.now() - t0);
  }
  index.nearest(query, K);
  const searchTimes: number[] = [];
  let ours = index.nearest(query, K);
  for (let i = 0; i < REPEATS; i++) {
    const t0 = performance.now();
    ours = index.nearest(query, K);
    searchTimes.push(performance.now() - t0);
  }
  const oursMs = median(searchTimes);
  const oursFastest = Math.min(...searchTimes);
  console.log(JSON.stringify({ figure: 'index top-10 search, median', value: Number(oursMs.toFixed(2)), fastest: Number(oursFastest.toFixed(2)), unit: 'ms', ...common }));
  const rawBytes = COUNT * width * Float64Array.BYTES_PER_ELEMENT;
  console.log(JSON.stringify({ figure: 'index memory / raw re+im data', value: Number((index.byteLength / rawBytes).toFixed(4)), unit: 'ratio', limit: 1.5, indexBytes: index.byteLength, rawBytes, ...common }));
  console.log(JSON.stringify({ figure: 'index build, median of 3', value: Math.round(median(buildTimes)), fastest: Math.round(Math.min(...buildTimes)), unit: 'ms', limit: 1000, ...common }));

  const dir = mkdtempSync(join(tmpdir(), 'ohmprint-search-'));
  try {
    const file = join(dir, 'library.f64');
    const raw = new Float64Array((COUNT + 1) * width);
    [...library, query].forEach((s, r) => {
      raw.set(s.re, r * width);
      raw.set(s.im, r * width + POINTS);
    });
    writeFileSync(file, Buffer.from(raw.buffer));
    const python = spawnSync('python3', [join(__dirname, 'search-scipy.py'), file, String(COUNT), String(width), String(K), String(REPEATS)], {
      encoding: 'utf8',
      maxBuffer: 16 << 20,
    });
    if (python.status !== 0) {
      console.log(JSON.stringify({ figure: 'scipy cdist + argpartition top-10, median', value: null, unit: 'ms', error: python.stderr.trim(), ...common }));
      return { shape, oursMs, scipyMs: null, ratio: null, identical: null };
    }
    const scipy = JSON.parse(python.stdout) as { medianMs: number; fastestMs: number; top: number[]; distances: number[]; versions: string };
    console.log(JSON.stringify({ figure: 'scipy cdist + argpartition top-10, median', value: Number(scipy.medianMs.toFixed(2)), fastest: Number(scipy.fastestMs.toFixed(2)), unit: 'ms', versions: scipy.versions, ...common }));
    // The fastest of several runs is the figure least disturbed by other work on a shared machine.
    const ratio = oursMs / scipy.medianMs;
    console.log(JSON.stringify({ figure: 'index time / scipy time', value: Number(ratio.toFixed(3)), fastestRatio: Number((oursFastest / scipy.fastestMs).toFixed(3)), unit: 'ratio', aim: '≤ 0.5', ...common }));
    const identical = ours.length === scipy.top.length && ours.every((hit, i) => hit.index === scipy.top[i]);
    const largestGap = Math.max(...ours.map((hit, i) => Math.abs(hit.distance - scipy.distances[i])));
    console.log(JSON.stringify({ figure: 'top-10 identical to scipy', value: identical, largestDistanceDifference: largestGap, ...common }));
    return { shape, oursMs, scipyMs: scipy.medianMs, ratio, identical };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export async function run(): Promise<void> {
  const grid = logGrid(0.1, 1e6, POINTS);
  const tight = syntheticLibrary(COUNT + 1, grid, 40, 20261202);
  // The query is one more lot of an existing product, not a copy of a library entry.
  const tightQuery = tight.pop()!;
  const figures = [measure('tight', tight, tightQuery)];
  tight.length = 0;
  const broad = broadLibrary(COUNT, grid, 20261203);
  figures.push(measure('broad', broad.library, broad.query));
  const side = Object.fromEntries(figures.map((f) => [f.shape, { oursMs: Number(f.oursMs.toFixed(2)), scipyMs: f.scipyMs === null ? null : Number(f.scipyMs.toFixed(2)), ratio: f.ratio === null ? null : Number(f.ratio.toFixed(3)), identical: f.identical }]));
  console.log(JSON.stringify({ bench: 'search.bench.ts', figure: 'top-10 search, index / scipy, both library shapes', value: side, aim: 'ratio ≤ 0.5 on both, identical top-10', references: COUNT, frequencies: POINTS, k: K }));
}
