/**
 * Messages from GET /api/v1/live, whose shapes are ingest/wire/live.ts (the server builds them
 * with the same types); the rest of the app imports them from here. Checked by hand rather
 * than with a schema library to keep the web bundle small; anything unexpected is dropped,
 * never thrown.
 */
import { isAlarmKind } from '@/ingest/alarmKinds';
import type {
  AccessMessage,
  AlarmMessage,
  LiveAlarm,
  LiveReading,
  ReadingMessage,
  ShopChangeMessage,
} from '@/ingest/wire/live';
import { ALARM_VALUE_KEYS } from '@/ingest/wire/alarms';
import { IMPORT_STATUSES, type Import, type ImportMessage } from '@/ingest/wire/imports';
import { LEVELS as LEVEL_LIST, SURFACE_SOURCES } from '@/ingest/wire/levels';

export type { LiveAlarm, LiveReading };

/** As parsed: `count` is left out when a message lacks it (then it counts as one). */
export interface LiveReadingMessage extends Omit<ReadingMessage, 'count'> {
  count?: number;
}

/** As parsed: `partial` is always there; true means refetch rather than patch. */
export interface LiveAlarmMessage extends Omit<AlarmMessage, 'partial'> {
  partial: boolean;
}

export type LiveAccessMessage = AccessMessage;

export type LiveShopChangeMessage = ShopChangeMessage;

export type LiveImportMessage = ImportMessage;

/** The messages the app acts on; `hello` and anything newer are dropped. */
export type LiveMessage =
  | LiveReadingMessage
  | LiveAlarmMessage
  | LiveAccessMessage
  | LiveShopChangeMessage
  | LiveImportMessage;

const LEVELS: readonly string[] = LEVEL_LIST;
const SOURCES: readonly string[] = SURFACE_SOURCES;

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
    (value.surfaceSource === null || SOURCES.includes(value.surfaceSource as string))
  );
}

const isTime = (value: unknown) => typeof value === 'string' && !Number.isNaN(Date.parse(value));
const isNamed = (value: unknown) =>
  isObject(value) && typeof value.id === 'string' && typeof value.name === 'string';

function isAcknowledgement(value: unknown): boolean {
  if (value === null) return true;
  return (
    isObject(value) &&
    (value.by === null || isNamed(value.by)) &&
    isTime(value.at) &&
    typeof value.note === 'string'
  );
}

function isAlarm(value: unknown): value is LiveAlarm {
  if (!isObject(value)) return false;
  return (
    typeof value.id === 'string' &&
    isAlarmKind(value.kind) &&
    (value.state === 'open' || value.state === 'cleared') &&
    isNamed(value.zone) &&
    (value.sensor === null || isNamed(value.sensor)) &&
    isTime(value.sinceAt) &&
    isTime(value.openedAt) &&
    isTime(value.updatedAt) &&
    (value.clearedAt === null || isTime(value.clearedAt)) &&
    ALARM_VALUE_KEYS.every((key) => isNumberOrNull(value[key])) &&
    isAcknowledgement(value.acknowledgement)
  );
}

const STATUSES: readonly string[] = IMPORT_STATUSES;
const isCount = (value: unknown) => isNumber(value) && value >= 0;
const isTimeOrNull = (value: unknown) => value === null || isTime(value);

function isImport(value: unknown): value is Import {
  if (!isObject(value)) return false;
  const error = value.error;
  return (
    typeof value.id === 'string' &&
    typeof value.sensorId === 'string' &&
    typeof value.fileName === 'string' &&
    isCount(value.bytes) &&
    typeof value.status === 'string' &&
    STATUSES.includes(value.status) &&
    isCount(value.rowsRead) &&
    isCount(value.rowsStored) &&
    isCount(value.rowsDuplicate) &&
    isCount(value.rowsRejected) &&
    isTimeOrNull(value.firstAt) &&
    isTimeOrNull(value.lastAt) &&
    (error === null ||
      (isObject(error) && typeof error.code === 'string' && typeof error.message === 'string')) &&
    isTime(value.createdAt) &&
    isTimeOrNull(value.finishedAt)
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
  if (isObject(value) && value.type === 'access') {
    const ids = value.shopIds;
    if (!Array.isArray(ids) || !ids.every((id) => typeof id === 'string')) return null;
    return { type: 'access', shopIds: ids as string[] };
  }
  if (isObject(value) && (value.type === 'zones' || value.type === 'sensors')) {
    if (typeof value.shopId !== 'string') return null;
    return { type: value.type, shopId: value.shopId };
  }
  if (isObject(value) && value.type === 'import') {
    if (typeof value.shopId !== 'string' || !isImport(value.import)) return null;
    return { type: 'import', shopId: value.shopId, import: value.import };
  }
  if (isObject(value) && value.type === 'alarm') {
    if (typeof value.shopId !== 'string' || !isAlarm(value.alarm)) return null;
    return { type: 'alarm', shopId: value.shopId, alarm: value.alarm, partial: !!value.partial };
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
