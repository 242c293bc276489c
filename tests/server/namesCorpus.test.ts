// Bad-input corpus for names, wherever a name is accepted: sign-up, PATCH /me, shops, zones,
// sensors and accepting an invitation. Control characters (C0, DEL, C1) and the
// text-direction marks, embeddings, overrides and isolates are refused with 400 in the shared
// error shape, and nothing in the database changes; names are stored trimmed.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, ownerWithSensor, uniqueEmail, type TestApp } from '../support/app';
import { linkToken, waitForMail } from '../support/mail';

let t: TestApp;
let o: Awaited<ReturnType<typeof ownerWithSensor>>;
beforeAll(async () => {
  t = makeTestApp();
  o = await ownerWithSensor(t);
});
afterAll(() => t.pool.end());

const MESSAGE = 'Names cannot contain control or text-direction characters.';

// Escapes written out: a raw override character in this file would reorder it on screen.
const BAD_NAMES: [what: string, name: string][] = [
  ['NUL (C0)', 'Saw\u0000top'],
  ['BEL (C0)', '\u0007Jointer'],
  ['tab inside (C0)', 'Band\tsaw'],
  ['line feed inside (C0)', 'Lumber\nrack'],
  ['escape (C0)', 'Planer\u001b[31m'],
  ['DEL', 'Drill\u007fpress'],
  ['NEL (C1)', 'Bench\u0085'],
  ['CSI (C1)', '\u009bFinishing room'],
  ['C1 last', 'Shop\u009f'],
  ['left-to-right mark U+200E', 'Shop\u200e'],
  ['right-to-left mark U+200F', '\u200fShop'],
  ['Arabic letter mark U+061C', 'Sh\u061cop'],
  ['LRE U+202A', '\u202aShop'],
  ['RLE U+202B', '\u202bShop'],
  ['PDF U+202C', 'Shop\u202c'],
  ['LRO U+202D', '\u202dShop'],
  ['RLO U+202E', 'Saw \u202emlac'],
  ['LRI U+2066', '\u2066Shop'],
  ['RLI U+2067', '\u2067Shop'],
  ['FSI U+2068', '\u2068Shop'],
  ['PDI U+2069', 'Shop\u2069'],
];

/** What each route could change, for this test's owner and shop (other files run alongside). */
async function snapshot(extraEmail?: string) {
  const { rows } = await t.pool.query(
    `select
       (select name from users where id = $1) as user_name,
       (select json_agg(s.name order by s.id) from shops s
          join memberships m on m.shop_id = s.id where m.user_id = $1) as shops,
       (select json_agg(name order by id) from zones where shop_id = $2) as zones,
       (select json_agg(name order by id) from sensors where shop_id = $2) as sensors,
       (select count(*)::int from memberships where shop_id = $2) as members,
       (select json_agg(accepted_at order by id) from invitations where shop_id = $2) as invitations,
       (select count(*)::int from users where email = $3) as extra_users`,
    [o.user.id, o.shopId, extraEmail ?? ''],
  );
  return rows[0] as Record<string, unknown>;
}

/** Each route that takes a name: a request with `name` in it, and an e-mail it may create. */
interface NameRoute {
  route: string;
  send(name: string): Promise<request.Response>;
  email?: string;
}

const routes: [route: string, make: () => NameRoute | Promise<NameRoute>][] = [
  [
    'POST /auth/sign-up',
    () => {
      const email = uniqueEmail('signup');
      return {
        route: 'POST /auth/sign-up',
        email,
        send: (name) =>
          request(t.app)
            .post('/api/v1/auth/sign-up')
            .send({ email, password: 'correct horse battery', name }),
      };
    },
  ],
  [
    'PATCH /me',
    () => ({
      route: 'PATCH /me',
      send: (name) => o.agent.patch('/api/v1/me').send({ name }),
    }),
  ],
  [
    'POST /shops',
    () => ({
      route: 'POST /shops',
      send: (name) => o.agent.post('/api/v1/shops').send({ name, timeZone: 'Europe/Oslo' }),
    }),
  ],
  [
    'PATCH /shops/:id',
    () => ({
      route: 'PATCH /shops/:id',
      send: (name) => o.agent.patch(`/api/v1/shops/${o.shopId}`).send({ name }),
    }),
  ],
  [
    'POST /zones',
    () => ({
      route: 'POST /zones',
      send: (name) => o.agent.post(`/api/v1/shops/${o.shopId}/zones`).send({ name }),
    }),
  ],
  [
    'PATCH /zones/:id',
    () => ({
      route: 'PATCH /zones/:id',
      send: (name) => o.agent.patch(`/api/v1/shops/${o.shopId}/zones/${o.zoneId}`).send({ name }),
    }),
  ],
  [
    'POST /sensors',
    () => ({
      route: 'POST /sensors',
      send: (name) =>
        o.agent.post(`/api/v1/shops/${o.shopId}/sensors`).send({ name, zoneId: o.zoneId }),
    }),
  ],
  [
    'PATCH /sensors/:id',
    () => ({
      route: 'PATCH /sensors/:id',
      send: (name) =>
        o.agent.patch(`/api/v1/shops/${o.shopId}/sensors/${o.sensorId}`).send({ name }),
    }),
  ],
  [
    'POST /invitations/:token/accept',
    async () => {
      const email = uniqueEmail('invited');
      await o.agent
        .post(`/api/v1/shops/${o.shopId}/invitations`)
        .send({ email, role: 'member' })
        .expect(201);
      const token = linkToken(await waitForMail(t.outbox, email), 'invite');
      return {
        route: 'POST /invitations/:token/accept',
        email,
        send: (name) =>
          request(t.app)
            .post(`/api/v1/invitations/${token}/accept`)
            .send({ name, password: 'correct horse battery' }),
      };
    },
  ],
];

describe.each(routes)('%s', (_route, make) => {
  it('refuses every bad name with 400 and changes nothing', async () => {
    const r = await make();
    const before = await snapshot(r.email);
    for (const [what, name] of BAD_NAMES) {
      const res = await r.send(name);
      expect(res.status, `${r.route}: ${what}`).toBe(400);
      expect(res.body.error.code, `${r.route}: ${what}`).toBe('invalid_input');
      expect(res.body.error.details, `${r.route}: ${what}`).toContainEqual({
        path: 'name',
        message: MESSAGE,
      });
    }
    expect(await snapshot(r.email), r.route).toEqual(before);
  });
});

describe('names that are fine', () => {
  it('stores a name trimmed, with accents, emoji and right-to-left script', async () => {
    const zone = await o.agent
      .post(`/api/v1/shops/${o.shopId}/zones`)
      .send({ name: '  Atelier du rabot — établi 🪚  ' })
      .expect(201);
    expect(zone.body.name).toBe('Atelier du rabot — établi 🪚');
    const me = await o.agent.patch('/api/v1/me').send({ name: '\tנגר  ' }).expect(200);
    expect(me.body.user.name).toBe('נגר');
    await o.agent.patch('/api/v1/me').send({ name: 'Owner' }).expect(200);
  });
});
