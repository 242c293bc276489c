/**
 * How a zone's series is bucketed: the bucket width and the date_bin origin. The origin is the
 * shop-local midnight of the window's first day and the width divides a day, so bucket
 * boundaries fall on round local times (every 24 min, 1 h 30…) and each local midnight before
 * the next daylight-saving change starts a bucket — a chart's midnight tick then marks a
 * bucket's edge, not the middle of one.
 */
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';

import { ROLLUP_RANGE_MS } from '@/db/queries/readingRollups';

const DAY_S = 86_400;
const HOUR_S = 3_600;
const HOUR_MS = HOUR_S * 1000;

// Every whole number of seconds that divides a day, smallest first: 1, 2, 3 … 43200, 86400.
const DAY_DIVISORS_S = Array.from({ length: DAY_S }, (_, i) => i + 1).filter(
  (s) => DAY_S % s === 0,
);

export interface BucketPlan {
  bucketSeconds: number;
  originMs: number;
}

/** Buckets date_bin makes over [fromMs, toMs] (both ends included) with this plan. */
export function bucketCount(plan: BucketPlan, fromMs: number, toMs: number): number {
  const widthMs = plan.bucketSeconds * 1000;
  const first = Math.floor((fromMs - plan.originMs) / widthMs);
  const last = Math.floor((toMs - plan.originMs) / widthMs);
  return last - first + 1;
}

/** The shop-local midnight at or before `atMs`. */
export function localMidnightMs(atMs: number, timeZone: string): number {
  const day = formatInTimeZone(atMs, timeZone, 'yyyy-MM-dd');
  return fromZonedTime(`${day}T00:00:00`, timeZone).getTime();
}

/**
 * The narrowest bucket that divides a day and still leaves at most `maxPoints` buckets over the
 * window, counted with the origin's alignment (a window that starts mid-bucket needs one more).
 * Windows too long for a day-sized bucket (over `maxPoints` days) fall back to equal buckets
 * from the window's start.
 *
 * Windows over ROLLUP_RANGE_MS are read from the hourly roll-ups, so their buckets are whole
 * hours (1, 2, 3, 4, 6, 8, 12 h, then whole days) from a whole UTC hour: the local midnight,
 * or in a zone with a half- or quarter-hour offset the UTC hour just before it.
 */
export function bucketPlan(
  fromMs: number,
  toMs: number,
  maxPoints: number,
  timeZone: string,
): BucketPlan {
  if (toMs - fromMs > ROLLUP_RANGE_MS) return hourBucketPlan(fromMs, toMs, maxPoints, timeZone);
  const originMs = localMidnightMs(fromMs, timeZone);
  const spanS = (toMs - fromMs) / 1000;
  for (const bucketSeconds of DAY_DIVISORS_S) {
    if (bucketSeconds * maxPoints < spanS) continue;
    const plan = { bucketSeconds, originMs };
    if (bucketCount(plan, fromMs, toMs) <= maxPoints) return plan;
  }
  // Equal buckets from `fromMs`: floor(span / width) + 1 ≤ maxPoints.
  const bucketSeconds = Math.max(1, Math.ceil(spanS / Math.max(1, maxPoints - 1)));
  return { bucketSeconds, originMs: fromMs };
}

function hourBucketPlan(
  fromMs: number,
  toMs: number,
  maxPoints: number,
  timeZone: string,
): BucketPlan {
  const originMs = Math.floor(localMidnightMs(fromMs, timeZone) / HOUR_MS) * HOUR_MS;
  for (const bucketSeconds of DAY_DIVISORS_S.filter((s) => s % HOUR_S === 0)) {
    const plan = { bucketSeconds, originMs };
    if (bucketCount(plan, fromMs, toMs) <= maxPoints) return plan;
  }
  // Whole days: two buckets at the least need a bucket over half the window.
  for (let days = 2; ; days++) {
    const plan = { bucketSeconds: days * DAY_S, originMs };
    if (bucketCount(plan, fromMs, toMs) <= maxPoints) return plan;
  }
}
