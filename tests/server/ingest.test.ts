// POST /api/v1/ingest end to end on the real test database: stored rows, derived values
// (against psychrolib), units, duplicates, per-reading rejections, the surface estimate,
// malformed bodies and revoked tokens.
import psychrolib from 'psychrolib';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { errorShape } from '../support/errorShape';
import { postIngest } from '../support/ingest';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
  psychrolib.SetUnitSystem(psychrolib.SI);
});
afterAll(() => t.pool.end());

describe('ingest', () => {
  it('stores a reading and returns the derived values', async () => {
    const o = await ownerWithSensor(t);
    const at = new Date(Date.now() - 60_000).toISOString();
    const res = await postIngest(t.app, o.token, {
      readings: [{ at, air: 20, rh: 50, surface: 12, battery: 3.01 }],
    }).expect(202);
    expect(res.body).toMatchObject({ stored: 1, duplicates: 0, rejected: [] });
    const result = res.body.results[0];
    // Reference: psychrolib (ASHRAE Handbook — Fundamentals psychrometric functions), 20 °C / 50 %.
    const expectedDewC = psychrolib.GetTDewPointFromRelHum(20, 0.5);
    expect(expectedDewC).toBeCloseTo(9.26, 1); // sanity: the commonly tabulated 9.3 °C
    expect(Math.abs(result.dewPoint - expectedDewC)).toBeLessThanOrEqual(0.05);
    expect(result.margin).toBeCloseTo(12 - result.dewPoint, 10);
    // 12 − 9.26 = 2.74 K: inside the 3 K caution limit (ISO 8502-4) and above the 1 K wet limit.
    expect(result.level).toBe('close');
    expect(result.surfaceSource).toBe('probe');
    // Wood Handbook (FPL-GTR-190) table 4-2: 68 °F / 50 % RH → 9.2 %.
    expect(result.emc).toBeGreaterThan(9.0);
    expect(result.emc).toBeLessThan(9.4);
    expect(result.at).toBe(at);
  });

  it('accepts a single reading in °F with epoch seconds, and counts a retry as a duplicate', async () => {
    const o = await ownerWithSensor(t);
    const atS = Math.floor(Date.now() / 1000) - 120;
    const body = { unit: 'F', at: atS, air: 68, rh: 50, surface: 53.6 };
    const first = await postIngest(t.app, o.token, body).expect(202);
    expect(first.body.stored).toBe(1);
    // 53.6 °F = 12 °C; 68 °F = 20 °C.
    expect(first.body.results[0].margin).toBeCloseTo(12 - first.body.results[0].dewPoint, 6);
    const retry = await postIngest(t.app, o.token, body).expect(202);
    expect(retry.body).toMatchObject({ stored: 0, duplicates: 1 });
  });

  it('rejects out-of-range readings one by one and stores the rest', async () => {
    const o = await ownerWithSensor(t);
    const base = Date.now() - 10 * 60_000;
    const res = await postIngest(t.app, o.token, {
      readings: [
        { at: new Date(base).toISOString(), air: 15, rh: 60 },
        { at: new Date(base + 1000).toISOString(), air: 15, rh: 100.5 },
        { at: new Date(base + 2000).toISOString(), air: 90, rh: 50 },
        { at: new Date(Date.now() + 10 * 60_000).toISOString(), air: 15, rh: 50 },
      ],
    }).expect(202);
    expect(res.body.stored).toBe(1);
    expect(
      res.body.rejected.map((r: { index: number; code: string }) => [r.index, r.code]),
    ).toEqual([
      [1, 'rh_out_of_range'],
      [2, 'air_out_of_range'],
      [3, 'time_in_future'],
    ]);
    // No probe: the first estimate of the iron starts at the air temperature.
    expect(res.body.results[0]).toMatchObject({ surfaceSource: 'estimate' });
    expect(res.body.results[0].margin).toBeCloseTo(15 - res.body.results[0].dewPoint, 6);
  });

  it('estimates the surface of a sensor without a probe as a first-order lag of the air', async () => {
    const o = await ownerWithSensor(t);
    const hourMs = 3_600_000;
    const t0 = Date.now() - 4 * hourMs;
    const post = (readings: object[]) => postIngest(t.app, o.token, { readings }).expect(202);
    // A step of the air from 10 to 20 °C, posted in two requests (the state carries over).
    await post([{ at: new Date(t0).toISOString(), air: 10, rh: 50 }]);
    const res = await post(
      [1, 2, 3].map((h) => ({ at: new Date(t0 + h * hourMs).toISOString(), air: 20, rh: 50 })),
    );
    // Analytic step response of a first-order lag: after τ (3 h, the default) the surface has
    // covered 1 − e⁻¹ = 63.2 % of the step: 10 + 10 × 0.632 = 16.32 °C.
    const surfaceAfterTauC = 20 - 10 * Math.exp(-1);
    const last = res.body.results[2];
    expect(last.surfaceSource).toBe('estimate');
    expect(last.margin + last.dewPoint).toBeCloseTo(surfaceAfterTauC, 6);
  });

  it.each([
    ['no token', undefined, 'missing_token'],
    ['an unknown token', 'Bearer dbs_not-a-real-token', 'invalid_token'],
    ['a non-bearer scheme', 'Basic abc', 'missing_token'],
  ])('answers 401 to %s', async (_name, header, code) => {
    const req = request(t.app).post('/api/v1/ingest').send({ air: 20, rh: 50 });
    const res = await (header ? req.set('authorization', header) : req).expect(401);
    expect(res.body).toMatchObject(errorShape);
    expect(res.body.error.code).toBe(code);
  });

  it('answers 400 in the error shape to malformed JSON and to wrong types', async () => {
    const o = await ownerWithSensor(t);
    const broken = await request(t.app)
      .post('/api/v1/ingest')
      .set('authorization', `Bearer ${o.token}`)
      .set('content-type', 'application/json')
      .send('{"air": 20, "rh": ')
      .expect(400);
    expect(broken.body).toMatchObject(errorShape);
    expect(broken.body.error.code).toBe('invalid_json');
    const wrongType = await postIngest(t.app, o.token, {
      readings: [{ air: '20', rh: 50 }],
    }).expect(400);
    expect(wrongType.body.error.details[0].path).toBe('readings.0.air');
    const empty = await postIngest(t.app, o.token, { readings: [] }).expect(400);
    expect(empty.body).toMatchObject(errorShape);
  });

  it('refuses a revoked token', async () => {
    const o = await ownerWithSensor(t);
    await postIngest(t.app, o.token, { air: 20, rh: 50 }).expect(202);
    await o.agent.delete(`/api/v1/shops/${o.shopId}/sensors/${o.sensorId}/token`).expect(204);
    await postIngest(t.app, o.token, { air: 20, rh: 50 }).expect(401);
  });
});
