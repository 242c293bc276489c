// Reading a logger file's times and lines (ingest/importTime.ts, ingest/importRows.ts).
// Expected instants come from the IANA tz database's rules (northamerica: Rule US, America/Chicago
// CST −6 / CDT −5, changes at 02:00 local on the second Sunday of March and the first Sunday of
// November; europe: Rule EU, Europe/Berlin CET +1 / CEST +2, changes at 01:00 UTC on the last
// Sundays of March and October) and from ISO 8601's and POSIX's definitions of the formats.
import { describe, expect, it } from 'vitest';

import {
  createTimeReader,
  detectDelimiter,
  isHeaderLine,
  planColumns,
  readImportRow,
  readImportTime,
  readNumber,
  resolveFold,
  splitCsvLine,
} from '@/ingest';
import type { ImportTimeFormat } from '@/ingest/wire/imports';

const iso = (ms: number | undefined) => (ms === undefined ? undefined : new Date(ms).toISOString());

describe('readImportTime', () => {
  // [cell, format, zone, UTC instant]
  const CASES: [string, ImportTimeFormat, string, string][] = [
    // ISO 8601 with an offset: the offset decides, the zone is ignored.
    ['2025-06-01T12:00:00Z', 'iso', 'America/Chicago', '2025-06-01T12:00:00.000Z'],
    ['2025-06-01T12:00:00+02:00', 'iso', 'UTC', '2025-06-01T10:00:00.000Z'],
    ['2025-06-01 12:00:00-0500', 'iso', 'UTC', '2025-06-01T17:00:00.000Z'],
    // Local ISO times in the logger's zone: CDT (−5) in June, CST (−6) in January.
    ['2025-06-01T12:00:00', 'iso', 'America/Chicago', '2025-06-01T17:00:00.000Z'],
    ['2025-01-15 06:30', 'iso', 'America/Chicago', '2025-01-15T12:30:00.000Z'],
    ['2025-01-15 06:30:15.250', 'iso', 'UTC', '2025-01-15T06:30:15.250Z'],
    // Day first and month first, with / . - and 12-hour clocks.
    ['02/11/2025 00:45', 'day-first', 'America/Chicago', '2025-11-02T05:45:00.000Z'],
    ['31.12.2025 23:59:59', 'day-first', 'Europe/Berlin', '2025-12-31T22:59:59.000Z'],
    ['11-02-2025 00:45', 'month-first', 'America/Chicago', '2025-11-02T05:45:00.000Z'],
    ['6/1/2025 12:00 AM', 'month-first', 'UTC', '2025-06-01T00:00:00.000Z'],
    ['6/1/2025 12:30 PM', 'month-first', 'UTC', '2025-06-01T12:30:00.000Z'],
    ['6/1/2025 1:05:09 p.m.', 'month-first', 'UTC', '2025-06-01T13:05:09.000Z'],
    // POSIX time: seconds (or milliseconds) since 1970-01-01T00:00:00Z.
    ['1748736000', 'epoch-s', 'America/Chicago', '2025-06-01T00:00:00.000Z'],
    ['1748736000.5', 'epoch-s', 'UTC', '2025-06-01T00:00:00.500Z'],
    ['1748736000123', 'epoch-ms', 'UTC', '2025-06-01T00:00:00.123Z'],
  ];
  it.each(CASES)('%s (%s, %s) → %s', (cell, format, zone, expected) => {
    expect(iso(readImportTime(cell, format, zone)?.atMs)).toBe(expected);
    // The import's cached reader agrees with the plain one.
    expect(iso(createTimeReader(format, zone)(cell)?.atMs)).toBe(expected);
  });

  it.each([
    ['31/02/2025 10:00', 'day-first'],
    ['13/13/2025 10:00', 'month-first'],
    ['2025-06-01T24:00:00', 'iso'],
    ['6/1/2025 13:00 PM', 'month-first'],
    ['yesterday', 'iso'],
    ['', 'epoch-s'],
    ['2025-06-01', 'epoch-ms'],
  ] as [string, ImportTimeFormat][])('%s is no %s time', (cell, format) => {
    expect(readImportTime(cell, format, 'UTC')).toBeNull();
  });

  it('names both instants of the autumn repeated hour, the earlier (daylight) first', () => {
    const t = readImportTime('2025-11-02 01:30', 'iso', 'America/Chicago')!;
    expect(iso(t.atMs)).toBe('2025-11-02T06:30:00.000Z'); // 01:30 CDT
    expect(iso(t.laterMs)).toBe('2025-11-02T07:30:00.000Z'); // 01:30 CST
    // Europe/Berlin repeats 02:00–03:00 on 2025-10-26: CEST (+2) first, then CET (+1). Here
    // date-fns-tz alone would answer CET, the later one.
    const b = readImportTime('26.10.2025 02:15', 'day-first', 'Europe/Berlin')!;
    expect([iso(b.atMs), iso(b.laterMs)]).toEqual([
      '2025-10-26T00:15:00.000Z',
      '2025-10-26T01:15:00.000Z',
    ]);
  });

  it("reads a spring wall time that never happened at daylight time (date-fns-tz's rule)", () => {
    // 02:30 on 2025-03-09 does not exist in Chicago; read at CDT (−5) it is 07:30Z.
    expect(iso(readImportTime('2025-03-09 02:30', 'iso', 'America/Chicago')?.atMs)).toBe(
      '2025-03-09T07:30:00.000Z',
    );
    // 02:30 on 2025-03-30 does not exist in Berlin; read at CEST (+2) it is 00:30Z.
    expect(iso(readImportTime('30.03.2025 02:30', 'day-first', 'Europe/Berlin')?.atMs)).toBe(
      '2025-03-30T00:30:00.000Z',
    );
    expect(readImportTime('2025-03-09 03:00', 'iso', 'America/Chicago')?.laterMs).toBeUndefined();
  });

  it('takes the second instant once a file in time order comes back through the hour', () => {
    const read = createTimeReader('day-first', 'America/Chicago');
    let previous: number | null = null;
    const out = [
      '02/11/2025 01:50',
      '02/11/2025 01:00',
      '02/11/2025 01:50',
      '02/11/2025 02:10',
    ].map((cell) => {
      previous = resolveFold(read(cell)!, previous);
      return iso(previous);
    });
    expect(out).toEqual([
      '2025-11-02T06:50:00.000Z', // 01:50 CDT
      '2025-11-02T07:00:00.000Z', // 01:00 CST: the clock went back
      '2025-11-02T07:50:00.000Z', // 01:50 CST
      '2025-11-02T08:10:00.000Z', // 02:10 CST
    ]);
  });
});

