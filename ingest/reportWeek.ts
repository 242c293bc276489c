/**
 * The week report's calendar and its figures, computed in JavaScript. The server computes the
 * same figures in SQL (db/queries/reports.ts) without loading the week's rows; this is the
 * reference that a test holds the SQL to, and the one place the rule is written down.
 *
 * The week: Monday 00:00 to the next Monday 00:00, shop-local (IANA time zone). Across a
 * daylight-saving change it has 167 or 169 hours, not 168.
 *
 * The rule for a zone's figures (the same as time of wetness, ingest/wetness.ts):
 * - the readings of all the zone's sensors in [from, end) are merged in time order, ties broken
 *   by sensor id;
 * - each reading stands until the zone's next reading or the period end, capped at `maxGapMs`
 *   (TOW_MAX_GAP_MS, 15 min); two readings at the same instant give the first one no time;
 * - time beyond the cap, and the time from the period start to the first reading, is a gap: no
 *   reading stands for it, so it is not covered, its level is unknown and it counts in no mean;
 * - means are weighted by each reading's time; min and max take every reading in the period;
 * - hours per level use the level stored with each reading; unknown = period − dry − close − wet;
 * - a silent period is a stretch no reading stands for that is longer than the cap: from the
 *   period start to the first reading, from a reading's cap to the next reading, or from the
 *   last reading's cap to the period end (the whole period when there is no reading).
 */
import { fromZonedTime, toZonedTime } from 'date-fns-tz';

import type { Level } from './levels';
import { annualWetHours, timeOfWetness } from './wetness';

const HOUR_MS = 3_600_000;
const DAY_MS = 24 * HOUR_MS;
const DATE_RE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** A calendar date YYYY-MM-DD that exists (no 2026-02-30); false otherwise. */
export function isCalendarDate(date: string): boolean {
  const m = DATE_RE.exec(date);
  if (!m) return false;
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return d.toISOString().slice(0, 10) === date;
}

/** Whether a calendar date YYYY-MM-DD is a Monday (the weekday of a date needs no time zone). */
export function isMonday(date: string): boolean {
  if (!isCalendarDate(date)) return false;
  return new Date(`${date}T00:00:00Z`).getUTCDay() === 1;
}

/** The calendar date `days` after `date` (both YYYY-MM-DD). */
export function addDays(date: string, days: number): string {
  return new Date(new Date(`${date}T00:00:00Z`).getTime() + days * DAY_MS)
    .toISOString()
    .slice(0, 10);
}

export interface WeekBounds {
  start: string;
  fromMs: number;
  toMs: number;
  /** 168, or 167 / 169 across a daylight-saving change. */
  hours: number;
}

/** Monday 00:00 to the next Monday 00:00 in `timeZone`, as instants. `start` must be a Monday. */
export function weekBounds(start: string, timeZone: string): WeekBounds {
  if (!isMonday(start)) throw new RangeError(`${start} is not a Monday`);
  const fromMs = fromZonedTime(`${start}T00:00:00`, timeZone).getTime();
  const toMs = fromZonedTime(`${addDays(start, 7)}T00:00:00`, timeZone).getTime();
  return { start, fromMs, toMs, hours: (toMs - fromMs) / HOUR_MS };
}

