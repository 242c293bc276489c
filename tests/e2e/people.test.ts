// A new person's path, in Debian's Chromium against the real server: sign up, open the
// verification link from the server's outbox (which signs her in), create a shop,
// add a zone and a sensor, copy the sensor's token from the page, post a reading with it from
// this test (as the sensor would), and see the reading on the shop's overview — then switch
// the profile to °F and see the same reading in Fahrenheit.
import { randomUUID } from 'node:crypto';

import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { VERIFICATION_SUBJECT } from '@/server/mail';

import {
  postReading,
  SHOTS,
  startBrowserSuite,
  watchPage,
  type BrowserSuite,
} from '../support/browser';
import { linkToken, waitForMail } from '../support/mail';

let suite: BrowserSuite;
beforeAll(async () => {
  suite = await startBrowserSuite();
});
afterAll(() => suite?.close());

async function shot(page: Page, name: string) {
  await page.screenshot({ path: `${SHOTS}/people-${name}.png`, fullPage: true });
}

describe('a new owner on a phone (390×844)', () => {
  let context: BrowserContext;
  let page: Page;
  let errors: string[] = [];

  beforeAll(async () => {
    context = await suite.browser.newContext({
      viewport: { width: 390, height: 844 },
      permissions: ['clipboard-read', 'clipboard-write'],
    });
    page = await context.newPage();
    errors = watchPage(page);
  });
  afterAll(() => context?.close());

  it('signs up, creates a shop, a zone and a sensor, and sees the sensor’s reading', async () => {
    const base = suite.server.baseUrl;
    await page.goto(`${base}/sign-in`);
    await page.getByTestId('to-sign-up').click();
    await page.waitForURL(/\/sign-up$/);

    // The form checks before sending: errors appear next to their fields.
    await page.getByTestId('sign-up-submit').click();
    await expect
      .poll(() => page.getByTestId('sign-up-email-error').textContent())
      .toContain('e-mail');
    await page.getByTestId('sign-up-name').fill('Mira Planer');
    const email = `mira-${randomUUID().slice(0, 8)}@cedar.example`;
    await page.getByTestId('sign-up-email').fill(email);
    await page.getByTestId('sign-up-password').fill('short');
    await page.getByTestId('sign-up-submit').click();
    await expect
      .poll(() => page.getByTestId('sign-up-password-error').textContent())
      .toContain('at least 10');
    await page.getByTestId('sign-up-password').fill('cedar loft password');
    await page.getByTestId('sign-up-submit').click();

    // No session yet: the page says where the link went; the link signs her in.
    await expect.poll(() => page.getByTestId('check-inbox').textContent()).toContain(email);
    await shot(page, 'check-inbox-phone');
    const mail = await waitForMail(suite.server.app.outbox, email, {
      subject: VERIFICATION_SUBJECT,
    });
    const token = linkToken(mail, 'verify');
    // A spent or mistyped link says so plainly.
    await page.goto(`${base}/verify?token=${token.slice(0, 20)}`);
    await expect.poll(() => page.getByTestId('verify-error').textContent()).toContain('expired');
    await shot(page, 'verify-error-phone');
    await page.goto(`${base}/verify?token=${token}`);

    await page.getByTestId('create-shop').click();
    await page.waitForURL(/\/new-shop$/);
    await page.getByTestId('shop-create-name').fill('Cedar Loft Workshop');
    await page.getByTestId('shop-create-timezone').fill('America/Denver');
    await page.getByTestId('shop-create-submit').click();
    // The overview opens with the getting-started steps; the first leads to the settings.
    await page.waitForURL(/\/shops\/[0-9a-f-]+$/);
    await page.getByTestId('setup-step-zone-link').click();
    await page.waitForURL(/\/shops\/[0-9a-f-]+\/settings$/);
    expect(await page.getByTestId('shop-name').textContent()).toBe('Cedar Loft Workshop');

    await page.getByTestId('zone-create-name').fill('Machine room');
    await page.getByTestId('zone-create-submit').click();
    await expect.poll(() => page.getByTestId('zone-edit-name').inputValue()).toBe('Machine room');
    await shot(page, 'settings-phone');

    await page.getByTestId('nav-sensors').click();
    await page.waitForURL(/\/sensors$/);
    await page.getByTestId('sensor-create-name').fill('Saw-top probe');
    await page.getByRole('radio', { name: 'Machine room' }).click();
    await page.getByTestId('sensor-create-submit').click();
    const shown = (await page.getByTestId('sensor-token').textContent())!.trim();
    expect(shown).toMatch(/^dbs_[A-Za-z0-9_-]{43}$/);
    await page.getByTestId('copy-token').click();
    await expect.poll(() => page.getByTestId('copy-status').textContent()).toBe('Token copied.');
    const copied = await page.evaluate(() => navigator.clipboard.readText());
    expect(copied).toBe(shown);
    const curl = await page.getByTestId('sensor-curl').textContent();
    expect(curl).toContain(`curl -X POST ${base}/api/v1/ingest`);
    expect(curl).toContain(`Authorization: Bearer ${copied}`);
    await shot(page, 'token-phone');

    // The sensor (this test) posts with the copied token; the overview shows the reading.
    await postReading(base, copied, { air: 16.4, rh: 58, surface: 13.1, battery: 3.05 });
    await page.getByTestId('nav-zones').click();
    const card = page.getByTestId('zone-card').filter({ hasText: 'Machine room' });
    await expect.poll(() => card.getByTestId('zone-air').textContent()).toBe('16.4 °C');
    expect(await card.getByTestId('zone-surface').textContent()).toBe('13.1 °C');
    await shot(page, 'overview-phone');

    // Fahrenheit: 16.4 °C = 61.5 °F; 13.1 °C = 55.6 °F (°F = °C × 9/5 + 32).
    await page.getByTestId('nav-profile').click();
    await page.getByTestId('profile-email-verified').waitFor();
    await page.getByRole('radio', { name: '°F' }).click();
    await expect
      .poll(() => page.getByRole('radio', { name: '°F' }).getAttribute('aria-checked'))
      .toBe('true');
    await page.getByTestId('nav-zones').click();
    await expect.poll(() => card.getByTestId('zone-air').textContent()).toBe('61.5 °F');
    expect(await card.getByTestId('zone-surface').textContent()).toBe('55.6 °F');

    await page.getByTestId('nav-sensors').click();
    await expect.poll(() => page.getByTestId('sensor-battery').textContent()).toBe('3.05 V');
    expect(await page.getByTestId('sensor-last-seen').textContent()).toMatch(/just now|min ago/);
    expect(errors).toEqual([]);
  });

  it('shows the same shop on a wide screen with a left rail instead of the bottom bar', async () => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await page.getByTestId('nav-zones').click();
    await page.getByTestId('shop-nav-rail').waitFor();
    expect(await page.getByTestId('shop-nav-bar').count()).toBe(0);
    expect(await page.getByRole('link', { name: 'Zones' }).getAttribute('aria-current')).toBe(
      'page',
    );
    await shot(page, 'overview-wide');
    await page.getByTestId('nav-shop').click();
    await page.getByTestId('tab-members').click();
    await page.getByTestId('member-list').waitFor();
    await shot(page, 'members-wide');
    expect(errors).toEqual([]);
  });
});
