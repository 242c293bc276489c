/**
 * The week report's words: the column labels with their units (one list for the CSV, the PDF
 * and the Report screen), the daylight-saving note and the plain verdicts written from the
 * figures in the reader's unit. The figures themselves arrive in °C, K, %, hours and minutes
 * (ingest/wire/reports.ts); only what is shown here is converted.
 */
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';

import { ALARM_KINDS, type AlarmKind } from '../alarmKinds';
import { addDays, weekBounds } from '../reportWeek';
import { cToF, kToFDelta, type TemperatureUnit } from '../units';
import type { ShopWeekFigures, WeekReport, ZoneWeekFigures } from '../wire/reports';
import { CAUTIONS } from './advice';
import { ALARM_KIND_WORDS } from './alarms';
import { deltaInUnit, formatPercent } from './format';
import { PURPOSE_WORDS } from './zones';

const HOUR_MS = 3_600_000;

/** Hours as people read them: "2.5 h", "12 h", "0 h". */
export function formatHours(hours: number): string {
  const text = hours.toFixed(1).replace(/\.0$/, '');
  return `${text === '-0' ? '0' : text} h`;
}

/** Minutes to acknowledge: "12 min", "1.5 h" from 90 min on. */
export function formatAckMinutes(minutes: number): string {
  return minutes >= 90 ? formatHours(minutes / 60) : `${Math.round(minutes)} min`;
}

/** "Tuesday at 06:10" in the shop's time zone. */
export function formatReportMoment(at: string, timeZone: string): string {
  return formatInTimeZone(new Date(at), timeZone, "EEEE 'at' HH:mm");
}

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

/**
 * "This week had 167 hours: clocks went forward on Sunday 29 March." when the week is not 168
 * hours long, else null. The day named is the one whose local midnight-to-midnight is not 24 h.
 */
export function weekNote(start: string, timeZone: string): string | null {
  const week = weekBounds(start, timeZone);
  if (week.hours === 168) return null;
  for (let i = 0; i < 7; i++) {
    const day = addDays(start, i);
    const dayHours =
      (localMidnightMs(addDays(day, 1), timeZone) - localMidnightMs(day, timeZone)) / HOUR_MS;
    if (dayHours !== 24) {
      const when = formatInTimeZone(new Date(`${day}T12:00:00Z`), 'UTC', 'EEEE d MMMM');
      const way = dayHours < 24 ? 'forward' : 'back';
      return `This week had ${week.hours} hours: clocks went ${way} on ${when}.`;
    }
  }
  return `This week had ${week.hours} hours.`;
}

const localMidnightMs = (day: string, timeZone: string) =>
  fromZonedTime(`${day}T00:00:00`, timeZone).getTime();

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** How the alarms went, in one sentence: "2 alarms, answered in 12 min at the median." */
function alarmSentence(a: {
  opened: number;
  medianAckMinutes: number | null;
  unacknowledged: number;
}): string {
  if (a.opened === 0) return 'No alarms.';
  if (a.medianAckMinutes === null) {
    return `${plural(a.opened, 'alarm')}, ${a.opened === 1 ? 'not' : 'none'} acknowledged.`;
  }
  const answered = `answered in ${formatAckMinutes(a.medianAckMinutes)} at the median`;
  const open = a.unacknowledged > 0 ? `; ${a.unacknowledged} not acknowledged yet` : '';
  return `${plural(a.opened, 'alarm')}, ${answered}${open}.`;
}

/** A zone's verdict: a few plain sentences from its figures, in the reader's unit. */
export function zoneVerdict(
  z: Omit<ZoneWeekFigures, 'verdict'>,
  unit: TemperatureUnit,
  timeZone: string,
): string {
  if (z.readings === 0) {
    return `No readings from ${z.name} in this period: nothing is known about it, so it cannot be called dry.`;
  }
  const parts: string[] = [];
  if (z.lowestMargin) {
    const when = formatReportMoment(z.lowestMargin.at, timeZone);
    const gap = `${deltaInUnit(Math.abs(z.lowestMargin.marginK), unit)} °${unit}`;
    parts.push(
      z.lowestMargin.marginK > 0
        ? `The iron came within ${gap} of the dew point on ${when}`
        : z.lowestMargin.marginK === 0
          ? `The iron reached the dew point on ${when}`
          : `The iron went ${gap} below the dew point on ${when}`,
    );
    const h = z.levelHours;
    parts[0] +=
      h.wet > 0
        ? ` and was wet for ${formatHours(h.wet)}.`
        : h.close > 0
          ? ` and was close for ${formatHours(h.close)}, never wet.`
          : ', and it stayed dry.';
  } else {
    parts.push('No surface temperature came in, so the dew margin is unknown.');
  }
  if (z.timeOfWetness.hours > 0) {
    parts.push(
      `The air was damp enough for rust (RH over 80 %) for ${formatHours(z.timeOfWetness.hours)}.`,
    );
  }
  if (z.coveragePct < 95) {
    const silentHours = z.silentPeriods.reduce((sum, p) => sum + p.hours, 0);
    parts.push(
      `Readings covered ${formatPercent(z.coveragePct)} of the time` +
        (z.silentPeriods.length > 0
          ? ` (${plural(z.silentPeriods.length, 'silent period')}, ${formatHours(silentHours)}).`
          : '.'),
    );
  }
  parts.push(alarmSentence(z.alarms));
  return parts.join(' ');
}

/**
 * The shop's verdict. When any iron was wet or close it suggests warming or drying, so it
 * carries the heater and dehumidifier cautions (ingest/words/advice.ts) with it.
 */
export function shopVerdict(
  s: Omit<ShopWeekFigures, 'verdict'>,
  unit: TemperatureUnit,
  timeZone: string,
): string {
  if (s.zones === 0) return 'This shop has no zones yet.';
  const parts: string[] = [];
  if (s.lowestMargin) {
    const when = formatReportMoment(s.lowestMargin.at, timeZone);
    const gap = `${deltaInUnit(Math.abs(s.lowestMargin.marginK), unit)} °${unit}`;
    const where =
      s.lowestMargin.marginK > 0
        ? `within ${gap} of the dew point`
        : s.lowestMargin.marginK === 0
          ? 'the dew point'
          : `${gap} below the dew point`;
    parts.push(`Closest approach: ${s.lowestMargin.zoneName} came ${where} on ${when}.`);
  } else {
    parts.push('No surface temperature came in this period, so no dew margin is known.');
  }
  parts.push(
    s.zonesWet > 0
      ? `${plural(s.zonesWet, 'zone')} had wet iron, ${formatHours(s.wetHours)} in all.`
      : s.closeHours > 0
        ? `No iron was wet; ${formatHours(s.closeHours)} close to the dew point.`
        : 'No iron was wet or close.',
  );
  parts.push(`Readings covered ${formatPercent(s.coveragePct)} of the time.`);
  parts.push(alarmSentence({ ...s, opened: s.alarmsOpened }));
  if (s.zonesWet > 0 || s.closeHours > 0) {
    parts.push(
      'Warm the shop slowly or dry the air before the iron sweats, and cover or wax the tops.',
      CAUTIONS.fuelHeaters,
      CAUTIONS.appliancesAndCodes,
    );
  }
  return parts.join(' ');
}

/** The title of a report: "Week of Monday 23 March 2026". */
export function reportTitle(report: Pick<WeekReport, 'week'>): string {
  const when = formatInTimeZone(new Date(`${report.week.start}T12:00:00Z`), 'UTC', 'd MMMM yyyy');
  return `Week of Monday ${when}`;
}
