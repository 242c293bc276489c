/**
 * A shop's zones: list with each zone's newest reading, create, rename, set purpose and limits,
 * delete an empty one. Every change tells the shop's other open tabs to reread the list once it
 * commits.
 */
import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { tokenHashesOfZone } from '@/db/queries/sensors';
import {
  deleteEmptyZone,
  findZone,
  insertZone,
  listZonesWithLatest,
  updateZone,
} from '@/db/queries/zones';
import { transaction } from '@/db/transaction';
import { marginLimitsSchema } from '@/ingest';
import { EMC_REGIONS, ZONE_PURPOSES, type ZonesResponse } from '@/ingest/wire';

import { isUuid, shopIdOf } from '../auth/middleware';
import type { SensorTokenCache } from '../auth/sensorTokens';
import { ApiError } from '../errors';
import { announceShopChange } from '../live/messages';
import { parseInput } from '../validate';
import { toZone, toZoneSettings } from '../wire/zones';

import { nameField } from './fields';

const zoneName = nameField('Name the zone');
const purposeField = z.enum(ZONE_PURPOSES, {
  error: `Choose what the zone holds: ${ZONE_PURPOSES.join(', ')}`,
});
const emcRegionField = z.enum(EMC_REGIONS, {
  error: `Choose the region: ${EMC_REGIONS.join(', ')}`,
});
const createZoneBody = z
  .object({
    name: zoneName,
    purpose: purposeField.optional(),
    emcRegion: emcRegionField.optional(),
  })
  .strict();

// Limits in kelvin (a margin is a difference). 20 K and 100 % bound typos, not physics.
const updateZoneBody = z
  .object({
    name: zoneName.optional(),
    cautionK: z.number().min(0, 'At least 0 K').max(20, 'At most 20 K').optional(),
    wetK: z.number().min(-5, 'At least −5 K').max(20, 'At most 20 K').optional(),
    humidRhPct: z.number().min(30, 'At least 30 %').max(100, 'At most 100 %').optional(),
    purpose: purposeField.optional(),
    emcRegion: emcRegionField.optional(),
  })
  .strict();

const noZone = () => new ApiError(404, 'not_found', 'No such zone in this shop.');

/** Mounted at /shops/:shopId/zones. */
export function zonesRouter(db: Db, tokens: SensorTokenCache): Router {
  const router = Router({ mergeParams: true });

  router.get('/', async (_req, res) => {
    const rows = await listZonesWithLatest(db, shopIdOf(res));
    res.json({ zones: rows.map(toZone) } satisfies ZonesResponse);
  });

  router.post('/', async (req, res) => {
    const body = parseInput(createZoneBody, req.body);
    const shopId = shopIdOf(res);
    // Other open tabs of the shop reread the zone list once this commits.
    const zone = await transaction(db, async (tx) => {
      const inserted = await insertZone(tx, shopId, body.name, {
        purpose: body.purpose,
        emcRegion: body.emcRegion,
      });
      await announceShopChange(tx, shopId, ['zones']);
      return inserted;
    });
    res.status(201).json(toZoneSettings(zone));
  });

  router.patch('/:zoneId', async (req, res) => {
    const body = parseInput(updateZoneBody, req.body);
    const shopId = shopIdOf(res);
    const zoneId = req.params.zoneId;
    const zone = isUuid(zoneId) ? await findZone(db, shopId, zoneId) : null;
    if (!zone) throw noZone();
    // The pair must hold together after the change, whichever of the two is sent.
    parseInput(marginLimitsSchema, {
      cautionK: body.cautionK ?? zone.cautionK,
      wetK: body.wetK ?? zone.wetK,
    });
    const updated = await transaction(db, async (tx) => {
      const row = await updateZone(tx, shopId, zone.id, body);
      if (row) await announceShopChange(tx, shopId, ['zones']);
      return row;
    });
    if (!updated) throw noZone();
    // Sensors in this zone carry its limits in the ingest cache: forget them.
    for (const hash of await tokenHashesOfZone(db, zone.id)) await tokens.invalidate(hash);
    res.json(toZoneSettings(updated));
  });

  // Only a zone made by mistake: its sensors and readings would go with it (db/queries/zones.ts).
  router.delete('/:zoneId', async (req, res) => {
    const shopId = shopIdOf(res);
    const zoneId = req.params.zoneId;
    if (!isUuid(zoneId)) throw noZone();
    const refusal = await transaction(db, async (tx) => {
      const why = await deleteEmptyZone(tx, shopId, zoneId);
      if (!why) await announceShopChange(tx, shopId, ['zones', 'sensors']);
      return why;
    });
    if (refusal === 'not_found') throw noZone();
    if (refusal === 'has_sensors') {
      throw new ApiError(
        409,
        'zone_has_sensors',
        'Move or remove the sensors of this zone first; a zone is deleted only when empty.',
      );
    }
    if (refusal === 'has_readings') {
      throw new ApiError(
        409,
        'zone_has_readings',
        'This zone has readings, which are its history: rename it instead of deleting it.',
      );
    }
    if (refusal === 'has_surfaces') {
      throw new ApiError(
        409,
        'zone_has_surfaces',
        'This zone has surfaces with their care log: move or keep them; a zone is deleted only when empty.',
      );
    }
    res.status(204).end();
  });

  return router;
}
