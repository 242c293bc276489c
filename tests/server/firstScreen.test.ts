// The overview's first screen rendered by the server into the page (server/firstScreen.ts): a
// signed-in member's GET /shops/:shopId carries the shop's zone cards, rendered by the app's own
// components from the renderer build-web.sh makes (built here into a scratch export), in the
// person's unit; never another shop's; never cached for someone else; and every other case
// (signed out, not a member, no zones, a renderer that fails) gets the plain page, never a 500.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import {
  FIRST_SCREEN_ANSWERS_ID,
  FIRST_SCREEN_ID,
  firstScreenAnswerPaths,
} from '@/ingest/wire/firstScreen';
import { buildFirstScreenRenderer, RENDERER_PATH } from '@/scripts/webpage/firstScreenBuild';
import { FIRST_SCREEN_RENDERER } from '@/server/firstScreen';

import { makeTestApp, ownerWithSensor, verifiedPerson, type TestApp } from '../support/app';
import { errorShape } from '../support/errorShape';
import { postIngest } from '../support/ingest';
import { captureLogs } from '../support/logs';
import { ACTORS, makeWorld, secretsOf, type Actor, type World } from '../support/tenants';

// The export's page as finishExport leaves it, shortened: an inline boot script, the root.
const BOOT = 'window.booted = true;';
const PAGE =
  `<!doctype html><html><head><title>Drybench</title><script>${BOOT}</script></head>` +
  '<body><div id="root"></div><script src="/_expo/entry.js" defer></script></body></html>';

let t: TestApp;
let webDir: string;

function scratchExport(): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'drybench-first-screen-'));
  fs.writeFileSync(path.join(dir, 'index.html'), PAGE);
  return dir;
}

/** The first screen's markup in a page, or null for the plain page. */
function firstScreenOf(html: string): string | null {
  const start = html.indexOf(`<div id="${FIRST_SCREEN_ID}"`);
  if (start < 0) return null;
  return html.slice(start, html.indexOf('<div id="root">'));
}

/** The page's embedded API answers by path; none in a plain page. */
function answersOf(html: string): Record<string, unknown> {
  const found = new RegExp(
    `<script type="application/json" id="${FIRST_SCREEN_ANSWERS_ID}">([\\s\\S]*?)</script>`,
  ).exec(html);
  return found ? (JSON.parse(found[1]!) as Record<string, unknown>) : {};
}

type Owner = Awaited<ReturnType<typeof ownerWithSensor>>;

/** An owner whose one zone has a reading: air 20 °C, RH 50 %, surface 14 °C. */
async function shopWithReading(name: string): Promise<Owner> {
  const owner = await ownerWithSensor(t);
  await owner.agent
    .patch(`/api/v1/shops/${owner.shopId}/zones/${owner.zoneId}`)
    .send({ name })
    .expect(200);
  await postIngest(t.app, owner.token, { air: 20, rh: 50, surface: 14 }).expect(202);
  return owner;
}

beforeAll(() => {
  webDir = scratchExport();
  buildFirstScreenRenderer(webDir);
  t = makeTestApp({ webDir });
}, 180_000);

afterAll(async () => {
  await t.pool.end();
  fs.rmSync(webDir, { recursive: true, force: true });
});

