/** Series rows to what the API answers (ingest/wire/readings.ts): the one place that decides it. */
import type { SeriesRow } from '@/db/queries/readings';
import { levelFor, type MarginLimits } from '@/ingest';
import type { ReadingPoint } from '@/ingest/wire';

/**
 * A point of the series. Its level is that of the lowest margin in it, under the zone's limits
 * as they are now: a bucket that came close to the dew point is shown as close.
 */
export function toReadingPoint(row: SeriesRow, limits: MarginLimits): ReadingPoint {
  return {
    at: row.at.toISOString(),
    air: row.airC,
    rh: row.rhPct,
    surface: row.surfaceC,
    dewPoint: row.dewPointC,
    margin: row.marginK,
    marginMin: row.marginMinK,
    emc: row.emcPct,
    level: levelFor(row.marginMinK, limits),
    count: row.count,
  };
}
