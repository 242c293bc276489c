// Exposure of a surface since its last coat, against a constructed series whose hours are
// worked out by hand below. Readings go through POST /api/v1/ingest, so their levels are the
// ones the server derives; the hours follow the week report's rule (API.md): each reading
// stands until the zone's (or the probe's) next one, at most 15 minutes.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { postIngest } from '../support/ingest';

let t: TestApp;
let o: Awaited<ReturnType<typeof ownerWithSensor>>;
let secondToken: string;
const MIN = 60_000;
// A whole minute six hours back: the series ends long before now, so the last reading of each
// sensor stands for the 15-minute cap and no more.
const T0 = Math.floor((Date.now() - 6 * 60 * MIN) / MIN) * MIN;
const at = (minutes: number) => new Date(T0 + minutes * MIN).toISOString();

// Dew points by the Magnus formula (b = 17.62, c = 243.12 °C, WMO Guide No. 8), worked by hand:
//   20 °C, 50 % → 9.26 °C;  15 °C, 85 % → 12.50 °C;  15 °C, 90 % → 13.37 °C.
// Margins against the default limits (wet ≤ 1 K, dry ≥ 3 K, ingest/levels.ts) are each at least
// 0.25 K from a limit, so any sound dew-point formula gives the same level.
const SERIES = [
  { min: 0, air: 20, rh: 50, surface: 18, level: 'dry' }, // margin 8.74 K
  { min: 10, air: 20, rh: 50, surface: 18, level: 'dry' },
  { min: 20, air: 20, rh: 50, surface: 18, level: 'dry' },
  // The coat goes on at minute 30.
  { min: 30, air: 20, rh: 50, surface: 11, level: 'close' }, // 1.74 K: 10 min close
  { min: 40, air: 20, rh: 50, surface: 9, level: 'wet' }, // −0.26 K: 10 min wet
  { min: 50, air: 20, rh: 50, surface: 9, level: 'wet' }, // 10 min wet
  { min: 60, air: 15, rh: 85, surface: 14, level: 'close' }, // 1.50 K, RH > 80: 10 min close, wet by ISO 9223
  { min: 70, air: 15, rh: 85, surface: 17, level: 'dry' }, // 4.50 K, RH > 80: 10 min ISO 9223
  { min: 80, air: 20, rh: 50, surface: 18, level: 'dry' }, // 40 min to the next: 15 min counted
  { min: 120, air: 15, rh: 90, surface: 12, level: 'wet' }, // −1.37 K, RH > 80: 15 min (cap) wet, ISO 9223
] as const;
const COAT_MIN = 30;
// Since the coat, by hand from the table:
//   close: minutes 30 and 60, 10 + 10 = 20 min = 1/3 h
//   wet: minutes 40, 50 (10 + 10) and 120 (15, the cap) = 35 min = 7/12 h
//   ISO 9223 time of wetness (RH > 80 %, air > 0 °C): minutes 60, 70 (10 + 10) and 120 (15) = 35 min
const HOURS_CLOSE = 20 / 60;
const HOURS_WET = 35 / 60;
const TOW_HOURS = 35 / 60;

beforeAll(async () => {
  t = makeTestApp();
  o = await ownerWithSensor(t);
  const posted = await postIngest(t.app, o.token, {
    readings: SERIES.map((r) => ({ at: at(r.min), air: r.air, rh: r.rh, surface: r.surface })),
  }).expect(202);
  expect(posted.body.stored).toBe(SERIES.length);
  expect(posted.body.results.map((r: { level: string }) => r.level)).toEqual(
    SERIES.map((r) => r.level),
  );
  // A second sensor in the same zone, wet long after the first one's series: it counts for a
  // surface that reads the zone, not for one that reads only the first probe.
  const second = await o.agent
    .post(`/api/v1/shops/${o.shopId}/sensors`)
    .send({ name: 'Bandsaw probe', zoneId: o.zoneId })
    .expect(201);
  secondToken = second.body.token;
  await postIngest(t.app, secondToken, {
    readings: [{ at: at(200), air: 15, rh: 90, surface: 12 }],
  }).expect(202);
});
afterAll(() => t.pool.end());

async function surface(body: object) {
  const res = await o.agent.post(`/api/v1/shops/${o.shopId}/surfaces`).send(body).expect(201);
  return res.body.id as string;
}

async function coat(surfaceId: string, atIso: string, type = 'wax') {
  return o.agent
    .post(`/api/v1/shops/${o.shopId}/surfaces/${surfaceId}/care`)
    .send({ kind: 'coating', at: atIso, coating: { type, product: 'Shop-mixed paste' } })
    .expect(201);
}

const exposure = async (surfaceId: string) =>
  (await o.agent.get(`/api/v1/shops/${o.shopId}/surfaces/${surfaceId}/exposure`).expect(200)).body;

async function budgets(hoursWet: number, hoursClose: number, towHours: number) {
  await o.agent
    .put(`/api/v1/shops/${o.shopId}/coating-budgets`)
    .send({ budgets: [{ coating: 'wax', hoursWet, hoursClose, towHours }] })
    .expect(200);
}

