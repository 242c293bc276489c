import { Router } from 'express';

import type { Db } from '@/db';
import { listShopsOfUser } from '@/db/queries/memberships';
import { findUserById } from '@/db/queries/users';

import { ApiError } from '../errors';

export function meRouter(db: Db): Router {
  const router = Router();
  router.get('/', async (_req, res) => {
    const userId = res.locals.userId as string;
    const user = await findUserById(db, userId);
    // A valid token for a deleted account is treated as signed out.
    if (!user) throw new ApiError(401, 'not_signed_in', 'Sign in to continue.');
    res.json({ user, shops: await listShopsOfUser(db, userId) });
  });
  return router;
}
