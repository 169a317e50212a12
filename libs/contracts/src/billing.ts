import { z } from 'zod';
import { listQuery, pageOf } from './paging';

/** Text a person types: no control characters (NUL and friends), trimmed. */
const plainText = (min: number, max: number) =>
  z.string().trim().min(min, min === 1 ? 'must not be empty' : `must be at least ${min} characters`).max(max, `must be at most ${max} characters`)
    // eslint-disable-next-line no-control-regex
    .refine((s) => !/[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/.test(s), 'must not contain control characters');

/** ISO 4217 code, lower case as the payment service writes it (`eur`, `gbp`). */
export const CurrencySchema = z.string().trim().toLowerCase().regex(/^[a-z]{3}$/, 'must be a three-letter currency code such as EUR');

export const CreditBalanceSchema = z.object({ available: z.number().int().min(0), reserved: z.number().int().min(0) });
export type CreditBalanceView = z.infer<typeof CreditBalanceSchema>;

/** A pack as a client sees it: price in minor units (cents) of `currency`. */
export const CreditPackOfferSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  credits: z.number().int().min(1),
  price: z.number().int().min(0),
  currency: z.string(),
});
export type CreditPackOffer = z.infer<typeof CreditPackOfferSchema>;

export const CreditPackSchema = CreditPackOfferSchema.extend({
  active: z.boolean(),
  paymentProductId: z.string().nullable(),
  paymentPriceId: z.string().nullable(),
  createdAt: z.iso.datetime(),
  updatedAt: z.iso.datetime(),
});
export type CreditPack = z.infer<typeof CreditPackSchema>;

export const CreateCreditPackSchema = z.object({
  name: plainText(1, 80),
  credits: z.number().int('must be a whole number').min(1, 'must be at least 1').max(10000, 'must be at most 10000'),
  price: z.number().int('must be a whole number of minor units (cents)').min(0).max(100_000_000, 'must be at most 100000000'),
  currency: CurrencySchema,
});
export type CreateCreditPack = z.infer<typeof CreateCreditPackSchema>;

export const UpdateCreditPackSchema = CreateCreditPackSchema.partial().extend({ active: z.boolean().optional() })
  .refine((v) => Object.keys(v).length > 0, 'name at least one field to change');
export type UpdateCreditPack = z.infer<typeof UpdateCreditPackSchema>;

export const CreditPricesSchema = z.object({
  creditsPerCheckSample: z.number().int('must be a whole number').min(1, 'must be at least 1').max(1000, 'must be at most 1000'),
  creditsPerReferenceLot: z.number().int('must be a whole number').min(1, 'must be at least 1').max(1000, 'must be at most 1000'),
});
export type CreditPrices = z.infer<typeof CreditPricesSchema>;

export const StartCheckoutSchema = z.object({ packId: z.uuid({ message: 'must be a UUID' }) });
export const CheckoutStartedSchema = z.object({ sessionId: z.string(), checkoutUrl: z.url() });
export type CheckoutStarted = z.infer<typeof CheckoutStartedSchema>;
export const SessionParamsSchema = z.object({ sessionId: z.string().regex(/^cs_[A-Za-z0-9_]{1,200}$/, 'is not a checkout id') });

/**
 * A payment's state: `open` (checkout started, nothing paid yet), `paid` (credits added),
 * `declined` (the card was refused; nothing added, the checkout may still be paid), `expired`
 * (abandoned; nothing added), `refunded` (money returned, credits removed).
 */
export const PAYMENT_STATES = ['open', 'paid', 'declined', 'expired', 'refunded'] as const;
export const PaymentStateSchema = z.enum(PAYMENT_STATES);
export type PaymentState = z.infer<typeof PaymentStateSchema>;

