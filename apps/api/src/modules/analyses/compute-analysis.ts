import { averageReplicates, fitModel, impedance, judge, MODEL_CATALOG, replicateAgreement, sampleMap, type Calibration, type FitSuccess, type Spectrum } from '@ohmprint/spectral-engine';
import { NEAREST_LOTS, type AnalysisResult, type FittedParameter, type QualityFlag, type SpectrumPoints, type ThresholdStatement } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { PublishedLibrary } from '../libraries/published-library';
import { prepareReplicates } from '../measurements/prepared-replicates';
import type { Replicate } from '../measurements/replicate.entity';
import { distanceHistogram } from './distance-histogram';
import { closestOtherLibrary, resemblanceFlag, type OtherLibrary } from './does-not-belong';

/**
 * Lots drawn on the map: the sample's nearest ones. Sixty points keep the map legible and its
 * exact eigen-decomposition quick (15–35 ms against 200–700 ms for 150 points, measured on the
 * two-core development machine), whatever the size of the library.
 */
export const MAP_LOTS = NEAREST_LOTS;

/**
 * One extra start beyond the engine's guess: the guess from the spectrum's shape already lands
 * in the right basin for these single-relaxation models, and each start costs about 10 ms.
 */
const FIT_RESTARTS = 1;

export interface ComputedAnalysis {
  result: AnalysisResult;
  sampleSpectrum: SpectrumPoints;
  /** Every lot's distance, in the library's lot order; stored apart from the result and paged on demand. */
  lotDistances: Float64Array;
  /** Lot indices nearest first (see `rankLots`). */
  ranking: Uint32Array;
}

/**
 * Lot indices nearest first, ties by lot order (lot code, then id). Distances are finite and not
 * negative, so their IEEE-754 bit patterns, read as unsigned integers, order as the numbers do. The
 * indices are radix-sorted (stable, least significant digit first, two 16-bit digits, skipping a
 * digit every lot shares) by the high 32 bits only: sign, exponent and the top 20 bits of the
 * mantissa. Lots whose high words are equal then sit side by side in lot order, and each such run
 * is ordered by the low word, ties by index. The result is the comparison sort's order in two
 * linear passes (four over all 64 bits cost three times as much at 50,000 lots, mostly in cache
 * misses). Anything else (a negative, NaN or infinite distance, a big-endian host) takes the
 * comparison sort.
 */
export function rankLots(distances: ArrayLike<number>): Uint32Array {
  const count = distances.length;
  const order = new Uint32Array(count);
  for (let i = 0; i < count; i++) order[i] = i;
  const values = distances instanceof Float64Array ? distances : Float64Array.from(distances);
  let radixable = LITTLE_ENDIAN;
  for (let i = 0; i < count && radixable; i++) radixable = values[i] >= 0 && values[i] < Infinity;
  if (!radixable) return order.sort((a, b) => distances[a] - distances[b] || a - b);
  if (count < 2) return order;
  const words = new Uint32Array(values.buffer, values.byteOffset, 2 * count);
  const lowDigits = new Uint32Array(RADIX);
  const highDigits = new Uint32Array(RADIX);
  for (let i = 0; i < count; i++) {
    const high = words[2 * i + 1];
    lowDigits[high & 0xffff]++;
    highDigits[high >>> 16]++;
  }
  let from = order;
  let to = new Uint32Array(count);
  for (const [counts, shift] of [[lowDigits, 0], [highDigits, 16]] as const) {
    if (counts[(words[1] >>> shift) & 0xffff] === count) continue;
    let start = 0;
    for (let b = 0; b < RADIX; b++) {
      const c = counts[b];
      counts[b] = start;
      start += c;
    }
    for (let i = 0; i < count; i++) {
      const lot = from[i];
      to[counts[(words[2 * lot + 1] >>> shift) & 0xffff]++] = lot;
    }
    const swap = from;
    from = to;
    to = swap;
  }
  // runs of one high word, each already in lot order: order by the low word, ties by lot index
  const low = (lot: number) => words[2 * lot];
  for (let runStart = 0; runStart < count; ) {
    const high = words[2 * from[runStart] + 1];
    let runEnd = runStart + 1;
    while (runEnd < count && words[2 * from[runEnd] + 1] === high) runEnd++;
    if (runEnd - runStart > 1) from.subarray(runStart, runEnd).sort((a, b) => low(a) - low(b) || a - b);
    runStart = runEnd;
  }
  return from;
}
const RADIX = 1 << 16;
const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

