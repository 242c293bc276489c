// Alarms in °F in Debian's Chromium against the real server, at 390×844 and 1440×900: the owner
// reads °F, a probe posts a wet margin, and every number on the banner, the alarm cards and the
// limits form is in °F (a dew margin difference scales by 1.8, no offset); the phone banner is
// one line that opens the Alarms page; the Alarms entry counts open alarms; a limit typed in °F
// is stored in kelvin and shown in °F again; a browser notification is made for an alarm that
// opens after the person opted in on Profile, and none before.
import type { BrowserContext, Page } from 'playwright-core';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_PASSWORD, DEMO_PEOPLE } from '@/db/seed';

import { MINUTE_MS, withMargin } from '../support/alarms';
import {
  postReading,
  SHOTS,
  signInAs,
  startBrowserSuite,
  watchPage,
  type BrowserSuite,
} from '../support/browser';

let suite: BrowserSuite;
let server: BrowserSuite['server'];
const [owner] = DEMO_PEOPLE;
let agent: ReturnType<typeof request.agent>;

beforeAll(async () => {
  suite = await startBrowserSuite();
  ({ server } = suite);
  agent = request.agent(server.baseUrl);
  await agent
    .post('/api/v1/auth/sign-in')
    .send({ email: owner.email, password: DEMO_PASSWORD })
    .expect(200);
  await agent.patch('/api/v1/me').send({ unitPref: 'F' }).expect(200);
});

afterAll(async () => {
  await agent?.patch('/api/v1/me').send({ unitPref: 'C' });
  await suite?.close();
});

const base = () => `/api/v1/shops/${server.demo.shopId}`;

/** A new zone with its own probe; a rerun on the same database numbers the name. */
async function zoneWithSensor(wanted: string) {
  const existing = (await agent.get(`${base()}/zones`).expect(200)).body.zones as {
    name: string;
  }[];
  const taken = existing.filter((z) => z.name.startsWith(wanted)).length;
  const name = taken === 0 ? wanted : `${wanted} ${taken + 1}`;
  const zone = await agent.post(`${base()}/zones`).send({ name }).expect(201);
  const sensor = await agent
    .post(`${base()}/sensors`)
    .send({ name: `${name} probe`, zoneId: zone.body.id })
    .expect(201);
  return { name, zoneId: zone.body.id as string, token: sensor.body.token as string };
}

/** Three readings −2.7 K a minute apart: the third confirms wet (3 readings, ingest/hysteresis.ts). */
async function makeWet(token: string) {
  const nowMs = Date.now();
  for (const i of [2, 1, 0]) {
    await postReading(server.baseUrl, token, withMargin(nowMs - i * MINUTE_MS, -2.7));
  }
}

// Records each Notification the page constructs: the real browser API, wrapped, not our code.
const RECORD_NOTIFICATIONS = `(() => {
  const Real = window.Notification;
  if (!Real) return;
  window.__notifications = [];
  function Recorded(title, options) {
    window.__notifications.push({ title, body: options && options.body });
    const made = new Real(title, options);
    (window.__made = window.__made || []).push(made);
    return made;
  }
  Object.defineProperty(Recorded, 'permission', { get: () => Real.permission });
  Recorded.requestPermission = (...args) => Real.requestPermission(...args);
  Recorded.prototype = Real.prototype;
  window.Notification = Recorded;
})();`;

const notifications = (page: Page) =>
  page.evaluate(
    () =>
      (window as unknown as { __notifications: { title: string; body: string }[] }).__notifications,
  );

