// The browser tests' frame: the exported app on a live server with the demo shop seeded,
// Debian's Chromium (never a downloaded one), a folder for screenshots, and signing in.
import fs from 'node:fs';

import { chromium, type Browser, type Page } from 'playwright-core';

import { DEMO_PASSWORD } from '@/db/seed';

import { CHROMIUM_ARGS, startLiveServer } from './liveServer';

export const SHOTS = 'test-results/screenshots';

export interface BrowserSuite {
  server: Awaited<ReturnType<typeof startLiveServer>>;
  browser: Browser;
  close(): Promise<void>;
}

export async function startBrowserSuite(): Promise<BrowserSuite> {
  if (!fs.existsSync('dist/index.html'))
    throw new Error('dist/ is missing: run scripts/build-web.sh');
  fs.mkdirSync(SHOTS, { recursive: true });
  const server = await startLiveServer();
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: CHROMIUM_ARGS,
  });
  return {
    server,
    browser,
    async close() {
      await browser.close();
      await server.close();
    },
  };
}

/** Signs a demo person in through the sign-in page and waits for their shop. */
export async function signInAs(page: Page, baseUrl: string, email: string) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(DEMO_PASSWORD);
  await page.getByTestId('sign-in-submit').click();
  await page.waitForURL(/\/shops\/[0-9a-f-]+/);
}