describe("the overview's first screen", () => {
  it('is where the server looks for the renderer the build makes', () => {
    expect(FIRST_SCREEN_RENDERER).toBe(RENDERER_PATH);
  });

  it("carries the member's zone card in their unit, and no other shop's", async () => {
    const mine = await shopWithReading('Jointer corner');
    const theirs = await shopWithReading('Planer alcove');
    await mine.agent.patch('/api/v1/me').send({ unitPref: 'F' }).expect(200);

    const res = await mine.agent.get(`/shops/${mine.shopId}`).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/html/);
    const screen = firstScreenOf(res.text);
    expect(screen).not.toBeNull();
    expect(screen).toContain('data-testid="zone-card"');
    expect(screen).toContain('Jointer corner');
    // Dew point of air at 20 °C and 50 % RH: 9.3 °C (psychrometric tables, e.g. ASHRAE Handbook
    // — Fundamentals ch. 1; Magnus with Alduchov & Eskridge gives 9.26). Margin 14 − 9.26 =
    // 4.74 K, dry (≥ 3 K, ISO 8502-4); as a Fahrenheit difference 4.74 × 1.8 = 8.5 °F.
    expect(screen).toMatch(/data-testid="zone-margin"[^>]*>\+8\.5 °F</);
    expect(screen).not.toContain('°C<');
    expect(screen).toMatch(/data-testid="zone-level"/);
    expect(screen).toContain('Dry');
    expect(screen).toContain('Test shop');
    // The app's own card links to the zone.
    expect(screen).toContain(`href="/shops/${mine.shopId}/zones/${mine.zoneId}"`);
    // Not the other shop's zone, anywhere in the page.
    expect(res.text).not.toContain('Planer alcove');
    expect(res.text).not.toContain(theirs.zoneId);

    // Per person: never stored by a cache, and a shared cache keeps cookies apart (RFC 9111
    // §5.2.2.5 no-store, §5.2.2.7 private; RFC 9110 §12.5.5 Vary).
    expect(res.headers['cache-control']).toBe('private, no-store');
    expect(res.headers['vary']).toMatch(/Cookie/i);
    // react-native-web's style element for the card's classes, in the head.
    expect(res.text).toMatch(/<style id="react-native-stylesheet">[\s\S]*<\/head>/);
  });

  it("keeps the page's inline scripts, so the CSP hashes still allow exactly them", async () => {
    const mine = await shopWithReading('Band saw table');
    const plain = await request(t.app).get('/').expect(200);
    const res = await mine.agent.get(`/shops/${mine.shopId}`).expect(200);
    expect(firstScreenOf(res.text)).not.toBeNull();
    const scripts = (html: string) => [...html.matchAll(/<script[^>]*>[\s\S]*?<\/script>/g)];
    // Every script the plain page has, and one more that is data, never run (HTML § 4.12.1:
    // a type that is not a JavaScript MIME type makes a data block).
    const [data, ...run] = scripts(res.text).map((m) => m[0]);
    expect(data).toMatch(
      new RegExp(`^<script type="application/json" id="${FIRST_SCREEN_ANSWERS_ID}">`),
    );
    expect(run).toEqual(scripts(plain.text).map((m) => m[0]));
    expect(res.headers['content-security-policy']).toBe(plain.headers['content-security-policy']);
  });

  it('shows the Celsius margin to a person who keeps °C', async () => {
    const mine = await shopWithReading('Drill press');
    const res = await mine.agent.get(`/shops/${mine.shopId}/`).expect(200);
    // The same reading as above: margin 4.74 K, shown as 4.7 °C.
    expect(firstScreenOf(res.text)).toMatch(/data-testid="zone-margin"[^>]*>\+4\.7 °C</);
  });

  it('gives the plain page to someone signed out, and to a person of another shop', async () => {
    const mine = await shopWithReading('Lathe bench');
    const stranger = await verifiedPerson(t, 'Stranger');
    for (const res of [
      await request(t.app).get(`/shops/${mine.shopId}`).expect(200),
      await stranger.agent.get(`/shops/${mine.shopId}`).expect(200),
    ]) {
      expect(res.text).toBe(PAGE);
      expect(res.text).not.toContain('Lathe bench');
      expect(res.headers['cache-control']).toBe('no-cache');
      expect(res.headers['vary']).toMatch(/Cookie/i);
    }
  });

  it("gives the plain page to a shop's other addresses and to a shop without zones", async () => {
    const mine = await shopWithReading('Router table');
    for (const url of [
      `/shops/${mine.shopId}/alarms`,
      `/shops/${mine.shopId}/zones/${mine.zoneId}`,
    ])
      expect((await mine.agent.get(url).expect(200)).text).toBe(PAGE);
    const empty = await verifiedPerson(t, 'New owner');
    const shop = await empty.agent
      .post('/api/v1/shops')
      .send({ name: 'Empty shop', timeZone: 'UTC' })
      .expect(201);
    expect((await empty.agent.get(`/shops/${shop.body.id}`).expect(200)).text).toBe(PAGE);
  });

  // Bad addresses: not a shop id, a malformed %-escape, an id of no shop. Each gets the plain
  // page (the app says what is wrong), never an error page.
  it.each([
    '/shops/not-a-uuid',
    '/shops/%E0%A4%A',
    '/shops/00000000-0000-4000-8000-000000000000',
    "/shops/'%20or%201=1--",
  ])('answers %s with the plain page', async (url) => {
    const mine = await shopWithReading('Spindle sander');
    const res = await mine.agent.get(url).expect(200);
    expect(res.text).toBe(PAGE);
  });

  it('holds the API answers it was rendered from, equal to what the routes answer', async () => {
    const mine = await ownerWithSensor(t);
    // Surface 2 K under the dew point of 20 °C / 50 % RH (9.3 °C, as above): wet for five
    // minutes, which opens a wet-surface alarm (tests/server/ingestState.test.ts).
    const start = Date.now() - 5 * 60_000;
    const readings = [0, 1, 2, 3, 4].map((m) => ({
      at: new Date(start + m * 60_000).toISOString(),
      air: 20,
      rh: 50,
      surface: 7.3,
    }));
    await postIngest(t.app, mine.token, { readings }).expect(202);
    const paths = firstScreenAnswerPaths(mine.shopId);
    let alarms: { alarms: unknown[] } = { alarms: [] };
    for (let i = 0; i < 100 && alarms.alarms.length === 0; i++) {
      alarms = (await mine.agent.get(paths.alarms).expect(200)).body;
      if (alarms.alarms.length === 0) await new Promise((r) => setTimeout(r, 50));
    }
    expect(alarms.alarms.length).toBeGreaterThan(0);

    const res = await mine.agent.get(`/shops/${mine.shopId}`).expect(200);
    const answers = answersOf(res.text);
    const all = [paths.me, paths.zones, paths.alarms, paths.sensors];
    expect(Object.keys(answers).sort()).toEqual([...all].sort());
    for (const path of all) {
      const api = await mine.agent.get(path).expect(200);
      expect(answers[path], path).toEqual(api.body);
    }
    // The frame the app shows around the cards: the open alarm's banner, above them.
    const screen = firstScreenOf(res.text)!;
    expect(screen).toContain('data-testid="alarm-banner"');
    expect(screen.indexOf('data-testid="alarm-banner"')).toBeLessThan(
      screen.indexOf('data-testid="zone-card"'),
    );
  });

  it("escapes a zone's name so it cannot end the answers' element", async () => {
    const name = '</script><script>alert(1)</script><!--';
    const mine = await shopWithReading(name);
    const plain = await request(t.app).get('/').expect(200);
    const res = await mine.agent.get(`/shops/${mine.shopId}`).expect(200);
    // The name reads back whole from the JSON, and no script element is added but the data.
    const answers = answersOf(res.text);
    const zones = answers[firstScreenAnswerPaths(mine.shopId).zones] as {
      zones: { name: string }[];
    };
    expect(zones.zones.map((z) => z.name)).toEqual([name]);
    expect(res.text).not.toContain('<script>alert(1)');
    const count = (html: string) => html.match(/<script/g)?.length ?? 0;
    expect(count(res.text)).toBe(count(plain.text) + 1);
    // In the markup React escapes it as text (&lt;/script&gt;…).
    expect(firstScreenOf(res.text)).toContain('&lt;/script&gt;&lt;script&gt;alert(1)');
  });

  it("renders the app's three layouts, one shown per width from the app's breakpoints", async () => {
    const mine = await shopWithReading('Bandsaw nook');
    const res = await mine.agent.get(`/shops/${mine.shopId}`).expect(200);
    const screen = firstScreenOf(res.text)!;
    const layouts = screen.split(/<div class="first-screen-layout-\d">/).slice(1);
    expect(layouts).toHaveLength(3);
    // components/layout/breakpoints.ts: medium from 640 px, wide from 1024 px.
    expect(res.text).toContain('@media (min-width:640px)');
    expect(res.text).toContain('@media (min-width:1024px)');
    // Phone and medium: the bottom bar and the list; wide: the rail and the list beside the zone.
    for (const phone of layouts.slice(0, 2)) {
      expect(phone).toContain('data-testid="shop-nav-bar"');
      expect(phone).not.toContain('data-testid="zone-list-scroll"');
    }
    expect(layouts[2]).toContain('data-testid="shop-nav-rail"');
    expect(layouts[2]).toContain('data-testid="zone-list-scroll"');
    expect(layouts[2]).toContain('data-testid="zone-detail"');
    // React's hoisted styles (the focus ring) go to the head, once, so they stay after the
    // handover: the app's React keeps the one it finds instead of adding its own.
    expect(screen).not.toContain('<style');
    const head = res.text.slice(0, res.text.indexOf('</head>'));
    expect(head.match(/<style [^>]*data-href="drybench-focus-ring"/g)).toHaveLength(1);
    for (const layout of layouts) {
      expect(layout.match(/data-testid="zone-card"/g)).toHaveLength(1);
      expect(layout.match(/aria-level="1"/g)).toHaveLength(1);
    }
  });

  it('sends the rendered page compressed to a browser that takes it, brotli first', async () => {
    const mine = await shopWithReading('Mortiser stand');
    // supertest decodes what it gets; Content-Length is what was sent.
    const get = (encoding: string) =>
      mine.agent.get(`/shops/${mine.shopId}`).set('Accept-Encoding', encoding).expect(200);
    const plain = await get('identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(firstScreenOf(plain.text)).toContain('Mortiser stand');
    const sent = Number(plain.headers['content-length']);
    expect(sent).toBe(Buffer.byteLength(plain.text));
    // RFC 9110 §12.5.3: the browser's list ("gzip, deflate, br"); we prefer brotli (RFC 7932).
    for (const [accept, coding] of [
      ['gzip, deflate, br', 'br'],
      ['gzip', 'gzip'],
    ] as const) {
      const res = await get(accept);
      expect(res.headers['content-encoding']).toBe(coding);
      expect(res.headers['vary']).toMatch(/Accept-Encoding/i);
      expect(res.headers['vary']).toMatch(/Cookie/i);
      expect(firstScreenOf(res.text)).toContain('Mortiser stand');
      // Markup repeats itself (three layouts of the same cards): a quarter is a loose bound.
      expect(Number(res.headers['content-length'])).toBeLessThan(sent / 4);
    }
  });

  it('keeps the renderer to itself', async () => {
    const res = await request(t.app).get(`/${RENDERER_PATH}`).expect(404);
    expect(res.body).toEqual(errorShape);
  });
});

