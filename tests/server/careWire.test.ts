// What the care routes answer has exactly the keys of its shape in ingest/wire/surfaces.ts,
// nested shapes too (the rule of tests/server/wireShapes.test.ts): each key list is a Record over
// the shape's keys, so the compiler refuses a list that misses a key or names one it lacks.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type {
  CareEntry,
  CoatingBudget,
  CoatingBudgetsResponse,
  Surface,
  SurfaceDetail,
  SurfaceExposure,
  SurfacesResponse,
} from '@/ingest/wire';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';

type Keys<T> = Record<keyof T, true>;
const keys = (k: object) => Object.keys(k).sort();

const SURFACE: Keys<Surface> = {
  id: true,
  name: true,
  zoneId: true,
  material: true,
  sensorId: true,
  createdAt: true,
};
const SURFACE_DETAIL: Keys<SurfaceDetail> = { ...SURFACE, care: true };
const SURFACES_RESPONSE: Keys<SurfacesResponse> = { surfaces: true };
const CARE_ENTRY: Keys<CareEntry> = {
  id: true,
  kind: true,
  at: true,
  by: true,
  coating: true,
  rusting: true,
  note: true,
  photos: true,
};
const CARE_BY: Keys<NonNullable<CareEntry['by']>> = { id: true, name: true };
const CARE_COATING: Keys<NonNullable<CareEntry['coating']>> = { type: true, product: true };
const EXPOSURE: Keys<SurfaceExposure> = {
  since: true,
  coating: true,
  hoursClose: true,
  hoursWet: true,
  timeOfWetnessHours: true,
  recoat: true,
};
const RECOAT: Keys<SurfaceExposure['recoat']> = { due: true, reason: true, cautions: true };
const BUDGETS_RESPONSE: Keys<CoatingBudgetsResponse> = { budgets: true };
const BUDGET: Keys<CoatingBudget> = {
  coating: true,
  hoursWet: true,
  hoursClose: true,
  towHours: true,
  isDefault: true,
};

let t: TestApp;
let o: Awaited<ReturnType<typeof ownerWithSensor>>;
beforeAll(async () => {
  t = makeTestApp();
  o = await ownerWithSensor(t);
});
afterAll(() => t.pool.end());

describe('care wire shapes', () => {
  it('answers surfaces, care entries, exposure and budgets with exactly their keys', async () => {
    const base = `/api/v1/shops/${o.shopId}`;
    const created = await o.agent
      .post(`${base}/surfaces`)
      .send({ name: 'Saw top', zoneId: o.zoneId, sensorId: o.sensorId, material: 'cast iron' })
      .expect(201);
    expect(keys(created.body)).toEqual(keys(SURFACE));
    const id = created.body.id as string;

    const list = await o.agent.get(`${base}/surfaces`).expect(200);
    expect(keys(list.body)).toEqual(keys(SURFACES_RESPONSE));
    expect(list.body.surfaces).toEqual([created.body]);

    const entry = await o.agent
      .post(`${base}/surfaces/${id}/care`)
      .send({ kind: 'coating', at: new Date().toISOString(), coating: { type: 'oil' } })
      .expect(201);
    expect(keys(entry.body)).toEqual(keys(CARE_ENTRY));
    expect(keys(entry.body.by)).toEqual(keys(CARE_BY));
    expect(keys(entry.body.coating)).toEqual(keys(CARE_COATING));
    expect(entry.body.coating).toEqual({ type: 'oil', product: null });

    const detail = await o.agent.get(`${base}/surfaces/${id}`).expect(200);
    expect(keys(detail.body)).toEqual(keys(SURFACE_DETAIL));
    expect(detail.body.care).toEqual([entry.body]);

    const exposure = await o.agent.get(`${base}/surfaces/${id}/exposure`).expect(200);
    expect(keys(exposure.body)).toEqual(keys(EXPOSURE));
    expect(keys(exposure.body.recoat)).toEqual(keys(RECOAT));

    const budgets = await o.agent.get(`${base}/coating-budgets`).expect(200);
    expect(keys(budgets.body)).toEqual(keys(BUDGETS_RESPONSE));
    for (const b of budgets.body.budgets) expect(keys(b)).toEqual(keys(BUDGET));
    // Every type on its default (ingest/care.ts) until the shop sets one.
    expect(budgets.body.budgets.map((b: CoatingBudget) => [b.coating, b.isDefault])).toEqual([
      ['wax', true],
      ['dry_film', true],
      ['inhibitor_spray', true],
      ['oil', true],
      ['other', true],
    ]);
    const put = await o.agent
      .put(`${base}/coating-budgets`)
      .send({ budgets: [{ coating: 'oil', hoursWet: 2, hoursClose: 30, towHours: 200 }] })
      .expect(200);
    expect(put.body.budgets[3]).toEqual({
      coating: 'oil',
      hoursWet: 2,
      hoursClose: 30,
      towHours: 200,
      isDefault: false,
    });
    expect(put.body.budgets.filter((b: CoatingBudget) => !b.isDefault)).toHaveLength(1);

    // The shop can still be deleted: surfaces, the care log and budgets go with it.
    await o.agent.delete(base).send({ confirmName: 'Test shop' }).expect(204);
    const { rows } = await t.pool.query(
      `select (select count(*)::int from surfaces where shop_id = $1)
            + (select count(*)::int from care_entries where shop_id = $1)
            + (select count(*)::int from coating_budgets where shop_id = $1) as left_over`,
      [o.shopId],
    );
    expect(rows[0].left_over).toBe(0);
  });
});
