// Running on a network: the Host check (DNS rebinding) on every route and the WebSocket
// upgrade, the dev outbox only on loopback outside production, and TRUST_PROXY deciding
// whose X-Forwarded-For the rate limits believe. The server here listens first and answers
// exactly the Host values server/index.ts computes for its port, as in production.
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';

import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import WebSocket from 'ws';

import { allowedHostsOf, isAllowedHost } from '@/server/auth/hosts';
import { devOutboxAllowed, isLoopbackHost, readConfig } from '@/server/config';
import { startLiveHub } from '@/server/live/hub';

import {
  makeTestApp,
  ownerWithSensor,
  TEST_PUBLIC_URL,
  TEST_RATE_LIMITS,
  TEST_SECRET,
  type TestApp,
} from '../support/app';
import { postIngest } from '../support/ingest';
import { signInCookie } from '../support/sessionCookie';

const BASE_ENV = { DATABASE_URL: 'postgres://127.0.0.1/x', SESSION_SECRET: TEST_SECRET };
const configOf = (env: Record<string, string>) => readConfig({ ...BASE_ENV, ...env });

describe('which listen addresses are loopback', () => {
  it.each([
    ['127.0.0.1', true],
    ['127.255.3.4', true],
    ['localhost', true],
    ['LOCALHOST', true],
    ['::1', true],
    ['[::1]', true],
    ['0:0:0:0:0:0:0:1', true],
    ['::ffff:127.0.0.1', true],
    ['0.0.0.0', false],
    ['::', false],
    ['192.168.1.20', false],
    ['128.0.0.1', false],
    ['127.example.com', false],
    ['drybench.example.com', false],
  ])('%s → %s', (host, expected) => {
    expect(isLoopbackHost(host)).toBe(expected);
  });
});

describe('the dev outbox decision', () => {
  it.each([
    [{ host: '127.0.0.1', production: false }, true],
    [{ host: 'localhost', production: false }, true],
    [{ host: '::1', production: false }, true],
    [{ host: '127.0.0.1', production: true }, false],
    [{ host: '0.0.0.0', production: false }, false],
    [{ host: '::', production: false }, false],
    [{ host: '10.1.2.3', production: false }, false],
    [{ host: '0.0.0.0', production: true }, false],
  ])('%o → %s', (input, expected) => {
    expect(devOutboxAllowed(input)).toBe(expected);
  });

  it('overrules DEV_OUTBOX=true off loopback or in production, and says why', () => {
    const local = configOf({ DEV_OUTBOX: 'true', HOST: '127.0.0.1' });
    expect(local).toMatchObject({ devOutbox: true, devOutboxRefusal: null });
    const open = configOf({ DEV_OUTBOX: 'true', HOST: '0.0.0.0' });
    expect(open.devOutbox).toBe(false);
    expect(open.devOutboxRefusal).toMatch(/HOST=0\.0\.0\.0 is not a loopback address/);
    const production = configOf({ DEV_OUTBOX: 'true', NODE_ENV: 'production' });
    expect(production.devOutbox).toBe(false);
    expect(production.devOutboxRefusal).toMatch(/NODE_ENV=production/);
    expect(configOf({ HOST: '0.0.0.0' }).devOutboxRefusal).toBeNull();
  });
});

describe('TRUST_PROXY', () => {
  it.each([
    [undefined, false],
    ['false', false],
    ['true', true],
    ['0', 0],
    ['1', 1],
    ['2', 2],
    ['10.0.0.0/8', ['10.0.0.0/8']],
    ['loopback, 192.168.1.10,fd00::/8', ['loopback', '192.168.1.10', 'fd00::/8']],
  ])('%s → %o', (text, expected) => {
    expect(configOf(text === undefined ? {} : { TRUST_PROXY: text }).trustProxy).toEqual(expected);
  });

  it.each(['yes', '-1', '1.5', '10.0.0.0/33', '300.1.1.1', '10.0.0.0/8/1', 'proxy.example', ','])(
    'refuses %j with a clear message',
    (text) => {
      expect(() => configOf({ TRUST_PROXY: text })).toThrow(/TRUST_PROXY/);
    },
  );
});

