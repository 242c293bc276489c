// The zone history's ranges (components/zones/chartRange.ts): what each asks the server for,
// and the custom range's two shop-local clock times. Expected instants are hand-converted from
// the zones' UTC offsets (IANA tz database: Europe/Berlin changes from +01:00 to +02:00 at
// 02:00 local on Sunday 29 March 2026; America/Chicago from −05:00 to −06:00 at 02:00 local
// on Sunday 1 November 2026).
import { describe, expect, it } from 'vitest';

import {
  checkCustomRange,
  fixedWindow,
  fromLocalInput,
  rangeFromParam,
  rangeHeading,
  toLocalInput,
} from '@/components/zones/chartRange';
import { axisTicks, midnightTicks } from '@/components/zones/chartTicks';

const HOUR_MS = 3_600_000;
const iso = (ms: number) => new Date(ms).toISOString();

describe('fixed ranges', () => {
  it.each([
    ['6h', 6 * HOUR_MS],
    ['24h', 24 * HOUR_MS],
    ['7d', 7 * 24 * HOUR_MS],
    ['30d', 30 * 24 * HOUR_MS],
  ] as const)('%s reaches back %d ms from now', (key, ms) => {
    const now = Date.parse('2026-12-02T10:00:00Z');
    expect(fixedWindow(key, now)).toEqual({ fromMs: now - ms, toMs: now });
  });

  it('24 h across the Berlin spring change is 24 real hours, 25 clock hours apart', () => {
    // 12:00 CEST on 29 March is 10:00Z; 24 real hours earlier is 10:00Z on the 28th, which
    // Berlin's clock (still CET, +01:00) shows as 11:00 — so the axis spans 11:00 → 12:00.
    const now = Date.parse('2026-03-29T10:00:00Z');
    const { fromMs, toMs } = fixedWindow('24h', now);
    expect(toMs - fromMs).toBe(24 * HOUR_MS);
    expect(toLocalInput(fromMs, 'Europe/Berlin')).toBe('2026-03-28T11:00');
    expect(toLocalInput(toMs, 'Europe/Berlin')).toBe('2026-03-29T12:00');
  });

  it('reads the URL parameter, falling back to 24 h', () => {
    expect(rangeFromParam('7d')).toBe('7d');
    expect(rangeFromParam(['30d'])).toBe('30d');
    expect(rangeFromParam('1y')).toBe('24h');
    expect(rangeFromParam(undefined)).toBe('24h');
    expect(rangeHeading('7d')).toBe('Last 7 days');
    expect(rangeHeading('6h')).toBe('Last 6 hours');
  });
});

describe('custom range in the shop time zone', () => {
  it.each([
    // Berlin in winter is +01:00, in summer +02:00; Chicago in summer −05:00.
    ['2026-03-28T06:00', 'Europe/Berlin', '2026-03-28T05:00:00.000Z'],
    ['2026-03-29T06:00', 'Europe/Berlin', '2026-03-29T04:00:00.000Z'],
    ['2026-07-01T00:00', 'America/Chicago', '2026-07-01T05:00:00.000Z'],
    ['2026-07-01T00:00', 'Asia/Kolkata', '2026-06-30T18:30:00.000Z'],
  ])('%s in %s is %s', (text, zone, expected) => {
    expect(iso(fromLocalInput(text, zone)!)).toBe(expected);
  });

  it.each(['', '2026-02-30T06:00', '2026-03-02T25:00', '2026-03-02', 'yesterday'])(
    'refuses %j as a clock time',
    (text) => {
      expect(fromLocalInput(text, 'Europe/Berlin')).toBeNull();
    },
  );

  it('accepts a span of up to 31 days with the start before the end', () => {
    const ok = checkCustomRange('2026-03-01T00:00', '2026-04-01T00:00', 'Europe/Berlin');
    // 1 March 00:00 CET (+01:00) to 1 April 00:00 CEST (+02:00): 31 days less the skipped hour.
    expect(ok).toEqual({
      ok: true,
      fromMs: Date.parse('2026-02-28T23:00:00Z'),
      toMs: Date.parse('2026-03-31T22:00:00Z'),
    });
  });

  it.each([
    ['2026-03-05T06:00', '2026-03-05T06:00', 'to', 'The end must come after the start.'],
    ['2026-03-05T06:00', '2026-03-04T06:00', 'to', 'The end must come after the start.'],
    // 1 Jan 00:00 to 1 Feb 00:01 (no DST change in between): 31 days and a minute.
    ['2026-01-01T00:00', '2026-02-01T00:01', 'to', 'Choose at most 31 days at a time.'],
    ['nope', '2026-02-01T00:00', 'from', 'Enter a start as a date and time.'],
    ['2026-01-01T00:00', '', 'to', 'Enter an end as a date and time.'],
  ])('refuses %s → %s', (from, to, field, message) => {
    expect(checkCustomRange(from, to, 'Europe/Berlin')).toEqual({ ok: false, field, message });
  });
});

