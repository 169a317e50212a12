import { In, type EntityManager } from 'typeorm';
import { quantile, spectrumDistance, type Spectrum } from '@ohmprint/spectral-engine';
import type { RepeatabilityStudy } from '@ohmprint/contracts';
import type { MethodSettings } from '@ohmprint/contracts';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import { publishedLibrary } from '../libraries/published-library';
import { prepareReplicates } from '../measurements/prepared-replicates';
import { Replicate } from '../measurements/replicate.entity';

/** Newest samples looked at, and lots paired: bounds the work whatever the data. */
const SAMPLE_LIMIT = 200;
const LOT_LIMIT = 300;
const BINS = 24;

function pairwise(spectra: Spectrum[]): number[] {
  const out: number[] = [];
  for (let i = 0; i < spectra.length; i++) for (let j = i + 1; j < spectra.length; j++) out.push(spectrumDistance(spectra[i], spectra[j]));
  return out;
}

/** Shared log-spaced bins over both sets of distances (they differ by orders of magnitude). */
export function sharedHistogram(within: number[], between: number[], bins = BINS): RepeatabilityStudy['histogram'] {
  const all = [...within, ...between].filter((d) => d > 0);
  if (!all.length) return { edges: [], within: [], between: [] };
  const lo = Math.log10(Math.min(...all));
  const hi = Math.log10(Math.max(...all));
  const span = hi - lo || 1;
  const edges = Array.from({ length: bins + 1 }, (_, i) => 10 ** (lo + (span * i) / bins));
  const count = (values: number[]) => {
    const c = new Array<number>(bins).fill(0);
    for (const v of values) {
      if (!(v > 0)) continue;
      c[Math.min(bins - 1, Math.max(0, Math.floor(((Math.log10(v) - lo) / span) * bins)))]++;
    }
    return c;
  };
  return { edges, within: count(within), between: count(between) };
}

const q = (values: number[], p: number) => (values.length ? quantile(values, p) : null);

/**
 * Replicate distances within each sample of the product (prepared under the version's frozen
 * method) against the distances between the version's lots. The demo's synthesised blind checks
 * add theirs (three sweeps each, so three pairs per check), flagged as such.
 */
/** The distances within each sample's prepared replicates and between the lots (run in a worker thread). */
export function repeatabilityDistances(input: { groups: Replicate[][]; method: MethodSettings; grid: Float64Array; lots: Spectrum[] }): { within: number[]; used: number; between: number[] } {
  const within: number[] = [];
  let used = 0;
  for (const reps of input.groups) {
    const spectra = prepareReplicates(reps, input.method, input.grid).flatMap((p) => (p.spectrum ? [p.spectrum] : []));
    if (spectra.length < 2) continue;
    used++;
    for (const d of pairwise(spectra)) within.push(d);
  }
  return { within, used, between: pairwise(input.lots) };
}

export async function repeatabilityStudy(manager: EntityManager, labId: string, versionId: string): Promise<RepeatabilityStudy> {
  const library = await publishedLibrary(manager, labId, versionId);
  const samples: { id: string }[] = await manager.query(
    `SELECT s.id FROM sample s JOIN test_order o ON o.id = s.order_id
     WHERE s.lab_id = $1 AND o.product_id = $2
       AND (SELECT count(*) FROM replicate r WHERE r.sample_id = s.id AND NOT r.excluded) >= 2
     ORDER BY s.created_at DESC, s.id LIMIT ${SAMPLE_LIMIT}`,
    [labId, library.productId],
  );
  const replicates = samples.length ? await manager.find(Replicate, { where: { labId, sampleId: In(samples.map((s) => s.id)), excluded: false } }) : [];
  const bySample = new Map<string, Replicate[]>();
  for (const r of replicates) bySample.set(r.sampleId, [...(bySample.get(r.sampleId) ?? []), r]);
  // Preparing every replicate and pairing up to 300 lots is CPU work: a worker thread does it.
  const light = [...bySample.values()].map((reps) => reps.map((r) => ({ ...r, rawFile: Buffer.alloc(0) }) as Replicate));
  const { within, used: measured, between } = await runCpuTask('repeatabilityDistances', { groups: light, method: library.method, grid: library.grid, lots: library.spectra.slice(0, LOT_LIMIT) });
  let used = measured;
  const [demo]: { distances: number[] | null }[] = await manager.query(
    `SELECT array_agg(d) AS distances FROM synthesised_trial t, unnest(t.replicate_distances) AS d
     WHERE t.lab_id = $1 AND t.product_id = $2 AND t.kind = 'blind-check'`,
    [labId, library.productId],
  );
  const synthesised = demo?.distances ?? [];
  if (synthesised.length) {
    within.push(...synthesised);
    used += synthesised.length / 3;
  }
  const medWithin = q(within, 0.5);
  const medBetween = q(between, 0.5);
  return {
    libraryVersionId: versionId,
    within: { count: within.length, samples: used, median: medWithin, p95: q(within, 0.95), max: within.length ? Math.max(...within) : null },
    between: { count: between.length, median: medBetween, p5: q(between, 0.05), min: between.length ? Math.min(...between) : null },
    histogram: sharedHistogram(within, between),
    ratio: medWithin && medBetween ? medBetween / medWithin : null,
    synthesisedForDemo: synthesised.length > 0,
  };
}
