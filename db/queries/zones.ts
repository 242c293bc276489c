import { and, eq, sql } from 'drizzle-orm';

import type { EmcRegion, Level, SurfaceSource, ZonePurpose } from '@/ingest/wire';

import type { Db } from '../index';
import { zones } from '../schema';

const zoneColumns = {
  id: zones.id,
  name: zones.name,
  cautionK: zones.cautionK,
  wetK: zones.wetK,
  humidRhPct: zones.humidRhPct,
  purpose: zones.purpose,
  emcRegion: zones.emcRegion,
};

/** A zone's own columns: name, purpose, limits (K, % RH) and EMC region. */
export interface ZoneRow {
  id: string;
  name: string;
  cautionK: number;
  wetK: number;
  humidRhPct: number;
  purpose: ZonePurpose;
  emcRegion: EmcRegion;
}

export interface ZoneChanges {
  name?: string;
  cautionK?: number;
  wetK?: number;
  humidRhPct?: number;
  purpose?: ZonePurpose;
  emcRegion?: EmcRegion;
}

export async function insertZone(
  db: Db,
  shopId: string,
  name: string,
  extra: { purpose?: ZonePurpose; emcRegion?: EmcRegion } = {},
) {
  const [row] = await db
    .insert(zones)
    .values({ shopId, name, ...extra })
    .returning(zoneColumns);
  if (!row) throw new Error('zone insert returned no row');
  return row;
}

export async function findZone(db: Db, shopId: string, zoneId: string) {
  const [row] = await db
    .select(zoneColumns)
    .from(zones)
    .where(and(eq(zones.shopId, shopId), eq(zones.id, zoneId)));
  return row ?? null;
}

export async function updateZone(db: Db, shopId: string, zoneId: string, changes: ZoneChanges) {
  const [row] = await db
    .update(zones)
    .set(changes)
    .where(and(eq(zones.shopId, shopId), eq(zones.id, zoneId)))
    .returning(zoneColumns);
  return row ?? null;
}

/** A zone's newest reading as stored. */
export interface LatestReadingRow {
  at: Date;
  airC: number;
  rhPct: number;
  surfaceC: number | null;
  dewPointC: number | null;
  marginK: number | null;
  emcPct: number | null;
  level: Level;
  surfaceSource: SurfaceSource | null;
  sensorId: string;
}

/**
 * Zones of a shop, each with its newest reading. A LATERAL lookup per zone walks the
 * (zone_id, at) index backwards, so it stays one index probe per zone however long the history.
 */
export async function listZonesWithLatest(db: Db, shopId: string) {
  const result = await db.execute<{
    id: string;
    name: string;
    caution_k: number;
    wet_k: number;
    humid_rh_pct: number;
    purpose: ZonePurpose;
    emc_region: EmcRegion;
    latest: (Omit<LatestReadingRow, 'at'> & { at: string }) | null;
    sensor_intervals: { setS: number | null; learnedS: number | null }[];
  }>(sql`
    select z.id, z.name, z.caution_k, z.wet_k, z.humid_rh_pct, z.purpose, z.emc_region,
      (select coalesce(json_agg(json_build_object(
          'setS', s.expected_interval_s, 'learnedS', s.interval_s)), '[]'::json)
        from sensors s where s.zone_id = z.id and s.revoked_at is null) as sensor_intervals,
      case when r.at is null then null else json_build_object(
        'at', r.at, 'airC', r.air_c, 'rhPct', r.rh_pct, 'surfaceC', r.surface_c,
        'dewPointC', r.dew_point_c, 'marginK', r.margin_k, 'emcPct', r.emc_pct,
        'level', r.level, 'surfaceSource', r.surface_source, 'sensorId', r.sensor_id) end as latest
    from zones z
    left join lateral (
      select * from readings where zone_id = z.id order by at desc limit 1
    ) r on true
    where z.shop_id = ${shopId}
    order by z.created_at, z.name`);
  return result.rows.map((row) => ({
    id: row.id,
    name: row.name,
    cautionK: row.caution_k,
    wetK: row.wet_k,
    humidRhPct: row.humid_rh_pct,
    purpose: row.purpose,
    emcRegion: row.emc_region,
    latest: row.latest ? { ...row.latest, at: new Date(row.latest.at) } : null,
    // The posting intervals of its working sensors: when its newest reading goes stale.
    sensorIntervals: row.sensor_intervals,
  }));
}

export type ZoneWithLatestRow = Awaited<ReturnType<typeof listZonesWithLatest>>[number];

/** Why a zone cannot be deleted, or null when it was. */
export type ZoneDeleteRefusal = 'not_found' | 'has_sensors' | 'has_readings' | 'has_surfaces';

/**
 * Deletes a zone made by mistake. Readings, sensors and alarms cascade with a zone, so a zone
 * with a sensor still in it, or any stored reading, is refused: its history outlives a rename,
 * not a delete. So is one with a surface, whose care log would cascade with it. Removed sensors without readings go with it. The zone row is locked first so a
 * sensor placed or a reading stored meanwhile waits and then sees the zone gone.
 */
export async function deleteEmptyZone(
  db: Db,
  shopId: string,
  zoneId: string,
): Promise<ZoneDeleteRefusal | null> {
  const locked = await db.execute<{ id: string }>(
    sql`select id from zones where shop_id = ${shopId} and id = ${zoneId} for update`,
  );
  if (locked.rows.length === 0) return 'not_found';
  const uses = await db.execute<{ sensors: boolean; readings: boolean; surfaces: boolean }>(sql`
    select
      exists (select 1 from sensors where zone_id = ${zoneId} and removed_at is null) as sensors,
      exists (select 1 from readings where zone_id = ${zoneId}) as readings,
      exists (select 1 from surfaces where zone_id = ${zoneId}) as surfaces`);
  const use = uses.rows[0];
  if (use?.sensors) return 'has_sensors';
  if (use?.readings) return 'has_readings';
  if (use?.surfaces) return 'has_surfaces';
  await db.delete(zones).where(and(eq(zones.shopId, shopId), eq(zones.id, zoneId)));
  return null;
}
