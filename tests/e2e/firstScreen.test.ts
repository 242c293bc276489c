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

/** Each card's zone name and lead figure, in the order shown. */
function cardWords(page: Page, within: string) {
  return page.evaluate(
    (sel) =>
      Array.from(document.querySelectorAll(`${sel} [data-testid="zone-card"]`)).map((card) => ({
        name: card.querySelector('[data-testid="zone-name"]')?.textContent,
        level: card.querySelector('[data-testid="zone-level"]')?.textContent,
        margin: card.querySelector('[data-testid="zone-margin"]')?.textContent ?? null,
      })),
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
    await expect.poll(() => screen.getByTestId('zone-card').first().isVisible()).toBe(true);
    // The shop's zones as the API answers them to the same person.
    const api = await context.request.get(
      `${suite.server.baseUrl}/api/v1/shops/${suite.server.demo.shopId}/zones`,
    );
    const zones = ((await api.json()) as { zones: { name: string }[] }).zones;
    const cards = await cardWords(page, `#${FIRST_SCREEN_ID}`);
    expect(cards.map((c) => c.name).sort()).toEqual(zones.map((z) => z.name).sort());
    for (const card of cards) expect(card.level).toBeTruthy();
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
