// A person's first steps through the HTTP contract: sign-up, /me, sign-out and sign-in, and
// the first shop, on the real test database.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, verifiedPerson, type TestApp } from '../support/app';
import { errorShape } from '../support/errorShape';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
});
afterAll(() => t.pool.end());

describe('people', () => {
  it('signs up, reads /me, signs out and signs in again', async () => {
    const { agent, email, password, user } = await verifiedPerson(t, 'Ada Planer');
    const me = await agent.get('/api/v1/me').expect(200);
    expect(me.body).toEqual({ user, shops: [] });

    await agent.post('/api/v1/auth/sign-out').expect(204);
    const fresh = request.agent(t.app);
    await fresh.get('/api/v1/me').expect(401);
    const signIn = await fresh
      .post('/api/v1/auth/sign-in')
      .send({ email: email.toUpperCase(), password })
      .expect(200);
    expect(signIn.headers['set-cookie']?.[0]).toMatch(/drybench_session=.*HttpOnly/i);
    await fresh.get('/api/v1/me').expect(200);
  });

  it('refuses a wrong password with the same message as an unknown e-mail', async () => {
    const { email } = await verifiedPerson(t);
    const wrong = await request(t.app)
      .post('/api/v1/auth/sign-in')
      .send({ email, password: 'not the password' })
      .expect(401);
    const unknown = await request(t.app)
      .post('/api/v1/auth/sign-in')
      .send({ email: 'nobody@test.example', password: 'whatever1234' })
      .expect(401);
    expect(wrong.body).toMatchObject(errorShape);
    expect(wrong.body.error.message).toBe(unknown.body.error.message);
  });

  it('makes no second account on the same e-mail, and says so only to the address', async () => {
    const { email, password } = await verifiedPerson(t);
    const res = await request(t.app)
      .post('/api/v1/auth/sign-up')
      .send({ email, password: 'another long one', name: 'Twin' })
      .expect(202);
    expect(res.body).toEqual({ status: 'verification_sent', email });
    await request(t.app).post('/api/v1/auth/sign-in').send({ email, password }).expect(200);
    const count = await t.pool.query('select count(*)::int n from users where email = $1', [email]);
    expect(count.rows[0].n).toBe(1);
  });

  it('lists the new shop with the creator as owner and rejects an unknown time zone', async () => {
    const { agent } = await verifiedPerson(t);
    const shop = await agent
      .post('/api/v1/shops')
      .send({ name: 'Birch Barn', timeZone: 'America/Denver' })
      .expect(201);
    expect(shop.body).toMatchObject({ name: 'Birch Barn', timeZone: 'America/Denver' });
    const me = await agent.get('/api/v1/me').expect(200);
    // Denver is in the US, so the week report starts on ANSI letter (ingest/paperSize.ts).
    expect(me.body.shops).toEqual([
      {
        id: shop.body.id,
        name: 'Birch Barn',
        timeZone: 'America/Denver',
        role: 'owner',
        paperSize: 'letter',
      },
    ]);

    const bad = await agent
      .post('/api/v1/shops')
      .send({ name: 'X', timeZone: 'Mars/Olympus' })
      .expect(400);
    expect(bad.body).toMatchObject(errorShape);
    expect(bad.body.error.details[0].path).toBe('timeZone');
  });
});
