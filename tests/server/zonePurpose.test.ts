// A zone's purpose (what it holds) and the EMC region of its target band, through the real
// routes on the real test database: defaults, create, change, and bad input that changes nothing.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { EMC_REGIONS, ZONE_PURPOSES } from '@/ingest/wire';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { errorShape } from '../support/errorShape';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
});
afterAll(() => t.pool.end());

type Owner = Awaited<ReturnType<typeof ownerWithSensor>>;

async function zonesOf(o: Owner) {
  const res = await o.agent.get(`/api/v1/shops/${o.shopId}/zones`).expect(200);
  return res.body.zones as { id: string; name: string; purpose: string; emcRegion: string }[];
}

describe('zone purpose', () => {
  it('defaults to machines in most of the US, and a new zone can be made as lumber', async () => {
    const o = await ownerWithSensor(t);
    const [first] = await zonesOf(o);
    expect(first).toMatchObject({ purpose: 'machines', emcRegion: 'most' });

    const made = await o.agent
      .post(`/api/v1/shops/${o.shopId}/zones`)
      .send({ name: 'Lumber rack', purpose: 'lumber', emcRegion: 'damp_coastal' })
      .expect(201);
    expect(made.body).toMatchObject({ purpose: 'lumber', emcRegion: 'damp_coastal' });
    const listed = (await zonesOf(o)).find((z) => z.id === made.body.id);
    expect(listed).toMatchObject({ purpose: 'lumber', emcRegion: 'damp_coastal' });
  });

  it.each(ZONE_PURPOSES)('PATCH sets the purpose to %s', async (purpose) => {
    const o = await ownerWithSensor(t);
    const res = await o.agent
      .patch(`/api/v1/shops/${o.shopId}/zones/${o.zoneId}`)
      .send({ purpose })
      .expect(200);
    expect(res.body.purpose).toBe(purpose);
    expect((await zonesOf(o))[0]!.purpose).toBe(purpose);
  });

  it.each(EMC_REGIONS)('PATCH sets the EMC region to %s', async (emcRegion) => {
    const o = await ownerWithSensor(t);
    const res = await o.agent
      .patch(`/api/v1/shops/${o.shopId}/zones/${o.zoneId}`)
      .send({ emcRegion })
      .expect(200);
    expect(res.body.emcRegion).toBe(emcRegion);
  });

  // Bad input: unknown values, wrong types, a misspelt field. Each answers 400 in the shared
  // shape naming the field, and the zone stays as it was.
  const badBodies: [string, Record<string, unknown>, string][] = [
    ['an unknown purpose', { purpose: 'spaceship' }, 'purpose'],
    ['a purpose in capitals', { purpose: 'LUMBER' }, 'purpose'],
    ['a purpose as a number', { purpose: 2 }, 'purpose'],
    ['a purpose as null', { purpose: null }, 'purpose'],
    ['a purpose as a list', { purpose: ['lumber'] }, 'purpose'],
    ['an unknown region', { emcRegion: 'arctic' }, 'emcRegion'],
    ['a region as a boolean', { emcRegion: true }, 'emcRegion'],
  ];

  it.each(badBodies)('PATCH refuses %s', async (_label, body, path) => {
    const o = await ownerWithSensor(t);
    const res = await o.agent
      .patch(`/api/v1/shops/${o.shopId}/zones/${o.zoneId}`)
      .send({ name: 'Renamed', ...body })
      .expect(400);
    expect(res.body).toMatchObject(errorShape);
    expect(res.body.error.details).toEqual([{ path, message: expect.any(String) }]);
    expect((await zonesOf(o))[0]).toMatchObject({
      name: 'Machine room',
      purpose: 'machines',
      emcRegion: 'most',
    });
  });

  it.each(badBodies)('POST refuses %s and makes no zone', async (_label, body, path) => {
    const o = await ownerWithSensor(t);
    const res = await o.agent
      .post(`/api/v1/shops/${o.shopId}/zones`)
      .send({ name: 'Finishing room', ...body })
      .expect(400);
    expect(res.body).toMatchObject(errorShape);
    expect(res.body.error.details).toEqual([{ path, message: expect.any(String) }]);
    expect(await zonesOf(o)).toHaveLength(1);
  });

  it('POST refuses a misspelt field instead of ignoring it', async () => {
    const o = await ownerWithSensor(t);
    const res = await o.agent
      .post(`/api/v1/shops/${o.shopId}/zones`)
      .send({ name: 'Lumber rack', purpse: 'lumber' })
      .expect(400);
    expect(res.body).toMatchObject(errorShape);
    expect(await zonesOf(o)).toHaveLength(1);
  });

  it("another shop's owner cannot change the purpose", async () => {
    const o = await ownerWithSensor(t);
    // The tenant matrix covers every role on every route; this names the new field's case.
    const other = await ownerWithSensor(t);
    await other.agent
      .patch(`/api/v1/shops/${o.shopId}/zones/${o.zoneId}`)
      .send({ purpose: 'lumber' })
      .expect(404);
    expect((await zonesOf(o))[0]!.purpose).toBe('machines');
  });
});
