/**
 * The database baseline: the same readings table, written the plainest way — one multi-row
 * INSERT … VALUES per batch, each its own commit, from as many connections as the HTTP load
 * generator uses. No HTTP, no validation, no sensor update, no notification: what the ingest
 * route would reach if everything above the database cost nothing.
 */
import pg from 'pg';

import { derivedOf, type ReadingSource } from './readings';

const COLUMNS = [
  'sensor_id',
  'at',
  'shop_id',
  'zone_id',
  'air_c',
  'rh_pct',
  'surface_c',
  'surface_source',
  'battery_v',
  'dew_point_c',
  'margin_k',
  'emc_pct',
  'level',
] as const;

export interface RawInsertSlice {
  rows: number;
  durationS: number;
  /** Per statement, commit included. */
  latenciesMs: number[];
}

export interface RawInserter {
  slice(durationS: number): Promise<RawInsertSlice>;
  close(): Promise<void>;
}

export async function openRawInserter(spec: {
  databaseUrl: string;
  connections: number;
  batch: number;
  sensors: { sensorId: string; shopId: string; zoneId: string }[];
  readings: ReadingSource;
}): Promise<RawInserter> {
  const placeholders = Array.from(
    { length: spec.batch },
    (_, row) => `(${COLUMNS.map((_c, col) => `$${row * COLUMNS.length + col + 1}`).join(', ')})`,
  );
  const text = `insert into readings (${COLUMNS.join(', ')}) values ${placeholders.join(', ')}`;
  let turn = 0;
  const nextValues = () => {
    const values: unknown[] = [];
    for (let i = 0; i < spec.batch; i++) {
      const sensor = spec.sensors[turn++ % spec.sensors.length]!;
      const r = spec.readings.next();
      const d = derivedOf(r);
      values.push(sensor.sensorId, r.at, sensor.shopId, sensor.zoneId, r.air, r.rh, r.surface);
      values.push('probe', r.battery, d.dewPointC, d.marginK, d.emcPct, d.level);
    }
    return values;
  };

  const clients = Array.from(
    { length: spec.connections },
    () => new pg.Client({ connectionString: spec.databaseUrl }),
  );
  await Promise.all(clients.map((c) => c.connect()));

  return {
    async slice(durationS) {
      const latenciesMs: number[] = [];
      const startMs = performance.now();
      const endMs = startMs + durationS * 1000;
      const loop = async (client: pg.Client) => {
        let rows = 0;
        let lastMs = startMs;
        while (performance.now() < endMs) {
          const values = nextValues();
          const t0 = performance.now();
          await client.query(text, values);
          lastMs = performance.now();
          latenciesMs.push(lastMs - t0);
          rows += spec.batch;
        }
        return { rows, lastMs };
      };
      const done = await Promise.all(clients.map(loop));
      return {
        rows: done.reduce((n, d) => n + d.rows, 0),
        // Until the last statement committed: the ones that began before the end count whole.
        durationS: (Math.max(...done.map((d) => d.lastMs)) - startMs) / 1000,
        latenciesMs,
      };
    },
    async close() {
      await Promise.all(clients.map((c) => c.end().catch(() => {})));
    },
  };
}
