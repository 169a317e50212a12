import type { EntityManager } from 'typeorm';
import type { CheckoutStatus, CreditAccountListQuery, CreditAccountView, LedgerEntry, LedgerListQuery, Page, Payment, PaymentListQuery } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { cappedCount, escapeLike, sparseSearchIds, pageParams, toCappedPage, totalCapFor } from '../../core/paging';
import { creditBalance, type CreditScope } from '../credits/credit-ledger';
import { receiptNumber } from './receipt-email';

interface PaymentRowView {
  id: string; receipt_no: string; client_id: string; client_name: string; pack_name: string; credits: number; amount_minor: string; currency: string;
  status: Payment['status']; failure_message: string | null; started_by_id: string | null; started_by_name: string | null; created_at: Date;
  paid_at: Date | null; refunded_at: Date | null; refunded_by_id: string | null; refunded_by_name: string | null; checkout_session_id: string; is_demo: boolean;
}

const PAYMENT_SQL = `
  SELECT p.id, p.receipt_no, co.id AS client_id, co.name AS client_name, p.pack_name, p.credits, p.amount_minor, p.currency, p.status,
         p.failure_message, su.id AS started_by_id, su.display_name AS started_by_name, p.created_at, p.paid_at, p.refunded_at,
         ru.id AS refunded_by_id, ru.display_name AS refunded_by_name, p.checkout_session_id, p.is_demo
  FROM payment p
  JOIN client_organisation co ON co.id = p.client_organisation_id AND co.lab_id = p.lab_id
  LEFT JOIN app_user su ON su.id = p.started_by_user_id
  LEFT JOIN app_user ru ON ru.id = p.refunded_by_user_id`;

function paymentView(r: PaymentRowView): Payment {
  return {
    id: r.id, receiptNumber: receiptNumber(r.receipt_no), clientOrganisation: { id: r.client_id, name: r.client_name }, packName: r.pack_name,
    credits: r.credits, amount: Number(r.amount_minor), currency: r.currency, status: r.status, failureMessage: r.failure_message,
    startedBy: r.started_by_id ? { id: r.started_by_id, displayName: r.started_by_name ?? '' } : null,
    createdAt: r.created_at.toISOString(), paidAt: r.paid_at?.toISOString() ?? null, refundedAt: r.refunded_at?.toISOString() ?? null,
    refundedBy: r.refunded_by_id ? { id: r.refunded_by_id, displayName: r.refunded_by_name ?? '' } : null,
    sessionId: r.checkout_session_id, isDemo: r.is_demo,
  };
}

const PAYMENT_SORT: Record<PaymentListQuery['sort'], string> = { createdAt: 'p.created_at', amount: 'p.amount_minor', status: 'p.status' };

/** Payments of one lab, or of one organisation in it; `q` searches organisation, pack, receipt and checkout id. */
export async function payments(manager: EntityManager, labId: string, clientOrganisationId: string | null, query: PaymentListQuery): Promise<Page<Payment>> {
  const params: unknown[] = [labId];
  const where = ['p.lab_id = $1'];
  if (clientOrganisationId) {
    params.push(clientOrganisationId);
    where.push(`p.client_organisation_id = $${params.length}`);
  }
  if (query.status) {
    params.push(query.status);
    where.push(`p.status = $${params.length}`);
  }
  if (query.q) {
    params.push(escapeLike(query.q));
    const p = `$${params.length}`;
    where.push(`(p.client_organisation_id IN (SELECT c2.id FROM client_organisation c2 WHERE c2.lab_id = $1 AND c2.name ILIKE ${p})
                 OR p.pack_name ILIKE ${p} OR p.checkout_session_id ILIKE ${p} OR 'R-' || lpad(p.receipt_no::text, 6, '0') ILIKE ${p})`);
  }
  const { skip, take } = pageParams(query);
  const order = `${PAYMENT_SORT[query.sort]} ${query.dir === 'asc' ? 'ASC' : 'DESC'}, p.receipt_no ${query.dir === 'asc' ? 'ASC' : 'DESC'}`;
  const [rows, counted] = await Promise.all([
    manager.query(
      `${PAYMENT_SQL.replace('FROM payment p', `FROM (SELECT p.* FROM payment p JOIN (SELECT p.id FROM payment p WHERE ${where.join(' AND ')} ORDER BY ${order} LIMIT $${params.length + 1} OFFSET $${params.length + 2}) page USING (id)) p`)}
       ORDER BY ${order}`,
      [...params, take, skip],
    ) as Promise<PaymentRowView[]>,
    cappedCount(manager, `FROM payment p WHERE ${where.join(' AND ')}`, params, totalCapFor(query)),
  ]);
  return toCappedPage(rows.map(paymentView), counted, query);
}

