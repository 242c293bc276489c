// Setting up a sensor as a new shop owner would, in Debian's Chromium against the real server,
// in °F: the only zone is chosen for her, the token screen says what to send and how often, the
// example it gives leaves the zone dry, and "first reading received" appears live when the
// sensor posts. A misspelt field is refused with unknown_field; a zone whose sensor went quiet
// for three of its intervals is greyed (the reading's time is set back, not waited for).
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEFAULT_LIMITS, deriveReading, fToC } from '@/ingest';

import {
  openInApp,
  SHOTS,
  startBrowserSuite,
  watchPage,
  type BrowserSuite,
} from '../support/browser';
import { verifiedPerson } from '../support/app';

let suite: BrowserSuite;
let server: BrowserSuite['server'];

beforeAll(async () => {
  suite = await startBrowserSuite();
  server = suite.server;
});
afterAll(() => suite?.close());

/** A new owner with °F chosen and a shop of one zone, made through the API. */
async function ownerWithOneZone() {
  const person = await verifiedPerson(
    { app: server.baseUrl, outbox: server.app.outbox },
    'Ana Planer',
  );
  await person.agent.patch('/api/v1/me').send({ unitPref: 'F' }).expect(200);
  const shop = (
    await person.agent
      .post('/api/v1/shops')
      .send({ name: 'Cedar Loft Joinery', timeZone: 'America/Chicago' })
      .expect(201)
  ).body as { id: string };
  const zone = (
    await person.agent
      .post(`/api/v1/shops/${shop.id}/zones`)
      .send({ name: 'Machine room' })
      .expect(201)
  ).body as { id: string };
  return { ...person, shopId: shop.id, zoneId: zone.id };
}

async function signIn(page: Page, email: string, password: string) {
  await page.goto(`${server.baseUrl}/sign-in`);
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(password);
  await page.getByTestId('sign-in-submit').click();
  await page.waitForURL(/\/shops\/[0-9a-f-]+/);
}

interface IngestReply {
  results: { level: string; margin: number }[];
  error: { code: string; message: string; details: { path: string }[] };
}

async function ingest(token: string, body: unknown) {
  const res = await fetch(`${server.baseUrl}/api/v1/ingest`, {
    method: 'POST',
    headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
    body: JSON.stringify(body),
  });
  return { status: res.status, body: (await res.json()) as IngestReply };
}

/** The element's box lies inside the other's (1 px slack for borders). */
async function inside(page: Page, inner: string, outer: string) {
  const [a, b] = await Promise.all([
    page.locator(inner).first().boundingBox(),
    page.locator(outer).first().boundingBox(),
  ]);
  expect(a && b).toBeTruthy();
  expect(a!.x).toBeGreaterThanOrEqual(b!.x - 1);
  expect(a!.x + a!.width).toBeLessThanOrEqual(b!.x + b!.width + 1);
}

