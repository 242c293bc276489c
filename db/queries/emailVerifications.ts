import { and, eq, gt, isNull, sql } from 'drizzle-orm';

import type { Db } from '../index';
import { emailVerifications, users } from '../schema';
import { transaction } from '../transaction';

export async function createEmailVerification(
  db: Db,
  input: { userId: string; tokenHash: string; expiresAt: Date },
) {
  await db.insert(emailVerifications).values(input);
}

/**
 * Spends a verification token: marked used only if unused and unexpired at `now`, and the
 * account's address marked verified in the same transaction (its other open links die with
 * it). Returns the account and its session version, to sign the person in; null when the
 * token cannot be used.
 */
export async function spendEmailVerification(
  db: Db,
  input: { tokenHash: string; now: Date },
): Promise<{ userId: string; sessionVersion: number } | null> {
  return transaction(db, async (tx) => {
    const [spent] = await tx
      .update(emailVerifications)
      .set({ usedAt: input.now })
      .where(
        and(
          eq(emailVerifications.tokenHash, input.tokenHash),
          isNull(emailVerifications.usedAt),
          gt(emailVerifications.expiresAt, input.now),
        ),
      )
      .returning({ userId: emailVerifications.userId });
    if (!spent) return null;
    const [user] = await tx
      .update(users)
      .set({ emailVerifiedAt: sql`coalesce(${users.emailVerifiedAt}, ${input.now})` })
      .where(eq(users.id, spent.userId))
      .returning({ userId: users.id, sessionVersion: users.sessionVersion });
    await tx
      .update(emailVerifications)
      .set({ usedAt: input.now })
      .where(and(eq(emailVerifications.userId, spent.userId), isNull(emailVerifications.usedAt)));
    return user ?? null;
  });
}
