import type { Spectrum } from '@ohmprint/spectral-engine';
import type { PublishedLibrary } from './published-library';

/**
 * A published library as it crosses into a worker thread. The lots' spectra sit in one
 * SharedArrayBuffer (lot by lot: N real parts, then N imaginary parts), which a worker reads in
 * place instead of receiving a copy; the lots' ids and codes travel as one string. Posting a
 * 50,000-lot library then moves a few megabytes of text rather than 100,000 typed arrays.
 */
export interface PackedLibrary extends Omit<PublishedLibrary, 'spectra' | 'lots'> {
  /** `id\tlotCode` per lot, one per line, in the library's order. */
  lotKeys: string;
}

/** Views, not copies: lot i's re and im over the shared buffer. */
export function spectraOver(packed: Float64Array, grid: Float64Array): Spectrum[] {
  const n = grid.length;
  const count = n ? packed.length / (2 * n) : 0;
  const spectra: Spectrum[] = new Array(count);
  for (let i = 0; i < count; i++) {
    spectra[i] = { frequencyHz: grid, re: packed.subarray(2 * n * i, 2 * n * i + n), im: packed.subarray(2 * n * i + n, 2 * n * (i + 1)) };
  }
  return spectra;
}

/** One packed form per cached library (the cache hands out one object per version), built once. */
const packedForms = new WeakMap<PublishedLibrary, PackedLibrary>();

export function packLibrary(library: PublishedLibrary): PackedLibrary {
  let packed = packedForms.get(library);
  if (!packed) {
    const { spectra: _spectra, lots, ...rest } = library;
    packed = { ...rest, lotKeys: lots.map((l) => `${l.id}\t${l.lotCode}`).join('\n') };
    packedForms.set(library, packed);
  }
  return packed;
}

/**
 * Unpacked libraries a worker keeps between tasks, by version (published versions never change).
 * Only the lot list is the worker's own memory; the spectra stay shared.
 */
const unpacked = new Map<string, PublishedLibrary>();
/**
 * Bounded by lots, not by libraries: an analysis reads its own library and every other published
 * library of the lab (for the does-not-belong flag), so a count of four thrashed as soon as a lab
 * had five, and a 50,000-lot lot list was rebuilt on every analysis. Small libraries cost little;
 * the lots of the task at hand are always kept.
 */
const WORKER_KEEPS_LOTS = 200_000;
const WORKER_KEEPS = 32;
let keptLots = 0;

export function unpackLibrary(p: PackedLibrary): PublishedLibrary {
  const kept = unpacked.get(p.versionId);
  if (kept && kept.labId === p.labId && kept.packed.length === p.packed.length) {
    unpacked.delete(p.versionId);
    unpacked.set(p.versionId, kept);
    return kept;
  }
  const { lotKeys, ...rest } = p;
  const lots = lotKeys
    ? lotKeys.split('\n').map((line) => {
        const tab = line.indexOf('\t');
        return { id: line.slice(0, tab), lotCode: line.slice(tab + 1) };
      })
    : [];
  const library: PublishedLibrary = { ...rest, lots, spectra: spectraOver(p.packed, p.grid) };
  if (kept) {
    unpacked.delete(p.versionId);
    keptLots -= kept.lots.length;
  }
  unpacked.set(p.versionId, library);
  keptLots += lots.length;
  while (unpacked.size > 1 && (unpacked.size > WORKER_KEEPS || keptLots > WORKER_KEEPS_LOTS)) {
    const oldest = unpacked.keys().next().value as string;
    keptLots -= (unpacked.get(oldest) as PublishedLibrary).lots.length;
    unpacked.delete(oldest);
  }
  return library;
}
