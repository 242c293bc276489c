// The overview's first screen as the server renders it (server/firstScreen.ts), in Debian's
// Chromium against the real server and the demo shop: without JavaScript the page alone shows
// the shop's zone cards; with it, the app takes over without a moment when no card is in the
// document, the server's screen goes only once the app's root has its own cards, and the app's
// cards say what the server's said. The references: the DOM as Chromium builds it from the
// page's bytes, watched by a MutationObserver and on every animation frame from before any of
// the page's scripts.
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_PEOPLE } from '@/db/seed';
import { FIRST_SCREEN_ID } from '@/ingest/wire/firstScreen';

import {
  openInApp,
  SHOTS,
  signInAs,
  startBrowserSuite,
  watchPage,
  type BrowserSuite,
} from '../support/browser';

let suite: BrowserSuite;
let cookies: Awaited<ReturnType<BrowserContext['cookies']>>;
beforeAll(async () => {
  suite = await startBrowserSuite();
  const signIn = await suite.browser.newPage();
  await signInAs(signIn, suite.server.baseUrl, DEMO_PEOPLE[0].email);
  cookies = await signIn.context().cookies();
  await signIn.close();
});
afterAll(() => suite?.close());

const overviewUrl = () => `${suite.server.baseUrl}/shops/${suite.server.demo.shopId}`;

/**
 * Each shown card's zone name and lead figure, in the order shown. The server's screen holds one
 * layout per breakpoint, all but one hidden by its CSS: only the one shown counts.
 */
function cardWords(page: Page, within: string) {
  return page.evaluate(
    (sel) =>
      Array.from(document.querySelectorAll(`${sel} [data-testid="zone-card"]`))
        .filter((card) => card.checkVisibility())
        .map((card) => ({
          name: card.querySelector('[data-testid="zone-name"]')?.textContent,
          level: card.querySelector('[data-testid="zone-level"]')?.textContent,
          margin: card.querySelector('[data-testid="zone-margin"]')?.textContent ?? null,
        })),
    within,
  );
}

interface CardBox {
  name: string;
  x: number;
  y: number;
  width: number;
  height: number;
  text: string;
}

/** Where each shown card stands (by its zone's name) and what it says, once the fonts are in. */
async function cardBoxes(page: Page, within: string): Promise<CardBox[]> {
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
  return page.evaluate(
    (sel) =>
      Array.from(document.querySelectorAll(`${sel} [data-testid="zone-card"]`))
        .filter((card) => card.checkVisibility())
        .map((card) => {
          const box = card.getBoundingClientRect();
          return {
            name: card.querySelector('[data-testid="zone-name"]')?.textContent ?? '',
            x: box.x,
            y: box.y,
            width: box.width,
            height: box.height,
            text: (card as HTMLElement).innerText,
          };
        }),
    within,
  );
}

describe.each([
  { name: 'phone', viewport: { width: 390, height: 844 } },
  { name: 'wide', viewport: { width: 1440, height: 900 } },
])('the server-rendered overview without JavaScript, $name', ({ name, viewport }) => {
  let context: BrowserContext;
  let page: Page;

  beforeAll(async () => {
    context = await suite.browser.newContext({ viewport, javaScriptEnabled: false });
    await context.addCookies(cookies);
    page = await context.newPage();
    watchPage(page);
    await page.goto(overviewUrl());
  });
  afterAll(() => context?.close());

  it("shows every zone of the shop as the app's card, with its heading", async () => {
    const screen = page.locator(`#${FIRST_SCREEN_ID}`);
    await expect
      .poll(() => screen.locator('[data-testid="zone-card"]:visible').first().isVisible())
      .toBe(true);
    // The shop's zones as the API answers them to the same person.
    const api = await context.request.get(
      `${suite.server.baseUrl}/api/v1/shops/${suite.server.demo.shopId}/zones`,
    );
    const zones = ((await api.json()) as { zones: { name: string }[] }).zones;
    const cards = await cardWords(page, `#${FIRST_SCREEN_ID}`);
    expect(cards.map((c) => c.name).sort()).toEqual(zones.map((z) => z.name).sort());
    for (const card of cards) expect(card.level).toBeTruthy();
    // One layout is shown, with one h1; the others are out of the page (display: none).
    expect(await screen.getByRole('heading', { level: 1 }).count()).toBe(1);
    await expect.poll(() => screen.getByRole('heading', { level: 1 }).textContent()).toBe('Zones');
    await page.screenshot({ path: `${SHOTS}/first-screen-${name}.png` });
  });
});