describe('axis ticks over days', () => {
  it('puts a tick on each Berlin midnight across the spring change (23-hour day)', () => {
    // 27 March 12:00Z to 31 March 12:00Z. Midnights: 28 Mar 00:00 CET = 27 Mar 23:00Z,
    // 29 Mar 00:00 CET = 28 Mar 23:00Z, 30 Mar 00:00 CEST = 29 Mar 22:00Z (23 h later),
    // 31 Mar 00:00 CEST = 30 Mar 22:00Z.
    const from = Date.parse('2026-03-27T12:00:00Z');
    const to = Date.parse('2026-03-31T12:00:00Z');
    expect(midnightTicks(from, to, 'Europe/Berlin', 1).map(iso)).toEqual([
      '2026-03-27T23:00:00.000Z',
      '2026-03-28T23:00:00.000Z',
      '2026-03-29T22:00:00.000Z',
      '2026-03-30T22:00:00.000Z',
    ]);
  });

  it('a 7-day chart on a phone gets daily midnights labelled with weekday and date', () => {
    const to = Date.parse('2026-03-31T12:00:00Z');
    const from = to - 7 * 24 * HOUR_MS;
    // 340 px: 5 date labels fit (60 px each), so days go in steps of 2 (7 / 2 ≤ 5), on even days since
    // 1970-01-01 so the ticks stay put as the window slides: 26 March 2026 is day 20,538.
    const axis = axisTicks(from, to, 'Europe/Berlin', 340);
    expect(axis.ticks.map((t) => axis.label(t))).toEqual(['26 Mar', '28 Mar', '30 Mar']);
    // 180 px: 3 labels, 7 / 2 > 3, so every third day: day 20,538 (26 March) is 3 × 6,846.
    const narrow = axisTicks(from, to, 'Europe/Berlin', 180);
    expect(narrow.ticks.map((t) => narrow.label(t))).toEqual(['26 Mar', '29 Mar']);
    // Wide: 1,000 px fits 16 labels, one a day.
    const wide = axisTicks(from, to, 'Europe/Berlin', 1000);
    expect(wide.ticks).toHaveLength(7);
    expect(wide.label(wide.ticks[0]!)).toBe('Wed 25');
  });

  it('a 30-day chart steps by weeks on Mondays, by fortnights on a phone', () => {
    const to = Date.parse('2026-03-31T12:00:00Z');
    // 340 px: 5 date labels fit (60 px each), 30 / 7 ≤ 5. March 2026's Mondays: 2, 9, 16, 23, 30.
    const wide = axisTicks(to - 30 * 24 * HOUR_MS, to, 'Europe/Berlin', 340);
    expect(wide.ticks.map((t) => wide.label(t))).toEqual([
      '2 Mar',
      '9 Mar',
      '16 Mar',
      '23 Mar',
      '30 Mar',
    ]);
    // 200 px: 3 date labels (60 px each), 30 / 7 > 3, so every other Monday, counted from
    // 5 January 1970 (2 March 2026 is 20,510 days later: 1,465 fortnights).
    const phone = axisTicks(to - 30 * 24 * HOUR_MS, to, 'Europe/Berlin', 200);
    expect(phone.ticks.map((t) => phone.label(t))).toEqual(['2 Mar', '16 Mar', '30 Mar']);
  });
});
