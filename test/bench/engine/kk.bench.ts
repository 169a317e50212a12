// Speed of the linear Kramers–Kronig test on 100-point spectra, element count searched by μ.
import { impedance, linearKramersKronig } from '../../../libs/spectral-engine/src/index';

const POINTS = 100;
const RUNS = 40;

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return (s[(s.length - 1) >> 1] + s[s.length >> 1]) / 2;
};

export async function run(): Promise<void> {
  const frequencyHz = Float64Array.from({ length: POINTS }, (_, i) => 10 ** (-1 + (6 * i) / (POINTS - 1)));
  const spectra = {
    'rs + zarc': impedance('r-zarc', { rs: 20, r: 100, q: 1e-4, n: 0.8 }, frequencyHz),
    'randles with diffusion tail': impedance('randles-cpe', { rs: 20, rct: 100, q: 25e-6, n: 0.9, sigma: 300 }, frequencyHz),
  };
  for (const [name, s] of Object.entries(spectra)) {
    linearKramersKronig(s);
    const times: number[] = [];
    let elements = 0;
    for (let i = 0; i < RUNS; i++) {
      const t0 = performance.now();
      elements = linearKramersKronig(s).elements;
      times.push(performance.now() - t0);
    }
    console.log(JSON.stringify({ figure: 'linearKramersKronig median time', value: median(times), unit: 'ms', spectrum: name, points: POINTS, elements, runs: RUNS, target: '< 20 ms' }));
  }
}
