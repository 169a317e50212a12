/**
 * The validation part of the invented demo (labelled demo wherever it shows): a second cell of
 * Calder Analytical with a control-chart history in which a drift blocked the cell for a day
 * until a new standard run released it; chemistry for the demo lots that have none; and, for
 * Ridgeline Red, a detection study and blind checks synthesised from the demo's own models and
 * judged against its published library. Idempotent: each part is created only when missing.
 */
import type { EntityManager } from 'typeorm';
import { averageReplicates, impedance, judge, kclConductivity, spectrumDistance, type Spectrum } from '@ohmprint/spectral-engine';
import { publishedLibrary } from '../../apps/api/src/modules/libraries/published-library';
import { standardResistance } from '../../apps/api/src/modules/validation/standard-resistance';
import { DEMO_LABS } from './accounts-demo-data';
import { DEMO_PRODUCTS } from './lab-demo-catalog';
import { type DemoRandom } from './lab-demo-random';
import { DEMO_PROFILES, demoRandom, seedFrom, suspectParameters, type Adulteration } from './lab-demo-spectra';

const DAY_MS = 86_400_000;
export const DEMO_DRIFT_CELL = 'Dip cell B (demo)';
export const DEMO_STUDY_PRODUCT = 'ridgeline-red';

/** Cell constants of the demo history, oldest first: run 15 (16 days ago) drifts beyond the limits, run 16 a day later releases. */
function driftHistory(rng: DemoRandom): { daysAgo: number; k: number }[] {
  const runs: { daysAgo: number; k: number }[] = [];
  for (let i = 0; i < 20; i++) {
    const daysAgo = i <= 14 ? 44 - 2 * i : 15 - 2 * (i - 15);
    const k = i === 14 ? 1.0071 : 0.9985 + rng.normal(0, 0.0006);
    runs.push({ daysAgo, k });
  }
  return runs;
}

/** A KCl standard's sweep through the cell: R + CPE (electrode polarisation), 1 kHz–1 MHz. */
function standardSpectrum(resistanceOhm: number): Spectrum {
  const f = Float64Array.from({ length: 31 }, (_, i) => 10 ** (3 + (3 * i) / 30));
  return impedance('r-cpe', { r: resistanceOhm, q: 2e-5, n: 0.88 }, f);
}

async function seedDriftCell(manager: EntityManager, labId: string, analystId: string, now: Date): Promise<void> {
  const [existing] = await manager.query(`SELECT id FROM measurement_cell WHERE lab_id = $1 AND name = $2`, [labId, DEMO_DRIFT_CELL]);
  if (existing) return;
  const [cell] = await manager.query(`INSERT INTO measurement_cell (lab_id, name, nominal_constant_per_cm) VALUES ($1, $2, 1.0) RETURNING id`, [labId, DEMO_DRIFT_CELL]);
  const rng = demoRandom(seedFrom('validation:drift-cell'));
  for (const run of driftHistory(rng)) {
    const temperatureC = 24 + rng.normal(0, 0.4);
    const standard = kclConductivity(0.01, 'molal', temperatureC);
    const spectrum = standardSpectrum(run.k / (standard.conductivityUsPerCm * 1e-6));
    const r = standardResistance(spectrum).resistanceOhm;
    const measuredAt = new Date(now.getTime() - run.daysAgo * DAY_MS);
    await manager.query(
      `INSERT INTO cell_calibration (lab_id, cell_id, standard_name, standard_conductivity_us_per_cm, standard_temperature_c,
         plateau_resistance_ohm, cell_constant_per_cm, measured_at, measured_by_user_id, concentration, concentration_basis,
         conductivity_source, resistance_source, file_name, frequency_hz, re, im)
       VALUES ($1,$2,'KCl 0.01 mol/kg',$3,$4,$5,$6,$7,$8,0.01,'molal',$9,'plateau',$10,$11,$12,$13)`,
      [labId, cell.id, standard.conductivityUsPerCm, temperatureC, r, standard.conductivityUsPerCm * 1e-6 * r, measuredAt, analystId,
        `${standard.source}; ${standard.temperatureFormula}`, `kcl-demo-run-${measuredAt.toISOString().slice(0, 10)}.csv`,
        Array.from(spectrum.frequencyHz), Array.from(spectrum.re), Array.from(spectrum.im)],
    );
  }
  // The upload the drift refused, half a day after the drifting run (invented).
  await manager.query(`INSERT INTO cell_upload_refusal (lab_id, cell_id, sample_code, rule, refused_at) VALUES ($1, $2, 'OP-DEMO-00', 'one run outside the ±3σ limits', $3)`, [
    labId, cell.id, new Date(now.getTime() - 15.5 * DAY_MS),
  ]);
}

