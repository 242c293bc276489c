/**
 * Words about sensors and their readings' age, the same on the zone cards and the sensors screen.
 * Ages arrive already written ("47 min ago"); these give them their frame.
 */

/** Under a zone card: "Last reading 47 min ago". */
export function lastReadingText(age: string): string {
  return `Last reading ${age}`;
}

/** Beside a stale card's age: why it is grey and what to do. */
export const STALE_READING_NOTE =
  'Stale: older than its sensors normally go quiet. Check the sensor, its power and its network.';

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
