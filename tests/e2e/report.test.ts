// The Report screen in Debian's Chromium against the real server, for the demo owner (°C): a
// week of readings posted by the demo sensors into the last complete week, the report opened
// from the navigation, a week back and forth (the URL and the dates follow, a reload keeps the
// week), the CSV and the PDF downloaded through the browser and read back (a first PDF request
// held and failed, to see the busy state, the server's sentence and the retry), and screenshots at
// 390×844 and 1440×900. Expected figures are worked out from the posted readings in the
// comments; the dew point and margin come from the ingest answer (ingest/psychrometrics.ts,
// checked against published tables in its own tests).
import fs from 'node:fs';

import Papa from 'papaparse';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { shiftWeek, weekLabel } from '@/components/report/reportWeek';
import { weekStartOf } from '@/ingest/reportWeek';
import { DEMO_PEOPLE, DEMO_SHOP } from '@/db/seed';
import { formatHours, formatMargin } from '@/ingest/words';

import {
  postReading,
  SHOTS,
  signInAs,
  startBrowserSuite,
  watchPage,
  type BrowserSuite,
} from '../support/browser';

let suite: BrowserSuite;
const [owner] = DEMO_PEOPLE;
const STEP_MS = 10 * 60_000;

/** The last complete shop-local week: what the report shows without ?week=. */
const lastWeek = () => shiftWeek(weekStartOf(Date.now(), DEMO_SHOP.timeZone), -1);

/** Monday 00:00 of a week in Chicago as an instant: the Monday's UTC midnight plus the offset. */
function chicagoMidnightMs(date: string): number {
  // Chicago is UTC−6 in winter (CST) and UTC−5 in summer (CDT); the week's Monday tells which.
  const noonMs = Date.parse(`${date}T12:00:00Z`);
  const offsetH = new Intl.DateTimeFormat('en-US', {
    timeZone: 'America/Chicago',
    timeZoneName: 'shortOffset',
  })
    .formatToParts(noonMs)
    .find((part) => part.type === 'timeZoneName')!
    .value.replace('GMT', '');
  return Date.parse(`${date}T00:00:00Z`) - Number(offsetH) * 3_600_000;
}

/** The machine room's margin, as ingest computed it for 15 °C / 50 % RH over a 14 °C surface. */
let machineMarginK: number;
/** The hours of last week in Chicago. */
let weekHours: number;

beforeAll(async () => {
  suite = await startBrowserSuite();
  // The Machine room's probe every 10 minutes through the whole of last week, from Monday 00:00
  // to the next Monday 00:00 in Chicago (168 h, or 167 / 169 across a daylight-saving change):
  // 15 °C air, 50 % RH, 14 °C surface, dry throughout.
  const start = lastWeek();
  const fromMs = chicagoMidnightMs(start);
  const toMs = chicagoMidnightMs(shiftWeek(start, 1));
  weekHours = (toMs - fromMs) / 3_600_000;
  const sensor = suite.server.demo.tokens.find((s) => s.zone === 'Machine room')!;
  const readings = [];
  for (let atMs = fromMs; atMs < toMs; atMs += STEP_MS)
    readings.push({ at: new Date(atMs).toISOString(), air: 15, rh: 50, surface: 14 });
  // At most 1,000 readings a request (API.md).
  for (let i = 0; i < readings.length; i += 500) {
    const answer = await postReading(suite.server.baseUrl, sensor.token, {
      readings: readings.slice(i, i + 500),
    });
    machineMarginK = answer.results[0]?.margin ?? machineMarginK;
  }
});
afterAll(() => suite?.close());

/** The week label once the report for it has loaded. */
async function shownWeek(page: Page) {
  await page.getByTestId('report-shop').waitFor();
  return page.getByTestId('report-week-label').textContent();
}

function machineCard(page: Page) {
  return page
    .getByTestId('report-zone')
    .filter({ has: page.getByTestId('report-zone-name').filter({ hasText: 'Machine room' }) });
}

