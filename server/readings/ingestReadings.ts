/**
 * One request's readings from parsed envelope to stored rows: ingest/'s checks, the surface
 * estimate and ingest/'s margin (prepare.ts), the group writer, which commits the rows with
 * their live message (writer.ts), then the alarm queue. The route around it deals with HTTP
 * only (server/routes/ingest.ts); this returns what its 202 carries.
 */
import type { SensorIdentity } from '@/db/queries/sensors';
import type { Level, Rejection, SensorReading } from '@/ingest';
import type { SurfaceSource } from '@/ingest/wire/levels';

import type { AlarmQueue } from '../alarms/queue';
import { stageMs, stageTraceOn } from '../stageTrace';

import { prepareReadings } from './prepare';
import type { SurfaceEstimator } from './surfaceEstimates';
import type { ReadingWriter } from './writer';

export interface StoreReadingsDeps {
  writer: ReadingWriter;
  estimator: SurfaceEstimator;
  alarms?: AlarmQueue;
  /** Settle only after the alarms are judged too (tests want that order; sensors need not). */
  awaitAlarms?: boolean;
}

/** One accepted reading as the sensor is told about it, in the order it was sent. */
export interface StoredReadingResult {
  at: string;
  dewPoint: number | null;
  margin: number | null;
  emc: number | null;
  level: Level;
  surfaceSource: SurfaceSource | null;
}

export interface StoreReadingsOutcome {
  stored: number;
  duplicates: number;
  rejected: ({ index: number } & Rejection)[];
  results: StoredReadingResult[];
}

export async function storeReadings(
  deps: StoreReadingsDeps,
  sensor: SensorIdentity,
  readings: SensorReading[],
  receivedAtMs: number,
): Promise<StoreReadingsOutcome> {
  const t0 = stageTraceOn ? performance.now() : 0;
  const { rows, rejected } = await prepareReadings(sensor, readings, receivedAtMs, deps.estimator);
  if (stageTraceOn) stageMs('ingest.prepare', performance.now() - t0);
  const { insertedMs } = await deps.writer.write(rows);
  // The rows are committed, so the answer need not wait for the alarms: the queue judges them
  // next, logs its own failures and never undoes the answer.
  const judged = deps.alarms?.add(
    sensor,
    rows.filter((r) => insertedMs.has(r.at.getTime())),
  );
  if (deps.awaitAlarms) await judged;

  return {
    stored: insertedMs.size,
    duplicates: rows.length - insertedMs.size,
    rejected,
    results: rows.map((r) => ({
      at: r.atIso ?? r.at.toISOString(),
      dewPoint: r.dewPointC,
      margin: r.marginK,
      emc: r.emcPct,
      level: r.level,
      surfaceSource: r.surfaceSource,
    })),
  };
}
