// What the account routes reveal and prove: sign-in and sign-up answer the same whether or not
// an address has an account, a new account proves its address through a single-use link that
// also signs it in, accepting an e-mailed invitation proves it too, and a password hashed with
// older scrypt parameters is re-hashed with today's on the next sign-in.
import { randomBytes, scryptSync } from 'node:crypto';

import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { insertUser } from '@/db/queries/users';
import { hashPassword, verifyPassword } from '@/server/auth/password';

import {
  makeTestApp,
  ownerWithSensor,
  TEST_PUBLIC_URL,
  uniqueEmail,
  verifiedPerson,
  type TestApp,
} from '../support/app';
import { linkToken, waitForMail } from '../support/mail';
import { sessionCookieOf } from '../support/sessionCookie';

// The app's clock: the expiry test moves it past 24 hours.
let nowMs = Date.now();
let t: TestApp;
beforeAll(() => {
  t = makeTestApp({ now: () => nowMs });
});
afterAll(() => t.pool.end());

const HOUR_MS = 3_600_000;
const VERIFY_SUBJECT = 'Confirm your e-mail address for Drybench';
const PASSWORD = 'correct horse battery';

const signUpReq = (email: string, password = PASSWORD, name = 'New Person') =>
  request(t.app).post('/api/v1/auth/sign-up').send({ email, password, name });
const signInReq = (email: string, password: string) =>
  request(t.app).post('/api/v1/auth/sign-in').send({ email, password });
const verifyReq = (body: unknown) =>
  request(t.app)
    .post('/api/v1/auth/verify')
    .send(body as object);
const me = (cookie: string) => request(t.app).get('/api/v1/me').set('Cookie', cookie);

/** Process CPU time (every thread, so scrypt in libuv's pool counts) spent in `work`, in ms. */
async function cpuMsOf(work: () => Promise<unknown>): Promise<number> {
  const start = process.cpuUsage();
  await work();
  const used = process.cpuUsage(start);
  return (used.user + used.system) / 1000;
}

describe('sign-in reveals nothing', () => {
  it('answers an unknown address exactly as a wrong password, after the same scrypt work', async () => {
    const known = { email: uniqueEmail('known') };
    await insertUser(t.db, {
      email: known.email,
      name: 'Known',
      passwordHash: await hashPassword(PASSWORD),
    });
    const unknownEmail = uniqueEmail('nobody');
    // Warm both paths once (first requests pay for lazy set-up).
    await signInReq(known.email, 'not the password').expect(401);
    await signInReq(unknownEmail, 'not the password').expect(401);

    const wrong = await signInReq(known.email, 'not the password');
    const unknown = await signInReq(unknownEmail, 'not the password');
    expect(unknown.status).toBe(401);
    expect(wrong.status).toBe(401);
    expect(unknown.body).toEqual(wrong.body);
    expect(unknown.body.error.code).toBe('invalid_credentials');
    expect(unknown.headers['set-cookie']).toBeUndefined();

    // Not a race between the two paths (noisy on a shared machine): each one on its own must
    // spend at least half the CPU of one real scrypt hash and more than 20 ms of wall time.
    // Without the dummy verify the unknown path costs one indexed query, a few ms.
    const scryptCpuMs = await cpuMsOf(() => hashPassword('a password to time'));
    for (const email of [unknownEmail, known.email]) {
      const startMs = performance.now();
      const cpuMs = await cpuMsOf(() => signInReq(email, 'not the password').expect(401));
      expect(performance.now() - startMs).toBeGreaterThan(20);
      expect(cpuMs, `${email}: ${cpuMs} ms CPU, scrypt ${scryptCpuMs} ms`).toBeGreaterThan(
        Math.max(scryptCpuMs * 0.5, 10),
      );
    }
  });
});

