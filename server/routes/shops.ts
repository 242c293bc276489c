import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { createShopWithOwner } from '@/db/queries/shops';

import { parseInput } from '../validate';

/** True for a time zone name the runtime's IANA database knows (e.g. Europe/Dublin). */
function isIanaZone(name: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: name });
    return name.includes('/') || name === 'UTC';
  } catch {
    return false;
  }
}

const createShopBody = z.object({
  name: z.string().trim().min(1, 'Name the shop').max(100),
  timeZone: z.string().refine(isIanaZone, 'Use an IANA time zone such as America/Chicago'),
});

export function shopsRouter(db: Db): Router {
  const router = Router();
  router.post('/', async (req, res) => {
    const body = parseInput(createShopBody, req.body);
    const shop = await createShopWithOwner(db, body, res.locals.userId as string);
    res.status(201).json(shop);
  });
  return router;
}
