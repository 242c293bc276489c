// Reading what the test app's local SMTP server received.
import type { Outbox, StoredMail } from '@/server/mail';

export interface MailWait {
  /** Only a message whose subject is this (or matches it): an address may get several kinds. */
  subject?: string | RegExp;
  timeoutMs?: number;
}

/** Waits until a message to `to` arrives (mail is sent over a real SMTP connection). */
export async function waitForMail(
  outbox: Outbox,
  to: string,
  { subject, timeoutMs = 5_000 }: MailWait = {},
): Promise<StoredMail> {
  const deadline = Date.now() + timeoutMs;
  const wanted = (m: StoredMail) =>
    subject === undefined ||
    (typeof subject === 'string' ? m.subject === subject : subject.test(m.subject));
  for (;;) {
    const found = outbox.list().find((m) => m.to.includes(to) && wanted(m));
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no mail to ${to} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

// Invitation and reset links carry the token as the last path segment; the verification link
// as the `token` query parameter (the app route reads it from there).
const LINK_PATTERNS = {
  invite: /https?:\/\/\S+\/invite\/([A-Za-z0-9_-]+)/,
  'reset-password': /https?:\/\/\S+\/reset-password\/([A-Za-z0-9_-]+)/,
  verify: /https?:\/\/\S+\/verify\?token=([A-Za-z0-9_-]+)/,
} as const;

/** The token of the first link of this kind in a message's text. */
export function linkToken(mail: StoredMail, kind: keyof typeof LINK_PATTERNS): string {
  const match = LINK_PATTERNS[kind].exec(mail.text);
  if (!match) throw new Error(`no ${kind} link in: ${mail.text}`);
  return match[1]!;
}
