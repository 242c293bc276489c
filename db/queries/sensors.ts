import { and, eq, isNull, sql, type SQL } from 'drizzle-orm';

import type { Db } from '../index';
import { sensors, zones } from '../schema';
import { transaction } from '../transaction';

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

/** The columns of a SensorIdentity, selected from sensors joined with their zone. */
export const identityColumns = {
  sensorId: sensors.id,
  shopId: sensors.shopId,
  zoneId: sensors.zoneId,
  cautionK: zones.cautionK,
  wetK: zones.wetK,
};

async function findActiveSensor(db: Db, match: SQL | undefined): Promise<SensorIdentity | null> {
  const [row] = await db
    .select(identityColumns)
    .from(sensors)
    .innerJoin(zones, eq(zones.id, sensors.zoneId))
    // A removed sensor is revoked too (removeSensor), so this one test covers both.
    .where(and(match, isNull(sensors.revokedAt)));
  return row ?? null;
}

export function findActiveSensorByTokenHash(
  db: Db,
  tokenHash: string,
): Promise<SensorIdentity | null> {
  return findActiveSensor(db, eq(sensors.tokenHash, tokenHash));
}

/** The sensor behind an MQTT readings topic, while its token stands (id already a UUID). */
export function findActiveSensorById(db: Db, sensorId: string): Promise<SensorIdentity | null> {
  return findActiveSensor(db, eq(sensors.id, sensorId));
}

/** A sensor of this shop that has not been removed: removed ones exist only as history. */
const ofShop = (shopId: string, sensorId: string) =>
  and(eq(sensors.shopId, shopId), eq(sensors.id, sensorId), isNull(sensors.removedAt));

/** Marks a sensor's token revoked; returns its hash so caches can drop it, or null. */
export async function revokeSensorToken(db: Db, shopId: string, sensorId: string) {
  const [row] = await db
    .update(sensors)
    .set({ revokedAt: sql`now()` })
    .where(ofShop(shopId, sensorId))
    .returning({ tokenHash: sensors.tokenHash });
  return row?.tokenHash ?? null;
}

/**
 * Removes a sensor: it leaves the shop's list and its token stops working, but the row stays
 * (marked removed and revoked). Readings reference sensors with ON DELETE CASCADE, so deleting
 * the row would delete its readings — the zone's history, week figures and the evidence behind
 * past alarms — when what an owner removes is a dead or retired device, not the past. Returns
 * the token hash so caches drop it at once, or null when no such sensor is in the shop.
 */
export async function removeSensor(db: Db, shopId: string, sensorId: string) {
  const [row] = await db
    .update(sensors)
    .set({ removedAt: sql`now()`, revokedAt: sql`coalesce(${sensors.revokedAt}, now())` })
    .where(ofShop(shopId, sensorId))
    .returning({ tokenHash: sensors.tokenHash });
  return row?.tokenHash ?? null;
}

/** Token hashes of every sensor of a shop, removed ones included: what a shop's deletion ends. */
export async function tokenHashesOfShop(db: Db, shopId: string): Promise<string[]> {
  const rows = await db
    .select({ tokenHash: sensors.tokenHash })
    .from(sensors)
    .where(eq(sensors.shopId, shopId));
  return rows.map((r) => r.tokenHash);
}

const sensorColumns = {
  id: sensors.id,
  name: sensors.name,
  zoneId: sensors.zoneId,
  zoneName: zones.name,
  lastSeenAt: sensors.lastSeenAt,
  batteryV: sensors.batteryV,
  revokedAt: sensors.revokedAt,
  createdAt: sensors.createdAt,
  intervalS: sensors.intervalS,
  expectedIntervalS: sensors.expectedIntervalS,
};

/** A shop's sensors with where they sit and how they are doing; never the token hash. */
export async function listSensors(db: Db, shopId: string) {
  return db
    .select(sensorColumns)
    .from(sensors)
    .innerJoin(zones, eq(zones.id, sensors.zoneId))
    .where(and(eq(sensors.shopId, shopId), isNull(sensors.removedAt)))
    .orderBy(zones.name, sensors.name);
}

/** One sensor of a shop as the list shows it, or null. */
export async function findSensor(db: Db, shopId: string, sensorId: string) {
  const [row] = await db
    .select(sensorColumns)
    .from(sensors)
    .innerJoin(zones, eq(zones.id, sensors.zoneId))
    .where(ofShop(shopId, sensorId));
  return row ?? null;
}

/**
 * Gives a sensor a new token (and lifts a revocation). Returns the old hash so the token
 * cache can drop it at once, or null when the sensor is not in this shop.
 */
export async function rotateSensorToken(
  db: Db,
  shopId: string,
  sensorId: string,
  tokenHash: string,
): Promise<{ oldTokenHash: string } | null> {
  return transaction(db, async (tx) => {
    const [old] = await tx
      .select({ tokenHash: sensors.tokenHash })
      .from(sensors)
      .where(ofShop(shopId, sensorId))
      .for('update');
    if (!old) return null;
    await tx.update(sensors).set({ tokenHash, revokedAt: null }).where(eq(sensors.id, sensorId));
    return { oldTokenHash: old.tokenHash };
  });
}

/**
 * Renames a sensor or moves it to another zone of the same shop (the zone is checked in the
 * same statement). Returns its token hash so the ingest cache forgets the old zone, or null.
 */
export async function updateSensor(
  db: Db,
  shopId: string,
  sensorId: string,
  changes: { name?: string; zoneId?: string; expectedIntervalS?: number | null },
) {
  const zoneOk = changes.zoneId
    ? sql`exists (select 1 from ${zones} where ${zones.id} = ${changes.zoneId} and ${zones.shopId} = ${shopId})`
    : sql`true`;
  const [row] = await db
    .update(sensors)
    .set(changes)
    .where(and(ofShop(shopId, sensorId), zoneOk))
    .returning({
      id: sensors.id,
      name: sensors.name,
      zoneId: sensors.zoneId,
      tokenHash: sensors.tokenHash,
    });
  return row ?? null;
}

/** Token hashes of a zone's sensors: the cache entries that hold the zone's old limits. */
export async function tokenHashesOfZone(db: Db, zoneId: string): Promise<string[]> {
  const rows = await db
    .select({ tokenHash: sensors.tokenHash })
    .from(sensors)
    .where(eq(sensors.zoneId, zoneId));
  return rows.map((r) => r.tokenHash);
}
