// GET …/reports/week: figures of constructed weeks, every expectation worked out by hand below
// from the rule in ingest/reportWeek.ts (each reading stands until the next, capped at 15 min).
// Readings go through POST /api/v1/ingest, so levels and margins are the server's own.
//
// Exact limits: at 100 % RH the dew point equals the air temperature (the definition of
// saturation; ingest/psychrometrics.ts clamps the last bit), so air 10 °C / RH 100 % with a
// surface of 13 °C has a margin of exactly 3 K (the caution limit, ISO 8502-4: dry, since "at
// least 3 K") and with 11 °C exactly 1 K (the wet limit: wet, ingest/levels.ts).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { kToFDelta } from '@/ingest/units';
import { weekReportSeries } from '@/server/reports/weekReport';

import { makeTestApp, verifiedPerson, type TestApp } from '../support/app';
import { postIngest } from '../support/ingest';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
});
afterAll(() => t.pool.end());

const MIN_MS = 60_000;
const H = 3_600_000;

/** An owner with a shop in `timeZone`, one zone and one sensor, all made through the API. */
async function shopIn(timeZone: string, zoneName = 'Machine room') {
  const owner = await verifiedPerson(t, 'Owner');
  const shop = (
    await owner.agent.post('/api/v1/shops').send({ name: 'Tamarack', timeZone }).expect(201)
  ).body as { id: string };
  const zone = (
    await owner.agent.post(`/api/v1/shops/${shop.id}/zones`).send({ name: zoneName }).expect(201)
  ).body as { id: string };
  const sensor = (
    await owner.agent
      .post(`/api/v1/shops/${shop.id}/sensors`)
      .send({ name: 'Saw probe', zoneId: zone.id })
      .expect(201)
  ).body as { id: string; token: string };
  return { ...owner, shopId: shop.id, zoneId: zone.id, token: sensor.token };
}

interface R {
  at: string;
  air: number;
  rh: number;
  surface: number;
}
const r = (at: string, air: number, rh: number, surface: number): R => ({ at, air, rh, surface });
const every10 = (startIso: string, n: number, air: number, rh: number, surface: number) =>
  Array.from({ length: n }, (_, i) =>
    r(new Date(Date.parse(startIso) + i * 10 * MIN_MS).toISOString(), air, rh, surface),
  );

