import { Router } from 'express';
import type pg from 'pg';

import { ApiError } from '../errors';

export function healthRouter(pool: pg.Pool): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    try {
      await pool.query('select 1');
    } catch {
      throw new ApiError(503, 'storage_unavailable', 'The database is not reachable.');
    }
    res.json({ ok: true });
  });
  return router;
}
