/**
 * Reads a logger file's time cell as an instant (epoch ms), per the format and zone the person
 * chose (ingest/wire/imports.ts `ImportTimeFormat`):
 *
 * - `iso`: 2025-11-02T01:30:00, a space instead of the T, seconds and fractions optional; with
 *   an offset (Z, +01:00, -0500) the offset decides and the zone is ignored;
 * - `day-first` 02/11/2025 01:30[:00] and `month-first` 11/02/2025 01:30[:00]: `/ . -` between
 *   the date's parts, a 4-digit year, 24-hour time or 12-hour time with AM/PM;
 * - `epoch-s`, `epoch-ms`: seconds or milliseconds since 1970-01-01T00:00:00Z (a decimal point
 *   allowed); the zone is ignored.
 *
 * Wall times become instants in the logger's IANA zone through date-fns-tz's `fromZonedTime`.
 * At the clock changes (checked in tests/ingest/importTime.test.ts against the tz database):
 * - a wall time that never happens (the spring hour, 02:00–03:00 on 2025-03-09 in
 *   America/Chicago) is read, as date-fns-tz reads it, with the daylight-time offset: 02:30 →
 *   07:30Z (UTC−5), which the clock showed as 01:30 CST;
 * - a wall time that happens twice (the autumn hour, 01:00–02:00 on 2025-11-02 there) is
 *   ambiguous. date-fns-tz picks the offset in force at the wall time read as UTC — daylight
 *   time west of Greenwich (Chicago: CDT), standard time east of it (Berlin: CET) — so we ask
 *   for both instants and name them, the earlier (daylight) first. A logger that keeps local
 *   time writes that hour twice, so in a file read in order (`resolveFold`) the first pass
 *   takes the earlier instant and the second pass, once the clock has gone back, the later.
 */
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';

import type { ImportTimeFormat } from './wire/imports';

/** A time read from a cell; `laterMs` when the wall time happens twice in the zone. */
export interface ReadTime {
  atMs: number;
  /** The second instant of an ambiguous wall time (the autumn hour), else undefined. */
  laterMs?: number;
}

const ISO_LOCAL = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(\.\d{1,9})?)?$/;
const ISO_OFFSET =
  /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(\.\d{1,9})?)?\s?(Z|[+-]\d{2}(?::?\d{2})?)$/i;
const ISO_DATE_ONLY = /^(\d{4})-(\d{2})-(\d{2})$/;
// a/b/yyyy h:mm[:ss[.fff]] [AM|PM], separators / . - ; a comma or T may follow the date.
const DMY =
  /^(\d{1,2})([/.-])(\d{1,2})\2(\d{4}),?[ T]+(\d{1,2}):(\d{2})(?::(\d{2})(\.\d{1,9})?)?(?:\s*([AaPp])\.?[Mm]\.?)?$/;
const EPOCH = /^[+-]?\d+(\.\d+)?$/;

interface Wall {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
  ms: number;
}

const msOf = (fraction: string | undefined) =>
  fraction ? Math.round(Number(`0${fraction}`) * 1000) : 0;

/** True when the parts name a real calendar date and clock time. */
function isRealWall(w: Wall): boolean {
  if (w.month < 1 || w.month > 12 || w.day < 1 || w.hour > 23 || w.minute > 59) return false;
  if (w.second > 59) return false;
  const date = new Date(Date.UTC(w.year, w.month - 1, w.day));
  return date.getUTCMonth() === w.month - 1 && date.getUTCDate() === w.day;
}

const pad = (n: number, width = 2) => String(n).padStart(width, '0');
const WALL_FORMAT = "yyyy-MM-dd'T'HH:mm:ss.SSS";

/** The wall time as text; date-fns-tz reads text without the server's own zone leaking in. */
const wallText = (w: Wall) =>
  `${pad(w.year, 4)}-${pad(w.month)}-${pad(w.day)}T${pad(w.hour)}:${pad(w.minute)}:${pad(w.second)}.${pad(w.ms, 3)}`;

