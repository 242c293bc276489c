// Shops, members and invitations on the real test database, with invitation mail going through
// the test app's real SMTP server.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import {
  makeTestApp,
  ownerWithSensor,
  verifiedPerson,
  uniqueEmail,
  type TestApp,
} from '../support/app';
import { postIngest } from '../support/ingest';
import { linkToken, waitForMail } from '../support/mail';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
});
afterAll(() => t.pool.end());

type Agent = ReturnType<typeof request.agent>;

async function invite(owner: Agent, shopId: string, email: string, role: string) {
  const res = await owner.post(`/api/v1/shops/${shopId}/invitations`).send({ email, role });
  expect(res.status, res.text).toBe(201);
  return linkToken(await waitForMail(t.outbox, email), 'invite');
}

describe('invitations through the SMTP server', () => {
  it('mails a link in plain text and HTML that makes a new account a member, once', async () => {
    const o = await ownerWithSensor(t);
    const email = uniqueEmail('invitee');
    await o.agent
      .post(`/api/v1/shops/${o.shopId}/invitations`)
      .send({ email: email.toUpperCase(), role: 'member' })
      .expect(201);
    const mail = await waitForMail(t.outbox, email);
    expect(mail.subject).toBe('Join Test shop on Drybench');
    expect(mail.text).toContain('Owner invited you to Test shop on Drybench as a member');
    expect(mail.html).toContain('<strong>Test shop</strong>');
    const token = linkToken(mail, 'invite');
    expect(mail.html).toContain(`/invite/${token}`);

    const open = await o.agent.get(`/api/v1/shops/${o.shopId}/invitations`).expect(200);
    expect(open.body.invitations).toEqual([expect.objectContaining({ email, role: 'member' })]);

    const peek = await request(t.app).get(`/api/v1/invitations/${token}`).expect(200);
    expect(peek.body).toMatchObject({ shopName: 'Test shop', email, accountExists: false });

    const newcomer = request.agent(t.app);
    const noPassword = await newcomer.post(`/api/v1/invitations/${token}/accept`).send({});
    expect(noPassword.status).toBe(400);
    const accepted = await newcomer
      .post(`/api/v1/invitations/${token}/accept`)
      .send({ name: 'New Hand', password: 'a good long password' })
      .expect(201);
    expect(accepted.body).toEqual({ shop: { id: o.shopId, name: 'Test shop' }, role: 'member' });
    const me = await newcomer.get('/api/v1/me').expect(200);
    expect(me.body.user).toMatchObject({ email, name: 'New Hand' });
    expect(me.body.shops).toEqual([expect.objectContaining({ id: o.shopId, role: 'member' })]);

    // The link is spent: nobody can use it again.
    const again = await request(t.app)
      .post(`/api/v1/invitations/${token}/accept`)
      .send({ name: 'Second', password: 'another long password' })
      .expect(404);
    expect(again.body.error.code).toBe('invitation_not_found');
    await request(t.app).get(`/api/v1/invitations/${token}`).expect(404);
    expect((await o.agent.get(`/api/v1/shops/${o.shopId}/invitations`)).body.invitations).toEqual(
      [],
    );
  });

  it('lets an existing account accept only when signed in as that account', async () => {
    const o = await ownerWithSensor(t);
    const invitee = await verifiedPerson(t, 'Existing Person');
    const other = await verifiedPerson(t, 'Someone Else');
    const token = await invite(o.agent, o.shopId, invitee.email, 'viewer');

    const peek = await request(t.app).get(`/api/v1/invitations/${token}`).expect(200);
    expect(peek.body.accountExists).toBe(true);
    const anonymous = await request(t.app)
      .post(`/api/v1/invitations/${token}/accept`)
      .send({ name: 'Impostor', password: 'a good long password' })
      .expect(401);
    expect(anonymous.body.error.message).toContain('sign in');
    const wrong = await other.agent.post(`/api/v1/invitations/${token}/accept`).expect(403);
    expect(wrong.body.error.code).toBe('wrong_account');
    await other.agent.get(`/api/v1/shops/${o.shopId}`).expect(404);

    await invitee.agent.post(`/api/v1/invitations/${token}/accept`).expect(200);
    const shop = await invitee.agent.get(`/api/v1/shops/${o.shopId}`).expect(200);
    expect(shop.body).toMatchObject({ name: 'Test shop', role: 'viewer' });
  });

  it('refuses to invite a member again, and withdraws an invitation', async () => {
    const o = await ownerWithSensor(t);
    const taken = await o.agent
      .post(`/api/v1/shops/${o.shopId}/invitations`)
      .send({ email: o.email, role: 'viewer' })
      .expect(409);
    expect(taken.body.error.code).toBe('already_member');
    const email = uniqueEmail('withdrawn');
    const token = await invite(o.agent, o.shopId, email, 'viewer');
    const [open] = (await o.agent.get(`/api/v1/shops/${o.shopId}/invitations`)).body.invitations;
    await o.agent.delete(`/api/v1/shops/${o.shopId}/invitations/${open.id}`).expect(204);
    await request(t.app).get(`/api/v1/invitations/${token}`).expect(404);
  });

  it('takes the invitation back and answers 503 when the mail server is down', async () => {
    const local = makeTestApp();
    try {
      const o = await ownerWithSensor(local);
      await (await local.smtp).close();
      const res = await o.agent
        .post(`/api/v1/shops/${o.shopId}/invitations`)
        .send({ email: uniqueEmail(), role: 'member' })
        .expect(503);
      expect(res.body.error.code).toBe('mail_unavailable');
      const open = await o.agent.get(`/api/v1/shops/${o.shopId}/invitations`).expect(200);
      expect(open.body.invitations).toEqual([]);
    } finally {
      await local.pool.end();
    }
  });
});

