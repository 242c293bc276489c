/**
 * The numbers and field names of a sensor reading (shared/API.md), without zod: the payload
 * schema (payload.ts) checks them and the token screen shows them, from this one source.
 */

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
export const RH_MIN_PCT = 0;
export const RH_MAX_PCT = 100;

/** Battery volts a reading may carry: 0 V (dead) to 24 V (the largest pack a shop sensor uses). */
export const BATTERY_MIN_V = 0;
export const BATTERY_MAX_V = 24;

/** The fields a reading may name; anything else is refused (`unknown_field`). */
export const READING_FIELDS = ['at', 'air', 'rh', 'surface', 'battery'] as const;
/** The fields of the batch form's envelope. */
export const ENVELOPE_FIELDS = ['unit', 'readings'] as const;
export type ReadingField = (typeof READING_FIELDS)[number];

/**
 * What each field means, for the token screen and the contract: one source, so a screen never
 * retypes a unit or a range. Ranges are the per-reading checks (payload.ts checkReading).
 */
export const READING_FIELD_GUIDE: readonly {
  field: ReadingField | 'unit';
  required: boolean;
  /** How the value is given; temperatures follow `unit`. */
  kind: 'time' | 'temperature' | 'percent' | 'volts' | 'unit';
  min?: number;
  max?: number;
}[] = [
  {
    field: 'air',
    required: true,
    kind: 'temperature',
    min: TEMPERATURE_MIN_C,
    max: TEMPERATURE_MAX_C,
  },
  { field: 'rh', required: true, kind: 'percent', min: RH_MIN_PCT, max: RH_MAX_PCT },
  {
    field: 'surface',
    required: false,
    kind: 'temperature',
    min: TEMPERATURE_MIN_C,
    max: TEMPERATURE_MAX_C,
  },
  { field: 'battery', required: false, kind: 'volts', min: BATTERY_MIN_V, max: BATTERY_MAX_V },
  { field: 'at', required: false, kind: 'time' },
  { field: 'unit', required: false, kind: 'unit' },
];