/** The wall time in the zone as an instant, with the second instant of a repeated hour. */
function wallToInstant(w: Wall, timeZone: string): ReadTime | null {
  if (!isRealWall(w)) return null;
  const text = wallText(w);
  const atMs = fromZonedTime(text, timeZone).getTime();
  if (!Number.isFinite(atMs)) return null;
  // Ambiguous when, a fold's length away (every fold of the tz database is 1 h but Lord Howe's
  // 30 min), the zone's wall clock shows this same time again: date-fns-tz may have picked either
  // instant, so both are named, the earlier first.
  for (const stepMs of [3_600_000, 1_800_000]) {
    if (formatInTimeZone(atMs + stepMs, timeZone, WALL_FORMAT) === text) {
      return { atMs, laterMs: atMs + stepMs };
    }
    if (formatInTimeZone(atMs - stepMs, timeZone, WALL_FORMAT) === text) {
      return { atMs: atMs - stepMs, laterMs: atMs };
    }
  }
  return { atMs };
}

function readIso(text: string, toInstant: (w: Wall) => ReadTime | null): ReadTime | null {
  const o = ISO_OFFSET.exec(text);
  if (o) {
    const wall = { year: +o[1]!, month: +o[2]!, day: +o[3]!, hour: +o[4]!, minute: +o[5]! };
    if (!isRealWall({ ...wall, second: Number(o[6] ?? 0), ms: 0 })) return null;
    // Offsets as Date.parse reads them: Z or ±hh:mm.
    const offset =
      o[8]!.toUpperCase() === 'Z'
        ? 'Z'
        : o[8]!.replace(
            /^([+-]\d{2}):?(\d{2})?$/,
            (_m, h: string, mm?: string) => `${h}:${mm ?? '00'}`,
          );
    const atMs = Date.parse(
      `${wallText({ ...wall, second: Number(o[6] ?? 0), ms: msOf(o[7]) })}${offset}`,
    );
    return Number.isFinite(atMs) ? { atMs } : null;
  }
  const m = ISO_LOCAL.exec(text) ?? null;
  if (m) {
    return toInstant({
      year: Number(m[1]),
      month: Number(m[2]),
      day: Number(m[3]),
      hour: Number(m[4]),
      minute: Number(m[5]),
      second: Number(m[6] ?? 0),
      ms: msOf(m[7]),
    });
  }
  const d = ISO_DATE_ONLY.exec(text);
  if (d) {
    const wall = { year: +d[1]!, month: +d[2]!, day: +d[3]!, hour: 0, minute: 0, second: 0, ms: 0 };
    return toInstant(wall);
  }
  return null;
}

function readDayMonth(
  text: string,
  dayFirst: boolean,
  toInstant: (w: Wall) => ReadTime | null,
): ReadTime | null {
  const m = DMY.exec(text);
  if (!m) return null;
  let hour = Number(m[5]);
  const meridiem = m[9]?.toLowerCase();
  if (meridiem) {
    // 12-hour clock: 12:xx AM is just after midnight, 12:xx PM just after noon.
    if (hour < 1 || hour > 12) return null;
    hour = (hour % 12) + (meridiem === 'p' ? 12 : 0);
  }
  const first = Number(m[1]);
  const second = Number(m[3]);
  return toInstant({
    year: Number(m[4]),
    month: dayFirst ? second : first,
    day: dayFirst ? first : second,
    hour,
    minute: Number(m[6]),
    second: Number(m[7] ?? 0),
    ms: msOf(m[8]),
  });
}

function readTimeWith(
  cell: string,
  format: ImportTimeFormat,
  toInstant: (w: Wall) => ReadTime | null,
): ReadTime | null {
  const text = cell.trim();
  if (text === '') return null;
  switch (format) {
    case 'iso':
      return readIso(text, toInstant);
    case 'day-first':
      return readDayMonth(text, true, toInstant);
    case 'month-first':
      return readDayMonth(text, false, toInstant);
    case 'epoch-s':
    case 'epoch-ms': {
      if (!EPOCH.test(text)) return null;
      const value = Number(text);
      const atMs = Math.round(format === 'epoch-s' ? value * 1000 : value);
      return Number.isFinite(atMs) ? { atMs } : null;
    }
  }
}

