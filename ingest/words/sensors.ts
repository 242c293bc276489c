import { cToF, type TemperatureUnit } from '../units';

/**
 * Words about sensors and their readings' age, the same on the zone cards and the sensors screen.
 * Ages arrive already written ("47 min ago"); these give them their frame.
 */

/** Under a zone card: "Last reading 47 min ago". */
export function lastReadingText(age: string): string {
  return `Last reading ${age}`;
}

/** Beside a stale card's age: why it is grey and what to do. */
export const STALE_READING_NOTE = 'Stale: its sensors have gone quiet. Check power and network.';

/** The token screen, once the new sensor's first reading is stored. */
export function firstReadingText(age: string): string {
  return `First reading received ${age}.`;
}

/** A posting interval in plain words: "every 5 min", "every 30 s", "every 1 h 30 min". */
export function intervalWords(seconds: number): string {
  const s = Math.round(seconds);
  if (s < 60) return `every ${s} s`;
  if (s < 3600) {
    const min = Math.floor(s / 60);
    const rest = s % 60;
    return rest === 0 ? `every ${min} min` : `every ${min} min ${rest} s`;
  }
  const h = Math.floor(s / 3600);
  const min = Math.round((s % 3600) / 60);
  return min === 0 ? `every ${h} h` : `every ${h} h ${min} min`;
}

/** What each field of a reading is, for the token screen (units and ranges come from payload.ts). */
export const READING_FIELD_WORDS = {
  air: 'Air temperature',
  rh: 'Relative humidity',
  surface: 'Surface temperature, from a probe on the metal (left out, Drybench estimates it)',
  battery: 'Battery voltage',
  at: 'When it was measured: ISO 8601 with Z or an offset, or epoch seconds (left out, the time it arrives)',
  unit: '"C" (the default) or "F", for air and surface',
} as const;

/**
 * The token screen's example reading: air 18 °C at 50 % RH over a 17 °C surface. Its dew point
 * is about 7.4 °C, so the margin of about 9.6 K leaves a new zone dry under the default limits
 * (checked against ingest/derive.ts in tests/ingest/sensorWords.test.ts) — a first reading
 * should show a working sensor, not an alarm.
 */
export const EXAMPLE_READING_C = { air: 18, rh: 50, surface: 17 } as const;

/** The example as the JSON a sensor sends, in the reader's unit ("unit": "F" when °F). */
export function exampleReadingJson(unit: TemperatureUnit): string {
  const { air, rh, surface } = EXAMPLE_READING_C;
  if (unit === 'C') return JSON.stringify({ air, rh, surface });
  const f = (c: number) => Math.round(cToF(c) * 10) / 10;
  return JSON.stringify({ unit: 'F', air: f(air), rh, surface: f(surface) });
}
