// Fitting speed and recovery: fitModel against SciPy's least_squares on the same 200 Cole–Cole spectra.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { fitModel, guessParameters, impedance } from '../../../libs/spectral-engine/src/index';

const CASES = 200;
const POINTS = 50;
const NAMES = ['rInf', 'r0', 'tau', 'alpha'] as const;

/** Small seeded generator (mulberry32) so every run fits the same spectra. */
function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const logUniform = (u: number, lo: number, hi: number): number => Math.exp(Math.log(lo) + u * (Math.log(hi) - Math.log(lo)));
const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
const recovered = (fitted: readonly number[], truth: readonly number[]): boolean =>
  fitted.every((v, j) => Math.abs(v - truth[j]) <= 0.005 * Math.abs(truth[j]));

export async function run(): Promise<void> {
  const random = seeded(20260);
  const frequencyHz = Float64Array.from({ length: POINTS }, (_, i) => 10 ** ((6 * i) / (POINTS - 1)));
  const cases = Array.from({ length: CASES }, () => {
    const rInf = logUniform(random(), 10, 200);
    const r0 = rInf + logUniform(random(), 100, 5000);
    const tau = 1 / (2 * Math.PI * logUniform(random(), 100, 1e4));
    const alpha = 0.5 + 0.45 * random();
    const truth = [rInf, r0, tau, alpha];
    return { truth, spectrum: impedance('cole-cole', { rInf, r0, tau, alpha }, frequencyHz) };
  });

  const ours: number[] = [];
  let oursRecovered = 0;
  for (const c of cases) {
    const t0 = performance.now();
    const fit = fitModel(c.spectrum, 'cole-cole');
    ours.push(performance.now() - t0);
    if (fit.converged && recovered(NAMES.map((n) => fit.parameters[n]), c.truth)) oursRecovered++;
  }

  const input = JSON.stringify({
    frequencyHz: Array.from(frequencyHz),
    cases: cases.map((c) => ({ re: Array.from(c.spectrum.re), im: Array.from(c.spectrum.im), start: NAMES.map((n) => guessParameters(c.spectrum, 'cole-cole')[n]) })),
  });
  const python = spawnSync('python3', [join(__dirname, 'fit-scipy.py')], { input, encoding: 'utf8', maxBuffer: 64 << 20 });
  const common = { cases: CASES, points: POINTS, model: 'cole-cole', start: 'automatic guess from the spectrum shape' };
  console.log(JSON.stringify({ figure: 'fitModel median time per fit', value: median(ours), unit: 'ms', ...common }));
  console.log(JSON.stringify({ figure: 'fitModel parameter sets recovered within 0.5 %', value: oursRecovered, unit: 'count', ...common }));
  if (python.status !== 0) {
    console.log(JSON.stringify({ figure: 'scipy least_squares comparison', value: null, unit: 'ms', error: python.stderr.trim() }));
    return;
  }
  const reference = JSON.parse(python.stdout) as { scipy: string; parameters: number[][]; millis: number[] };
  const theirsRecovered = reference.parameters.filter((p, i) => recovered(p, cases[i].truth)).length;
  const theirs = median(reference.millis);
  const source = { ...common, reference: `scipy ${reference.scipy} least_squares(method='trf')` };
  console.log(JSON.stringify({ figure: 'scipy median time per fit', value: theirs, unit: 'ms', ...source }));
  console.log(JSON.stringify({ figure: 'scipy parameter sets recovered within 0.5 %', value: theirsRecovered, unit: 'count', ...source }));
  console.log(JSON.stringify({ figure: 'fitModel time relative to scipy', value: median(ours) / theirs, unit: 'ratio', ...source }));
}
