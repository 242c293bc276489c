/**
 * Week reports of the invented Tamarack shop, written out by hand (as the API would answer them)
 * for the PDF tests, with margin series shaped like a cold shop's week. The figures are chosen
 * so that their printed form is easy to work out by hand in the tests.
 */
import type { ReadingPoint } from '@/ingest/wire/readings';
import type { UnitPref } from '@/ingest/wire/people';
import type { PaperSize, WeekReport, ZoneWeekFigures } from '@/ingest/wire/reports';

import { verifiedPerson, type TestApp } from './app';
import { postIngest } from './ingest';

export const LONG_ZONE_NAME =
  'Lumber rack along the north wall, behind the jointer and the long outfeed table';

const NO_ALARMS = { dew_risk: 0, wet_surface: 0, humid_air: 0, sensor_silent: 0, battery_low: 0 };

export interface ShopWeek {
  timeZone: string;
  paperSize: PaperSize;
  start: string;
  /** Monday 00:00 and the next Monday 00:00 in `timeZone`, worked out by hand. */
  from: string;
  to: string;
  hours: number;
  note: string | null;
}

/** Mon 2 Mar 2026 in Berlin (CET, UTC+1 all week): 168 h. */
export const BERLIN_WEEK: ShopWeek = {
  timeZone: 'Europe/Berlin',
  paperSize: 'a4',
  start: '2026-03-02',
  from: '2026-03-01T23:00:00.000Z',
  to: '2026-03-08T23:00:00.000Z',
  hours: 168,
  note: null,
};

/**
 * The same Monday in Chicago: CST (UTC−6) until Sun 8 Mar 2026 02:00, when US clocks go forward
 * (second Sunday of March), so the week ends at 00:00 CDT (UTC−5) and has 167 h.
 */
export const CHICAGO_WEEK: ShopWeek = {
  timeZone: 'America/Chicago',
  paperSize: 'letter',
  start: '2026-03-02',
  from: '2026-03-02T06:00:00.000Z',
  to: '2026-03-09T05:00:00.000Z',
  hours: 167,
  note: 'This week had 167 hours: clocks went forward on Sunday 8 March.',
};

export function machineRoom(hours: number): ZoneWeekFigures {
  return {
    zoneId: 'zone-machine-room',
    name: 'Machine room',
    purpose: 'machines',
    readings: 2004,
    coveragePct: 99.6,
    airC: { min: 8.1, mean: 12.34, max: 17 },
    rhPct: { min: 55.2, mean: 70.4, max: 88.6 },
    emcPct: { min: 10.2, mean: 13.14, max: 17.86 },
    lowestMargin: { marginK: 0.8, at: '2026-03-03T12:10:00.000Z' },
    levelHours: { dry: 150, close: 12.5, wet: 1.5, unknown: hours - 164 },
    timeOfWetness: { hours: 12.5, annualHours: (12.5 / 168) * 8760, category: 't3' },
    alarms: {
      opened: 3,
      openedByKind: { ...NO_ALARMS, dew_risk: 2, wet_surface: 1 },
      acknowledged: 2,
      medianAckMinutes: 12,
      longestAckMinutes: 95,
      unacknowledged: 1,
    },
    silentPeriods: [],
    verdict: 'The tops came within 0.8 K of the dew point on Tuesday and were wet for 1.5 h.',
  };
}

export function lumberRack(hours: number): ZoneWeekFigures {
  return {
    zoneId: 'zone-lumber',
    name: LONG_ZONE_NAME,
    purpose: 'lumber',
    readings: 1950,
    coveragePct: 97.2,
    airC: { min: -2.5, mean: 4.05, max: 9.96 },
    rhPct: { min: 61, mean: 77.5, max: 93.2 },
    emcPct: { min: 11.94, mean: 15.5, max: 20.3 },
    lowestMargin: { marginK: -0.4, at: '2026-03-05T07:40:00.000Z' },
    levelHours: { dry: 120, close: 30, wet: 6, unknown: hours - 156 },
    timeOfWetness: { hours: 40, annualHours: (40 / 163.3) * 8760, category: 't3' },
    alarms: {
      opened: 1,
      openedByKind: { ...NO_ALARMS, sensor_silent: 1 },
      acknowledged: 1,
      medianAckMinutes: 7,
      longestAckMinutes: 7,
      unacknowledged: 0,
    },
    silentPeriods: [
      { from: '2026-03-05T01:00:00.000Z', to: '2026-03-05T03:30:00.000Z', hours: 2.5 },
    ],
    verdict: 'Stock stayed damp: wood EMC reached 20.3 % on Thursday.',
  };
}