describe('the allowed Host values', () => {
  const hosts = allowedHostsOf(8080, 'https://drybench.example.com');
  it.each([
    ['drybench.example.com', true],
    ['DryBench.Example.com', true],
    ['drybench.example.com:443', true],
    ['127.0.0.1:8080', true],
    ['localhost:8080', true],
    ['[::1]:8080', true],
    ['drybench.example.com:8080', false],
    ['127.0.0.1:8081', false],
    ['127.0.0.1', false],
    ['evil.example', false],
    ['evil.example:8080', false],
    ['drybench.example.com.evil.example', false],
    ['', false],
    [undefined, false],
  ])('%s → %s', (host, expected) => {
    expect(isAllowedHost(host, hosts)).toBe(expected);
  });

  it('takes the port of an http PUBLIC_URL, and default ports either way', () => {
    expect(allowedHostsOf(8080, 'http://shop.lan:9000').hosts).toContain('shop.lan:9000');
    expect(allowedHostsOf(8080, 'http://shop.lan:9000').hosts).not.toContain('shop.lan');
    expect(allowedHostsOf(80, 'http://shop.lan').hosts).toEqual(
      new Set(
        ['shop.lan', 'shop.lan:80', '127.0.0.1', '127.0.0.1:80', 'localhost'].concat([
          'localhost:80',
          '[::1]',
          '[::1]:80',
        ]),
      ),
    );
  });

  it('accepts any loopback port only when a test asks for it', () => {
    const lenient = { ...allowedHostsOf(8080, TEST_PUBLIC_URL), anyLoopbackPort: true as const };
    expect(isAllowedHost('127.0.0.1:41234', lenient)).toBe(true);
    expect(isAllowedHost('127.0.0.1:41234', allowedHostsOf(8080, TEST_PUBLIC_URL))).toBe(false);
    expect(isAllowedHost('evil.example:41234', lenient)).toBe(false);
  });
});

describe('a server reached by a name it does not answer to', () => {
  let t: TestApp;
  let server: http.Server;
  let hub: ReturnType<typeof startLiveHub>;
  let port: number;
  let baseUrl: string;
  let webDir: string;

  beforeAll(async () => {
    webDir = fs.mkdtempSync(path.join(os.tmpdir(), 'drybench-web-'));
    fs.writeFileSync(path.join(webDir, 'index.html'), '<!doctype html><title>Drybench</title>');
    server = http.createServer();
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    port = (server.address() as AddressInfo).port;
    baseUrl = `http://127.0.0.1:${port}`;
    // What server/index.ts would compute for PORT=port and PUBLIC_URL=TEST_PUBLIC_URL.
    const config = configOf({
      PORT: String(port),
      PUBLIC_URL: TEST_PUBLIC_URL,
      DEV_OUTBOX: 'true',
    });
    t = makeTestApp({
      listen: true,
      webDir,
      devOutbox: config.devOutbox,
      allowedHosts: allowedHostsOf(config.port, config.publicUrl),
    });
    hub = startLiveHub({
      listener: t.listener!,
      db: t.db,
      sessions: t.sessions,
      allowedHosts: t.allowedHosts,
    });
    await t.listener!.ready;
    server.on('request', t.app);
    hub.attach(server);
  });
  afterAll(async () => {
    await hub.close();
    await t.listener!.close();
    server.closeAllConnections();
    await new Promise((resolve) => server.close(resolve));
    await t.pool.end();
    fs.rmSync(webDir, { recursive: true, force: true });
  });

  it.each(['/api/v1/health', '/dev/outbox', '/', '/shops/x', '/api/v1/me', '/nothing-here'])(
    'answers 421 unknown_host on %s for a forged Host, before any router',
    async (route) => {
      const res = await request(baseUrl).get(route).set('Host', 'evil.example');
      expect(res.status).toBe(421);
      expect(res.body).toEqual({
        error: { code: 'unknown_host', message: expect.any(String), details: [] },
      });
      // Not even the security headers of the routers behind the check.
      expect(res.headers['content-security-policy']).toBeUndefined();
    },
  );

  it.each(['/api/v1/health', '/dev/outbox', '/'])(
    'answers %s for the listen address, its loopback names and PUBLIC_URL',
    async (route) => {
      for (const host of [`127.0.0.1:${port}`, `localhost:${port}`, 'drybench.test']) {
        const res = await request(baseUrl).get(route).set('Host', host);
        expect(res.status, `${host}${route}`).toBe(200);
      }
    },
  );

  it('refuses another port of a loopback name (another server on this machine)', async () => {
    await request(baseUrl)
      .get('/api/v1/health')
      .set('Host', `127.0.0.1:${port + 1}`)
      .expect(421);
  });

  it('checks the sensor route by the same rule', async () => {
    const o = await ownerWithSensor({ app: baseUrl, outbox: t.outbox });
    const reading = { air: 14.2, rh: 71, surface: 11.9 };
    const forged = await postIngest(baseUrl, o.token, reading).set('Host', 'evil.example');
    expect(forged.status).toBe(421);
    expect(forged.body.error.code).toBe('unknown_host');
    await postIngest(baseUrl, o.token, reading).expect(202);
    await postIngest(baseUrl, o.token, { ...reading, at: new Date(Date.now() - 60_000) })
      .set('Host', 'drybench.test')
      .expect(202);
  });

  function upgrade(host: string, cookie: string) {
    return new Promise<{ status: number; body: string }>((resolve, reject) => {
      const ws = new WebSocket(`ws://127.0.0.1:${port}/api/v1/live`, {
        headers: { host, cookie },
      });
      ws.on('open', () => {
        ws.close();
        resolve({ status: 101, body: '' });
      });
      ws.on('unexpected-response', (_req, res) => {
        let body = '';
        res.on('data', (chunk: Buffer) => (body += String(chunk)));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body }));
      });
      ws.on('error', reject);
    });
  }

  it('refuses the WebSocket upgrade for a forged Host and opens it for ours', async () => {
    const o = await ownerWithSensor({ app: baseUrl, outbox: t.outbox });
    const cookie = await signInCookie(baseUrl, o);
    const forged = await upgrade('evil.example', cookie);
    expect(forged.status).toBe(421);
    expect(JSON.parse(forged.body).error.code).toBe('unknown_host');
    expect((await upgrade(`127.0.0.1:${port}`, cookie)).status).toBe(101);
  });
});

