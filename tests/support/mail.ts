// Reading what the test app's local SMTP server received.
import type { Outbox, StoredMail } from '@/server/mail';

/** Waits until a message to `to` arrives (mail is sent over a real SMTP connection). */
export async function waitForMail(
  outbox: Outbox,
  to: string,
  timeoutMs = 5_000,
): Promise<StoredMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = outbox.list().find((m) => m.to.includes(to));
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no mail to ${to} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

/** The token at the end of the first link of this kind in a message's text. */
export function linkToken(mail: StoredMail, kind: 'invite' | 'reset-password'): string {
  const match = new RegExp(`https?://\\S+/${kind}/([A-Za-z0-9_-]+)`).exec(mail.text);
  if (!match) throw new Error(`no ${kind} link in: ${mail.text}`);
  return match[1]!;
}
