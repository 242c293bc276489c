// Limits on the account routes, on an injected clock so nothing waits: failed sign-ins per
// account from any network address with a doubling back-off, reset requests per address and
// per target e-mail, reset links tried per address, password changes and verification mails
// per account. Every refusal is a 429 in the shared error shape with Retry-After.
import http from 'node:http';
import type { AddressInfo } from 'node:net';

import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

import { insertUser } from '@/db/queries/users';
import { hashPassword } from '@/server/auth/password';
import { DEFAULT_RATE_LIMITS, type RateLimitConfig } from '@/server/auth/rateLimits';

import {
  makeTestApp,
  TEST_RATE_LIMITS,
  uniqueEmail,
  verifiedPerson,
  type TestApp,
} from '../support/app';

// Each failed sign-in or password change is a real scrypt verify: on a busy 2-core machine a
// test here can take longer than the project's default timeout.
vi.setConfig({ testTimeout: 90_000 });

let nowMs = Date.now();
const apps: TestApp[] = [];
function limitedApp(limits: Partial<RateLimitConfig> = {}) {
  const t = makeTestApp({ now: () => nowMs, rateLimits: { ...TEST_RATE_LIMITS, ...limits } });
  apps.push(t);
  return t;
}
afterAll(async () => {
  for (const t of apps) await t.pool.end();
});

const PASSWORD = 'the right password';
let sharedHash: Promise<string> | null = null;
/** An account made straight in the database (the limits do not care how it was made). */
async function account(t: TestApp) {
  sharedHash ??= hashPassword(PASSWORD);
  const email = uniqueEmail('limited');
  await insertUser(t.db, { email, name: 'Limited', passwordHash: await sharedHash });
  return email;
}

function expectRefused(res: { status: number; body: unknown; headers: Record<string, string> }) {
  expect(res.status).toBe(429);
  expect(res.body).toEqual({
    error: { code: 'too_many_requests', message: expect.stringMatching(/wait/i), details: [] },
  });
  expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
  return Number(res.headers['retry-after']);
}