describe('the dev outbox off loopback or in production', () => {
  it.each([
    [{ HOST: '0.0.0.0' }, 404],
    [{ HOST: '192.168.1.20' }, 404],
    [{ HOST: '127.0.0.1', NODE_ENV: 'production' }, 404],
    [{ HOST: '127.0.0.1' }, 200],
  ])('with %o and DEV_OUTBOX=true answers %i', async (env, status) => {
    const config = configOf({ ...env, DEV_OUTBOX: 'true' });
    const t = makeTestApp({ devOutbox: config.devOutbox });
    try {
      const res = await request(t.app).get('/dev/outbox');
      expect(res.status).toBe(status);
    } finally {
      await t.pool.end();
    }
  });
});

describe('whose address the sign-in limit counts', () => {
  // The per-account back-off (failures for one e-mail from anywhere) has tests of its own in
  // accountLimits.test.ts; here it stays out of the way of the per-address count.
  const limits = { ...TEST_RATE_LIMITS, signInPerAccount: 3, signInFreeFailures: 1000 };
  const email = 'nobody-here@test.example';

  async function failedSignIns(app: TestApp['app'], count: number) {
    const statuses: number[] = [];
    for (let i = 0; i < count; i++) {
      const res = await request(app)
        .post('/api/v1/auth/sign-in')
        .set('X-Forwarded-For', `203.0.113.${i + 1}`)
        .send({ email, password: 'not the password' });
      statuses.push(res.status);
    }
    return statuses;
  }

  it('ignores X-Forwarded-For without TRUST_PROXY, so rotating it escapes nothing', async () => {
    const t = makeTestApp({ rateLimits: limits, trustProxy: configOf({}).trustProxy });
    try {
      expect(await failedSignIns(t.app, 5)).toEqual([401, 401, 401, 429, 429]);
    } finally {
      await t.pool.end();
    }
  });

  it('counts the forwarded client address with TRUST_PROXY=1', async () => {
    const t = makeTestApp({
      rateLimits: limits,
      trustProxy: configOf({ TRUST_PROXY: '1' }).trustProxy,
    });
    try {
      expect(await failedSignIns(t.app, 5)).toEqual([401, 401, 401, 401, 401]);
      // One client behind the proxy is still limited: 203.0.113.1 failed once above.
      const again: number[] = [];
      for (let i = 0; i < 3; i++) {
        const res = await request(t.app)
          .post('/api/v1/auth/sign-in')
          .set('X-Forwarded-For', '203.0.113.1')
          .send({ email, password: 'not the password' });
        again.push(res.status);
      }
      expect(again).toEqual([401, 401, 429]);
    } finally {
      await t.pool.end();
    }
  });
});
