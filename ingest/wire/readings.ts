/** A zone's series: GET /shops/:shopId/zones/:zoneId/readings. Temperatures °C, margins K. */
import type { Level } from './levels';

export interface ReadingPoint {
  /** ISO 8601, UTC: the reading's time, or its bucket's start. */
  at: string;
  air: number;
  rh: number;
  surface: number | null;
  dewPoint: number | null;
  margin: number | null;
  /** The lowest margin inside a bucket; equals `margin` for a raw reading. */
  marginMin: number | null;
  /** The highest margin inside a bucket; equals `margin` for a raw reading. */
  marginMax: number | null;
  emc: number | null;
  /** The level of `marginMin` under the zone's limits. */
  level: Level;
  /** Readings in the point: 1 for a raw reading. */
  count: number;
}

export interface ReadingsResponse {
  from: string;
  to: string;
  /**
   * The zone's first reading ever (ISO 8601, UTC), null before any: until a zone has a day of
   * history its chart spans from here instead of the whole window.
   */
  firstAt: string | null;
  /** 0 means the points are raw readings. */
  bucketSeconds: number;
  points: ReadingPoint[];
}
