// The bucket plan of a zone's history (server/readings/bucketPlan.ts): at most the points asked
// for, whatever the window's alignment, and bucket edges on the shop's local midnight.
import { describe, expect, it } from 'vitest';

import { bucketCount, bucketPlan, localMidnightMs } from '@/server/readings/bucketPlan';

const HOUR_MS = 3_600_000;
const DAY_MS = 24 * HOUR_MS;

describe('bucket plan', () => {
  // The app's ranges (6 h, 24 h, 7 d, 30 d) and the 31-day cap, at awkward start times (not on
  // a minute, across the Europe/Berlin and America/Chicago DST changes of 2026: 29 March and
  // 1 November), in zones with half- and quarter-hour offsets.
  const spans = [6 * HOUR_MS, DAY_MS, 7 * DAY_MS, 30 * DAY_MS, 31 * DAY_MS];
  const starts = [
    Date.parse('2026-03-28T13:17:41.123Z'),
    Date.parse('2026-10-31T23:59:59.999Z'),
    Date.parse('2026-12-02T00:00:00.000Z'),
  ];
  const zones = ['Europe/Berlin', 'America/Chicago', 'Asia/Kolkata', 'Asia/Kathmandu', 'UTC'];
  const cases = spans.flatMap((span) =>
    starts.flatMap((from) =>
      zones.flatMap((zone) => [500, 300, 31, 7, 2].map((points) => ({ span, from, zone, points }))),
    ),
  );

  it.each(cases)('never more than the cap: %o', ({ span, from, zone, points }) => {
    const plan = bucketPlan(from, from + span, points, zone);
    expect(bucketCount(plan, from, from + span)).toBeLessThanOrEqual(points);
  });

  it('picks a width that divides a day, starting from the local midnight', () => {
    // 7 days in 500 points: 604,800 s / 500 = 1,209.6 s at least. The divisors of 86,400 =
    // 2^7 · 3^3 · 5^2 between 1,200 and 1,400 are 1,200 and 1,350 (22.5 min, a day / 64); 1,200
    // is too narrow, so 1,350 s: 448 buckets plus one for the start's alignment.
    const from = Date.parse('2026-03-02T06:10:00Z');
    const plan = bucketPlan(from, from + 7 * DAY_MS, 500, 'Europe/Berlin');
    expect(plan.bucketSeconds).toBe(1350);
    // Berlin is UTC+1 in March before the change: midnight of 2 March is 1 March 23:00 UTC.
    expect(plan.originMs).toBe(Date.parse('2026-03-01T23:00:00Z'));
  });

  // Over 7 days the history reads hourly roll-ups: whole-hour buckets from a whole UTC hour.
  // Kolkata is UTC+05:30 (hand-converted): its midnight of 2 March is 1 March 18:30 UTC, so the
  // buckets start at 18:00 UTC; Berlin (UTC+1 in March) keeps its midnight, 23:00 UTC.
  it.each([
    ['Asia/Kolkata', '2026-03-01T18:00:00Z'],
    ['Europe/Berlin', '2026-03-01T23:00:00Z'],
  ])('over 7 days in %s: whole hours from a whole hour', (zone, origin) => {
    const from = Date.parse('2026-03-02T06:10:00Z');
    // 30 days in 500 points: 720 h are too many one-hour buckets, so two hours (361 buckets).
    const plan = bucketPlan(from, from + 30 * DAY_MS, 500, zone);
    expect(plan.bucketSeconds).toBe(7200);
    expect(plan.originMs).toBe(Date.parse(origin));
    // Exactly 7 days stays on the finer plan (raw readings).
    expect(bucketPlan(from, from + 7 * DAY_MS, 500, zone).bucketSeconds % 3600).not.toBe(0);
  });

  it.each([
    // Shop-local midnights, hand-converted from the zones' offsets on those days.
    ['2026-03-29T12:00:00Z', 'Europe/Berlin', '2026-03-28T23:00:00Z'], // CEST starts at 02:00
    ['2026-03-30T12:00:00Z', 'Europe/Berlin', '2026-03-29T22:00:00Z'],
    ['2026-11-01T12:00:00Z', 'America/Chicago', '2026-11-01T05:00:00Z'], // CDT until 02:00
    ['2026-11-02T12:00:00Z', 'America/Chicago', '2026-11-02T06:00:00Z'],
    ['2026-06-01T20:00:00Z', 'Asia/Kolkata', '2026-06-01T18:30:00Z'], // UTC+5:30: next day
  ])('local midnight before %s in %s is %s', (at, zone, midnight) => {
    expect(localMidnightMs(Date.parse(at), zone)).toBe(Date.parse(midnight));
  });
});
