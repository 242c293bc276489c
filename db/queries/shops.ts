import type { Db } from '../index';
import { memberships, shops } from '../schema';

/** Creates a shop and makes its creator the owner, in one transaction. */
export async function createShopWithOwner(
  db: Db,
  input: { name: string; timeZone: string },
  ownerId: string,
) {
  return db.transaction(async (tx) => {
    const [shop] = await tx
      .insert(shops)
      .values(input)
      .returning({ id: shops.id, name: shops.name, timeZone: shops.timeZone });
    if (!shop) throw new Error('shop insert returned no row');
    await tx.insert(memberships).values({ shopId: shop.id, userId: ownerId, role: 'owner' });
    return shop;
  });
}
