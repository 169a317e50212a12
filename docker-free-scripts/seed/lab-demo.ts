/**
 * The lab workflow's part of the invented demo: method settings, a bench (analyser, cell, KCl
 * calibration), products with published reference libraries, and orders with suspect samples in
 * several states. Idempotent: everything is found by name or code and created only when missing.
 */
import type { EntityManager } from 'typeorm';
import { CustodyEvent } from '../../apps/api/src/modules/custody/custody-event.entity';
import { SampleIntake } from '../../apps/api/src/modules/intake/sample-intake.entity';
import { DEFAULT_METHOD } from '../../apps/api/src/modules/libraries/default-method';
import { LabMethodSettings } from '../../apps/api/src/modules/libraries/method-settings.entity';
import { CellCalibration } from '../../apps/api/src/modules/measurements/cell-calibration.entity';
import { cellConstantPerCm } from '../../apps/api/src/modules/measurements/cell-constant';
import { Instrument } from '../../apps/api/src/modules/measurements/instrument.entity';
import { MeasurementCell } from '../../apps/api/src/modules/measurements/measurement-cell.entity';
import { Product } from '../../apps/api/src/modules/orders/product.entity';
import { TestOrder } from '../../apps/api/src/modules/orders/test-order.entity';
import { Sample } from '../../apps/api/src/modules/samples/sample.entity';
import { DEMO_LABS } from './accounts-demo-data';
import { DEMO_BENCH, DEMO_PRODUCTS, DEMO_SAMPLES, type DemoSample } from './lab-demo-catalog';
import { seedDemoLibraries } from './lab-demo-libraries';

const DAY_MS = 86_400_000;

async function idOf(manager: EntityManager, sql: string, params: unknown[], what: string): Promise<string> {
  const [row] = await manager.query(sql, params);
  if (!row) throw new Error(`lab demo seed: ${what} is missing; seed the accounts first`);
  return row.id as string;
}

async function seedBench(manager: EntityManager, labId: string, analystId: string, now: Date): Promise<void> {
  let instrument = await manager.findOne(Instrument, { where: { labId, name: DEMO_BENCH.instrument.name } });
  instrument ??= await manager.save(Instrument, manager.create(Instrument, { labId, ...DEMO_BENCH.instrument }));
  let cell = await manager.findOne(MeasurementCell, { where: { labId, name: DEMO_BENCH.cell.name } });
  cell ??= await manager.save(MeasurementCell, manager.create(MeasurementCell, { labId, ...DEMO_BENCH.cell }));
  if (!(await manager.findOne(CellCalibration, { where: { labId, cellId: cell.id } }))) {
    const c = DEMO_BENCH.calibration;
    await manager.insert(CellCalibration, {
      labId,
      cellId: cell.id,
      ...c,
      cellConstantPerCm: cellConstantPerCm(c.standardConductivityUsPerCm, c.plateauResistanceOhm),
      measuredAt: new Date(now.getTime() - 10 * DAY_MS),
      measuredByUserId: analystId,
    });
  }
}

async function seedProducts(manager: EntityManager, labKey: 'calder' | 'marlow', labId: string, adminId: string): Promise<Map<string, string>> {
  const ids = new Map<string, string>();
  for (const demo of DEMO_PRODUCTS.filter((p) => p.lab === labKey)) {
    const clientId = await idOf(manager, 'SELECT id FROM client_organisation WHERE lab_id = $1 AND name = $2', [labId, demo.client], `client ${demo.client}`);
    let product = await manager.findOne(Product, { where: { labId, clientOrganisationId: clientId, name: demo.name } });
    product ??= await manager.save(Product, manager.create(Product, { labId, clientOrganisationId: clientId, name: demo.name, matrix: demo.matrix, description: demo.description }));
    ids.set(demo.key, product.id);
  }
  await seedDemoLibraries(manager, labKey, labId, adminId, ids);
  return ids;
}

