// Classical MDS of 2,000 spectra (the iterative solver), from their spectral distance matrix.
import { classicalMds, distanceMatrix, logGrid } from '../../../libs/spectral-engine/src/index';
import { median, syntheticLibrary } from './synthetic-library';

const COUNT = 2000;
const POINTS = 32;

export async function run(): Promise<void> {
  const spectra = syntheticLibrary(COUNT, logGrid(1, 1e6, POINTS), 12, 5050);
  const common = { bench: 'mds.bench.ts', points: COUNT, dims: 2 };
  let t0 = performance.now();
  const d = distanceMatrix(spectra);
  console.log(JSON.stringify({ figure: 'distance matrix of 2,000 spectra', value: Math.round(performance.now() - t0), unit: 'ms', frequencies: POINTS, ...common }));
  const times: number[] = [];
  let result = classicalMds(d, 2);
  for (let i = 0; i < 3; i++) {
    t0 = performance.now();
    result = classicalMds(d, 2);
    times.push(performance.now() - t0);
  }
  console.log(JSON.stringify({ figure: 'classical MDS of 2,000 points, median of 3', value: Math.round(median(times)), fastest: Math.round(Math.min(...times)), unit: 'ms', limit: 1000, method: result.method, ...common }));
  console.log(JSON.stringify({ figure: 'leading eigenvalues and smallest estimate', value: result.eigenvalues, smallestEigenvalue: result.smallestEigenvalue, ...common }));
}
