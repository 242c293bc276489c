/**
 * The sensor payload of POST /api/v1/ingest (see the HTTP contract): a batch
 * `{ unit, readings: [...] }` or one reading object with an optional `unit` beside it.
 *
 * Two layers, because the contract treats them differently: the envelope (types, shape)
 * fails the whole request with 400; the per-reading range checks reject only that reading.
 */
import { z } from 'zod';

import { fToC, type TemperatureUnit } from './units';

/** Readings more than this far ahead of the server clock are refused: a sensor clock gone wrong. */
export const MAX_FUTURE_MS = 5 * 60 * 1000;
/**
 * Readings dated before this are refused (the contract's lower bound, 2000-01-01T00:00:00Z): a
 * sensor that lost its clock reports 1970 or year 1, and PostgreSQL cannot even store some such
 * instants (timestamptz starts at 4713 BC), so they must never reach the group INSERT.
 */
export const MIN_TIME_MS = Date.UTC(2000, 0, 1);
export const MAX_READINGS_PER_REQUEST = 1000;
export const TEMPERATURE_MIN_C = -60;
export const TEMPERATURE_MAX_C = 85;

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
}

export type EnvelopeResult =
  | { ok: true; readings: SensorReading[] }
  | { ok: false; issues: { path: string; message: string }[] };

/** True when the body is an object that names a `readings` field (the batch form). */
function isBatch(body: unknown): boolean {
  return typeof body === 'object' && body !== null && !Array.isArray(body) && 'readings' in body;
}

/**
 * Parse the envelope. `receivedAtMs` stands in for a missing `at`, so a sensor without a clock
 * still gets a correctly timed reading.
 */
export function parseEnvelope(body: unknown, receivedAtMs: number): EnvelopeResult {
  const parsed = isBatch(body)
    ? batchSchema.safeParse(body)
    : singleSchema
        .transform(({ unit, ...reading }) => ({ unit, readings: [reading] }))
        .safeParse(body);
  if (!parsed.success) {
    return {
      ok: false,
      issues: parsed.error.issues.map((issue) => ({
        path: issue.path.join('.'),
        message: issue.message,
      })),
    };
  }
  const { unit, readings } = parsed.data;
  return { ok: true, readings: readings.map((r) => normalizeReading(r, unit, receivedAtMs)) };
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
}

const inRange = (v: number) => v >= TEMPERATURE_MIN_C && v <= TEMPERATURE_MAX_C;

/** The per-reading checks of the contract; null when the reading may be stored. */
export function checkReading(r: SensorReading, nowMs: number): Rejection | null {
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
  if (!(r.rhPct >= 0 && r.rhPct <= 100)) {
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
  if (r.batteryV !== null && !(r.batteryV >= 0 && r.batteryV <= 24)) {
    return { code: 'battery_out_of_range', message: 'Battery voltage must be between 0 and 24 V.' };
  }
  return null;
}
