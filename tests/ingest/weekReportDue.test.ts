import { describe, expect, it } from 'vitest';

import {
  isWeekReportMailDue,
  weekReportMailDue,
  weekReportMailDueAt,
} from '@/ingest/weekReportDue';

const iso = (text: string) => Date.parse(text);

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
      expect(weekReportMailDue(iso(now), timeZone).start).toBe(dueWeek);
    },
  );

  it('says the due week’s bounds and hours (the 169 h Chicago week)', () => {
    const due = weekReportMailDue(iso('2026-11-02T13:00:00Z'), 'America/Chicago');
    // US daylight time ends the first Sunday of November (Energy Policy Act of 2005): the week
    // runs from CDT (UTC-5) to CST (UTC-6), 169 h.
    expect(due).toMatchObject({ start: '2026-10-26', hours: 169 });
    expect(new Date(due.fromMs).toISOString()).toBe('2026-10-26T05:00:00.000Z');
    expect(new Date(due.toMs).toISOString()).toBe('2026-11-02T06:00:00.000Z');
    expect(new Date(due.dueAtMs).toISOString()).toBe('2026-11-02T13:00:00.000Z');
  });

  it('says the Berlin spring week’s 167 h (EU summer time from 29 March, Directive 2000/84/EC)', () => {
    const due = weekReportMailDue(iso('2026-03-30T05:00:00Z'), 'Europe/Berlin');
    expect(due).toMatchObject({ start: '2026-03-23', hours: 167 });
    expect(new Date(due.fromMs).toISOString()).toBe('2026-03-22T23:00:00.000Z');
    expect(new Date(due.toMs).toISOString()).toBe('2026-03-29T22:00:00.000Z');
  });
});
