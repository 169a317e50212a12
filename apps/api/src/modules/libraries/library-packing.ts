import type { Spectrum } from '@ohmprint/spectral-engine';
import type { PublishedLibrary } from './published-library';

/**
 * A published library as it crosses into a worker thread the first time. The lots' spectra sit in
 * one SharedArrayBuffer (lot by lot: N real parts, then N imaginary parts), which a worker reads in
 * place instead of receiving a copy; the lots' ids and codes travel as one string. A worker keeps
 * what it received (see `keepResident`), so later analyses send only a `LibraryRef`.
 */
export interface PackedLibrary extends Omit<PublishedLibrary, 'spectra' | 'lots'> {
  /** `id\tlotCode` per lot, one per line, in the library's order. */
  lotKeys: string;
}

/**
 * A library named rather than sent: the worker answers from the copy it keeps when the version,
 * the lab, the load and the lot count all match, and says it is missing otherwise.
 */
export interface LibraryRef {
  versionId: string;
  labId: string;
  /** Which load of the version on the request thread (a new one after the request thread's cache let it go). */
  loadKey: string;
  lotCount: number;
}

/** What an analysis task receives for each library: the whole packed form, or a reference to a kept one. */
export type LibraryHandOver = PackedLibrary | LibraryRef;

export const isPacked = (h: LibraryHandOver): h is PackedLibrary => 'lotKeys' in h;

/**
 * What a decoded library costs in memory, estimated: its spectra (8 bytes a value), each lot's
 * id, code and two typed-array views (about 400 bytes together), and the calibration distances.
 */
export function libraryBytes(library: Pick<PublishedLibrary, 'packed' | 'lots' | 'calibration'>): number {
  return library.packed.byteLength + library.lots.length * 400 + (library.calibration?.nearestDistances?.length ?? 0) * 16 + 4096;
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
    // the spectra travel as `packed`; the views over it are not read here (the cache makes them on first use)
    const { lots, ...rest } = library;
    if ('spectra' in rest) delete (rest as Partial<PublishedLibrary>).spectra;
    packed = { ...rest, lotKeys: lots.map((l) => `${l.id}\t${l.lotCode}`).join('\n') };
    packedForms.set(library, packed);
  }
  return packed;
}

export function libraryRef(library: PublishedLibrary): LibraryRef {
  return { versionId: library.versionId, labId: library.labId, loadKey: library.loadKey, lotCount: library.lots.length };
}

/**
 * Libraries a worker thread keeps between tasks, least recently used first, by version. Bounded
 * by their estimated bytes (`libraryBytes`; the spectra are shared with the request thread's cache
 * but a kept library holds them alive, so they count), never dropping the one just asked for.
 */
const resident = new Map<string, { library: PublishedLibrary; bytes: number }>();
let residentTotal = 0;
/** When the task does not say (the request thread passes its own cache's cap). */
export const WORKER_KEEPS_BYTES = 512 * 1024 * 1024;

function touch(versionId: string, entry: { library: PublishedLibrary; bytes: number }): void {
  resident.delete(versionId);
  resident.set(versionId, entry);
}

function dropResident(versionId: string): void {
  const entry = resident.get(versionId);
  if (!entry) return;
  resident.delete(versionId);
  residentTotal -= entry.bytes;
}

/** The kept library a reference names, or null when this thread has none that matches it exactly. */
export function residentLibrary(ref: LibraryRef): PublishedLibrary | null {
  const entry = resident.get(ref.versionId);
  if (!entry) return null;
  const l = entry.library;
  if (l.labId !== ref.labId || l.loadKey !== ref.loadKey || l.lots.length !== ref.lotCount) return null;
  touch(ref.versionId, entry);
  return l;
}

/**
 * Unpacks a library sent whole and keeps it for the next tasks (the same load already kept is
 * reused as it is). An older load of the version, or another lab's copy under the same id, is
 * replaced, never served.
 */
export function keepResident(p: PackedLibrary, maxBytes = WORKER_KEEPS_BYTES): PublishedLibrary {
  const entry = resident.get(p.versionId);
  if (entry && entry.library.labId === p.labId && entry.library.loadKey === p.loadKey && entry.library.packed.length === p.packed.length) {
    touch(p.versionId, entry);
    return entry.library;
  }
  const { lotKeys, ...rest } = p;
  const lots = lotKeys
    ? lotKeys.split('\n').map((line) => {
        const tab = line.indexOf('\t');
        return { id: line.slice(0, tab), lotCode: line.slice(tab + 1) };
      })
    : [];
  const library: PublishedLibrary = { ...rest, lots, spectra: spectraOver(p.packed, p.grid) };
  dropResident(p.versionId);
  const bytes = libraryBytes(library);
  resident.set(p.versionId, { library, bytes });
  residentTotal += bytes;
  while (resident.size > 1 && residentTotal > maxBytes) dropResident(resident.keys().next().value as string);
  return library;
}

/** The versions and bytes this thread keeps, oldest first (for tests and figures). */
export function residentLibraries(): { versionIds: string[]; bytes: number } {
  return { versionIds: [...resident.keys()], bytes: residentTotal };
}

/** A library as the worker will use it: kept, or sent whole and kept from now on; null when a reference names one it lacks. */
export function receiveLibrary(h: LibraryHandOver, maxBytes = WORKER_KEEPS_BYTES): PublishedLibrary | null {
  return isPacked(h) ? keepResident(h, maxBytes) : residentLibrary(h);
}

/** Kept for callers that hand over a packed library and want it unpacked (and kept). */
export const unpackLibrary = (p: PackedLibrary): PublishedLibrary => keepResident(p);
