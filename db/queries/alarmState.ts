/**
 * The alarm engine's state in PostgreSQL, for a set of zones at once: their state rows, taken
 * under row locks so requests and instances step a zone one after the other, the readings'
 * margins and open alarms they are judged with, and the writes of what a step changed (states,
 * alarms, their events), each one statement whatever the number of zones.
 *
 * Plain SQL on the transaction's client rather than Drizzle's builder: these run for every busy
 * zone every second, and building a statement cost more CPU than PostgreSQL spent running it.
 * Arrays travel as unnest() parameters, so a statement has a fixed set of parameters (and one
 * plan) whatever the number of zones or alarms.
 */
import type pg from 'pg';

import type { MarginSample } from '@/ingest';

import type { AlarmRow, AlarmViewRow, NewAlarmEvent } from './alarms';

/** A transaction's client (db/transaction.ts inTransaction). */
export type TxClient = Pick<pg.PoolClient, 'query'>;

export interface ZoneAlarmSettings {
  cautionK: number;
  wetK: number;
  humidRhPct: number;
}

export interface LockedZoneState {
  zoneId: string;
  shopId: string;
  state: Record<string, unknown>;
  settings: ZoneAlarmSettings;
}

const LOCK_STATES = `
  select s.zone_id, z.shop_id, s.state, z.caution_k, z.wet_k, z.humid_rh_pct
    from alarm_zone_states s
    join zones z on z.id = s.zone_id
   where s.zone_id = any($1::uuid[])
   order by s.zone_id
     for update of s`;

interface LockedRow {
  zone_id: string;
  shop_id: string;
  state: Record<string, unknown>;
  caution_k: number;
  wet_k: number;
  humid_rh_pct: number;
}

/**
 * Takes the engine state of every zone named (SELECT … FOR UPDATE in one statement), creating the
 * rows of zones judged for the first time, so two transactions judging a zone step it one after
 * the other. Rows are locked in zone id order (ORDER BY runs below the lock), so two instances
 * whose sets overlap wait for each other instead of deadlocking. A zone that is gone is missing
 * from the answer. The row exists after a zone's first judgement, so the insert runs only when
 * the lock finds some missing: one statement per judgement instead of two.
 */
export async function lockZoneStates(
  client: TxClient,
  zoneIds: readonly string[],
): Promise<Map<string, LockedZoneState>> {
  const ids = [...new Set(zoneIds)].sort();
  const locked = new Map<string, LockedZoneState>();
  const take = async (wanted: string[]) => {
    const { rows } = await client.query<LockedRow>(LOCK_STATES, [wanted]);
    for (const r of rows) {
      locked.set(r.zone_id, {
        zoneId: r.zone_id,
        shopId: r.shop_id,
        state: r.state,
        settings: { cautionK: r.caution_k, wetK: r.wet_k, humidRhPct: r.humid_rh_pct },
      });
    }
  };
  await take(ids);
  const missing = ids.filter((id) => !locked.has(id));
  if (missing.length > 0) {
    // From zones, so a zone deleted meanwhile gets no row (and is skipped) instead of failing
    // the foreign key and with it every other zone of the set.
    await client.query(
      `insert into alarm_zone_states (zone_id, shop_id)
       select id, shop_id from zones where id = any($1::uuid[])
       on conflict do nothing`,
      [missing],
    );
    await take(missing);
  }
  return locked;
}

/** What a zone is judged with besides its state: the trend window's margins, its open alarms. */
export interface ZoneInputs {
  margins: MarginSample[];
  open: AlarmRow[];
}

/** The alarm columns as AlarmRow names them, for plain-SQL reads. */
const ALARM_COLUMNS = `
  a.id, a.shop_id as "shopId", a.zone_id as "zoneId", a.sensor_id as "sensorId",
  a.subject_id as "subjectId", a.kind, a.since_at as "sinceAt", a.opened_at as "openedAt",
  a.updated_at as "updatedAt", a.cleared_at as "clearedAt", a.worst_margin_k as "worstMarginK",
  a.latest_margin_k as "latestMarginK", a.minutes_to_wet as "minutesToWet",
  a.peak_rh_pct as "peakRhPct", a.latest_rh_pct as "latestRhPct",
  a.lowest_battery_v as "lowestBatteryV", a.latest_battery_v as "latestBatteryV",
  a.acknowledged_by as "acknowledgedBy", a.acknowledged_at as "acknowledgedAt",
  a.ack_note as "ackNote", a.created_at as "createdAt"`;

