import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { insertSensor, revokeSensorToken } from '@/db/queries/sensors';
import { findZone } from '@/db/queries/zones';

import { isUuid, requireShopRole, shopIdOf } from '../auth/middleware';
import { hashToken, newSensorToken, type SensorTokenCache } from '../auth/sensorTokens';
import { ApiError } from '../errors';
import { parseInput } from '../validate';

const createSensorBody = z.object({
  name: z.string().trim().min(1, 'Name the sensor').max(100),
  zoneId: z.string().uuid('Pick a zone of this shop'),
});

/** Mounted at /shops/:shopId/sensors. Owners only: a token is a key to the shop's data. */
export function sensorsRouter(db: Db, tokens: SensorTokenCache): Router {
  const router = Router({ mergeParams: true });
  router.use(requireShopRole(db, 'owner'));

  router.post('/', async (req, res) => {
    const shopId = shopIdOf(res);
    const body = parseInput(createSensorBody, req.body);
    if (!(await findZone(db, shopId, body.zoneId))) {
      throw new ApiError(400, 'invalid_input', 'That zone is not in this shop.', [
        { path: 'zoneId', message: 'Unknown zone' },
      ]);
    }
    const token = newSensorToken();
    const sensor = await insertSensor(db, {
      shopId,
      zoneId: body.zoneId,
      name: body.name,
      tokenHash: hashToken(token),
    });
    // The only time the token leaves the server: it is stored as a hash.
    res.status(201).json({ id: sensor.id, name: sensor.name, zoneId: sensor.zoneId, token });
  });

  router.delete('/:sensorId/token', async (req, res) => {
    const sensorId = req.params.sensorId;
    const tokenHash = isUuid(sensorId)
      ? await revokeSensorToken(db, shopIdOf(res), sensorId)
      : null;
    if (!tokenHash) throw new ApiError(404, 'not_found', 'No such sensor in this shop.');
    await tokens.invalidate(tokenHash);
    res.status(204).end();
  });

  return router;
}
