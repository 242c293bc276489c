// A logger's CSV imported on a sensor's page in Debian's Chromium against the real server and
// S3 fake: the preview shows the file's columns, the choices are guessed from the header, a time
// format that cannot read the times is refused beside the time format, a day-first file kept in
// America/Chicago lands with its bad rows listed by line, the same file again stores nothing new
// and comes prefilled with the remembered choices, an empty file is refused with the server's
// words, and a viewer sees the past imports but no upload. Screens are checked with axe-core and
// photographed at 390 × 844 and 1440 × 900.
import AxeBuilder from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_PEOPLE } from '@/db/seed';

import { verifiedPerson } from '../support/app';
import {
  SHOTS,
  signInAs,
  startBrowserSuite,
  watchPage,
  type BrowserSuite,
} from '../support/browser';

let suite: BrowserSuite;

// The whole path as `npm start` runs it: the file in the S3 fake, the import queued in pg-boss
// and worked by the same job the server runs.
beforeAll(async () => {
  suite = await startBrowserSuite({ imports: { schema: 'pgboss_e2e_imports' } });
});
afterAll(async () => {
  await suite?.close();
});

/**
 * Five hours of 10-minute readings from 1 October 2025 00:00 on the logger's clock, day first,
 * with two bad rows: line 12 (RH 104 %, above the ingest limit of 100 %) and line 20 (a time
 * that is no date). 30 good rows; the header is line 1.
 */
function loggerFile(): string {
  const lines = ['Time,Air °C,RH %'];
  let good = 0;
  for (let line = 2; good < 30 || lines.length < 33; line += 1) {
    if (line === 12) lines.push('01/10/2025 09:99,14.0,104');
    else if (line === 20) lines.push('not a time,14.0,70');
    else {
      const minutes = good * 10;
      const hh = String(Math.floor(minutes / 60)).padStart(2, '0');
      const mm = String(minutes % 60).padStart(2, '0');
      lines.push(`01/10/2025 ${hh}:${mm},${(12 + good / 10).toFixed(1)},${70 + (good % 5)}`);
      good += 1;
    }
  }
  return lines.join('\r\n') + '\r\n';
}