const points = (s: Spectrum): SpectrumPoints => ({ frequencyHz: Array.from(s.frequencyHz), re: Array.from(s.re), im: Array.from(s.im) });

function fittedParameters(model: string, fit: FitSuccess): FittedParameter[] {
  const catalog = new Map(MODEL_CATALOG.find((m) => m.name === model)?.parameters.map((p) => [p.name, p]) ?? []);
  return fit.parameterNames.map((name) => ({
    name,
    ...(catalog.get(name)?.description ? { description: catalog.get(name)?.description } : {}),
    value: fit.parameters[name],
    standardError: Number.isFinite(fit.standardErrors[name]) ? fit.standardErrors[name] : null,
    unit: (catalog.get(name)?.unit ?? '').replace('Ω', 'Ω·cm'),
  }));
}

/** The fitted model at the sample's own frequencies: one curve, as small as the spectrum itself. */
function fittedCurve(model: string, fit: FitSuccess, sample: Spectrum): { re: number[]; im: number[] } {
  const z = impedance(model, fit.parameters, sample.frequencyHz);
  return { re: Array.from(z.re), im: Array.from(z.im) };
}

/** What the version states about its thresholds, repeated on the analysis and its report. */
export function thresholdStatement(c: Calibration): ThresholdStatement {
  return {
    estimator: c.thresholdEstimator ?? 'empirical-type7',
    lotCount: c.lotCount,
    t95Interval: c.lowerInterval ? [c.lowerInterval[0], c.lowerInterval[1]] : null,
    t99Interval: c.upperInterval ? [c.upperInterval[0], c.upperInterval[1]] : null,
    confidenceLevel: c.bootstrap?.confidenceLevel ?? null,
    resamples: c.bootstrap?.resamples ?? null,
  };
}

/**
 * Scores a sample against a published library version, every number by the engine: the included
 * replicates normalised and resampled under the version's frozen method, averaged, then distances,
 * verdict, typicality, map and model fit, with the quality flags a reviewer needs to see — among
 * them whether the sample resembles one of the lab's `others` libraries more than its own.
 * Pure given its inputs, which is what lets `reproduce` recompute and compare.
 */
