// A person's path through the foundation, in Debian's Chromium against the real server:
// sign in as the demo owner, open a zone, and watch a reading posted over HTTP by "a sensor"
// (this test) reach the card and the chart without a reload.
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_PEOPLE } from '@/db/seed';
import type { Level } from '@/ingest/wire/levels';
import { LEVEL_WORDS } from '@/ingest/words';

import {
  openInApp,
  postReading,
  SHOTS,
  signInAs,
  startBrowserSuite,
  watchPage,
  type BrowserSuite,
} from '../support/browser';

let suite: BrowserSuite;
let server: BrowserSuite['server'];
let browser: BrowserSuite['browser'];

beforeAll(async () => {
  suite = await startBrowserSuite();
  ({ server, browser } = suite);
});

afterAll(() => suite?.close());

const signIn = (page: Page) => signInAs(page, server.baseUrl, DEMO_PEOPLE[0].email);

describe.each([
  { label: 'phone', width: 390, height: 844, air: 17.4, surface: 9.6 },
  { label: 'wide', width: 1440, height: 900, air: 18.6, surface: 11.2 },
])('a zone on a $label screen ($width×$height)', ({ label, width, height, air, surface }) => {
  it('shows a reading posted by a sensor on the card and the chart within 2 s', async () => {
    const page = await browser.newPage({ viewport: { width, height } });
    const errors = watchPage(page);
    const sensor = server.demo.tokens.find((s) => s.zone === 'Machine room')!;
    // An earlier reading, so the chart has a line before the live one arrives.
    await postReading(server.baseUrl, sensor.token, {
      at: new Date(Date.now() - 15 * 60_000).toISOString(),
      air: air - 2,
      rh: 60,
      surface: surface - 1,
    });
    await signIn(page);

    await page.getByRole('link', { name: /^Machine room\b/ }).click();
    await page.waitForURL(/\/zones\/[0-9a-f-]+$/);
    const detail = page.getByTestId('zone-detail');
    const chart = detail.getByTestId('zone-chart');
    await expect
      .poll(() => chart.locator('svg path').count(), { timeout: 10_000 })
      .toBeGreaterThan(2);
    await expect.poll(() => page.getByTestId('live-status').textContent()).toContain('live');
    const countOf = async () => Number(await chart.getByTestId('zone-chart-count').textContent());
    const pointsBefore = await countOf();

    const posted = await postReading(server.baseUrl, sensor.token, { air, rh: 62, surface });
    const expected = posted.results[0]!;
    // Phone: the card heads the zone page; wide: the selected card in the list beside the chart.
    const card = page
      .getByTestId('zone-card')
      .filter({ has: page.getByTestId('zone-name').filter({ hasText: 'Machine room' }) });
    const startedMs = Date.now();
    await expect
      .poll(() => card.getByTestId('zone-air').textContent(), { timeout: 2000, interval: 50 })
      .toContain(air.toFixed(1));
    expect(Date.now() - startedMs).toBeLessThan(2000);
    expect(await card.getByTestId('zone-surface').textContent()).toContain(surface.toFixed(1));
    expect(await card.getByTestId('zone-margin').textContent()).toContain(
      Math.abs(expected.margin).toFixed(1),
    );
    // The level word in sentence case (ingest/words/levels.ts): "Wet" for the API's `wet`.
    expect(await card.getByTestId('zone-level').textContent()).toContain(
      LEVEL_WORDS[expected.level as Level],
    );
    await expect.poll(countOf, { timeout: 2000, interval: 50 }).toBe(pointsBefore + 1);

    await page.screenshot({ path: `${SHOTS}/zone-${label}.png`, fullPage: true });
    await openInApp(page, page.url().replace(/\/zones\/.*$/, ''));
    await page.getByTestId('zone-card').first().waitFor();
    await page.screenshot({ path: `${SHOTS}/overview-${label}.png`, fullPage: true });
    expect(errors).toEqual([]);
    await page.close();
  });
});