export async function labPayment(manager: EntityManager, labId: string, id: string): Promise<Payment> {
  const rows: PaymentRowView[] = await manager.query(`${PAYMENT_SQL} WHERE p.lab_id = $1 AND p.id = $2`, [labId, id]);
  if (!rows.length) throw ApiError.notFound('Payment');
  return paymentView(rows[0]);
}

/** What the portal's "after paying" page polls: the checkout's state and the balance. */
export async function checkoutStatus(manager: EntityManager, scope: CreditScope, sessionId: string): Promise<CheckoutStatus> {
  const [row]: { checkout_session_id: string; status: CheckoutStatus['status']; credits: number; pack_name: string }[] = await manager.query(
    `SELECT checkout_session_id, status, credits, pack_name FROM payment WHERE lab_id = $1 AND client_organisation_id = $2 AND ${sessionId.startsWith('cs_') ? 'checkout_session_id = $3' : 'id = $3::uuid'}`,
    [scope.labId, scope.clientOrganisationId, sessionId],
  );
  if (!row) throw ApiError.notFound('Checkout');
  return { sessionId: row.checkout_session_id, status: row.status, credits: row.credits, packName: row.pack_name, balance: await creditBalance(manager, scope) };
}

interface LedgerRow {
  id: string; entry_no: string; kind: LedgerEntry['kind']; available_change: number; reserved_change: number; available_after: number; reserved_after: number;
  reason: string; order_id: string | null; sample_id: string | null; sample_code: string | null; payment_id: string | null; receipt_no: string | null;
  actor_id: string | null; actor_name: string | null; created_at: Date;
}

function reference(r: LedgerRow): LedgerEntry['reference'] {
  if (r.payment_id) return { type: 'payment', id: r.payment_id, label: r.receipt_no ? `Payment ${receiptNumber(r.receipt_no)}` : 'Payment' };
  if (r.sample_id) return { type: 'sample', id: r.sample_id, label: r.sample_code ? `Sample ${r.sample_code}` : 'Sample' };
  if (r.order_id) return { type: 'order', id: r.order_id, label: `Order ${r.order_id.slice(0, 8)}` };
  return { type: 'adjustment', id: r.id, label: 'Manual adjustment' };
}

const LEDGER_SORT: Record<LedgerListQuery['sort'], string> = { entryNo: 'e.entry_no', kind: 'e.kind' };

