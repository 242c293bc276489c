import { and, eq } from 'drizzle-orm';

import type { Db } from '../index';
import { memberships, shops, type Role } from '../schema';

export async function findMembership(db: Db, shopId: string, userId: string) {
  const [row] = await db
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.shopId, shopId), eq(memberships.userId, userId)));
  return row ?? null;
}

export async function listShopsOfUser(db: Db, userId: string) {
  return db
    .select({ id: shops.id, name: shops.name, timeZone: shops.timeZone, role: memberships.role })
    .from(memberships)
    .innerJoin(shops, eq(shops.id, memberships.shopId))
    .where(eq(memberships.userId, userId))
    .orderBy(shops.name);
}

export async function addMember(db: Db, shopId: string, userId: string, role: Role) {
  await db.insert(memberships).values({ shopId, userId, role }).onConflictDoNothing();
}
