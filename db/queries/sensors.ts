import { and, eq, isNull, sql } from 'drizzle-orm';

import type { Db } from '../index';
import { sensors, zones } from '../schema';

export async function insertSensor(
  db: Db,
  input: { shopId: string; zoneId: string; name: string; tokenHash: string },
) {
  const [row] = await db
    .insert(sensors)
    .values(input)
    .returning({ id: sensors.id, name: sensors.name, zoneId: sensors.zoneId });
  if (!row) throw new Error('sensor insert returned no row');
  return row;
}

/** What the ingest route needs to know about the sensor behind a token. */
export interface SensorIdentity {
  sensorId: string;
  shopId: string;
  zoneId: string;
  cautionK: number;
  wetK: number;
}

export async function findActiveSensorByTokenHash(
  db: Db,
  tokenHash: string,
): Promise<SensorIdentity | null> {
  const [row] = await db
    .select({
      sensorId: sensors.id,
      shopId: sensors.shopId,
      zoneId: sensors.zoneId,
      cautionK: zones.cautionK,
      wetK: zones.wetK,
    })
    .from(sensors)
    .innerJoin(zones, eq(zones.id, sensors.zoneId))
    .where(and(eq(sensors.tokenHash, tokenHash), isNull(sensors.revokedAt)));
  return row ?? null;
}

/** Marks a sensor's token revoked; returns its hash so caches can drop it, or null. */
export async function revokeSensorToken(db: Db, shopId: string, sensorId: string) {
  const [row] = await db
    .update(sensors)
    .set({ revokedAt: sql`now()` })
    .where(and(eq(sensors.shopId, shopId), eq(sensors.id, sensorId)))
    .returning({ tokenHash: sensors.tokenHash });
  return row?.tokenHash ?? null;
}

/** Replaces a sensor's token hash (used to re-issue demo tokens) and clears any revocation. */
export async function replaceSensorToken(db: Db, sensorId: string, tokenHash: string) {
  await db.update(sensors).set({ tokenHash, revokedAt: null }).where(eq(sensors.id, sensorId));
}
