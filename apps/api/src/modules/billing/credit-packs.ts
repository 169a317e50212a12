import type { EntityManager } from 'typeorm';
import type { CreateCreditPack, CreditPack, CreditPackOffer, UpdateCreditPack } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { recordAudit } from '../audit/record-audit';
import { CreditPackRow } from './credit-pack.entity';
import { paymentService, paymentServiceProblem } from './payment-service';

export function packView(p: CreditPackRow): CreditPack {
  return {
    id: p.id, name: p.name, credits: p.credits, price: Number(p.priceMinor), currency: p.currency, active: p.active,
    paymentProductId: p.paymentProductId, paymentPriceId: p.paymentPriceId,
    createdAt: p.createdAt.toISOString(), updatedAt: p.updatedAt.toISOString(),
  };
}

export const offerView = (p: CreditPackRow): CreditPackOffer => ({ id: p.id, name: p.name, credits: p.credits, price: Number(p.priceMinor), currency: p.currency });

export async function labPacks(manager: EntityManager, labId: string): Promise<CreditPack[]> {
  const rows = await manager.find(CreditPackRow, { where: { labId }, order: { active: 'DESC', credits: 'ASC', name: 'ASC' } });
  return rows.map(packView);
}

export async function activePacks(manager: EntityManager, labId: string): Promise<CreditPackOffer[]> {
  const rows = await manager.find(CreditPackRow, { where: { labId, active: true }, order: { credits: 'ASC', name: 'ASC' } });
  return rows.map(offerView);
}

export async function packOf(manager: EntityManager, labId: string, id: string, lock = false): Promise<CreditPackRow> {
  const pack = await manager.findOne(CreditPackRow, { where: { id, labId }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
  if (!pack) throw ApiError.notFound('Credit pack');
  return pack;
}

async function newPrice(pack: CreditPackRow): Promise<string> {
  const price = await paymentService().prices.create({
    product: pack.paymentProductId!, unit_amount: Number(pack.priceMinor), currency: pack.currency,
    nickname: `${pack.credits} credits`, metadata: { ohmprint_pack_id: pack.id, ohmprint_lab_id: pack.labId },
  }, { idempotencyKey: `price:${pack.id}:${pack.priceMinor}:${pack.currency}:${pack.credits}:${Date.now()}` });
  return price.id;
}

/**
 * Makes sure the pack has a live product and price at the payment service (a pack made by the demo
 * seed has none yet; a local payment service that restarted has forgotten them). Call it with the
 * pack row locked.
 */
export async function ensurePaymentPrice(manager: EntityManager, pack: CreditPackRow): Promise<string> {
  const stripe = paymentService();
  try {
    if (pack.paymentPriceId) {
      const price = await stripe.prices.retrieve(pack.paymentPriceId).catch((e: { statusCode?: number }) => {
        if (e?.statusCode === 404) return null;
        throw e;
      });
      if (price?.active && price.unit_amount === Number(pack.priceMinor) && price.currency === pack.currency) return price.id;
    }
    if (pack.paymentProductId) {
      const product = await stripe.products.retrieve(pack.paymentProductId).catch((e: { statusCode?: number }) => {
        if (e?.statusCode === 404) return null;
        throw e;
      });
      if (!product) pack.paymentProductId = null;
    }
    if (!pack.paymentProductId) {
      const product = await stripe.products.create({ name: pack.name, metadata: { ohmprint_pack_id: pack.id, ohmprint_lab_id: pack.labId } });
      pack.paymentProductId = product.id;
    }
    pack.paymentPriceId = await newPrice(pack);
  } catch (err) {
    throw paymentServiceProblem(err, 'setting up the pack’s price');
  }
  await manager.update(CreditPackRow, { id: pack.id }, { paymentProductId: pack.paymentProductId, paymentPriceId: pack.paymentPriceId });
  return pack.paymentPriceId;
}

export async function createPack(manager: EntityManager, labId: string, actorUserId: string, input: CreateCreditPack): Promise<CreditPack> {
  const inserted = await manager.insert(CreditPackRow, { labId, name: input.name, credits: input.credits, priceMinor: String(input.price), currency: input.currency });
  const pack = await packOf(manager, labId, inserted.identifiers[0].id as string, true);
  await ensurePaymentPrice(manager, pack);
  await recordAudit(manager, { labId, actorUserId, action: 'credit-pack.created', subjectType: 'credit-pack', subjectId: pack.id,
    details: { name: pack.name, credits: pack.credits, price: input.price, currency: pack.currency, priceId: pack.paymentPriceId } });
  return packView(await packOf(manager, labId, pack.id));
}

/**
 * Edits a pack. Prices at the payment service cannot change, so a new price, currency or credit count
 * makes a new price there and retires the old one; retiring the pack retires its product and price.
 */
export async function updatePack(manager: EntityManager, labId: string, actorUserId: string, id: string, input: UpdateCreditPack): Promise<CreditPack> {
  const pack = await packOf(manager, labId, id, true);
  const before = packView(pack);
  const stripe = paymentService();
  const priceChanged = (input.price !== undefined && input.price !== Number(pack.priceMinor)) || (input.currency !== undefined && input.currency !== pack.currency)
    || (input.credits !== undefined && input.credits !== pack.credits);
  const oldPriceId = pack.paymentPriceId;
  if (input.name !== undefined) pack.name = input.name;
  if (input.credits !== undefined) pack.credits = input.credits;
  if (input.price !== undefined) pack.priceMinor = String(input.price);
  if (input.currency !== undefined) pack.currency = input.currency;
  if (input.active !== undefined) pack.active = input.active;
  await manager.update(CreditPackRow, { id }, { name: pack.name, credits: pack.credits, priceMinor: pack.priceMinor, currency: pack.currency, active: pack.active });
  try {
    if (pack.active) {
      if (priceChanged || !oldPriceId) pack.paymentPriceId = null;
      await ensurePaymentPrice(manager, pack);
      if (oldPriceId && oldPriceId !== pack.paymentPriceId) await stripe.prices.update(oldPriceId, { active: false }).catch(ignoreMissing);
      if (pack.paymentProductId) await stripe.products.update(pack.paymentProductId, { name: pack.name, active: true }).catch(ignoreMissing);
    } else {
      if (oldPriceId) await stripe.prices.update(oldPriceId, { active: false }).catch(ignoreMissing);
      if (pack.paymentProductId) await stripe.products.update(pack.paymentProductId, { name: pack.name, active: false }).catch(ignoreMissing);
    }
  } catch (err) {
    throw paymentServiceProblem(err, 'updating the pack’s price');
  }
  const after = packView(await packOf(manager, labId, id));
  await recordAudit(manager, { labId, actorUserId, action: 'credit-pack.updated', subjectType: 'credit-pack', subjectId: id,
    details: { before: { name: before.name, credits: before.credits, price: before.price, currency: before.currency, active: before.active, priceId: before.paymentPriceId },
      after: { name: after.name, credits: after.credits, price: after.price, currency: after.currency, active: after.active, priceId: after.paymentPriceId } } });
  return after;
}

function ignoreMissing(e: { statusCode?: number }): null {
  if (e?.statusCode === 404) return null;
  throw e;
}
