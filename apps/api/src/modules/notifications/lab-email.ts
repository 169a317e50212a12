import type { EntityManager } from 'typeorm';
import { config } from '../../config';
import { enqueueEmail } from '../mail/enqueue-email';

/** What every e-mail from a lab says about who sent it and how to reach them. */
export interface LabSender {
  name: string;
  contactEmail: string;
  contactPhone: string;
}

export async function labSender(manager: EntityManager, labId: string): Promise<LabSender> {
  const [row]: Array<{ name: string; contact_email: string; contact_phone: string }> = await manager.query(
    'SELECT name, contact_email, contact_phone FROM lab WHERE id = $1',
    [labId],
  );
  if (!row) throw new Error(`No lab ${labId}`);
  return { name: row.name, contactEmail: row.contact_email, contactPhone: row.contact_phone };
}

export interface LabMessage {
  subject: string;
  /** Plain text, paragraphs separated by a blank line. */
  text: string;
  /** The body as HTML (no <html> wrapper); made from `text` when absent. */
  html?: string;
  /** A client-portal path (`/reports`) or a full URL; shown as a link in both parts. */
  link?: string | null;
  linkLabel?: string;
}

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };
export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ESCAPES[c]);
}

/** Plain paragraphs as HTML paragraphs; line breaks inside a paragraph kept. */
export function paragraphsToHtml(text: string): string {
  return text
    .split(/\n{2,}/)
    .map((p) => p.trim())
    .filter(Boolean)
    .map((p) => `<p style="margin:0 0 14px">${escapeHtml(p).replace(/\n/g, '<br>')}</p>`)
    .join('\n');
}

export function absoluteLink(link: string): string {
  return /^https?:\/\//.test(link) ? link : `${config.publicBaseUrl}${link.startsWith('/') ? '' : '/'}${link}`;
}

/** How to reach the lab, in words: e-mail and phone when set. */
function contactLine(lab: LabSender): string {
  const ways = [lab.contactEmail && `e-mail ${lab.contactEmail}`, lab.contactPhone && `phone ${lab.contactPhone}`].filter(Boolean);
  return ways.length ? `Questions? Contact ${lab.name}: ${ways.join(', ')}.` : `Questions? Contact ${lab.name}.`;
}

function replyLine(lab: LabSender): string {
  return lab.contactEmail ? `Replies to this message reach ${lab.name} at ${lab.contactEmail}.` : 'This address does not receive replies; use the contact above.';
}

/**
 * The full message as plain text and HTML: the lab's name at the top, the body, the link, and the
 * lab's contact at the foot. The HTML has inline styles only and loads nothing (no images, no
 * tracking pixels, no remote fonts).
 */
export function composeLabEmail(lab: LabSender, message: LabMessage): { subject: string; text: string; html: string } {
  const url = message.link ? absoluteLink(message.link) : null;
  const label = message.linkLabel ?? 'Open in Ohmprint';
  const footer = [contactLine(lab), replyLine(lab), `Sent by Ohmprint on behalf of ${lab.name}.`];
  const text = [message.text.trim(), url ? `${label}: ${url}` : null, '--', ...footer].filter((p): p is string => !!p).join('\n\n') + '\n';
  const body = message.html ?? paragraphsToHtml(message.text);
  const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>${escapeHtml(message.subject)}</title></head>
<body style="margin:0;padding:0;background:#f6f4f1;color:#1d1b19;font-family:Arial,Helvetica,sans-serif;font-size:15px;line-height:1.5">
<div style="max-width:600px;margin:0 auto;padding:24px 20px">
<p style="margin:0 0 20px;font-size:18px;font-weight:bold;color:#00504a">${escapeHtml(lab.name)}</p>
${body}
${url ? `<p style="margin:20px 0"><a href="${escapeHtml(url)}" style="color:#00504a;font-weight:bold">${escapeHtml(label)}</a></p>` : ''}
<hr style="border:none;border-top:1px solid #d6d1cb;margin:24px 0 12px">
${footer.map((f) => `<p style="margin:0 0 6px;font-size:13px;color:#4f4a45">${escapeHtml(f)}</p>`).join('\n')}
</div>
</body></html>
`;
  return { subject: message.subject, text, html };
}

/**
 * Queues one e-mail from the lab in the caller's transaction, with the lab's layout and a Reply-To
 * of the lab's contact e-mail. For one-off addresses (an invitation, a receipt); organisation-wide
 * events go through `notifyClientOrganisation`.
 */
export async function enqueueLabEmail(manager: EntityManager, labId: string, to: string, message: LabMessage, sender?: LabSender): Promise<string> {
  const lab = sender ?? (await labSender(manager, labId));
  const composed = composeLabEmail(lab, message);
  return enqueueEmail(manager, { labId, to, ...composed, replyTo: lab.contactEmail || null });
}
