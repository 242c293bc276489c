/** Zones as the API answers them: GET /shops/:shopId/zones, POST and PATCH …/zones/:zoneId. */
import type { Level, SurfaceSource } from './levels';

/** The newest reading in a zone, with what was derived from it. Temperatures °C, margin K. */
export interface LatestReading {
  /** ISO 8601, UTC. */
  at: string;
  air: number;
  rh: number;
  surface: number | null;
  dewPoint: number | null;
  margin: number | null;
  emc: number | null;
  level: Level;
  surfaceSource: SurfaceSource | null;
  sensorId: string;
}

/** A zone and its limits, as created or changed (POST, PATCH). Limits K, humidity %. */
export interface ZoneSettings {
  id: string;
  name: string;
  cautionK: number;
  wetK: number;
  humidRhPct: number;
}

/** A zone in the shop's list: its settings and its newest reading, if any. */
export interface Zone extends ZoneSettings {
  latest: LatestReading | null;
  /**
   * Seconds after which `latest` is stale: when every working sensor of the zone would count as
   * silent (ingest/postingInterval.ts). The card greys out past it.
   */
  staleAfterS: number;
}

export interface ZonesResponse {
  zones: Zone[];
}
