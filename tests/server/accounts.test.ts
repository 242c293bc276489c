// Accounts and sessions on the real test database: password reset (single use, expiring, on an
// injected clock), tampered cookies, cross-site writes, and sign-out or
// a password change ending the account's other sessions.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { SESSION_TTL_S } from '@/server/auth/session';

import { makeTestApp, verifiedPerson, TEST_PUBLIC_URL, type TestApp } from '../support/app';
import { linkToken, waitForMail } from '../support/mail';
import { sessionCookieOf } from '../support/sessionCookie';

// The app's clock: tests move it forward to pass expiry times.
let nowMs = Date.now();
let t: TestApp;
beforeAll(() => {
  t = makeTestApp({ now: () => nowMs });
});
afterAll(() => t.pool.end());

const MINUTE_MS = 60_000;
const RESET_SUBJECT = 'Reset your Drybench password';

async function signIn(email: string, password: string) {
  const res = await request(t.app).post('/api/v1/auth/sign-in').send({ email, password });
  expect(res.status, res.text).toBe(200);
  return sessionCookieOf(res);
}

const me = (cookie: string) => request(t.app).get('/api/v1/me').set('Cookie', cookie);

describe('password reset by e-mail', () => {
  it('sends a link that works once, within the hour, and ends older sessions', async () => {
    const { email, password } = await verifiedPerson(t, 'Resetting Person');
    const before = await signIn(email, password);

    await request(t.app).post('/api/v1/auth/password-reset').send({ email }).expect(202);
    const mail = await waitForMail(t.outbox, email, { subject: RESET_SUBJECT });
    expect(mail.subject).toBe('Reset your Drybench password');
    expect(mail.html).toContain(`${TEST_PUBLIC_URL}/reset-password/`);
    const token = linkToken(mail, 'reset-password');

    const newPassword = 'a brand new password';
    const confirm = await request(t.app)
      .post('/api/v1/auth/password-reset/confirm')
      .send({ token, password: newPassword })
      .expect(204);
    await me(sessionCookieOf(confirm)).expect(200);
    // The session from before the reset has ended; the old password no longer works.
    await me(before).expect(401);
    await request(t.app).post('/api/v1/auth/sign-in').send({ email, password }).expect(401);
    await signIn(email, newPassword);

    const again = await request(t.app)
      .post('/api/v1/auth/password-reset/confirm')
      .send({ token, password: 'yet another password' })
      .expect(410);
    expect(again.body.error.code).toBe('link_expired');
    await signIn(email, newPassword);
  });

  it('refuses a link after 60 minutes', async () => {
    const { email, password } = await verifiedPerson(t);
    await request(t.app).post('/api/v1/auth/password-reset').send({ email }).expect(202);
    const token = linkToken(
      await waitForMail(t.outbox, email, { subject: RESET_SUBJECT }),
      'reset-password',
    );
    const startMs = nowMs;
    try {
      nowMs = startMs + 61 * MINUTE_MS;
      await request(t.app)
        .post('/api/v1/auth/password-reset/confirm')
        .send({ token, password: 'too late password' })
        .expect(410);
    } finally {
      nowMs = startMs;
    }
    await signIn(email, password);
  });

  it('answers 202 for an unknown address and sends nothing', async () => {
    const email = 'nobody-here@test.example';
    await request(t.app).post('/api/v1/auth/password-reset').send({ email }).expect(202);
    await new Promise((r) => setTimeout(r, 200));
    expect(t.outbox.list().some((m) => m.to.includes(email))).toBe(false);
  });
});

