/**
 * The PDF's rows of the week report's figures, in the reader's unit. Every number goes through
 * ingest/words' formatters (°C/°F, margins as differences, hours, minutes to acknowledge) and the
 * week report's own words (ingest/words/report.ts), so the PDF, the CSV, the screen and the mail
 * read alike; the times come in already written in the shop's time zone.
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
import {
  ALARM_KIND_WORDS,
  LEVEL_WORDS,
  MISSING,
  REPORT_COLUMNS,
  formatAckMinutes,
  formatHours,
  formatPercent,
  formatTemperature,
} from '@/ingest/words';

/** "8.1 °C / 12.3 °C / 17.0 °C" — lowest, time-weighted mean, highest. */
export function temperatureRangeText(values: MinMeanMax, unit: UnitPref): string {
  return [values.min, values.mean, values.max].map((v) => formatTemperature(v, unit)).join(' / ');
}

/** "55 % / 70 % / 88 %"; EMC takes one decimal ("9.8 %"). */
export function percentRangeText(values: MinMeanMax, digits = 0): string {
  return [values.min, values.mean, values.max].map((v) => formatPercent(v, digits)).join(' / ');
}

export const LEVEL_ORDER: readonly Level[] = ['dry', 'close', 'wet', 'unknown'];

/** "150 h / 12.5 h / 1.5 h / 4 h" in the order dry / close / wet / unknown. */
export function levelHoursText(hours: LevelHours): string {
  return LEVEL_ORDER.map((level) => formatHours(hours[level])).join(' / ');
}

/** The worst level the zone spent any time in; unknown when it had no surface data at all. */
export function worstLevel(hours: LevelHours): Level {
  if (hours.wet > 0) return 'wet';
  if (hours.close > 0) return 'close';
  if (hours.dry > 0) return 'dry';
  return 'unknown';
}

/** A column of the shared report list, by key: its label and its cell, as the CSV has them. */
function column(key: string) {
  const found = REPORT_COLUMNS.find((c) => c.key === key);
  if (!found) throw new Error(`report column ${key} is missing from ingest/words/report.ts`);
  return found;
}

/** "12.5 h; 652 h a year at this rate, category T3 (one week only: an indication)". */
export function timeOfWetnessText(tow: TimeOfWetnessFigures): string {
  const week = formatHours(tow.hours);
  if (tow.annualHours === null || tow.category === null) return week;
  // Upper case as the CSV's category column writes it ("T3").
  return `${week}; ${formatHours(Math.round(tow.annualHours))} a year at this rate, category ${tow.category.toUpperCase()} (one week only: an indication)`;
}

/** "3 opened (Dew risk 2, Wet surface 1)", "none". */
export function alarmsOpenedText(alarms: AlarmWeekFigures): string {
  if (alarms.opened === 0) return 'none';
  const kinds = ALARM_KINDS.filter((kind) => alarms.openedByKind[kind] > 0).map(
    (kind) => `${ALARM_KIND_WORDS[kind]} ${alarms.openedByKind[kind]}`,
  );
  return `${alarms.opened} opened (${kinds.join(', ')}), ${alarms.acknowledged} acknowledged`;
}

export const ackOrMissing = (minutes: number | null) =>
  minutes === null ? MISSING : formatAckMinutes(minutes);

/** "12 min / 1.6 h; 1 not acknowledged". */
export function ackText(alarms: AlarmWeekFigures): string {
  if (alarms.opened === 0) return MISSING;
  const times = `${ackOrMissing(alarms.medianAckMinutes)} / ${ackOrMissing(alarms.longestAckMinutes)}`;
  return alarms.unacknowledged > 0 ? `${times}; ${alarms.unacknowledged} not acknowledged` : times;
}

/** The shared label of the time-of-wetness column without its unit: the value carries "h". */
const towLabel = column('tow_hours')
  .label('C')
  .replace(/ \(h\)$/, '');

/** The figures table's labels; the values carry their units. */
export const PDF_LABELS = {
  coverage: 'Data coverage',
  air: 'Air min / mean / max',
  rh: 'RH min / mean / max',
  lowestMargin: 'Lowest dew margin',
  levelHours: `Hours ${LEVEL_ORDER.map((l) => LEVEL_WORDS[l].toLowerCase()).join(' / ')}`,
  timeOfWetness: towLabel,
  emc: 'Wood EMC min / mean / max',
  alarms: 'Alarms',
  ack: 'To acknowledge median / longest',
  silent: 'Silent periods',
} as const;
