/** Photos: the row written once both objects are stored, and the shop-scoped look-up. */
import { and, eq } from 'drizzle-orm';

import type { Db } from '../index';
import { photos } from '../schema';

export type PhotoRow = typeof photos.$inferSelect;
export type NewPhoto = typeof photos.$inferInsert;

export async function insertPhoto(db: Db, photo: NewPhoto): Promise<PhotoRow> {
  const [row] = await db.insert(photos).values(photo).returning();
  return row!;
}

/** A photo of this shop; another shop's id finds nothing, as a missing one does. */
export async function findShopPhoto(
  db: Db,
  shopId: string,
  photoId: string,
): Promise<PhotoRow | null> {
  const [row] = await db
    .select()
    .from(photos)
    .where(and(eq(photos.shopId, shopId), eq(photos.id, photoId)));
  return row ?? null;
}

/** Every object key of a shop's photos (both sizes), for removing them with the shop. */
export async function shopPhotoKeys(db: Db, shopId: string): Promise<string[]> {
  const rows = await db
    .select({ objectKey: photos.objectKey, thumbKey: photos.thumbKey })
    .from(photos)
    .where(eq(photos.shopId, shopId));
  return rows.flatMap((r) => [r.objectKey, r.thumbKey]);
}