async function axeProblems(page: Page): Promise<string[]> {
  const result = await new AxeBuilder({ page }).analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `axe ${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

async function pick(page: Page, name: string, text: string, input = 'import-file-input') {
  await page
    .getByTestId(input)
    .setInputFiles({ name, mimeType: 'text/csv', buffer: Buffer.from(text) });
}

describe('importing a logger file on a sensor’s page', () => {
  let owner: Awaited<ReturnType<typeof verifiedPerson>>;
  let shopId = '';
  let sensorId = '';

  it('previews, refuses unreadable times beside the field, imports and lists rejected rows (phone)', async () => {
    owner = await verifiedPerson(
      { app: suite.server.baseUrl, outbox: suite.server.app.outbox },
      'Mara Planer',
    );
    shopId = (
      await owner.agent
        .post('/api/v1/shops')
        .send({ name: 'Tamarack Bench Works', timeZone: 'America/Chicago' })
        .expect(201)
    ).body.id;
    const zoneId = (
      await owner.agent.post(`/api/v1/shops/${shopId}/zones`).send({ name: 'Basement' }).expect(201)
    ).body.id;
    sensorId = (
      await owner.agent
        .post(`/api/v1/shops/${shopId}/sensors`)
        .send({ name: 'Basement logger', zoneId })
        .expect(201)
    ).body.id;

    const context = await suite.browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    const errors = watchPage(page);
    page.setDefaultNavigationTimeout(30_000);
    await signInAs(page, suite.server.baseUrl, owner.email, owner.password);
    await page.goto(`${suite.server.baseUrl}/shops/${shopId}/sensors`);
    await page.getByTestId('sensor-name').click();
    await page.waitForURL(new RegExp(`/sensors/${sensorId}$`));
    await expect.poll(() => page.getByTestId('import-history-empty').isVisible()).toBe(true);

    await pick(page, 'basement-oct.csv', loggerFile());
    await page.getByTestId('import-choices').waitFor();
    // The preview holds the header's columns, and the guesses name them.
    const headers = await page.locator('[role="columnheader"]').allTextContents();
    expect(headers.map((h) => h.split('→')[0]!.trim())).toEqual(['Time', 'Air °C', 'RH %']);
    for (const [field, column] of [
      ['timeColumn', 'Time'],
      ['airColumn', 'Air °C'],
      ['rhColumn', 'RH %'],
    ] as const) {
      expect(await page.getByTestId(`import-${field}-${column}`).getAttribute('aria-checked')).toBe(
        'true',
      );
    }
    expect(await page.getByTestId('import-timeZone').inputValue()).toBe('America/Chicago');
    await page.screenshot({ path: `${SHOTS}/import-choices-phone.png` });
    expect(await axeProblems(page)).toEqual([]);

    // Unix seconds cannot read "01/10/2025 00:00": refused before anything is stored, beside it.
    await page.getByTestId('import-time-format-epoch-s').click();
    await page.getByTestId('import-start').click();
    await page.getByTestId('import-time-format-error').waitFor();
    await page.screenshot({ path: `${SHOTS}/import-refused-phone.png` });

    await page.getByTestId('import-time-format-day-first').click();
    await page.getByTestId('import-start').click();
    const summary = page.getByTestId('import-summary');
    await summary.waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('import-summary-status').textContent()).toBe('Done');
    expect(await page.getByTestId('import-summary-stored').textContent()).toBe('30');
    expect(await page.getByTestId('import-summary-duplicate').textContent()).toBe('0');
    expect(await page.getByTestId('import-summary-rejected').textContent()).toBe('2');
    // The logger kept Chicago's clock and so does the shop: the span reads as the file's times,
    // 30 rows 10 min apart from 00:00 end at 04:50.
    expect(await page.getByTestId('import-summary-span').textContent()).toBe(
      '1 Oct 2025 00:00 – 1 Oct 2025 04:50',
    );
    const rejected = await page.getByTestId('import-rejected-row').allTextContents();
    expect(rejected.map((row) => /Line (\d+)/.exec(row)?.[1])).toEqual(['12', '20']);
    await page.getByTestId('import-summary-note').waitFor();
    await summary.scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${SHOTS}/import-summary-phone.png` });
    expect(await axeProblems(page)).toEqual([]);
    // The readings are there, as the zone's history answers them.
    const readings = await owner.agent
      .get(`/api/v1/shops/${shopId}/zones/${zoneId}/readings`)
      .query({ from: '2025-10-01T05:00:00Z', to: '2025-10-01T10:00:00Z' })
      .expect(200);
    expect(readings.body.points.reduce((n: number, p: { count: number }) => n + p.count, 0)).toBe(
      30,
    );
    expect(errors).toEqual([]);
    await context.close();
  });

  it('imports the same file again storing nothing, prefilled with the remembered choices (wide)', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 1440, height: 900 } });
    const page = await context.newPage();
    const errors = watchPage(page);
    page.setDefaultNavigationTimeout(30_000);
    await signInAs(page, suite.server.baseUrl, owner.email, owner.password);
    await page.goto(`${suite.server.baseUrl}/shops/${shopId}/sensors/${sensorId}`);
    await page.getByTestId('import-history-item').first().waitFor();

    await pick(page, 'basement-oct.csv', loggerFile());
    await page.getByTestId('import-choices').waitFor();
    expect(
      await page.getByTestId('import-time-format-day-first').getAttribute('aria-checked'),
    ).toBe('true');
    await page.screenshot({ path: `${SHOTS}/import-choices-wide.png` });
    await page.getByTestId('import-start').click();
    await page.getByTestId('import-summary').waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('import-summary-stored').textContent()).toBe('0');
    expect(await page.getByTestId('import-summary-duplicate').textContent()).toBe('30');
    await page.screenshot({ path: `${SHOTS}/import-summary-wide.png` });
    expect(await axeProblems(page)).toEqual([]);
    const statuses = await page.getByTestId('import-history-status').allTextContents();
    expect(statuses.slice(0, 2)).toEqual(['Done', 'Done']);

    // An empty file is refused with the server's own sentence, and nothing is listed for it.
    await pick(page, 'empty.csv', '', 'import-file-next-input');
    const refusal = page.getByTestId('import-file-next-error');
    await refusal.waitFor();
    expect((await refusal.textContent())?.length).toBeGreaterThan(10);
    expect(errors).toEqual([]);
    await context.close();
  });

  it('shows a viewer the past imports but no upload', async () => {
    const viewer = DEMO_PEOPLE.find((p) => p.role === 'viewer')!;
    const context = await suite.browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    watchPage(page);
    page.setDefaultNavigationTimeout(30_000);
    await signInAs(page, suite.server.baseUrl, viewer.email);
    await page.goto(`${suite.server.baseUrl}/shops/${suite.server.demo.shopId}/sensors`);
    await page.getByTestId('sensor-name').first().click();
    await page.getByTestId('import-history').waitFor();
    expect(await page.getByTestId('import-file').count()).toBe(0);
    expect(await page.getByTestId('import-panel').count()).toBe(0);
    await page.screenshot({ path: `${SHOTS}/import-viewer-phone.png` });
    await context.close();
  });
});
