/**
 * The sensor payload of POST /api/v1/ingest (see the HTTP contract): a batch
 * `{ unit, readings: [...] }` or one reading object with an optional `unit` beside it.
 *
 * Two layers, because the contract treats them differently: the envelope (types, shape)
 * fails the whole request with 400; the per-reading range checks reject only that reading.
 */
import { z } from 'zod';

import {
  BATTERY_MAX_V,
  BATTERY_MIN_V,
  ENVELOPE_FIELDS,
  MAX_FUTURE_MS,
  MIN_TIME_MS,
  READING_FIELDS,
  RH_MAX_PCT,
  RH_MIN_PCT,
  TEMPERATURE_MAX_C,
  TEMPERATURE_MIN_C,
} from './readingFields';
import { fToC, type TemperatureUnit } from './units';

// The contract's numbers and field names live in readingFields.ts (no zod, so the app can show
// them); re-exported here for the server and tests.
export * from './readingFields';

// ISO 8601 date-time that names its offset (Z or ±hh:mm); a bare local time is ambiguous.
const ISO_WITH_OFFSET = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,9})?)?(Z|[+-]\d{2}:?\d{2})$/;

const timeSchema = z.union([
  z.string().regex(ISO_WITH_OFFSET, 'Use ISO 8601 with an offset or Z, e.g. 2026-03-02T06:10:00Z'),
  z.number().describe('epoch seconds'),
]);

export const readingSchema = z.object({
  at: timeSchema.optional(),
  air: z.number(),
  rh: z.number(),
  surface: z.number().nullable().optional(),
  battery: z.number().nullable().optional(),
});

const unitSchema = z.enum(['C', 'F']).default('C');

export const batchSchema = z.object({
  unit: unitSchema,
  readings: z.array(readingSchema).min(1, 'Send at least one reading'),
});

export const singleSchema = readingSchema.extend({ unit: unitSchema });

export type RawReading = z.infer<typeof readingSchema>;

/** A reading in the units we store: °C, %, volts, epoch milliseconds. */
export interface SensorReading {
  atMs: number;
  airC: number;
  rhPct: number;
  surfaceC: number | null;
  batteryV: number | null;
  /** Keys the contract does not name, sent on this reading of a batch: it is refused. */
  unknownFields?: string[];
}

export interface PayloadIssue {
  path: string;
  message: string;
}

export type EnvelopeResult =
  | { ok: true; readings: SensorReading[] }
  | { ok: false; code: 'invalid_payload' | 'unknown_field'; issues: PayloadIssue[] };

// A hostile body may send thousands of keys or one of a megabyte: the answer names a few, short.
const MAX_KEYS_NAMED = 20;
const MAX_KEY_CHARS = 64;
const shortKey = (key: string) =>
  key.length > MAX_KEY_CHARS ? `${key.slice(0, MAX_KEY_CHARS)}…` : key;
const isRecord = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

/** The keys of `value` outside `known`, in the order they were sent (the first 20). */
function unknownKeys(value: unknown, known: readonly string[]): string[] {
  if (!isRecord(value)) return [];
  return Object.keys(value)
    .filter((key) => !known.includes(key))
    .slice(0, MAX_KEYS_NAMED);
}

const quoteList = (keys: string[]) => keys.map((k) => `"${shortKey(k)}"`).join(', ');

/** The sentence an unknown field earns: a misspelt field must never pass as a missing one. */
export function unknownFieldMessage(
  keys: string[],
  known: readonly string[],
  holder: 'a reading' | 'the batch' = 'a reading',
): string {
  const what = keys.length === 1 ? 'field' : 'fields';
  return `Unknown ${what} ${quoteList(keys)}: ${holder} may only name ${known.join(', ')} (check the spelling).`;
}

/** True when the body is an object that names a `readings` field (the batch form). */
function isBatch(body: unknown): boolean {
  return typeof body === 'object' && body !== null && !Array.isArray(body) && 'readings' in body;
}

const SINGLE_FIELDS: readonly string[] = [...READING_FIELDS, 'unit'];

// The single form's zod schema, built once: a schema made per request costs more than the
// parse itself.
const singleAsBatchSchema = singleSchema.transform(({ unit, ...reading }) => ({
  unit,
  readings: [reading],
}));

const isFiniteNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
const isOptionalNumber = (v: unknown) => v === undefined || v === null || isFiniteNumber(v);

/**
 * The hot path's check: true when zod would accept `item` as a reading exactly as sent (the
 * shape nearly every sensor posts), so it can be read without running zod. Anything else, valid
 * or not, goes through zod, which alone words the errors; tests/ingest/payload.test.ts holds
 * the two to the same verdicts. z.number() refuses NaN and ±Infinity, so this does too.
 */
function isPlainReading(item: unknown): item is RawReading {
  if (!isRecord(item)) return false;
  const { at, air, rh, surface, battery } = item;
  if (!isFiniteNumber(air) || !isFiniteNumber(rh)) return false;
  if (!isOptionalNumber(surface) || !isOptionalNumber(battery)) return false;
  if (at === undefined || isFiniteNumber(at)) return true;
  return typeof at === 'string' && ISO_WITH_OFFSET.test(at);
}

const isUnit = (u: unknown): u is TemperatureUnit | undefined =>
  u === undefined || u === 'C' || u === 'F';