/** Invented chemistry per matrix: a base, a slope on the lot's conductivity and a spread. */
const CHEMISTRY_MODEL: Record<string, { field: string; base: number; perResistivity: number; sd: number; digits: number }[]> = {
  wine: [
    { field: 'alcoholPercentVolume', base: 13.2, perResistivity: 6, sd: 0.08, digits: 1 },
    { field: 'pH', base: 3.5, perResistivity: 0.5, sd: 0.04, digits: 2 },
    { field: 'titratableAcidityGPerL', base: 5.8, perResistivity: -8, sd: 0.15, digits: 1 },
  ],
  milk: [
    { field: 'fatGPer100G', base: 3.5, perResistivity: 4, sd: 0.05, digits: 2 },
    { field: 'proteinGPer100G', base: 3.3, perResistivity: -2, sd: 0.04, digits: 2 },
    { field: 'pH', base: 6.7, perResistivity: 0.2, sd: 0.03, digits: 2 },
  ],
  juice: [
    { field: 'sugarGPerL', base: 105, perResistivity: 150, sd: 2, digits: 0 },
    { field: 'pH', base: 3.6, perResistivity: 0.6, sd: 0.04, digits: 2 },
  ],
};

/**
 * Chemistry for demo lots recorded without any: invented values that follow each lot's
 * high-frequency resistivity a little, so the correlation screen has something to show. Lots of
 * published versions are frozen by a trigger; the seed lifts it for this one invented column.
 */
async function seedLotChemistry(manager: EntityManager, labId: string): Promise<void> {
  const lots: { id: string; matrix: string; spectrum: Buffer; lot_code: string }[] = await manager.query(
    `SELECT r.id, p.matrix, r.spectrum, r.lot_code FROM reference_lot r
     JOIN library_version v ON v.id = r.library_version_id JOIN reference_library l ON l.id = v.library_id JOIN product p ON p.id = l.product_id
     WHERE r.lab_id = $1 AND r.chemistry = '{}'::jsonb ORDER BY r.lot_code, r.id`,
    [labId],
  );
  if (!lots.length) return;
  const byMatrix = new Map<string, number[]>();
  for (const l of lots) byMatrix.set(l.matrix, [...(byMatrix.get(l.matrix) ?? []), l.spectrum.readDoubleLE(0)]);
  const rng = demoRandom(seedFrom(`validation:chemistry:${labId}`));
  await manager.query(`ALTER TABLE reference_lot DISABLE TRIGGER reference_lot_frozen`);
  for (const l of lots) {
    const model = CHEMISTRY_MODEL[l.matrix];
    if (!model) continue;
    const values = byMatrix.get(l.matrix) as number[];
    const mean = values.reduce((a, b) => a + b, 0) / values.length;
    const rel = l.spectrum.readDoubleLE(0) / mean - 1;
    const chemistry = Object.fromEntries(model.map((m) => [m.field, Number((m.base + m.perResistivity * rel + rng.normal(0, m.sd)).toFixed(m.digits))]));
    await manager.query(`UPDATE reference_lot SET chemistry = $2 WHERE id = $1`, [l.id, JSON.stringify(chemistry)]);
  }
  await manager.query(`ALTER TABLE reference_lot ENABLE TRIGGER reference_lot_frozen`);
}

/** Invented noise of one sweep (as the lab demo's), relative to each component. */
const SWEEP_NOISE = 0.0015;

function noisy(s: Spectrum, rng: DemoRandom, relative: number): Spectrum {
  return { frequencyHz: s.frequencyHz, re: s.re.map((v) => v * (1 + rng.normal(0, relative))), im: s.im.map((v) => v * (1 + rng.normal(0, relative))) };
}

/** An invented sample's normalised spectrum on the library grid (what three averaged sweeps give). */
function synthesised(profileKey: string, adulteration: Adulteration, grid: Float64Array, rng: DemoRandom): Spectrum {
  const profile = DEMO_PROFILES[profileKey];
  return noisy(impedance(profile.model, suspectParameters(profile, adulteration, rng), grid), rng, SWEEP_NOISE / Math.sqrt(3));
}

/** Three sweeps of one invented authentic sample, their mean, and the distances between the sweeps. */
function synthesisedWithReplicates(profileKey: string, grid: Float64Array, rng: DemoRandom): { mean: Spectrum; distances: number[] } {
  const profile = DEMO_PROFILES[profileKey];
  const clean = impedance(profile.model, suspectParameters(profile, { kind: 'none' }, rng), grid);
  const sweeps = [0, 1, 2].map(() => noisy(clean, rng, SWEEP_NOISE));
  return {
    mean: averageReplicates(sweeps),
    distances: [spectrumDistance(sweeps[0], sweeps[1]), spectrumDistance(sweeps[0], sweeps[2]), spectrumDistance(sweeps[1], sweeps[2])],
  };
}

