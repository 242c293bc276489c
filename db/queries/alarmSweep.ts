/**
 * What the silent-sensor sweep reads: the sensors it must judge, with their posting intervals
 * (set and learnt) and any open silent alarm, and a sensor's last reading read again under the zone's lock.
 */
import { eq, sql } from 'drizzle-orm';

import type { Db } from '../index';
import { sensors } from '../schema';

import type { Tx } from './alarms';

export interface SweepCandidate {
  sensorId: string;
  shopId: string;
  zoneId: string;
  lastSeenAt: Date;
  revoked: boolean;
  /** The interval its owner set and the one learnt from its readings, seconds. */
  expectedIntervalS: number | null;
  intervalS: number | null;
  openSilentAlarmId: string | null;
}

/**
 * Sensors a silent-sensor sweep must judge: every active sensor that has ever posted, and every
 * revoked one still holding an open silent alarm (to close it). Optionally one shop only.
 */
export async function sweepCandidates(db: Db, shopId?: string) {
  const result = await db.execute<{
    sensor_id: string;
    shop_id: string;
    zone_id: string;
    last_seen_at: Date | string;
    revoked: boolean;
    expected_interval_s: number | null;
    interval_s: number | null;
    open_silent_alarm_id: string | null;
  }>(sql`
    select s.id as sensor_id, s.shop_id, s.zone_id, s.last_seen_at,
      s.revoked_at is not null as revoked, s.expected_interval_s, s.interval_s,
      a.id as open_silent_alarm_id
    from sensors s
    left join alarms a
      on a.subject_id = s.id and a.kind = 'sensor_silent' and a.cleared_at is null
    where s.last_seen_at is not null
      and (s.revoked_at is null or a.id is not null)
      ${shopId ? sql`and s.shop_id = ${shopId}` : sql``}`);
  return result.rows.map((r): SweepCandidate => ({
    sensorId: r.sensor_id,
    shopId: r.shop_id,
    zoneId: r.zone_id,
    lastSeenAt: new Date(r.last_seen_at),
    revoked: r.revoked,
    expectedIntervalS: r.expected_interval_s === null ? null : Number(r.expected_interval_s),
    intervalS: r.interval_s === null ? null : Number(r.interval_s),
    openSilentAlarmId: r.open_silent_alarm_id,
  }));
}

/** A sensor's last reading time and whether it is revoked, read again under the zone's lock. */
export async function sensorSeen(tx: Tx, sensorId: string) {
  const [row] = await tx
    .select({ lastSeenAt: sensors.lastSeenAt, revokedAt: sensors.revokedAt })
    .from(sensors)
    .where(eq(sensors.id, sensorId));
  return row ?? null;
}