/** A server on loopback, so requests can come from different network addresses (127.0.0.x). */
async function listen(t: TestApp) {
  const server = http.createServer(t.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  const post = (from: string, path: string, body: object) =>
    new Promise<{ status: number; body: unknown; headers: Record<string, string> }>(
      (resolve, reject) => {
        const req = http.request(
          {
            host: '127.0.0.1',
            port,
            path: `/api/v1${path}`,
            method: 'POST',
            localAddress: from,
            headers: { 'content-type': 'application/json' },
          },
          (res) => {
            let text = '';
            res.on('data', (chunk: Buffer) => (text += chunk.toString()));
            res.on('end', () =>
              resolve({
                status: res.statusCode ?? 0,
                body: JSON.parse(text) as unknown,
                headers: res.headers as Record<string, string>,
              }),
            );
          },
        );
        req.on('error', reject);
        req.end(JSON.stringify(body));
      },
    );
  return { post, close: () => new Promise((resolve) => server.close(resolve)) };
}

describe('failed sign-ins per account, from any address', () => {
  let t: TestApp;
  let server: Awaited<ReturnType<typeof listen>>;
  beforeAll(async () => {
    t = limitedApp();
    server = await listen(t);
  });
  afterAll(() => server.close());

  it('after 5 failures refuses each further attempt for 1 s, 2 s, 4 s …, and a success resets it', async () => {
    const email = await account(t);
    const from = (i: number) => `127.0.0.${2 + (i % 5)}`;
    const signIn = (i: number, password: string) =>
      server.post(from(i), '/auth/sign-in', { email, password });
    // Five failures, each from another address: no address sees more than one.
    for (let i = 0; i < 5; i++) expect((await signIn(i, 'wrong guess')).status).toBe(401);

    const startMs = nowMs;
    try {
      // A sixth address, the right password: refused for 1 s all the same.
      expect(expectRefused(await signIn(5, PASSWORD))).toBe(1);
      // Another account from the same addresses is not affected.
      const other = await account(t);
      expect(
        (await server.post(from(5), '/auth/sign-in', { email: other, password: 'no' })).status,
      ).toBe(401);
      nowMs += 1_000;
      expect((await signIn(6, 'wrong guess')).status).toBe(401);
      expect(expectRefused(await signIn(7, 'wrong guess'))).toBe(2);
      nowMs += 1_500;
      expect(expectRefused(await signIn(7, 'wrong guess'))).toBe(1);
      nowMs += 500;
      expect((await signIn(8, 'wrong guess')).status).toBe(401);
      expect(expectRefused(await signIn(9, PASSWORD))).toBe(4);
      nowMs += 4_000;
      // The right password after the wait signs in and clears the count.
      expect((await signIn(10, PASSWORD)).status).toBe(200);
      for (let i = 0; i < 5; i++) expect((await signIn(i, 'wrong guess')).status).toBe(401);
      expect(expectRefused(await signIn(5, 'wrong guess'))).toBe(1);
    } finally {
      nowMs = startMs;
    }
  });

  it('doubles up to 15 minutes, and treats an address without an account the same', async () => {
    for (const email of [await account(t), uniqueEmail('nobody')]) {
      const startMs = nowMs;
      try {
        const waits: number[] = [];
        for (let i = 0; i < 5; i++) {
          const res = await server.post(from(i), '/auth/sign-in', { email, password: 'wrong' });
          expect(res.status).toBe(401);
        }
        for (let i = 0; i < 12; i++) {
          const wait = expectRefused(
            await server.post(from(i), '/auth/sign-in', { email, password: 'wrong' }),
          );
          waits.push(wait);
          nowMs += wait * 1_000;
          expect(
            (await server.post(from(i), '/auth/sign-in', { email, password: 'wrong' })).status,
          ).toBe(401);
        }
        expect(waits).toEqual([1, 2, 4, 8, 16, 32, 64, 128, 256, 512, 900, 900]);
      } finally {
        nowMs = startMs;
      }
    }
    function from(i: number) {
      return `127.0.0.${2 + (i % 5)}`;
    }
  });

  it('keeps the limit of failures per account and address on the real clock', async () => {
    const email = await account(t);
    const startMs = nowMs;
    try {
      for (let i = 0; i < DEFAULT_RATE_LIMITS.signInPerAccount; i++) {
        expect(
          (await server.post('127.0.0.20', '/auth/sign-in', { email, password: 'x' })).status,
        ).toBe(401);
        // Past the back-off each time, so only the per-address count remains.
        nowMs += 20 * 60_000;
      }
      expectRefused(
        await server.post('127.0.0.20', '/auth/sign-in', { email, password: PASSWORD }),
      );
      // From another address the right password still works.
      expect(
        (await server.post('127.0.0.21', '/auth/sign-in', { email, password: PASSWORD })).status,
      ).toBe(200);
    } finally {
      nowMs = startMs;
    }
  });
});

describe('password reset limits', () => {
  it('limits reset mails per target e-mail, whoever asks, for known and unknown addresses alike', async () => {
    const t = limitedApp();
    const server = await listen(t);
    try {
      for (const email of [await account(t), uniqueEmail('nobody')]) {
        for (let i = 0; i < DEFAULT_RATE_LIMITS.resetPerEmail; i++) {
          const res = await server.post(`127.0.0.${30 + i}`, '/auth/password-reset', { email });
          expect(res.status).toBe(202);
        }
        expectRefused(await server.post('127.0.0.40', '/auth/password-reset', { email }));
      }
      // Another address is not affected.
      const other = await server.post('127.0.0.40', '/auth/password-reset', {
        email: uniqueEmail('other'),
      });
      expect(other.status).toBe(202);
    } finally {
      await server.close();
    }
  });

  it('limits reset mails per network address, whatever the e-mail', async () => {
    const t = limitedApp({ resetPerIp: 3 });
    for (let i = 0; i < 3; i++) {
      await request(t.app)
        .post('/api/v1/auth/password-reset')
        .send({ email: uniqueEmail('any') })
        .expect(202);
    }
    expectRefused(
      await request(t.app)
        .post('/api/v1/auth/password-reset')
        .send({ email: uniqueEmail('any') }),
    );
  });

  it('limits reset links tried per network address, apart from reset mails', async () => {
    const t = limitedApp({ resetConfirmPerIp: 3 });
    const confirm = () =>
      request(t.app)
        .post('/api/v1/auth/password-reset/confirm')
        .send({ token: 'y'.repeat(43), password: 'long enough pass' });
    for (let i = 0; i < 3; i++) expect((await confirm()).status).toBe(410);
    const startMs = nowMs;
    try {
      expectRefused(await confirm());
      // Asking for a mail is a separate count.
      await request(t.app)
        .post('/api/v1/auth/password-reset')
        .send({ email: uniqueEmail('any') })
        .expect(202);
      nowMs += DEFAULT_RATE_LIMITS.windowMs;
      expect((await confirm()).status).toBe(410);
    } finally {
      nowMs = startMs;
    }
  });
});

describe('per-account limits of signed-in routes', () => {
  it('allows 10 password changes per 15 minutes', async () => {
    const t = limitedApp();
    const person = await verifiedPerson(t);
    const startMs = nowMs;
    try {
      for (let i = 0; i < DEFAULT_RATE_LIMITS.passwordChangePerAccount; i++) {
        const res = await person.agent
          .post('/api/v1/me/password')
          .send({ currentPassword: 'a wrong guess', newPassword: 'a new long password' });
        expect(res.status).toBe(400);
      }
      expectRefused(
        await person.agent
          .post('/api/v1/me/password')
          .send({ currentPassword: person.password, newPassword: 'a new long password' }),
      );
      nowMs += DEFAULT_RATE_LIMITS.windowMs;
      await person.agent
        .post('/api/v1/me/password')
        .send({ currentPassword: person.password, newPassword: 'a new long password' })
        .expect(204);
    } finally {
      nowMs = startMs;
    }
  });

  it('limits verification mails sent again per account', async () => {
    const t = limitedApp();
    const email = uniqueEmail('resend');
    await request(t.app)
      .post('/api/v1/auth/sign-up')
      .send({ email, password: PASSWORD, name: 'Resender' })
      .expect(202);
    const agent = request.agent(t.app);
    await agent.post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(200);
    for (let i = 0; i < DEFAULT_RATE_LIMITS.verificationPerAccount; i++) {
      await agent.post('/api/v1/me/verification').send({}).expect(202);
    }
    expectRefused(await agent.post('/api/v1/me/verification').send({}));
  });
});
