import type { EntityManager } from 'typeorm';
import type { OrderSummary } from '@ohmprint/contracts';
import { config } from '../../config';
import { enqueueEmail } from '../mail/enqueue-email';
import type { ClientScope } from './client-views';

const escapeHtml = (text: string): string =>
  text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);

/**
 * Tells the organisation's client admins that an order was placed: its codes, what it holds in
 * credits and what to do next. The lab-settings notifications replace this call site with their
 * own message (lab name and contact as reply address) when they land.
 */
export async function notifyClientOrderPlaced(manager: EntityManager, scope: ClientScope, order: OrderSummary): Promise<void> {
  const admins: { email: string; display_name: string; lab_name: string }[] = await manager.query(
    `SELECT u.email, u.display_name, l.name AS lab_name
     FROM client_membership cm JOIN app_user u ON u.id = cm.user_id AND u.status = 'active' JOIN lab l ON l.id = cm.lab_id
     WHERE cm.lab_id = $1 AND cm.client_organisation_id = $2 AND cm.role = 'client-admin' ORDER BY u.email`,
    [scope.labId, scope.clientOrganisationId],
  );
  const what = order.kind === 'check' ? 'check order' : 'reference enrolment order';
  const link = `${config.publicBaseUrl.replace(/\/$/, '')}/orders/${order.id}`;
  const codes = order.samples.map((s) => s.code);
  for (const a of admins) {
    const text = [
      `Dear ${a.display_name},`,
      '',
      `Your ${what} for ${order.product.name} was placed with ${a.lab_name}.`,
      `Samples: ${codes.join(', ')}`,
      `Credits held for it: ${order.creditsReserved}`,
      '',
      `Print the label pack from the order page, label each sample with its code and send them to the lab: ${link}`,
    ].join('\n');
    const html =
      `<p>Dear ${escapeHtml(a.display_name)},</p>` +
      `<p>Your ${what} for <strong>${escapeHtml(order.product.name)}</strong> was placed with ${escapeHtml(a.lab_name)}.</p>` +
      `<p>Samples: ${codes.map((c) => `<code>${c}</code>`).join(', ')}<br>Credits held for it: ${order.creditsReserved}</p>` +
      `<p>Print the label pack from the <a href="${escapeHtml(link)}">order page</a>, label each sample with its code and send them to the lab.</p>`;
    await enqueueEmail(manager, { labId: scope.labId, to: a.email, subject: `Order placed: ${order.product.name}, ${codes.length} sample${codes.length === 1 ? '' : 's'}`, text, html });
  }
}
