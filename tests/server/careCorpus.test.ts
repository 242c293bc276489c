// Bad-input corpus for the care log (API.md "Reports, care, trials, imports"): every refusal
// answers 400 (or 404 for a surface that is not the shop's) in the shared error shape, names the
// field at fault, never a 500, and stores nothing.
import { randomUUID } from 'node:crypto';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { errorShape } from '../support/errorShape';

let t: TestApp;
let o: Awaited<ReturnType<typeof ownerWithSensor>>;
let other: Awaited<ReturnType<typeof ownerWithSensor>>;
let surfaceId: string;
let otherZoneSensorId: string;
beforeAll(async () => {
  t = makeTestApp();
  o = await ownerWithSensor(t);
  other = await ownerWithSensor(t);
  surfaceId = (
    await o.agent
      .post(`/api/v1/shops/${o.shopId}/surfaces`)
      .send({ name: 'Saw top', zoneId: o.zoneId })
      .expect(201)
  ).body.id;
  const zone2 = await o.agent
    .post(`/api/v1/shops/${o.shopId}/zones`)
    .send({ name: 'Lumber rack' })
    .expect(201);
  otherZoneSensorId = (
    await o.agent
      .post(`/api/v1/shops/${o.shopId}/sensors`)
      .send({ name: 'Rack probe', zoneId: zone2.body.id })
      .expect(201)
  ).body.id;
});
afterAll(() => t.pool.end());

async function counts() {
  const { rows } = await t.pool.query(
    `select (select count(*)::int from surfaces where shop_id = $1) as surfaces,
            (select count(*)::int from care_entries where shop_id = $1) as care,
            (select count(*)::int from coating_budgets where shop_id = $1) as budgets`,
    [o.shopId],
  );
  return rows[0] as { surfaces: number; care: number; budgets: number };
}

function expectRefusal(res: { status: number; body: unknown }, path: string) {
  expect(res.status, JSON.stringify(res.body)).toBe(400);
  expect(res.body).toEqual(errorShape);
  const body = res.body as { error: { code: string; details: { path: string }[] } };
  expect(body.error.code).toBe('invalid_input');
  expect(body.error.details.map((d) => d.path)).toContain(path);
}

const valid = () => ({ name: 'Router table', zoneId: o.zoneId });
// [what, body, the field named in the error]
const BAD_SURFACES: [string, () => object, string][] = [
  ['no name', () => ({ zoneId: o.zoneId }), 'name'],
  ['a blank name', () => ({ ...valid(), name: '   ' }), 'name'],
  ['a name of 101 characters', () => ({ ...valid(), name: 'x'.repeat(101) }), 'name'],
  ['a right-to-left override in the name', () => ({ ...valid(), name: 'Saw\u202etop' }), 'name'],
  ['no zone', () => ({ name: 'Router table' }), 'zoneId'],
  ['a zone id that is no uuid', () => ({ ...valid(), zoneId: 'zone-1' }), 'zoneId'],
  ['a zone of no shop', () => ({ ...valid(), zoneId: randomUUID() }), 'zoneId'],
  ["another shop's zone", () => ({ ...valid(), zoneId: other.zoneId }), 'zoneId'],
  ['a number for material', () => ({ ...valid(), material: 7 }), 'material'],
  ["another shop's sensor", () => ({ ...valid(), sensorId: other.sensorId }), 'sensorId'],
  ['a probe in another zone', () => ({ ...valid(), sensorId: otherZoneSensorId }), 'sensorId'],
  ['an unknown field', () => ({ ...valid(), colour: 'grey' }), ''],
];

const coat = () => ({ kind: 'coating', at: '2026-01-05T08:00:00Z', coating: { type: 'wax' } });
const BAD_CARE: [string, () => object, string][] = [
  ['no kind', () => ({ at: '2026-01-05T08:00:00Z' }), 'kind'],
  ['an unknown kind', () => ({ ...coat(), kind: 'polish' }), 'kind'],
  ['no time', () => ({ kind: 'inspection' }), 'at'],
  ['a time without a zone', () => ({ ...coat(), at: '2026-01-05T08:00:00' }), 'at'],
  ['a date alone', () => ({ ...coat(), at: '2026-01-05' }), 'at'],
  ['epoch seconds', () => ({ ...coat(), at: 1767600000 }), 'at'],
  ['a time before 2000', () => ({ ...coat(), at: '1999-12-31T23:00:00Z' }), 'at'],
  [
    'a time next year',
    () => ({ ...coat(), at: new Date(Date.now() + 3.2e10).toISOString() }),
    'at',
  ],
  ['a coat without its type', () => ({ kind: 'coating', at: '2026-01-05T08:00:00Z' }), 'coating'],
  ['an unknown coating type', () => ({ ...coat(), coating: { type: 'paint' } }), 'coating.type'],
  [
    'a blank product',
    () => ({ ...coat(), coating: { type: 'oil', product: ' ' } }),
    'coating.product',
  ],
  [
    'an inspection with a coat',
    () => ({ kind: 'inspection', at: '2026-01-05T08:00:00Z', coating: { type: 'wax' } }),
    'coating',
  ],
  ['rusting 6 (ISO 4628-3 ends at Ri 5)', () => ({ ...coat(), rusting: 6 }), 'rusting'],
  ['rusting −1', () => ({ ...coat(), rusting: -1 }), 'rusting'],
  ['rusting 2.5 (the grades are whole)', () => ({ ...coat(), rusting: 2.5 }), 'rusting'],
  ['rusting as text', () => ({ ...coat(), rusting: '2' }), 'rusting'],
  ['a note of 2001 characters', () => ({ ...coat(), note: 'n'.repeat(2001) }), 'note'],
  ['an unknown field', () => ({ ...coat(), photo: 'x.jpg' }), ''],
];

