import type { EntityManager } from 'typeorm';
import { averageReplicates, createSpectrumIndex, type Spectrum, type SpectrumIndex } from '@ohmprint/spectral-engine';
import type { QualityFlag } from '@ohmprint/contracts';
import { publishedLibrary, type PublishedLibrary } from '../libraries/published-library';
import { prepareReplicates } from '../measurements/prepared-replicates';
import type { Replicate } from '../measurements/replicate.entity';

/**
 * How far past T99 the sample's nearest lot must be before other libraries are searched. Between
 * T99 and a few times T99 lie the adulterated and blended samples of the ordered product (the demo's
 * watered and blended wines sit at 1–3 × T99); a sample of another product lies tens of times past
 * it (the demo milk against the apple juice library: about 40 × T99). Three times keeps the first
 * group out of the flag. A lab's choice like the thresholds' quantiles, not a standard.
 */
export const DOES_NOT_BELONG_T99_MULTIPLE = 3;

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
 * A packed index per published version, built once and dropped with the version itself: the
 * library cache hands out one object per version, so a WeakMap follows its evictions.
 */
const indexes = new WeakMap<PublishedLibrary, SpectrumIndex>();
function indexOf(library: PublishedLibrary): SpectrumIndex {
  let index = indexes.get(library);
  if (!index) {
    index = createSpectrumIndex(library.spectra);
    indexes.set(library, index);
  }
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
 * The other library the sample resembles most, when its nearest lot of the ordered library lies
 * more than `DOES_NOT_BELONG_T99_MULTIPLE` × T99 away and a lot of that other library lies nearer.
 * Other libraries are searched only past that point, so authentic samples cost nothing extra.
 */
export function closestOtherLibrary(
  replicates: readonly Replicate[],
  nearestDistance: number | null,
  t99: number | null,
  others: readonly OtherLibrary[],
): Resemblance | null {
  if (nearestDistance === null || t99 === null || !(nearestDistance > DOES_NOT_BELONG_T99_MULTIPLE * t99)) return null;
  let best: Resemblance | null = null;
  for (const other of others) {
    if (!other.library.spectra.length) continue;
    const sample = sampleUnder(replicates, other.library);
    if (!sample) continue;
    const [hit] = indexOf(other.library).nearest(sample, 1);
    if (hit.distance < nearestDistance && (!best || hit.distance < best.distance)) best = { other, distance: hit.distance };
  }
  return best;
}

const fmt = (d: number) => d.toPrecision(3);

/** The flag as the reviewer reads it, and the report's wording (another client's product is not named there). */
export function resemblanceFlag(r: Resemblance, orderedProduct: string, nearestDistance: number, t99: number): QualityFlag {
  const { library, matrix, sameClient } = r.other;
  const figures = `nearest distance ${fmt(r.distance)} to its library (version ${library.version}) against ${fmt(nearestDistance)} to ${orderedProduct}'s, which is ${fmt(nearestDistance / t99)} × T99`;
  return {
    code: 'resembles-other-product',
    severity: 'warning',
    message: `Resembles ${library.productName} more than the ordered product (${orderedProduct}): ${figures}. Check that the right sample was measured.`,
    reportMessage: sameClient
      ? undefined
      : `Resembles another product in the laboratory's libraries (${matrix}) more than the ordered product (${orderedProduct}): nearest distance ${fmt(r.distance)} to that library against ${fmt(nearestDistance)} here (${fmt(nearestDistance / t99)} × T99).`,
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
