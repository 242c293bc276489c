/** Zone rows to what the API answers (ingest/wire/zones.ts): the one place that decides it. */
import type { LatestReadingRow, ZoneRow, ZoneWithLatestRow } from '@/db/queries/zones';
import { zoneStaleAfterS } from '@/ingest';
import type { LatestReading, Zone, ZoneSettings } from '@/ingest/wire';

export function toZoneSettings(row: ZoneRow): ZoneSettings {
  return {
    id: row.id,
    name: row.name,
    cautionK: row.cautionK,
    wetK: row.wetK,
    humidRhPct: row.humidRhPct,
    purpose: row.purpose,
    emcRegion: row.emcRegion,
  };
}

export function toLatestReading(row: LatestReadingRow): LatestReading {
  return {
    at: row.at.toISOString(),
    air: row.airC,
    rh: row.rhPct,
    surface: row.surfaceC,
    dewPoint: row.dewPointC,
    margin: row.marginK,
    emc: row.emcPct,
    level: row.level,
    surfaceSource: row.surfaceSource,
    sensorId: row.sensorId,
  };
}

export function toZone(row: ZoneWithLatestRow): Zone {
  return {
    ...toZoneSettings(row),
    latest: row.latest ? toLatestReading(row.latest) : null,
    staleAfterS: Math.round(zoneStaleAfterS(row.sensorIntervals)),
  };
}
