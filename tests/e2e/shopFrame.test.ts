// The one frame around a shop's pages (app/shops/[shopId]/_layout.tsx), in Debian's Chromium
// against the real server: whichever page is opened, /me failing for a reason other than the
// session shows the error with a retry that recovers, a shop the person is not in shows "Shop
// not found" with a link home, and no session sends the person to sign in.
import type { Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_PEOPLE } from '@/db/seed';

import { signInAs, startBrowserSuite, watchPage, type BrowserSuite } from '../support/browser';

let suite: BrowserSuite;
beforeAll(async () => {
  suite = await startBrowserSuite();
});
afterAll(() => suite?.close());

const OTHER_SHOP = '00000000-0000-4000-8000-000000000000';
const PAGES = ['', '/alarms', '/sensors', '/settings', '/members', '/profile'];
// The overview and a section page: before the frame they had two different copies of this.
// (Each waits out the client's retries of the 5xx, some 8 s.)
const ERROR_PAGES = ['', '/sensors'];

describe('the shop frame (390×844)', () => {
  let page: Page;
  let errors: string[];
  let shopUrl: string;

  beforeAll(async () => {
    page = await suite.browser.newPage({ viewport: { width: 390, height: 844 } });
    errors = watchPage(page);
    await signInAs(page, suite.server.baseUrl, DEMO_PEOPLE[0].email);
    shopUrl = `${suite.server.baseUrl}/shops/${suite.server.demo.shopId}`;
  });
  afterAll(() => page?.close());
  // A failed case must not leave /me failing, or the page plain, for the next one.
  afterEach(() => page.unrouteAll());

  it.each(ERROR_PAGES)('shows the error with a retry when /me fails on %s', async (path) => {
    // The server is up but answers /me with a 503, as when PostgreSQL is away.
    await page.route('**/api/v1/me', (route) =>
      route.fulfill({
        status: 503,
        contentType: 'application/json',
        body: JSON.stringify({
          error: { code: 'unavailable', message: 'The database is not answering.', details: [] },
        }),
      }),
    );
    // The overview the server renders holds /me's answer (server/firstScreen.ts), and a server
    // whose database fails renders none: the page comes plain, as it would then.
    const plainPage = await (await fetch(`${suite.server.baseUrl}/`)).text();
    await page.route(`${shopUrl}${path}`, (route) =>
      route.fulfill({ status: 200, contentType: 'text/html', body: plainPage }),
    );
    await page.goto(`${shopUrl}${path}`);
    const notice = page.getByTestId('shop-error');
    await notice.waitFor();
    expect(await notice.textContent()).toContain('The database is not answering.');
    expect(await page.getByTestId('shop-not-found').count()).toBe(0);

    await page.unroute('**/api/v1/me');
    await notice.getByRole('button', { name: 'Try again' }).click();
    await page.getByTestId('shop-nav-bar').waitFor();
    expect(await page.getByTestId('shop-name').textContent()).toBe('Tamarack Street Joinery');
    expect(await page.getByTestId('shop-error').count()).toBe(0);
    expect(errors).toEqual([]);
  });

  it.each(PAGES)(
    'shows "Shop not found" with a link home for a foreign shop on %s',
    async (path) => {
      await page.goto(`${suite.server.baseUrl}/shops/${OTHER_SHOP}${path}`);
      const notice = page.getByTestId('shop-not-found');
      await notice.waitFor();
      await notice.getByRole('link', { name: 'Go to your shops' }).click();
      await page.waitForURL(`${shopUrl}`);
      expect(errors).toEqual([]);
    },
  );

  it('starts the next page at the top, as a page of its own would', async () => {
    // The frame stays mounted from page to page; its scrolling area must not keep the offset.
    const scrolled = () =>
      page.evaluate(() =>
        Math.max(...Array.from(document.querySelectorAll('div'), (el) => el.scrollTop)),
      );
    // Sensors once first, so its list comes from the cache later and the page is long at once
    // (a short loading page would bring the offset to 0 by itself).
    await page.goto(`${shopUrl}/sensors`);
    await page.getByText('Add a sensor').waitFor();
    await page.getByTestId('nav-shop').click();
    await page.getByText('Zones and limits').waitFor();
    await page.mouse.move(195, 500);
    await page.mouse.wheel(0, 1500);
    await expect.poll(scrolled).toBeGreaterThan(0);
    await page.getByTestId('nav-sensors').click();
    await page.waitForURL(`${shopUrl}/sensors`);
    await page.getByRole('heading', { name: 'Sensors', exact: true }).waitFor();
    await expect.poll(scrolled).toBe(0);
    expect(errors).toEqual([]);
  });

  it('sends a person without a session to sign in from any page', async () => {
    const fresh = await suite.browser.newPage({ viewport: { width: 390, height: 844 } });
    try {
      for (const path of PAGES) {
        await fresh.goto(`${shopUrl}${path}`);
        await fresh.waitForURL(/\/sign-in$/);
      }
    } finally {
      await fresh.close();
    }
  });
});
