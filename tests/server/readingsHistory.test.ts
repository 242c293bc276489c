// A zone's history over a long range (GET …/zones/:zoneId/readings): buckets keep both the
// lowest and the highest dew margin, so a two-minute dip below the dew point inside a 30-day
// window survives, and no answer carries more points than asked for.
import psychrolib from 'psychrolib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { querySeries } from '@/db/queries/readings';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { postIngest } from '../support/ingest';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
  psychrolib.SetUnitSystem(psychrolib.SI);
});
afterAll(() => t.pool.end());

const MINUTE_MS = 60_000;
const DAY_MS = 24 * 60 * MINUTE_MS;

interface Point {
  at: string;
  marginMin: number | null;
  marginMax: number | null;
  level: string;
  count: number;
}

describe('zone history over 30 days', () => {
  it('keeps a 2-minute dip to −0.5 K as the bucket minimum, the dry margin as its maximum', async () => {
    const o = await ownerWithSensor(t);
    // Reference values from psychrolib (ASHRAE Handbook — Fundamentals, ch. 1): at 20 °C and
    // 50 % RH the dew point is 9.26 °C, so a 15 °C top sits 5.74 K above it (dry), and a top
    // at dew − 0.5 K is wet (the default wet limit is 1 K).
    const dewC = psychrolib.GetTDewPointFromRelHum(20, 0.5);
    const dryMarginK = 15 - dewC;
    const toMs = Math.floor(Date.now() / MINUTE_MS) * MINUTE_MS;
    const fromMs = toMs - 30 * DAY_MS;
    const everyTenMinutes = Array.from({ length: (30 * DAY_MS) / (10 * MINUTE_MS) }, (_, i) => ({
      at: new Date(fromMs + i * 10 * MINUTE_MS).toISOString(),
      air: 20,
      rh: 50,
      surface: 15,
    }));
    // The dip: two readings a minute apart, 17 days in, between the ten-minute readings.
    const dipMs = fromMs + 17 * DAY_MS + 3 * MINUTE_MS;
    const dip = [0, 1].map((i) => ({
      at: new Date(dipMs + i * MINUTE_MS).toISOString(),
      air: 20,
      rh: 50,
      surface: dewC - 0.5,
    }));
    const all = [...everyTenMinutes, ...dip];
    for (let i = 0; i < all.length; i += 1000) {
      await postIngest(t.app, o.token, { readings: all.slice(i, i + 1000) }).expect(202);
    }

    const res = await o.agent
      .get(`/api/v1/shops/${o.shopId}/zones/${o.zoneId}/readings`)
      .query({ from: new Date(fromMs).toISOString(), to: new Date(toMs).toISOString() })
      .expect(200);
    const points = res.body.points as Point[];
    expect(res.body.bucketSeconds).toBeGreaterThan(0);
    // The default cap is 500 points per series.
    expect(points.length).toBeLessThanOrEqual(500);
    // Every reading is in exactly one bucket.
    expect(points.reduce((n, p) => n + p.count, 0)).toBe(all.length);

    const bucketMs = res.body.bucketSeconds * 1000;
    const holding = points.filter((p) => {
      const startMs = Date.parse(p.at);
      return startMs <= dipMs && dipMs < startMs + bucketMs;
    });
    expect(holding).toHaveLength(1);
    const bucket = holding[0]!;
    // The dip is two of the bucket's readings; the rest of it is dry.
    expect(bucket.count).toBeGreaterThan(2);
    expect(bucket.marginMin).toBeCloseTo(-0.5, 1);
    expect(bucket.marginMax).toBeCloseTo(dryMarginK, 1);
    expect(bucket.level).toBe('wet');
    // Every other bucket stays dry, its minimum and maximum both the dry margin.
    const others = points.filter((p) => p !== bucket);
    expect(others.every((p) => p.level === 'dry')).toBe(true);
    expect(Math.min(...others.map((p) => p.marginMin!))).toBeCloseTo(dryMarginK, 1);
    expect(Math.max(...others.map((p) => p.marginMax!))).toBeCloseTo(dryMarginK, 1);

    // Bucket edges fall on round local times: the width divides a day, and the first bucket
    // starts on a whole multiple of it from the shop's midnight (Europe/Oslo, the test shop's).
    expect(86_400 % res.body.bucketSeconds).toBe(0);

    // Any cap is honoured, also when a bucket a day wide would leave too many (31 days, 7).
    for (const points of [500, 120, 31, 7, 2]) {
      const capped = await o.agent
        .get(`/api/v1/shops/${o.shopId}/zones/${o.zoneId}/readings`)
        .query({
          from: new Date(toMs - 31 * DAY_MS).toISOString(),
          to: new Date(toMs).toISOString(),
          points,
        })
        .expect(200);
      expect(capped.body.points.length).toBeLessThanOrEqual(points);
      const lowest = Math.min(...(capped.body.points as Point[]).map((p) => p.marginMin!));
      expect(lowest).toBeCloseTo(-0.5, 1);
    }

    // Called without a plan (as other server code may), the query cuts equal slices from
    // `from`: 31 days in at most 7, the dip still the lowest.
    const plain = await querySeries(t.db, {
      zoneId: o.zoneId,
      from: new Date(toMs - 31 * DAY_MS),
      to: new Date(toMs),
      points: 7,
    });
    expect(plain.rows.length).toBeLessThanOrEqual(7);
    expect(Math.min(...plain.rows.map((r) => r.marginMinK!))).toBeCloseTo(-0.5, 1);
    expect(Math.max(...plain.rows.map((r) => r.marginMaxK!))).toBeCloseTo(dryMarginK, 1);
  }, 60_000);
});
