// The batch ingest path turns each reading's time into text once (server/readings/prepare.ts
// atIso), for the insert's array and the answer both: a count of Date#toISOString calls over one
// 50-reading request, not a timing (this machine is shared). The answer's times must still be
// what PostgreSQL stored, rendered by PostgreSQL itself (to_char in UTC).
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { postIngest } from '../support/ingest';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp({ sensorRate: { ratePerS: 1e6, burst: 1e6 } });
});
afterAll(() => t.pool.end());

describe('a 50-reading batch', () => {
  it('makes each time into text once, and answers the times stored', async () => {
    const o = await ownerWithSensor(t);
    const startMs = Date.now() - 60 * 60_000;
    // Whole seconds with an offset, so the sent text is not the stored text's form.
    const readings = Array.from({ length: 50 }, (_, i) => ({
      at: new Date(startMs + i * 60_000).toISOString().replace(/\.\d{3}Z$/, '+00:00'),
      air: 18 + (i % 5) * 0.1,
      rh: 55,
      surface: 16,
    }));
    // Warm the sensor's caches first, so the count is the steady path's.
    await postIngest(t.app, o.token, { readings: readings.slice(0, 1) }).expect(202);
    const spy = vi.spyOn(Date.prototype, 'toISOString');
    let calls: number;
    let res;
    try {
      res = await postIngest(t.app, o.token, { readings: readings.slice(1) }).expect(202);
      calls = spy.mock.calls.length;
    } finally {
      spy.mockRestore();
    }
    expect(res.body.stored).toBe(49);
    // One per reading, plus a few per request (the sensor's latest time, the live message's
    // newest reading). Counted at the change: 100 calls before (twice per reading), 51 after.
    expect(calls).toBeGreaterThanOrEqual(49);
    expect(calls).toBeLessThan(49 + 10);
    const { rows } = await t.pool.query(
      `select to_char(at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') as at
       from readings where sensor_id = $1 order by at offset 1`,
      [o.sensorId],
    );
    expect(res.body.results.map((r: { at: string }) => r.at)).toEqual(rows.map((r) => r.at));
  });
});
