/**
 * A shop's sensors. Listing shows last seen and battery; creating and rotating answer the
 * token this once (it is stored only as a hash); revoking and moving drop the token from the
 * ingest cache at once so the change applies to the sensor's next post. An owner may set how
 * often the sensor posts (`expectedIntervalS`), which decides when it counts as silent.
 * Removing takes the sensor off the list and refuses its token everywhere, but keeps its
 * readings (db/queries/sensors.ts).
 */
import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import {
  findSensor,
  insertSensor,
  listSensors,
  removeSensor,
  revokeSensorToken,
  rotateSensorToken,
  updateSensor,
} from '@/db/queries/sensors';
import { findZone } from '@/db/queries/zones';
import { transaction } from '@/db/transaction';
import { EXPECTED_INTERVAL_MAX_S, EXPECTED_INTERVAL_MIN_S } from '@/ingest';
import type { IssuedToken, Sensor, SensorsResponse } from '@/ingest/wire';

import { isUuid, shopIdOf } from '../auth/middleware';
import { hashToken, newSensorToken, type SensorTokenCache } from '../auth/sensorTokens';
import { ApiError } from '../errors';
import { announceShopChange } from '../live/messages';
import { parseInput } from '../validate';
import { toCreatedSensor, toSensor } from '../wire/sensors';

import { nameField } from './fields';

const sensorName = nameField('Name the sensor');
const zoneId = z.string().uuid('Pick a zone of this shop');

const createSensorBody = z.object({ name: sensorName, zoneId });
// Whole seconds; null clears the setting and the learnt interval applies again.
const expectedIntervalS = z
  .number({ message: 'Give the interval in seconds, as a number' })
  .int('Whole seconds')
  .min(EXPECTED_INTERVAL_MIN_S, `At least ${EXPECTED_INTERVAL_MIN_S} s`)
  .max(EXPECTED_INTERVAL_MAX_S, `At most ${EXPECTED_INTERVAL_MAX_S} s (one day)`)
  .nullable();
const updateSensorBody = z
  .object({
    name: sensorName.optional(),
    zoneId: zoneId.optional(),
    expectedIntervalS: expectedIntervalS.optional(),
  })
  .strict()
  .refine(
    (b) => b.name !== undefined || b.zoneId !== undefined || b.expectedIntervalS !== undefined,
    'Change the name, the zone or the expected interval',
  );

const noSensor = () => new ApiError(404, 'not_found', 'No such sensor in this shop.');
const unknownZone = () =>
  new ApiError(400, 'invalid_input', 'That zone is not in this shop.', [
    { path: 'zoneId', message: 'Unknown zone' },
  ]);

/** Mounted at /shops/:shopId/sensors. */
export function sensorsRouter(
  db: Db,
  tokens: SensorTokenCache,
  mqttPublicUrl: string | null = null,
): Router {
  const router = Router({ mergeParams: true });

  router.get('/', async (_req, res) => {
    const rows = await listSensors(db, shopIdOf(res));
    res.json({
      sensors: rows.map(toSensor),
      mqtt: mqttPublicUrl ? { url: mqttPublicUrl } : null,
    } satisfies SensorsResponse);
  });

  router.post('/', async (req, res) => {
    const shopId = shopIdOf(res);
    const body = parseInput(createSensorBody, req.body);
    if (!(await findZone(db, shopId, body.zoneId))) throw unknownZone();
    const token = newSensorToken();
    const tokenHash = hashToken(token);
    // Every change below tells the shop's other open tabs to reread the sensor list, once the
    // change commits (the notification rides in the same transaction).
    const sensor = await transaction(db, async (tx) => {
      const inserted = await insertSensor(tx, {
        shopId,
        zoneId: body.zoneId,
        name: body.name,
        tokenHash,
      });
      await announceShopChange(tx, shopId, ['sensors']);
      return inserted;
    });
    // A fresh random token is in no cache; this only matters should its hash have been tried
    // (and remembered as unknown) before, so the new sensor's first post is never refused.
    await tokens.invalidate(tokenHash);
    // The only time the token leaves the server: it is stored as a hash.
    res.status(201).json(toCreatedSensor(sensor, token));
  });

  router.patch('/:sensorId', async (req, res) => {
    const body = parseInput(updateSensorBody, req.body);
    const sensorId = req.params.sensorId;
    if (!isUuid(sensorId)) throw noSensor();
    const shopId = shopIdOf(res);
    if (body.zoneId && !(await findZone(db, shopId, body.zoneId))) throw unknownZone();
    const updated = await transaction(db, async (tx) => {
      const row = await updateSensor(tx, shopId, sensorId, body);
      if (row) await announceShopChange(tx, shopId, ['sensors']);
      return row;
    });
    if (!updated) throw noSensor();
    await tokens.invalidate(updated.tokenHash);
    const sensor = await findSensor(db, shopId, sensorId);
    if (!sensor) throw noSensor();
    res.json(toSensor(sensor) satisfies Sensor);
  });

  // Rotation: a new token now, the old one refused from the next post on.
  router.post('/:sensorId/token', async (req, res) => {
    const sensorId = req.params.sensorId;
    const token = newSensorToken();
    const tokenHash = hashToken(token);
    const shopId = shopIdOf(res);
    const rotated = isUuid(sensorId)
      ? await transaction(db, async (tx) => {
          const row = await rotateSensorToken(tx, shopId, sensorId, tokenHash);
          if (row) await announceShopChange(tx, shopId, ['sensors']);
          return row;
        })
      : null;
    if (!rotated) throw noSensor();
    await tokens.invalidate([rotated.oldTokenHash, tokenHash]);
    res.status(201).json({ id: sensorId, token } satisfies IssuedToken);
  });

  router.delete('/:sensorId/token', async (req, res) => {
    const sensorId = req.params.sensorId;
    const shopId = shopIdOf(res);
    const tokenHash = isUuid(sensorId)
      ? await transaction(db, async (tx) => {
          const hash = await revokeSensorToken(tx, shopId, sensorId);
          if (hash) await announceShopChange(tx, shopId, ['sensors']);
          return hash;
        })
      : null;
    if (!tokenHash) throw noSensor();
    await tokens.invalidate(tokenHash);
    res.status(204).end();
  });

  router.delete('/:sensorId', async (req, res) => {
    const sensorId = req.params.sensorId;
    const shopId = shopIdOf(res);
    const tokenHash = isUuid(sensorId)
      ? await transaction(db, async (tx) => {
          const hash = await removeSensor(tx, shopId, sensorId);
          if (hash) await announceShopChange(tx, shopId, ['sensors']);
          return hash;
        })
      : null;
    if (!tokenHash) throw noSensor();
    await tokens.invalidate(tokenHash);
    res.status(204).end();
  });

  return router;
}
