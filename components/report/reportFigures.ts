/**
 * A zone's week figures as label–value rows, the same rows on a phone's card and in the wide
 * table: temperatures in the reader's unit through ingest/words' formatters, times on the shop's
 * clock. Pure: the report, the unit and the zone are arguments.
 */
import { formatInTimeZone } from 'date-fns-tz';

import type { MinMeanMax, ZoneWeekFigures } from '@/components/queries';
import { ALARM_KINDS } from '@/ingest/alarmKinds';
import type { TemperatureUnit } from '@/ingest/units';
import {
  ALARM_KIND_WORDS,
  MISSING,
  formatMargin,
  formatPercent,
  formatTemperature,
} from '@/ingest/words';

import { REPORT_FIGURE_LABELS } from './reportLabels';

export interface FigureRow {
  key: FigureKey;
  label: string;
  value: string;
}

export type FigureKey = keyof ReturnType<typeof REPORT_FIGURE_LABELS>;

/** "Tue 24 Mar 06:52" on the shop's clock. */
export function reportTime(atIso: string, timeZone: string): string {
  return formatInTimeZone(Date.parse(atIso), timeZone, 'EEE d MMM HH:mm');
}

/** Hours as the report writes them: one decimal, "12.5 h". */
export function formatHours(hours: number | null): string {
  if (hours === null || !Number.isFinite(hours)) return MISSING;
  return `${hours.toFixed(1)} h`;
}

/** Minutes to acknowledge: "12 min", "2.5 h" past two hours. */
export function formatAckMinutes(minutes: number | null): string {
  if (minutes === null || !Number.isFinite(minutes)) return MISSING;
  return minutes < 120 ? `${Math.round(minutes)} min` : `${(minutes / 60).toFixed(1)} h`;
}

/** "8.1 °C / 11.3 °C / 14.0 °C", or one dash when the zone sent nothing usable. */
function minMeanMax(figures: MinMeanMax, format: (value: number | null) => string): string {
  if (figures.min === null && figures.mean === null && figures.max === null) return MISSING;
  return [figures.min, figures.mean, figures.max].map(format).join(' / ');
}

/** ISO 9223's time-of-wetness categories are written τ1 … τ5. */
export function towCategoryWord(category: string | null): string {
  return category ? `τ${category.slice(1)}` : MISSING;
}

/** "3: 2 dew risk, 1 wet surface", "0". */
function alarmsOpened(zone: ZoneWeekFigures): string {
  const { opened, openedByKind } = zone.alarms;
  if (opened === 0) return '0';
  const kinds = ALARM_KINDS.filter((kind) => openedByKind[kind] > 0).map(
    (kind) => `${openedByKind[kind]} ${ALARM_KIND_WORDS[kind].toLowerCase()}`,
  );
  return `${opened}: ${kinds.join(', ')}`;
}

/** The rows of one zone's figures, in the order the card and the table show them. */
export function zoneFigureRows(
  zone: ZoneWeekFigures,
  unit: TemperatureUnit,
  timeZone: string,
): FigureRow[] {
  const labels = REPORT_FIGURE_LABELS(unit);
  const tow = zone.timeOfWetness;
  const silentHours = zone.silentPeriods.reduce((sum, period) => sum + period.hours, 0);
  const values: Record<FigureKey, string> = {
    coverage: formatPercent(zone.coveragePct),
    lowestMargin: zone.lowestMargin
      ? `${formatMargin(zone.lowestMargin.marginK, unit)}, ${reportTime(zone.lowestMargin.at, timeZone)}`
      : MISSING,
    air: minMeanMax(zone.airC, (c) => formatTemperature(c, unit)),
    rh: minMeanMax(zone.rhPct, (pct) => formatPercent(pct)),
    emc: minMeanMax(zone.emcPct, (pct) => formatPercent(pct, 1)),
    timeOfWetness:
      tow.category === null
        ? formatHours(tow.hours)
        : `${formatHours(tow.hours)}, ${towCategoryWord(tow.category)}`,
    alarmsOpened: alarmsOpened(zone),
    ackTimes:
      zone.alarms.acknowledged === 0
        ? MISSING
        : `${formatAckMinutes(zone.alarms.medianAckMinutes)} / ${formatAckMinutes(zone.alarms.longestAckMinutes)}`,
    unacknowledged: String(zone.alarms.unacknowledged),
    silent:
      zone.silentPeriods.length === 0
        ? '0'
        : `${zone.silentPeriods.length}, ${formatHours(silentHours)}`,
  };
  return (Object.keys(values) as FigureKey[]).map((key) => ({
    key,
    label: labels[key],
    value: values[key],
  }));
}
