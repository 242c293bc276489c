// A corpus of hostile and broken bodies for POST /api/v1/ingest. Every answer is a 4xx in the
// shared error shape (or a 202 whose bad readings are listed in `rejected`), never a 5xx, and
// afterwards the database holds exactly the valid readings — each once.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { gzipSync } from 'node:zlib';

import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { postIngest } from '../support/ingest';

let t: TestApp;
let server: http.Server;
let baseUrl: string;
let token: string;
let sensorId: string;
// Each valid reading gets its own instant, so the expected row count is exact.
let clockMs = Date.now() - 24 * 3_600_000;
const nextAt = () => new Date((clockMs += 1000)).toISOString();
const validAts = new Set<string>();

beforeAll(async () => {
  t = makeTestApp({ sensorRate: { ratePerS: 1e6, burst: 1e6 } });
  const o = await ownerWithSensor(t);
  token = o.token;
  sensorId = o.sensorId;
  // Raw bytes over a real socket: a client library would re-encode what we mean to send.
  server = http.createServer(t.app).listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(async () => {
  server.closeAllConnections();
  await new Promise((resolve) => server.close(resolve));
  await t.pool.end();
});

interface Case {
  name: string;
  body: string | Buffer;
  contentType?: string | null;
  headers?: Record<string, string>;
  /** 'envelope': a 4xx for the whole request; 'reading': 202 with this many rejected. */
  expect:
    | { status: number; code?: string; paths?: string[] }
    | { rejected: number; stored: number; rejectedCodes?: string[]; fields?: string[] };
}

const valid = () => ({ at: nextAt(), air: 12.5, rh: 70, surface: 10.2 });

function envelopeCases(): Case[] {
  const cases: Case[] = [];
  const bad = (name: string, body: string | Buffer, status = 400, extra: Partial<Case> = {}) =>
    cases.push({ name, body, expect: { status }, ...extra });

  // Every proper prefix of a valid body is truncated JSON (or, for the empty one, no body).
  const full = JSON.stringify({
    unit: 'C',
    readings: [{ at: '2026-01-01T00:00:00Z', air: 1, rh: 2 }],
  });
  for (let n = 1; n < full.length; n += 1) bad(`truncated at ${n}`, full.slice(0, n));

  for (const text of ['{', '[', '}', 'nul', 'tru', '{"air": 1,}', "{'air': 1}", '{"air": 01}']) {
    bad(`invalid JSON ${text}`, text);
  }
  for (const text of ['NaN', 'Infinity', '-Infinity', 'undefined', '0x10', '1_0', '+1', '.5']) {
    bad(`non-JSON number ${text}`, `{"air": ${text}, "rh": 50}`);
  }
  // JSON.parse turns 1e309 into Infinity; the schema must still refuse it.
  bad('air 1e309', '{"air": 1e309, "rh": 50}');
  bad('rh -1e309', '{"air": 10, "rh": -1e309}');
  for (const text of ['null', '123', '"text"', 'true', '[]', '[{"air":1,"rh":2}]', '{}']) {
    bad(`top-level ${text}`, text);
  }
  const wrongTypes: [string, unknown][] = [
    ['air as string', { air: '12.5', rh: 50 }],
    ['rh as string', { air: 12.5, rh: '50' }],
    ['air null', { air: null, rh: 50 }],
    ['air missing', { rh: 50 }],
    ['rh missing', { air: 12 }],
    ['air as object', { air: { value: 1 }, rh: 50 }],
    ['air as array', { air: [1], rh: 50 }],
    ['air boolean', { air: true, rh: 50 }],
    ['surface as string', { air: 1, rh: 50, surface: '3' }],
    ['battery as string', { air: 1, rh: 50, battery: 'full' }],
    ['at as object', { at: {}, air: 1, rh: 50 }],
    ['at without offset', { at: '2026-03-02T06:10:00', air: 1, rh: 50 }],
    ['at as date only', { at: '2026-03-02', air: 1, rh: 50 }],
    ['at as words', { at: 'yesterday', air: 1, rh: 50 }],
    ['at as boolean', { at: true, air: 1, rh: 50 }],
    ['at with a six-digit year', { at: '+275760-09-13T00:00:00Z', air: 1, rh: 50 }],
    ['unit lowercase', { unit: 'c', air: 1, rh: 50 }],
    ['unit kelvin', { unit: 'K', air: 1, rh: 50 }],
    ['unit number', { unit: 1, air: 1, rh: 50 }],
    ['readings empty', { readings: [] }],
    ['readings null', { readings: null }],
    ['readings object', { readings: { air: 1, rh: 2 } }],
    ['readings string', { readings: 'air=1' }],
    ['readings of numbers', { readings: [1, 2, 3] }],
    ['readings of nulls', { readings: [null] }],
    [
      'one bad among good',
      {
        readings: [
          { air: 1, rh: 50 },
          { air: 'x', rh: 50 },
        ],
      },
    ],
    ['nested arrays', { readings: [[{ air: 1, rh: 50 }]] }],
    ['deep nesting 200', JSON.parse('['.repeat(200) + ']'.repeat(200))],
    ['proto pollution in readings', JSON.parse('{"readings": {"__proto__": {"length": 1}}}')],
  ];
  for (const [name, body] of wrongTypes) bad(name, JSON.stringify(body));
  bad('deep nesting 100000', '['.repeat(100_000) + ']'.repeat(100_000));

  bad(
    '1,001 readings',
    JSON.stringify({ readings: Array.from({ length: 1001 }, () => ({ air: 1, rh: 2 })) }),
    413,
  );
  bad(
    '2 MiB body',
    JSON.stringify({ readings: [{ air: 1, rh: 2, pad: 'x'.repeat(2 * 1024 * 1024) }] }),
    413,
  );

  const body = JSON.stringify({ air: 10, rh: 50 });
  for (const type of [
    'text/plain',
    'application/x-www-form-urlencoded',
    'multipart/form-data; boundary=x',
    'application/xml',
    'application/octet-stream',
  ]) {
    bad(`content type ${type}`, body, 415, { contentType: type });
  }
  bad('no content type', body, 415, { contentType: null });
  bad('charset latin1', body, 415, { contentType: 'application/json; charset=latin1' });
  bad('content-encoding br, plain body', body, 400, { headers: { 'content-encoding': 'br' } });
  bad('content-encoding zstd', body, 415, { headers: { 'content-encoding': 'zstd' } });
  bad('gzip header, plain body', body, 400, { headers: { 'content-encoding': 'gzip' } });
  bad(
    'invalid UTF-8 in a key',
    Buffer.concat([Buffer.from('{"a'), Buffer.from([0xff, 0xfe]), Buffer.from('r": 1, "rh": 50}')]),
  );
  bad('UTF-16 bytes', Buffer.from(body, 'utf16le'));
  bad('BOM then garbage', Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from('{air:1}')]));
  return cases;
}