// The tenant matrix's actors (tests/support/tenants.ts) at shop A's overview: its three roles get
// its cards, a member of another shop and someone signed out the plain page; no page carries the
// other shop's ids, names or people.
describe("the first screen across the tenant matrix's actors", () => {
  let world: World;
  beforeAll(async () => {
    world = await makeWorld(t);
  });

  const cookieOf = (actor: Actor) => (actor === 'anonymous' ? undefined : world[actor].cookie);

  it.each(ACTORS)('%s at shop A', async (actor) => {
    const req = request(t.app).get(`/shops/${world.a.id}`);
    const cookie = cookieOf(actor);
    const res = await (cookie ? req.set('cookie', cookie) : req).expect(200);
    const { a, b } = secretsOf(world);
    const member = actor === 'owner' || actor === 'member' || actor === 'viewer';
    if (member) {
      expect(firstScreenOf(res.text)).toContain(world.a.zone.name);
      expect(res.headers['cache-control']).toBe('private, no-store');
    } else {
      expect(res.text).toBe(PAGE);
      for (const secret of a) expect(res.text).not.toContain(secret);
    }
    for (const secret of b) expect(res.text).not.toContain(secret);
  });
});

describe('a first screen that cannot be rendered', () => {
  it('sends the plain page and logs why', async () => {
    const dir = scratchExport();
    fs.mkdirSync(path.join(dir, path.dirname(RENDERER_PATH)));
    fs.writeFileSync(
      path.join(dir, RENDERER_PATH),
      "exports.renderFirstScreen = () => { throw new Error('renderer broke'); };",
    );
    const logs = captureLogs();
    const broken = makeTestApp({ webDir: dir, logger: logs.logger });
    try {
      const owner = await ownerWithSensor(broken);
      await postIngest(broken.app, owner.token, { air: 20, rh: 50, surface: 14 }).expect(202);
      const res = await owner.agent.get(`/shops/${owner.shopId}`).expect(200);
      expect(res.text).toBe(PAGE);
      expect(logs.text()).toContain('renderer broke');
      expect(logs.text()).toContain('first screen failed');
    } finally {
      await broken.pool.end();
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