/** The envelope as zod would parse it, or null when only zod can tell (see isPlainReading). */
function parsePlain(
  body: Record<string, unknown>,
  batch: boolean,
): { unit: TemperatureUnit; readings: RawReading[] } | null {
  const { unit } = body;
  if (!isUnit(unit)) return null;
  if (!batch) return isPlainReading(body) ? { unit: unit ?? 'C', readings: [body] } : null;
  const { readings } = body;
  if (!Array.isArray(readings) || readings.length === 0) return null;
  for (const item of readings) if (!isPlainReading(item)) return null;
  return { unit: unit ?? 'C', readings: readings as RawReading[] };
}

/**
 * Parse the envelope. `receivedAtMs` stands in for a missing `at`, so a sensor without a clock
 * still gets a correctly timed reading.
 */
export function parseEnvelope(body: unknown, receivedAtMs: number): EnvelopeResult {
  // An unknown key beside the readings (e.g. "unti": "F") could change what every reading
  // means, so the envelope's own keys refuse the whole request. A single reading is its own
  // envelope: its unknown keys refuse it the same way.
  const batch = isBatch(body);
  const known = batch ? ENVELOPE_FIELDS : SINGLE_FIELDS;
  const outside = unknownKeys(body, known);
  if (outside.length > 0) {
    return {
      ok: false,
      code: 'unknown_field',
      issues: outside.map((key) => ({
        path: shortKey(key),
        message: unknownFieldMessage([key], known, batch ? 'the batch' : 'a reading'),
      })),
    };
  }
  let envelope = isRecord(body) ? parsePlain(body, batch) : null;
  if (!envelope) {
    const parsed = batch ? batchSchema.safeParse(body) : singleAsBatchSchema.safeParse(body);
    if (!parsed.success) {
      return {
        ok: false,
        code: 'invalid_payload',
        issues: parsed.error.issues.map((issue) => ({
          path: issue.path.join('.'),
          message: issue.message,
        })),
      };
    }
    envelope = parsed.data;
  }
  const { unit, readings } = envelope;
  // In a batch a reading with an unknown key fails alone, like any per-reading check: zod has
  // already dropped the key, so it is found again on the raw item.
  const rawItems = batch && isRecord(body) && Array.isArray(body.readings) ? body.readings : [];
  return {
    ok: true,
    readings: readings.map((r, index) => {
      const reading = normalizeReading(r, unit, receivedAtMs);
      if (!batch) return reading;
      const extra = unknownKeys(rawItems[index], READING_FIELDS);
      return extra.length > 0 ? { ...reading, unknownFields: extra } : reading;
    }),
  };
}

function toC(value: number, unit: TemperatureUnit): number {
  return unit === 'F' ? fToC(value) : value;
}

function normalizeReading(
  r: RawReading,
  unit: TemperatureUnit,
  receivedAtMs: number,
): SensorReading {
  let atMs = receivedAtMs;
  if (typeof r.at === 'number') atMs = Math.round(r.at * 1000);
  else if (typeof r.at === 'string') atMs = Date.parse(r.at);
  return {
    atMs,
    airC: toC(r.air, unit),
    rhPct: r.rh,
    surfaceC: r.surface == null ? null : toC(r.surface, unit),
    batteryV: r.battery ?? null,
  };
}

export type RejectCode =
  | 'unknown_field'
  | 'invalid_time'
  | 'time_too_early'
  | 'time_in_future'
  | 'rh_out_of_range'
  | 'air_out_of_range'
  | 'surface_out_of_range'
  | 'battery_out_of_range'
  | 'not_computable';

export interface Rejection {
  code: RejectCode;
  message: string;
  /** The field at fault, where one field is (`surfce` for a misspelt `surface`). */
  field?: string;
}

const inRange = (v: number) => v >= TEMPERATURE_MIN_C && v <= TEMPERATURE_MAX_C;

/** The per-reading checks of the contract; null when the reading may be stored. */
export function checkReading(r: SensorReading, nowMs: number): Rejection | null {
  if (r.unknownFields && r.unknownFields.length > 0) {
    return {
      code: 'unknown_field',
      message: unknownFieldMessage(r.unknownFields, READING_FIELDS),
      field: shortKey(r.unknownFields[0]!),
    };
  }
  if (!Number.isFinite(r.atMs)) {
    return { code: 'invalid_time', message: 'The time is not a real date.' };
  }
  if (r.atMs < MIN_TIME_MS) {
    return {
      code: 'time_too_early',
      message:
        'The time is before 2000-01-01T00:00:00Z; check the sensor clock (a clock that lost power often reads 1970).',
    };
  }
  if (r.atMs > nowMs + MAX_FUTURE_MS) {
    return {
      code: 'time_in_future',
      message: 'The time is more than 5 minutes ahead of the server clock; check the sensor clock.',
    };
  }
  if (!(r.rhPct >= RH_MIN_PCT && r.rhPct <= RH_MAX_PCT)) {
    return { code: 'rh_out_of_range', message: 'Relative humidity must be between 0 and 100 %.' };
  }
  if (!inRange(r.airC)) {
    return { code: 'air_out_of_range', message: 'Air temperature must be between −60 and 85 °C.' };
  }
  if (r.surfaceC !== null && !inRange(r.surfaceC)) {
    return {
      code: 'surface_out_of_range',
      message: 'Surface temperature must be between −60 and 85 °C.',
    };
  }
  if (r.batteryV !== null && !(r.batteryV >= BATTERY_MIN_V && r.batteryV <= BATTERY_MAX_V)) {
    return { code: 'battery_out_of_range', message: 'Battery voltage must be between 0 and 24 V.' };
  }
  return null;
}
