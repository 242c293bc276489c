// The week report's paper as a shop setting: new shops start on ANSI letter in a US or Canadian
// time zone (IANA zone.tab) and on ISO 216 A4 elsewhere; the owner changes it with PATCH
// /shops/:shopId, and GET /shops/:shopId and /me's shop list carry it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, ownerWithMember, type TestApp } from '../support/app';
import { errorShape } from '../support/errorShape';

let t: TestApp;
let people: Awaited<ReturnType<typeof ownerWithMember>>;
beforeAll(async () => {
  t = makeTestApp();
  people = await ownerWithMember(t);
});
afterAll(() => t.pool.end());

async function storedPaper(shopId: string): Promise<string> {
  const { rows } = await t.pool.query('select paper_size from shops where id = $1', [shopId]);
  return (rows[0] as { paper_size: string }).paper_size;
}

describe('shop paper size', () => {
  it.each([
    ['America/Chicago', 'letter'],
    ['America/Toronto', 'letter'],
    ['America/Sao_Paulo', 'a4'],
    ['Europe/Oslo', 'a4'],
  ])('a new shop in %s starts on %s', async (timeZone, paper) => {
    const { owner } = people;
    const created = await owner.agent
      .post('/api/v1/shops')
      .send({ name: `Paper ${timeZone}`, timeZone })
      .expect(201);
    expect(await storedPaper(created.body.id)).toBe(paper);
    const shop = await owner.agent.get(`/api/v1/shops/${created.body.id}`).expect(200);
    expect(shop.body.paperSize).toBe(paper);
  });

  it('round-trips a change by the owner through PATCH, GET and /me', async () => {
    const { owner } = people;
    // ownerWithSensor's shop is in Europe/Oslo: A4.
    expect(await storedPaper(owner.shopId)).toBe('a4');
    const patched = await owner.agent
      .patch(`/api/v1/shops/${owner.shopId}`)
      .send({ paperSize: 'letter' })
      .expect(200);
    expect(patched.body).toMatchObject({ id: owner.shopId, paperSize: 'letter', role: 'owner' });
    expect(await storedPaper(owner.shopId)).toBe('letter');
    const got = await owner.agent.get(`/api/v1/shops/${owner.shopId}`).expect(200);
    expect(got.body.paperSize).toBe('letter');
    const me = await owner.agent.get('/api/v1/me').expect(200);
    const listed = (me.body.shops as { id: string; paperSize: string }[]).find(
      (s) => s.id === owner.shopId,
    );
    expect(listed?.paperSize).toBe('letter');
    // Moving the shop's time zone keeps the owner's choice.
    await owner.agent
      .patch(`/api/v1/shops/${owner.shopId}`)
      .send({ timeZone: 'Europe/Berlin' })
      .expect(200);
    expect(await storedPaper(owner.shopId)).toBe('letter');
    await owner.agent.patch(`/api/v1/shops/${owner.shopId}`).send({ paperSize: 'a4' }).expect(200);
    expect(await storedPaper(owner.shopId)).toBe('a4');
  });

  it('is the owner’s: a member is refused with 403 and nothing changes', async () => {
    const { owner, member } = people;
    const before = await storedPaper(owner.shopId);
    const res = await member.agent
      .patch(`/api/v1/shops/${owner.shopId}`)
      .send({ paperSize: before === 'a4' ? 'letter' : 'a4' });
    expect(res.status).toBe(403);
    expect(res.body).toEqual(errorShape);
    expect(await storedPaper(owner.shopId)).toBe(before);
    // Members still read it.
    const got = await member.agent.get(`/api/v1/shops/${owner.shopId}`).expect(200);
    expect(got.body.paperSize).toBe(before);
  });
});