describe('week report: Europe/Berlin, the spring change (167 h)', () => {
  // EU summer time begins on the last Sunday of March at 01:00 UTC (Directive 2000/84/EC):
  // 2026-03-29. The week of Monday 2026-03-23 runs from 2026-03-22T23:00Z (CET, +01) to
  // 2026-03-29T22:00Z (CEST, +02): 167 hours.
  const readings: R[] = [
    // R1–R6 Monday 00:00–00:50 local: margin exactly 3 K → dry; RH 100 % > 80 and 10 °C > 0 → wet
    // in ISO 9223 terms. Each stands 10 min.
    ...every10('2026-03-22T23:00:00Z', 6, 10, 100, 13),
    // R7–R9: margin 2 K → close, 10 min each.
    ...every10('2026-03-23T00:00:00Z', 3, 10, 100, 12),
    // R10–R12: margin exactly 1 K → wet; R12 (00:50Z) is followed by 70 min of silence, so it
    // stands for the 15 min cap and 01:05Z–02:00Z is a silent period.
    ...every10('2026-03-23T00:30:00Z', 3, 10, 100, 11),
    // R13–R14: air exactly 0 °C, RH 90 %: not ISO 9223 wet (T > 0 °C is strict). Margin above
    // 5 K (frost point of 0 °C / 90 % is about −1.4 °C): dry. R14 stands 15 min (cap).
    r('2026-03-23T02:00:00Z', 0, 90, 5),
    r('2026-03-23T02:10:00Z', 0, 90, 5),
    // Sunday, around the change (01:00Z): R15 RH exactly 80 % (not wet, RH > 80 % is strict),
    // R16 RH 80.5 % (wet), R17 air 0.1 °C / RH 90 % (wet); all dry by a wide margin. R17 stands
    // 15 min, then silence to the week's end.
    r('2026-03-29T00:50:00Z', 20, 80, 25),
    r('2026-03-29T01:00:00Z', 20, 80.5, 25),
    r('2026-03-29T01:10:00Z', 0.1, 90, 25),
  ];

  it('has 167 hours, says why, and gives the hand-computed figures', async () => {
    const o = await shopIn('Europe/Berlin');
    const ingest = await postIngest(t.app, o.token, { readings }).expect(202);
    expect(ingest.body.stored).toBe(17);
    // The limits are met exactly, not nearly: the premise of the level checks below.
    const margins = (ingest.body.results as { margin: number; level: string }[]).slice(0, 12);
    expect(margins.map((m) => [m.margin, m.level])).toEqual([
      ...Array(6).fill([3, 'dry']),
      ...Array(3).fill([2, 'close']),
      ...Array(3).fill([1, 'wet']),
    ]);

    const res = await o.agent
      .get(`/api/v1/shops/${o.shopId}/reports/week?start=2026-03-23`)
      .expect(200);
    const report = res.body;
    expect(report.week).toMatchObject({
      start: '2026-03-23',
      from: '2026-03-22T23:00:00.000Z',
      to: '2026-03-29T22:00:00.000Z',
      hours: 167,
      periodEnd: '2026-03-29T22:00:00.000Z',
      note: 'This week had 167 hours: clocks went forward on Sunday 29 March.',
    });
    const z = report.zones[0];
    expect(z.readings).toBe(17);
    // Covered: 60 (R1–6) + 30 (R7–9) + 35 (R10–12) + 25 (R13–14) + 35 (R15–17) = 185 min.
    expect(z.coveragePct).toBeCloseTo((185 / (167 * 60)) * 100, 9);
    // Dry 60 + 25 + 35 = 120 min; close 30 min; wet 10 + 10 + 15 = 35 min; the rest unknown.
    expect(z.levelHours.dry).toBeCloseTo(2, 9);
    expect(z.levelHours.close).toBeCloseTo(0.5, 9);
    expect(z.levelHours.wet).toBeCloseTo(35 / 60, 9);
    expect(z.levelHours.unknown).toBeCloseTo(167 - 185 / 60, 9);
    // Air: min 0, max 20; mean (10·125 + 0·25 + 20·20 + 0.1·15) / 185 = 1651.5 / 185.
    expect(z.airC.min).toBe(0);
    expect(z.airC.max).toBe(20);
    expect(z.airC.mean).toBeCloseTo(1651.5 / 185, 9);
    // RH: (100·125 + 90·25 + 80·10 + 80.5·10 + 90·15) / 185 = 17705 / 185.
    expect(z.rhPct).toMatchObject({ min: 80, max: 100 });
    expect(z.rhPct.mean).toBeCloseTo(17705 / 185, 9);
    // The lowest margin, 1 K, first reached at R10.
    expect(z.lowestMargin).toEqual({ marginK: 1, at: '2026-03-23T00:30:00.000Z' });
    // ISO 9223: R1–R12 (125 min) + R16 (10) + R17 (15) = 150 min; per year 150/185 · 8760 =
    // 7102.7 h, over 5500 h: τ5 (ISO 9223:1992 Table 1).
    expect(z.timeOfWetness.hours).toBeCloseTo(2.5, 9);
    expect(z.timeOfWetness.annualHours).toBeCloseTo((150 / 185) * 8760, 9);
    expect(z.timeOfWetness.category).toBe('t5');
    expect(z.silentPeriods).toEqual([
      { from: '2026-03-23T01:05:00.000Z', to: '2026-03-23T02:00:00.000Z', hours: 55 / 60 },
      {
        from: '2026-03-23T02:25:00.000Z',
        to: '2026-03-29T00:50:00.000Z',
        hours: (Date.parse('2026-03-29T00:50:00Z') - Date.parse('2026-03-23T02:25:00Z')) / H,
      },
      {
        from: '2026-03-29T01:25:00.000Z',
        to: '2026-03-29T22:00:00.000Z',
        hours: (Date.parse('2026-03-29T22:00:00Z') - Date.parse('2026-03-29T01:25:00Z')) / H,
      },
    ]);
    // Local time in the verdict: 00:30Z is 01:30 CET on Monday.
    expect(z.verdict).toContain('came within 1.0 °C of the dew point on Monday at 01:30');
    expect(z.verdict).toContain('wet for 0.6 h');
    expect(report.shopWide).toMatchObject({ zones: 1, zonesWet: 1 });
    expect(report.shopWide.lowestMargin).toMatchObject({ marginK: 1, zoneName: 'Machine room' });

    // The PDF's and the screen's chart: the very series the zone history route answers.
    const series = await weekReportSeries(t.db, report);
    const history = await o.agent
      .get(`/api/v1/shops/${o.shopId}/zones/${o.zoneId}/readings`)
      .query({ from: report.week.from, to: report.week.periodEnd, points: 500 })
      .expect(200);
    expect(series.get(o.zoneId)).toEqual(history.body.points);
    expect(history.body.points).toHaveLength(17);
  });
});

