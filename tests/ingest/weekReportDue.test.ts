import { describe, expect, it } from 'vitest';

import {
  addCalendarDays,
  isWeekReportMailDue,
  localMondayOf,
  shopWeek,
  weekReportMailDue,
  weekReportMailDueAt,
} from '@/ingest/weekReportDue';

const iso = (text: string) => Date.parse(text);

describe('the shop-local Monday of an instant', () => {
  // Calendar of 2026: 1 January 2026 is a Thursday, so Monday 30 March and Monday 2 November.
  it.each([
    // 2026-03-29 is a Sunday; 21:59Z is 23:59 CEST the same Sunday in Berlin.
    ['2026-03-29T21:59:00Z', 'Europe/Berlin', '2026-03-23'],
    // 22:00Z on that Sunday is already Monday 00:00 CEST in Berlin.
    ['2026-03-29T22:00:00Z', 'Europe/Berlin', '2026-03-30'],
    // 2 November is after the change (CST, UTC-6): 05:30Z is still Sunday 23:30 in Chicago.
    ['2026-11-02T05:30:00Z', 'America/Chicago', '2026-10-26'],
    ['2026-11-02T06:00:00Z', 'America/Chicago', '2026-11-02'],
    // Across a year end: Thursday 1 January 2026 belongs to the week of Monday 29 December 2025.
    ['2026-01-01T12:00:00Z', 'UTC', '2025-12-29'],
  ])('%s in %s is in the week of %s', (at, timeZone, monday) => {
    expect(localMondayOf(iso(at), timeZone)).toBe(monday);
  });

  it('adds calendar days across month and year ends', () => {
    expect(addCalendarDays('2026-03-30', -7)).toBe('2026-03-23');
    expect(addCalendarDays('2025-12-29', 7)).toBe('2026-01-05');
    expect(addCalendarDays('2024-02-26', 3)).toBe('2024-02-29'); // 2024 is a leap year
  });
});

describe('the week and its hours across daylight-saving changes', () => {
  it.each([
    // EU summer time starts the last Sunday of March at 01:00 UTC (Directive 2000/84/EC):
    // 2026-03-29, so the week of 23 March runs CET (UTC+1) to CEST (UTC+2) and loses an hour.
    ['2026-03-23', 'Europe/Berlin', '2026-03-22T23:00:00.000Z', '2026-03-29T22:00:00.000Z', 167],
    // US daylight time ends the first Sunday of November at 02:00 local (Energy Policy Act of
    // 2005): 2026-11-01, so the week of 26 October runs CDT (UTC-5) to CST (UTC-6): 169 h.
    ['2026-10-26', 'America/Chicago', '2026-10-26T05:00:00.000Z', '2026-11-02T06:00:00.000Z', 169],
    // A week with no change: 168 h.
    ['2026-06-08', 'Europe/Berlin', '2026-06-07T22:00:00.000Z', '2026-06-14T22:00:00.000Z', 168],
  ])('week of %s in %s: %s → %s, %d h', (weekStart, timeZone, from, to, hours) => {
    const week = shopWeek(weekStart, timeZone);
    expect(week.from.toISOString()).toBe(from);
    expect(week.to.toISOString()).toBe(to);
    expect(week.hours).toBe(hours);
  });
});

describe('when the Monday mail is due: 07:00 shop time on the Monday after the week', () => {
  it('Berlin, Monday 2026-03-30 07:00 CEST is 05:00Z (summer time since 29 March)', () => {
    expect(weekReportMailDueAt('2026-03-23', 'Europe/Berlin').toISOString()).toBe(
      '2026-03-30T05:00:00.000Z',
    );
  });

  it('Chicago, Monday 2026-11-02 07:00 CST is 13:00Z (daylight time ended 1 November)', () => {
    expect(weekReportMailDueAt('2026-10-26', 'America/Chicago').toISOString()).toBe(
      '2026-11-02T13:00:00.000Z',
    );
  });

  it.each([
    // [now, zone, the week asked about, due?, the week due then]
    // Sunday 23:59 CEST: the week of 23 March is not over; the week before is still due.
    ['2026-03-29T21:59:00Z', 'Europe/Berlin', '2026-03-23', false, '2026-03-16'],
    // Monday 00:00 and 06:59 CEST: not yet; the week before keeps its turn until 07:00.
    ['2026-03-29T22:00:00Z', 'Europe/Berlin', '2026-03-23', false, '2026-03-16'],
    ['2026-03-30T04:59:00Z', 'Europe/Berlin', '2026-03-23', false, '2026-03-16'],
    // 07:00 CEST sharp: due.
    ['2026-03-30T05:00:00Z', 'Europe/Berlin', '2026-03-23', true, '2026-03-23'],
    // A server down all Monday sends on Thursday; still that week until the next Monday 07:00.
    ['2026-04-02T10:00:00Z', 'Europe/Berlin', '2026-03-23', true, '2026-03-23'],
    ['2026-04-06T04:59:00Z', 'Europe/Berlin', '2026-03-23', true, '2026-03-23'],
    ['2026-04-06T05:00:00Z', 'Europe/Berlin', '2026-03-23', false, '2026-03-30'],
    // Chicago: 06:59 CST is 12:59Z, 07:00 CST is 13:00Z.
    ['2026-11-02T12:59:00Z', 'America/Chicago', '2026-10-26', false, '2026-10-19'],
    ['2026-11-02T13:00:00Z', 'America/Chicago', '2026-10-26', true, '2026-10-26'],
    // Sunday 1 November 23:59 CST (05:59Z on the 2nd): the week of 26 October is not over.
    ['2026-11-02T05:59:00Z', 'America/Chicago', '2026-10-26', false, '2026-10-19'],
  ])(
    'at %s in %s the week of %s is due: %s (due then: %s)',
    (now, timeZone, asked, due, dueWeek) => {
      expect(isWeekReportMailDue(asked, iso(now), timeZone)).toBe(due);
      expect(weekReportMailDue(iso(now), timeZone).weekStart).toBe(dueWeek);
    },
  );

  it('says the due week’s bounds and hours (the 169 h Chicago week)', () => {
    const due = weekReportMailDue(iso('2026-11-02T13:00:00Z'), 'America/Chicago');
    expect(due).toMatchObject({ weekStart: '2026-10-26', hours: 169 });
    expect(due.from.toISOString()).toBe('2026-10-26T05:00:00.000Z');
    expect(due.to.toISOString()).toBe('2026-11-02T06:00:00.000Z');
    expect(due.dueAt.toISOString()).toBe('2026-11-02T13:00:00.000Z');
  });
});
