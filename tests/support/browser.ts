// The browser tests' frame: the exported app on a live server with the demo shop seeded,
// Debian's Chromium (never a downloaded one), a folder for screenshots, signing in, watching a
// page for errors, and posting readings as a sensor would.
import fs from 'node:fs';

import { chromium, type Browser, type Page } from 'playwright-core';
import { expect } from 'vitest';

import { DEMO_PASSWORD } from '@/db/seed';
import { FIRST_SCREEN_ID } from '@/ingest/wire/firstScreen';

import type { TestAppOptions } from './app';
import { startImportJobRunner, type ImportJobRunner } from './imports';
import { CHROMIUM_ARGS, startLiveServer } from './liveServer';

export const SHOTS = 'test-results/screenshots';

export interface BrowserSuite {
  server: Awaited<ReturnType<typeof startLiveServer>>;
  browser: Browser;
  /** The import job runner behind the server, when the suite was asked for one. */
  imports?: ImportJobRunner;
  close(): Promise<void>;
}

export interface BrowserSuiteOptions extends Omit<TestAppOptions, 'imports'> {
  /**
   * A real import job runner (tests/support/imports.ts) behind the server, its pg-boss in this
   * schema: the files in an S3 fake, the jobs worked as `npm start` works them.
   */
  imports?: { schema: string };
}

export async function startBrowserSuite(options: BrowserSuiteOptions = {}): Promise<BrowserSuite> {
  if (!fs.existsSync('dist/index.html'))
    throw new Error('dist/ is missing: run scripts/build-web.sh');
  fs.mkdirSync(SHOTS, { recursive: true });
  const { imports: importsOption, ...appOptions } = options;
  const imports = importsOption && (await startImportJobRunner(importsOption.schema));
  const server = await startLiveServer({ ...appOptions, ...imports?.appOptions });
  await imports?.work(server.app);
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: CHROMIUM_ARGS,
  });
  return {
    server,
    browser,
    imports,
    async close() {
      await browser.close();
      await imports?.boss.stop({ graceful: false });
      await server.close();
      await imports?.s3.dispose();
    },
  };
}

/** Gives a page the tests' 10 s wait; the list it returns collects the page's uncaught errors. */
export function watchPage(page: Page): string[] {
  page.setDefaultTimeout(10_000);
  const errors: string[] = [];
  page.on('pageerror', (err) => errors.push(err.message));
  return errors;
}

/**
 * Opens a page and waits until the app, not the server's first screen, is in charge. A shop's
 * overview opened by address comes with the server's cards placed before the app's root
 * (server/firstScreen.ts); a locator that finds one of them loses it when the app takes over,
 * so a test that acts on the overview's cards opens it this way.
 */
export async function openInApp(page: Page, url: string): Promise<void> {
  await page.goto(url);
  await page.locator(`#${FIRST_SCREEN_ID}`).waitFor({ state: 'detached' });
}

/** What the ingest route answers about each reading it took. */
export interface IngestAnswer {
  results: { dewPoint: number; margin: number; level: string }[];
}

/** Posts a reading over HTTP with a sensor's token, as the sensor would, and expects a 202. */
export async function postReading(
  baseUrl: string,
  token: string,
  reading: Record<string, unknown>,
): Promise<IngestAnswer> {
  const res = await fetch(`${baseUrl}/api/v1/ingest`, {
    method: 'POST',
    headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
    body: JSON.stringify(reading),
  });
  expect(res.status).toBe(202);
  return (await res.json()) as IngestAnswer;
}

/** Signs a person in (a demo person unless a password is given) and waits for their shop. */
export async function signInAs(
  page: Page,
  baseUrl: string,
  email: string,
  password = DEMO_PASSWORD,
) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(password);
  await page.getByTestId('sign-in-submit').click();
  await page.waitForURL(/\/shops\/[0-9a-f-]+/);
}
