/** A shop's zones: list with each zone's newest reading, create, rename, set purpose and limits. */
import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { tokenHashesOfZone } from '@/db/queries/sensors';
import { findZone, insertZone, listZonesWithLatest, updateZone } from '@/db/queries/zones';
import { marginLimitsSchema } from '@/ingest';
import { EMC_REGIONS, ZONE_PURPOSES, type ZonesResponse } from '@/ingest/wire';

import { isUuid, shopIdOf } from '../auth/middleware';
import type { SensorTokenCache } from '../auth/sensorTokens';
import { ApiError } from '../errors';
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
    const zone = await insertZone(db, shopIdOf(res), body.name, {
      purpose: body.purpose,
      emcRegion: body.emcRegion,
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
    const updated = await updateZone(db, shopId, zone.id, body);
    if (!updated) throw noZone();
    // Sensors in this zone carry its limits in the ingest cache: forget them.
    for (const hash of await tokenHashesOfZone(db, zone.id)) await tokens.invalidate(hash);
    res.json(toZoneSettings(updated));
  });

  return router;
}
