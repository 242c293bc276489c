// Session lifetime on an injected clock: a session renewed every few days still ends 30 days
// after its sign-in (401 session_expired), renewal never reaches past that end, and the cookie
// is Secure whenever PUBLIC_URL is https (COOKIE_SECURE overrides either way).
import { SignJWT } from 'jose';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { readConfig } from '@/server/config';
import { SESSION_ABSOLUTE_S, SESSION_COOKIE } from '@/server/auth/session';

import { makeTestApp, verifiedPerson, TEST_SECRET, type TestApp } from '../support/app';
import { sessionCookieOf } from '../support/sessionCookie';

const DAY_MS = 24 * 3_600_000;
let nowMs = Date.now();
let t: TestApp;
beforeAll(() => void (t = makeTestApp({ now: () => nowMs })));
afterAll(() => t.pool.end());

const me = (cookie: string) => request(t.app).get('/api/v1/me').set('Cookie', cookie);

function setCookieOf(res: request.Response): string | undefined {
  return ([] as string[])
    .concat(res.headers['set-cookie'] ?? [])
    .find((c) => c.startsWith(`${SESSION_COOKIE}=`));
}

const maxAgeSOf = (setCookie: string) => Number(/Max-Age=(\d+)/.exec(setCookie)?.[1]);

describe('the absolute session lifetime', () => {
  it('ends a session renewed every 3.5+ days at 30 days after the sign-in', async () => {
    const { email, password } = await verifiedPerson(t);
    const signedInMs = nowMs;
    const endMs = signedInMs + SESSION_ABSOLUTE_S * 1000;
    try {
      let cookie = sessionCookieOf(
        await request(t.app).post('/api/v1/auth/sign-in').send({ email, password }).expect(200),
      );
      // Active every 4 days: each visit is past half the 7-day token, so it is renewed.
      for (let day = 4; day <= 24; day += 4) {
        nowMs = signedInMs + day * DAY_MS;
        const res = await me(cookie).expect(200);
        const renewed = setCookieOf(res);
        expect(renewed, `day ${day}`).toBeDefined();
        // Never past the absolute end: on day 24 the cookie lives 6 days, not 7.
        expect(maxAgeSOf(renewed!)).toBe(Math.min(7 * 86_400, (endMs - nowMs) / 1000));
        cookie = sessionCookieOf(res);
      }
      // Day 28: the token already ends at the absolute end; renewing would not extend it.
      nowMs = signedInMs + 28 * DAY_MS;
      expect(setCookieOf(await me(cookie).expect(200))).toBeUndefined();
      nowMs = endMs - 60_000;
      await me(cookie).expect(200);
      nowMs = endMs + 1000;
      const ended = await me(cookie).expect(401);
      expect(ended.body.error.code).toBe('session_expired');
    } finally {
      nowMs = signedInMs;
    }
  });

  it('refuses a token renewed yesterday whose sign-in is 31 days old', async () => {
    const { user } = await verifiedPerson(t);
    const nowS = Math.floor(nowMs / 1000);
    // What an uncapped renewal would have issued: fresh iat and exp, the old sign-in time.
    const token = await new SignJWT({ sv: 0, auth_time: nowS - 31 * 86_400 })
      .setProtectedHeader({ alg: 'HS256' })
      .setSubject(user.id)
      .setIssuedAt(nowS - 86_400)
      .setExpirationTime(nowS + 6 * 86_400)
      .sign(new TextEncoder().encode(TEST_SECRET));
    const res = await me(`${SESSION_COOKIE}=${token}`).expect(401);
    expect(res.body.error.code).toBe('session_expired');
    // A route open to anyone still answers, as for no session.
    await request(t.app)
      .get('/api/v1/health')
      .set('Cookie', `${SESSION_COOKIE}=${token}`)
      .expect(200);
  });

  it('keeps an idle session unrenewed past 7 days as signed out, not expired', async () => {
    const { email, password } = await verifiedPerson(t);
    const startMs = nowMs;
    try {
      const cookie = sessionCookieOf(
        await request(t.app).post('/api/v1/auth/sign-in').send({ email, password }).expect(200),
      );
      nowMs = startMs + 8 * DAY_MS;
      expect((await me(cookie).expect(401)).body.error.code).toBe('not_signed_in');
    } finally {
      nowMs = startMs;
    }
  });
});

describe('the Secure cookie attribute', () => {
  const env = { DATABASE_URL: 'postgres://127.0.0.1/x', SESSION_SECRET: TEST_SECRET };

  it.each([
    [{ PUBLIC_URL: 'https://drybench.example.com' }, true],
    [{ PUBLIC_URL: 'https://drybench.example.com', COOKIE_SECURE: 'false' }, false],
    [{ PUBLIC_URL: 'http://shop.lan:8080' }, false],
    [{ PUBLIC_URL: 'http://shop.lan:8080', COOKIE_SECURE: 'true' }, true],
    [{}, false],
  ])('with %o: Secure %s', async (vars, secure) => {
    const config = readConfig({ ...env, ...vars });
    const local = makeTestApp({ cookieSecure: config.cookieSecure });
    try {
      const { email, password } = await verifiedPerson(local);
      const res = await request(local.app)
        .post('/api/v1/auth/sign-in')
        .send({ email, password })
        .expect(200);
      const setCookie = setCookieOf(res)!;
      expect(setCookie).toMatch(/HttpOnly/);
      expect(/;\s*Secure/i.test(setCookie)).toBe(secure);
    } finally {
      await local.pool.end();
    }
  });
});
