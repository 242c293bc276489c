// Protection trials through the API: a trial, its tests and ranks, and the standings on GET.
// The ranks are the catalysts example of tests/ingest/trialStandings.test.ts (4 tests × 3
// treatments, no ties; published statistic 6.5 with 2 df, rank totals hand-computed 4, 11, 9).
// Conditions come from readings posted through POST /api/v1/ingest and are worked out by hand.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { postIngest } from '../support/ingest';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
});
afterAll(() => t.pool.end());

const MIN_MS = 60_000;

// A shop of its own with one zone and one probe, made through the API.
const shopWithSensor = () => ownerWithSensor(t);

const every10 = (startIso: string, n: number, air: number, rh: number, surface: number) =>
  Array.from({ length: n }, (_, i) => ({
    at: new Date(Date.parse(startIso) + i * 10 * MIN_MS).toISOString(),
    air,
    rh,
    surface,
  }));

describe('protection trials', () => {
  it('ranks, totals and tests the treatments, and reads the zone during a test', async () => {
    const o = await shopWithSensor();
    const base = `/api/v1/shops/${o.shopId}/trials`;
    const created = await o.agent
      .post(base)
      .send({ name: 'Top protection', treatments: ['Paste wax', 'Dry lube', 'Nothing'] })
      .expect(201);
    const trialId = created.body.id as string;
    const [wax, lube, bare] = created.body.treatments.map((x: { id: string }) => x.id);
    expect(created.body.treatments.map((x: { name: string }) => x.name)).toEqual([
      'Paste wax',
      'Dry lube',
      'Nothing',
    ]);
    expect(created.body.standings).toMatchObject({ tests: 0, friedman: null, kendallW: null });

    // At 100 % RH the dew point is the air temperature (saturation), so air 10 °C with a
    // surface of 12 °C is a 2 K margin (close) and 11 °C a 1 K margin (wet, ingest/levels.ts).
    await postIngest(t.app, o.token, {
      readings: [
        ...every10('2026-03-23T00:00:00Z', 3, 10, 100, 12),
        ...every10('2026-03-23T00:30:00Z', 3, 10, 100, 11),
      ],
    }).expect(202);

    const windows = ['2026-03-23', '2026-03-24', '2026-03-25', '2026-03-26'];
    // (wax, lube, bare) per test, best = 1: the catalysts' ranks.
    const ranks = [
      [1, 3, 2],
      [1, 3, 2],
      [1, 2, 3],
      [1, 3, 2],
    ];
    for (const [i, day] of windows.entries()) {
      const test = await o.agent
        .post(`${base}/${trialId}/tests`)
        .send({
          name: `Morning ${i + 1}`,
          kind: i === 0 ? 'condensation' : 'humid_storage',
          from: `${day}T00:00:00Z`,
          to: `${day}T01:00:00Z`,
          ...(i === 0 ? { zoneId: o.zoneId, notes: 'Door open overnight' } : {}),
        })
        .expect(201);
      const put = await o.agent
        .put(`${base}/${trialId}/tests/${test.body.id}/ranks`)
        .send({
          ranks: [wax, lube, bare].map((treatmentId, j) => ({ treatmentId, rank: ranks[i]![j] })),
        })
        .expect(200);
      expect(put.body.ranks).toHaveLength(3);
    }
    // A fifth test not ranked yet does not count.
    await o.agent
      .post(`${base}/${trialId}/tests`)
      .send({
        name: 'Later',
        kind: 'wear',
        from: '2026-04-01T00:00:00Z',
        to: '2026-04-02T00:00:00Z',
      })
      .expect(201);

    const got = (await o.agent.get(`${base}/${trialId}`).expect(200)).body;
    expect(got.tests).toHaveLength(5);
    const s = got.standings;
    expect(s.tests).toBe(4);
    expect(s.rankTotals).toEqual([
      { treatmentId: wax, total: 4, meanRank: 1 },
      { treatmentId: lube, total: 11, meanRank: 2.75 },
      { treatmentId: bare, total: 9, meanRank: 2.25 },
    ]);
    expect(s.friedman.statistic).toBeCloseTo(6.5, 10);
    expect(s.friedman.df).toBe(2);
    expect(s.friedman.p).toBeCloseTo(Math.exp(-3.25), 10); // df 2: e^(−x/2)
    expect(s.kendallW).toBeCloseTo(0.8125, 10); // 6.5 / (4 · 2)
    expect(s.pairs[0]).toMatchObject({ better: wax, worse: lube, differs: true });
    expect(s.verdict).toBe(
      'Paste wax ranked best; the differences are more than chance (p = 0.039). ' +
        'With 4 tests this is a rough guide: rank at least 2 more tests to be surer.',
    );

    // The first test's hour: 00:00–00:30 close (three readings of 10 min), 00:30–01:00 wet
    // (the last stands to the window's end, 10 min, under the 15 min cap). RH 100 % and 10 °C
    // are wet in ISO 9223 terms (RH > 80 %, T > 0 °C) for the whole hour.
    const first = got.tests[0];
    expect(first).toMatchObject({
      kind: 'condensation',
      zoneId: o.zoneId,
      notes: 'Door open overnight',
    });
    expect(first.conditions).toEqual({
      readings: 6,
      lowestMarginK: 1,
      highestRhPct: 100,
      hoursWet: 0.5,
      timeOfWetnessHours: 1,
    });
    expect(got.tests[1].conditions).toBeNull();

    const list = (await o.agent.get(base).expect(200)).body;
    expect(list.trials).toEqual([
      expect.objectContaining({ id: trialId, name: 'Top protection', tests: 5 }),
    ]);
  });

  it('replaces a test’s ranks and takes ties as shared ranks', async () => {
    const o = await shopWithSensor();
    const base = `/api/v1/shops/${o.shopId}/trials`;
    const trial = (
      await o.agent
        .post(base)
        .send({ name: 'Covers', treatments: ['Cover', 'Bare'] })
        .expect(201)
    ).body;
    const [cover, bare] = trial.treatments.map((x: { id: string }) => x.id);
    const test = (
      await o.agent
        .post(`${base}/${trial.id}/tests`)
        .send({
          name: 'Spill',
          kind: 'standing_liquid',
          from: '2026-05-01T08:00:00+02:00',
          to: '2026-05-01T09:00:00+02:00',
        })
        .expect(201)
    ).body;
    expect(test.from).toBe('2026-05-01T06:00:00.000Z');
    const ranksPath = `${base}/${trial.id}/tests/${test.id}/ranks`;
    await o.agent
      .put(ranksPath)
      .send({
        ranks: [
          { treatmentId: cover, rank: 2 },
          { treatmentId: bare, rank: 1 },
        ],
      })
      .expect(200);
    await o.agent
      .put(ranksPath)
      .send({
        ranks: [
          { treatmentId: cover, rank: 1 },
          { treatmentId: bare, rank: 1 },
        ],
      })
      .expect(200);
    const s = (await o.agent.get(`${base}/${trial.id}`).expect(200)).body.standings;
    // One test, tied: each treatment has the average of ranks 1 and 2.
    expect(s.rankTotals.map((r: { total: number }) => r.total)).toEqual([1.5, 1.5]);
    expect(s.friedman).toBeNull();
    expect(s.verdict).toBe('Too few tests to tell: rank at least 1 more test.');
  });

  it("refuses another shop's zone for a test and stores nothing", async () => {
    const mine = await shopWithSensor();
    const theirs = await shopWithSensor();
    const base = `/api/v1/shops/${mine.shopId}/trials`;
    const trial = (
      await mine.agent
        .post(base)
        .send({ name: 'Oils', treatments: ['Oil', 'Bare'] })
        .expect(201)
    ).body;
    const res = await mine.agent.post(`${base}/${trial.id}/tests`).send({
      name: 'Borrowed zone',
      kind: 'condensation',
      from: '2026-03-23T00:00:00Z',
      to: '2026-03-23T01:00:00Z',
      zoneId: theirs.zoneId,
    });
    expect(res.status, res.text).toBe(400);
    expect(res.body.error.details).toEqual([
      { path: 'zoneId', message: 'No such zone in this shop' },
    ]);
    expect(res.text).not.toContain(theirs.shopId);
    const got = (await mine.agent.get(`${base}/${trial.id}`).expect(200)).body;
    expect(got.tests).toEqual([]);
  });
});