const wax = () => ({ coating: 'wax', hoursWet: 4, hoursClose: 72, towHours: 500 });
const BAD_BUDGETS: [string, () => object, string][] = [
  ['no budgets', () => ({}), 'budgets'],
  ['an empty list', () => ({ budgets: [] }), 'budgets'],
  ['a type twice', () => ({ budgets: [wax(), wax()] }), 'budgets'],
  ['an unknown type', () => ({ budgets: [{ ...wax(), coating: 'paint' }] }), 'budgets.0.coating'],
  ['negative hours', () => ({ budgets: [{ ...wax(), hoursWet: -1 }] }), 'budgets.0.hoursWet'],
  ['more than a year', () => ({ budgets: [{ ...wax(), towHours: 9000 }] }), 'budgets.0.towHours'],
  ['hours as text', () => ({ budgets: [{ ...wax(), hoursClose: '72' }] }), 'budgets.0.hoursClose'],
  [
    'a missing figure',
    () => ({ budgets: [{ coating: 'wax', hoursWet: 1 }] }),
    'budgets.0.hoursClose',
  ],
];

describe('care log bad input', () => {
  it.each(BAD_SURFACES)('refuses a surface with %s', async (_what, body, path) => {
    const before = await counts();
    const res = await o.agent.post(`/api/v1/shops/${o.shopId}/surfaces`).send(body());
    expectRefusal(res, path);
    expect(await counts()).toEqual(before);
  });

  it.each(BAD_CARE)('refuses a care entry with %s', async (_what, body, path) => {
    const before = await counts();
    const res = await o.agent
      .post(`/api/v1/shops/${o.shopId}/surfaces/${surfaceId}/care`)
      .send(body());
    expectRefusal(res, path);
    expect(await counts()).toEqual(before);
  });

  it.each(BAD_BUDGETS)('refuses budgets with %s', async (_what, body, path) => {
    const before = await counts();
    const res = await o.agent.put(`/api/v1/shops/${o.shopId}/coating-budgets`).send(body());
    expectRefusal(res, path);
    expect(await counts()).toEqual(before);
  });

  it('refuses a body that is not JSON with 400, not 500', async () => {
    const res = await o.agent
      .post(`/api/v1/shops/${o.shopId}/surfaces/${surfaceId}/care`)
      .set('content-type', 'application/json')
      .send('{"kind": "coating",');
    expect(res.status).toBe(400);
    expect(res.body).toEqual(errorShape);
  });

  it.each([
    ['not a uuid', 'saw-top'],
    ['a uuid of no surface', randomUUID()],
  ])('answers 404 for a surface id that is %s, on every surface route', async (_what, id) => {
    const base = `/api/v1/shops/${o.shopId}/surfaces/${id}`;
    for (const res of [
      await o.agent.get(base),
      await o.agent.get(`${base}/exposure`),
      await o.agent.post(`${base}/care`).send(coat()),
    ]) {
      expect(res.status).toBe(404);
      expect(res.body).toEqual(errorShape);
      expect(res.body.error.code).toBe('not_found');
    }
  });

  it('refuses to delete a zone that holds a surface, so its care log is not lost', async () => {
    const zone = await o.agent
      .post(`/api/v1/shops/${o.shopId}/zones`)
      .send({ name: 'Outfeed corner' })
      .expect(201);
    await o.agent
      .post(`/api/v1/shops/${o.shopId}/surfaces`)
      .send({ name: 'Outfeed table', zoneId: zone.body.id })
      .expect(201);
    const before = await counts();
    const res = await o.agent.delete(`/api/v1/shops/${o.shopId}/zones/${zone.body.id}`);
    expect(res.status).toBe(409);
    expect(res.body).toEqual(errorShape);
    expect(res.body.error.code).toBe('zone_has_surfaces');
    expect(await counts()).toEqual(before);
    // An empty zone still goes.
    const empty = await o.agent
      .post(`/api/v1/shops/${o.shopId}/zones`)
      .send({ name: 'Spare corner' })
      .expect(201);
    await o.agent.delete(`/api/v1/shops/${o.shopId}/zones/${empty.body.id}`).expect(204);
  });

  it('stores a valid entry after all that (the corpus is not refusing everything)', async () => {
    const before = await counts();
    await o.agent
      .post(`/api/v1/shops/${o.shopId}/surfaces/${surfaceId}/care`)
      .send({ ...coat(), rusting: 0, note: 'Fresh coat' })
      .expect(201);
    expect(await counts()).toEqual({ ...before, care: before.care + 1 });
  });
});
