// Ingest behaviour that spans requests: the per-sensor limit, and the surface estimate's state
// surviving a server restart (a new process rebuilds it from the stored readings).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { postIngest } from '../support/ingest';

const apps: TestApp[] = [];
const app = (options: Parameters<typeof makeTestApp>[0] = {}) => {
  const t = makeTestApp(options);
  apps.push(t);
  return t;
};
let first: TestApp;

beforeAll(() => {
  first = app();
});
afterAll(async () => {
  await Promise.all(apps.map((t) => t.pool.end()));
});

describe('the per-sensor limit', () => {
  it('answers 429 with Retry-After once a sensor spends its burst, and only for that sensor', async () => {
    const t = app({ sensorRate: { ratePerS: 0.5, burst: 5 } });
    const noisy = await ownerWithSensor(t);
    const quiet = await ownerWithSensor(t);
    const post = (token: string) => postIngest(t.app, token, { air: 18, rh: 50 });
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) statuses.push((await post(noisy.token)).status);
    expect(statuses).toEqual([202, 202, 202, 202, 202, 429]);
    const limited = await post(noisy.token);
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('rate_limited');
    // One token every 2 s at 0.5/s.
    expect(Number(limited.headers['retry-after'])).toBe(2);
    expect((await post(quiet.token)).status).toBe(202);
  });
});

describe('the surface estimate across a restart', () => {
  it('continues the lag from stored readings in a fresh server', async () => {
    const o = await ownerWithSensor(first);
    const hourMs = 3_600_000;
    const t0 = Date.now() - 3 * hourMs;
    const post = (t: TestApp, readings: object[]) =>
      postIngest(t.app, o.token, { readings }).expect(202);
    await post(first, [{ at: new Date(t0).toISOString(), air: 10, rh: 50 }]);
    await post(first, [{ at: new Date(t0 + hourMs).toISOString(), air: 20, rh: 50 }]);

    // A new process: nothing in memory, the same database.
    const restarted = app();
    const res = await post(restarted, [
      { at: new Date(t0 + 2 * hourMs).toISOString(), air: 20, rh: 50 },
    ]);
    const result = res.body.results[0];
    // First-order lag, τ = 3 h: two hours of a 10 K step → 20 − 10·e^(−2/3) = 14.87 °C. A
    // fresh start from the air would have said 20 °C.
    expect(result.surfaceSource).toBe('estimate');
    expect(result.margin + result.dewPoint).toBeCloseTo(20 - 10 * Math.exp(-2 / 3), 6);
  });
});

describe('alarms off the ingest path', () => {
  it('answers 202 without waiting for the alarms, which follow from the queue', async () => {
    const t = app({ awaitAlarms: false });
    const o = await ownerWithSensor(t);
    const start = Date.now() - 10 * 60_000;
    // Surface 2 K under the dew point of 20 °C / 50 % (9.3 °C): wet, four minutes running.
    const readings = [0, 1, 2, 3, 4].map((m) => ({
      at: new Date(start + m * 60_000).toISOString(),
      air: 20,
      rh: 50,
      surface: 7.3,
    }));
    await postIngest(t.app, o.token, { readings }).expect(202);
    let kinds: string[] = [];
    for (let i = 0; i < 100 && !kinds.includes('wet_surface'); i++) {
      const res = await o.agent.get(`/api/v1/shops/${o.shopId}/alarms?state=open`).expect(200);
      kinds = (res.body.alarms as { kind: string }[]).map((a) => a.kind);
      if (!kinds.includes('wet_surface')) await new Promise((r) => setTimeout(r, 20));
    }
    expect(kinds).toContain('wet_surface');
  });
});

describe('an alarm cleared and opened again within one batch', () => {
  it('closes the old wet-surface alarm and opens a new one', async () => {
    const o = await ownerWithSensor(first);
    const t0 = Date.now() - 60 * 60_000;
    // 20 °C / 50 % RH: dew point 9.3 °C. Surface 7.3 °C is wet (margin −2 K); 16 °C is dry.
    const at = (minute: number) => new Date(t0 + minute * 60_000).toISOString();
    const reading = (minute: number, surface: number) => ({
      at: at(minute),
      air: 20,
      rh: 50,
      surface,
    });
    const post = (readings: object[]) => postIngest(first.app, o.token, { readings }).expect(202);
    await post([0, 1, 2, 3, 4, 5].map((m) => reading(m, 7.3)));
    const wetAlarms = async () => {
      const res = await o.agent.get(`/api/v1/shops/${o.shopId}/alarms?state=all`).expect(200);
      return (res.body.alarms as { kind: string; clearedAt: string | null }[]).filter(
        (a) => a.kind === 'wet_surface',
      );
    };
    expect(await wetAlarms()).toHaveLength(1);
    // Twenty dry minutes, then wet again — all in one request.
    await post([
      ...Array.from({ length: 20 }, (_, i) => reading(6 + i, 16)),
      ...[26, 27, 28, 29, 30, 31].map((m) => reading(m, 7.3)),
    ]);
    const after = await wetAlarms();
    expect(after).toHaveLength(2);
    expect(after.filter((a) => a.clearedAt === null)).toHaveLength(1);
  });
});