describe('sign-up reveals nothing', () => {
  it('answers a taken address as a new one, without a session, and tells the owner instead', async () => {
    const fresh = uniqueEmail('fresh');
    const owner = await verifiedPerson(t, 'Address Owner');

    const created = await signUpReq(fresh);
    const taken = await signUpReq(owner.email.toUpperCase(), 'someone elses password');
    expect(created.status).toBe(202);
    expect(created.body).toEqual({ status: 'verification_sent', email: fresh });
    expect(taken.status).toBe(202);
    expect(taken.body).toEqual({ status: 'verification_sent', email: owner.email });
    expect(created.headers['set-cookie']).toBeUndefined();
    expect(taken.headers['set-cookie']).toBeUndefined();

    const notice = await waitForMail(t.outbox, owner.email, { subject: /tried to create/ });
    expect(notice.subject).toBe('Someone tried to create a Drybench account with your address');
    expect(notice.text).toContain('If it was you, sign in or reset your password');
    expect(notice.text).toContain(`${TEST_PUBLIC_URL}/sign-in`);
    expect(notice.text).toContain(`${TEST_PUBLIC_URL}/forgot-password`);
    expect(notice.html).toContain(`href="${TEST_PUBLIC_URL}/sign-in"`);
    expect(notice.text).not.toContain('/verify?token=');

    // The owner's account is untouched: the old password works, the attempted one does not.
    await signInReq(owner.email, owner.password).expect(200);
    await signInReq(owner.email, 'someone elses password').expect(401);
  });
});

