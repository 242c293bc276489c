// The report's weeks on the shop's calendar: stepping Monday to Monday across daylight-saving
// changes, which week "now" is in the shop's zone on either side of its midnight, the week as
// people read it, and what a URL's ?week= may hold. Expected dates are worked out by hand from
// the zones' published rules (IANA tz database): Europe/Berlin goes from CET (UTC+1) to CEST
// (UTC+2) at 01:00 UTC on the last Sunday of March (29 March 2026); America/Chicago from CDT
// (UTC−5) back to CST (UTC−6) at 07:00 UTC on the first Sunday of November (1 November 2026).
import { describe, expect, it } from 'vitest';

import {
  isLatestWeek,
  isPartialWeek,
  parseWeekStart,
  shiftWeek,
  weekLabel,
  weekSpanShort,
} from '@/components/report/reportWeek';
import { weekStartOf } from '@/ingest/reportWeek';

describe('stepping weeks', () => {
  it.each([
    // Across Berlin's spring change: the week of 23 March has 167 hours, still Monday to Monday.
    { start: '2026-03-23', weeks: 1, expected: '2026-03-30' },
    { start: '2026-03-30', weeks: -1, expected: '2026-03-23' },
    // Across Chicago's autumn change (169 hours).
    { start: '2026-10-26', weeks: 1, expected: '2026-11-02' },
    // Across a month end and a year end (2025-12-29 is a Monday: 1 January 2026 is a Thursday).
    { start: '2026-01-05', weeks: -1, expected: '2025-12-29' },
    { start: '2025-12-29', weeks: 1, expected: '2026-01-05' },
    // Leap day: 2028-02-28 is a Monday, a week later is 6 March.
    { start: '2028-02-28', weeks: 1, expected: '2028-03-06' },
  ])('$start + $weeks week(s) is $expected', ({ start, weeks, expected }) => {
    expect(shiftWeek(start, weeks)).toBe(expected);
  });
});

describe('the week that holds now, on the shop clock', () => {
  it.each([
    // Berlin, CET: Monday 23 March 00:00 local is 22 March 23:00 UTC.
    { at: '2026-03-22T22:59:59Z', zone: 'Europe/Berlin', expected: '2026-03-16' },
    { at: '2026-03-22T23:00:00Z', zone: 'Europe/Berlin', expected: '2026-03-23' },
    // Berlin, CEST since the 29th: Monday 30 March 00:00 local is 29 March 22:00 UTC.
    { at: '2026-03-29T21:59:59Z', zone: 'Europe/Berlin', expected: '2026-03-23' },
    { at: '2026-03-29T22:00:00Z', zone: 'Europe/Berlin', expected: '2026-03-30' },
    // Chicago, CST since 1 November: Monday 2 November 00:00 local is 06:00 UTC.
    { at: '2026-11-02T05:59:59Z', zone: 'America/Chicago', expected: '2026-10-26' },
    { at: '2026-11-02T06:00:00Z', zone: 'America/Chicago', expected: '2026-11-02' },
    // The same instant is already Monday in Tokyo (UTC+9) but still Sunday in Chicago.
    { at: '2026-03-22T16:00:00Z', zone: 'Asia/Tokyo', expected: '2026-03-23' },
    { at: '2026-03-22T16:00:00Z', zone: 'America/Chicago', expected: '2026-03-16' },
  ])('$at in $zone is in the week of $expected', ({ at, zone, expected }) => {
    expect(weekStartOf(Date.parse(at), zone)).toBe(expected);
  });

  it('offers no week after the current one', () => {
    const wednesday = Date.parse('2026-03-25T12:00:00Z');
    expect(isLatestWeek('2026-03-23', wednesday, 'Europe/Berlin')).toBe(true);
    expect(isLatestWeek('2026-03-16', wednesday, 'Europe/Berlin')).toBe(false);
    // Sunday 29 March 23:30 CEST is still the week of the 23rd; 00:30 Monday is the next one.
    expect(isLatestWeek('2026-03-23', Date.parse('2026-03-29T21:30:00Z'), 'Europe/Berlin')).toBe(
      true,
    );
    expect(isLatestWeek('2026-03-23', Date.parse('2026-03-29T22:30:00Z'), 'Europe/Berlin')).toBe(
      false,
    );
  });
});

describe('the week in words', () => {
  it.each([
    { start: '2026-03-23', label: 'Mon 23 Mar – Sun 29 Mar 2026', short: '23–29 Mar' },
    { start: '2026-03-30', label: 'Mon 30 Mar – Sun 5 Apr 2026', short: '30 Mar–5 Apr' },
    { start: '2025-12-29', label: 'Mon 29 Dec 2025 – Sun 4 Jan 2026', short: '29 Dec–4 Jan' },
  ])('$start reads "$label"', ({ start, label, short }) => {
    expect(weekLabel(start)).toBe(label);
    expect(weekSpanShort(start)).toBe(short);
  });

  it('marks the current week as so far while its figures stop before its end', () => {
    const week = { from: '2026-03-22T23:00:00.000Z', to: '2026-03-29T22:00:00.000Z' };
    expect(isPartialWeek({ ...week, periodEnd: '2026-03-25T11:00:00.000Z' })).toBe(true);
    expect(isPartialWeek({ ...week, periodEnd: week.to })).toBe(false);
  });
});

describe('?week= from a URL', () => {
  it.each([
    { value: '2026-03-23', expected: '2026-03-23' },
    // A Tuesday, a day February does not have, another format, nothing, a repeated parameter.
    { value: '2026-03-24', expected: null },
    { value: '2026-02-30', expected: null },
    { value: '23.03.2026', expected: null },
    { value: undefined, expected: null },
    { value: ['2026-03-23', '2026-03-30'], expected: null },
  ])('$value → $expected', ({ value, expected }) => {
    expect(parseWeekStart(value)).toBe(expected);
  });
});