function readingCases(): Case[] {
  const cases: Case[] = [];
  const rejectedOne = (name: string, reading: Record<string, unknown>) =>
    cases.push({ name, body: JSON.stringify(reading), expect: { rejected: 1, stored: 0 } });
  rejectedOne('rh 100.0001', { at: nextAt(), air: 10, rh: 100.0001 });
  rejectedOne('rh -0.0001', { at: nextAt(), air: 10, rh: -0.0001 });
  rejectedOne('rh 0 (no dew point)', { at: nextAt(), air: 10, rh: 0 });
  rejectedOne('rh 1e308', { at: nextAt(), air: 10, rh: 1e308 });
  rejectedOne('air 85.01', { at: nextAt(), air: 85.01, rh: 50 });
  rejectedOne('air -60.01', { at: nextAt(), air: -60.01, rh: 50 });
  rejectedOne('air -1e308', { at: nextAt(), air: -1e308, rh: 50 });
  rejectedOne('surface 200', { at: nextAt(), air: 10, rh: 50, surface: 200 });
  rejectedOne('battery -1', { at: nextAt(), air: 10, rh: 50, battery: -1 });
  rejectedOne('185 °F air', { unit: 'F', at: nextAt(), air: 186, rh: 50 });
  rejectedOne('10 minutes ahead', {
    at: new Date(Date.now() + 600_000).toISOString(),
    air: 10,
    rh: 50,
  });
  rejectedOne('epoch 1e20 seconds', { at: 1e20, air: 10, rh: 50 });
  // Before 2000-01-01 (the contract's lower bound); PostgreSQL cannot even store some of these,
  // and once one failed a whole group statement shared with other sensors.
  rejectedOne('year 1 as ISO', { at: '0001-01-01T00:00:00Z', air: 10, rh: 50 });
  rejectedOne('year 1 in epoch seconds', { at: -62167219200, air: 10, rh: 50 });
  rejectedOne('epoch -1e20 seconds', { at: -1e20, air: 10, rh: 50 });
  rejectedOne('one second before 2000', { at: 946684799, air: 10, rh: 50 });
  rejectedOne('1999-12-31T23:59:59Z', { at: '1999-12-31T23:59:59Z', air: 10, rh: 50 });
  rejectedOne('impossible date', { at: '2026-02-30T25:61:00Z', air: 10, rh: 50 });
  return cases;
}