/** The shop-local calendar date of an instant, YYYY-MM-DD. */
function localDate(nowMs: number, timeZone: string): string {
  const z = toZonedTime(new Date(nowMs), timeZone);
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${z.getFullYear()}-${pad(z.getMonth() + 1)}-${pad(z.getDate())}`;
}

/** The Monday of the shop-local week that holds `nowMs`. */
export function weekStartOf(nowMs: number, timeZone: string): string {
  const today = localDate(nowMs, timeZone);
  const weekday = new Date(`${today}T00:00:00Z`).getUTCDay(); // 0 Sunday … 6 Saturday
  return addDays(today, -((weekday + 6) % 7));
}

/** The Monday of the last week that has ended, shop-local. */
export function lastCompleteWeekStart(nowMs: number, timeZone: string): string {
  return addDays(weekStartOf(nowMs, timeZone), -7);
}

/** One stored reading of a zone as the report reads it. */
export interface ReportReading {
  sensorId: string;
  atMs: number;
  airC: number;
  rhPct: number;
  marginK: number | null;
  emcPct: number | null;
  level: Level;
}

export interface FigureRange {
  min: number | null;
  mean: number | null;
  max: number | null;
}

export interface LevelMs {
  dry: number;
  close: number;
  wet: number;
  unknown: number;
}

/** A zone's figures over [fromMs, endMs), in ms where a duration, before any rounding. */
export interface WeekFigures {
  readings: number;
  periodMs: number;
  coveredMs: number;
  airC: FigureRange;
  rhPct: FigureRange;
  emcPct: FigureRange;
  lowestMargin: { marginK: number; atMs: number } | null;
  levelMs: LevelMs;
  /** ISO 9223 time of wetness (ingest/wetness.ts). */
  wetnessMs: number;
  /** Wet hours per year at the week's wet fraction of covered time; null without coverage. */
  annualWetHours: number | null;
  silentPeriods: { fromMs: number; toMs: number }[];
}

export interface WeekFigureOptions {
  fromMs: number;
  /** The period end: the week's end, or the time of making for the current week. */
  endMs: number;
  maxGapMs: number;
}

/** Time order, ties by sensor id: the order both paths (JS and SQL) merge a zone's sensors in. */
export function compareReadings(a: ReportReading, b: ReportReading): number {
  if (a.atMs !== b.atMs) return a.atMs - b.atMs;
  return a.sensorId < b.sensorId ? -1 : a.sensorId > b.sensorId ? 1 : 0;
}

class Range {
  min: number | null = null;
  max: number | null = null;
  private weighted = 0;
  private weightMs = 0;
  add(value: number | null, ms: number) {
    if (value === null || !Number.isFinite(value)) return;
    this.min = this.min === null ? value : Math.min(this.min, value);
    this.max = this.max === null ? value : Math.max(this.max, value);
    this.weighted += value * ms;
    this.weightMs += ms;
  }
  result(): FigureRange {
    return {
      min: this.min,
      mean: this.weightMs > 0 ? this.weighted / this.weightMs : null,
      max: this.max,
    };
  }
}

/** A zone's week figures from its readings (any order; those outside [from, end) are ignored). */
export function weekFiguresFromReadings(
  all: readonly ReportReading[],
  options: WeekFigureOptions,
): WeekFigures {
  const { fromMs, endMs, maxGapMs } = options;
  const readings = all.filter((r) => r.atMs >= fromMs && r.atMs < endMs).sort(compareReadings);
  const air = new Range();
  const rh = new Range();
  const emc = new Range();
  const levelMs: LevelMs = { dry: 0, close: 0, wet: 0, unknown: 0 };
  let coveredMs = 0;
  let lowestMargin: WeekFigures['lowestMargin'] = null;
  const silentPeriods: WeekFigures['silentPeriods'] = [];

  const first = readings[0];
  if (!first) silentPeriods.push({ fromMs, toMs: endMs });
  else if (first.atMs - fromMs > maxGapMs) silentPeriods.push({ fromMs, toMs: first.atMs });

  readings.forEach((r, i) => {
    const untilMs = readings[i + 1]?.atMs ?? endMs;
    const spanMs = untilMs - r.atMs;
    const ms = Math.min(spanMs, maxGapMs);
    if (spanMs > maxGapMs) silentPeriods.push({ fromMs: r.atMs + maxGapMs, toMs: untilMs });
    coveredMs += ms;
    air.add(r.airC, ms);
    rh.add(r.rhPct, ms);
    emc.add(r.emcPct, ms);
    if (r.level !== 'unknown') levelMs[r.level] += ms;
    // Strictly lower only: the earliest of equal lows is the one reported (as in SQL).
    if (r.marginK !== null && (lowestMargin === null || r.marginK < lowestMargin.marginK)) {
      lowestMargin = { marginK: r.marginK, atMs: r.atMs };
    }
  });

  const periodMs = endMs - fromMs;
  levelMs.unknown = periodMs - levelMs.dry - levelMs.close - levelMs.wet;
  // The sorted order is kept by timeOfWetness's stable sort, so ties resolve the same way.
  const tow = timeOfWetness(readings, { endMs, maxGapMs });
  return {
    readings: readings.length,
    periodMs,
    coveredMs,
    airC: air.result(),
    rhPct: rh.result(),
    emcPct: emc.result(),
    lowestMargin,
    levelMs,
    wetnessMs: tow.wetMs,
    annualWetHours: annualWetHours(tow),
    silentPeriods,
  };
}