// From before the page's first byte is parsed: the moment a card first enters the document, any
// moment after it when none is in it (checked at every DOM change and every frame), and what the
// app's root held when the server's screen went.
const WATCH_CARDS = `(() => {
  const w = (window.__cards = { firstMs: null, lostAt: [], screenGoneMs: null, rootCardsAtGone: null, serverCards: null });
  const check = () => {
    const any = document.querySelector('[data-testid="zone-card"]');
    if (any && w.firstMs === null) {
      w.firstMs = performance.now();
    } else if (!any && w.firstMs !== null) {
      w.lostAt.push(performance.now());
    }
    const screen = document.getElementById('${FIRST_SCREEN_ID}');
    if (screen && !w.serverCards && document.readyState !== 'loading') {
      w.serverCards = screen.querySelectorAll('[data-testid="zone-card"]').length;
    }
    if (!screen && w.firstMs !== null && w.screenGoneMs === null) {
      w.screenGoneMs = performance.now();
      const root = document.getElementById('root');
      w.rootCardsAtGone = root ? root.querySelectorAll('[data-testid="zone-card"]').length : 0;
    }
  };
  new MutationObserver(check).observe(document, { childList: true, subtree: true });
  const frame = () => { check(); requestAnimationFrame(frame); };
  requestAnimationFrame(frame);
})();`;

interface CardWatch {
  firstMs: number | null;
  lostAt: number[];
  screenGoneMs: number | null;
  rootCardsAtGone: number | null;
  serverCards: number | null;
}

describe('the app taking over from the server-rendered overview', () => {
  let context: BrowserContext;
  let page: Page;
  let errors: string[];
  const consoleLines: string[] = [];
  let serverWords: Awaited<ReturnType<typeof cardWords>>;

  beforeAll(async () => {
    context = await suite.browser.newContext({ viewport: { width: 390, height: 844 } });
    await context.addCookies(cookies);
    await context.addInitScript(WATCH_CARDS);
    page = await context.newPage();
    errors = watchPage(page);
    page.on('console', (m) => consoleLines.push(`${m.type()}: ${m.text()}`));
    await page.goto(overviewUrl(), { waitUntil: 'commit' });
    await page.locator(`#${FIRST_SCREEN_ID} [data-testid="zone-card"]`).first().waitFor();
    serverWords = await cardWords(page, `#${FIRST_SCREEN_ID}`);
    // A cold start on a busy machine: the app may take many seconds to show its own.
    await page.locator(`#${FIRST_SCREEN_ID}`).waitFor({ state: 'detached', timeout: 60_000 });
  });
  afterAll(() => context?.close());

  it('never leaves the document without a zone card, and hands over only to cards', async () => {
    const watch = await page.evaluate(() => (window as unknown as { __cards: CardWatch }).__cards);
    expect(watch.firstMs).not.toBeNull();
    expect(watch.serverCards).toBeGreaterThan(0);
    expect(watch.lostAt).toEqual([]);
    expect(watch.screenGoneMs).not.toBeNull();
    expect(watch.rootCardsAtGone).toBeGreaterThan(0);
    await expect
      .poll(() => page.locator('#root').getByTestId('zone-card').first().isVisible())
      .toBe(true);
  });

  it("shows the same zones, levels and margins in the app's cards as in the server's", async () => {
    expect(serverWords.length).toBeGreaterThan(0);
    await expect.poll(() => cardWords(page, '#root')).toEqual(serverWords);
  });

  it('runs under the CSP with no page errors', () => {
    expect(consoleLines.filter((l) => /Content Security Policy|Refused to/i.test(l))).toEqual([]);
    expect(errors).toEqual([]);
  });
});

