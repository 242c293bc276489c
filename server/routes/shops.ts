/** Shops: create (the creator owns it), read, rename or move time zone, delete with confirmation. */
import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { shopPhotoKeys } from '@/db/queries/photos';
import { createShopWithOwner, deleteShop, findShop, updateShop } from '@/db/queries/shops';
import { defaultPaperSize } from '@/ingest/paperSize';
import { checkTimeZone } from '@/ingest/timeZones';
import { PAPER_SIZES } from '@/ingest/wire/reports';

import { roleOf, shopIdOf, userIdOf } from '../auth/middleware';
import type { SensorTokenCache } from '../auth/sensorTokens';
import { ApiError } from '../errors';
import { deleteObjects } from '../photos';
import type { Storage } from '../storage';
import { parseInput } from '../validate';
import { toShop, toShopSummary } from '../wire/people';

import { nameField } from './fields';

const shopName = nameField('Name the shop');

/**
 * An IANA name the server's Intl knows, spelt exactly (ingest/timeZones.ts); a near miss names
 * the spelling it was probably meant as, so the person can fix it in one go.
 */
const timeZone = z
  .string()
  .max(64, 'At most 64 characters')
  .superRefine((name, ctx) => {
    const check = checkTimeZone(name);
    if (check.ok) return;
    ctx.addIssue({
      code: 'custom',
      message: check.suggestion
        ? `Use the IANA spelling: ${check.suggestion}`
        : 'Pick a time zone from the list, such as America/Chicago',
    });
  });

const paperSize = z.enum(PAPER_SIZES, { error: 'Choose a4 or letter' });

const createShopBody = z.object({ name: shopName, timeZone });
const updateShopBody = z
  .object({
    name: shopName.optional(),
    timeZone: timeZone.optional(),
    paperSize: paperSize.optional(),
  })
  .strict()
  .refine(
    (b) => b.name !== undefined || b.timeZone !== undefined || b.paperSize !== undefined,
    'Change the name, time zone or paper size',
  );
const deleteShopBody = z.object({ confirmName: z.string().max(200) });

const gone = () => new ApiError(404, 'shop_not_found', 'No such shop among yours.');

export function shopsRouter(
  db: Db,
  tokens: SensorTokenCache,
  storage: Storage | undefined,
): Router {
  const router = Router();

  router.post('/', async (req, res) => {
    const body = parseInput(createShopBody, req.body);
    // The report's sheet follows where the shop is (ingest/paperSize.ts); the owner can change it.
    const shop = await createShopWithOwner(
      db,
      { ...body, paperSize: defaultPaperSize(body.timeZone) },
      userIdOf(res),
    );
    res.status(201).json(toShop(shop));
  });

  router.get('/:shopId', async (_req, res) => {
    const shop = await findShop(db, shopIdOf(res));
    if (!shop) throw gone();
    res.json(toShopSummary({ ...shop, role: roleOf(res) }));
  });

  router.patch('/:shopId', async (req, res) => {
    const body = parseInput(updateShopBody, req.body);
    const shop = await updateShop(db, shopIdOf(res), body);
    if (!shop) throw gone();
    res.json(toShopSummary({ ...shop, role: roleOf(res) }));
  });

  // Deleting takes every zone, sensor and reading with it: the body must repeat the name.
  router.delete('/:shopId', async (req, res) => {
    const body = parseInput(deleteShopBody, req.body ?? {});
    const shop = await findShop(db, shopIdOf(res));
    if (!shop) throw gone();
    if (body.confirmName.trim() !== shop.name) {
      throw new ApiError(
        400,
        'confirmation_mismatch',
        'Type the shop’s name exactly to delete it.',
        [{ path: 'confirmName', message: `Type “${shop.name}”` }],
      );
    }
    const photoKeys = await shopPhotoKeys(db, shop.id);
    const { tokenHashes } = await deleteShop(db, shop.id);
    // The sensors are gone with the shop: their tokens must stop working on every instance now,
    // not when each instance's cache entry expires.
    await tokens.invalidate(tokenHashes);
    // The photo rows went with the shop; their bytes must not outlive it in the bucket.
    if (storage) await deleteObjects(storage, photoKeys);
    res.status(204).end();
  });

  return router;
}