describe.each([
  { label: 'phone', width: 390, height: 844 },
  { label: 'wide', width: 1440, height: 900 },
])('sensor set-up on a $label screen ($width×$height)', ({ label, width, height }) => {
  it('from a new sensor to its first reading, live, in °F', async () => {
    const owner = await ownerWithOneZone();
    const page = await suite.browser.newPage({ viewport: { width, height } });
    const errors = watchPage(page);
    await signIn(page, owner.email, owner.password);
    await page.goto(`${server.baseUrl}/shops/${owner.shopId}/sensors`);

    // The only zone is already chosen.
    const zoneChoice = page.getByTestId(`sensor-create-zone-${owner.zoneId}`);
    await expect.poll(() => zoneChoice.getAttribute('aria-checked')).toBe('true');
    await page.getByTestId('sensor-create-name').fill('Saw-top probe');
    await page.getByTestId('sensor-create-submit').click();

    // The token screen: fields with units and ranges (°F, from the contract's −60…85 °C), the
    // interval, an example.
    const reveal = page.getByTestId('token-reveal');
    await reveal.waitFor();
    const fields = reveal.getByTestId('token-fields');
    for (const field of ['air', 'rh', 'surface', 'battery', 'at', 'unit']) {
      expect(await fields.getByTestId(`token-field-${field}`).count()).toBe(1);
    }
    expect(await fields.getByTestId('token-field-air').textContent()).toContain('°F');
    expect(await fields.getByTestId('token-field-air').textContent()).toContain('-76 to 185');
    expect(await fields.getByTestId('token-field-rh').textContent()).toContain('0 to 100');
    expect(await reveal.getByTestId('token-interval').textContent()).toContain('every 1–5 minutes');
    expect(await reveal.getByTestId('first-reading').textContent()).toContain('Waiting');
    await page.screenshot({ path: `${SHOTS}/sensor-token-${label}.png`, fullPage: true });

    // Post the example exactly as the screen gives it.
    const token = (await reveal.getByTestId('sensor-token').textContent())!.trim();
    const curl = (await reveal.getByTestId('sensor-curl').textContent())!;
    const example = JSON.parse(/-d '(.*)'/.exec(curl)![1]!) as Record<string, number | string>;
    expect(example.unit).toBe('F');
    // The project's own derive code on the example's values: dry under the default limits.
    const derived = deriveReading({
      airC: fToC(Number(example.air)),
      rhPct: Number(example.rh),
      surfaceC: fToC(Number(example.surface)),
    });
    expect(derived.level).toBe('dry');
    const posted = await ingest(token, example);
    expect(posted.status).toBe(202);
    expect(posted.body.results[0]!.level).toBe('dry');
    expect(posted.body.results[0]!.margin).toBeGreaterThan(DEFAULT_LIMITS.cautionK);

    // Live, without a reload.
    const first = reveal.getByTestId('first-reading');
    await expect
      .poll(() => first.textContent(), { timeout: 5_000, interval: 100 })
      .toContain('First reading received');
    const level = await first.getByTestId('first-reading-level').textContent();
    expect(level).toContain('dry');
    expect(level).toContain('°F');
    await first.scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${SHOTS}/sensor-first-reading-${label}.png` });

    // A misspelt field is refused, named, and stores nothing.
    const typo = await ingest(token, { unit: 'F', air: 60, rh: 80, surfce: 41 });
    expect(typo.status).toBe(400);
    expect(typo.body.error).toMatchObject({
      code: 'unknown_field',
      details: [{ path: 'surfce' }],
    });
    expect(typo.body.error.message).toContain('"surfce"');

    // Buttons say which sensor they act on; the revoke question stays on its card.
    await reveal.getByTestId('token-done').click();
    const card = page.getByTestId('sensor-card');
    await card.waitFor();
    // The page's layout: on a wide screen the ways in stand beside the sensor list (a second
    // column, not a narrow column with empty sides); on a phone, one column, after it.
    const listBox = (await page.getByTestId('sensor-list').boundingBox())!;
    const waysBox = (await page.getByTestId('sensor-ways-in').boundingBox())!;
    if (label === 'wide') {
      expect(waysBox.x).toBeGreaterThan(listBox.x + listBox.width);
      expect(Math.abs(waysBox.y - listBox.y)).toBeLessThan(2);
      // The two take the content width, well past the 640 px phone column the page had.
      expect(waysBox.x + waysBox.width - listBox.x).toBeGreaterThan(900);
    } else {
      expect(waysBox.y).toBeGreaterThan(listBox.y + listBox.height);
      expect(Math.abs(waysBox.x - listBox.x)).toBeLessThan(1);
    }
    await page.screenshot({ path: `${SHOTS}/sensors-${label}.png`, fullPage: true });
    expect(await page.getByRole('button', { name: 'New token for Saw-top probe' }).count()).toBe(1);
    expect(
      await page.getByRole('button', { name: 'Revoke the token of Saw-top probe' }).count(),
    ).toBe(1);
    expect(await page.getByRole('button', { name: 'Remove Saw-top probe' }).count()).toBe(1);
    await page.getByRole('button', { name: 'Revoke the token of Saw-top probe' }).click();
    await page.getByTestId('sensor-revoke-confirm').waitFor();
    await inside(page, '[data-testid="sensor-revoke-confirm"]', '[data-testid="sensor-card"]');
    const question = page.getByRole('group', { name: /Revoke Saw-top probe/ });
    await inside(page, '[role="group"][aria-label^="Revoke"]', '[data-testid="sensor-card"]');
    expect(await question.count()).toBe(1);
    await page.screenshot({ path: `${SHOTS}/sensor-revoke-${label}.png`, fullPage: true });
    await page.getByRole('button', { name: 'Cancel' }).click();
    expect(errors).toEqual([]);
    await page.close();
  });

  it('greys a zone whose sensor has been quiet for three of its intervals', async () => {
    const owner = await ownerWithOneZone();
    const sensors = `/api/v1/shops/${owner.shopId}/sensors`;
    const sensor = (
      await owner.agent
        .post(sensors)
        .send({ name: 'Saw-top probe', zoneId: owner.zoneId })
        .expect(201)
    ).body as { id: string; token: string };
    const paint = (
      await owner.agent
        .post(`/api/v1/shops/${owner.shopId}/zones`)
        .send({ name: 'Paint bay' })
        .expect(201)
    ).body as { id: string };
    const quiet = (
      await owner.agent.post(sensors).send({ name: 'Booth probe', zoneId: paint.id }).expect(201)
    ).body as { id: string; token: string };
    // Posts every minute, says its owner: silent after 3 min. Its last reading is 4 min old.
    await owner.agent.patch(`${sensors}/${quiet.id}`).send({ expectedIntervalS: 60 }).expect(200);
    const fourMinAgo = new Date(Date.now() - 4 * 60_000).toISOString();
    expect(
      (await ingest(quiet.token, { at: fourMinAgo, air: 18, rh: 50, surface: 17 })).status,
    ).toBe(202);
    expect((await ingest(sensor.token, { air: 18, rh: 50, surface: 17 })).status).toBe(202);

    const page = await suite.browser.newPage({ viewport: { width, height } });
    const errors = watchPage(page);
    await signIn(page, owner.email, owner.password);
    await openInApp(page, `${server.baseUrl}/shops/${owner.shopId}`);
    const cardOf = (name: string) =>
      page
        .getByTestId('zone-card')
        .filter({ has: page.getByTestId('zone-name').filter({ hasText: name }) })
        .first();
    await cardOf('Paint bay').getByTestId('zone-stale').waitFor();
    expect(await cardOf('Paint bay').getByTestId('zone-last-seen').textContent()).toBe(
      'Last reading 4 min ago',
    );
    expect(await cardOf('Paint bay').getByTestId('zone-level').textContent()).toContain('Unknown');
    // Greyed with the stale palette (theme.ts staleColors.card), not by fading the text.
    const background = (name: string) =>
      cardOf(name).evaluate((el) => getComputedStyle(el).backgroundColor);
    expect(await background('Paint bay')).toBe('rgb(240, 238, 233)');
    expect(await cardOf('Paint bay').evaluate((el) => getComputedStyle(el).opacity)).toBe('1');
    // The zone whose sensor just posted keeps its colours.
    expect(await cardOf('Machine room').getByTestId('zone-stale').count()).toBe(0);
    expect(await background('Machine room')).toBe('rgb(255, 253, 248)');
    expect(await cardOf('Machine room').getByTestId('zone-level').textContent()).toContain('Dry');
    await page.screenshot({ path: `${SHOTS}/zone-stale-${label}.png`, fullPage: true });
    await cardOf('Paint bay').scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${SHOTS}/zone-stale-card-${label}.png` });
    expect(errors).toEqual([]);
    await page.close();
  });
});
