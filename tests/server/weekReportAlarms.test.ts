// The week report's alarms: opened in the week (by the real engine, from readings posted through
// the ingest route), acknowledged through the API at chosen moments of the app's clock, and the
// counts, median and longest time to acknowledge worked out by hand from those moments. Also
// which week is "the last complete one" and the partial current week, on the same clock.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { Alarm } from '@/ingest/wire/alarms';

import { alarmsOf, postBatch, withMargin } from '../support/alarms';
import { makeTestApp, verifiedPerson, type TestApp } from '../support/app';

const MIN = 60_000;
let clockMs = Date.parse('2026-11-19T12:00:00Z');
let t: TestApp;
beforeAll(() => {
  t = makeTestApp({ now: () => clockMs });
});
afterAll(() => t.pool.end());

/** A wet spell: 10 min at a 0.5 K margin (wet), then 50 min at 6 K (dry), one reading a minute. */
function episode(startIso: string) {
  const startMs = Date.parse(startIso);
  return Array.from({ length: 60 }, (_, i) => withMargin(startMs + i * MIN, i < 10 ? 0.5 : 6));
}

describe('week report alarms', () => {
  it('counts the week’s alarms and times their acknowledgements', async () => {
    const owner = await verifiedPerson(t, 'Owner');
    const shopId = (
      await owner.agent
        .post('/api/v1/shops')
        .send({ name: 'Tamarack', timeZone: 'UTC' })
        .expect(201)
    ).body.id as string;
    const zoneId = (
      await owner.agent
        .post(`/api/v1/shops/${shopId}/zones`)
        .send({ name: 'Machine room' })
        .expect(201)
    ).body.id as string;
    const token = (
      await owner.agent
        .post(`/api/v1/shops/${shopId}/sensors`)
        .send({ name: 'Saw probe', zoneId })
        .expect(201)
    ).body.token as string;

    // The week of Monday 2026-11-16 (UTC shop: 2026-11-16T00:00Z to 2026-11-23T00:00Z). The first
    // spell starts on the Sunday before, so its alarms belong to the previous week.
    for (const start of [
      '2026-11-15T23:30:00Z',
      '2026-11-17T06:00:00Z',
      '2026-11-18T06:00:00Z',
      '2026-11-19T06:00:00Z',
    ]) {
      await postBatch(t.app, token, episode(start));
    }
    const all = await alarmsOf(owner.agent, shopId);
    const weekFrom = Date.parse('2026-11-16T00:00:00Z');
    const weekTo = Date.parse('2026-11-23T00:00:00Z');
    const inWeek = all.filter(
      (a) => Date.parse(a.openedAt) >= weekFrom && Date.parse(a.openedAt) < weekTo,
    );
    const wet = inWeek
      .filter((a) => a.kind === 'wet_surface')
      .sort((a, b) => a.openedAt.localeCompare(b.openedAt));
    // The premise: one wet-surface alarm per spell, and one from the Sunday before.
    expect(wet).toHaveLength(3);
    const before = all.find((a) => a.kind === 'wet_surface' && Date.parse(a.openedAt) < weekFrom);
    expect(before).toBeDefined();

    const ack = async (alarm: Alarm, afterMin: number) => {
      clockMs = Date.parse(alarm.openedAt) + afterMin * MIN;
      await owner.agent
        .post(`/api/v1/shops/${shopId}/alarms/${alarm.id}/ack`)
        .send({ note: 'Wiped the tops and covered them' })
        .expect(200);
    };
    // 12, 30 and 5 minutes: median 12, longest 30. The previous week's, after 100 min, must not
    // count (it would be the longest).
    await ack(wet[0]!, 12);
    await ack(wet[1]!, 30);
    await ack(wet[2]!, 5);
    await ack(before!, 100);

    // On the next Tuesday, the default week is the last complete one: 2026-11-16.
    clockMs = Date.parse('2026-11-24T08:00:00Z');
    const report = (await owner.agent.get(`/api/v1/shops/${shopId}/reports/week`).expect(200)).body;
    expect(report.week.start).toBe('2026-11-16');
    expect(report.week.periodEnd).toBe('2026-11-23T00:00:00.000Z');
    const a = report.zones[0].alarms;
    const byKind = (kind: string) => inWeek.filter((x) => x.kind === kind).length;
    expect(a.openedByKind).toEqual({
      dew_risk: byKind('dew_risk'),
      wet_surface: 3,
      humid_air: byKind('humid_air'),
      sensor_silent: byKind('sensor_silent'),
      battery_low: byKind('battery_low'),
    });
    expect(a.opened).toBe(inWeek.length);
    expect(a.acknowledged).toBe(3);
    expect(a.medianAckMinutes).toBeCloseTo(12, 9);
    expect(a.longestAckMinutes).toBeCloseTo(30, 9);
    expect(a.unacknowledged).toBe(inWeek.length - 3);
    expect(report.shopWide).toMatchObject({
      alarmsOpened: inWeek.length,
      unacknowledged: inWeek.length - 3,
    });
    expect(report.shopWide.medianAckMinutes).toBeCloseTo(12, 9);
    expect(report.zones[0].verdict).toContain(
      `${inWeek.length} alarms, answered in 12 min at the median`,
    );
    // Wet or close iron in the shop: the shop's verdict suggests warming or drying, and so
    // carries the heater and dehumidifier cautions (ingest/words/advice.ts).
    expect(report.shopWide.verdict).toContain('carbon monoxide');
    expect(report.shopWide.verdict).toContain('licensed electrician');
  });

  it('reports the current week up to now and refuses one that has not begun', async () => {
    clockMs = Date.parse('2026-11-19T12:00:00Z');
    const owner = await verifiedPerson(t, 'Owner');
    const shopId = (
      await owner.agent
        .post('/api/v1/shops')
        .send({ name: 'Tamarack', timeZone: 'UTC' })
        .expect(201)
    ).body.id as string;
    const current = await owner.agent
      .get(`/api/v1/shops/${shopId}/reports/week?start=2026-11-16`)
      .expect(200);
    expect(current.body.week.periodEnd).toBe('2026-11-19T12:00:00.000Z');
    // No zones: nothing to cover.
    expect(current.body.shopWide).toMatchObject({ zones: 0, coveragePct: 0 });
    const next = await owner.agent
      .get(`/api/v1/shops/${shopId}/reports/week?start=2026-11-23`)
      .expect(400);
    expect(next.body.error).toMatchObject({
      code: 'invalid_input',
      details: [{ path: 'start', message: 'After the current week' }],
    });
  });
});
