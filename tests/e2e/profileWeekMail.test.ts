// The Monday week-report switch on Profile, in Debian's Chromium against the real server: on by
// default for the demo member, turned off and on again with a click, kept across a reload, a
// full tap target, at 390×844 and 1440×900 (screenshots of both states at each size).
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { TAP_TARGET_PX } from '@/components/theme';

import {
  SHOTS,
  signInAs,
  startBrowserSuite,
  watchPage,
  type BrowserSuite,
} from '../support/browser';

// The demo shop's member (db/seed.ts): verified, so the status names the address.
const THEO = 'theo@tamarack.example';

let suite: BrowserSuite;
beforeAll(async () => {
  suite = await startBrowserSuite();
});
afterAll(async () => {
  // Leave the demo member as seeded for the other browser tests.
  await suite?.server.app.pool.query('update users set week_report_mail = true where email = $1', [
    THEO,
  ]);
  await suite?.close();
});

async function stored(): Promise<boolean> {
  const { rows } = await suite.server.app.pool.query(
    'select week_report_mail from users where email = $1',
    [THEO],
  );
  return (rows[0] as { week_report_mail: boolean }).week_report_mail;
}

const status = (page: Page) => page.getByTestId('profile-week-mail-status').textContent();

describe.each([
  ['phone', 390, 844],
  ['wide', 1440, 900],
])('the week report switch on a %s (%d×%d)', (label, width, height) => {
  it('starts on, turns off and on, and keeps what was chosen', async () => {
    const context = await suite.browser.newContext({ viewport: { width, height } });
    try {
      const page = await context.newPage();
      const errors = watchPage(page);
      await signInAs(page, suite.server.baseUrl, THEO);
      await page.goto(`${page.url().replace(/(\/shops\/[0-9a-f-]+).*/, '$1')}/profile`);

      const toggle = page.getByRole('switch', { name: 'Week report e-mail on Mondays' });
      await toggle.waitFor();
      expect(await toggle.isChecked()).toBe(true);
      await expect.poll(() => status(page)).toBe(`On: the week report goes to ${THEO} on Mondays.`);
      // A finger-sized target (LOOK.md, components/theme.ts).
      const box = await page.getByTestId('profile-week-mail').boundingBox();
      expect(box!.height).toBeGreaterThanOrEqual(TAP_TARGET_PX);
      expect(box!.width).toBeGreaterThanOrEqual(TAP_TARGET_PX);
      await page.getByTestId('profile-week-mail').scrollIntoViewIfNeeded();
      await page.screenshot({ path: `${SHOTS}/profile-week-mail-on-${label}.png`, fullPage: true });

      await toggle.click();
      await expect.poll(() => status(page)).toBe('Off: no week report e-mails.');
      await expect.poll(stored).toBe(false);
      // The alarm e-mail switch beside it is its own setting.
      expect(
        await page.getByRole('switch', { name: 'E-mail me when an alarm opens' }).isChecked(),
      ).toBe(true);
      await page.screenshot({
        path: `${SHOTS}/profile-week-mail-off-${label}.png`,
        fullPage: true,
      });

      await page.reload();
      await toggle.waitFor();
      expect(await toggle.isChecked()).toBe(false);
      await toggle.click();
      await expect.poll(() => status(page)).toContain('On:');
      await expect.poll(stored).toBe(true);
      expect(errors).toEqual([]);
    } finally {
      await context.close();
    }
  });
});