type JsonAlarm = Omit<
  AlarmRow,
  'sinceAt' | 'openedAt' | 'updatedAt' | 'clearedAt' | 'acknowledgedAt' | 'createdAt'
> & {
  sinceAt: string;
  openedAt: string;
  updatedAt: string;
  clearedAt: string | null;
  acknowledgedAt: string | null;
  createdAt: string;
};

const dateOrNull = (iso: string | null) => (iso === null ? null : new Date(iso));

function alarmFromJson(j: JsonAlarm): AlarmRow {
  return {
    ...j,
    sinceAt: new Date(j.sinceAt),
    openedAt: new Date(j.openedAt),
    updatedAt: new Date(j.updatedAt),
    clearedAt: dateOrNull(j.clearedAt),
    acknowledgedAt: dateOrNull(j.acknowledgedAt),
    createdAt: new Date(j.createdAt),
  };
}

/**
 * For each zone, in one statement: its stored margins in [from, to] (none when `from` is null)
 * and its open alarms, its own and its sensors'. Read after the lock, so the alarms are those
 * the previous step committed.
 */
export async function zoneInputs(
  client: TxClient,
  zones: readonly { zoneId: string; from: Date | null; to: Date | null }[],
): Promise<Map<string, ZoneInputs>> {
  const { rows } = await client.query<{
    zone_id: string;
    ats: number[] | null;
    margins: number[] | null;
    open: JsonAlarm[] | null;
  }>(
    `select w.zone_id, m.ats, m.margins, o.open
       from unnest($1::uuid[], $2::timestamptz[], $3::timestamptz[]) as w(zone_id, from_at, to_at)
       left join lateral (
         select array_agg((extract(epoch from r.at) * 1000)::float8 order by r.at) as ats,
                array_agg(r.margin_k order by r.at) as margins
           from readings r
          where r.zone_id = w.zone_id and r.at >= w.from_at and r.at <= w.to_at
            and r.margin_k is not null
       ) m on true
       left join lateral (
         select json_agg(x) as open
           from (select ${ALARM_COLUMNS} from alarms a
                  where a.zone_id = w.zone_id and a.cleared_at is null) x
       ) o on true`,
    [zones.map((z) => z.zoneId), zones.map((z) => z.from), zones.map((z) => z.to)],
  );
  const inputs = new Map<string, ZoneInputs>();
  for (const r of rows) {
    const ats = r.ats ?? [];
    const margins = r.margins ?? [];
    inputs.set(r.zone_id, {
      margins: ats.map((atMs, i) => ({ atMs, marginK: margins[i]! })),
      open: (r.open ?? []).map(alarmFromJson),
    });
  }
  return inputs;
}

/** Writes the states that changed, in one statement. */
export async function saveZoneStates(
  client: TxClient,
  changed: readonly { zoneId: string; state: object }[],
): Promise<void> {
  if (changed.length === 0) return;
  await client.query(
    `update alarm_zone_states s set state = v.state, updated_at = now()
       from unnest($1::uuid[], $2::jsonb[]) as v(zone_id, state)
      where s.zone_id = v.zone_id`,
    [changed.map((c) => c.zoneId), changed.map((c) => JSON.stringify(c.state))],
  );
}

/** The alarm values as parallel arrays, in the order the statements below name them. */
function valueArrays(rows: readonly AlarmRow[]) {
  return [
    rows.map((r) => r.worstMarginK),
    rows.map((r) => r.latestMarginK),
    rows.map((r) => r.minutesToWet),
    rows.map((r) => r.peakRhPct),
    rows.map((r) => r.latestRhPct),
    rows.map((r) => r.lowestBatteryV),
    rows.map((r) => r.latestBatteryV),
  ];
}

/**
 * Writes what the engine changed — changed alarms in one statement, new alarms and every event
 * in another — and returns the changed alarms as now stored, with their names, for the
 * caller's live messages. Only the columns the engine owns are written, so an acknowledgement
 * made meanwhile is never overwritten.
 */
