// The overview's first load, in Debian's Chromium against the real server, with an empty cache:
// the page's boot script (scripts/webpage/boot.ts) runs under the server's Content-Security-Policy
// (Chromium logs a refused inline script on the console), the app takes its early answers
// instead of asking again (each of /me, the open alarms and the zones is requested once), the
// chunks it preloads are exactly the ones expo-router then loads for the address, and the
// JetBrains Mono faces declared by the page end up loaded and used. The references: Chromium's
// CSP enforcement, expo-router's own choice of chunks, the browser's FontFace states.
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
beforeAll(async () => {
  suite = await startBrowserSuite();
});
afterAll(() => suite?.close());

// Before any of the page's scripts: every <script src> added later, but for the page's own
// deferred ones (metro's runtime appends one per chunk it loads).
const WATCH_SCRIPTS = `(() => {
  window.__addedScripts = [];
  new MutationObserver((changes) => {
    for (const c of changes) for (const n of c.addedNodes) {
      if (n.tagName === 'SCRIPT' && n.src && !n.defer) window.__addedScripts.push(new URL(n.src).pathname);
    }
  }).observe(document, { childList: true, subtree: true });
})();`;

describe.each([
  { width: 390, height: 844 },
  { width: 1440, height: 900 },
])('the overview opened afresh at $width×$height', (viewport) => {
  let context: BrowserContext;
  let page: Page;
  let errors: string[];
  const consoleLines: string[] = [];
  const apiRequests: string[] = [];

  beforeAll(async () => {
    // Sign in on one page, then open the overview in a new context: an empty cache, the session.
    const signIn = await suite.browser.newPage();
    await signInAs(signIn, suite.server.baseUrl, DEMO_PEOPLE[0].email);
    const cookies = await signIn.context().cookies();
    await signIn.close();
    context = await suite.browser.newContext({ viewport });
    await context.addCookies(cookies);
    await context.addInitScript(WATCH_SCRIPTS);
    page = await context.newPage();
    errors = watchPage(page);
    page.on('console', (m) => consoleLines.push(`${m.type()}: ${m.text()}`));
    page.on('request', (r) => {
      const u = new URL(r.url());
      if (u.pathname.startsWith('/api/')) apiRequests.push(`${u.pathname}${u.search}`);
    });
    // A cold load on a busy machine can pass the usual 10 s before the page's load event.
    await page.goto(`${suite.server.baseUrl}/shops/${suite.server.demo.shopId}`, {
      waitUntil: 'commit',
    });
    // The app's own cards, and the server's first screen (tests/e2e/firstScreen.test.ts) gone.
    await page.locator('#root').getByTestId('zone-card').first().waitFor({ timeout: 60_000 });
    await page.locator(`#${FIRST_SCREEN_ID}`).waitFor({ state: 'detached' });
    await page.evaluate(() => document.fonts.ready.then(() => undefined));
  });
  afterAll(() => context?.close());

  it("runs the boot script under the CSP and asks none of the first screen's questions", () => {
    expect(consoleLines.filter((l) => /Content Security Policy|Refused to/i.test(l))).toEqual([]);
    // The overview the server rendered holds these answers (server/firstScreen.ts); a page it
    // did not render asks each once (tests/e2e/firstScreen.test.ts counts both).
    const shop = `/api/v1/shops/${suite.server.demo.shopId}`;
    const count = (path: string) => apiRequests.filter((p) => p === path).length;
    expect(count('/api/v1/me')).toBe(0);
    expect(count(`${shop}/alarms?state=open`)).toBe(0);
    expect(count(`${shop}/zones`)).toBe(0);
    expect(count(`${shop}/sensors`)).toBe(0);
    expect(errors).toEqual([]);
  });

  it('preloads exactly the route chunks expo-router loads for the address', async () => {
    const { preloaded, added } = await page.evaluate(() => ({
      preloaded: Array.from(
        document.querySelectorAll<HTMLLinkElement>('link[rel="preload"][as="script"]'),
        (l) => new URL(l.href).pathname,
      ),
      added: (window as unknown as { __addedScripts: string[] }).__addedScripts,
    }));
    // The root layout, the shop's layout and the overview's screen; the wide overview also
    // shows a zone's chart, whose chunk (LazyCharts) is no route's and is loaded when drawn.
    expect(preloaded).toHaveLength(3);
    const routeChunks = added.filter((p) => !/\/charts-[0-9a-f]+\.js$/.test(p));
    expect([...routeChunks].sort()).toEqual([...preloaded].sort());
  });

  it('declares, loads and uses the three faces', async () => {
    const faces = await page.evaluate(() => {
      const list: string[] = [];
      document.fonts.forEach((f) => list.push(`${f.family.replace(/"/g, '')} ${f.status}`));
      return list.sort();
    });
    expect(faces).toEqual([
      'JetBrainsMono_400Regular loaded',
      'JetBrainsMono_500Medium loaded',
      'JetBrainsMono_700Bold loaded',
    ]);
    const heading = await page
      .getByRole('heading', { level: 1 })
      .evaluate((el) => getComputedStyle(el).fontFamily);
    expect(heading).toMatch(/^JetBrainsMono_\w+, monospace$/);
    await page.screenshot({ path: `${SHOTS}/first-load-${viewport.width}.png` });
  });
});