describe('exposure since the last coat', () => {
  it('counts the probe’s hours close, wet and ISO 9223 wet since the coat (hand-computed)', async () => {
    const id = await surface({ name: 'Saw top', zoneId: o.zoneId, sensorId: o.sensorId });
    await coat(id, at(COAT_MIN));
    const e = await exposure(id);
    expect(e.since).toBe(at(COAT_MIN));
    expect(e.coating).toBe('wax');
    expect(e.hoursClose).toBeCloseTo(HOURS_CLOSE, 9);
    expect(e.hoursWet).toBeCloseTo(HOURS_WET, 9);
    expect(e.timeOfWetnessHours).toBeCloseTo(TOW_HOURS, 9);
  });

  it('reads the whole zone when the surface has no probe of its own', async () => {
    const id = await surface({ name: 'Jointer bed', zoneId: o.zoneId });
    await coat(id, at(COAT_MIN));
    const e = await exposure(id);
    // The second sensor's reading at minute 200 adds 15 min (the cap) wet and ISO 9223 wet.
    expect(e.hoursWet).toBeCloseTo(HOURS_WET + 15 / 60, 9);
    expect(e.timeOfWetnessHours).toBeCloseTo(TOW_HOURS + 15 / 60, 9);
    expect(e.hoursClose).toBeCloseTo(HOURS_CLOSE, 9);
  });

  it('starts again from a newer coat: a coat after every reading has 0 h', async () => {
    const id = await surface({ name: 'Planer bed', zoneId: o.zoneId });
    await coat(id, at(COAT_MIN));
    await coat(id, new Date().toISOString(), 'dry_film');
    const e = await exposure(id);
    expect(e.coating).toBe('dry_film');
    expect([e.hoursClose, e.hoursWet, e.timeOfWetnessHours]).toEqual([0, 0, 0]);
    expect(e.recoat.due).toBe(false);
    expect(e.recoat.cautions).toEqual([]);
  });

  it('suggests a coat when none is logged', async () => {
    const id = await surface({ name: 'Fence face', zoneId: o.zoneId });
    const e = await exposure(id);
    expect(e).toMatchObject({ since: null, hoursWet: null, hoursClose: null });
    expect(e.recoat.due).toBe(true);
    expect(e.recoat.reason).toMatch(/No coat is logged/);
  });

  it('says a re-coat is due when an exposure passes the coat’s budget, and which one', async () => {
    const id = await surface({ name: 'Table saw wing', zoneId: o.zoneId, sensorId: o.sensorId });
    await coat(id, at(COAT_MIN));

    // Defaults for wax (4 h wet, 72 h close, 500 h wetness) are far above 0.58 h: not due.
    let e = await exposure(id);
    expect(e.recoat.due).toBe(false);
    expect(e.recoat.reason).toMatch(/within its budget/);

    // 35 min wet > 0.5 h.
    await budgets(0.5, 10, 10);
    e = await exposure(id);
    expect(e.recoat.due).toBe(true);
    expect(e.recoat.reason).toBe(
      'Re-coat suggested: wet for 0.6 h since the paste wax, more than its budget of 0.5 h.',
    );
    expect(e.recoat.cautions.join(' ')).toMatch(/safety data sheet/);
    expect(e.recoat.cautions.join(' ')).toMatch(/closed metal container/);
    expect(e.recoat.cautions.join(' ')).toMatch(/local fire codes/);

    // 20 min close > 0.25 h, wet within 1 h.
    await budgets(1, 0.25, 10);
    e = await exposure(id);
    expect(e.recoat.due).toBe(true);
    expect(e.recoat.reason).toMatch(/^Re-coat suggested: close to the dew point for 0\.3 h/);

    // 35 min of ISO 9223 wetness > 0.5 h, the rest within.
    await budgets(1, 1, 0.5);
    e = await exposure(id);
    expect(e.recoat.due).toBe(true);
    expect(e.recoat.reason).toMatch(/0\.6 h of time of wetness \(ISO 9223\)/);

    // Exactly at a budget is not past it: 20 min close against a 1/3 h budget.
    await budgets(1, 1 / 3, 1);
    e = await exposure(id);
    expect(e.recoat.due).toBe(false);
  });

  it('lists the care log newest first, with who logged each entry', async () => {
    const id = await surface({
      name: 'Drill press table',
      zoneId: o.zoneId,
      material: 'cast iron',
    });
    await coat(id, at(COAT_MIN));
    await o.agent
      .post(`/api/v1/shops/${o.shopId}/surfaces/${id}/care`)
      .send({ kind: 'inspection', at: at(130), rusting: 2, note: 'Specks by the miter slot' })
      .expect(201);
    const detail = await o.agent.get(`/api/v1/shops/${o.shopId}/surfaces/${id}`).expect(200);
    expect(detail.body).toMatchObject({ id, name: 'Drill press table', material: 'cast iron' });
    expect(detail.body.care).toEqual([
      {
        id: expect.any(String),
        kind: 'inspection',
        at: at(130),
        by: { id: o.user.id, name: 'Owner' },
        coating: null,
        rusting: 2,
        note: 'Specks by the miter slot',
        photos: [],
      },
      {
        id: expect.any(String),
        kind: 'coating',
        at: at(COAT_MIN),
        by: { id: o.user.id, name: 'Owner' },
        coating: { type: 'wax', product: 'Shop-mixed paste' },
        rusting: null,
        note: null,
        photos: [],
      },
    ]);
  });
});