/** One cell's time, or null when it cannot be read with this format (an unreadable time). */
export function readImportTime(
  cell: string,
  format: ImportTimeFormat,
  timeZone: string,
): ReadTime | null {
  return readTimeWith(cell, format, (w) => wallToInstant(w, timeZone));
}

const HOUR_MS = 3_600_000;
const DAY_MS = 24 * HOUR_MS;

const wallOf = (d: Date): Wall => ({
  year: d.getUTCFullYear(),
  month: d.getUTCMonth() + 1,
  day: d.getUTCDate(),
  hour: d.getUTCHours(),
  minute: d.getUTCMinutes(),
  second: d.getUTCSeconds(),
  ms: d.getUTCMilliseconds(),
});

/**
 * The zone's offset (wall − instant, ms) over the wall span [fromMs, fromMs + spanMs), when it
 * is the same at both ends and neither end is ambiguous; null when the clock changes in it.
 */
function steadyOffsetMs(fromMs: number, spanMs: number, timeZone: string): number | null {
  const start = new Date(fromMs);
  const end = new Date(fromMs + spanMs - 1);
  const a = wallToInstant(wallOf(start), timeZone);
  const b = wallToInstant(wallOf(end), timeZone);
  if (!a || !b || a.laterMs !== undefined || b.laterMs !== undefined) return null;
  const offset = start.getTime() - a.atMs;
  return offset === end.getTime() - b.atMs ? offset : null;
}

/**
 * A reader of one file's time cells, for the hot loop of an import: date-fns-tz's zone
 * arithmetic costs tens of microseconds a call, so the zone's offset is kept per wall-clock
 * day, and for a day whose offset changes (a clock change) per hour, and reused for the other
 * times of that day or hour: a year of one-minute lines asks the zone about 730 times instead
 * of 500,000. An hour where the offset changes, or that is ambiguous, is never kept: each of
 * its times is worked out whole, as `readImportTime` does. A day is taken as steady when both
 * its ends have the same offset: no zone of the tz database changes its clock twice in one day
 * and back (the changes it records are months apart).
 */
export function createTimeReader(
  format: ImportTimeFormat,
  timeZone: string,
): (cell: string) => ReadTime | null {
  const dayOffsetMs = new Map<number, number | null>();
  const hourOffsetMs = new Map<number, number | null>();
  const wallReader = (w: Wall): ReadTime | null => {
    if (!isRealWall(w)) return null;
    const wallMs = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second, w.ms);
    const day = Math.floor(wallMs / DAY_MS);
    let offset = dayOffsetMs.get(day);
    if (offset === undefined) {
      offset = steadyOffsetMs(day * DAY_MS, DAY_MS, timeZone);
      dayOffsetMs.set(day, offset);
    }
    if (offset === null) {
      const hour = Math.floor(wallMs / HOUR_MS);
      offset = hourOffsetMs.get(hour);
      if (offset === undefined) {
        offset = steadyOffsetMs(hour * HOUR_MS, HOUR_MS, timeZone);
        hourOffsetMs.set(hour, offset);
      }
    }
    return offset === null ? wallToInstant(w, timeZone) : { atMs: wallMs - offset };
  };
  return (cell) => readTimeWith(cell, format, wallReader);
}

/**
 * The instant of a time read in file order: the second instant of a repeated wall time when
 * the row before (`previousMs`, the last instant resolved) already reached the first one — the
 * logger's clock went back and is going through the hour again. Files are assumed to be written
 * in time order across the change, as loggers write them.
 */
export function resolveFold(time: ReadTime, previousMs: number | null): number {
  if (time.laterMs === undefined || previousMs === null) return time.atMs;
  return previousMs >= time.atMs ? time.laterMs : time.atMs;
}
