import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import * as cpuPool from '../../core/cpu-pool/cpu-pool';
import { spectraOver } from '../libraries/library-packing';
import { decodeLotSpectrum } from '../libraries/lot-spectrum-bytes';
import { publishedLibrary, type PublishedLibrary } from '../libraries/published-library';
import { Replicate } from '../measurements/replicate.entity';
import { measureDemoSample, useTestApp } from '../../testing';
import { analyseOffThread } from './analyse-off-thread';
import { onAnalysisStage } from './analysis-stages';
import { computeAnalysis } from './compute-analysis';
import { encodeRanked } from './lot-distances';

jest.setTimeout(120_000);

const t = useTestApp();
const CODE = 'OP-9RWD-6F';
let labId: string;
let versionId: string;
let replicates: Replicate[];

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  const measured = await measureDemoSample(t, CODE);
  versionId = measured.versionId;
  [{ lab_id: labId }] = await t.db.query(`SELECT lab_id FROM sample WHERE id = $1`, [measured.sampleId]);
  replicates = await t.db.manager.find(Replicate, { where: { labId, sampleId: measured.sampleId, excluded: false }, order: { replicateNumber: 'ASC' } });
});

afterEach(() => {
  onAnalysisStage(null);
  jest.restoreAllMocks();
});


/** Counts the analyses whose worker lacked a library and had it sent whole. */
function countResends(): { resends: number } {
  const seen = { resends: 0 };
  onAnalysisStage((stage) => {
    if (stage === 'worker-missing') seen.resends += 1;
  });
  return seen;
}

/** The same version as another load with every spectrum scaled: what a stale copy would be mistaken for. */
function anotherLoad(library: PublishedLibrary, changes: { labId?: string; scale: number }): PublishedLibrary {
  const packed = new Float64Array(new SharedArrayBuffer(library.packed.byteLength));
  packed.set(library.packed.map((v) => v * changes.scale));
  return { ...library, labId: changes.labId ?? library.labId, packed, spectra: spectraOver(packed, library.grid), loadKey: `${library.loadKey}-again` };
}

describe('a published library loaded for analyses', () => {
  it('is decoded in a worker, bit for bit the stored lot spectra, in lot-code order', async () => {
    const decoded: string[] = [];
    const real = cpuPool.runCpuTask;
    jest.spyOn(cpuPool, 'runCpuTask').mockImplementation(((name: Parameters<typeof real>[0], input: never, options?: Parameters<typeof real>[2]) => {
      decoded.push(name);
      return real(name, input, options);
    }) as typeof real);
    const [other] = await t.db.query(
      `SELECT v.id FROM library_version v WHERE v.lab_id = $1 AND v.status = 'published' AND v.id <> $2 ORDER BY v.id LIMIT 1`,
      [labId, versionId],
    );
    // a version no test in this file has loaded yet, so the cache must load it now
    const library = await publishedLibrary(t.db.manager, labId, other.id);
    expect(decoded).toEqual(['decodeLibrarySpectra']);
    // shared with every worker thread (made in a worker, so of that realm: compared by its tag)
    expect(Object.prototype.toString.call(library.packed.buffer)).toBe('[object SharedArrayBuffer]');
    const rows: { id: string; lot_code: string; spectrum: Buffer }[] = await t.db.query(
      `SELECT id, lot_code, spectrum FROM reference_lot WHERE library_version_id = $1 AND included ORDER BY lot_code, id`,
      [other.id],
    );
    expect(rows.length).toBeGreaterThan(10);
    expect(library.lots).toEqual(rows.map((r) => ({ id: r.id, lotCode: r.lot_code })));
    rows.forEach((r, i) => {
      const expected = decodeLotSpectrum(r.spectrum, library.grid);
      expect(Array.from(library.spectra[i].re)).toEqual(Array.from(expected.re));
      expect(Array.from(library.spectra[i].im)).toEqual(Array.from(expected.im));
    });
  });

  it('answers 404 to another lab even once it is loaded', async () => {
    await publishedLibrary(t.db.manager, labId, versionId);
    const [otherLab] = await t.db.query(`SELECT id FROM lab WHERE id <> $1 LIMIT 1`, [labId]);
    await expect(publishedLibrary(t.db.manager, otherLab.id, versionId)).rejects.toMatchObject({ status: 404 });
  });
});

describe('the worker thread’s kept libraries', () => {
  it('give the same analysis as computing on this thread, and the library is sent whole only the first time', async () => {
    const library = await publishedLibrary(t.db.manager, labId, versionId);
    const expected = computeAnalysis(replicates, library);
    const seen = countResends();
    const first = await analyseOffThread(replicates, library, [], { lotOrder: true });
    const second = await analyseOffThread(replicates, library);
    // one worker thread here (CPU_WORKERS in tests, or the machine's cores less one): it kept the library
    expect(seen.resends).toBeLessThanOrEqual(cpuPool.cpuWorkerCount());
    expect(seen.resends).toBeGreaterThanOrEqual(1);
    const before = seen.resends;
    for (let i = 0; i < 3 * cpuPool.cpuWorkerCount(); i++) await analyseOffThread(replicates, library);
    expect(seen.resends - before).toBeLessThanOrEqual(cpuPool.cpuWorkerCount() - 1);
    for (const got of [first, second]) {
      expect(got.result).toEqual(expected.result);
      expect(got.sampleSpectrum).toEqual(expected.sampleSpectrum);
      expect(got.lotCount).toBe(library.lots.length);
      expect(Buffer.from(got.rankedBytes)).toEqual(encodeRanked(expected.ranking, expected.lotDistances));
    }
    expect(Array.from(first.lotDistances!)).toEqual(Array.from(expected.lotDistances));
    expect(second.lotDistances).toBeNull();
  });

  it('never answers a new load of the version from the copy kept for the old one', async () => {
    const library = await publishedLibrary(t.db.manager, labId, versionId);
    await analyseOffThread(replicates, library);
    const reloaded = anotherLoad(library, { scale: 1.05 });
    const got = await analyseOffThread(replicates, reloaded);
    expect(got.result).toEqual(computeAnalysis(replicates, reloaded).result);
    expect(got.result.nearest?.distance).not.toEqual(computeAnalysis(replicates, library).result.nearest?.distance);
  });

  it('never mixes two labs’ libraries, even under the same version id', async () => {
    const ours = await publishedLibrary(t.db.manager, labId, versionId);
    const theirs = anotherLoad(ours, { labId: '00000000-0000-4000-8000-0000000000b2', scale: 0.9 });
    const a = await analyseOffThread(replicates, ours);
    const b = await analyseOffThread(replicates, theirs);
    const a2 = await analyseOffThread(replicates, ours);
    expect(b.result).toEqual(computeAnalysis(replicates, theirs).result);
    expect(a.result).toEqual(computeAnalysis(replicates, ours).result);
    expect(a2.result).toEqual(a.result);
    expect(b.result.nearest?.distance).not.toEqual(a.result.nearest?.distance);
  });
});
