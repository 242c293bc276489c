// The server's logs as an operator reads them: one JSON line per request with a request id
// that the response carries too, the 5xx body naming that id, components for the background
// parts, and never a password, cookie, sensor token or link token — checked on a real app with
// its real SMTP server and database.
import { randomUUID } from 'node:crypto';
import { Writable } from 'node:stream';

import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createApp } from '@/server/app';
import { SESSION_COOKIE } from '@/server/auth/session';
import { readConfig } from '@/server/config';
import { startNotificationListener } from '@/db/listener';
import { createLogger } from '@/server/logger';
import type { ReadingWriter } from '@/server/readings/writer';
import { VERIFICATION_SUBJECT } from '@/server/mail';
import { safeUrl } from '@/server/requestLog';

import {
  makeTestApp,
  ownerWithSensor,
  TEST_PUBLIC_URL,
  uniqueEmail,
  type TestApp,
} from '../support/app';
import { postIngest } from '../support/ingest';
import { captureLogs, type CapturedLogs } from '../support/logs';
import { linkToken, waitForMail } from '../support/mail';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

let logs: CapturedLogs;
let t: TestApp;
beforeAll(() => {
  // Debug, so the mail module's own lines are there to be checked as well.
  logs = captureLogs('debug');
  t = makeTestApp({ logger: logs.logger });
});
afterAll(() => t.pool.end());

type Line = Record<string, unknown> & {
  req?: { id?: string; method?: string; url?: string };
  res?: { statusCode?: number };
};

/** The request lines (component http) for one request id. */
function requestLines(id: string): Line[] {
  return (logs.lines() as Line[]).filter((l) => l.component === 'http' && l.req?.id === id);
}

/** The value of a Set-Cookie for the session, as the browser would store it. */
function sessionCookie(res: request.Response): string {
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  const found = cookies.find((c) => c.startsWith(`${SESSION_COOKIE}=`));
  if (!found) throw new Error(`no session cookie in ${JSON.stringify(cookies)}`);
  return found.slice(SESSION_COOKIE.length + 1).split(';')[0]!;
}

