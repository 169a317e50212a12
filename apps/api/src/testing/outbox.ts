import type { DataSource } from 'typeorm';
import { EmailOutbox } from '../modules/mail/email-outbox.entity';

/** The newest queued message to `address` in this file's database (the worker does not run under test). */
export async function latestEmailTo(db: DataSource, address: string): Promise<EmailOutbox> {
  const [mail] = await db.manager.find(EmailOutbox, { where: { to: address }, order: { createdAt: 'DESC' }, take: 1 });
  if (!mail) throw new Error(`no e-mail queued for ${address}`);
  return mail;
}

/** The `?token=` of the first portal link in an e-mail's text. */
export function linkToken(text: string): { url: string; token: string } {
  const m = text.match(/(https?:\/\/\S+\?token=([A-Za-z0-9_-]+))/);
  if (!m) throw new Error(`no token link in: ${text}`);
  return { url: m[1], token: m[2] };
}
