/**
 * The week report's columns: each figure's label with its unit in the reader's scale and its
 * value converted to that scale — one list for the CSV, the PDF and the Report screen, so the
 * three name and convert every figure the same way. Re-exported by ./report.
 */
import { formatInTimeZone } from 'date-fns-tz';

import { ALARM_KINDS, type AlarmKind } from '../alarmKinds';
import { cToF, kToFDelta, type TemperatureUnit } from '../units';
import type { ShopWeekFigures, ZoneWeekFigures } from '../wire/reports';
import { ALARM_KIND_WORDS } from './alarms';
import { PURPOSE_WORDS } from './zones';

/** "2026-03-24 06:10" in the shop's time zone: the CSV's and the table's time cells. */
export function formatReportTime(at: string, timeZone: string): string {
  return formatInTimeZone(new Date(at), timeZone, 'yyyy-MM-dd HH:mm');
}

/** What a column holds, so each output can align, convert and neutralise it properly. */
export type ReportCellKind = 'text' | 'number' | 'time';

/** A cell's value in the reader's unit; null when the figure does not exist (no data). */
export type ReportCell = string | number | null;

export interface ReportColumn {
  key: string;
  kind: ReportCellKind;
  /** The header, with the unit: "Air min (°F)". */
  label: (unit: TemperatureUnit) => string;
  /** A zone's value in the reader's unit (temperatures converted, differences scaled). */
  zone: (z: ZoneWeekFigures, unit: TemperatureUnit, timeZone: string) => ReportCell;
  /** The shop-wide value, where the shop-wide line has one. */
  shop?: (s: ShopWeekFigures, unit: TemperatureUnit, timeZone: string) => ReportCell;
}

const temp = (c: number | null, unit: TemperatureUnit) =>
  c === null ? null : unit === 'F' ? cToF(c) : c;
const diff = (k: number | null, unit: TemperatureUnit) =>
  k === null ? null : unit === 'F' ? kToFDelta(k) : k;

const alarmColumn = (kind: AlarmKind): ReportColumn => ({
  key: `alarms_${kind}`,
  kind: 'number',
  label: () => `${ALARM_KIND_WORDS[kind]} alarms opened`,
  zone: (z) => z.alarms.openedByKind[kind],
});

/**
 * The report's columns, in order. A dew margin is a difference: in °F it is scaled ×1.8 with no
 * offset, and labelled as a difference so it never reads like an air temperature.
 */
export const REPORT_COLUMNS: readonly ReportColumn[] = [
  { key: 'zone', kind: 'text', label: () => 'Zone', zone: (z) => z.name },
  {
    key: 'purpose',
    kind: 'text',
    label: () => 'Purpose',
    zone: (z) => PURPOSE_WORDS[z.purpose],
  },
  { key: 'readings', kind: 'number', label: () => 'Readings', zone: (z) => z.readings },
  {
    key: 'coverage',
    kind: 'number',
    label: () => 'Data coverage (%)',
    zone: (z) => z.coveragePct,
    shop: (s) => s.coveragePct,
  },
  ...(['min', 'mean', 'max'] as const).map((m): ReportColumn => ({
    key: `air_${m}`,
    kind: 'number',
    label: (u) => `Air ${m} (°${u})`,
    zone: (z, u) => temp(z.airC[m], u),
  })),
  ...(['min', 'mean', 'max'] as const).map((m): ReportColumn => ({
    key: `rh_${m}`,
    kind: 'number',
    label: () => `RH ${m} (%)`,
    zone: (z) => z.rhPct[m],
  })),
  ...(['min', 'mean', 'max'] as const).map((m): ReportColumn => ({
    key: `emc_${m}`,
    kind: 'number',
    label: () => `Wood EMC ${m} (%)`,
    zone: (z) => z.emcPct[m],
  })),
  {
    key: 'lowest_margin',
    kind: 'number',
    label: (u) => `Lowest dew margin (°${u} difference)`,
    zone: (z, u) => diff(z.lowestMargin?.marginK ?? null, u),
    shop: (s, u) => diff(s.lowestMargin?.marginK ?? null, u),
  },
  {
    key: 'lowest_margin_at',
    kind: 'time',
    label: () => 'Lowest dew margin at (shop time)',
    zone: (z, _u, tz) => (z.lowestMargin ? formatReportTime(z.lowestMargin.at, tz) : null),
    shop: (s, _u, tz) => (s.lowestMargin ? formatReportTime(s.lowestMargin.at, tz) : null),
  },
  {
    key: 'hours_dry',
    kind: 'number',
    label: () => 'Dry (h)',
    zone: (z) => z.levelHours.dry,
  },
  {
    key: 'hours_close',
    kind: 'number',
    label: () => 'Close (h)',
    zone: (z) => z.levelHours.close,
    shop: (s) => s.closeHours,
  },
  {
    key: 'hours_wet',
    kind: 'number',
    label: () => 'Wet (h)',
    zone: (z) => z.levelHours.wet,
    shop: (s) => s.wetHours,
  },
  {
    key: 'hours_unknown',
    kind: 'number',
    label: () => 'Unknown or no data (h)',
    zone: (z) => z.levelHours.unknown,
  },
  {
    key: 'tow_hours',
    kind: 'number',
    label: () => 'Time of wetness, ISO 9223: RH > 80 % and air > 0 °C (h)',
    zone: (z) => z.timeOfWetness.hours,
  },
  {
    key: 'tow_annual',
    kind: 'number',
    label: () => 'Time of wetness per year at this rate (h)',
    zone: (z) => z.timeOfWetness.annualHours,
  },
  {
    key: 'tow_category',
    kind: 'text',
    label: () => 'Time-of-wetness category, ISO 9223 (one week only: an indication)',
    zone: (z) => z.timeOfWetness.category?.toUpperCase() ?? null,
  },
  {
    key: 'alarms_opened',
    kind: 'number',
    label: () => 'Alarms opened',
    zone: (z) => z.alarms.opened,
    shop: (s) => s.alarmsOpened,
  },
  ...ALARM_KINDS.map(alarmColumn),
  {
    key: 'alarms_acknowledged',
    kind: 'number',
    label: () => 'Alarms acknowledged',
    zone: (z) => z.alarms.acknowledged,
  },
  {
    key: 'ack_median',
    kind: 'number',
    label: () => 'Median time to acknowledge (min)',
    zone: (z) => z.alarms.medianAckMinutes,
    shop: (s) => s.medianAckMinutes,
  },
  {
    key: 'ack_longest',
    kind: 'number',
    label: () => 'Longest time to acknowledge (min)',
    zone: (z) => z.alarms.longestAckMinutes,
  },
  {
    key: 'unacknowledged',
    kind: 'number',
    label: () => 'Alarms not acknowledged',
    zone: (z) => z.alarms.unacknowledged,
    shop: (s) => s.unacknowledged,
  },
  {
    key: 'silent_periods',
    kind: 'number',
    label: () => 'Silent periods (over 15 min)',
    zone: (z) => z.silentPeriods.length,
  },
  {
    key: 'silent_hours',
    kind: 'number',
    label: () => 'Silent (h)',
    zone: (z) => z.silentPeriods.reduce((sum, p) => sum + p.hours, 0),
  },
  {
    key: 'verdict',
    kind: 'text',
    label: () => 'Verdict',
    zone: (z) => z.verdict,
    shop: (s) => s.verdict,
  },
];

/** The first cell of the shop-wide line, which says what the line is. */
export const SHOP_WIDE_LABEL = 'Whole shop (all zones)';
