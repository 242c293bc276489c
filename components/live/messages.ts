/**
 * Messages from GET /api/v1/live. Checked by hand rather than with a schema library to keep
 * the web bundle small; anything unexpected is dropped, never thrown.
 */
import type { Level } from '@/ingest';
import type { SurfaceSource } from '@/components/queries';

export interface LiveReading {
  at: string;
  air: number;
  rh: number;
  surface: number | null;
  dewPoint: number | null;
  margin: number | null;
  emc: number | null;
  level: Level;
  surfaceSource: SurfaceSource | null;
}

export interface LiveReadingMessage {
  type: 'reading';
  shopId: string;
  zoneId: string;
  sensorId: string;
  reading: LiveReading;
  /** How many readings the batch stored; only the newest travels in `reading`. */
  count?: number;
}

export type LiveMessage = LiveReadingMessage;

const LEVELS: readonly string[] = ['dry', 'close', 'wet', 'unknown'];

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null;
}

function isNumber(value: unknown): value is number {
  return typeof value === 'number' && Number.isFinite(value);
}

function isNumberOrNull(value: unknown): value is number | null {
  return value === null || isNumber(value);
}

function isReading(value: unknown): value is LiveReading {
  if (!isObject(value)) return false;
  return (
    typeof value.at === 'string' &&
    !Number.isNaN(Date.parse(value.at)) &&
    isNumber(value.air) &&
    isNumber(value.rh) &&
    isNumberOrNull(value.surface) &&
    isNumberOrNull(value.dewPoint) &&
    isNumberOrNull(value.margin) &&
    isNumberOrNull(value.emc) &&
    typeof value.level === 'string' &&
    LEVELS.includes(value.level) &&
    (value.surfaceSource === null ||
      value.surfaceSource === 'probe' ||
      value.surfaceSource === 'estimate')
  );
}

/** The message in a WebSocket frame, or null for anything we do not (yet) understand. */
export function parseLiveMessage(data: unknown): LiveMessage | null {
  if (typeof data !== 'string') return null;
  let value: unknown;
  try {
    value = JSON.parse(data);
  } catch {
    return null;
  }
  if (!isObject(value) || value.type !== 'reading') return null;
  if (
    typeof value.shopId !== 'string' ||
    typeof value.zoneId !== 'string' ||
    typeof value.sensorId !== 'string' ||
    !isReading(value.reading)
  ) {
    return null;
  }
  return {
    type: 'reading',
    shopId: value.shopId,
    zoneId: value.zoneId,
    sensorId: value.sensorId,
    reading: value.reading,
    count: isNumber(value.count) ? value.count : undefined,
  };
}