describe('sessions', () => {
  it('refuses a session cookie altered by one byte', async () => {
    const { email, password } = await verifiedPerson(t);
    const cookie = await signIn(email, password);
    await me(cookie).expect(200);
    const [name, value] = cookie.split('=') as [string, string];
    // One character of the payload, then one of the signature.
    for (const at of [value.indexOf('.') + 5, value.length - 3]) {
      const flipped = value[at] === 'A' ? 'B' : 'A';
      const altered = `${name}=${value.slice(0, at)}${flipped}${value.slice(at + 1)}`;
      const res = await me(altered).expect(401);
      expect(res.body.error.code).toBe('not_signed_in');
    }
  });

  it('ends every session of the account on sign-out', async () => {
    const { email, password } = await verifiedPerson(t);
    const phone = await signIn(email, password);
    const laptop = await signIn(email, password);
    await request(t.app).post('/api/v1/auth/sign-out').set('Cookie', phone).expect(204);
    await me(phone).expect(401);
    await me(laptop).expect(401);
    await signIn(email, password);
  });

  it('ends the other sessions on a password change and keeps this one', async () => {
    const { email, password } = await verifiedPerson(t);
    const here = await signIn(email, password);
    const elsewhere = await signIn(email, password);
    const wrong = await request(t.app)
      .post('/api/v1/me/password')
      .set('Cookie', here)
      .send({ currentPassword: 'not the password', newPassword: 'changed password 1' })
      .expect(400);
    expect(wrong.body.error.details[0].path).toBe('currentPassword');
    await me(elsewhere).expect(200);

    const changed = await request(t.app)
      .post('/api/v1/me/password')
      .set('Cookie', here)
      .send({ currentPassword: password, newPassword: 'changed password 1' })
      .expect(204);
    await me(sessionCookieOf(changed)).expect(200);
    await me(elsewhere).expect(401);
    await me(here).expect(401);
  });

  it('renews a cookie past half its life and expires an unrenewed one', async () => {
    const { email, password } = await verifiedPerson(t);
    const startMs = nowMs;
    try {
      const first = await signIn(email, password);
      nowMs = startMs + (SESSION_TTL_S / 2 + 3600) * 1000;
      const renewedRes = await me(first).expect(200);
      const renewed = sessionCookieOf(renewedRes);
      expect(renewed).not.toBe(first);
      nowMs = startMs + (SESSION_TTL_S + 3600) * 1000;
      await me(first).expect(401);
      await me(renewed).expect(200);
    } finally {
      nowMs = startMs;
    }
  });

  it('keeps the profile: name and unit preference', async () => {
    const { agent } = await verifiedPerson(t, 'Before Name');
    const res = await agent.patch('/api/v1/me').send({ name: 'After Name', unitPref: 'F' });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ name: 'After Name', unitPref: 'F' });
    const bad = await agent.patch('/api/v1/me').send({ unitPref: 'K' }).expect(400);
    expect(bad.body.error.details[0].path).toBe('unitPref');
    expect((await agent.get('/api/v1/me').expect(200)).body.user.unitPref).toBe('F');
  });
});

describe('cross-site requests', () => {
  it('refuses a cookie-carrying write from another origin and changes nothing', async () => {
    const { agent } = await verifiedPerson(t);
    for (const headers of [
      { origin: 'http://evil.example' },
      { origin: 'null' },
      { referer: 'http://evil.example/page' },
      { 'sec-fetch-site': 'cross-site' },
    ]) {
      const res = await agent
        .post('/api/v1/shops')
        .set(headers)
        .send({ name: 'Planted shop', timeZone: 'UTC' })
        .expect(403);
      expect(res.body.error.code).toBe('cross_site_request');
    }
    expect((await agent.get('/api/v1/me').expect(200)).body.shops).toEqual([]);
    // Our own origins pass: the request's host and the configured public URL.
    const host = '127.0.0.1:9';
    await agent
      .post('/api/v1/shops')
      .set({ host, origin: `http://${host}` })
      .send({ name: 'Own shop', timeZone: 'UTC' })
      .expect(201);
    await agent
      .post('/api/v1/shops')
      .set({ origin: TEST_PUBLIC_URL })
      .send({ name: 'Public shop', timeZone: 'UTC' })
      .expect(201);
  });
});