describe('the week report on a phone (390×844)', () => {
  it('opens from the navigation, pages a week back, and downloads the CSV and PDF', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 390, height: 844 } });
    const errors = watchPage(page);
    await signInAs(page, suite.server.baseUrl, owner.email);

    await page.getByTestId('shop-nav-bar').getByTestId('nav-report').click();
    await page.waitForURL(/\/report$/);
    const start = lastWeek();
    // The server's default week is the last complete one, named by its shop-local dates.
    expect(await shownWeek(page)).toBe(weekLabel(start));
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('Week report');
    expect(await page.getByTestId('report-so-far').count()).toBe(0);

    // The machine room: a reading every 10 min fills the week (1,008 for 168 h), all dry; air
    // 15 °C throughout.
    const card = machineCard(page);
    expect(await card.getByTestId('report-zone-levels-dry').textContent()).toBe(
      `Dry ${formatHours(weekHours)}`,
    );
    expect(await card.getByTestId('report-zone-levels-wet').textContent()).toBe('Wet 0 h');
    for (const key of ['air_min', 'air_mean', 'air_max'])
      expect(await card.getByTestId(`report-zone-figures-${key}`).textContent()).toContain(
        '15.0 °C',
      );
    expect(await card.getByTestId('report-zone-figures-lowest_margin').textContent()).toContain(
      formatMargin(machineMarginK, 'C'),
    );
    // RH 50 % never passes ISO 9223's 80 %: no time of wetness.
    expect(await card.getByTestId('report-zone-figures-tow_hours').textContent()).toContain('0 h');
    // Its chart draws the week's lines.
    await expect
      .poll(() => card.getByTestId('zone-chart-plot').locator('svg path').count())
      .toBeGreaterThan(2);
    await page.screenshot({ path: `${SHOTS}/report-phone.png` });
    await card.scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${SHOTS}/report-phone-zone.png` });

    // A week back: the URL names it, the dates follow, and the previous week has no readings.
    await page.getByTestId('report-week-previous').click();
    const before = shiftWeek(start, -1);
    await page.waitForURL(new RegExp(`/report\\?week=${before}$`));
    await expect.poll(() => shownWeek(page)).toBe(weekLabel(before));
    await expect.poll(() => machineCard(page).getByTestId('report-zone-empty').count()).toBe(1);
    // A reload keeps the week.
    await page.reload();
    expect(await shownWeek(page)).toBe(weekLabel(before));
    // And forward again.
    await page.getByTestId('report-week-next').click();
    await page.waitForURL(new RegExp(`/report\\?week=${start}$`));
    await expect.poll(() => shownWeek(page)).toBe(weekLabel(start));

    // The CSV through the browser's download: a header naming each column (time of wetness
    // among them) and the machine room's row with its 15.0 °C air.
    const [csvDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByTestId('report-download-csv-button').click(),
    ]);
    expect(csvDownload.suggestedFilename()).toMatch(/\.csv$/);
    const csv = fs.readFileSync((await csvDownload.path())!, 'utf8').replace(/^\uFEFF/, '');
    const parsed = Papa.parse<string[]>(csv.trim(), { skipEmptyLines: true });
    const [header, ...rows] = parsed.data;
    expect(header!.some((name) => /wetness/i.test(name))).toBe(true);
    const machine = rows.find((row) => row.includes('Machine room'));
    expect(machine, csv).toBeDefined();
    const airMean = header!.findIndex((name) => /air/i.test(name) && /mean/i.test(name));
    expect(airMean, header!.join(' | ')).toBeGreaterThanOrEqual(0);
    expect(Number(machine![airMean])).toBeCloseTo(15, 1);
    // The button is ready again.
    expect(await page.getByTestId('report-download-csv-button').textContent()).toBe('Download CSV');

    // A PDF that fails: while the answer is awaited the button says so and is busy; the
    // server's sentence then shows with a retry. The first PDF request is held and answered
    // 503 in the shared error shape; the retry goes through to the server.
    let release: () => void = () => {};
    const held = new Promise<void>((resolve) => (release = resolve));
    await page.route(
      '**/reports/week?*format=pdf*',
      async (route) => {
        await held;
        await route.fulfill({
          status: 503,
          contentType: 'application/json',
          body: JSON.stringify({
            error: { code: 'storage_unavailable', message: 'Storage is busy.', details: [] },
          }),
        });
      },
      { times: 1 },
    );
    const pdfButton = page.getByTestId('report-download-pdf-button');
    await pdfButton.click();
    await expect.poll(() => pdfButton.textContent()).toBe('Preparing PDF…');
    expect(await pdfButton.getAttribute('aria-busy')).toBe('true');
    expect(await pdfButton.getAttribute('aria-disabled')).toBe('true');
    release();
    const failure = page.getByTestId('report-download-pdf-error');
    await failure.waitFor();
    expect(await failure.getAttribute('role')).toBe('alert');
    expect(await failure.textContent()).toContain('Storage is busy.');
    expect(await pdfButton.getAttribute('aria-busy')).toBeNull();

    // The retry: the PDF's bytes start with the PDF signature (ISO 32000-1 §7.5.2 "%PDF-").
    const [pdfDownload] = await Promise.all([
      page.waitForEvent('download', { timeout: 20_000 }),
      page.getByTestId('report-download-pdf-retry').click(),
    ]);
    expect(pdfDownload.suggestedFilename()).toMatch(/\.pdf$/);
    const pdf = fs.readFileSync((await pdfDownload.path())!);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    await expect.poll(() => failure.count()).toBe(0);

    expect(errors).toEqual([]);
    await page.close();
  });
});

describe('the week report on a wide screen (1440×900)', () => {
  it('adds a figures table with zones as rows beside the charts', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1440, height: 900 } });
    const errors = watchPage(page);
    await signInAs(page, suite.server.baseUrl, owner.email);
    await page.getByTestId('shop-nav-rail').getByTestId('nav-report').click();
    await page.waitForURL(/\/report$/);
    expect(await shownWeek(page)).toBe(weekLabel(lastWeek()));

    const table = page.getByTestId('report-table').first();
    const headers = await table.getByRole('columnheader').allTextContents();
    // The CSV's own headers, with their units.
    expect(headers.slice(0, 2)).toEqual(['Zone', 'Data coverage (%)']);
    expect(headers).toContain('Air mean (°C)');
    const names = await table.getByRole('rowheader').allTextContents();
    // One row per zone the report answers: the demo's three, and any a test running before this
    // one added to the demo shop.
    const answered = await page.request.get(
      `${suite.server.baseUrl}/api/v1/shops/${suite.server.demo.shopId}/reports/week`,
    );
    const reported = ((await answered.json()) as { zones: { name: string }[] }).zones.map(
      (z) => z.name,
    );
    expect(names.sort()).toEqual(reported.sort());
    expect(names).toEqual(
      expect.arrayContaining(['Finishing room', 'Lumber rack', 'Machine room']),
    );
    const machineRow = table.getByTestId('report-table-row').filter({ hasText: 'Machine room' });
    expect(await machineRow.getByTestId('report-table-air_mean').textContent()).toBe('15.0 °C');
    // The second table: the level hours, all dry.
    const levels = page.getByTestId('report-table').nth(1);
    const machineLevels = levels
      .getByTestId('report-table-row')
      .filter({ hasText: 'Machine room' });
    expect(await machineLevels.getByTestId('report-table-hours_dry').textContent()).toBe(
      formatHours(weekHours),
    );
    // The cards beside it leave the figures to the table.
    expect(await page.getByTestId('report-zone-figures').count()).toBe(0);
    await expect
      .poll(() => machineCard(page).getByTestId('zone-chart-plot').locator('svg path').count())
      .toBeGreaterThan(2);
    await page.screenshot({ path: `${SHOTS}/report-wide.png` });
    await machineCard(page).scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${SHOTS}/report-wide-zones.png` });
    expect(errors).toEqual([]);
    await page.close();
  });
});
