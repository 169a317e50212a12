/**
 * The demo's methods and reference libraries, built through the same data model and services the
 * lab portal uses: a method per matrix with its versions, and each product's library as a draft
 * of invented lots (some with invented chemistry) published under a method version. Ridgeline Red
 * shows a library that grew: version 1 (40 lots, method version 1 with the empirical estimator)
 * is superseded by version 2 (80 lots, method version 2 with the lognormal estimator). All data
 * is invented.
 */
import type { EntityManager } from 'typeorm';
import type { Chemistry, Matrix, MethodSettings } from '@ohmprint/contracts';
import { DEFAULT_METHOD } from '../../apps/api/src/modules/libraries/default-method';
import { createDraftVersion, libraryOf, publishVersion, type NewLot } from '../../apps/api/src/modules/libraries/library-versions';
import { Method } from '../../apps/api/src/modules/libraries/method.entity';
import { MethodVersion } from '../../apps/api/src/modules/libraries/method-version.entity';
import { methodGrid } from '../../apps/api/src/modules/measurements/prepared-replicates';
import { DEMO_PRODUCTS, type DemoProduct } from './lab-demo-catalog';
import { demoRandom, seedFrom } from './lab-demo-random';
import { DEMO_PROFILES, demoLots, type DemoLot } from './lab-demo-spectra';
import { demoProducerLotCode } from './producer-lot-codes-demo';

interface DemoMethod {
  matrix: Matrix;
  name: string;
  /** Oldest first; each a change of the one before. */
  versions: { settings: MethodSettings; note: string }[];
}

const lognormal: Partial<MethodSettings> = { thresholdEstimator: 'lognormal-ml', maxThresholdIntervalWidth: 1 };

export const DEMO_METHODS: DemoMethod[] = [
  {
    matrix: 'wine',
    name: 'Wine screening (demo)',
    versions: [
      { settings: { ...DEFAULT_METHOD, model: 'cole-cole', thresholdEstimator: 'empirical-type7' }, note: 'First method for still wines (invented demo).' },
      { settings: { ...DEFAULT_METHOD, model: 'cole-cole', ...lognormal }, note: 'Thresholds from a fitted lognormal with bootstrap intervals; publish limit 100 % of the threshold.' },
    ],
  },
  { matrix: 'milk', name: 'Milk screening (demo)', versions: [{ settings: { ...DEFAULT_METHOD, model: 'havriliak-negami', ...lognormal }, note: 'Milk: asymmetric arc, so Havriliak–Negami.' }] },
  { matrix: 'juice', name: 'Juice screening (demo)', versions: [{ settings: { ...DEFAULT_METHOD, model: 'cole-cole', ...lognormal }, note: 'Fruit juices (invented demo).' }] },
];

/** Invented chemistry for every other lot, loosely following the lot's low-frequency resistance. */
function chemistryOf(matrix: Matrix, lot: DemoLot, i: number, meanRe: number): Chemistry {
  if (i % 2 === 1) return {};
  const rng = demoRandom(seedFrom(`chemistry:${lot.lotCode}`));
  const shift = lot.spectrum.re[0] / meanRe - 1;
  const round = (x: number, d: number) => Number(x.toFixed(d));
  if (matrix === 'wine') return { alcoholPercentVolume: round(13.4 + 25 * shift + rng.normal(0, 0.08), 2), pH: round(3.55 + rng.normal(0, 0.04), 2) };
  if (matrix === 'milk') return { fatGPer100G: round(3.5 - 8 * shift + rng.normal(0, 0.05), 2), proteinGPer100G: round(3.3 + rng.normal(0, 0.05), 2) };
  return { sugarGPerL: round(105 + 400 * shift + rng.normal(0, 1.5), 1), pH: round(3.45 + rng.normal(0, 0.03), 2) };
}

function lotsOf(product: DemoProduct, grid: Float64Array, count: number): NewLot[] {
  const lots = demoLots(DEMO_PROFILES[product.profile], grid, count, product.key);
  const meanRe = lots.reduce((s, l) => s + l.spectrum.re[0], 0) / lots.length;
  return lots.map((l, i) => ({
    ...l,
    note: 'Invented demo lot',
    producerLotCode: demoProducerLotCode(l.lotCode),
    chemistry: chemistryOf(product.matrix, l, i, meanRe),
    quality: { replicates: 3, kkMaxResidualPercent: null, replicateMaxDistance: null, problems: [] },
  }));
}

async function seedMethods(manager: EntityManager, labId: string, adminId: string): Promise<Map<Matrix, string[]>> {
  const versionIds = new Map<Matrix, string[]>();
  for (const demo of DEMO_METHODS) {
    let method = await manager.findOne(Method, { where: { labId, name: demo.name } });
    method ??= await manager.save(Method, manager.create(Method, { labId, name: demo.name, matrix: demo.matrix }));
    const ids: string[] = [];
    for (const [i, v] of demo.versions.entries()) {
      let row = await manager.findOne(MethodVersion, { where: { labId, methodId: method.id, version: i + 1 } });
      row ??= await manager.save(MethodVersion, manager.create(MethodVersion, { labId, methodId: method.id, version: i + 1, settings: v.settings, note: v.note, createdByUserId: adminId }));
      ids.push(row.id);
    }
    versionIds.set(demo.matrix, ids);
  }
  return versionIds;
}

async function publishDemoVersion(manager: EntityManager, labId: string, libraryId: string, methodVersionId: string, settings: MethodSettings, lots: NewLot[], adminId: string): Promise<void> {
  const versionId = await createDraftVersion(manager, labId, libraryId, settings, methodGrid(settings), lots, methodVersionId);
  await publishVersion(manager, labId, versionId, adminId);
}

/** Methods and published libraries of one demo lab's products (skips what is already there). */
export async function seedDemoLibraries(manager: EntityManager, labKey: 'calder' | 'marlow', labId: string, adminId: string, productIds: Map<string, string>): Promise<void> {
  const methods = await seedMethods(manager, labId, adminId);
  for (const product of DEMO_PRODUCTS.filter((p) => p.lab === labKey)) {
    const library = await libraryOf(manager, labId, productIds.get(product.key)!);
    const [existing] = await manager.query(`SELECT id FROM library_version WHERE library_id = $1 LIMIT 1`, [library.id]);
    if (existing) continue;
    const versions = methods.get(product.matrix)!;
    const demo = DEMO_METHODS.find((m) => m.matrix === product.matrix)!;
    if (product.earlierLots) {
      const first = demo.versions[0].settings;
      await publishDemoVersion(manager, labId, library.id, versions[0], first, lotsOf(product, methodGrid(first), product.earlierLots), adminId);
    }
    const latest = demo.versions[demo.versions.length - 1].settings;
    await publishDemoVersion(manager, labId, library.id, versions[versions.length - 1], latest, lotsOf(product, methodGrid(latest), product.lots), adminId);
  }
}
