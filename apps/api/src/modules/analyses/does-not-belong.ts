import type { EntityManager } from 'typeorm';
import { averageReplicates, createSpectrumIndex, type Spectrum, type SpectrumIndex } from '@ohmprint/spectral-engine';
import type { QualityFlag } from '@ohmprint/contracts';
import { publishedLibrary, type PublishedLibrary } from '../libraries/published-library';
import { prepareReplicates } from '../measurements/prepared-replicates';
import type { Replicate } from '../measurements/replicate.entity';

/**
 * How far past its own T99 the sample's nearest lot must lie before other libraries are searched.
 * Authentic demo lots lie within 1.6 × T99 and the demo's watered milk at 1.9 × T99 of their own
 * library; whole milk against the skimmed milk library lies only 2.2–3.6 × T99 away (the two
 * products are alike), so a higher multiple such as 3 would miss that mix-up. A lab's choice
 * checked on the demo libraries, not a standard.
 */
export const DOES_NOT_BELONG_T99_MULTIPLE = 2;

/**
 * How much nearer, in units of each library's own T99, the other library must be. Distances are
 * compared as multiples of each library's T99 because libraries differ in spread. Being merely
 * nearer is not enough: the demo's red wine with 12 % water lies 6.5 × T99 from its own library and
 * 3.2 × T99 from the white wine's (a ratio of 2), and is not white wine; every wrong-product case in
 * the demo libraries has a ratio of 3.2 or more. A lab's choice, like the multiple above.
 */
export const RESEMBLANCE_MARGIN = 3;

export interface Candidate<T> {
  item: T;
  /** The sample's nearest distance to this library. */
  distance: number;
  t99: number | null;
}

/**
 * The decision on its own: the candidate the sample resembles most (least multiple of its T99),
 * when the sample lies more than `DOES_NOT_BELONG_T99_MULTIPLE` × T99 from its own library and
 * that candidate is at least `RESEMBLANCE_MARGIN` times nearer in T99 units. Null otherwise.
 */
export function pickResemblance<T>(own: { distance: number | null; t99: number | null }, candidates: Iterable<Candidate<T>>): Candidate<T> | null {
  if (own.distance === null || own.t99 === null || !(own.t99 > 0)) return null;
  const ownMultiple = own.distance / own.t99;
  if (!(ownMultiple > DOES_NOT_BELONG_T99_MULTIPLE)) return null;
  let best: { c: Candidate<T>; multiple: number } | null = null;
  for (const c of candidates) {
    if (c.t99 === null || !(c.t99 > 0)) continue;
    const multiple = c.distance / c.t99;
    if (multiple * RESEMBLANCE_MARGIN <= ownMultiple && (!best || multiple < best.multiple)) best = { c, multiple };
  }
  return best?.c ?? null;
}

/** The sample's own library is past the multiple: worth searching the others. */
export function worthSearching(nearestDistance: number | null, t99: number | null): boolean {
  return nearestDistance !== null && t99 !== null && t99 > 0 && nearestDistance / t99 > DOES_NOT_BELONG_T99_MULTIPLE;
}

/** Another published library of the lab, as the flag needs it. */
export interface OtherLibrary {
  library: PublishedLibrary;
  /** The product's matrix, e.g. "whole milk". */
  matrix: string;
  /** Whether the product belongs to the sample's own client (its name may then be printed on the report). */
  sameClient: boolean;
}

export interface Resemblance {
  other: OtherLibrary;
  /** The sample's nearest distance to the other library, on that library's grid and under its method. */
  distance: number;
}

/**
 * A packed index per published version, built once per thread and kept for the next analyses.
 * This runs in the CPU pool's worker threads, where every task receives a fresh copy of the
 * library, so the index is keyed by the (frozen) version rather than by the object: building it
 * takes seconds for a 100,000-lot library and must not be repeated for every sample. Bounded so a
 * thread keeps only the few versions in use.
 */
