import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { insertZone, listZonesWithLatest } from '@/db/queries/zones';

import { requireShopRole, shopIdOf } from '../auth/middleware';
import { parseInput } from '../validate';

const createZoneBody = z.object({ name: z.string().trim().min(1, 'Name the zone').max(100) });

/** Mounted at /shops/:shopId/zones. */
export function zonesRouter(db: Db): Router {
  const router = Router({ mergeParams: true });

  router.get('/', requireShopRole(db, 'viewer'), async (req, res) => {
    res.json({ zones: await listZonesWithLatest(db, shopIdOf(res)) });
  });

  router.post('/', requireShopRole(db, 'owner'), async (req, res) => {
    const body = parseInput(createZoneBody, req.body);
    const zone = await insertZone(db, shopIdOf(res), body.name);
    res.status(201).json(zone);
  });

  return router;
}
