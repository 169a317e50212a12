/** What maildev's REST API (/api/email) returns for one caught message (the fields tests read). */
export interface CaughtMail {
  id: string;
  subject: string;
  text: string;
  html?: string;
  to: { address: string; name: string }[];
}

function inboxUrl(): string {
  return process.env.MAIL_INBOX_URL ?? 'http://127.0.0.1:1080';
}

/** Messages caught by maildev for `address` (the mail catcher is shared: filter by recipient). */
export async function readMailbox(address: string): Promise<CaughtMail[]> {
  const res = await fetch(`${inboxUrl()}/api/email`);
  if (!res.ok) throw new Error(`the mail catcher answered ${res.status}`);
  const all = (await res.json()) as CaughtMail[];
  return all.filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()));
}

/** Deletes the caught messages for `address` only, so parallel test files do not disturb each other. */
export async function clearMailbox(address: string): Promise<void> {
  for (const mail of await readMailbox(address)) {
    await fetch(`${inboxUrl()}/api/email/${mail.id}`, { method: 'DELETE' });
  }
}
