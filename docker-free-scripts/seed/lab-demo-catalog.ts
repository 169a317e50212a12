/**
 * The invented lab demo: products, orders and suspect samples of the demo producers, with fixed
 * sample codes so the demo guide and the browser journey can name them. All data is invented.
 */
import type { Matrix, SampleState } from '@ohmprint/contracts';
import { DEMO_PROFILES, type Adulteration } from './lab-demo-spectra';

export interface DemoProduct {
  key: string;
  lab: 'calder' | 'marlow';
  client: string;
  name: string;
  matrix: Matrix;
  description: string;
  profile: string;
  /** Authentic lots in the newest published library version. */
  lots: number;
  /** Lots of an earlier version the newest one supersedes (built under the method's first version). */
  earlierLots?: number;
}

export const DEMO_PRODUCTS: DemoProduct[] = [
  { key: 'ridgeline-red', lab: 'calder', client: 'Hollin Ridge Cellars', name: 'Ridgeline Red (demo)', matrix: 'wine', description: 'Invented red wine, 13.5 % vol., 750 ml bottle', profile: 'ridgeline-red', lots: 80, earlierLots: 40 },
  { key: 'hollin-white', lab: 'calder', client: 'Hollin Ridge Cellars', name: 'Hollin Dry White (demo)', matrix: 'wine', description: 'Invented dry white wine, 12 % vol., 750 ml bottle', profile: 'hollin-white', lots: 30 },
  { key: 'whole-milk', lab: 'calder', client: 'Brightwater Dairy Cooperative', name: 'Brightwater Whole Milk (demo)', matrix: 'milk', description: 'Invented pasteurised whole milk, 3.5 % fat, 1 l carton', profile: 'whole-milk', lots: 40 },
  { key: 'skimmed-milk', lab: 'calder', client: 'Brightwater Dairy Cooperative', name: 'Brightwater Skimmed Milk (demo)', matrix: 'milk', description: 'Invented pasteurised skimmed milk, 0.1 % fat, 1 l carton', profile: 'skimmed-milk', lots: 30 },
  { key: 'cloudy-apple', lab: 'calder', client: 'Sunvale Juice Works', name: 'Sunvale Cloudy Apple (demo)', matrix: 'juice', description: 'Invented not-from-concentrate cloudy apple juice, 1 l bottle', profile: 'cloudy-apple', lots: 40 },
  { key: 'greyfield-apple', lab: 'marlow', client: 'Greyfield Preserves', name: 'Greyfield Apple Juice (demo)', matrix: 'juice', description: 'Invented apple juice of the second demo lab', profile: 'cloudy-apple', lots: 24 },
];

/** Shapes of instrument export the demo files come in (see demo-files/README.md). */
export type ExportShape = 'comma-real-imaginary' | 'semicolon-kilo-negative-imaginary' | 'tab-modulus-phase';

export interface DemoSample {
  code: string;
  product: string;
  /** Which of the product's demo orders it belongs to (orders are placed `daysAgo` days ago). */
  order: { daysAgo: number; placedBy: 'client-admin' | 'client-member' };
  state: Extract<SampleState, 'awaiting-arrival' | 'received' | 'accepted'>;
  obtainedWhere: string;
  obtainedOn: string;
  labelText: string;
  claimedLot: string;
  /** Present when the demo ships instrument exports for the sample. */
  files?: { adulteration: Adulteration; shape: ExportShape; replicates: number; temperatureC: number; expect: string };
}

const white = DEMO_PROFILES['hollin-white'];

