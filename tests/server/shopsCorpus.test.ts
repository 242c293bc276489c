// Bad-input corpus for a shop's time zone (POST /shops and PATCH /shops/:id): only IANA names
// the server's Intl knows, spelt exactly as IANA spells them, are stored; anything else answers
// 400 with a field error on `timeZone` in the shared error shape, names the spelling meant when
// there is one, and changes nothing.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { errorShape } from '../support/errorShape';

let t: TestApp;
let o: Awaited<ReturnType<typeof ownerWithSensor>>;
beforeAll(async () => {
  t = makeTestApp();
  o = await ownerWithSensor(t);
});
afterAll(() => t.pool.end());

// [what, sent, the message the field error must carry]
const BAD_ZONES: [what: string, timeZone: unknown, message: RegExp][] = [
  // The case a person types: the zone exists, the spelling does not (used to be stored lowercased).
  ['lower case', 'america/chicago', /Use the IANA spelling: America\/Chicago/],
  ['upper case', 'AMERICA/CHICAGO', /America\/Chicago/],
  ['mixed case', 'Europe/dublin', /Europe\/Dublin/],
  ['lower-case utc', 'utc', /Use the IANA spelling: UTC/],
  ['a city alone', 'Chicago', /Pick a time zone from the list/],
  ['an invented zone', 'Mars/Olympus', /Pick a time zone from the list/],
  ['an offset, not a zone', '+02:00', /Pick a time zone from the list/],
  ['an abbreviation', 'CST', /./],
  ['empty', '', /Pick a time zone from the list/],
  ['spaces around', ' Europe/Oslo ', /Pick a time zone from the list/],
  ['a path', '../../etc/passwd', /Pick a time zone from the list/],
  ['too long', `America/${'x'.repeat(80)}`, /At most 64 characters/],
  ['a number', 42, /./],
  ['null', null, /./],
  ['an array', ['America/Chicago'], /./],
];

async function shopState() {
  const { rows } = await t.pool.query(
    `select (select time_zone from shops where id = $1) as zone,
            (select count(*)::int from memberships where user_id = $2) as shops`,
    [o.shopId, o.user.id],
  );
  return rows[0] as { zone: string; shops: number };
}

describe('shop time zone', () => {
  it.each(BAD_ZONES)('refuses %s on create and update', async (_what, timeZone, message) => {
    const before = await shopState();
    for (const res of [
      await o.agent.post('/api/v1/shops').send({ name: 'Corpus shop', timeZone }),
      await o.agent.patch(`/api/v1/shops/${o.shopId}`).send({ timeZone }),
    ]) {
      expect(res.status).toBe(400);
      expect(res.body).toEqual(errorShape);
      expect(res.body.error.code).toBe('invalid_input');
      const detail = res.body.error.details.find((d: { path: string }) => d.path === 'timeZone');
      expect(detail?.message).toMatch(message);
    }
    expect(await shopState()).toEqual(before);
  });

  // Canonical names as listed by Intl.supportedValuesOf('timeZone'), plus UTC which Node's list
  // leaves out, and the current IANA spellings of renamed zones that a newer browser reports
  // where the server's ICU lists the older one (Node 20 lists Europe/Kiev and Asia/Calcutta;
  // IANA's tzdata spells them Europe/Kyiv and Asia/Kolkata — the release of each rename is from
  // memory: 2022b and 2008).
  it.each([
    'America/Chicago',
    'UTC',
    'America/Argentina/Buenos_Aires',
    'Europe/Kyiv',
    'Asia/Kolkata',
  ])('stores %s as spelt', async (timeZone) => {
    const created = await o.agent
      .post('/api/v1/shops')
      .send({ name: 'Zone shop', timeZone })
      .expect(201);
    expect(created.body.timeZone).toBe(timeZone);
    const moved = await o.agent.patch(`/api/v1/shops/${o.shopId}`).send({ timeZone }).expect(200);
    expect(moved.body.timeZone).toBe(timeZone);
  });
});

// Bad-input corpus for the week report's paper (PATCH /shops/:id): 'a4' or 'letter' exactly;
// anything else answers 400 with a field error on `paperSize` and changes nothing.
const BAD_PAPERS: [what: string, paperSize: unknown][] = [
  ['another ISO 216 size', 'A5'],
  ['upper case', 'A4'],
  ['a capitalised name', 'Letter'],
  ['the label, not the value', 'US Letter'],
  ['a number', 3],
  ['null', null],
  ['empty', ''],
  ['an array', ['a4']],
  ['an object', { size: 'a4' }],
];

describe('shop paper size', () => {
  it.each(BAD_PAPERS)('refuses %s', async (_what, paperSize) => {
    const before = await t.pool.query('select paper_size from shops where id = $1', [o.shopId]);
    const res = await o.agent.patch(`/api/v1/shops/${o.shopId}`).send({ paperSize });
    expect(res.status).toBe(400);
    expect(res.body).toEqual(errorShape);
    expect(res.body.error.code).toBe('invalid_input');
    const detail = res.body.error.details.find((d: { path: string }) => d.path === 'paperSize');
    expect(detail?.message).toMatch(/a4 or letter/);
    const after = await t.pool.query('select paper_size from shops where id = $1', [o.shopId]);
    expect(after.rows).toEqual(before.rows);
  });
});