/** The organisation's ledger: every movement with its reason, reference, who, and the balances after it. */
export async function ledger(manager: EntityManager, scope: CreditScope, query: LedgerListQuery): Promise<Page<LedgerEntry>> {
  const params: unknown[] = [scope.labId, scope.clientOrganisationId];
  const where = ['e.lab_id = $1', 'e.client_organisation_id = $2'];
  if (query.kind) {
    params.push(query.kind);
    where.push(`e.kind = $${params.length}`);
  }
  if (query.q) {
    params.push(escapeLike(query.q));
    const p = `$${params.length}`;
    const samples = `SELECT s2.id FROM sample s2 WHERE s2.lab_id = $1 AND s2.code ILIKE ${p}`;
    const actors = `SELECT u2.id FROM app_user u2 WHERE u2.lab_id = $1 AND u2.display_name ILIKE ${p}`;
    const arms = [
      `SELECT x.id FROM credit_ledger_entry x WHERE x.lab_id = $1 AND x.client_organisation_id = $2 AND x.reason ILIKE ${p}`,
      `SELECT x.id FROM credit_ledger_entry x WHERE x.lab_id = $1 AND x.client_organisation_id = $2 AND x.sample_id IN (${samples})`,
      `SELECT x.id FROM credit_ledger_entry x WHERE x.lab_id = $1 AND x.client_organisation_id = $2 AND x.actor_user_id IN (${actors})`,
    ];
    const ids = await sparseSearchIds(manager, arms, params);
    if (ids) params[params.length - 1] = ids;
    where.push(ids
      ? `e.id = ANY(${p}::uuid[])`
      : `(e.reason ILIKE ${p} OR e.actor_user_id IN (${actors}) OR EXISTS (SELECT 1 FROM sample s2 WHERE s2.id = e.sample_id AND s2.code ILIKE ${p}))`);
  }
  const { skip, take } = pageParams(query);
  const order = `${LEDGER_SORT[query.sort]} ${query.dir === 'asc' ? 'ASC' : 'DESC'}, e.entry_no ${query.dir === 'asc' ? 'ASC' : 'DESC'}`;
  const [rows, counted] = await Promise.all([
    manager.query(
      `SELECT e.id, e.entry_no, e.kind, e.available_change, e.reserved_change, e.available_after, e.reserved_after, e.reason,
              e.order_id, e.sample_id, s.code AS sample_code, e.payment_id, p.receipt_no, u.id AS actor_id, u.display_name AS actor_name,
              e.created_at
       FROM (SELECT e.* FROM credit_ledger_entry e JOIN (SELECT e.id FROM credit_ledger_entry e WHERE ${where.join(' AND ')} ORDER BY ${order} LIMIT $${params.length + 1} OFFSET $${params.length + 2}) page USING (id)) e
       LEFT JOIN sample s ON s.id = e.sample_id AND s.lab_id = e.lab_id
       LEFT JOIN payment p ON p.id = e.payment_id AND p.lab_id = e.lab_id
       LEFT JOIN app_user u ON u.id = e.actor_user_id
       ORDER BY ${order}`,
      [...params, take, skip],
    ) as Promise<LedgerRow[]>,
    cappedCount(manager, `FROM credit_ledger_entry e WHERE ${where.join(' AND ')}`, params, totalCapFor(query)),
  ]);
  return toCappedPage(rows.map((r) => ({
    id: r.id, entryNo: Number(r.entry_no), kind: r.kind, availableChange: r.available_change, reservedChange: r.reserved_change,
    availableAfter: r.available_after, reservedAfter: r.reserved_after, reason: r.reason, reference: reference(r),
    actor: r.actor_id ? { id: r.actor_id, displayName: r.actor_name ?? '' } : null, createdAt: r.created_at.toISOString(),
  })), counted, query);
}

const ACCOUNT_SORT: Record<CreditAccountListQuery['sort'], string> = { name: 'lower(co.name)', available: 'COALESCE(a.available, 0)' };

/** Every client organisation of the lab with its credits (none yet reads 0 and 0). */
export async function creditAccounts(manager: EntityManager, labId: string, query: CreditAccountListQuery): Promise<Page<CreditAccountView>> {
  const params: unknown[] = [labId];
  let search = '';
  if (query.q) {
    params.push(escapeLike(query.q));
    search = 'AND co.name ILIKE $2';
  }
  const { skip, take } = pageParams(query);
  const [rows, counted] = await Promise.all([
    manager.query(
      `SELECT co.id, co.name, a.available, a.reserved, a.updated_at
       FROM client_organisation co LEFT JOIN credit_account a ON a.client_organisation_id = co.id AND a.lab_id = co.lab_id
       WHERE co.lab_id = $1 ${search}
       ORDER BY ${ACCOUNT_SORT[query.sort]} ${query.dir === 'asc' ? 'ASC' : 'DESC'}, co.id
       LIMIT $${params.length + 1} OFFSET $${params.length + 2}`,
      [...params, take, skip],
    ) as Promise<{ id: string; name: string; available: number | null; reserved: number | null; updated_at: Date | null }[]>,
    cappedCount(manager, `FROM client_organisation co WHERE co.lab_id = $1 ${search}`, params, totalCapFor(query)),
  ]);
  return toCappedPage(rows.map((r) => ({ clientOrganisation: { id: r.id, name: r.name }, available: r.available ?? 0, reserved: r.reserved ?? 0,
    updatedAt: r.updated_at?.toISOString() ?? null })), counted, query);
}