const WATER_LEVELS = [2, 5, 8, 12, 16, 20];
const BLEND_LEVELS = [10, 20, 35, 50];
const TRIALS_PER_LEVEL = 12;
const BLIND_CHECKS = 48;

async function seedStudies(manager: EntityManager, labId: string, now: Date): Promise<void> {
  const demo = DEMO_PRODUCTS.find((p) => p.key === DEMO_STUDY_PRODUCT)!;
  const [product] = await manager.query(`SELECT id FROM product WHERE lab_id = $1 AND name = $2`, [labId, demo.name]);
  if (!product) return;
  const [done] = await manager.query(`SELECT 1 FROM synthesised_trial WHERE lab_id = $1 AND product_id = $2 LIMIT 1`, [labId, product.id]);
  if (done) return;
  const [version] = await manager.query(
    `SELECT v.id FROM library_version v JOIN reference_library l ON l.id = v.library_id
     WHERE l.product_id = $1 AND v.lab_id = $2 AND v.status = 'published' ORDER BY v.version DESC LIMIT 1`,
    [product.id, labId],
  );
  if (!version) return;
  const library = await publishedLibrary(manager, labId, version.id);
  const rng = demoRandom(seedFrom('validation:studies'));
  const blendWith = DEMO_PROFILES['hollin-white'];
  const rows: unknown[][] = [];
  const add = (kind: string, admixture: string | null, name: string | null, level: number | null, reference: string, spectrum: Spectrum, decidedAt: Date, replicateDistances: number[] = []) => {
    const j = judge(spectrum, library.spectra, library.calibration);
    rows.push([labId, product.id, version.id, kind, admixture, name, level, reference, j.verdict, j.nearest?.distance ?? null, decidedAt, replicateDistances]);
  };
  for (const level of WATER_LEVELS) {
    for (let i = 0; i < TRIALS_PER_LEVEL; i++) {
      add('detection', 'water', 'tap water', level, `DEMO-W${level}-${i + 1}`, synthesised(DEMO_STUDY_PRODUCT, { kind: 'watered', waterFraction: level / 100 }, library.grid, rng), new Date(now.getTime() - 20 * DAY_MS));
    }
  }
  for (const level of BLEND_LEVELS) {
    for (let i = 0; i < TRIALS_PER_LEVEL; i++) {
      add('detection', 'other-product', 'Hollin Dry White (demo)', level, `DEMO-B${level}-${i + 1}`, synthesised(DEMO_STUDY_PRODUCT, { kind: 'blended', with: blendWith, fraction: level / 100 }, library.grid, rng), new Date(now.getTime() - 19 * DAY_MS));
    }
  }
  for (let i = 0; i < BLIND_CHECKS; i++) {
    const check = synthesisedWithReplicates(DEMO_STUDY_PRODUCT, library.grid, rng);
    add('blind-check', null, null, null, `DEMO-BLIND-${String(i + 1).padStart(2, '0')}`, check.mean, new Date(now.getTime() - (90 - 1.8 * i) * DAY_MS), check.distances);
  }
  for (const r of rows) {
    await manager.query(
      `INSERT INTO synthesised_trial (lab_id, product_id, library_version_id, kind, admixture, admixture_name, level_percent, reference, verdict, nearest_distance, decided_at, replicate_distances)
       VALUES ($1,$2,$3,$4,$5,$6,$7,$8,$9,$10,$11,$12)`,
      r,
    );
  }
}

/** Seeds the validation demo for Calder Analytical (after the lab demo). */
export async function seedValidationDemo(manager: EntityManager, now = new Date()): Promise<void> {
  const demo = DEMO_LABS.find((l) => l.key === 'calder')!;
  const [lab] = await manager.query(`SELECT id FROM lab WHERE name = $1`, [demo.name]);
  if (!lab) throw new Error('validation demo seed: seed the accounts and the lab demo first');
  const analystEmail = demo.staff.find((s) => (s.roles as string[]).includes('analyst'))!.email;
  const [analyst] = await manager.query(`SELECT id FROM app_user WHERE email = $1`, [analystEmail]);
  await seedDriftCell(manager, lab.id, analyst.id, now);
  await seedLotChemistry(manager, lab.id);
  await seedStudies(manager, lab.id, now);
}
