/**
 * Photos of the care log and trials. The image bytes live in object storage (server/storage/);
 * a row here is written only after both objects (the photo and its thumbnail) were stored, so a
 * row always names objects that exist.
 */
import { index, integer, pgTable, text, uuid } from 'drizzle-orm/pg-core';

import { createdAt } from './columns';
import { shops, users } from './people';

export const photos = pgTable(
  'photos',
  {
    id: uuid().primaryKey(),
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    // What the photo belongs to (a care entry, a trial test): kept generic so those tables can
    // come and go without a migration here; null while it belongs to nothing yet.
    ownerKind: text(),
    ownerId: uuid(),
    /** Object keys, both under shops/<shopId>/photos/. */
    objectKey: text().notNull(),
    thumbKey: text().notNull(),
    widthPx: integer().notNull(),
    heightPx: integer().notNull(),
    thumbWidthPx: integer().notNull(),
    thumbHeightPx: integer().notNull(),
    bytes: integer().notNull(),
    thumbBytes: integer().notNull(),
    // The person may leave; the photo stays with the shop.
    createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('photos_shop_owner_idx').on(t.shopId, t.ownerKind, t.ownerId)],
);