describe('e-mail verification', () => {
  it('sends a link that verifies the address and signs in, once', async () => {
    const email = uniqueEmail('verify');
    await signUpReq(email).expect(202);
    const mail = await waitForMail(t.outbox, email, { subject: VERIFY_SUBJECT });
    expect(mail.text).toContain(`${TEST_PUBLIC_URL}/verify?token=`);
    const token = linkToken(mail, 'verify');
    expect(mail.html).toContain(`/verify?token=${token}`);

    // Unverified accounts may sign in with their password: a lost mail locks nobody out.
    const before = await signInReq(email, PASSWORD).expect(200);
    expect(before.body.user).toMatchObject({ email, emailVerified: false });
    const early = await me(sessionCookieOf(before)).expect(200);
    expect(early.body.user.emailVerified).toBe(false);

    const verified = await verifyReq({ token }).expect(200);
    expect(verified.body.user).toMatchObject({ email, name: 'New Person', emailVerified: true });
    const after = await me(sessionCookieOf(verified)).expect(200);
    expect(after.body.user).toMatchObject({ email, emailVerified: true });
    // The older session sees the change as well.
    expect((await me(sessionCookieOf(before)).expect(200)).body.user.emailVerified).toBe(true);

    const again = await verifyReq({ token });
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('verification_link_invalid');
    expect(again.headers['set-cookie']).toBeUndefined();
  });

  it('refuses a link after 24 hours', async () => {
    const email = uniqueEmail('late');
    await signUpReq(email).expect(202);
    const token = linkToken(
      await waitForMail(t.outbox, email, { subject: VERIFY_SUBJECT }),
      'verify',
    );
    const startMs = nowMs;
    try {
      nowMs = startMs + 24 * HOUR_MS + 60_000;
      const late = await verifyReq({ token });
      expect(late.status).toBe(400);
      expect(late.body.error.code).toBe('verification_link_invalid');
      expect(late.headers['set-cookie']).toBeUndefined();
    } finally {
      nowMs = startMs;
    }
    const cookie = sessionCookieOf(await signInReq(email, PASSWORD).expect(200));
    expect((await me(cookie).expect(200)).body.user.emailVerified).toBe(false);
  });

  it.each([
    ['no body', undefined],
    ['no token', {}],
    ['a number', { token: 12345678901 }],
    ['an empty token', { token: '' }],
    ['a short token', { token: 'abc' }],
    ['a huge token', { token: 'x'.repeat(5_000) }],
    ['an array', { token: ['a'.repeat(43)] }],
    ['null', { token: null }],
  ])('answers 400 in the error shape for %s', async (_name, body) => {
    const res = await verifyReq(body);
    expect(res.status).toBe(400);
    expect(res.body).toEqual({
      error: { code: 'invalid_input', message: expect.any(String), details: expect.any(Array) },
    });
    expect(res.headers['set-cookie']).toBeUndefined();
  });

  it('answers an unknown well-formed token with 400, not a session', async () => {
    const res = await verifyReq({ token: randomBytes(32).toString('base64url') });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('verification_link_invalid');
  });

  it('sends the link again on request, and refuses once the address is verified', async () => {
    const email = uniqueEmail('resend');
    await signUpReq(email).expect(202);
    await waitForMail(t.outbox, email, { subject: VERIFY_SUBJECT });
    const agent = request.agent(t.app);
    await agent.post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(200);
    // The route takes no input: anything else is refused and sends nothing.
    for (const body of [{ email: 'someone-else@test.example' }, ['x'], [{}]]) {
      const bad = await agent.post('/api/v1/me/verification').send(body);
      expect(bad.status, JSON.stringify(body)).toBe(400);
      expect(bad.body.error.code).toBe('invalid_input');
    }
    const sentBefore = t.outbox.list().filter((m) => m.to.includes(email)).length;
    const resent = await agent.post('/api/v1/me/verification').send({}).expect(202);
    expect(resent.body).toEqual({ status: 'verification_sent', email });
    await expect
      .poll(() => t.outbox.list().filter((m) => m.to.includes(email)).length)
      .toBe(sentBefore + 1);
    const token = linkToken(
      await waitForMail(t.outbox, email, { subject: VERIFY_SUBJECT }),
      'verify',
    );
    await verifyReq({ token }).expect(200);
    const refused = await agent.post('/api/v1/me/verification').send({});
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('already_verified');
  });

  it('marks an address verified when its invitation link is accepted', async () => {
    const o = await ownerWithSensor(t);
    // A new account made from the link.
    const newcomer = uniqueEmail('invited');
    await o.agent
      .post(`/api/v1/shops/${o.shopId}/invitations`)
      .send({ email: newcomer, role: 'member' })
      .expect(201);
    const token = linkToken(await waitForMail(t.outbox, newcomer), 'invite');
    const agent = request.agent(t.app);
    await agent
      .post(`/api/v1/invitations/${token}/accept`)
      .send({ name: 'Invited Hand', password: 'a good long password' })
      .expect(201);
    expect((await agent.get('/api/v1/me').expect(200)).body.user.emailVerified).toBe(true);

    // An unverified account that signs in and accepts.
    const email = uniqueEmail('unverified');
    await signUpReq(email).expect(202);
    const existing = request.agent(t.app);
    await existing.post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(200);
    expect((await existing.get('/api/v1/me').expect(200)).body.user.emailVerified).toBe(false);
    await o.agent
      .post(`/api/v1/shops/${o.shopId}/invitations`)
      .send({ email, role: 'viewer' })
      .expect(201);
    const second = linkToken(await waitForMail(t.outbox, email, { subject: /^Join / }), 'invite');
    await existing.post(`/api/v1/invitations/${second}/accept`).send({}).expect(200);
    expect((await existing.get('/api/v1/me').expect(200)).body.user.emailVerified).toBe(true);
  });
});

describe('re-hash on sign-in', () => {
  it('stores a hash made with N=2^14 again with today’s parameters', async () => {
    const password = 'an older hashed password';
    const salt = randomBytes(16);
    const key = scryptSync(password, salt, 32, { N: 2 ** 14, r: 8, p: 1 });
    const oldHash = ['scrypt', 2 ** 14, 8, 1, salt.toString('base64'), key.toString('base64')].join(
      '$',
    );
    const email = uniqueEmail('old-hash');
    const user = await insertUser(t.db, { email, name: 'Old Hash', passwordHash: oldHash });
    const stored = async () =>
      (
        await t.pool.query<{ h: string }>('select password_hash h from users where id = $1', [
          user!.id,
        ])
      ).rows[0]!.h;

    // A wrong password changes nothing.
    await signInReq(email, 'not the password').expect(401);
    expect(await stored()).toBe(oldHash);

    await signInReq(email, password).expect(200);
    const fresh = await stored();
    expect(fresh.startsWith('scrypt$32768$8$1$')).toBe(true);
    expect(await verifyPassword(password, fresh)).toBe(true);
    await signInReq(email, password).expect(200);
    // Already current: the next sign-in leaves it alone.
    expect(await stored()).toBe(fresh);
  });
});
