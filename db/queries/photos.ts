/**
 * Photos: the row written once both objects are stored, the shop-scoped look-ups, the photos of
 * many subjects in one query, and whether a subject (a care entry, a trial test) is the shop's.
 */
import { and, asc, eq, inArray } from 'drizzle-orm';

import type { PhotoSubjectKind } from '@/ingest/wire/photos';

import type { Db } from '../index';
import { careEntries, photos, trialTests } from '../schema';

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

/** Deletes a photo's row; the deleted row (for its object keys), or null when there was none. */
export async function deleteShopPhoto(
  db: Db,
  shopId: string,
  photoId: string,
): Promise<PhotoRow | null> {
  const [row] = await db
    .delete(photos)
    .where(and(eq(photos.shopId, shopId), eq(photos.id, photoId)))
    .returning();
  return row ?? null;
}

/**
 * The photos of many subjects of one kind, oldest first: one query for a whole surface's care
 * log or a whole trial's tests (the (shop, kind, owner) index serves it).
 */
export async function subjectPhotos(
  db: Db,
  shopId: string,
  kind: PhotoSubjectKind,
  subjectIds: readonly string[],
): Promise<PhotoRow[]> {
  if (subjectIds.length === 0) return [];
  return db
    .select()
    .from(photos)
    .where(
      and(
        eq(photos.shopId, shopId),
        eq(photos.ownerKind, kind),
        inArray(photos.ownerId, [...subjectIds]),
      ),
    )
    .orderBy(asc(photos.createdAt), asc(photos.id));
}

/**
 * True when the subject is this shop's — and, when given, on that surface or in that trial.
 * The tables are the care log's and the trials', read here so a photo's rule lives in one file.
 */
export async function subjectInShop(
  db: Db,
  shopId: string,
  subject: { kind: PhotoSubjectKind; id: string; parentId?: string },
): Promise<boolean> {
  if (subject.kind === 'care_entry') {
    const [row] = await db
      .select({ id: careEntries.id })
      .from(careEntries)
      .where(
        and(
          eq(careEntries.shopId, shopId),
          eq(careEntries.id, subject.id),
          subject.parentId === undefined ? undefined : eq(careEntries.surfaceId, subject.parentId),
        ),
      );
    return Boolean(row);
  }
  const [row] = await db
    .select({ id: trialTests.id })
    .from(trialTests)
    .where(
      and(
        eq(trialTests.shopId, shopId),
        eq(trialTests.id, subject.id),
        subject.parentId === undefined ? undefined : eq(trialTests.trialId, subject.parentId),
      ),
    );
  return Boolean(row);
}

/** Every object key of a shop's photos (both sizes), for removing them with the shop. */
export async function shopPhotoKeys(db: Db, shopId: string): Promise<string[]> {
  const rows = await db
    .select({ objectKey: photos.objectKey, thumbKey: photos.thumbKey })
    .from(photos)
    .where(eq(photos.shopId, shopId));
  return rows.flatMap((r) => [r.objectKey, r.thumbKey]);
}