/**
 * Fields the contract does not name (shared/API.md: `unknown_field`). A misspelt `surface` once
 * passed as a reading without a probe: the surface was estimated and the card showed dry over a
 * wet plate. A single reading is its own envelope and is refused whole (400); in a batch only
 * the reading at fault is refused and listed, the others stored; an unknown key beside
 * `readings` (a misspelt `unit` would change every value) refuses the request.
 */
function unknownFieldCases(): Case[] {
  const cases: Case[] = [];
  const single = (name: string, body: unknown, paths: string[]) =>
    cases.push({
      name: `single reading: ${name}`,
      body: typeof body === 'string' ? body : JSON.stringify(body),
      expect: { status: 400, code: 'unknown_field', paths },
    });
  single('misspelt "surfce"', { at: nextAt(), air: 12, rh: 80, surfce: 5 }, ['surfce']);
  single('"temp" for air', { at: nextAt(), temp: 12, air: 12, rh: 80 }, ['temp']);
  single('"Surface" capitalised', { at: nextAt(), air: 12, rh: 80, Surface: 5 }, ['Surface']);
  single('"humidity" beside rh', { at: nextAt(), air: 12, rh: 80, humidity: 80 }, ['humidity']);
  single('an extra nested key', { ...valid(), extra: { a: 1 } }, ['extra']);
  single('firmware version', { ...valid(), firmware: '1.4.2' }, ['firmware']);
  single('two unknown keys', { ...valid(), surfce: 5, batery: 3 }, ['surfce', 'batery']);
  single('"readings " with a space', { air: 1, rh: 50, 'readings ': [] }, ['readings ']);
  single('__proto__ key', JSON.stringify(valid()).replace('{', '{"__proto__": {"admin": true},'), [
    '__proto__',
  ]);
  single('constructor key', { ...valid(), constructor: { prototype: { x: 1 } } }, ['constructor']);
  // Hostile: the answer names the first 20 keys, each cut at 64 characters.
  const many = Object.fromEntries(Array.from({ length: 5000 }, (_, i) => [`k${i}`, i]));
  single(
    '5,000 unknown keys',
    { ...valid(), ...many },
    Array.from({ length: 20 }, (_, i) => `k${i}`),
  );
  single('a 100 KB key', { ...valid(), ['x'.repeat(100_000)]: 1 }, [`${'x'.repeat(64)}…`]);

  const envelope = (name: string, body: unknown, paths: string[]) =>
    cases.push({
      name: `batch envelope: ${name}`,
      body: JSON.stringify(body),
      expect: { status: 400, code: 'unknown_field', paths },
    });
  envelope('misspelt "unti"', { unti: 'F', readings: [valid()] }, ['unti']);
  envelope('"sensor" beside readings', { sensor: 'saw', readings: [valid()] }, ['sensor']);

  const batch = (name: string, readings: Record<string, unknown>[], fields: string[]) => {
    const good = readings.filter((r) => !('bad' in r)).map((r) => r as { at: string });
    for (const r of good) validAts.add(r.at);
    cases.push({
      name: `batch: ${name}`,
      body: JSON.stringify({
        readings: readings.map((r) => {
          const { bad, ...rest } = r;
          return bad ? { ...rest, ...(bad as object) } : rest;
        }),
      }),
      expect: {
        rejected: fields.length,
        stored: good.length,
        rejectedCodes: fields.map(() => 'unknown_field'),
        fields,
      },
    });
  };
  batch(
    'one "surfce" among two good',
    [valid(), { ...valid(), bad: { surfce: 5 } }, valid()],
    ['surfce'],
  );
  batch('"rh" spelt "RH"', [{ at: nextAt(), air: 12, bad: { RH: 80, rh: 80 } }], ['RH']);
  batch(
    'every reading misspelt',
    [
      { ...valid(), bad: { temp: 1 } },
      { ...valid(), bad: { nested: { surface: 1 } } },
    ],
    ['temp', 'nested'],
  );
  return cases;
}

function validCases(): Case[] {
  const ok = (name: string, body: unknown, stored = 1, extra: Partial<Case> = {}) =>
    ({ name, body: JSON.stringify(body), expect: { rejected: 0, stored }, ...extra }) as Case;
  const remember = <T extends { at: string }>(r: T) => (validAts.add(r.at), r);
  return [
    ok('a plain reading', remember(valid())),
    ok('minus zero', remember({ at: nextAt(), air: -0, rh: 50, surface: -0 })),
    ok('rh exactly 100', remember({ at: nextAt(), air: 5, rh: 100 })),
    ok('air exactly -60', remember({ at: nextAt(), air: -60, rh: 50 })),
    ok(
      'batch of three',
      { readings: [remember(valid()), remember(valid()), remember(valid())] },
      3,
    ),
    ok('°F batch', {
      unit: 'F',
      readings: [remember({ at: nextAt(), air: 50, rh: 60, surface: 45 })],
    }),
    ok('charset utf-8 spelled out', remember(valid()), 1, {
      contentType: 'application/json; charset=utf-8',
    }),
    ok('gzip body', remember(valid()), 1, { headers: { 'content-encoding': 'gzip' } }),
  ];
}

