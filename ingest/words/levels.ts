/**
 * Level words, in sentence case wherever they stand alone (a card's badge, an alarm's tone);
 * inside a sentence they are lower case ("Machine room wet"). One word per level, and each alarm
 * kind shows the word of the level it borrows its colour from, so colour never speaks alone.
 */
import { ALARM_KIND_LEVEL, type AlarmKind } from '../alarmKinds';
import type { Level } from '../wire/levels';

export const LEVEL_WORDS: Record<Level, string> = {
  dry: 'Dry',
  close: 'Close',
  wet: 'Wet',
  unknown: 'Unknown',
};

/** "wet", for the middle of a sentence. */
export function levelWordInline(level: Level): string {
  return LEVEL_WORDS[level].toLowerCase();
}

/**
 * The level word an alarm kind carries beside its colour, or null for the sensor kinds, whose
 * grey says "no data" and whose name says the rest.
 */
export function alarmLevelWord(kind: AlarmKind): string | null {
  const level = ALARM_KIND_LEVEL[kind];
  return level === 'unknown' ? null : LEVEL_WORDS[level];
}
