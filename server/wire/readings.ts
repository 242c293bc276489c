/** Series rows to what the API answers (ingest/wire/readings.ts): the one place that decides it. */
import type { SeriesRow } from '@/db/queries/readings';
import type { ReadingPoint } from '@/ingest/wire';

/**
 * A point of the series. Its level is the one stored with the reading (ingest/derive.ts: the
 * limits in force when it arrived); a bucket's is the worst stored in it.
 */
export function toReadingPoint(row: SeriesRow): ReadingPoint {
  return {
    at: row.at.toISOString(),
    air: row.airC,
    rh: row.rhPct,
    surface: row.surfaceC,
    dewPoint: row.dewPointC,
    margin: row.marginK,
    marginMin: row.marginMinK,
    marginMax: row.marginMaxK,
    emc: row.emcPct,
    level: row.level,
    count: row.count,
  };
}