export function computeAnalysis(replicates: readonly Replicate[], library: PublishedLibrary, others: readonly OtherLibrary[] = [], timings?: Record<string, number>): ComputedAnalysis {
  let mark = performance.now();
  /** Milliseconds since the last lap, added to `timings[stage]` when asked for (the results benchmark prints them). */
  const lap = (stage: string) => {
    if (!timings) return;
    const now = performance.now();
    timings[stage] = (timings[stage] ?? 0) + now - mark;
    mark = now;
  };
  const method = library.method;
  const flags: QualityFlag[] = [];
  const prepared = prepareReplicates(replicates, method, library.grid);
  for (const p of prepared) if (p.coverageProblem) flags.push({ code: 'band-not-covered', severity: 'warning', message: `${p.coverageProblem}; this replicate was left out.` });
  const usable = prepared.filter((p) => p.spectrum !== null);
  if (!usable.length) throw ApiError.conflict('No included replicate covers the method band, so there is nothing to analyse. Re-measure over the full band.');
  for (const r of replicates) {
    if (!r.kramersKronig.passed) {
      // A residual stored as null (NaN in JSON) from an older file with absurd values still reads.
      const residual = r.kramersKronig.maxResidualPercent as number | null;
      const shown = typeof residual === 'number' && Number.isFinite(residual) ? `${residual.toFixed(2)} %` : 'not computable';
      flags.push({ code: 'kk-failed', severity: 'warning', message: `Replicate ${r.replicateNumber} (${r.fileName}) fails the Kramers–Kronig test: ${shown} > ${r.kramersKronig.limitPercent} %.` });
    }
  }
  if (usable.length < method.minimumReplicates) {
    flags.push({ code: 'too-few-replicates', severity: 'warning', message: `${usable.length} usable replicate(s); the method asks for at least ${method.minimumReplicates}.` });
  }
  const spectra = usable.map((p) => p.spectrum as Spectrum);
  if (spectra.length >= 2) {
    const agreement = replicateAgreement(spectra);
    if (agreement.maxDistance > method.replicateDistanceLimit) {
      flags.push({ code: 'poor-replicate-agreement', severity: 'warning', message: `Replicates differ by up to ${agreement.maxDistance.toPrecision(3)} (limit ${method.replicateDistanceLimit}).` });
    }
  }
  const sample = spectra.length === 1 ? spectra[0] : averageReplicates(spectra);
  lap('prepare');

  const judgement = judge(sample, library.spectra, library.calibration);
  lap('distances');
  if (judgement.reason) flags.push({ code: 'too-few-lots', severity: 'warning', message: `No verdict: ${judgement.reason}.` });
  const lotDistance = (i: number) => ({ lotId: library.lots[i].id, lotCode: library.lots[i].lotCode, distance: judgement.distances[i] });

  const lotDistances = Float64Array.from(judgement.distances);
  const ranking = rankLots(lotDistances);
  const nearestLots = Array.from(ranking.subarray(0, NEAREST_LOTS));
  lap('rank');
  const mapIndices = nearestLots.slice(0, MAP_LOTS);
  let map: AnalysisResult['map'] = { sample: [0, 0], lots: [] };
  if (mapIndices.length >= 2) {
    const m = sampleMap(mapIndices.map((i) => library.spectra[i]), sample);
    const s = m.points[m.points.length - 1];
    map = {
      sample: [s.x, s.y],
      lots: m.points.slice(0, -1).map((p) => ({ lotId: library.lots[mapIndices[p.index]].id, lotCode: library.lots[mapIndices[p.index]].lotCode, x: p.x, y: p.y })),
      ...(m.axisShares ? { axisShares: [m.axisShares[0], m.axisShares[1]] as [number, number] } : {}),
    };
  }

  lap('map');
  const fit = fitModel(sample, method.model, { restarts: FIT_RESTARTS });
  lap('fit');
  if (!fit.converged) flags.push({ code: 'fit-poor', severity: 'warning', message: `The ${method.model} model did not converge: ${fit.reason}.` });

  const nearest = judgement.nearest ? lotDistance(judgement.nearest.index) : null;
  const usableIds = new Set(usable.map((p) => p.id));
  const t99 = library.calibration.upperThreshold;
  const resemblance = closestOtherLibrary(replicates.filter((r) => usableIds.has(r.id)), nearest?.distance ?? null, t99, others);
  if (resemblance && nearest && t99 !== null) flags.push(resemblanceFlag(resemblance, library.productName, nearest.distance, t99));
  lap('other-libraries');
  const histogram = distanceHistogram(library.calibration.nearestDistances, nearest?.distance ?? null, library.calibration.lowerThreshold, library.calibration.upperThreshold);
  lap('histogram');
  return {
    result: {
      verdict: judgement.verdict,
      nearest,
      t95: library.calibration.lowerThreshold,
      t99: library.calibration.upperThreshold,
      typicality: judgement.typicality,
      distances: nearestLots.map(lotDistance),
      lotCount: library.lots.length,
      map,
      histogram,
      // A fit that did not converge offers no numbers at all; the quality flag says why.
      fit: fit.converged
        ? {
            model: method.model,
            parameters: fittedParameters(method.model, fit),
            chiSquare: fit.chiSquare,
            converged: true,
            weighting: fit.weighting,
            curve: fittedCurve(method.model, fit, sample),
          }
        : null,
      qualityFlags: flags,
      replicateIds: usable.map((p) => p.id),
      thresholds: thresholdStatement(library.calibration),
    },
    sampleSpectrum: points(sample),
    lotDistances,
    ranking,
  };
}
