// Getting started, in Debian's Chromium against the real server, on a phone and a wide screen:
// the signed-out front page says what Drybench does and needs and leads to sign-up; a new
// person verifies from the server's outbox, creates a shop with its time zone found by typing
// "Chicago" in the picker, and follows the checklist on the overview — zone, sensor, first
// reading — each ticked as it happens, the list gone when all are done. The sole owner is told
// why they cannot leave instead of being offered Leave. A zone added in one tab appears in
// another open tab of the shop without a reload, and goes when it is deleted. The shop starts
// on US Letter for its week report (a Chicago shop) and the owner can switch it to A4.
import { randomUUID } from 'node:crypto';

import AxeBuilder from '@axe-core/playwright';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { VERIFICATION_SUBJECT } from '@/server/mail';

import {
  openInApp,
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

/** axe-core's serious and critical findings on the page as it stands (rule id and targets). */
async function seriousAxeFindings(page: Page) {
  const { violations } = await new AxeBuilder({ page }).analyze();
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

const stepState = (page: Page, step: 'zone' | 'sensor' | 'reading') =>
  page.getByTestId(`setup-step-${step}-state`).textContent();

describe.each([
  { label: 'phone', width: 390, height: 844 },
  { label: 'wide', width: 1440, height: 900 },
])('getting started on a $label screen ($width×$height)', ({ label, width, height }) => {
  let context: BrowserContext;
  let page: Page;
  let errors: string[];
  let shopUrl = '';
  const shot = (name: string) =>
    page.screenshot({ path: `${SHOTS}/getting-started-${name}-${label}.png`, fullPage: true });

  beforeAll(async () => {
    // A browser in Oslo: its own zone is the one the new-shop form offers first.
    context = await suite.browser.newContext({
      viewport: { width, height },
      timezoneId: 'Europe/Oslo',
    });
    page = await context.newPage();
    errors = watchPage(page);
  });
  afterAll(() => context?.close());

  it('shows a signed-out visitor what Drybench does and needs, with the ways in', async () => {
    const base = suite.server.baseUrl;
    await page.goto(`${base}/`);
    const landing = page.getByTestId('landing');
    await landing.waitFor();
    expect(await page.getByRole('heading', { level: 1 }).count()).toBe(1);
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toContain('dry');
    const does = (await page.getByTestId('landing-does').textContent()) ?? '';
    expect(does).toContain('dew margin');
    expect(does).toContain('Alarms before iron sweats');
    expect(does).toContain('weekly report');
    const needs = (await page.getByTestId('landing-needs').textContent()) ?? '';
    expect(needs).toContain('A hygrometer');
    expect(needs).toContain('surface probe');
    expect(needs).toContain('HTTPS POST');
    expect(needs).toContain('electrical codes');
    expect(await page.getByTestId('landing-sign-in').getAttribute('href')).toBe('/sign-in');
    expect(await page.getByTestId('landing-sign-up').getAttribute('href')).toBe('/sign-up');
    // Nothing runs off the side of the page.
    const overflow = await page.evaluate(
      () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
    );
    expect(overflow).toBeLessThanOrEqual(0);
    await shot('landing');
    expect(await seriousAxeFindings(page)).toEqual([]);

    await page.getByTestId('landing-sign-in').click();
    await page.waitForURL(/\/sign-in$/);
    await page.goBack();
    await page.getByTestId('landing-sign-up').click();
    await page.waitForURL(/\/sign-up$/);
  });

  it('signs up, verifies and creates a shop with the time zone found by typing Chicago', async () => {
    const base = suite.server.baseUrl;
    const email = `start-${label}-${randomUUID().slice(0, 8)}@walnut.example`;
    await page.getByTestId('sign-up-name').fill('Ines Router');
    await page.getByTestId('sign-up-email').fill(email);
    await page.getByTestId('sign-up-password').fill('walnut bench password');
    await page.getByTestId('sign-up-submit').click();
    await page.getByTestId('check-inbox').waitFor();
    const mail = await waitForMail(suite.server.app.outbox, email, {
      subject: VERIFICATION_SUBJECT,
    });
    await page.goto(`${base}/verify?token=${linkToken(mail, 'verify')}`);
    await page.getByTestId('create-shop').click();
    await page.waitForURL(/\/new-shop$/);

    const zone = page.getByTestId('shop-create-timezone');
    // The browser's own zone is preselected, and leads the list.
    expect(await zone.inputValue()).toBe('Europe/Oslo');
    expect(await zone.getAttribute('role')).toBe('combobox');
    expect(await zone.getAttribute('aria-label')).toBe('Time zone');
    await zone.focus();
    await zone.press('ArrowDown');
    expect(await zone.getAttribute('aria-expanded')).toBe('true');
    const options = page.getByTestId('shop-create-timezone-option');
    expect(await options.first().textContent()).toContain('Europe/Oslo');
    // Escape closes the list and keeps the zone.
    await zone.press('Escape');
    expect(await zone.getAttribute('aria-expanded')).toBe('false');
    expect(await zone.inputValue()).toBe('Europe/Oslo');

    await page.getByTestId('shop-create-name').fill('Walnut Row Shop');
    await zone.fill('Chicago');
    expect(await zone.getAttribute('aria-expanded')).toBe('true');
    expect(await options.first().textContent()).toBe('America/Chicago');
    // The highlighted option is the one named by aria-activedescendant, and arrows move it.
    const activeId = () => zone.getAttribute('aria-activedescendant');
    expect(await activeId()).toBe(await options.first().getAttribute('id'));
    expect(await options.first().getAttribute('aria-selected')).toBe('true');
    await zone.fill('America/');
    await zone.press('ArrowDown');
    expect(await activeId()).toBe(await options.nth(1).getAttribute('id'));
    await zone.press('ArrowUp');
    expect(await activeId()).toBe(await options.nth(0).getAttribute('id'));
    await zone.fill('Chicago');
    await shot('time-zone');
    // With the list open: the combobox, its listbox and options as axe-core checks them.
    expect(await seriousAxeFindings(page)).toEqual([]);
    // Enter picks the highlighted zone, spelt as IANA spells it, and does not send the form.
    await zone.press('Enter');
    expect(await zone.inputValue()).toBe('America/Chicago');
    expect(await zone.getAttribute('aria-expanded')).toBe('false');
    expect(page.url()).toMatch(/\/new-shop$/);

    await page.getByTestId('shop-create-submit').click();
    await page.waitForURL(/\/shops\/[0-9a-f-]+$/);
    shopUrl = page.url();
    const shopId = shopUrl.split('/').at(-1)!;
    const saved = await page.evaluate(async (id) => {
      const res = await fetch(`/api/v1/shops/${id}`);
      return ((await res.json()) as { timeZone: string }).timeZone;
    }, shopId);
    expect(saved).toBe('America/Chicago');
  });

  it('follows the checklist: zone, sensor and first reading, each ticked as it happens', async () => {
    const checklist = page.getByTestId('setup-checklist');
    await checklist.waitFor();
    expect(await stepState(page, 'zone')).toBe('next');
    expect(await stepState(page, 'sensor')).toBe('to do');
    expect(await stepState(page, 'reading')).toBe('to do');
    await shot('checklist');
    expect(await seriousAxeFindings(page)).toEqual([]);

    await page.getByTestId('setup-step-zone-link').click();
    await page.waitForURL(/\/settings$/);
    // The sole owner is told why there is no way to leave, and is offered none.
    await page.getByTestId('shop-leave-sole-owner').waitFor();
    expect(await page.getByTestId('shop-leave').count()).toBe(0);
    expect(await page.getByTestId('shop-leave-sole-owner').textContent()).toContain('only owner');
    await page.getByTestId('shop-leave-sole-owner').scrollIntoViewIfNeeded();
    await shot('sole-owner');
    // The saved zone shows in the settings' picker as saved.
    expect(await page.getByTestId('shop-edit-timezone').inputValue()).toBe('America/Chicago');
    await page.getByTestId('zone-create-name').fill('Machine room');
    await page.getByTestId('zone-create-submit').click();
    await expect.poll(() => page.getByTestId('zone-edit-name').inputValue()).toBe('Machine room');
    // A shop in Chicago starts on US Letter (ANSI, as paper is sold in the US); A4 is one tap.
    const paperChecked = (size: 'a4' | 'letter') =>
      page.getByTestId(`shop-edit-paper-${size}`).getAttribute('aria-checked');
    const savedPaper = () =>
      page.evaluate(async (url) => {
        const res = await fetch(`/api/v1/shops/${url.split('/').at(-1)}`);
        return ((await res.json()) as { paperSize: string }).paperSize;
      }, shopUrl);
    expect(await paperChecked('letter')).toBe('true');
    expect(await page.getByTestId('report-settings').textContent()).toContain('8.5 × 11 in');
    await page.getByTestId('shop-edit-paper-a4').click();
    await expect.poll(() => paperChecked('a4')).toBe('true');
    expect(await paperChecked('letter')).toBe('false');
    expect(await savedPaper()).toBe('a4');
    expect(await page.getByTestId('report-settings').textContent()).toContain('210 × 297 mm');
    await page.getByTestId('shop-edit-paper-letter').click();
    await expect.poll(() => paperChecked('letter')).toBe('true');
    expect(await savedPaper()).toBe('letter');
    await shot('settings');

    await page.getByTestId('nav-zones').click();
    await page.waitForURL(shopUrl);
    await expect.poll(() => stepState(page, 'zone')).toBe('done');
    expect(await stepState(page, 'sensor')).toBe('next');

    await page.getByTestId('setup-step-sensor-link').click();
    await page.waitForURL(/\/sensors$/);
    await page.getByTestId('sensor-create-name').fill('Saw-top probe');
    await page.getByRole('radio', { name: 'Machine room' }).click();
    await page.getByTestId('sensor-create-submit').click();
    const token = (await page.getByTestId('sensor-token').textContent())!.trim();
    expect(token).toMatch(/^dbs_/);

    await page.getByTestId('nav-zones').click();
    await page.waitForURL(shopUrl);
    await expect.poll(() => stepState(page, 'sensor')).toBe('done');
    expect(await stepState(page, 'reading')).toBe('next');
    await expect.poll(() => page.getByTestId('live-status').textContent()).toContain('live');
    await shot('checklist-two-done');

    // The sensor (this test) posts; the last step ticks live and the checklist goes away.
    await postReading(suite.server.baseUrl, token, { air: 15.2, rh: 55, surface: 12.9 });
    await expect.poll(() => page.getByTestId('setup-checklist').count(), { timeout: 5000 }).toBe(0);
    await page.getByTestId('zone-card').first().waitFor();
    await shot('checklist-done');
    expect(errors).toEqual([]);
  });

  it('shows a zone added in one tab in another open tab without a reload', async () => {
    const other = await context.newPage();
    const otherErrors = watchPage(other);
    try {
      await openInApp(other, shopUrl);
      await other.getByTestId('zone-card').first().waitFor();
      await expect.poll(() => other.getByTestId('live-status').textContent()).toContain('live');
      const cards = other.getByTestId('zone-card').filter({ hasText: 'Lumber rack' });
      expect(await cards.count()).toBe(0);

      await page.goto(`${shopUrl}/settings`);
      await page.getByTestId('zone-create-name').fill('Lumber rack');
      await page.getByTestId('zone-create-submit').click();
      await expect.poll(() => cards.count(), { timeout: 5000 }).toBe(1);
      await other.screenshot({
        path: `${SHOTS}/getting-started-other-tab-${label}.png`,
        fullPage: true,
      });
      // Deleting it (an empty zone, made by mistake) takes it off the other tab too; the zone
      // with readings offers no delete.
      await page.getByTestId('zone-delete').click();
      await page.getByTestId('zone-delete-confirm').click();
      await expect.poll(() => cards.count(), { timeout: 5000 }).toBe(0);
      await expect.poll(() => page.getByTestId('zone-delete').count()).toBe(0);
      expect(otherErrors).toEqual([]);
    } finally {
      await other.close();
    }
  });
});
