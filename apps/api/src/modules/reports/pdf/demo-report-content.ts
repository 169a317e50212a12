import { distanceHistogram } from '../../analyses/distance-histogram';
import { ReportContent, ReportData } from './report-data';

/**
 * Invented report content for the demo, tests and the benchmark: a fictional lab, client and
 * sample, and a synthetic spectrum (series resistance plus an R–CPE arc) with invented lot spread.
 * Nothing here is a real measurement.
 */
export function demoReportContent(overrides: Partial<ReportContent> = {}): ReportContent {
  const frequencyHz = Array.from({ length: 41 }, (_, k) => 10 ** (6 - k * 0.125));
  frequencyHz.reverse();
  const spectrum = (rs: number, r: number) =>
    frequencyHz.map((f) => {
      const w = 2 * Math.PI * f;
      const q = 2e-6;
      const n = 0.82;
      const jwn = { re: w ** n * Math.cos((n * Math.PI) / 2), im: w ** n * Math.sin((n * Math.PI) / 2) };
      const dRe = 1 + r * q * jwn.re;
      const dIm = r * q * jwn.im;
      const den = dRe * dRe + dIm * dIm;
      return { re: rs + (r * dRe) / den, im: (-r * dIm) / den };
    });
  const sample = spectrum(41, 505);
  const low = spectrum(38, 470);
  const high = spectrum(44, 540);
  const mod = (z: { re: number; im: number }) => Math.hypot(z.re, z.im);
  const ph = (z: { re: number; im: number }) => (Math.atan2(z.im, z.re) * 180) / Math.PI;
  return {
    lab: {
      name: 'Calder Analytical (demo)',
      address: ['Unit 4, Ferrow Yard', 'Calder Bridge', 'Demo County'],
      siteOfTesting: null,
      accreditation: { body: 'Demo Accreditation Service', number: 'DAS-0000-DEMO' },
      contactEmail: 'reports@calder.test',
    },
    client: { name: 'Hollin Ridge Cellars (demo)', contactName: 'Demo client administrator', contactEmail: 'admin@hollinridge.test' },
    sample: {
      code: 'S-HRC-00042',
      productName: 'Ridge Reserve Red',
      matrix: 'red wine',
      claimedLot: 'L2025-117',
      obtainedWhere: 'Retail shelf, demo market town',
      obtainedOn: '2026-11-20',
      labelText: 'Ridge Reserve Red 2024, 13.5 % vol, 750 ml',
      receivedAt: '2026-11-24T09:15:00Z',
      conditionOnReceipt: 'Seal intact, bottle undamaged, 7.5 °C on arrival, 750 ml',
    },
    method: {
      name: 'Wine fingerprint, 10 Hz to 100 kHz',
      methodVersion: { name: 'Red wine screening', version: 2 },
      bandHz: { min: 10, max: 1e5 },
      gridPoints: 41,
      referenceTemperatureC: 20,
      temperatureCoefficientPerC: 0.02,
      modelName: 'Rs + (R ∥ CPE)',
      quantiles: { lower: 0.95, upper: 0.99 },
      library: { productName: 'Ridge Reserve Red', version: '3', lotCount: 12, publishedAt: '2026-10-01T00:00:00Z' },
      engineVersion: '0.1.0',
      replicateCount: 3,
      deviations: [],
      thresholds: { estimator: 'lognormal fitted by maximum likelihood', lotCount: 12, t95Interval: [0.0031, 0.0049], t99Interval: [0.0039, 0.0071], confidenceLevel: 0.95, resamples: 2000 },
    },
    results: {
      verdict: 'consistent',
      nearestDistance: 0.0123,
      nearestLot: 'CAL-L0117',
      nearestLotProducerCode: 'L2025-117',
      claimedLotCheck: { lotCode: 'L2025-117', nearestIsClaimed: true },
      t95: 0.0188,
      t99: 0.0246,
      typicality: 0.58,
      fittedParameters: [
        { name: 'rs', description: 'Series resistance Rs', value: 41.02, standardError: 0.031, unit: 'Ω·cm' },
        { name: 'r', description: 'Parallel resistance R', value: 504.7, standardError: 0.42, unit: 'Ω·cm' },
        { name: 'q', description: 'CPE magnitude Q', value: 2.001e-6, standardError: 1.2e-8, unit: 'S·sⁿ·cm⁻¹' },
        { name: 'n', description: 'CPE exponent n', value: 0.8203, standardError: 0.0009, unit: '1' },
      ],
      goodnessOfFit: 3.1e-4,
      fitWeighting: 'modulus weighting',
      qualityFlags: [{ severity: 'info', message: 'Kramers–Kronig residuals within 0.4 % of |Z| across the band.' }],
    },
    plots: {
      impedanceUnit: 'Ω·cm',
      sample: { frequencyHz, re: sample.map((z) => z.re), im: sample.map((z) => z.im) },
      referenceEnvelope: {
        frequencyHz,
        modulusMin: low.map(mod),
        modulusMax: high.map(mod),
        phaseMinDeg: frequencyHz.map((_, i) => Math.min(ph(low[i]), ph(high[i])) - 0.6),
        phaseMaxDeg: frequencyHz.map((_, i) => Math.max(ph(low[i]), ph(high[i])) + 0.6),
        reMin: frequencyHz.map((_, i) => Math.min(low[i].re, high[i].re) - 3),
        reMax: frequencyHz.map((_, i) => Math.max(low[i].re, high[i].re) + 3),
        imMin: frequencyHz.map((_, i) => Math.min(low[i].im, high[i].im) - 3),
        imMax: frequencyHz.map((_, i) => Math.max(low[i].im, high[i].im) + 3),
      },
      calibrationHistogram: distanceHistogram([0.0061, 0.0083, 0.0094, 0.0102, 0.0111, 0.0119, 0.0128, 0.0137, 0.0149, 0.0163, 0.0181, 0.0232], 0.0123),
      map: {
        lots: Array.from({ length: 12 }, (_, i) => ({
          label: `L2025-${String(101 + i * 2)}`,
          x: Math.cos(i * 2.4) * (0.006 + (i % 3) * 0.003),
          y: Math.sin(i * 2.4) * (0.004 + (i % 4) * 0.002),
        })),
        sample: { x: 0.0021, y: -0.0013 },
      },
    },
    testedFrom: '2026-11-25',
    testedTo: '2026-11-25',
    analyst: { name: 'Demo Analyst', role: 'Analyst' },
    authorisedBy: { name: 'Demo Reviewer', role: 'Reviewer' },
    remarks: 'Three replicates agreed within 0.3 % of |Z|. Invented demo data.',
    demo: true,
    ...overrides,
  };
}

/** Demo content with the identity issuance would add, for rendering without a database. */
export function demoReportData(overrides: Partial<ReportData> = {}): ReportData {
  return {
    ...demoReportContent(),
    reportNumber: 'CAL-2026-000042',
    issuedAt: '2026-11-26T10:00:00Z',
    replaces: null,
    verification: { code: 'K7QM-4RTX-9WHP', url: 'http://127.0.0.1:4300/verify?report=CAL-2026-000042&code=K7QM-4RTX-9WHP' },
    ...overrides,
  };
}