export async function saveAlarmChanges(
  client: TxClient,
  changes: { inserted: AlarmRow[]; updated: AlarmRow[]; events: NewAlarmEvent[] },
): Promise<AlarmViewRow[]> {
  if (changes.events.length === 0) return [];
  const { inserted, updated, events } = changes;
  // Clears before opens: a batch that clears an alarm and opens its successor (same subject and
  // kind) would otherwise meet the one-open-alarm-per-subject index with both open.
  if (updated.length > 0) {
    await client.query(
      `update alarms a
          set updated_at = v.updated_at, cleared_at = v.cleared_at,
              worst_margin_k = v.worst_margin_k, latest_margin_k = v.latest_margin_k,
              minutes_to_wet = v.minutes_to_wet, peak_rh_pct = v.peak_rh_pct,
              latest_rh_pct = v.latest_rh_pct, lowest_battery_v = v.lowest_battery_v,
              latest_battery_v = v.latest_battery_v
         from unnest($1::uuid[], $2::timestamptz[], $3::timestamptz[], $4::float8[], $5::float8[],
                     $6::float8[], $7::float8[], $8::float8[], $9::float8[], $10::float8[])
              as v(id, updated_at, cleared_at, worst_margin_k, latest_margin_k, minutes_to_wet,
                   peak_rh_pct, latest_rh_pct, lowest_battery_v, latest_battery_v)
        where a.id = v.id`,
      [
        updated.map((r) => r.id),
        updated.map((r) => r.updatedAt),
        updated.map((r) => r.clearedAt),
        ...valueArrays(updated),
      ],
    );
  }
  // The events' foreign key is checked at the end of the statement, after the alarms' insert.
  await client.query(
    `with opened as (
       insert into alarms (id, shop_id, zone_id, sensor_id, subject_id, kind, since_at, opened_at,
                           updated_at, cleared_at, worst_margin_k, latest_margin_k, minutes_to_wet,
                           peak_rh_pct, latest_rh_pct, lowest_battery_v, latest_battery_v)
       select id, shop_id, zone_id, sensor_id, subject_id, kind::alarm_kind, since_at, opened_at,
              updated_at, cleared_at, worst_margin_k, latest_margin_k, minutes_to_wet,
              peak_rh_pct, latest_rh_pct, lowest_battery_v, latest_battery_v
         from unnest($1::uuid[], $2::uuid[], $3::uuid[], $4::uuid[], $5::uuid[], $6::text[],
                     $7::timestamptz[], $8::timestamptz[], $9::timestamptz[], $10::timestamptz[],
                     $11::float8[], $12::float8[], $13::float8[], $14::float8[], $15::float8[],
                     $16::float8[], $17::float8[])
              as v(id, shop_id, zone_id, sensor_id, subject_id, kind, since_at, opened_at,
                   updated_at, cleared_at, worst_margin_k, latest_margin_k, minutes_to_wet,
                   peak_rh_pct, latest_rh_pct, lowest_battery_v, latest_battery_v)
     )
     insert into alarm_events (alarm_id, shop_id, change, at, snapshot)
     select alarm_id, shop_id, change::alarm_change, at, snapshot
       from unnest($18::uuid[], $19::uuid[], $20::text[], $21::timestamptz[], $22::jsonb[])
            as e(alarm_id, shop_id, change, at, snapshot)`,
    [
      inserted.map((r) => r.id),
      inserted.map((r) => r.shopId),
      inserted.map((r) => r.zoneId),
      inserted.map((r) => r.sensorId),
      inserted.map((r) => r.subjectId),
      inserted.map((r) => r.kind),
      inserted.map((r) => r.sinceAt),
      inserted.map((r) => r.openedAt),
      inserted.map((r) => r.updatedAt),
      inserted.map((r) => r.clearedAt),
      ...valueArrays(inserted),
      events.map((e) => e.alarmId),
      events.map((e) => e.shopId),
      events.map((e) => e.change),
      events.map((e) => e.at),
      events.map((e) => JSON.stringify(e.snapshot)),
    ],
  );
  const ids = [...inserted, ...updated].map((r) => r.id);
  const { rows } = await client.query<AlarmViewRow>(
    `select ${ALARM_COLUMNS}, z.name as "zoneName", s.name as "sensorName",
            u.name as "acknowledgedByName"
       from alarms a
       join zones z on z.id = a.zone_id
       left join sensors s on s.id = a.sensor_id
       left join users u on u.id = a.acknowledged_by
      where a.id = any($1::uuid[])
      order by a.cleared_at is null desc, a.opened_at desc`,
    [ids],
  );
  return rows;
}