const indexes = new Map<string, { lots: number; index: SpectrumIndex }>();
const INDEXES_KEPT = 4;
function indexOf(library: PublishedLibrary): SpectrumIndex {
  const kept = indexes.get(library.versionId);
  if (kept && kept.lots === library.spectra.length) {
    indexes.delete(library.versionId);
    indexes.set(library.versionId, kept);
    return kept.index;
  }
  const index = createSpectrumIndex(library.spectra);
  if (indexes.size >= INDEXES_KEPT) indexes.delete(indexes.keys().next().value as string);
  indexes.set(library.versionId, { lots: library.spectra.length, index });
  return index;
}

/** The replicates prepared under another library's frozen method and averaged, or null if none covers its band. */
function sampleUnder(replicates: readonly Replicate[], library: PublishedLibrary): Spectrum | null {
  const spectra = prepareReplicates(replicates, library.method, library.grid)
    .map((p) => p.spectrum)
    .filter((s): s is Spectrum => s !== null);
  if (!spectra.length) return null;
  return spectra.length === 1 ? spectra[0] : averageReplicates(spectra);
}

/**
 * The other library the sample resembles most (see `pickResemblance`), each searched under its own
 * frozen method through its packed index. Other libraries are searched only when the sample is
 * far from its own, so authentic samples cost nothing extra.
 */
export function closestOtherLibrary(
  replicates: readonly Replicate[],
  nearestDistance: number | null,
  t99: number | null,
  others: readonly OtherLibrary[],
): Resemblance | null {
  if (!worthSearching(nearestDistance, t99)) return null;
  const candidates: Candidate<OtherLibrary>[] = [];
  for (const other of others) {
    if (!other.library.spectra.length) continue;
    const sample = sampleUnder(replicates, other.library);
    if (!sample) continue;
    const [hit] = indexOf(other.library).nearest(sample, 1);
    candidates.push({ item: other, distance: hit.distance, t99: other.library.calibration.upperThreshold });
  }
  const best = pickResemblance({ distance: nearestDistance, t99 }, candidates);
  return best && { other: best.item, distance: best.distance };
}

const fmt = (d: number) => d.toPrecision(3);

/** The flag as the reviewer reads it, and the report's wording (another client's product is not named there). */
export function resemblanceFlag(r: Resemblance, orderedProduct: string, nearestDistance: number, t99: number): QualityFlag {
  const { library, matrix, sameClient } = r.other;
  const otherT99 = library.calibration.upperThreshold ?? Number.NaN;
  const figures =
    `nearest distance ${fmt(r.distance)} (${fmt(r.distance / otherT99)} × its T99) to its library, version ${library.version}, ` +
    `against ${fmt(nearestDistance)} (${fmt(nearestDistance / t99)} × T99) to ${orderedProduct}'s`;
  return {
    code: 'resembles-other-product',
    severity: 'warning',
    message: `Resembles ${library.productName} more than the ordered product (${orderedProduct}): ${figures}. Check that the right sample was measured.`,
    reportMessage: sameClient
      ? undefined
      : `Resembles another product in the laboratory's libraries (${matrix}) more than the ordered product (${orderedProduct}): ` +
        `${fmt(r.distance / otherT99)} × that library's T99 against ${fmt(nearestDistance / t99)} × T99 here.`,
  };
}

/** The lab's other products' current published versions (the latest of each library), through the library cache. */
export async function otherPublishedLibraries(manager: EntityManager, labId: string, orderedProductId: string, clientOrganisationId: string): Promise<OtherLibrary[]> {
  const rows: { id: string; matrix: string; client_organisation_id: string }[] = await manager.query(
    `SELECT DISTINCT ON (v.library_id) v.id, p.matrix, p.client_organisation_id
     FROM library_version v JOIN reference_library l ON l.id = v.library_id JOIN product p ON p.id = l.product_id
     WHERE v.lab_id = $1 AND v.status = 'published' AND l.product_id <> $2
     ORDER BY v.library_id, v.version DESC`,
    [labId, orderedProductId],
  );
  const others: OtherLibrary[] = [];
  for (const row of rows) {
    others.push({ library: await publishedLibrary(manager, labId, row.id), matrix: row.matrix, sameClient: row.client_organisation_id === clientOrganisationId });
  }
  return others;
}
