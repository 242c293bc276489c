/**
 * The chart benches' installs, generated in SQL: shops, zones and sensors with ids derived from
 * their numbers (md5 of a key, so a run can find them again), and a day of one-minute readings
 * per statement, in time order across the sensors as ingest writes them. A bench names its own
 * install, so two benches can share one database.
 */
import type pg from 'pg';

export interface GeneratedInstall {
  shops: number;
  zonesPerShop: number;
  sensorsPerZone: number;
  days: number;
}

/** The words in the generated ids, names and token hashes of one bench's install. */
export interface InstallNames {
  /** md5('<idKey>-shop-' || n)::uuid and so on. */
  idKey: string;
  shop: string;
  zone: string;
  /** Also how the readings' statement finds this install's sensors (name like '<sensor> %'). */
  sensor: string;
  token: string;
}

const idOf = (names: InstallNames, kind: string, n: string) =>
  `md5('${names.idKey}-${kind}-' || ${n})::uuid`;

/** The shops (in `timeZone`), their zones and sensors; the counts. */
export async function insertInstall(
  pool: pg.Pool,
  install: GeneratedInstall,
  names: InstallNames,
  timeZone: string,
): Promise<{ zones: number; sensors: number }> {
  const { shops, zonesPerShop, sensorsPerZone } = install;
  const zones = shops * zonesPerShop;
  const sensors = zones * sensorsPerZone;
  const id = (kind: string, n: string) => idOf(names, kind, n);
  await pool.query(`
    insert into shops (id, name, time_zone)
    select ${id('shop', 's')}, '${names.shop} ' || s, '${timeZone}'
    from generate_series(1, ${shops}) s`);
  await pool.query(`
    insert into zones (id, shop_id, name)
    select ${id('zone', 'z')}, ${id('shop', `((z - 1) / ${zonesPerShop} + 1)`)}, '${names.zone} ' || z
    from generate_series(1, ${zones}) z`);
  await pool.query(`
    insert into sensors (id, shop_id, zone_id, name, token_hash)
    select ${id('sensor', 'n')},
           ${id('shop', `((n - 1) / ${sensorsPerZone * zonesPerShop} + 1)`)},
           ${id('zone', `((n - 1) / ${sensorsPerZone} + 1)`)},
           '${names.sensor} ' || n, md5('${names.token}-' || n)
    from generate_series(1, ${sensors}) n`);
  return { zones, sensors };
}

/**
 * The statement that inserts one day of one-minute readings from $1 (a timestamptz) for every
 * sensor of the install: a dry-ish shop whose air, RH and dew point wave with the time, a probe
 * 1.5 K under the air. `half`: only the sensors whose id hashes to $2 (0 or 1), so two
 * connections can each take one half. `receivedAtTaken`: received_at is the reading's time (as
 * if received when taken) instead of the insert's.
 */
export function dayOfReadingsSql(
  names: InstallNames,
  options: { half?: boolean; receivedAtTaken?: boolean } = {},
): string {
  const received = options.receivedAtTaken ? ', received_at' : '';
  return `insert into readings (sensor_id, at, shop_id, zone_id, air_c, rh_pct, surface_c,
     surface_source, dew_point_c, margin_k, emc_pct, level${received})
   select s.id, t.at, s.shop_id, s.zone_id, w.air_c, w.rh_pct, w.air_c - 1.5, 'probe',
          w.dew_c, w.air_c - 1.5 - w.dew_c, 11.5,
          case when w.air_c - 1.5 - w.dew_c <= 1 then 'wet'::level
               when w.air_c - 1.5 - w.dew_c < 3 then 'close'::level
               else 'dry'::level end${options.receivedAtTaken ? ', t.at' : ''}
   from generate_series($1::timestamptz, $1::timestamptz + interval '1 day' - interval '1 minute',
                        interval '1 minute') t(at)
   -- Every sensor's reading of a minute before the next minute's, as ingest writes them,
   -- without sorting millions of rows: the reference to t.at makes the sensors the inner side
   -- of the join (without it the planner may put them outside and store each sensor's day in
   -- one run of pages, which flatters the plain index 40-fold).
   cross join lateral (select id, shop_id, zone_id, hashtext(id::text) % 97 as k
                       from sensors
                       where name like '${names.sensor} %'${options.half ? ' and hashtext(id::text) & 1 = $2' : ''}
                         and t.at is not null
                       offset 0) s
   cross join lateral (
     select 18 + 4 * sin(extract(epoch from t.at) / 13751.0 + s.k) as air_c,
            60 + 15 * sin(extract(epoch from t.at) / 21600.0 + s.k) as rh_pct,
            9 + 5 * sin(extract(epoch from t.at) / 13751.0 + s.k + 0.7) as dew_c
   ) w`;
}
