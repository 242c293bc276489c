import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { firstReadingAt, querySeries } from '@/db/queries/readings';
import { findShop } from '@/db/queries/shops';
import { findZone } from '@/db/queries/zones';
import type { ReadingsResponse } from '@/ingest/wire';

import { isUuid, shopIdOf } from '../auth/middleware';
import { ApiError } from '../errors';
import { bucketPlan } from '../readings/bucketPlan';
import { parseInput } from '../validate';
import { toReadingPoint } from '../wire/readings';

const DAY_MS = 24 * 60 * 60 * 1000;
// A year of one-minute data in one request would be half a million rows; 31 days is plenty
// for a chart and keeps the response small.
const MAX_SPAN_MS = 31 * DAY_MS;

const seriesQuery = z
  .object({
    from: z.iso.datetime({ offset: true }).optional(),
    to: z.iso.datetime({ offset: true }).optional(),
    points: z.coerce.number().int().min(2).max(5000).default(500),
  })
  .strict();

/** Mounted at /shops/:shopId/zones/:zoneId/readings. */
export function readingsRouter(db: Db, now: () => number): Router {
  const router = Router({ mergeParams: true });

  router.get('/', async (req, res) => {
    const q = parseInput(seriesQuery, req.query, 'query');
    const to = q.to ? new Date(q.to) : new Date(now());
    const from = q.from ? new Date(q.from) : new Date(to.getTime() - DAY_MS);
    if (from >= to) {
      throw new ApiError(400, 'invalid_input', '`from` must be before `to`.', [
        { path: 'from', message: 'After `to`' },
      ]);
    }
    if (to.getTime() - from.getTime() > MAX_SPAN_MS) {
      throw new ApiError(400, 'invalid_input', 'Ask for at most 31 days at a time.', [
        { path: 'from', message: 'Span over 31 days' },
      ]);
    }
    // Merged from the mount path /shops/:shopId/zones/:zoneId/readings.
    const zoneId = (req.params as { zoneId?: string }).zoneId;
    const zone = isUuid(zoneId) ? await findZone(db, shopIdOf(res), zoneId) : null;
    if (!zone) throw new ApiError(404, 'not_found', 'No such zone in this shop.');

    const shop = await findShop(db, shopIdOf(res));
    const plan = bucketPlan(from.getTime(), to.getTime(), q.points, shop?.timeZone ?? 'UTC');
    const series = await querySeries(db, { zoneId: zone.id, from, to, points: q.points, plan });
    const firstAt = await firstReadingAt(db, zone.id);
    res.json({
      from: from.toISOString(),
      to: to.toISOString(),
      firstAt: firstAt ? firstAt.toISOString() : null,
      bucketSeconds: series.bucketSeconds,
      points: series.rows.map(toReadingPoint),
    } satisfies ReadingsResponse);
  });

  return router;
}
