/** Zones as the API answers them: GET /shops/:shopId/zones, POST and PATCH …/zones/:zoneId. */
import type { Level, SurfaceSource } from './levels';

/**
 * What a zone holds, which decides what its card leads with: machines (dew margin of the iron),
 * lumber (wood EMC against a target band), finishing, general. The database enum and the
 * route's zod field take this list.
 */
export const ZONE_PURPOSES = ['machines', 'lumber', 'finishing', 'general'] as const;
export type ZonePurpose = (typeof ZONE_PURPOSES)[number];

/**
 * The climate regions of the Wood Handbook's recommended moisture content for interior wood at
 * installation (ingest/emcTarget.ts): most of the US, the dry southwest, the damp warm coast.
 */
export const EMC_REGIONS = ['most', 'dry_southwest', 'damp_coastal'] as const;
export type EmcRegion = (typeof EMC_REGIONS)[number];

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

/** A zone, its purpose and limits, as created or changed (POST, PATCH). Limits K, humidity %. */
export interface ZoneSettings {
  id: string;
  name: string;
  cautionK: number;
  wetK: number;
  humidRhPct: number;
  purpose: ZonePurpose;
  /** The region whose target band a lumber zone's wood EMC is held against. */
  emcRegion: EmcRegion;
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