describe('members', () => {
  async function shopWithMember() {
    const o = await ownerWithSensor(t);
    const m = await verifiedPerson(t, 'Member Person');
    const token = await invite(o.agent, o.shopId, m.email, 'member');
    await m.agent.post(`/api/v1/invitations/${token}/accept`).expect(200);
    return { o, m };
  }

  it('lets the owner change roles and remove a member, who then loses the shop', async () => {
    const { o, m } = await shopWithMember();
    const list = await o.agent.get(`/api/v1/shops/${o.shopId}/members`).expect(200);
    expect(
      list.body.members.map((x: { email: string; role: string }) => [x.email, x.role]),
    ).toEqual(
      expect.arrayContaining([
        [o.email, 'owner'],
        [m.email, 'member'],
      ]),
    );
    await o.agent
      .patch(`/api/v1/shops/${o.shopId}/members/${m.user.id}`)
      .send({ role: 'viewer' })
      .expect(200);
    await m.agent.get(`/api/v1/shops/${o.shopId}/members`).expect(403);
    await o.agent.delete(`/api/v1/shops/${o.shopId}/members/${m.user.id}`).expect(204);
    await m.agent.get(`/api/v1/shops/${o.shopId}/zones`).expect(404);
    expect((await m.agent.get('/api/v1/me')).body.shops).toEqual([]);
  });

  it('keeps the last owner: no demotion, no removal, no leaving (409)', async () => {
    const { o, m } = await shopWithMember();
    for (const res of [
      await o.agent
        .patch(`/api/v1/shops/${o.shopId}/members/${o.user.id}`)
        .send({ role: 'member' }),
      await o.agent.delete(`/api/v1/shops/${o.shopId}/members/${o.user.id}`),
      await o.agent.delete(`/api/v1/shops/${o.shopId}/membership`),
    ]) {
      expect(res.status).toBe(409);
      expect(res.body.error).toMatchObject({ code: 'last_owner' });
      expect(res.body.error.message).toMatch(/at least one owner/);
    }
    // With a second owner, the first may step down.
    await o.agent
      .patch(`/api/v1/shops/${o.shopId}/members/${m.user.id}`)
      .send({ role: 'owner' })
      .expect(200);
    await o.agent.delete(`/api/v1/shops/${o.shopId}/membership`).expect(204);
    await m.agent.delete(`/api/v1/shops/${o.shopId}/membership`).expect(409);
  });
});

