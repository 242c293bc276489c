import { eq } from 'drizzle-orm';

import type { PaperSize } from '@/ingest/wire/reports';

import type { Db } from '../index';
import { memberships, shops } from '../schema';

import { notifyAccessChanged } from './memberships';
import { tokenHashesOfShop } from './sensors';
import { transaction } from '../transaction';

const shopColumns = {
  id: shops.id,
  name: shops.name,
  timeZone: shops.timeZone,
  paperSize: shops.paperSize,
};

/** Creates a shop and makes its creator the owner, in one transaction. */
export async function createShopWithOwner(
  db: Db,
  input: { name: string; timeZone: string; paperSize?: PaperSize },
  ownerId: string,
) {
  return transaction(db, async (tx) => {
    const [shop] = await tx.insert(shops).values(input).returning(shopColumns);
    if (!shop) throw new Error('shop insert returned no row');
    await tx.insert(memberships).values({ shopId: shop.id, userId: ownerId, role: 'owner' });
    await notifyAccessChanged(tx, [ownerId]);
    return shop;
  });
}

export async function findShop(db: Db, shopId: string) {
  const [row] = await db.select(shopColumns).from(shops).where(eq(shops.id, shopId));
  return row ?? null;
}

export async function updateShop(
  db: Db,
  shopId: string,
  changes: { name?: string; timeZone?: string; paperSize?: PaperSize },
) {
  const [row] = await db
    .update(shops)
    .set(changes)
    .where(eq(shops.id, shopId))
    .returning(shopColumns);
  return row ?? null;
}

/**
 * Deletes a shop and, by cascade, its zones, sensors, readings, memberships and invitations;
 * its former members' live connections are told to drop it. Returns whether it existed and its
 * sensors' token hashes, which the caller drops from every instance's token cache.
 */
export async function deleteShop(
  db: Db,
  shopId: string,
): Promise<{ deleted: boolean; tokenHashes: string[] }> {
  return transaction(db, async (tx) => {
    const members = await tx
      .select({ userId: memberships.userId })
      .from(memberships)
      .where(eq(memberships.shopId, shopId));
    const tokenHashes = await tokenHashesOfShop(tx, shopId);
    const deleted = await tx.delete(shops).where(eq(shops.id, shopId)).returning({ id: shops.id });
    await notifyAccessChanged(
      tx,
      members.map((m) => m.userId),
    );
    return { deleted: deleted.length > 0, tokenHashes };
  });
}
