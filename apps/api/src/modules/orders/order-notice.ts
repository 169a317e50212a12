import type { EntityManager } from 'typeorm';
import type { OrderSummary } from '@ohmprint/contracts';
import { notifyClientOrganisation } from '../notifications/notify-client-organisation';
import type { ClientScope } from './client-views';

const escapeHtml = (text: string): string =>
  text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);

/**
 * Tells the organisation's client admins that an order was placed (e-mail in the lab's layout with
 * its contact as reply address, and an in-app notice): its codes, what it holds in credits and what
 * to do next.
 */
export async function notifyClientOrderPlaced(manager: EntityManager, scope: ClientScope, order: OrderSummary): Promise<void> {
  const what = order.kind === 'check' ? 'check order' : 'reference enrolment order';
  const codes = order.samples.map((s) => s.code);
  const [lab]: { name: string }[] = await manager.query('SELECT name FROM lab WHERE id = $1', [scope.labId]);
  const text = [
    `Your ${what} for ${order.product.name} was placed with ${lab.name}.`,
    `Samples: ${codes.join(', ')}\nCredits held for it: ${order.creditsReserved}`,
    'Print the label pack from the order page, label each sample with its code and send them to the lab.',
  ].join('\n\n');
  const html =
    `<p>Your ${what} for <strong>${escapeHtml(order.product.name)}</strong> was placed with ${escapeHtml(lab.name)}.</p>` +
    `<p>Samples: ${codes.map((c) => `<code>${c}</code>`).join(', ')}<br>Credits held for it: ${order.creditsReserved}</p>` +
    '<p>Print the label pack from the order page, label each sample with its code and send them to the lab.</p>';
  await notifyClientOrganisation(manager, {
    labId: scope.labId,
    clientOrganisationId: scope.clientOrganisationId,
    event: 'order-placed',
    subject: `Order placed: ${order.product.name}, ${codes.length} sample${codes.length === 1 ? '' : 's'}`,
    text,
    html,
    link: `/orders/${order.id}`,
  });
}
