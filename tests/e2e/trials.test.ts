// A protection trial in Debian's Chromium against the real server: an owner starts a trial of
// four treatments, adds five tests on the shop's clock (the first in a zone with readings),
// ranks them, reads the standings and the zone's conditions, and downloads the CSV and PDF;
// the figures are checked against a Friedman test worked by hand and the API's answer.
import fs from 'node:fs';

import Papa from 'papaparse';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { verifiedPerson } from '../support/app';
import { postIngest } from '../support/ingest';
import { SHOTS, startBrowserSuite, watchPage, type BrowserSuite } from '../support/browser';
import { WORKED, WORKED_RANKS } from '../support/trialExample';

let suite: BrowserSuite;
let server: BrowserSuite['server'];

beforeAll(async () => {
  suite = await startBrowserSuite();
  server = suite.server;
});
afterAll(() => suite?.close());

const TREATMENTS = ['Paste wax', 'Camellia oil', 'Dry lubricant', 'Bare iron'];
// Ranked as tests/support/trialExample.ts works out: χ² = 11.64, df = 3, p = 0.008724, W = 0.776.
const RANKS = WORKED_RANKS;

async function signIn(page: Page, email: string, password: string) {
  await page.goto(`${server.baseUrl}/sign-in`);
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(password);
  await page.getByTestId('sign-in-submit').click();
  await page.waitForURL(/\/shops\/[0-9a-f-]+/);
}

interface ApiTrial {
  id: string;
  tests: { from: string; to: string; ranks: unknown[] }[];
  standings: {
    tests: number;
    rankTotals: { treatmentId: string; total: number; meanRank: number }[];
    friedman: { statistic: number; df: number; p: number } | null;
    kendallW: number | null;
    pairs: unknown[];
    verdict: string;
  };
  treatments: { id: string; name: string }[];
}