describe('shops', () => {
  it('renames, changes the time zone, and deletes only with the exact name', async () => {
    const o = await ownerWithSensor(t);
    const renamed = await o.agent
      .patch(`/api/v1/shops/${o.shopId}`)
      .send({ name: 'Birch Barn', timeZone: 'America/Denver' })
      .expect(200);
    expect(renamed.body).toMatchObject({ name: 'Birch Barn', timeZone: 'America/Denver' });
    const badZone = await o.agent
      .patch(`/api/v1/shops/${o.shopId}`)
      .send({ timeZone: 'Mars/Olympus' })
      .expect(400);
    expect(badZone.body.error.details[0].path).toBe('timeZone');

    const wrong = await o.agent
      .delete(`/api/v1/shops/${o.shopId}`)
      .send({ confirmName: 'birch barn' })
      .expect(400);
    expect(wrong.body.error.code).toBe('confirmation_mismatch');
    await o.agent.get(`/api/v1/shops/${o.shopId}`).expect(200);
    await o.agent
      .delete(`/api/v1/shops/${o.shopId}`)
      .send({ confirmName: 'Birch Barn' })
      .expect(204);
    await o.agent.get(`/api/v1/shops/${o.shopId}`).expect(404);
    // Its sensors went with it.
    await postIngest(t.app, o.token, { air: 20, rh: 50 }).expect(401);
  });
});

describe('zones and sensors', () => {
  it('sets zone limits (wet below caution) and ingest uses them', async () => {
    const o = await ownerWithSensor(t);
    const zonePath = `/api/v1/shops/${o.shopId}/zones/${o.zoneId}`;
    const bad = await o.agent.patch(zonePath).send({ wetK: 3 }).expect(400);
    expect(bad.body.error.details).toEqual([{ path: 'wetK', message: expect.any(String) }]);
    await o.agent
      .patch(zonePath)
      .send({ name: 'Bench room', cautionK: 6, wetK: 2, humidRhPct: 55 })
      .expect(200);
    const zones = await o.agent.get(`/api/v1/shops/${o.shopId}/zones`).expect(200);
    expect(zones.body.zones[0]).toMatchObject({
      name: 'Bench room',
      cautionK: 6,
      wetK: 2,
      humidRhPct: 55,
    });
    // 20 °C / 50 % RH: dew point 9.26 °C (psychrolib); surface 14 °C → margin 4.7 K, which is
    // dry under the default 3 K caution limit but close under the new 6 K one.
    const res = await postIngest(t.app, o.token, { air: 20, rh: 50, surface: 14 }).expect(202);
    expect(res.body.results[0].level).toBe('close');
  });

  it('lists sensors with last seen and battery, rotates, revokes and moves them', async () => {
    const o = await ownerWithSensor(t);
    const base = `/api/v1/shops/${o.shopId}/sensors`;
    await postIngest(t.app, o.token, { air: 18, rh: 60, battery: 2.91 }).expect(202);
    const listed = await o.agent.get(base).expect(200);
    expect(listed.body.sensors).toEqual([
      expect.objectContaining({ id: o.sensorId, zoneName: 'Machine room', batteryV: 2.91 }),
    ]);
    expect(listed.body.sensors[0].lastSeenAt).toEqual(expect.any(String));
    expect(JSON.stringify(listed.body)).not.toMatch(/tokenHash|token_hash/);

    const rotated = await o.agent.post(`${base}/${o.sensorId}/token`).expect(201);
    const post = (token: string) => postIngest(t.app, token, { air: 18, rh: 60 });
    expect((await post(o.token)).status).toBe(401);
    expect((await post(rotated.body.token)).status).toBe(202);

    const rack = await o.agent
      .post(`/api/v1/shops/${o.shopId}/zones`)
      .send({ name: 'Lumber rack' })
      .expect(201);
    const elsewhere = await ownerWithSensor(t);
    await o.agent.patch(`${base}/${o.sensorId}`).send({ zoneId: elsewhere.zoneId }).expect(400);
    await o.agent.patch(`${base}/${o.sensorId}`).send({ zoneId: rack.body.id }).expect(200);
    await post(rotated.body.token).expect(202);
    const zones = await o.agent.get(`/api/v1/shops/${o.shopId}/zones`).expect(200);
    const rackZone = zones.body.zones.find((z: { id: string }) => z.id === rack.body.id);
    expect(rackZone.latest).toMatchObject({ air: 18, rh: 60, sensorId: o.sensorId });

    await o.agent.delete(`${base}/${o.sensorId}/token`).expect(204);
    expect((await post(rotated.body.token)).status).toBe(401);
    const after = await o.agent.get(base).expect(200);
    expect(after.body.sensors[0].revokedAt).toEqual(expect.any(String));
  });
});
