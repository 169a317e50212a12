/**
 * Writes the invented instrument exports of the demo suspect samples into demo-files/, in three
 * export shapes, plus one deliberately broken file. Deterministic: rerunning gives the same bytes.
 *   npx tsx docker-free-scripts/seed/lab-demo-files.ts
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Spectrum } from '@ohmprint/spectral-engine';
import { DEFAULT_METHOD } from '../../apps/api/src/modules/libraries/default-method';
import { cellConstantPerCm } from '../../apps/api/src/modules/measurements/cell-constant';
import { DEMO_BENCH, DEMO_PRODUCTS, DEMO_SAMPLES, type DemoSample, type ExportShape } from './lab-demo-catalog';
import { DEMO_PROFILES, demoRandom, demoSweeps, seedFrom, suspectParameters } from './lab-demo-spectra';

export const DEMO_FILES_DIR = join(__dirname, 'demo-files');

/** The demo cell's constant from its seeded KCl calibration, cm⁻¹. */
export const DEMO_CELL_CONSTANT = cellConstantPerCm(DEMO_BENCH.calibration.standardConductivityUsPerCm, DEMO_BENCH.calibration.plateauResistanceOhm);

const fixed = (v: number, digits: number) => v.toPrecision(digits);

function preamble(sample: DemoSample, replicate: number, temperatureC: number, comment: string): string[] {
  return [
    `${comment} INVENTED DEMO DATA - not a measurement`,
    `${comment} Instrument: ${DEMO_BENCH.instrument.name} (${DEMO_BENCH.instrument.model})`,
    `${comment} Sample: ${sample.code}  Replicate: ${replicate}  Temperature: ${temperatureC} C`,
  ];
}

/** Instruments sweep from high to low frequency; the files keep that order. */
function rowsHighToLow(s: Spectrum): number[] {
  return Array.from({ length: s.frequencyHz.length }, (_, i) => s.frequencyHz.length - 1 - i);
}

function render(shape: ExportShape, s: Spectrum, head: string[]): string {
  const order = rowsHighToLow(s);
  switch (shape) {
    case 'comma-real-imaginary':
      return [...head, "Frequency (Hz),Z' (Ohm),Z'' (Ohm)", ...order.map((i) => `${fixed(s.frequencyHz[i], 8)},${fixed(s.re[i], 8)},${fixed(s.im[i], 8)}`)].join('\n') + '\n';
    case 'semicolon-kilo-negative-imaginary':
      return (
        [...head, 'Freq / kHz;Zre / kOhm;-Zim / kOhm', ...order.map((i) => [s.frequencyHz[i] / 1e3, s.re[i] / 1e3, -s.im[i] / 1e3].map((v) => fixed(v, 8).replace('.', ',')).join(';'))].join(
          '\r\n',
        ) + '\r\n'
      );
    case 'tab-modulus-phase':
      return (
        [
          ...head,
          'f [Hz]\t|Z| [Ohm]\tPhase [deg]',
          ...order.map((i) => `${fixed(s.frequencyHz[i], 8)}\t${fixed(Math.hypot(s.re[i], s.im[i]), 8)}\t${fixed((Math.atan2(s.im[i], s.re[i]) * 180) / Math.PI, 8)}`),
        ].join('\n') + '\n'
      );
  }
}

export interface DemoFile {
  sampleCode: string;
  fileName: string;
  text: string;
  temperatureC: number;
  expect: string;
}

/** Every demo export, in memory (the seed's tests and the bench use them without touching disk). */
export function demoFiles(): DemoFile[] {
  const files: DemoFile[] = [];
  for (const sample of DEMO_SAMPLES) {
    if (!sample.files) continue;
    const product = DEMO_PRODUCTS.find((p) => p.key === sample.product);
    if (!product) throw new Error(`demo sample ${sample.code} names unknown product ${sample.product}`);
    const profile = DEMO_PROFILES[product.profile];
    const rng = demoRandom(seedFrom(`sample:${sample.code}`));
    const params = suspectParameters(profile, sample.files.adulteration, rng);
    const conditions = {
      cellConstantPerCm: DEMO_CELL_CONSTANT,
      temperatureC: sample.files.temperatureC,
      referenceTemperatureC: DEFAULT_METHOD.referenceTemperatureC,
      coefficientPerC: DEFAULT_METHOD.temperatureCoefficientPerC,
    };
    const sweeps = demoSweeps(params, profile.model, conditions, sample.files.replicates, rng);
    const comment = sample.files.shape === 'semicolon-kilo-negative-imaginary' ? ';' : '#';
    sweeps.forEach((s, r) => {
      files.push({
        sampleCode: sample.code,
        fileName: `${sample.code}_${product.key}_rep${r + 1}.${sample.files?.shape === 'tab-modulus-phase' ? 'txt' : 'csv'}`,
        text: render(sample.files!.shape, s, preamble(sample, r + 1, sample.files!.temperatureC, comment)),
        temperatureC: sample.files!.temperatureC,
        expect: sample.files!.expect,
      });
    });
  }
  return files;
}

/** A copy of the first replicate of OP-7K3M-Q9 with one number mistyped, to show the import error. */
export function brokenDemoFile(): DemoFile {
  const good = demoFiles()[0];
  const lines = good.text.split('\n');
  const target = 9;
  lines[target - 1] = lines[target - 1].replace(/,([-0-9.]+),/, ',12.3.4,');
  return { ...good, fileName: `${good.sampleCode}_broken-line-${target}.csv`, text: lines.join('\n'), expect: `error on line ${target}` };
}

if (require.main === module) {
  mkdirSync(DEMO_FILES_DIR, { recursive: true });
  for (const f of [...demoFiles(), brokenDemoFile()]) writeFileSync(join(DEMO_FILES_DIR, f.fileName), f.text);
  console.log(`wrote ${demoFiles().length + 1} demo files to ${DEMO_FILES_DIR}`);
}
