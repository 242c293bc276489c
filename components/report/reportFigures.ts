/**
 * A zone's week figures as the screen shows them: named by the report's own column labels
 * (ingest/words/report.ts, the same headers as the CSV and the PDF), written with the shared
 * formatters in the reader's unit, times on the shop's clock. The figures come in groups that
 * sit side by side (min, mean and max in one row on a phone; one table per section on a wide
 * screen). Pure: the report, the unit and the zone are arguments.
 */
import { formatInTimeZone } from 'date-fns-tz';

import type { ShopWeekFigures, ZoneWeekFigures } from '@/components/queries';
import { ALARM_KINDS } from '@/ingest/alarmKinds';
import type { TemperatureUnit } from '@/ingest/units';
import {
  ALARM_KIND_WORDS,
  MISSING,
  REPORT_COLUMNS,
  formatHours,
  formatMargin,
  formatPercent,
  formatReportTime,
  formatTemperature,
} from '@/ingest/words';

export interface Figure {
  /** The report column it shows (REPORT_COLUMNS' key). */
  key: string;
  label: string;
  value: string;
}

type Show = (zone: ZoneWeekFigures, unit: TemperatureUnit, timeZone: string) => string;

const orMissing = <T>(value: T | null, show: (v: T) => string) =>
  value === null ? MISSING : show(value);

/** Whole minutes, as the column's "(min)" header says: "95 min", never "1.6 h" under it. */
const minutes = (value: number) => `${Math.round(value)} min`;

/** "3 (2 dew risk, 1 wet surface)", "0". */
function alarmsOpened(zone: ZoneWeekFigures): string {
  const { opened, openedByKind } = zone.alarms;
  const kinds = ALARM_KINDS.filter((kind) => openedByKind[kind] > 0).map(
    (kind) => `${openedByKind[kind]} ${ALARM_KIND_WORDS[kind].toLowerCase()}`,
  );
  return kinds.length === 0 ? String(opened) : `${opened} (${kinds.join(', ')})`;
}

/** How each shown column writes its value; the keys are REPORT_COLUMNS' own. */
const SHOW: Record<string, Show> = {
  zone: (z) => z.name,
  coverage: (z) => formatPercent(z.coveragePct),
  air_min: (z, u) => formatTemperature(z.airC.min, u),
  air_mean: (z, u) => formatTemperature(z.airC.mean, u),
  air_max: (z, u) => formatTemperature(z.airC.max, u),
  rh_min: (z) => formatPercent(z.rhPct.min),
  rh_mean: (z) => formatPercent(z.rhPct.mean),
  rh_max: (z) => formatPercent(z.rhPct.max),
  emc_min: (z) => formatPercent(z.emcPct.min, 1),
  emc_mean: (z) => formatPercent(z.emcPct.mean, 1),
  emc_max: (z) => formatPercent(z.emcPct.max, 1),
  lowest_margin: (z, u) => formatMargin(z.lowestMargin?.marginK, u),
  lowest_margin_at: (z, _u, tz) => orMissing(z.lowestMargin, (m) => formatReportTime(m.at, tz)),
  hours_dry: (z) => formatHours(z.levelHours.dry),
  hours_close: (z) => formatHours(z.levelHours.close),
  hours_wet: (z) => formatHours(z.levelHours.wet),
  hours_unknown: (z) => formatHours(z.levelHours.unknown),
  tow_hours: (z) => formatHours(z.timeOfWetness.hours),
  tow_category: (z) => orMissing(z.timeOfWetness.category, (c) => c.toUpperCase()),
  alarms_opened: alarmsOpened,
  unacknowledged: (z) => String(z.alarms.unacknowledged),
  ack_median: (z) => orMissing(z.alarms.medianAckMinutes, minutes),
  ack_longest: (z) => orMissing(z.alarms.longestAckMinutes, minutes),
  silent_periods: (z) => String(z.silentPeriods.length),
  silent_hours: (z) => formatHours(z.silentPeriods.reduce((sum, p) => sum + p.hours, 0)),
};

export interface FigureSection {
  title: string;
  /** Rows of figures that sit side by side; each key is a REPORT_COLUMNS key. */
  rows: string[][];
}

/** What the screen shows of a zone, by section; the CSV and the PDF hold every column. */
export const FIGURE_SECTIONS: readonly FigureSection[] = [
  {
    title: 'Air and wood',
    rows: [
      ['coverage'],
      ['lowest_margin', 'lowest_margin_at'],
      ['air_min', 'air_mean', 'air_max'],
      ['rh_min', 'rh_mean', 'rh_max'],
      ['emc_min', 'emc_mean', 'emc_max'],
    ],
  },
  {
    title: 'Levels and wetness',
    rows: [
      ['hours_dry', 'hours_close', 'hours_wet', 'hours_unknown'],
      ['tow_hours', 'tow_category'],
    ],
  },
  {
    title: 'Alarms and silences',
    rows: [
      ['alarms_opened', 'unacknowledged'],
      ['ack_median', 'ack_longest'],
      ['silent_periods', 'silent_hours'],
    ],
  },
];

const COLUMNS = new Map(REPORT_COLUMNS.map((column) => [column.key, column]));

/** The column's header in the reader's unit: "Air min (°F)". */
export function figureLabel(key: string, unit: TemperatureUnit): string {
  const column = COLUMNS.get(key);
  if (!column) throw new Error(`no report column ${key}`);
  return column.label(unit);
}

/** One figure of a zone, named and written in the reader's unit. */
export function zoneFigure(
  zone: ZoneWeekFigures,
  key: string,
  unit: TemperatureUnit,
  timeZone: string,
): Figure {
  const show = SHOW[key];
  if (!show) throw new Error(`no way to show ${key}`);
  return { key, label: figureLabel(key, unit), value: show(zone, unit, timeZone) };
}

type ShowShop = (shop: ShopWeekFigures, unit: TemperatureUnit, timeZone: string) => string;

/** The whole shop's line: the report columns that have a shop-wide value, in rows. */
const SHOW_SHOP: Record<string, ShowShop> = {
  lowest_margin: (s, u) =>
    orMissing(s.lowestMargin, (m) => `${formatMargin(m.marginK, u)} (${m.zoneName})`),
  lowest_margin_at: (s, _u, tz) => orMissing(s.lowestMargin, (m) => formatReportTime(m.at, tz)),
  hours_wet: (s) => formatHours(s.wetHours),
  hours_close: (s) => formatHours(s.closeHours),
  coverage: (s) => formatPercent(s.coveragePct),
  alarms_opened: (s) => String(s.alarmsOpened),
  unacknowledged: (s) => String(s.unacknowledged),
  ack_median: (s) => orMissing(s.medianAckMinutes, minutes),
};

export const SHOP_FIGURE_ROWS: readonly string[][] = [
  ['lowest_margin', 'lowest_margin_at'],
  ['hours_wet', 'hours_close'],
  ['coverage'],
  ['alarms_opened', 'unacknowledged'],
  ['ack_median'],
];

/** One shop-wide figure, named by its report column. */
export function shopFigure(
  shop: ShopWeekFigures,
  key: string,
  unit: TemperatureUnit,
  timeZone: string,
): Figure {
  const show = SHOW_SHOP[key];
  if (!show) throw new Error(`no shop-wide ${key}`);
  return { key, label: figureLabel(key, unit), value: show(shop, unit, timeZone) };
}

/** "Tue 24 Mar 06:52" on the shop's clock: a silent period's ends. */
export function reportClock(atIso: string, timeZone: string): string {
  return formatInTimeZone(Date.parse(atIso), timeZone, 'EEE d MMM HH:mm');
}
