import type { EntityManager } from 'typeorm';
import { formatMoney } from '@ohmprint/contracts';
import { config } from '../../config';
import { enqueueEmail } from '../mail/enqueue-email';
import type { PaymentRow } from './payment.entity';

const esc = (s: string): string => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);

export const receiptNumber = (receiptNo: string | number): string => `R-${String(receiptNo).padStart(6, '0')}`;

/**
 * Queues the receipt for a paid checkout, in the crediting transaction: to the person who paid, with
 * the lab's name, address and contact. Plain text and simple HTML; no images, no tracking.
 */
export async function enqueueReceipt(manager: EntityManager, payment: PaymentRow, balanceAfter: number): Promise<void> {
  const [info]: { lab_name: string; legal_name: string; address: string; client_name: string; payer_email: string | null; payer_name: string | null; contact: string | null; receipt_no: string }[] =
    await manager.query(
      `SELECT l.name AS lab_name, l.legal_name, l.address, co.name AS client_name, u.email AS payer_email, u.display_name AS payer_name, p.receipt_no,
              (SELECT a.email FROM lab_role_membership r JOIN app_user a ON a.id = r.user_id
                WHERE r.lab_id = l.id AND r.role = 'lab-admin' AND a.status = 'active' ORDER BY a.created_at, a.id LIMIT 1) AS contact
       FROM payment p JOIN lab l ON l.id = p.lab_id JOIN client_organisation co ON co.id = p.client_organisation_id
       LEFT JOIN app_user u ON u.id = p.started_by_user_id
       WHERE p.id = $1`,
      [payment.id],
    );
  if (!info?.payer_email) return;
  const amount = formatMoney(Number(payment.amountMinor), payment.currency);
  const number = receiptNumber(info.receipt_no);
  const paidOn = (payment.paidAt ?? new Date()).toISOString().slice(0, 16).replace('T', ' ') + ' UTC';
  const link = `${config.publicBaseUrl}/credits/payments`;
  const rows: [string, string][] = [
    ['Receipt', number],
    ['Paid on', paidOn],
    ['For', `${payment.packName}: ${payment.credits} test credit${payment.credits === 1 ? '' : 's'}`],
    ['Amount', amount],
    ['Organisation', info.client_name],
    ['Available credits now', String(balanceAfter)],
  ];
  const contact = info.contact ? `Questions about this payment: reply to ${info.contact}.` : 'Questions about this payment: contact the lab.';
  const text = [
    `Hello ${info.payer_name ?? ''},`.trim(),
    '',
    `${info.lab_name} received your payment. Thank you.`,
    '',
    ...rows.map(([k, v]) => `${k}: ${v}`),
    '',
    `Your payments and receipts: ${link}`,
    '',
    contact,
    `${info.legal_name}, ${info.address.replace(/\n/g, ', ')}`,
  ].join('\n');
  const html = `<!doctype html><html lang="en"><body style="font-family:sans-serif;line-height:1.5;color:#1d1d1b">
<p>Hello ${esc(info.payer_name ?? '')},</p>
<p><strong>${esc(info.lab_name)}</strong> received your payment. Thank you.</p>
<table style="border-collapse:collapse">${rows.map(([k, v]) => `<tr><th style="text-align:left;padding:4px 12px 4px 0">${esc(k)}</th><td style="padding:4px 0">${esc(v)}</td></tr>`).join('')}</table>
<p><a href="${esc(link)}">Your payments and receipts</a></p>
<p>${esc(contact)}<br>${esc(info.legal_name)}, ${esc(info.address.replace(/\n/g, ', '))}</p>
</body></html>`;
  await enqueueEmail(manager, { labId: payment.labId, to: info.payer_email, subject: `Receipt ${number} from ${info.lab_name}: ${payment.credits} test credits`, text, html });
}