describe('the cached zone offsets of a file', () => {
  // The reference is the whole computation per cell (readImportTime: date-fns-tz over the tz
  // database). The zones: Chicago (changes at 02:00), Santiago (changes at 24:00, so a day
  // starts at a wall time that never happens or ends in the repeated hour) and Lord Howe (a
  // 30-minute change). Every 37 minutes of 2025's wall clock (an odd step, so the cells fall on
  // every minute of the hour in turn and in every changed or repeated hour), read in file order.
  it.each(['America/Chicago', 'America/Santiago', 'Australia/Lord_Howe'])(
    'reads a year of %s wall times as the uncached reader does',
    (zone) => {
      const read = createTimeReader('iso', zone);
      const mismatches: string[] = [];
      for (let ms = Date.UTC(2025, 0, 1); ms < Date.UTC(2026, 0, 1); ms += 37 * 60_000) {
        const cell = new Date(ms).toISOString().slice(0, 19);
        const cached = read(cell);
        const whole = readImportTime(cell, 'iso', zone);
        if (cached?.atMs !== whole?.atMs || cached?.laterMs !== whole?.laterMs) {
          mismatches.push(cell);
        }
      }
      expect(mismatches).toEqual([]);
    },
    // The uncached reference takes tens of microseconds a cell; more on a busy machine.
    60_000,
  );
});

describe('splitting and reading lines', () => {
  it('splits on the delimiter outside quotes (RFC 4180 quoting)', () => {
    expect(splitCsvLine('a,"b,c","say ""hi""",', ',')).toEqual(['a', 'b,c', 'say "hi"', '']);
  });

  it.each([
    [['time,air,rh', '2025-06-01,1.5,70'], ','],
    [['time;air;rh', '01.06.2025;1,5;70'], ';'],
    [['time\tair', '2025\t1.5'], '\t'],
    [['time|air', '2025|1.5'], '|'],
    [['time air rh', '2025 1.5 70'], null],
  ])('finds the delimiter of %j', (lines, expected) => {
    expect(detectDelimiter(lines)).toBe(expected);
  });

  it('tells a header from a line of data', () => {
    expect(isHeaderLine(['Date Time', 'Temp C', 'RH %'])).toBe(true);
    expect(isHeaderLine(['2025-06-01T00:00:00Z', '14.2', '71'])).toBe(false);
    expect(isHeaderLine(['1748736000', '-3.5', '.5'])).toBe(false);
  });

  it('reads decimal commas only where commas do not split the cells', () => {
    expect(readNumber('12,5', true)).toBe(12.5);
    expect(Number.isNaN(readNumber('12,5', false))).toBe(true);
    expect(Number.isNaN(readNumber('', false))).toBe(true);
  });

  it('reads a line through the chosen columns, in °C', () => {
    const planned = planColumns(
      ['t', 'a', 'h', 's'],
      {
        timeColumn: 't',
        airColumn: 'a',
        rhColumn: 'h',
        surfaceColumn: 's',
        temperatureUnit: 'F',
        timeFormat: 'epoch-s',
        timeZone: 'UTC',
      },
      ',',
    );
    if (!planned.ok) throw new Error('plan');
    // 50 °F = 10 °C and 32 °F = 0 °C by definition of the Fahrenheit scale.
    expect(readImportRow(['1748736000', '50', '80', '32'], planned.plan)).toEqual({
      ok: true,
      time: { atMs: Date.UTC(2025, 5, 1) },
      reading: { airC: 10, rhPct: 80, surfaceC: 0, batteryV: null },
    });
    expect(readImportRow(['1748736000', '50', '80'], planned.plan)).toEqual({
      ok: false,
      reason: 'column_count',
    });
    expect(readImportRow(['1748736000', '50', 'x', ''], planned.plan)).toEqual({
      ok: false,
      reason: 'rh_unreadable',
    });
  });
});
