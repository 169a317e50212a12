import type { PublishedLibrary } from './published-library';
import { keepResident, libraryBytes, libraryRef, packLibrary, receiveLibrary, residentLibraries } from './library-packing';

/** An invented published library of `lots` lots on a two-point grid, as the request thread caches it. */
function library(versionId: string, lots: number, opts: { labId?: string; loadKey?: string; value?: number } = {}): PublishedLibrary {
  const grid = Float64Array.from([10, 100]);
  const packed = new Float64Array(new SharedArrayBuffer(8 * 4 * Math.max(1, lots))).subarray(0, 4 * lots).fill(opts.value ?? 1);
  return {
    versionId,
    labId: opts.labId ?? 'lab-1',
    loadKey: opts.loadKey ?? `${versionId}-load-1`,
    grid,
    packed,
    calibration: { nearestDistances: new Array(lots).fill(0.01) },
    lots: Array.from({ length: lots }, (_, i) => ({ id: `${versionId}-${i}`, lotCode: `L${i}` })),
  } as unknown as PublishedLibrary;
}

/** What a worker thread receives: a structured copy per task, never the same object twice. */
const sent = <T>(x: T): T => structuredClone(x);

describe('libraries a worker thread keeps', () => {
  it('keeps a lab of six libraries (its own plus five others) and answers later analyses from a reference alone', () => {
    const libraries = ['a', 'b', 'c', 'd', 'e', 'f'].map((v) => library(`v-${v}`, 50));
    const first = libraries.map((l) => receiveLibrary(sent(packLibrary(l))));
    const second = libraries.map((l) => receiveLibrary(sent(libraryRef(l))));
    second.forEach((l, i) => expect(l).toBe(first[i]));
    expect(second[5]?.lots[49]).toEqual({ id: 'v-f-49', lotCode: 'L49' });
  });

  it('is bounded by bytes: the least recently used goes first, never the one just asked for', () => {
    const each = libraryBytes(library('x', 20_000));
    const cap = Math.floor(each * 2.5);
    const [p, q, r] = ['v-p', 'v-q', 'v-r'].map((v) => library(v, 20_000));
    keepResident(sent(packLibrary(p)), cap);
    keepResident(sent(packLibrary(q)), cap);
    expect(receiveLibrary(sent(libraryRef(p)), cap)).not.toBeNull(); // p is now the most recently used
    keepResident(sent(packLibrary(r)), cap);
    expect(receiveLibrary(sent(libraryRef(q)), cap)).toBeNull();
    expect(residentLibraries().versionIds).toEqual(expect.arrayContaining(['v-p', 'v-r']));
    expect(residentLibraries().bytes).toBeLessThanOrEqual(cap);
    // one library larger than the whole cap is still kept while it is the one in use
    const huge = library('v-huge', 100_000);
    expect(keepResident(sent(packLibrary(huge)), cap).lots).toHaveLength(100_000);
    expect(residentLibraries().versionIds).toEqual(['v-huge']);
  });

  it('never answers for another load of the version: a reload on the request thread is sent again and replaces the old copy', () => {
    const old = library('v-reload', 10, { loadKey: 'load-1', value: 1 });
    const fresh = library('v-reload', 10, { loadKey: 'load-2', value: 2 });
    keepResident(sent(packLibrary(old)));
    expect(receiveLibrary(sent(libraryRef(fresh)))).toBeNull();
    const kept = receiveLibrary(sent(packLibrary(fresh)));
    expect(kept?.spectra[0].re[0]).toBe(2);
    // the old load is gone, not kept beside the new one
    expect(receiveLibrary(sent(libraryRef(old)))).toBeNull();
    expect(receiveLibrary(sent(libraryRef(fresh)))).toBe(kept);
  });

  it('never answers one lab with another lab’s copy, nor with a copy of another size', () => {
    const ours = library('v-shared-id', 10, { labId: 'lab-A', loadKey: 'k' });
    keepResident(sent(packLibrary(ours)));
    expect(receiveLibrary(sent({ ...libraryRef(ours), labId: 'lab-B' }))).toBeNull();
    expect(receiveLibrary(sent({ ...libraryRef(ours), lotCount: 11 }))).toBeNull();
    const theirs = library('v-shared-id', 10, { labId: 'lab-B', loadKey: 'k', value: 7 });
    expect(receiveLibrary(sent(packLibrary(theirs)))?.spectra[0].re[0]).toBe(7);
    expect(receiveLibrary(sent(libraryRef(ours)))).toBeNull();
  });
});