describe('week report: America/Chicago, the autumn change (169 h), and a zone with no readings', () => {
  // US daylight time ends on the first Sunday of November at 02:00 local (Energy Policy Act of
  // 2005, sec. 110): 2026-11-01, 07:00Z. The week of Monday 2026-10-26 runs from
  // 2026-10-26T05:00Z (CDT, −05) to 2026-11-02T06:00Z (CST, −06): 169 hours.
  it('has 169 hours, figures in °F sentences, and an empty zone that is not called dry', async () => {
    const o = await shopIn('America/Chicago', 'Lumber rack');
    await o.agent.patch('/api/v1/me').send({ unitPref: 'F' }).expect(200);
    const empty = (
      await o.agent
        .post(`/api/v1/shops/${o.shopId}/zones`)
        .send({ name: 'Finishing room' })
        .expect(201)
    ).body as { id: string };
    // Every 5 min from 06:00Z to 06:55Z on the Sunday, across 01:00 CDT → 01:00 CST at 07:00Z:
    // 11 readings stand 5 min, the last the 15 min cap: 70 min covered, all dry (air 15 °C,
    // RH 70 %: dew point about 9.6 °C, surface 18 °C).
    const readings = Array.from({ length: 12 }, (_, i) =>
      r(new Date(Date.parse('2026-11-01T06:00:00Z') + i * 5 * MIN_MS).toISOString(), 15, 70, 18),
    );
    const ingest = await postIngest(t.app, o.token, { readings }).expect(202);
    const marginK = ingest.body.results[0].margin as number;

    const report = (
      await o.agent.get(`/api/v1/shops/${o.shopId}/reports/week?start=2026-10-26`).expect(200)
    ).body;
    expect(report.unit).toBe('F');
    expect(report.week).toMatchObject({
      from: '2026-10-26T05:00:00.000Z',
      to: '2026-11-02T06:00:00.000Z',
      hours: 169,
      note: 'This week had 169 hours: clocks went back on Sunday 1 November.',
    });
    const [lumber, finishing] = report.zones;
    expect(lumber.name).toBe('Lumber rack');
    expect(lumber.readings).toBe(12);
    expect(lumber.coveragePct).toBeCloseTo((70 / (169 * 60)) * 100, 9);
    expect(lumber.levelHours).toEqual({
      dry: 70 / 60,
      close: 0,
      wet: 0,
      unknown: 169 - 70 / 60,
    });
    expect(lumber.airC).toEqual({ min: 15, mean: 15, max: 15 });
    // No ISO 9223 wetness (RH 70 %): 0 h a year is τ1 (≤ 10 h, ISO 9223:1992 Table 1).
    expect(lumber.timeOfWetness).toEqual({ hours: 0, annualHours: 0, category: 't1' });
    expect(lumber.lowestMargin).toEqual({ marginK, at: '2026-11-01T06:00:00.000Z' });
    // Silent from the week's start to the first reading, and from 06:55Z + 15 min to the end.
    expect(lumber.silentPeriods.map((p: { from: string; to: string }) => [p.from, p.to])).toEqual([
      ['2026-10-26T05:00:00.000Z', '2026-11-01T06:00:00.000Z'],
      ['2026-11-01T07:10:00.000Z', '2026-11-02T06:00:00.000Z'],
    ]);
    // 06:00Z is 01:00 CDT, the first of Sunday's two one o'clocks; the margin in °F (× 1.8).
    expect(lumber.verdict).toContain(
      `came within ${kToFDelta(marginK).toFixed(1)} °F of the dew point on Sunday at 01:00`,
    );
    expect(lumber.verdict).toContain('and it stayed dry.');

    expect(finishing).toMatchObject({
      zoneId: empty.id,
      readings: 0,
      coveragePct: 0,
      airC: { min: null, mean: null, max: null },
      rhPct: { min: null, mean: null, max: null },
      emcPct: { min: null, mean: null, max: null },
      lowestMargin: null,
      levelHours: { dry: 0, close: 0, wet: 0, unknown: 169 },
      timeOfWetness: { hours: 0, annualHours: null, category: null },
      silentPeriods: [
        { from: '2026-10-26T05:00:00.000Z', to: '2026-11-02T06:00:00.000Z', hours: 169 },
      ],
    });
    expect(finishing.verdict).toContain('No readings from Finishing room');
    expect(finishing.verdict).toContain('cannot be called dry');
    // The shop: 70 min covered of 2 × 169 h.
    expect(report.shopWide.coveragePct).toBeCloseTo((70 / (2 * 169 * 60)) * 100, 9);
    expect(report.shopWide).toMatchObject({ zones: 2, zonesWet: 0, wetHours: 0, closeHours: 0 });
  });
});