export const PaymentSchema = z.object({
  id: z.uuid(),
  receiptNumber: z.string(),
  clientOrganisation: z.object({ id: z.uuid(), name: z.string() }),
  packName: z.string(),
  credits: z.number().int(),
  amount: z.number().int(),
  currency: z.string(),
  status: PaymentStateSchema,
  failureMessage: z.string().nullable(),
  startedBy: z.object({ id: z.uuid(), displayName: z.string() }).nullable(),
  createdAt: z.iso.datetime(),
  paidAt: z.iso.datetime().nullable(),
  refundedAt: z.iso.datetime().nullable(),
  refundedBy: z.object({ id: z.uuid(), displayName: z.string() }).nullable(),
  sessionId: z.string(),
  isDemo: z.boolean(),
});
export type Payment = z.infer<typeof PaymentSchema>;
export const PaymentPageSchema = pageOf(PaymentSchema);
export const PaymentListQuerySchema = listQuery(['createdAt', 'amount', 'status'], 'desc').extend({
  status: PaymentStateSchema.optional(),
});
export type PaymentListQuery = z.infer<typeof PaymentListQuerySchema>;

export const CheckoutStatusSchema = z.object({ sessionId: z.string(), status: PaymentStateSchema, credits: z.number().int(), packName: z.string(),
  balance: CreditBalanceSchema });
export type CheckoutStatus = z.infer<typeof CheckoutStatusSchema>;

export const LEDGER_KINDS = ['purchase', 'reserve', 'release', 'consume', 'refund', 'adjustment'] as const;
export const LedgerEntrySchema = z.object({
  id: z.uuid(),
  entryNo: z.number().int(),
  kind: z.enum(LEDGER_KINDS),
  availableChange: z.number().int(),
  reservedChange: z.number().int(),
  availableAfter: z.number().int(),
  reservedAfter: z.number().int(),
  reason: z.string(),
  reference: z.object({ type: z.enum(['order', 'sample', 'payment', 'adjustment']), id: z.string().nullable(), label: z.string() }),
  actor: z.object({ id: z.uuid(), displayName: z.string() }).nullable(),
  createdAt: z.iso.datetime(),
});
export type LedgerEntry = z.infer<typeof LedgerEntrySchema>;
export const LedgerPageSchema = pageOf(LedgerEntrySchema);
export const LedgerListQuerySchema = listQuery(['entryNo', 'kind'], 'desc').extend({ kind: z.enum(LEDGER_KINDS).optional() });
export type LedgerListQuery = z.infer<typeof LedgerListQuerySchema>;

/** A lab's view of one client's credits, for adjustments. */
export const CreditAccountSchema = z.object({
  clientOrganisation: z.object({ id: z.uuid(), name: z.string() }),
  available: z.number().int(),
  reserved: z.number().int(),
  updatedAt: z.iso.datetime().nullable(),
});
export type CreditAccountView = z.infer<typeof CreditAccountSchema>;
export const CreditAccountPageSchema = pageOf(CreditAccountSchema);
export const CreditAccountListQuerySchema = listQuery(['name', 'available']);
export type CreditAccountListQuery = z.infer<typeof CreditAccountListQuerySchema>;

export const CreditAdjustmentSchema = z.object({
  clientOrganisationId: z.uuid({ message: 'must be a UUID' }),
  change: z.number().int('must be a whole number').min(-100000).max(100000).refine((n) => n !== 0, 'must not be zero'),
  reason: plainText(5, 500),
});
export type CreditAdjustment = z.infer<typeof CreditAdjustmentSchema>;
export const CreditAdjustedSchema = z.object({ balance: CreditBalanceSchema, entryId: z.uuid() });

export const WebhookAnswerSchema = z.object({ received: z.literal(true), outcome: z.string() });

/** Amount in minor units as people read it: `€12.50` (the currency's own decimals: ¥1250 stays whole). */
export function formatMoney(minor: number, currency: string, locale = 'en-GB'): string {
  try {
    const format = new Intl.NumberFormat(locale, { style: 'currency', currency: currency.toUpperCase() });
    return format.format(minor / 10 ** (format.resolvedOptions().maximumFractionDigits ?? 2));
  } catch {
    return `${(minor / 100).toFixed(2)} ${currency.toUpperCase()}`;
  }
}

/** A payment's state in words, for pages and e-mails. */
export const PAYMENT_STATE_WORDS: Record<PaymentState, string> = {
  open: 'Waiting for payment',
  paid: 'Paid: credits added',
  declined: 'Card declined: no credits added',
  expired: 'Checkout abandoned: nothing paid, no credits added',
  refunded: 'Refunded: credits removed',
};