export const DEMO_SAMPLES: DemoSample[] = [
  {
    code: 'OP-7K3M-Q9', product: 'ridgeline-red', order: { daysAgo: 6, placedBy: 'client-admin' }, state: 'accepted',
    obtainedWhere: 'Invented wine shop, Harbour Street, Demoport', obtainedOn: '2026-11-20', labelText: 'Ridgeline Red 2024, 13.5 % vol.', claimedLot: 'L24-118',
    files: { adulteration: { kind: 'none' }, shape: 'comma-real-imaginary', replicates: 3, temperatureC: 22.5, expect: 'consistent' },
  },
  {
    code: 'OP-4HXT-2B', product: 'ridgeline-red', order: { daysAgo: 6, placedBy: 'client-admin' }, state: 'accepted',
    obtainedWhere: 'Invented online marketplace listing, shipped from Demoville', obtainedOn: '2026-11-18', labelText: 'Ridgeline Red 2024 (label slightly faded)', claimedLot: 'L24-131',
    files: { adulteration: { kind: 'blended', with: white, fraction: 0.11 }, shape: 'semicolon-kilo-negative-imaginary', replicates: 3, temperatureC: 18.0, expect: 'not-consistent' },
  },
  {
    code: 'OP-9RWD-6F', product: 'ridgeline-red', order: { daysAgo: 6, placedBy: 'client-admin' }, state: 'accepted',
    obtainedWhere: 'Invented distributor complaint, Northgate depot', obtainedOn: '2026-11-15', labelText: 'Ridgeline Red 2024, cork loose', claimedLot: 'L24-118',
    files: { adulteration: { kind: 'watered', waterFraction: 0.12 }, shape: 'tab-modulus-phase', replicates: 3, temperatureC: 21.0, expect: 'not-consistent' },
  },
  {
    code: 'OP-2HNB-5W', product: 'ridgeline-red', order: { daysAgo: 5, placedBy: 'client-admin' }, state: 'accepted',
    obtainedWhere: 'Invented hotel cellar, Demoport seafront', obtainedOn: '2026-11-21', labelText: 'Ridgeline Red 2024, capsule intact', claimedLot: 'L24-125',
    files: { adulteration: { kind: 'none' }, shape: 'comma-real-imaginary', replicates: 3, temperatureC: 22.0, expect: 'consistent' },
  },
  {
    code: 'OP-3VNC-8P', product: 'ridgeline-red', order: { daysAgo: 1, placedBy: 'client-member' }, state: 'awaiting-arrival',
    obtainedWhere: 'Invented restaurant supplier, Quay Road', obtainedOn: '2026-11-28', labelText: 'Ridgeline Red 2024', claimedLot: 'L24-140',
  },
  {
    code: 'OP-5QGZ-1M', product: 'hollin-white', order: { daysAgo: 1, placedBy: 'client-member' }, state: 'awaiting-arrival',
    obtainedWhere: 'Invented duty-free shop, Demoport airport', obtainedOn: '2026-11-27', labelText: 'Hollin Dry White 2025', claimedLot: 'W25-022',
  },
  {
    code: 'OP-8MJA-4T', product: 'whole-milk', order: { daysAgo: 10, placedBy: 'client-admin' }, state: 'accepted',
    obtainedWhere: 'Invented convenience store, Mill Lane', obtainedOn: '2026-11-21', labelText: 'Brightwater Whole Milk, best before 2026-11-29', claimedLot: 'BW-3318',
    files: { adulteration: { kind: 'watered', waterFraction: 0.08 }, shape: 'comma-real-imaginary', replicates: 2, temperatureC: 19.0, expect: 'not-consistent' },
  },
  {
    code: 'OP-2DKE-7W', product: 'skimmed-milk', order: { daysAgo: 2, placedBy: 'client-admin' }, state: 'awaiting-arrival',
    obtainedWhere: 'Invented school canteen supplier', obtainedOn: '2026-11-29', labelText: 'Brightwater Skimmed Milk', claimedLot: 'BS-1207',
  },
  {
    code: 'OP-6TBS-3H', product: 'cloudy-apple', order: { daysAgo: 4, placedBy: 'client-admin' }, state: 'accepted',
    obtainedWhere: 'Invented farmers’ market stall, Demoville', obtainedOn: '2026-11-24', labelText: 'Sunvale Cloudy Apple, 1 l', claimedLot: 'SV-0913',
    files: { adulteration: { kind: 'watered', waterFraction: 0.015 }, shape: 'semicolon-kilo-negative-imaginary', replicates: 2, temperatureC: 20.5, expect: 'inconclusive' },
  },
  {
    code: 'OP-1PYF-9C', product: 'cloudy-apple', order: { daysAgo: 4, placedBy: 'client-admin' }, state: 'received',
    obtainedWhere: 'Invented wholesaler, Canal Basin', obtainedOn: '2026-11-25', labelText: 'Sunvale Cloudy Apple, 1 l (cap damaged)', claimedLot: 'SV-0921',
  },
  {
    code: 'OP-0GRY-5N', product: 'greyfield-apple', order: { daysAgo: 3, placedBy: 'client-admin' }, state: 'accepted',
    obtainedWhere: 'Invented corner shop of the second demo lab', obtainedOn: '2026-11-26', labelText: 'Greyfield Apple Juice', claimedLot: 'GF-0100',
  },
];

/** The demo bench: one analyser and one cell per lab, with a KCl calibration (invented readings). */
export const DEMO_BENCH = {
  instrument: { name: 'Bench analyser 1 (demo)', model: 'Invented IA-200', serialNumber: 'DEMO-0001' },
  cell: { name: 'Dip cell A (demo)', nominalConstantPerCm: 1.0 },
  // 0.01 mol/L KCl ≈ 1413 µS/cm at 25 °C (common practice, printed on commercial standards).
  calibration: { standardName: 'KCl 0.01 mol/L (1413 µS/cm at 25 °C)', standardConductivityUsPerCm: 1413, standardTemperatureC: 25, plateauResistanceOhm: 722.0 },
};