describe('the ingest bad-input corpus', () => {
  const cases = [...envelopeCases(), ...readingCases(), ...unknownFieldCases(), ...validCases()];

  it('has at least 150 cases', () => {
    expect(cases.length).toBeGreaterThanOrEqual(150);
  });

  it.each(cases)('$name', async (c) => {
    let body = typeof c.body === 'string' ? Buffer.from(c.body) : c.body;
    if (c.headers?.['content-encoding'] === 'gzip' && 'stored' in c.expect) body = gzipSync(body);
    const headers: Record<string, string> = { authorization: `Bearer ${token}`, ...c.headers };
    if (c.contentType !== null) headers['content-type'] = c.contentType ?? 'application/json';
    const response = await fetch(`${baseUrl}/api/v1/ingest`, {
      method: 'POST',
      headers,
      body: new Uint8Array(body),
    });
    const text = await response.text();
    const res = { status: response.status, text, body: JSON.parse(text) };

    expect(res.status).toBeLessThan(500);
    expect(res.text).not.toMatch(/at .*\.ts:\d+|node_modules|select |insert into/i);
    if ('status' in c.expect) {
      expect(res.status).toBe(c.expect.status);
      expect(res.body).toMatchObject({
        error: { code: expect.stringMatching(/^[a-z_]+$/), message: expect.any(String) },
      });
      if (c.expect.code) expect(res.body.error.code).toBe(c.expect.code);
      if (c.expect.paths) {
        const details = res.body.error.details as { path: string; message: string }[];
        expect(details.map((d) => d.path)).toEqual(c.expect.paths);
        // Each field is named where a person reads it: the message and its detail.
        for (const path of c.expect.paths) {
          expect(res.body.error.message).toContain(`"${path}"`);
          expect(details.find((d) => d.path === path)?.message).toContain(`"${path}"`);
        }
      }
    } else {
      expect(res.status).toBe(202);
      expect(res.body.rejected).toHaveLength(c.expect.rejected);
      expect(res.body.stored).toBe(c.expect.stored);
      const rejected = res.body.rejected as { code: string; field?: string; message: string }[];
      if (c.expect.rejectedCodes)
        expect(rejected.map((r) => r.code)).toEqual(c.expect.rejectedCodes);
      const fields = c.expect.fields;
      if (fields) {
        expect(rejected.map((r) => r.field)).toEqual(fields);
        rejected.forEach((r, i) => expect(r.message).toContain(`"${fields[i]}"`));
      }
    }
  });

  it('leaves exactly the valid readings in the database, once each', async () => {
    const rows = await t.pool.query<{ at: Date }>('select at from readings where sensor_id = $1', [
      sensorId,
    ]);
    expect(rows.rows.map((r) => r.at.toISOString()).sort()).toEqual([...validAts].sort());
  });

  it('stores nothing twice when the same batch is retried', async () => {
    const batch = { readings: [valid(), valid(), valid()] };
    const post = () => postIngest(t.app, token, batch);
    const first = await post().expect(202);
    const results = await Promise.all([post(), post(), post()]);
    expect(first.body).toMatchObject({ stored: 3, duplicates: 0 });
    for (const r of results) expect(r.body).toMatchObject({ stored: 0, duplicates: 3 });
    const n = await t.pool.query(
      'select count(*)::int as n from readings where sensor_id = $1 and at = any($2::timestamptz[])',
      [sensorId, batch.readings.map((r) => r.at)],
    );
    expect(n.rows[0].n).toBe(3);
  });
});

describe('header abuse', () => {
  it.each([
    ['an 8 KiB token', `Bearer ${'a'.repeat(8192)}`, 401],
    ['two tokens', `Bearer a b`, 401],
    ['an empty bearer', 'Bearer ', 401],
    ['lower-case scheme with a real token', 'bearer REAL', 202],
  ])('answers %s with %i', async (_name, header, status) => {
    const res = await request(t.app)
      .post('/api/v1/ingest')
      .set('authorization', header.replace('REAL', token))
      .send(valid());
    expect(res.status).toBe(status);
  });
});
