/**
 * The PDF's own phrasing of the week report's figures, in the reader's unit. Numbers go through
 * ingest/words' formatters (°C/°F, margins as differences); the times come in already written in
 * the shop's time zone by the caller, so these stay pure.
 */
import { ALARM_KINDS } from '@/ingest/alarmKinds';
import type { Level } from '@/ingest/wire/levels';
import type { UnitPref } from '@/ingest/wire/people';
import type {
  AlarmWeekFigures,
  LevelHours,
  MinMeanMax,
  TimeOfWetnessFigures,
} from '@/ingest/wire/reports';
import type { TowCategory } from '@/ingest/wetness';
import {
  ALARM_KIND_WORDS,
  LEVEL_WORDS,
  MISSING,
  formatPercent,
  formatTemperature,
} from '@/ingest/words';

/** Hours with one decimal: a 15 min gap cap makes finer steps meaningless. "12.5 h". */
export function hoursText(hours: number): string {
  return `${hours.toFixed(1)} h`;
}

/** "12 min", "2 h 05 min", "—". */
export function minutesText(minutes: number | null): string {
  if (minutes === null || !Number.isFinite(minutes)) return MISSING;
  const whole = Math.round(minutes);
  if (whole < 60) return `${whole} min`;
  return `${Math.floor(whole / 60)} h ${String(whole % 60).padStart(2, '0')} min`;
}

/** "8.1 °C / 12.3 °C / 17.0 °C" — lowest, time-weighted mean, highest. */
export function temperatureRangeText(values: MinMeanMax, unit: UnitPref): string {
  return [values.min, values.mean, values.max].map((v) => formatTemperature(v, unit)).join(' / ');
}

/** "55 % / 70 % / 88 %"; EMC takes one decimal ("9.8 %"). */
export function percentRangeText(values: MinMeanMax, digits = 0): string {
  return [values.min, values.mean, values.max].map((v) => formatPercent(v, digits)).join(' / ');
}

export const LEVEL_ORDER: readonly Level[] = ['dry', 'close', 'wet', 'unknown'];

/** "150.0 / 12.5 / 1.5 / 4.0 h" in the order dry / close / wet / unknown. */
export function levelHoursText(hours: LevelHours): string {
  return `${LEVEL_ORDER.map((level) => hours[level].toFixed(1)).join(' / ')} h`;
}

/** The worst level the zone spent any time in; unknown when it had no surface data at all. */
export function worstLevel(hours: LevelHours): Level {
  if (hours.wet > 0) return 'wet';
  if (hours.close > 0) return 'close';
  if (hours.dry > 0) return 'dry';
  return 'unknown';
}

/** ISO 9223:1992 writes its time-of-wetness categories τ1 … τ5. */
export function towCategoryText(category: TowCategory): string {
  return `τ${category.slice(1)}`;
}

/** "12.5 h; 650 h a year at this rate: ISO 9223 τ3 (from one week)". */
export function timeOfWetnessText(tow: TimeOfWetnessFigures): string {
  const week = hoursText(tow.hours);
  if (tow.annualHours === null || tow.category === null) return week;
  return `${week}; ${Math.round(tow.annualHours)} h a year at this rate: ISO 9223 ${towCategoryText(tow.category)} (from one week)`;
}

/** "3 opened (Dew risk 2, Wet surface 1)", "none". */
export function alarmsOpenedText(alarms: AlarmWeekFigures): string {
  if (alarms.opened === 0) return 'none';
  const kinds = ALARM_KINDS.filter((kind) => alarms.openedByKind[kind] > 0).map(
    (kind) => `${ALARM_KIND_WORDS[kind]} ${alarms.openedByKind[kind]}`,
  );
  return `${alarms.opened} opened (${kinds.join(', ')})`;
}

/** "12 min / 40 min; 1 not acknowledged". */
export function ackText(alarms: AlarmWeekFigures): string {
  if (alarms.opened === 0) return MISSING;
  const times = `${minutesText(alarms.medianAckMinutes)} / ${minutesText(alarms.longestAckMinutes)}`;
  return alarms.unacknowledged > 0 ? `${times}; ${alarms.unacknowledged} not acknowledged` : times;
}

/** The figures table's labels; each names its unit or its parts' order. */
export const PDF_LABELS = {
  coverage: 'Data coverage',
  air: 'Air min / mean / max',
  rh: 'RH min / mean / max',
  lowestMargin: 'Lowest dew margin',
  levelHours: `Hours ${LEVEL_ORDER.map((l) => LEVEL_WORDS[l].toLowerCase()).join(' / ')}`,
  timeOfWetness: 'Time of wetness',
  emc: 'Wood EMC min / mean / max',
  alarms: 'Alarms',
  ack: 'To acknowledge median / longest',
  silent: 'Silent periods',
  verdict: 'Verdict',
} as const;