async function seedSamples(manager: EntityManager, labKey: 'calder' | 'marlow', labId: string, productIds: Map<string, string>, intakeId: string, now: Date): Promise<void> {
  const lab = DEMO_LABS.find((l) => l.key === labKey)!;
  const mine = DEMO_SAMPLES.filter((s) => DEMO_PRODUCTS.find((p) => p.key === s.product)?.lab === labKey);
  const groups = new Map<string, DemoSample[]>();
  for (const s of mine) {
    const key = `${s.product}|${s.order.daysAgo}|${s.order.placedBy}`;
    groups.set(key, [...(groups.get(key) ?? []), s]);
  }
  for (const samples of groups.values()) {
    const first = samples[0];
    if (await manager.findOne(Sample, { where: { code: first.code } })) continue;
    const product = DEMO_PRODUCTS.find((p) => p.key === first.product)!;
    const client = lab.clients.find((c) => c.name === product.client)!;
    const placer = client.members.find((m) => m.role === first.order.placedBy)!;
    const placedById = await idOf(manager, 'SELECT id FROM app_user WHERE email = $1', [placer.email], placer.email);
    const clientId = await idOf(manager, 'SELECT id FROM client_organisation WHERE lab_id = $1 AND name = $2', [labId, client.name], client.name);
    const placedAt = new Date(now.getTime() - first.order.daysAgo * DAY_MS);
    const order = await manager.save(
      TestOrder,
      manager.create(TestOrder, {
        labId,
        clientOrganisationId: clientId,
        productId: productIds.get(first.product)!,
        status: samples.some((s) => s.state !== 'awaiting-arrival') ? 'in-progress' : 'placed',
        placedByUserId: placedById,
        creditsReserved: samples.length,
        placedAt,
      }),
    );
    for (const s of samples) {
      const arrived = s.state === 'awaiting-arrival' ? null : new Date(placedAt.getTime() + 2 * DAY_MS);
      const sample = await manager.save(
        Sample,
        manager.create(Sample, {
          labId,
          orderId: order.id,
          code: s.code,
          state: s.state,
          obtainedWhere: s.obtainedWhere,
          obtainedOn: s.obtainedOn,
          labelText: s.labelText,
          claimedLot: s.claimedLot,
          storageLocation: s.state === 'accepted' ? 'Cold room 1, shelf B (demo)' : null,
          receivedAt: arrived,
          stateChangedAt: arrived ?? placedAt,
        }),
      );
      if (!arrived) continue;
      await manager.insert(SampleIntake, {
        sampleId: sample.id,
        labId,
        carrier: 'Invented Courier Co.',
        trackingNumber: `DEMO${s.code.replace(/-/g, '')}`,
        arrivedAt: arrived,
        temperatureC: product.matrix === 'milk' ? 4.5 : 14.0,
        sealIntact: !s.labelText.includes('damaged'),
        containerCondition: s.labelText.includes('damaged') ? 'damaged' : 'intact',
        volumeMl: product.matrix === 'wine' ? 750 : 1000,
        notes: 'Invented demo intake record',
        recordedByUserId: intakeId,
        recordedAt: arrived,
      });
      const events: Partial<CustodyEvent>[] = [{ kind: 'received', location: 'Intake bench', reason: 'Arrived by Invented Courier Co.', occurredAt: arrived }];
      if (s.state === 'accepted') {
        const later = new Date(arrived.getTime() + 3_600_000);
        events.push({ kind: 'accepted', location: 'Intake bench', reason: 'Condition acceptable for testing', occurredAt: later });
        events.push({ kind: 'stored', location: 'Cold room 1, shelf B (demo)', reason: 'Stored until measurement', occurredAt: later });
      }
      for (const e of events) await manager.insert(CustodyEvent, { ...e, labId, sampleId: sample.id, actorUserId: intakeId, recordedAt: e.occurredAt });
    }
  }
}

/** Seeds the lab workflow demo for both demo labs. */
export async function seedLabDemo(manager: EntityManager, now = new Date()): Promise<void> {
  for (const demo of DEMO_LABS) {
    const labId = await idOf(manager, 'SELECT id FROM lab WHERE name = $1', [demo.name], `lab ${demo.name}`);
    const staffId = (role: string) => idOf(manager, 'SELECT id FROM app_user WHERE email = $1', [demo.staff.find((s) => (s.roles as string[]).includes(role))!.email], role);
    const [adminId, analystId, intakeId] = [await staffId('lab-admin'), await staffId('analyst'), await staffId('intake-technician')];
    if (!(await manager.findOne(LabMethodSettings, { where: { labId } }))) {
      await manager.insert(LabMethodSettings, { labId, settings: DEFAULT_METHOD, updatedByUserId: adminId, updatedAt: now });
    }
    await seedBench(manager, labId, analystId, now);
    const productIds = await seedProducts(manager, demo.key, labId, adminId);
    await seedSamples(manager, demo.key, labId, productIds, intakeId, now);
  }
}