describe.each([
  { label: 'phone', width: 390, height: 844, zone: 'Spray booth', second: 'Planer bay' },
  { label: 'wide', width: 1440, height: 900, zone: 'Drill press nook', second: 'Router table' },
])(
  'alarms in °F on a $label screen ($width×$height)',
  ({ label, width, height, zone: wanted, second }) => {
    let context: BrowserContext;
    afterAll(() => context?.close());

    it('shows °F everywhere, a one-line phone banner, the count, the limits round trip and notifications', async () => {
      context = await suite.browser.newContext({ viewport: { width, height } });
      await context.grantPermissions(['notifications'], { origin: server.baseUrl });
      await context.addInitScript(RECORD_NOTIFICATIONS);
      const page = await context.newPage();
      const errors = watchPage(page);
      const first = await zoneWithSensor(wanted);
      await signInAs(page, server.baseUrl, owner.email);
      await expect.poll(() => page.getByTestId('live-status').textContent()).toContain('live');

      // An alarm before opting in: no notification.
      await makeWet(first.token);
      const banner = page.getByTestId('alarm-banner');
      await expect.poll(() => banner.count()).toBe(1);
      const openCount = async () =>
        (await agent.get(`${base()}/alarms?state=open`).expect(200)).body.alarms.length as number;
      await expect
        .poll(async () =>
          page.getByRole('link', { name: `Alarms ${await openCount()} open` }).count(),
        )
        .toBe(1);
      expect(await notifications(page)).toEqual([]);

      const bannerText = (await banner.textContent()) ?? '';
      expect(bannerText).not.toContain('°C');
      if (label === 'phone') {
        // One line: "N alarms — <worst> …", no taller than a line plus its padding.
        const line = await page.getByTestId('alarm-banner-line').textContent();
        expect(line).toMatch(/^\d+ alarms? — .+/);
        const box = await banner.boundingBox();
        expect(box!.height).toBeLessThan(60);
      } else {
        const item = banner.getByTestId('alarm-banner-item').filter({ hasText: first.name });
        // −2.7 K × 1.8 = −4.86 °F; the wet limit 1 K + band 0.5 K = 1.5 K = 2.7 °F.
        await expect.poll(() => item.first().textContent()).toContain('worst margin -4.9 °F');
        expect(await item.first().textContent()).toContain(
          'Clears when the margin stays above 2.7 °F',
        );
      }
      await page.screenshot({ path: `${SHOTS}/alarms-units-banner-${label}.png` });

      // The Alarms page: every card's numbers in °F.
      await page.getByTestId('alarm-banner-all').click();
      await page.waitForURL(/\/alarms$/);
      const open = page.getByTestId('alarms-open');
      const card = open.getByTestId('alarm-card').filter({ hasText: `${first.name}: wet` });
      await expect.poll(() => card.count()).toBe(1);
      const cardText = (await card.textContent()) ?? '';
      expect(cardText).toContain('Wet · Wet surface');
      expect(cardText).toContain('worst margin -4.9 °F');
      expect(cardText).toContain('Clears when the dew margin stays above 2.7 °F');
      expect(await open.textContent()).not.toContain('°C');
      await page.screenshot({ path: `${SHOTS}/alarms-units-page-${label}.png`, fullPage: true });

      // Opt in on Profile (the permission is granted to the context; the request runs in the tap).
      await page.getByTestId('nav-profile').click();
      await page.getByTestId('profile-notify').click();
      await expect
        .poll(() => page.getByTestId('profile-notify-status').textContent())
        .toContain('On in this browser');
      await page.screenshot({ path: `${SHOTS}/alarms-units-profile-${label}.png`, fullPage: true });
      expect(await notifications(page)).toEqual([]);

      // New alarms after opting in: a notification each (dew risk may open first, then wet
      // surface on the third reading), their words in °F.
      const next = await zoneWithSensor(second);
      await makeWet(next.token);
      const wetNote = async () =>
        (await notifications(page)).find((n) => n.title.startsWith('Wet surface — '));
      await expect.poll(wetNote).toBeDefined();
      expect((await wetNote())!.body).toBe(`${next.name}: wet, margin -4.9 °F`);
      for (const n of await notifications(page)) {
        expect(n.body).toContain(next.name);
        expect(n.body).not.toContain('°C');
      }

      // A tap on the notification (its click handler, as the browser would run it) opens the
      // Alarms page with that alarm in view and marked.
      await page.evaluate(() => {
        const made = (window as unknown as { __made: Notification[] }).__made;
        const wetOne = made.find((n) => n.title.startsWith('Wet surface — '))!;
        wetOne.onclick!(new Event('click'));
      });
      await page.waitForURL(/\/alarms\?alarm=/);
      const focused = page.locator('[data-testid="alarm-card"][aria-current="true"]');
      await expect.poll(() => focused.textContent()).toContain(`${next.name}: wet`);
      await page.screenshot({ path: `${SHOTS}/alarms-units-focused-${label}.png` });

      // The limits form: labelled as dew-margin differences, °F only, and a round trip.
      await page.getByTestId('nav-shop').click();
      const names = page.getByTestId('zone-edit-name');
      await expect.poll(() => names.count()).toBeGreaterThan(0);
      const values = await names.evaluateAll((els) =>
        els.map((e) => (e as HTMLInputElement).value),
      );
      const i = values.indexOf(first.name);
      expect(i).toBeGreaterThanOrEqual(0);
      const settings = page.getByTestId('zone-settings');
      expect(await settings.textContent()).not.toContain('°C');
      expect(await settings.textContent()).toContain(
        'Caution when the dew margin is below (°F difference)',
      );
      const caution = page.getByTestId('zone-edit-caution').nth(i);
      expect(await caution.inputValue()).toBe('5.4'); // 3 K × 1.8
      await caution.fill('7.2');
      await page.getByTestId('zone-edit-submit').nth(i).click();
      await expect
        .poll(async () => {
          const zones = (await agent.get(`${base()}/zones`).expect(200)).body.zones as {
            id: string;
            cautionK: number;
          }[];
          return zones.find((z) => z.id === first.zoneId)?.cautionK;
        })
        .toBeCloseTo(4, 9); // 7.2 °F ÷ 1.8 = 4 K, no 32 °F offset
      await page.reload();
      await expect
        .poll(() => page.getByTestId('zone-edit-caution').nth(i).inputValue())
        .toBe('7.2');
      await page.screenshot({ path: `${SHOTS}/alarms-units-limits-${label}.png`, fullPage: true });
      expect(errors).toEqual([]);
    });
  },
);
