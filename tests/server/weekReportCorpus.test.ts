// Bad queries to GET …/reports/week: each a 400 in the shared error shape, never a 500.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, verifiedPerson, type TestApp } from '../support/app';
import { errorShape } from '../support/errorShape';

let t: TestApp;
let path: string;
let agent: Awaited<ReturnType<typeof verifiedPerson>>['agent'];
beforeAll(async () => {
  t = makeTestApp();
  const o = await verifiedPerson(t, 'Owner');
  agent = o.agent;
  const shopId = (
    await agent
      .post('/api/v1/shops')
      .send({ name: 'Tamarack', timeZone: 'Europe/Berlin' })
      .expect(201)
  ).body.id as string;
  path = `/api/v1/shops/${shopId}/reports/week`;
});
afterAll(() => t.pool.end());

describe('week report query corpus', () => {
  it.each([
    ['start without its day', 'start=2026-03', 'start'],
    ['start with month 13', 'start=2026-13-01', 'start'],
    ['start on 30 February', 'start=2026-02-30', 'start'],
    ['start on a Tuesday', 'start=2026-03-24', 'start'],
    ['start on a Sunday', 'start=2026-03-29', 'start'],
    // 2030-01-07 is a Monday (2030-01-01 is a Tuesday), years after the current week.
    ['start in the far future', 'start=2030-01-07', 'start'],
    ['start not a date', 'start=abc', 'start'],
    // A Monday, but before any reading can exist (the ingest contract refuses years before 2000).
    ['start before 2000', 'start=1999-12-27', 'start'],
    ['start empty', 'start=', 'start'],
    ['start with a time', 'start=2026-03-23T00:00:00Z', 'start'],
    ['start given twice (an array)', 'start=2026-03-23&start=2026-03-30', 'start'],
    ['format xls', 'format=xls', 'format'],
    ['format given twice', 'format=csv&format=pdf', 'format'],
    ['an unknown key', 'start=2026-03-23&week=12', ''],
  ])('%s → 400', async (_name, query, detailPath) => {
    const res = await agent.get(`${path}?${query}`);
    expect(res.status, res.text).toBe(400);
    expect(res.body).toMatchObject(errorShape);
    expect(res.body.error.code).toBe('invalid_input');
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(detailPath);
  });

  it('answers a good Monday (the check that the corpus is not refusing everything)', async () => {
    const res = await agent.get(`${path}?start=2026-03-23&format=json`).expect(200);
    expect(res.body.week.hours).toBe(167);
  });
});