describe('request lines', () => {
  it('logs each request once with status, path and id, and never a secret', async () => {
    const email = uniqueEmail('logs');
    const password = `first-pass-${randomUUID()}`;
    const newPassword = `second-pass-${randomUUID()}`;
    const seen: { res: request.Response; method: string; path: string }[] = [];
    const keep = (res: request.Response, method: string, path: string) => {
      seen.push({ res, method, path });
      return res;
    };

    keep(
      await request(t.app)
        .post('/api/v1/auth/sign-up')
        .send({ email, password, name: 'Log Reader' })
        .expect(202),
      'POST',
      '/api/v1/auth/sign-up',
    );
    const verifyMail = await waitForMail(t.outbox, email, { subject: VERIFICATION_SUBJECT });
    const verifyToken = linkToken(verifyMail, 'verify');
    const verified = keep(
      await request(t.app).post('/api/v1/auth/verify').send({ token: verifyToken }).expect(200),
      'POST',
      '/api/v1/auth/verify',
    );
    const signIn = keep(
      await request(t.app).post('/api/v1/auth/sign-in').send({ email, password }).expect(200),
      'POST',
      '/api/v1/auth/sign-in',
    );
    // A request that sends the cookie back, as a browser does.
    keep(
      await request(t.app)
        .get('/api/v1/me')
        .set('cookie', `${SESSION_COOKIE}=${sessionCookie(signIn)}`)
        .expect(200),
      'GET',
      '/api/v1/me',
    );

    const o = await ownerWithSensor(t);
    keep(
      await postIngest(t.app, o.token, { air: 14.2, rh: 71, surface: 11.9 }).expect(202),
      'POST',
      '/api/v1/ingest',
    );

    keep(
      await request(t.app).post('/api/v1/auth/password-reset').send({ email }).expect(202),
      'POST',
      '/api/v1/auth/password-reset',
    );
    const mail = await waitForMail(t.outbox, email, { subject: /reset/i });
    const resetToken = linkToken(mail, 'reset-password');
    const resetLink = `${TEST_PUBLIC_URL}/reset-password/${resetToken}`;
    expect(mail.text).toContain(resetLink);
    // Someone opens the link (this app serves no web pages, so it is a 404, logged all the same)
    // and a script passes a token in a query string.
    keep(
      await request(t.app).get(`/reset-password/${resetToken}`).expect(404),
      'GET',
      '/reset-password/[redacted]',
    );
    keep(
      await request(t.app).get(`/api/v1/health?token=${resetToken}&verbose=1`).expect(200),
      'GET',
      '/api/v1/health?token=[redacted]&verbose=1',
    );
    const confirm = keep(
      await request(t.app)
        .post('/api/v1/auth/password-reset/confirm')
        .send({ token: resetToken, password: newPassword })
        .expect(204),
      'POST',
      '/api/v1/auth/password-reset/confirm',
    );
    keep(
      await request(t.app)
        .post('/api/v1/auth/sign-in')
        .send({ email, password: newPassword })
        .expect(200),
      'POST',
      '/api/v1/auth/sign-in',
    );

    for (const { res, method, path } of seen) {
      const id = res.headers['x-request-id'] as string;
      expect(id, path).toMatch(UUID);
      const lines = requestLines(id);
      expect(lines, `${method} ${path}`).toEqual([
        expect.objectContaining({
          req: { id, method, url: path },
          res: { statusCode: res.status },
          responseTime: expect.any(Number),
        }),
      ]);
    }
    const ingestLine = requestLines(seen[4]!.res.headers['x-request-id'] as string)[0]!;
    expect(ingestLine.sensorId).toBe(o.sensorId);

    // The mail module says it kept a message — and nothing of what the message says.
    expect(logs.lines()).toContainEqual(
      expect.objectContaining({
        component: 'mail',
        msg: 'local SMTP: kept a message in the outbox',
        recipients: 1,
      }),
    );

    const text = logs.text();
    const secrets = {
      password,
      newPassword,
      sessionAfterVerify: sessionCookie(verified),
      verifyToken,
      sessionAfterSignIn: sessionCookie(signIn),
      sessionAfterReset: sessionCookie(confirm),
      sensorToken: o.token,
      ownerPassword: o.password,
      resetToken,
      resetLink,
    };
    for (const [name, secret] of Object.entries(secrets)) {
      expect(text.includes(secret), `${name} is in the log`).toBe(false);
    }
  });

  it('keeps a safe X-Request-Id from the caller and replaces any other', async () => {
    const o = await ownerWithSensor(t);
    const kept = await postIngest(t.app, o.token, { air: 14, rh: 60 })
      .set('x-request-id', 'sensor-7.retry_2')
      .expect(202);
    expect(kept.headers['x-request-id']).toBe('sensor-7.retry_2');
    expect(requestLines('sensor-7.retry_2')).toHaveLength(1);

    for (const unsafe of ['x'.repeat(65), 'has space', '"}{"level":60', 'id\u00e9']) {
      // Refused at the door (no token) and unknown paths carry an id too.
      for (const res of [
        await request(t.app).post('/api/v1/ingest').set('x-request-id', unsafe).send({}),
        await request(t.app).get('/api/v1/nowhere').set('x-request-id', unsafe),
      ]) {
        expect(res.status).toBeGreaterThanOrEqual(400);
        expect(res.headers['x-request-id']).toMatch(UUID);
        expect(logs.text().includes(unsafe)).toBe(false);
      }
    }
  });
});

describe('a 500', () => {
  it('names its request id in the body, the header and the log line with the error', async () => {
    const o = await ownerWithSensor(t);
    // Storage that fails in a way we do not recognise (not an outage: that answers 503).
    const failingWriter: ReadingWriter = {
      write: () => Promise.reject(new Error('reading writer: disk quota exceeded')),
      close: async () => {},
    };
    const app = createApp({
      ...t,
      writer: failingWriter,
      publicUrl: TEST_PUBLIC_URL,
      logger: logs.logger,
    });

    const res = await postIngest(app, o.token, { air: 14, rh: 60 }).expect(500);
    const id = res.headers['x-request-id'] as string;
    expect(id).toMatch(UUID);
    expect(res.body.error).toEqual({
      code: 'internal',
      message: expect.any(String),
      details: [{ path: 'requestId', message: id }],
    });
    expect(JSON.stringify(res.body)).not.toContain('disk quota');
    expect(requestLines(id)).toEqual([
      expect.objectContaining({
        level: 50,
        req: { id, method: 'POST', url: '/api/v1/ingest' },
        res: { statusCode: 500 },
        sensorId: o.sensorId,
        err: expect.objectContaining({ message: 'reading writer: disk quota exceeded' }),
      }),
    ]);
  });
});

