// How the server hands out the exported web app now that it is split into chunks: a chunk is
// a script with a hashed name, kept by browsers for good; a chunk that is not there (an old
// page asking after a deploy) is a 404 in the shared error shape, never the page's HTML; the
// page itself is revalidated on every visit so it always names the current chunks. What the
// export's finishing step compressed goes out as it is to a browser that takes it, and the
// page's inline boot script is allowed by its hash and nothing else inline is.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';

import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { errorShape } from '../support/errorShape';
import { makeTestApp, type TestApp } from '../support/app';

const CHUNK = '_expo/static/js/web/charts-0123456789abcdef.js';
const CHUNK_BODY = '__d(function(g,r,i,a,m,e,d){},42,[]);';
// The example of CSP Level 3 §2.3.1 ("hash-source"): this script and its SHA-256, base64.
const INLINE_SCRIPT = "alert('Hello, world.');";
const INLINE_SCRIPT_SOURCE = "'sha256-qznLcsROx4GACP2dm0UCKCzCG+HiZ1guq6ZZDob/Tng='";
const PAGE = `<!doctype html><title>Drybench</title><script>${INLINE_SCRIPT}</script><script src="/x.js"></script>`;

let t: TestApp;
let webDir: string;

beforeAll(() => {
  // A dot folder on purpose: a build kept aside (.tmp/…) must be servable too.
  webDir = fs.mkdtempSync(path.join(os.tmpdir(), '.drybench-web-'));
  fs.mkdirSync(path.join(webDir, path.dirname(CHUNK)), { recursive: true });
  fs.writeFileSync(path.join(webDir, 'index.html'), PAGE);
  fs.writeFileSync(path.join(webDir, 'index.html.br'), zlib.brotliCompressSync(PAGE));
  fs.writeFileSync(path.join(webDir, CHUNK), CHUNK_BODY);
  fs.writeFileSync(path.join(webDir, `${CHUNK}.br`), zlib.brotliCompressSync(CHUNK_BODY));
  fs.writeFileSync(path.join(webDir, `${CHUNK}.gz`), zlib.gzipSync(CHUNK_BODY));
  t = makeTestApp({ webDir });
});

afterAll(async () => {
  await t.pool.end();
  fs.rmSync(webDir, { recursive: true, force: true });
});

describe('the exported web app', () => {
  it('sends a chunk as JavaScript, cacheable for a year and immutable', async () => {
    const res = await request(t.app).get(`/${CHUNK}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/javascript|^text\/javascript/);
    expect(res.text).toBe(CHUNK_BODY);
    // RFC 8246: `immutable` spares the revalidation on reload; 365 d = 31,536,000 s.
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
  });

  // RFC 9110 §12.5.3: the first acceptable coding the server prefers; "identity" (none) when
  // the request names no coding the server stored.
  it.each([
    ['br, gzip', 'br'],
    ['gzip, deflate, br, zstd', 'br'],
    ['gzip', 'gzip'],
    ['deflate', undefined],
    ['br;q=0, gzip', 'gzip'],
    [undefined, undefined],
  ])('sends a chunk to Accept-Encoding %s coded %s', async (accept, coding) => {
    // supertest asks for gzip and deflate unless told otherwise, and decodes what it gets.
    const res = await request(t.app)
      .get(`/${CHUNK}`)
      .set('accept-encoding', accept ?? 'identity');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe(coding);
    expect(res.headers['content-type']).toMatch(/^application\/javascript|^text\/javascript/);
    expect(res.headers['vary']).toMatch(/Accept-Encoding/i);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.text).toBe(CHUNK_BODY);
  });

  it('sends the page compressed too, still revalidated on every visit', async () => {
    const res = await request(t.app).get('/shops/some-shop').set('accept-encoding', 'br');
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['content-type']).toMatch(/^text\/html/);
    expect(res.headers['cache-control']).toBe('no-cache');
    expect(res.text).toBe(PAGE);
  });

  it("allows the page's inline script by its hash, and no other inline script", async () => {
    const res = await request(t.app).get('/');
    const scriptSrc = /(?:^|;)\s*script-src ([^;]*)/.exec(
      res.headers['content-security-policy'] ?? '',
    )?.[1];
    expect(scriptSrc?.split(' ').sort()).toEqual(["'self'", INLINE_SCRIPT_SOURCE].sort());
  });

  it.each([
    '/_expo/static/js/web/charts-ffffffffffffffff.js',
    '/_expo/static/js/web/',
    '/assets/missing-font.ttf',
  ])('answers a missing %s with a 404 in the error shape, not the page', async (url) => {
    const res = await request(t.app).get(url);
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(res.body).toEqual(errorShape);
    expect(res.text).not.toContain('<!doctype html>');
  });

  it.each(['/', '/shops/some-shop', '/shops/some-shop/report?week=2026-11-23'])(
    'answers the app route %s with the page, revalidated on every visit',
    async (url) => {
      const res = await request(t.app).get(url);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toMatch(/^text\/html/);
      expect(res.text).toContain('<title>Drybench</title>');
      // RFC 9111 §5.2.2.4: no-cache lets a browser keep it but not reuse it unchecked.
      expect(res.headers['cache-control']).toBe('no-cache');
    },
  );
});
