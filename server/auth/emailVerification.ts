/**
 * E-mail verification links: a new account (and anyone asking again from Profile) gets one.
 * Like reset links they carry a 256-bit token stored only as SHA-256; they work once and for
 * VERIFICATION_VALID_HOURS, and opening one also signs the person in.
 */
import type { Db } from '@/db';
import { createEmailVerification } from '@/db/queries/emailVerifications';

import { verificationMail, type MailMessage } from '../mail';

import { hashToken, newLinkToken } from './linkTokens';

// A day: long enough for a mail that arrives late or is read the next morning.
export const VERIFICATION_VALID_HOURS = 24;

/** Stores a new link for the account and returns the mail that carries it. */
export async function issueVerification(
  deps: { db: Db; publicUrl: string; now: () => number },
  user: { id: string; email: string },
): Promise<MailMessage> {
  const token = newLinkToken();
  await createEmailVerification(deps.db, {
    userId: user.id,
    tokenHash: hashToken(token),
    expiresAt: new Date(deps.now() + VERIFICATION_VALID_HOURS * 3_600_000),
  });
  return verificationMail({
    to: user.email,
    verifyUrl: `${deps.publicUrl}/verify?token=${token}`,
    validHours: VERIFICATION_VALID_HOURS,
  });
}
