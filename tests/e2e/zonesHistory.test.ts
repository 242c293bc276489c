// Zones by what they hold, history that fits the data and the overview ordered by risk, in
// Debian's Chromium against the real server, for a person who reads °F: a shop of four zones
// (machines, lumber, finishing, and a machine zone with only an hour of readings), its overview
// order and level strip before and after a reading turns one zone wet, the lumber card's EMC
// lead and RH highlight, and the new zone's chart filling its width, with its summary line,
// values table and tooltip in °F.
import { randomUUID } from 'node:crypto';

import { formatInTimeZone } from 'date-fns-tz';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { shopSectionHref, zoneHref } from '@/components/hrefs';
import { insertSensor } from '@/db/queries/sensors';
import { createShopWithOwner } from '@/db/queries/shops';
import { insertUser, updateProfile } from '@/db/queries/users';
import { insertZone, updateZone } from '@/db/queries/zones';
import type { ZonePurpose } from '@/ingest/wire';
import { formatMargin } from '@/ingest/words';
import { hashPassword } from '@/server/auth/password';
import { hashToken, newSensorToken } from '@/server/auth/sensorTokens';

import {
  postReading,
  SHOTS,
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

const PASSWORD = 'zones history 1';
const MINUTE = 60_000;
const iso = (ms: number) => new Date(ms).toISOString();

/**
 * A °F owner and a shop of their own (so no other browser test's readings touch it), made
 * straight through db/queries. Zones are created in an order that is NOT the risk order.
 */
async function makeShop() {
  const db = server.app.db;
  const tag = randomUUID().slice(0, 8);
  const user = await insertUser(db, {
    email: `zones-${tag}@history.example`,
    name: 'Mara Quill',
    passwordHash: await hashPassword(PASSWORD),
    emailVerifiedAt: new Date(),
  });
  if (!user) throw new Error('user insert failed');
  await updateProfile(db, user.id, { unitPref: 'F' });
  const shop = await createShopWithOwner(
    db,
    { name: `Quill Boatworks ${tag}`, timeZone: 'America/Chicago' },
    user.id,
  );
  const zones: Record<string, { id: string; token: string }> = {};
  const add = async (name: string, purpose: ZonePurpose) => {
    const zone = await insertZone(db, shop.id, name, { purpose });
    const token = newSensorToken();
    await insertSensor(db, {
      shopId: shop.id,
      zoneId: zone.id,
      name: `${name} probe`,
      tokenHash: hashToken(token),
    });
    zones[name] = { id: zone.id, token };
  };
  await add('Machine room', 'machines');
  await add('Lumber rack', 'lumber');
  await add('Spray booth', 'finishing');
  await add('New bench', 'machines');
  await updateZone(db, shop.id, zones['Lumber rack']!.id, { humidRhPct: 60 });
  return { email: user.email, shopId: shop.id, zones };
}

type Shop = Awaited<ReturnType<typeof makeShop>>;

/**
 * Readings with a surface probe whose margins set the order (dew points by the server; margins
 * rounded here from ingest/psychrometrics.ts, which its own tests check against ASHRAE):
 * Lumber rack 20 °C / 85 % / surface 19.5 → dew 17.4, margin +2.1 K: close;
 * New bench 17 °C / 55 % / 15 → dew 7.8, +7.2 K: dry; Machine room 18 °C / 50 % / 17 → dew 7.4,
 * +9.6 K: dry; Spray booth 21 °C / 45 % / 20.5 → dew 8.6, +11.9 K: dry.
 */
async function postStart(shop: Shop) {
  const base = server.baseUrl;
  const now = Date.now();
  const at = iso(now - 2 * MINUTE);
  await postReading(base, shop.zones['Machine room']!.token, { at, air: 18, rh: 50, surface: 17 });
  await postReading(base, shop.zones['Lumber rack']!.token, { at, air: 20, rh: 85, surface: 19.5 });
  await postReading(base, shop.zones['Spray booth']!.token, { at, air: 21, rh: 45, surface: 20.5 });
  // The new zone: an hour of readings, every 5 minutes, the newest a minute ago.
  const readings = Array.from({ length: 13 }, (_, i) => ({
    at: iso(now - 61 * MINUTE + i * 5 * MINUTE),
    air: 16 + i / 12,
    rh: 55,
    surface: 14 + i / 12,
  }));
  const answer = await postReading(base, shop.zones['New bench']!.token, { readings });
  return { newBench: { readings, results: answer.results } };
}

async function signIn(page: Page, email: string) {
  await page.goto(`${server.baseUrl}/sign-in`);
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(PASSWORD);
  await page.getByTestId('sign-in-submit').click();
  await page.waitForURL(/\/shops\/[0-9a-f-]+/);
}

/** Whether the element lies wholly inside the viewport. */
async function inView(locator: ReturnType<Page['locator']>, height: number) {
  const box = await locator.boundingBox();
  return box !== null && box.y >= 0 && box.y + box.height <= height + 1;
}

const cardNames = (page: Page) =>
  page.getByTestId('zone-list').getByTestId('zone-name').allTextContents();

describe.each([
  { label: 'phone', width: 390, height: 844, wide: false },
  { label: 'wide', width: 1440, height: 900, wide: true },
])(
  'zones and history on a $label screen ($width×$height), in °F',
  ({ label, width, height, wide }) => {
    it('switches the history between 7 days, 6 h, 30 days and a custom span', async () => {
      const shop = await makeShop();
      const zone = shop.zones['Machine room']!;
      const now = Date.now();
      // Nine days every 15 minutes at 18 °C / 50 % RH over a 17 °C top (dew 7.4 °C, +9.6 K,
      // dry), and a two-reading dip three days ago to a 6 °C top (−1.4 K, wet): the 7-day and
      // 30-day spans must show the dip, the 6-hour span must not.
      const steady = Array.from({ length: 9 * 96 }, (_, i) => ({
        at: iso(now - 9 * 24 * 60 * MINUTE + i * 15 * MINUTE),
        air: 18,
        rh: 50,
        surface: 17,
      }));
      const dipMs = now - 3 * 24 * 60 * MINUTE + 7 * MINUTE;
      const dip = [0, 1].map((i) => ({ at: iso(dipMs + i * MINUTE), air: 18, rh: 50, surface: 6 }));
      const answers = [];
      for (let i = 0; i < steady.length; i += 500) {
        answers.push(
          await postReading(server.baseUrl, zone.token, { readings: steady.slice(i, i + 500) }),
        );
      }
      const dipAnswer = await postReading(server.baseUrl, zone.token, { readings: dip });
      const dryK = answers[0]!.results[0]!.margin;
      const dipK = Math.min(...dipAnswer.results.map((r) => r.margin));
      expect(dipK).toBeLessThan(0);

      const page = await browser.newPage({ viewport: { width, height } });
      const errors = watchPage(page);
      await signIn(page, shop.email);
      // The range comes from the address.
      await page.goto(`${server.baseUrl}${zoneHref(shop.shopId, zone.id)}?range=7d`);
      const detail = page.getByTestId('zone-detail');
      const heading = detail.getByTestId('zone-chart-heading');
      const summary = detail.getByTestId('zone-chart-summary');
      await expect.poll(() => heading.textContent()).toBe('Last 7 days');
      expect(await detail.getByTestId('zone-range-7d').getAttribute('aria-checked')).toBe('true');
      // A week's lowest margin is the dip, in °F (a difference: ×1.8), with its date.
      await expect
        .poll(() => summary.textContent(), { timeout: 10_000 })
        .toMatch(
          new RegExp(
            `^Lowest margin ${formatMargin(dipK, 'F')} in the last 7 days, at \\d+ \\w+ \\d\\d:\\d\\d$`,
          ),
        );
      // The humidity panel under the temperatures.
      const humidity = detail.getByTestId('zone-humidity-chart');
      await humidity.waitFor();
      expect(await humidity.textContent()).toContain('RH %');
      expect(await humidity.textContent()).toContain('wood EMC %');
      await expect
        .poll(() => detail.getByTestId('zone-chart-plot').locator('svg path').count())
        .toBeGreaterThan(2);
      // The page scrolls inside the app's frame: bring the charts into the picture.
      await detail.getByTestId('zone-charts').scrollIntoViewIfNeeded();
      await page.screenshot({ path: `${SHOTS}/zone-history-7d-${label}.png` });

      // The keyboard reads a point: focus the charts, End for the newest, ← for the one before.
      const charts = detail.getByTestId('zone-charts');
      const readout = detail.getByTestId('zone-chart-readout');
      await charts.focus();
      await page.keyboard.press('End');
      const newest = await readout.textContent();
      expect(newest).toMatch(/ · air 64\.4 °F · /); // 18 °C = 64.4 °F
      expect(newest).toMatch(/ · RH 50 % · EMC \d+\.\d %/);
      await page.keyboard.press('ArrowLeft');
      await expect.poll(() => readout.textContent()).not.toBe(newest);
      await page.screenshot({ path: `${SHOTS}/zone-history-readout-${label}.png` });
      expect(await readout.textContent()).toMatch(/^\d+ \w+ \d\d:\d\d · air /);

      // 6 h: no dip, the address follows.
      await detail.getByTestId('zone-range-6h').click();
      await expect.poll(() => heading.textContent()).toBe('Last 6 hours');
      await expect.poll(() => page.url()).toContain('range=6h');
      await expect
        .poll(() => summary.textContent())
        .toMatch(
          new RegExp(`^Lowest margin \\${formatMargin(dryK, 'F')} in the last 6 hours, at `),
        );

      // 30 days: the dip again, in a bucket whose readout gives its low and high margin.
      await detail.getByTestId('zone-range-30d').click();
      await expect.poll(() => heading.textContent()).toBe('Last 30 days');
      await expect
        .poll(() => summary.textContent())
        .toMatch(new RegExp(`^Lowest margin ${formatMargin(dipK, 'F')} in the last 30 days, at `));
      expect(await detail.getByTestId('chart-legend').textContent()).toContain('surface low–high');
      // The page scrolls inside the app's frame: bring the charts into the picture.
      await detail.getByTestId('zone-charts').scrollIntoViewIfNeeded();
      await page.screenshot({ path: `${SHOTS}/zone-history-30d-${label}.png` });

      // Custom: the end before the start is refused in words; a valid span on the shop clock
      // (America/Chicago) shows, from four days ago at midnight to two days ago at midnight.
      await detail.getByTestId('zone-range-custom').click();
      const from = detail.getByTestId('zone-custom-from');
      const to = detail.getByTestId('zone-custom-to');
      const day = (daysAgo: number) =>
        formatInTimeZone(now - daysAgo * 24 * 60 * MINUTE, 'America/Chicago', 'yyyy-MM-dd');
      await from.fill(`${day(2)} 00:00`);
      await to.fill(`${day(4)} 00:00`);
      await detail.getByTestId('zone-custom-show').click();
      expect(await detail.getByTestId('zone-custom-to-error').textContent()).toBe(
        'The end must come after the start.',
      );
      await from.fill(`${day(4)} 00:00`);
      await to.fill(`${day(2)} 00:00`);
      await detail.getByTestId('zone-custom-show').click();
      await expect.poll(() => heading.textContent()).toMatch(/^\d+ \w+ 00:00 – \d+ \w+ 00:00$/);
      await expect
        .poll(() => summary.textContent())
        .toMatch(new RegExp(`^Lowest margin ${formatMargin(dipK, 'F')} in this span, at `));
      // The page scrolls inside the app's frame: bring the charts into the picture.
      await detail.getByTestId('zone-charts').scrollIntoViewIfNeeded();
      await page.screenshot({ path: `${SHOTS}/zone-history-custom-${label}.png` });

      expect(errors).toEqual([]);
      await page.close();
    });

    it('orders by risk, leads lumber with EMC, and fits a new zone’s chart to its hour', async () => {
      const shop = await makeShop();
      const { newBench } = await postStart(shop);
      const page = await browser.newPage({ viewport: { width, height } });
      const errors = watchPage(page);
      await signIn(page, shop.email);
      const strip = page.getByTestId('zone-strip');
      await strip.waitFor();

      // The overview: close first, then dry by margin ascending; the strip counts them in words.
      await expect
        .poll(() => cardNames(page))
        .toEqual(['Lumber rack', 'New bench', 'Machine room', 'Spray booth']);
      expect(await strip.getAttribute('aria-label')).toBe('Zones: 0 wet · 1 close · 3 dry');
      expect(await strip.getByTestId('zone-strip-close').textContent()).toBe('1 close');

      // The lumber card leads with wood EMC against the band of most of the US (6–10 %, Wood
      // Handbook 2010 ch. 13, from memory): 20 °C at 85 % RH gives 18.0 % (eq. 4-5), above it.
      const lumber = page
        .getByTestId('zone-card')
        .filter({ has: page.getByTestId('zone-name').filter({ hasText: 'Lumber rack' }) });
      expect(await lumber.getByTestId('zone-emc-lead').textContent()).toBe('18.0 %');
      expect(await lumber.getByTestId('zone-emc-band').textContent()).toContain(
        'Above the target band',
      );
      expect(await lumber.getByTestId('zone-emc-band').textContent()).toContain('Target 6–10 %');
      expect(await lumber.getByTestId('zone-emc-source').textContent()).toMatch(/Wood Handbook/);
      expect(await lumber.getByTestId('zone-margin').count()).toBe(0);
      // RH 85 % over the rack's 60 % limit: said in words beside the value.
      expect(await lumber.getByTestId('zone-rh-over').textContent()).toBe('▲ Over the 60 % limit');
      // A machine zone still leads with its dew margin, and 50 % is under its 60 % limit.
      const machine = page
        .getByTestId('zone-card')
        .filter({ has: page.getByTestId('zone-name').filter({ hasText: 'Machine room' }) });
      expect(await machine.getByTestId('zone-margin').textContent()).toMatch(/^\+\d+\.\d °F$/);
      expect(await machine.getByTestId('zone-emc-lead').count()).toBe(0);
      expect(await machine.getByTestId('zone-rh-over').count()).toBe(0);
      await page.screenshot({ path: `${SHOTS}/zones-risk-${label}.png`, fullPage: true });

      // A reading that puts the machine room's surface under the dew point: 18 °C / 80 % RH
      // gives a dew point of 14.5 °C; a 13 °C surface is 1.5 K below it, wet.
      const wet = await postReading(server.baseUrl, shop.zones['Machine room']!.token, {
        air: 18,
        rh: 80,
        surface: 13,
      });
      expect(wet.results[0]!.level).toBe('wet');
      await expect
        .poll(() => cardNames(page))
        .toEqual(['Machine room', 'Lumber rack', 'New bench', 'Spray booth']);
      await expect
        .poll(() => strip.getAttribute('aria-label'))
        .toBe('Zones: 1 wet · 1 close · 2 dry');
      expect(await strip.getByTestId('zone-strip-wet').textContent()).toBe('1 wet');
      await page.screenshot({ path: `${SHOTS}/zones-wet-${label}.png`, fullPage: true });

      // The new zone's history: an hour of readings fills the chart's width.
      await page.getByRole('link', { name: /^New bench\b/ }).click();
      await page.waitForURL(new RegExp(`/zones/${shop.zones['New bench']!.id}$`));
      if (wide) {
        // The third card, below the fold once the new page starts at the top: scrolled to.
        const selected = page.getByTestId('zone-list').locator('[aria-current="page"]');
        expect(await selected.getByTestId('zone-name').textContent()).toBe('New bench');
        await expect.poll(() => inView(selected, height)).toBe(true);
      }
      const detail = page.getByTestId('zone-detail');
      const plot = detail.getByTestId('zone-chart-plot');
      await expect
        .poll(() => plot.locator('svg path').count(), { timeout: 10_000 })
        .toBeGreaterThan(2);
      expect(await detail.getByTestId('zone-chart-heading').textContent()).toMatch(
        // The clock names the weekday when the first reading fell on another day in the shop's
        // zone (an hour after local midnight, e.g. 00:08 in Chicago): "…, Wed 23:08".
        /^Since the first reading, (?:(?:Mon|Tue|Wed|Thu|Fri|Sat|Sun) )?\d\d:\d\d$/,
      );
      const fill = await plot.evaluate((element) => {
        const svg = element.querySelector('svg')!;
        const box = svg.getBoundingClientRect();
        // The air line is the path stroked in the air colour (#2C6E91).
        const air = Array.from(svg.querySelectorAll('path')).filter(
          (p) => getComputedStyle(p).stroke === 'rgb(44, 110, 145)',
        );
        const spans = air.map((p) => p.getBoundingClientRect());
        const left = Math.min(...spans.map((r) => r.left));
        const right = Math.max(...spans.map((r) => r.right));
        // The plot area is the svg less its padding (44 px left, 12 px right).
        return { lines: air.length, share: (right - left) / (box.width - 56) };
      });
      expect(fill.lines).toBeGreaterThan(0);
      // The hour runs from the first reading to the fetch; the line covers nearly all of it
      // (a 24 h axis would leave it 1/24 of the width).
      expect(fill.share).toBeGreaterThan(0.9);

      // The summary line: the lowest margin in °F (a difference: ×1.8, no offset) on the shop clock.
      const lowest = Math.min(...newBench.results.map((r) => r.margin));
      const summary = await detail.getByTestId('zone-chart-summary').textContent();
      expect(summary).toMatch(
        new RegExp(
          `^Lowest margin \\${formatMargin(lowest, 'F')} since the first reading, at (?:(?:Mon|Tue|Wed|Thu|Fri|Sat|Sun) )?\\d\\d:\\d\\d$`,
        ),
      );
      // ... which is also the chart's accessible name.
      expect(await plot.getAttribute('aria-label')).toBe(summary);

      // Show values: a table of the newest values, in °F.
      await detail.getByTestId('zone-values-toggle').click();
      const table = detail.getByTestId('zone-values');
      await table.waitFor();
      const rows = table.getByTestId('zone-values-row');
      expect(await rows.count()).toBe(12);
      const newest = newBench.results[newBench.results.length - 1]!;
      const firstRow = await rows.first().locator('[role="cell"]').allTextContents();
      expect(firstRow[3]).toBe(formatMargin(newest.margin, 'F'));
      expect(firstRow[1]).toMatch(/^\d+\.\d °F$/);
      expect(firstRow[2]).toMatch(/^\d+\.\d °F$/);

      // The crosshair's readout names the point's values in °F, on the shop's clock.
      await plot.scrollIntoViewIfNeeded();
      const box = (await plot.boundingBox())!;
      await page.mouse.move(box.x + box.width * 0.6, box.y + box.height / 2);
      const readout = detail.getByTestId('zone-chart-readout');
      await expect
        .poll(() => readout.textContent())
        .toMatch(
          /^(?:(?:Mon|Tue|Wed|Thu|Fri|Sat|Sun) )?\d\d:\d\d · air \d+\.\d °F · surface \d+\.\d °F · dew point \d+\.\d °F · margin \+\d+\.\d °F · RH 55 % · EMC \d+\.\d %$/,
        );
      // Every temperature on the zone's page follows the reader's unit.
      expect(await detail.textContent()).not.toContain('°C');
      await page.screenshot({ path: `${SHOTS}/zone-new-${label}.png`, fullPage: true });

      // The lumber zone's page, and the purpose and region in the shop settings.
      await page.goto(`${server.baseUrl}${zoneHref(shop.shopId, shop.zones['Lumber rack']!.id)}`);
      await page.getByTestId('zone-chart-summary').waitFor();
      await page.screenshot({ path: `${SHOTS}/zone-lumber-${label}.png`, fullPage: true });
      await page.goto(`${server.baseUrl}${shopSectionHref(shop.shopId, 'shop')}`);
      await page.getByTestId('zone-edit-purpose').first().waitFor();
      await page.screenshot({ path: `${SHOTS}/zone-settings-${label}.png`, fullPage: true });
      // The rack's region, chosen in the settings, moves its band: damp warm coast 8–13 %.
      const region = page.getByTestId('zone-edit-region');
      await region.scrollIntoViewIfNeeded();
      await page.getByTestId('zone-edit-region-damp_coastal').click();
      await expect
        .poll(() => page.getByTestId('zone-edit-region-damp_coastal').getAttribute('aria-checked'))
        .toBe('true');
      await page.screenshot({ path: `${SHOTS}/zone-settings-region-${label}.png` });
      await page.goto(`${server.baseUrl}${zoneHref(shop.shopId, shop.zones['Lumber rack']!.id)}`);
      await expect
        .poll(() => page.getByTestId('zone-emc-band').first().textContent())
        .toContain('Target 8–13 % · Damp, warm coast');

      if (wide) {
        // A zone opened by its address at the foot of a long list is scrolled into view there.
        // Eight zones without readings come last (by name), so "Store 8" is the last card.
        let lastId = '';
        for (let n = 1; n <= 8; n += 1) {
          lastId = (await insertZone(server.app.db, shop.shopId, `Store ${n}`)).id;
        }
        await page.goto(`${server.baseUrl}${zoneHref(shop.shopId, lastId)}`);
        const selected = page.getByTestId('zone-list').locator('[aria-current="page"]');
        await selected.waitFor();
        expect(await selected.getByTestId('zone-name').textContent()).toBe('Store 8');
        await expect.poll(() => inView(selected, height)).toBe(true);
        await page.screenshot({ path: `${SHOTS}/zones-scrolled-${label}.png` });
      }

      expect(errors).toEqual([]);
      await page.close();
    });
  },
);
