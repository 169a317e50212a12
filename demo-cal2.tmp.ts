import { averageReplicates, calibrate, judge, parseSpectrumFile, relativeWidth } from '@ohmprint/spectral-engine';
import { DEFAULT_METHOD } from './apps/api/src/modules/libraries/default-method';
import { methodGrid, prepareReplicates } from './apps/api/src/modules/measurements/prepared-replicates';
import { DEMO_PRODUCTS, DEMO_SAMPLES } from './docker-free-scripts/seed/lab-demo-catalog';
import { demoFiles, DEMO_CELL_CONSTANT } from './docker-free-scripts/seed/lab-demo-files';
import { DEMO_PROFILES, demoLots } from './docker-free-scripts/seed/lab-demo-spectra';
const grid = methodGrid(DEFAULT_METHOD);
const counts = (process.argv[2] ?? '12').split(',').map(Number);
const w = Number(process.env.W ?? 0);
const apple = DEMO_SAMPLES.find((x) => x.code === 'OP-6TBS-3H')!;
if (w) apple.files = { ...apple.files!, adulteration: { kind: 'watered', waterFraction: w } };
const files = demoFiles();
for (const s of DEMO_SAMPLES.filter((x) => x.files && (!process.env.ONLY || x.code === process.env.ONLY))) {
  const product = DEMO_PRODUCTS.find((p) => p.key === s.product)!;
  const reps = files.filter((f) => f.sampleCode === s.code).map((f, i) => {
    const sp = parseSpectrumFile(f.text);
    return { id: String(i), replicateNumber: i + 1, fileName: f.fileName, frequencyHz: Array.from(sp.frequencyHz), re: Array.from(sp.re), im: Array.from(sp.im), cellConstantPerCm: DEMO_CELL_CONSTANT, temperatureC: f.temperatureC } as any;
  });
  const prepared = prepareReplicates(reps, DEFAULT_METHOD, grid).map((p) => p.spectrum!);
  const sample = averageReplicates(prepared);
  for (const n of counts) {
    const lots = demoLots(DEMO_PROFILES[product.profile], grid, n, product.key).map((l) => l.spectrum);
    for (const est of ['empirical-type7', 'lognormal-ml'] as const) {
      const c = calibrate(lots, { thresholdEstimator: est });
      const j = judge(sample, lots, c);
      console.log(s.code, s.files!.expect, n, est, j.nearest!.distance.toFixed(5), c.lowerThreshold!.toFixed(5), c.upperThreshold!.toFixed(5), j.verdict, relativeWidth(c.upperThreshold!, c.upperInterval!).toFixed(2));
    }
  }
}
