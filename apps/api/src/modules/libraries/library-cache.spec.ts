import { createLibraryCache, libraryBytes, type PublishedLibrary } from './published-library';
import { keepResident, packLibrary } from './library-packing';

/** A decoded library of `lots` lots on an `n`-point grid (values invented). */
function library(versionId: string, lots: number, n = 41): PublishedLibrary {
  const grid = Float64Array.from({ length: n }, (_, i) => 100 * 1.2 ** i);
  const packed = new Float64Array(new SharedArrayBuffer(16 * n * lots));
  packed.forEach((_, i) => (packed[i] = (i % 7) - 3));
  const lotList = Array.from({ length: lots }, (_, i) => ({ id: `00000000-0000-4000-8000-${String(i).padStart(12, '0')}`, lotCode: `L${i}` }));
  return {
    versionId,
    version: 1,
    labId: 'lab',
    productId: 'product',
    productName: 'Invented product',
    method: {} as PublishedLibrary['method'],
    grid,
    calibration: { nearestDistances: new Array(lots).fill(0.01) } as unknown as PublishedLibrary['calibration'],
    publishedAt: new Date(0),
    lots: lotList,
    spectra: [],
    packed,
    loadKey: `${versionId}-load-1`,
  };
}

describe('published-library cache capped by bytes', () => {
  it('counts a library by its spectra and lots', () => {
    const small = libraryBytes(library('a', 100));
    const large = libraryBytes(library('b', 1000));
    expect(small).toBeGreaterThanOrEqual(100 * 41 * 16);
    expect(large).toBeGreaterThan(9 * small);
  });

  it('keeps the total under the cap, dropping the least recently used first', () => {
    const each = libraryBytes(library('x', 1000));
    const cache = createLibraryCache(Math.floor(each * 2.5));
    cache.set('a', library('a', 1000));
    cache.set('b', library('b', 1000));
    expect(cache.get('a')?.versionId).toBe('a'); // a is now the most recently used
    cache.set('c', library('c', 1000));
    expect([...cache.keys()].sort()).toEqual(['a', 'c']);
    expect(cache.calculatedSize).toBeLessThanOrEqual(each * 2.5);
  });

  it('serves a library larger than the whole cap without keeping it or dropping the others for it', () => {
    const each = libraryBytes(library('x', 100));
    const cache = createLibraryCache(each * 3);
    cache.set('a', library('a', 100));
    cache.set('huge', library('huge', 1000));
    expect(cache.has('huge')).toBe(false);
    expect(cache.has('a')).toBe(true);
  });
});

describe('a library packed for a worker thread', () => {
  it('shares its spectra rather than copying them, and unpacks to the same lots', () => {
    const lib = library('v', 3, 4);
    const packed = packLibrary(lib);
    expect(packed.packed.buffer).toBeInstanceOf(SharedArrayBuffer);
    const back = keepResident(structuredClone(packed));
    expect(back.lots).toEqual(lib.lots);
    expect(back.spectra).toHaveLength(3);
    expect(Array.from(back.spectra[1].re)).toEqual(Array.from(lib.packed.subarray(8, 12)));
    expect(Array.from(back.spectra[1].im)).toEqual(Array.from(lib.packed.subarray(12, 16)));
    back.packed[8] = 42; // the same memory on both sides
    expect(lib.packed[8]).toBe(42);
  });
});