export function finishingRoom(hours: number): ZoneWeekFigures {
  return {
    zoneId: 'zone-finishing',
    name: 'Finishing room',
    purpose: 'finishing',
    readings: 0,
    coveragePct: 0,
    airC: { min: null, mean: null, max: null },
    rhPct: { min: null, mean: null, max: null },
    emcPct: { min: null, mean: null, max: null },
    lowestMargin: null,
    levelHours: { dry: 0, close: 0, wet: 0, unknown: hours },
    timeOfWetness: { hours: 0, annualHours: null, category: null },
    alarms: {
      opened: 0,
      openedByKind: { ...NO_ALARMS },
      acknowledged: 0,
      medianAckMinutes: null,
      longestAckMinutes: null,
      unacknowledged: 0,
    },
    silentPeriods: [],
    verdict: 'No readings this week: is its sensor placed and powered?',
  };
}

export function tamarackReport(
  week: ShopWeek,
  unit: UnitPref,
  zones: ZoneWeekFigures[] = [
    machineRoom(week.hours),
    lumberRack(week.hours),
    finishingRoom(week.hours),
  ],
): WeekReport {
  return {
    shop: {
      id: 'shop-tamarack',
      name: 'Tamarack Joinery',
      timeZone: week.timeZone,
      paperSize: week.paperSize,
    },
    week: {
      start: week.start,
      from: week.from,
      to: week.to,
      hours: week.hours,
      periodEnd: week.to,
      note: week.note,
    },
    unit,
    generatedAt: '2026-03-09T06:30:00.000Z',
    shopWide: {
      zones: zones.length,
      coveragePct: 65.6,
      lowestMargin: {
        zoneId: 'zone-lumber',
        zoneName: 'Lumber rack',
        marginK: -0.4,
        at: '2026-03-05T07:40:00.000Z',
      },
      zonesWet: 2,
      wetHours: 7.5,
      closeHours: 42.5,
      alarmsOpened: 4,
      medianAckMinutes: 9.5,
      unacknowledged: 1,
      verdict: 'Two zones were wet this week; one alarm is still waiting for an answer.',
    },
    zones,
  };
}

/**
 * A bucketed margin series over the week (one point per `stepMin`), as the history API answers
 * it: a daily swing around `meanK` with the coldest hour near dawn, and optionally a hole.
 */
export function marginSeries(
  week: ShopWeek,
  meanK: number,
  stepMin = 20,
  hole?: { from: string; to: string },
): ReadingPoint[] {
  const points: ReadingPoint[] = [];
  const fromMs = Date.parse(week.from);
  const toMs = Date.parse(week.to);
  for (let at = fromMs; at < toMs; at += stepMin * 60_000) {
    if (hole && at >= Date.parse(hole.from) && at < Date.parse(hole.to)) continue;
    const dayPhase = ((at - fromMs) / 86_400_000) * 2 * Math.PI;
    const margin = meanK + 2.5 * Math.sin(dayPhase - Math.PI / 2);
    points.push({
      at: new Date(at).toISOString(),
      air: 12,
      rh: 70,
      surface: 10,
      dewPoint: 10 - margin,
      margin,
      marginMin: margin - 0.3,
      marginMax: margin + 0.3,
      emc: 13,
      level: margin - 0.3 <= 1 ? 'wet' : margin - 0.3 < 3 ? 'close' : 'dry',
      count: stepMin,
    });
  }
  return points;
}

/**
 * A °F reader's shop in `timeZone` with two zones, the first with a probe that posted six
 * readings 10 min apart from `firstAt`, through the real ingest route: three at air 10 °C,
 * RH 100 %, surface 13 °C (the dew point equals the air at 100 %, so the margin is exactly
 * 3 K), then three at air 20 °C, RH 50 %, surface 25 °C.
 */
export async function fahrenheitShopWithSixReadings(
  t: TestApp,
  shop: { name: string; timeZone: string; zones: [string, string]; firstAt: string },
) {
  const o = await verifiedPerson(t, 'Owner');
  await o.agent.patch('/api/v1/me').send({ unitPref: 'F' }).expect(200);
  const shopId = (
    await o.agent
      .post('/api/v1/shops')
      .send({ name: shop.name, timeZone: shop.timeZone })
      .expect(201)
  ).body.id as string;
  const zone = async (name: string) =>
    (await o.agent.post(`/api/v1/shops/${shopId}/zones`).send({ name }).expect(201)).body
      .id as string;
  const probed = await zone(shop.zones[0]);
  await zone(shop.zones[1]);
  const token = (
    await o.agent
      .post(`/api/v1/shops/${shopId}/sensors`)
      .send({ name: 'Saw probe', zoneId: probed })
      .expect(201)
  ).body.token as string;
  const startMs = Date.parse(shop.firstAt);
  const readings = Array.from({ length: 6 }, (_, i) => ({
    at: new Date(startMs + i * 10 * 60_000).toISOString(),
    air: i < 3 ? 10 : 20,
    rh: i < 3 ? 100 : 50,
    surface: i < 3 ? 13 : 25,
  }));
  await postIngest(t.app, token, { readings }).expect(202);
  return { agent: o.agent, shopId };
}
