// GET …/zones/:zoneId/readings: raw points, downsampled buckets that keep the lowest margin,
// another shop's zone, and the JSON 404 of unknown API paths.
import psychrolib from 'psychrolib';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, ownerWithSensor, verifiedPerson, type TestApp } from '../support/app';
import { errorShape } from '../support/errorShape';
import { postIngest } from '../support/ingest';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
  psychrolib.SetUnitSystem(psychrolib.SI);
});
afterAll(() => t.pool.end());

describe('readings query', () => {
  it('returns what was posted, oldest first, with the zone list showing the newest', async () => {
    const o = await ownerWithSensor(t);
    const start = Date.now() - 30 * 60_000;
    const readings = [0, 1, 2].map((i) => ({
      at: new Date(start + i * 60_000).toISOString(),
      air: 18 + i,
      rh: 55,
      surface: 14,
    }));
    await postIngest(t.app, o.token, { readings }).expect(202);

    const series = await o.agent
      .get(`/api/v1/shops/${o.shopId}/zones/${o.zoneId}/readings`)
      .expect(200);
    expect(series.body.bucketSeconds).toBe(0);
    expect(series.body.points.map((p: { at: string; air: number }) => [p.at, p.air])).toEqual(
      readings.map((r) => [r.at, r.air]),
    );
    expect(series.body.points[0]).toMatchObject({ rh: 55, surface: 14, count: 1 });

    const zones = await o.agent.get(`/api/v1/shops/${o.shopId}/zones`).expect(200);
    expect(zones.body.zones).toHaveLength(1);
    expect(zones.body.zones[0].latest).toMatchObject({
      at: readings[2]!.at,
      air: 20,
      rh: 55,
      surface: 14,
    });
  });

  it("names the zone's first reading ever, even when it lies before the window", async () => {
    const o = await ownerWithSensor(t);
    const path = `/api/v1/shops/${o.shopId}/zones/${o.zoneId}/readings`;
    const none = await o.agent.get(path).expect(200);
    expect(none.body.firstAt).toBeNull();

    const firstMs = Date.now() - 30 * 3_600_000;
    const first = new Date(firstMs).toISOString();
    const recent = new Date(Date.now() - 10 * 60_000).toISOString();
    await postIngest(t.app, o.token, {
      readings: [
        { at: first, air: 18, rh: 55 },
        { at: recent, air: 19, rh: 55 },
      ],
    }).expect(202);
    // The default window is the last 24 h: the 30 h old reading is outside it, yet it is the
    // zone's first, so the app knows this zone has more than a day of history.
    const series = await o.agent.get(path).expect(200);
    expect(series.body.points.map((p: { at: string }) => p.at)).toEqual([recent]);
    expect(series.body.firstAt).toBe(first);
  });

  it('downsamples into buckets that keep the lowest margin', async () => {
    const o = await ownerWithSensor(t);
    const start = Date.now() - 100 * 60_000;
    // 100 one-minute readings; one dip of the surface to 5 °C must survive the downsampling.
    const readings = Array.from({ length: 100 }, (_, i) => ({
      at: new Date(start + i * 60_000).toISOString(),
      air: 20,
      rh: 50,
      surface: i === 37 ? 5 : 15,
    }));
    await postIngest(t.app, o.token, { readings }).expect(202);
    const from = new Date(start).toISOString();
    const to = new Date(start + 100 * 60_000).toISOString();
    const res = await o.agent
      .get(`/api/v1/shops/${o.shopId}/zones/${o.zoneId}/readings`)
      .query({ from, to, points: 10 })
      .expect(200);
    // 6,000 s in at most 10 buckets: 600 s at least, widened to the next width that divides a
    // day when the window straddles a bucket edge (server/readings/bucketPlan.ts).
    expect(res.body.bucketSeconds).toBeGreaterThanOrEqual(600);
    expect(86_400 % res.body.bucketSeconds).toBe(0);
    expect(res.body.points.length).toBeLessThanOrEqual(10);
    expect(res.body.points.reduce((n: number, p: { count: number }) => n + p.count, 0)).toBe(100);
    const bucketMs = res.body.bucketSeconds * 1000;
    const bucketOf = (atMs: number) =>
      res.body.points.find(
        (p: { at: string }) => Date.parse(p.at) <= atMs && atMs < Date.parse(p.at) + bucketMs,
      );
    const dip = bucketOf(start + 37 * 60_000);
    const dewC = psychrolib.GetTDewPointFromRelHum(20, 0.5);
    expect(dip.marginMin).toBeCloseTo(5 - dewC, 1);
    expect(dip.marginMax).toBeCloseTo(15 - dewC, 1);
    expect(dip.level).toBe('wet');
    // 15 − 9.26 = 5.7 K: dry (≥ 3 K caution limit) in a bucket without the dip.
    expect(bucketOf(start + 90 * 60_000).level).toBe('dry');
  });

  it('hides another shop: 404 for a stranger, 401 without a session', async () => {
    const o = await ownerWithSensor(t);
    const stranger = await verifiedPerson(t, 'Stranger');
    const res = await stranger.agent
      .get(`/api/v1/shops/${o.shopId}/zones/${o.zoneId}/readings`)
      .expect(404);
    expect(res.body).toMatchObject(errorShape);
    await stranger.agent.get(`/api/v1/shops/${o.shopId}/zones`).expect(404);
    await stranger.agent
      .post(`/api/v1/shops/${o.shopId}/zones`)
      .send({ name: 'Mine now' })
      .expect(404);
    await request(t.app).get(`/api/v1/shops/${o.shopId}/zones`).expect(401);
  });

  // 20 °C at 50 % RH: dew point 9.26 °C (psychrolib, see ingest.test.ts), so a surface of
  // 11.26 °C sits 2 K above it — close under the default limits (caution 3 K, wet 1 K).
  it('keeps the level stored with each reading when the zone limits change later', async () => {
    const o = await ownerWithSensor(t);
    const start = Date.now() - 20 * 60_000;
    const readings = Array.from({ length: 30 }, (_, i) => ({
      at: new Date(start + i * 30_000).toISOString(),
      air: 20,
      rh: 50,
      surface: 11.26,
    }));
    await postIngest(t.app, o.token, { readings }).expect(202);
    // Under these limits 2 K would be dry; what was stored as close stays close.
    await o.agent
      .patch(`/api/v1/shops/${o.shopId}/zones/${o.zoneId}`)
      .send({ cautionK: 1.5, wetK: 0.5 })
      .expect(200);
    const path = `/api/v1/shops/${o.shopId}/zones/${o.zoneId}/readings`;
    const raw = await o.agent.get(path).expect(200);
    expect(raw.body.bucketSeconds).toBe(0);
    expect(new Set(raw.body.points.map((p: { level: string }) => p.level))).toEqual(
      new Set(['close']),
    );
    const bucketed = await o.agent.get(path).query({ points: 5 }).expect(200);
    expect(bucketed.body.bucketSeconds).toBeGreaterThan(0);
    expect(new Set(bucketed.body.points.map((p: { level: string }) => p.level))).toEqual(
      new Set(['close']),
    );
  });

  it('answers unknown API paths with a JSON 404', async () => {
    const res = await request(t.app).get('/api/v1/nothing-here').expect(404);
    expect(res.body).toMatchObject(errorShape);
  });
});