describe('the notification listener', () => {
  it('logs losing its connection and listening again, as component live', async () => {
    const listenerLogs = captureLogs();
    const listener = startNotificationListener(process.env.DATABASE_URL!, listenerLogs.logger);
    try {
      await listener.ready;
      const channel = `log_test_${randomUUID().replace(/-/g, '')}`;
      listener.on(channel, () => {});
      const backend = async () =>
        (
          await t.pool.query<{ pid: number }>('select pid from pg_stat_activity where query = $1', [
            `LISTEN ${channel}`,
          ])
        ).rows[0]?.pid;
      await expect.poll(backend).toBeDefined();
      await t.pool.query('select pg_terminate_backend($1)', [await backend()]);

      await expect
        .poll(() => listenerLogs.lines().map((l) => [l.component, l.msg]), { timeout: 10_000 })
        .toEqual([
          ['live', 'notification listener: lost its database connection; reconnecting'],
          ['live', 'notification listener: listening again'],
        ]);
    } finally {
      await listener.close();
    }
  });
});

describe('configuration and format', () => {
  const env = {
    DATABASE_URL: 'postgres://127.0.0.1/x',
    SESSION_SECRET: 's'.repeat(32),
    NODE_ENV: 'test',
  } as const;

  it.each([
    [undefined, 'info'],
    ['debug', 'debug'],
    [' WARN ', 'warn'],
    ['silent', 'silent'],
  ])('LOG_LEVEL=%j reads as %s', (value, level) => {
    expect(readConfig({ ...env, LOG_LEVEL: value }).logLevel).toBe(level);
  });

  it('refuses a LOG_LEVEL it does not know, naming the choices', () => {
    expect(() => readConfig({ ...env, LOG_LEVEL: 'loud' })).toThrow(
      /LOG_LEVEL must be one of fatal, error, warn, info, debug, trace, silent/,
    );
  });

  it('writes JSON lines, or readable lines when pretty (a terminal)', async () => {
    const written: Record<'json' | 'pretty', string[]> = { json: [], pretty: [] };
    for (const kind of ['json', 'pretty'] as const) {
      const destination = new Writable({
        write(chunk: Buffer, _encoding, done) {
          written[kind].push(chunk.toString());
          done();
        },
      });
      const logger = createLogger({ level: 'info', pretty: kind === 'pretty', destination });
      logger.child({ component: 'server' }).info({ password: 'hunter22' }, 'hello operator');
    }
    await expect.poll(() => written.pretty.join('')).toMatch(/INFO.*hello operator/);
    expect(JSON.parse(written.json.join(''))).toMatchObject({
      level: 30,
      component: 'server',
      msg: 'hello operator',
      password: '[redacted]',
    });
    const pretty = written.pretty.join('');
    expect(() => JSON.parse(pretty)).toThrow();
    expect(pretty).not.toContain('hunter22');
  });

  // Link tokens sit in paths and sometimes in queries; ids of a shop's invitations are no secret.
  it.each([
    ['/reset-password/abcDEF123_-', '/reset-password/[redacted]'],
    ['/invite/abcDEF123?x=1', '/invite/[redacted]?x=1'],
    ['/api/v1/invitations/abcDEF123/accept', '/api/v1/invitations/[redacted]/accept'],
    ['/API/V1/Invitations/abcDEF123', '/API/V1/Invitations/[redacted]'],
    ['/api/v1/shops/s1/invitations/i1', '/api/v1/shops/s1/invitations/i1'],
    ['/api/v1/health?token=abc&a=1', '/api/v1/health?token=[redacted]&a=1'],
    ['/x?access_token=abc&Password=p', '/x?access_token=[redacted]&Password=[redacted]'],
    ['/x?%74oken=abc', '/x?%74oken=[redacted]'],
    ['/x?%E0%A4%A=abc', '/x?%E0%A4%A=[redacted]'],
    [
      '/api/v1/shops/s1/zones/z1/readings?from=a&to=b',
      '/api/v1/shops/s1/zones/z1/readings?from=a&to=b',
    ],
  ])('logs %s as %s', (url, logged) => {
    expect(safeUrl(url)).toBe(logged);
  });
});