// The handover without a jump: each zone card stands where the app's own card for the zone will
// stand, at a phone's width and a wide screen's (components/layout/breakpoints.ts), because the
// server renders the app's frame and layout for each breakpoint. The reference is Chromium's own
// layout of both: the page without JavaScript (only the server's screen) and the app once it has
// taken over. Our tolerance: 2 px.
describe.each([
  { name: 'phone', viewport: { width: 390, height: 844 } },
  { name: 'wide', viewport: { width: 1440, height: 900 } },
])('the cards at the handover, $name', ({ name, viewport }) => {
  let server: CardBox[];
  let app: CardBox[];

  beforeAll(async () => {
    const plain = await suite.browser.newContext({ viewport, javaScriptEnabled: false });
    await plain.addCookies(cookies);
    const before = await plain.newPage();
    watchPage(before);
    await before.goto(overviewUrl());
    server = await cardBoxes(before, `#${FIRST_SCREEN_ID}`);
    await before.screenshot({ path: `${SHOTS}/first-screen-server-${name}.png` });
    await plain.close();

    const live = await suite.browser.newContext({ viewport });
    await live.addCookies(cookies);
    const after = await live.newPage();
    watchPage(after);
    await after.goto(overviewUrl());
    await after.locator(`#${FIRST_SCREEN_ID}`).waitFor({ state: 'detached', timeout: 60_000 });
    await after.locator('#root [data-testid="zone-card"]').first().waitFor();
    app = await cardBoxes(after, '#root');
    await after.screenshot({ path: `${SHOTS}/first-screen-app-${name}.png` });
    await live.close();
  }, 120_000);

  it("puts each zone's card where the app puts it, within 2 px", () => {
    expect(server.length).toBeGreaterThan(1);
    expect(server.map((c) => c.name)).toEqual(app.map((c) => c.name));
    for (const card of server) {
      const mine = app.find((c) => c.name === card.name)!;
      for (const key of ['x', 'y', 'width', 'height'] as const) {
        expect(Math.abs(card[key] - mine[key]), `${card.name} ${key}`).toBeLessThanOrEqual(2);
      }
    }
  });

  it("says in the first card what the app's first card says", () => {
    expect(server[0]!.text).toBe(app[0]!.text);
  });

  // The wide overview's history column: the app loads its chart (a lazy chunk) after taking over.
  if (name === 'wide')
    it("draws the first zone's chart once the app has taken over", async () => {
      const live = await suite.browser.newContext({ viewport });
      await live.addCookies(cookies);
      const page = await live.newPage();
      const errors = watchPage(page);
      await openInApp(page, overviewUrl());
      await page.locator('#root [data-testid="zone-chart-plot"] svg').first().waitFor();
      expect(await page.getByText('Loading the chart…').count()).toBe(0);
      expect(errors).toEqual([]);
      await live.close();
    }, 60_000);
});

// Asked once: a page the server rendered holds the answers of GET /me, the zones, the open
// alarms and the sensors, and the app takes them from it; a page it did not render (a zone's page) asks the API
// for each, once. Counted from Chromium's own request events until the app shows its cards.
describe('the API answers the first screen needs', () => {
  const WATCHED = {
    me: /\/api\/v1\/me$/,
    zones: /\/api\/v1\/shops\/[^/]+\/zones$/,
    alarms: /\/api\/v1\/shops\/[^/]+\/alarms\?state=open$/,
    sensors: /\/api\/v1\/shops\/[^/]+\/sensors$/,
  };

  async function requestsFor(url: string, ready: string) {
    const context = await suite.browser.newContext({ viewport: { width: 390, height: 844 } });
    await context.addCookies(cookies);
    const page = await context.newPage();
    const errors = watchPage(page);
    const counts = { me: 0, zones: 0, alarms: 0, sensors: 0 };
    page.on('request', (req) => {
      for (const [key, pattern] of Object.entries(WATCHED)) {
        if (req.method() === 'GET' && pattern.test(req.url())) counts[key as keyof typeof counts]++;
      }
    });
    await page.goto(url);
    await page.locator(ready).first().waitFor({ timeout: 60_000 });
    // Time for any late request the first screen would still make.
    await page.waitForTimeout(1_500);
    await context.close();
    return { counts, errors };
  }

  it('asks for none of them on an overview the server rendered', async () => {
    const { counts, errors } = await requestsFor(overviewUrl(), `#root [data-testid="zone-card"]`);
    expect(counts).toEqual({ me: 0, zones: 0, alarms: 0, sensors: 0 });
    expect(errors).toEqual([]);
  }, 90_000);

  it("asks for each once on a page the server did not render (a zone's page)", async () => {
    const zones = await suite.browser.newContext();
    await zones.addCookies(cookies);
    const api = await zones.request.get(
      `${suite.server.baseUrl}/api/v1/shops/${suite.server.demo.shopId}/zones`,
    );
    const zoneId = ((await api.json()) as { zones: { id: string }[] }).zones[0]!.id;
    await zones.close();
    const { counts, errors } = await requestsFor(
      `${overviewUrl()}/zones/${zoneId}`,
      `#root [data-testid="zone-detail"]`,
    );
    expect(counts).toEqual({ me: 1, zones: 1, alarms: 1, sensors: 1 });
    expect(errors).toEqual([]);
  }, 90_000);
});
