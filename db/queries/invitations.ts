import { and, eq, gt, isNull, sql } from 'drizzle-orm';

import type { Db } from '../index';
import { invitations, memberships, shops, users, type Role } from '../schema';

import { notifyAccessChanged } from './memberships';
import { transaction } from '../transaction';

const listColumns = {
  id: invitations.id,
  email: invitations.email,
  role: invitations.role,
  expiresAt: invitations.expiresAt,
  createdAt: invitations.createdAt,
};

/** Stores a new invitation; an earlier open one to the same address in this shop is replaced. */
export async function createInvitation(
  db: Db,
  input: {
    shopId: string;
    email: string;
    role: Role;
    tokenHash: string;
    invitedBy: string;
    expiresAt: Date;
  },
) {
  return transaction(db, async (tx) => {
    await tx
      .delete(invitations)
      .where(
        and(
          eq(invitations.shopId, input.shopId),
          eq(invitations.email, input.email),
          isNull(invitations.acceptedAt),
        ),
      );
    const [row] = await tx.insert(invitations).values(input).returning(listColumns);
    if (!row) throw new Error('invitation insert returned no row');
    return row;
  });
}

export async function deleteInvitation(db: Db, shopId: string, invitationId: string) {
  const deleted = await db
    .delete(invitations)
    .where(and(eq(invitations.shopId, shopId), eq(invitations.id, invitationId)))
    .returning({ id: invitations.id });
  return deleted.length > 0;
}

/** Open invitations of a shop, newest first (accepted ones have become members). */
export async function listOpenInvitations(db: Db, shopId: string, now: Date) {
  return db
    .select(listColumns)
    .from(invitations)
    .where(
      and(
        eq(invitations.shopId, shopId),
        isNull(invitations.acceptedAt),
        gt(invitations.expiresAt, now),
      ),
    )
    .orderBy(sql`${invitations.createdAt} desc`);
}

/** An open, unexpired invitation by the hash of its link's token, with its shop's name. */
export async function findOpenInvitation(db: Db, tokenHash: string, now: Date) {
  const [row] = await db
    .select({
      id: invitations.id,
      shopId: invitations.shopId,
      shopName: shops.name,
      email: invitations.email,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      accountExists: sql<boolean>`exists (select 1 from ${users} where ${users.email} = ${invitations.email})`,
    })
    .from(invitations)
    .innerJoin(shops, eq(shops.id, invitations.shopId))
    .where(
      and(
        eq(invitations.tokenHash, tokenHash),
        isNull(invitations.acceptedAt),
        gt(invitations.expiresAt, now),
      ),
    );
  return row ?? null;
}

/**
 * Uses an invitation once: marks it accepted (only if still open, so two clicks cannot both
 * win) and adds the person to the shop. Someone already in the shop keeps the higher role.
 */
export async function acceptInvitation(
  db: Db,
  input: { invitationId: string; userId: string; now: Date },
): Promise<{ shopId: string; role: Role } | null> {
  return transaction(db, async (tx) => {
    const [used] = await tx
      .update(invitations)
      .set({ acceptedAt: input.now })
      .where(
        and(
          eq(invitations.id, input.invitationId),
          isNull(invitations.acceptedAt),
          gt(invitations.expiresAt, input.now),
        ),
      )
      .returning({ shopId: invitations.shopId, role: invitations.role });
    if (!used) return null;
    await tx
      .insert(memberships)
      .values({ shopId: used.shopId, userId: input.userId, role: used.role })
      .onConflictDoUpdate({
        target: [memberships.shopId, memberships.userId],
        set: {
          role: sql`case when ${memberships.role} = 'owner' or excluded.role = 'owner' then 'owner'::role
            when ${memberships.role} = 'member' or excluded.role = 'member' then 'member'::role
            else 'viewer'::role end`,
        },
      });
    await notifyAccessChanged(tx, [input.userId]);
    return used;
  });
}
