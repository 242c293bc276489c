import { and, eq, gt, isNull, sql } from 'drizzle-orm';

import type { Db } from '../index';
import { passwordResets, users } from '../schema';
import { transaction } from '../transaction';

export async function createPasswordReset(
  db: Db,
  input: { userId: string; tokenHash: string; expiresAt: Date },
) {
  await db.insert(passwordResets).values(input);
}

/**
 * Spends a reset token and sets the new password in one transaction: the token is marked used
 * only if it is unused and unexpired at `now`, and the password change bumps the session
 * version so every session signed before the reset ends. Null when the token cannot be used.
 */
export async function spendPasswordReset(
  db: Db,
  input: { tokenHash: string; passwordHash: string; now: Date },
): Promise<{ userId: string; sessionVersion: number } | null> {
  return transaction(db, async (tx) => {
    const [spent] = await tx
      .update(passwordResets)
      .set({ usedAt: input.now })
      .where(
        and(
          eq(passwordResets.tokenHash, input.tokenHash),
          isNull(passwordResets.usedAt),
          gt(passwordResets.expiresAt, input.now),
        ),
      )
      .returning({ userId: passwordResets.userId });
    if (!spent) return null;
    const [user] = await tx
      .update(users)
      .set({ passwordHash: input.passwordHash, sessionVersion: sql`${users.sessionVersion} + 1` })
      .where(eq(users.id, spent.userId))
      .returning({ userId: users.id, sessionVersion: users.sessionVersion });
    // Any other open links of this account die with this one.
    await tx
      .update(passwordResets)
      .set({ usedAt: input.now })
      .where(and(eq(passwordResets.userId, spent.userId), isNull(passwordResets.usedAt)));
    return user ?? null;
  });
}