describe('protection trials', () => {
  let trialPath = '';
  let owner: Awaited<ReturnType<typeof verifiedPerson>>;

  it('starts a trial, adds and ranks five tests, and shows the standings (phone)', async () => {
    owner = await verifiedPerson({ app: server.baseUrl, outbox: server.app.outbox }, 'Ines Joiner');
    const shop = (
      await owner.agent
        .post('/api/v1/shops')
        .send({ name: 'Tamarack Bench Works', timeZone: 'America/Chicago' })
        .expect(201)
    ).body as { id: string };
    // A zone with a probe that saw the first test's night: at 100 % RH the dew point is the air
    // temperature, so a 12 °C surface over 10 °C air is a 2 K margin (close) and 11 °C a 1 K
    // margin (wet, ingest/levels.ts). Six readings 10 min apart from 00:00 UTC on 3 March (18:00
    // in Chicago), the last standing 15 min (the cap, ingest/wetness.ts): wet 00:30–01:05 =
    // 35 min = 0.58 h, ISO 9223 wetness (RH > 80 %, T > 0 °C) 00:00–01:05 = 65 min = 1.08 h.
    const zone = (
      await owner.agent
        .post(`/api/v1/shops/${shop.id}/zones`)
        .send({ name: 'Machine room' })
        .expect(201)
    ).body as { id: string };
    const sensor = (
      await owner.agent
        .post(`/api/v1/shops/${shop.id}/sensors`)
        .send({ name: 'Saw probe', zoneId: zone.id })
        .expect(201)
    ).body as { token: string };
    await postIngest(server.baseUrl, sensor.token, {
      readings: [12, 12, 12, 11, 11, 11].map((surface, i) => ({
        at: new Date(Date.parse('2026-03-03T00:00:00Z') + i * 600_000).toISOString(),
        air: 10,
        rh: 100,
        surface,
      })),
    }).expect(202);

    const page = await suite.browser.newPage({
      viewport: { width: 390, height: 844 },
      acceptDownloads: true,
    });
    const errors = watchPage(page);
    await signIn(page, owner.email, owner.password);

    // Reached from Shop → Trials.
    await page.goto(`${server.baseUrl}/shops/${shop.id}/settings`);
    await page.getByTestId('tab-trials').click();
    await page.waitForURL(/\/trials$/);
    await page.getByTestId('trials-empty').waitFor();
    expect(await page.locator('h1').allTextContents()).toEqual(['Trials']);

    // One treatment is refused with the server's own words, nothing is created.
    await page.getByTestId('trial-create-name').fill('Saw table protection');
    await page.getByTestId('trial-create-treatments').fill('Paste wax');
    await page.getByTestId('trial-create-submit').click();
    await expect
      .poll(() => page.getByTestId('trial-create-treatments-error').textContent())
      .toBe('Compare at least 2 treatments');

    await page.getByTestId('trial-create-treatments').fill(TREATMENTS.join('\n'));
    await page.getByTestId('trial-create-submit').click();
    await page.getByTestId('trial-link').click();
    await page.waitForURL(/\/trials\/[0-9a-f-]+$/);
    trialPath = new URL(page.url()).pathname;
    expect(await page.getByTestId('trial-name').textContent()).toBe('Saw table protection');

    // A test that ends before it starts is refused with the server's words on the end field.
    await page.getByTestId('trial-test-name').fill('Backwards');
    await page.getByTestId('trial-test-kind-wear').click();
    await page.getByTestId('trial-test-from').fill('2026-03-02 18:00');
    await page.getByTestId('trial-test-to').fill('2026-03-02 07:00');
    await page.getByTestId('trial-test-submit').click();
    await expect
      .poll(() => page.getByTestId('trial-test-to-error').textContent())
      .toBe('The test must end after it starts');
    expect(await page.getByTestId('trial-test').count()).toBe(0);

    for (const [i, ranks] of RANKS.entries()) {
      await page.getByTestId('trial-test-name').fill(`Wet rag night ${i + 1}`);
      await page.getByTestId('trial-test-kind-condensation').click();
      await page.getByTestId('trial-test-from').fill(`2026-03-0${i + 2} 18:00`);
      await page.getByTestId('trial-test-to').fill(`2026-03-0${i + 3} 07:00`);
      await page.getByTestId(`trial-test-zone-${i === 0 ? zone.id : 'none'}`).click();
      await page.getByTestId('trial-test-submit').click();
      await expect.poll(() => page.getByTestId('trial-test').count()).toBe(i + 1);
      const panel = page.getByTestId('trial-test').nth(i);
      const fields = panel.getByTestId('trial-rank');
      if (i === 0) {
        // A rank past the number of treatments is refused on its field, which takes the focus.
        await fields.nth(0).fill('7');
        await panel.getByTestId('trial-rank-submit').click();
        await expect
          .poll(() => panel.getByTestId('trial-rank-error').first().textContent())
          .toBe('Give a rank from 1 (best) to 4; tied treatments may share one');
        expect(await fields.nth(0).evaluate((el) => el === document.activeElement)).toBe(true);
      }
      for (const [j, rank] of ranks.entries()) await fields.nth(j).fill(String(rank));
      await panel.getByTestId('trial-rank-submit').click();
      await expect.poll(() => panel.textContent()).toContain('· ranked');
      await expect
        .poll(() => page.getByTestId('trial-standings').textContent())
        .toContain(`${i + 1} ${i === 0 ? 'test' : 'tests'} ranked`);
    }

    // The API's own answer for the same trial.
    const api = (await owner.agent.get(`/api/v1${trialPath}`).expect(200)).body as ApiTrial;
    // Times typed on the shop's clock: 18:00 in Chicago on 2 March 2026 is CST (UTC−6; DST
    // starts 8 March), so 00:00 UTC on 3 March.
    expect(api.tests[0]!.from).toBe('2026-03-03T00:00:00.000Z');
    expect(api.standings.tests).toBe(5);
    const totals = TREATMENTS.map(
      (name) =>
        api.standings.rankTotals.find(
          (r) => r.treatmentId === api.treatments.find((t) => t.name === name)!.id,
        )!.total,
    );
    expect(totals).toEqual(WORKED.totals); // hand sums of RANKS' columns
    expect(api.standings.friedman!.statistic).toBeCloseTo(WORKED.statistic, 9);
    expect(api.standings.friedman!.df).toBe(3);
    expect(api.standings.friedman!.p).toBeCloseTo(WORKED.p, 6); // χ²₃ survival
    expect(api.standings.kendallW).toBeCloseTo(WORKED.kendallW, 9);

    // The screen shows the same figures.
    expect(await page.getByTestId('trial-friedman').textContent()).toBe('11.64');
    expect(await page.getByTestId('trial-df').textContent()).toBe('3');
    expect(await page.getByTestId('trial-p').textContent()).toBe('p = 0.0087');
    expect(await page.getByTestId('trial-w').textContent()).toBe('0.78');
    expect(await page.getByTestId('trial-verdict').textContent()).toBe(api.standings.verdict);
    expect(api.standings.verdict).toContain('Paste wax ranked best');
    expect(api.standings.verdict).toContain('more than chance (p = 0.0087)');
    const standings = await page.getByTestId('trial-standing').allTextContents();
    expect(standings).toEqual([
      'Paste wax61.20',
      'Camellia oil102.00',
      'Dry lubricant153.00',
      'Bare iron193.80',
    ]);
    // p < 0.05, so the pairs are listed.
    expect(api.standings.pairs.length).toBeGreaterThan(0);
    expect(await page.getByTestId('trial-pair').count()).toBe(api.standings.pairs.length);

    await page.screenshot({ path: `${SHOTS}/trial-phone.png`, fullPage: true });
    expect(errors).toEqual([]);
    await page.close();
    // Five tests typed and ranked through the screen: slower than one check on a busy machine.
  }, 120_000);

  it('shows the zone’s conditions and downloads the trial as CSV and PDF (phone)', async () => {
    expect(trialPath).not.toBe('');
    const page = await suite.browser.newPage({
      viewport: { width: 390, height: 844 },
      acceptDownloads: true,
    });
    const errors = watchPage(page);
    await signIn(page, owner.email, owner.password);
    await page.goto(`${server.baseUrl}${trialPath}`);
    await page.getByTestId('trial-test-conditions').waitFor();

    // The first test's zone and its night, worked out above, in °C (the owner's unit).
    const conditions = page.getByTestId('trial-test-conditions');
    expect(await conditions.count()).toBe(1);
    const seen = (await conditions.textContent())!;
    for (const text of ['In Machine room', '+1.0 °C', '100 %', '0.6 h', '1.1 h']) {
      expect(seen).toContain(text);
    }
    await conditions.scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${SHOTS}/trial-test-phone.png` });

    // The CSV through the browser's download, read back: the Friedman line carries the worked
    // statistic and p.
    const [csvDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByTestId('trial-download-csv-button').click(),
    ]);
    expect(csvDownload.suggestedFilename()).toMatch(
      /^trial-saw-table-protection-\d{4}-\d{2}-\d{2}\.csv$/,
    );
    const csv = fs.readFileSync((await csvDownload.path())!, 'utf8');
    expect(csv).toContain('11.64');
    const rows = Papa.parse<Record<string, string>>(csv, {
      header: true,
      skipEmptyLines: true,
    }).data;
    const friedman = rows.find((r) => r.Section === 'friedman')!;
    expect(Number(friedman['Friedman chi-square'])).toBeCloseTo(WORKED.statistic, 9);
    expect(Number(friedman.p)).toBeCloseTo(WORKED.p, 6);
    const first = rows.find((r) => r.Section === 'rank' && r.Test === 'Wet rag night 1')!;
    expect(first).toMatchObject({ Zone: 'Machine room', 'Lowest dew margin (°C difference)': '1' });

    // The PDF: its bytes start with the PDF signature (ISO 32000-1 §7.5.2 "%PDF-").
    const [pdfDownload] = await Promise.all([
      page.waitForEvent('download', { timeout: 20_000 }),
      page.getByTestId('trial-download-pdf-button').click(),
    ]);
    expect(pdfDownload.suggestedFilename()).toMatch(/^trial-saw-table-protection-.*\.pdf$/);
    const pdf = fs.readFileSync((await pdfDownload.path())!);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(await page.getByTestId('trial-download-pdf-button').textContent()).toBe('Download PDF');

    expect(errors).toEqual([]);
    await page.close();
  });

  it('shows the same standings on a wide screen', async () => {
    expect(trialPath).not.toBe('');
    const page = await suite.browser.newPage({ viewport: { width: 1440, height: 900 } });
    const errors = watchPage(page);
    await signIn(page, owner.email, owner.password);
    await page.goto(`${server.baseUrl}${trialPath}`);
    await page.getByTestId('trial-standings').waitFor();
    expect(await page.locator('h1').allTextContents()).toEqual(['Trials']);
    expect(await page.getByTestId('trial-p').textContent()).toBe('p = 0.0087');
    expect(await page.getByTestId('trial-test').count()).toBe(5);
    expect(await page.getByTestId('trial-download-csv-button').textContent()).toBe('Download CSV');
    await expect
      .poll(() => page.getByTestId('trial-test-conditions').textContent())
      .toContain('+1.0 °C');
    await page.screenshot({ path: `${SHOTS}/trial-wide.png`, fullPage: true });
    await page.goto(`${server.baseUrl}${trialPath.replace(/\/[^/]+$/, '')}`);
    await page.getByTestId('trial-card').waitFor();
    expect(await page.getByTestId('trial-card').textContent()).toContain('5 tests');
    await page.screenshot({ path: `${SHOTS}/trials-wide.png`, fullPage: true });
    expect(errors).toEqual([]);
    await page.close();
  });
});
