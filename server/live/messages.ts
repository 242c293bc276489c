/** Messages the live hub pushes to browsers; built once, where the data is committed. */
import type { ReadingRow } from '@/db/queries/readings';

export interface LiveReading {
  at: string;
  air: number;
  rh: number;
  surface: number | null;
  dewPoint: number | null;
  margin: number | null;
  emc: number | null;
  level: ReadingRow['level'];
  surfaceSource: ReadingRow['surfaceSource'];
}

export interface ReadingMessage {
  type: 'reading';
  shopId: string;
  zoneId: string;
  sensorId: string;
  /** The newest reading of the batch: what a card shows. */
  reading: LiveReading;
  /** How many readings the batch stored; a chart refetches when more than one arrived. */
  count: number;
}

export type LiveMessage = ReadingMessage;

/** One message per stored batch keeps the payload far below pg_notify's 8,000-byte cap. */
export function readingMessage(fresh: ReadingRow[]): ReadingMessage {
  const newest = fresh.reduce((a, b) => (b.at > a.at ? b : a));
  return {
    type: 'reading',
    shopId: newest.shopId,
    zoneId: newest.zoneId,
    sensorId: newest.sensorId,
    reading: {
      at: newest.at.toISOString(),
      air: newest.airC,
      rh: newest.rhPct,
      surface: newest.surfaceC,
      dewPoint: newest.dewPointC,
      margin: newest.marginK,
      emc: newest.emcPct,
      level: newest.level,
      surfaceSource: newest.surfaceSource,
    },
    count: fresh.length,
  };
}
