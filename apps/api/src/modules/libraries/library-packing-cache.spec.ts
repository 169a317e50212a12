import type { PublishedLibrary } from './published-library';
import { packLibrary, unpackLibrary } from './library-packing';

/** An invented published library of `lots` lots on a two-point grid, as the request thread caches it. */
function library(versionId: string, lots: number): PublishedLibrary {
  const grid = Float64Array.from([10, 100]);
  const packed = new Float64Array(new SharedArrayBuffer(8 * 4 * lots));
  return { versionId, labId: 'lab-1', grid, packed, lots: Array.from({ length: lots }, (_, i) => ({ id: `${versionId}-${i}`, lotCode: `L${i}` })) } as unknown as PublishedLibrary;
}

describe('libraries a worker thread keeps unpacked', () => {
  it('keeps a lab of six libraries (its own plus five others) between analyses instead of rebuilding each', () => {
    const libraries = ['a', 'b', 'c', 'd', 'e', 'f'].map((v) => library(`v-${v}`, 50));
    // What a thread receives: a structured copy per task, never the same object twice.
    const first = libraries.map((l) => unpackLibrary(structuredClone(packLibrary(l))));
    const second = libraries.map((l) => unpackLibrary(structuredClone(packLibrary(l))));
    second.forEach((l, i) => expect(l).toBe(first[i]));
    expect(second[5].lots[49]).toEqual({ id: 'v-f-49', lotCode: 'L49' });
  });

  it('lets go of the oldest when the lots kept would pass the bound, but never the one just asked for', () => {
    const big = library('v-big', 150_000);
    const bigger = library('v-bigger', 150_000);
    const a = unpackLibrary(structuredClone(packLibrary(big)));
    const b = unpackLibrary(structuredClone(packLibrary(bigger)));
    expect(b.lots).toHaveLength(150_000);
    expect(unpackLibrary(structuredClone(packLibrary(bigger)))).toBe(b);
    expect(unpackLibrary(structuredClone(packLibrary(big)))).not.toBe(a);
  });
});
