// Every screen in Debian's Chromium against the real server, for people who do not use a mouse
// or see the screen as its makers do: axe-core (WCAG 2.x A/AA rules) finds no serious or critical
// violation, each screen has one h1, every control is at least 44×44 px on a phone, nothing runs
// past the viewport or out of its card at 390 px, and a person signs in, reaches the Alarms page
// and acknowledges an alarm with the keyboard alone. Screens are walked from a list of routes, so
// a screen that changes keeps being checked without selectors of its own here.
import AxeBuilder from '@axe-core/playwright';
import type { BrowserContext, Page } from 'playwright-core';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_PASSWORD, DEMO_PEOPLE } from '@/db/seed';
import type { AlarmsResponse } from '@/ingest/wire/alarms';

import { MINUTE_MS, withMargin } from '../support/alarms';
import {
  postReading,
  SHOTS,
  startBrowserSuite,
  watchPage,
  type BrowserSuite,
} from '../support/browser';

let suite: BrowserSuite;
const [owner, member] = DEMO_PEOPLE;
/** Set up once: the demo shop's first zone and a pending invitation with a long address. */
let trialId = '';
let surfaceId = '';
let sensorId = '';
let zoneId: string;
const LONG_INVITEE = 'ana.maria.oyelaran.vasquez@cedarloftjoinery.example';

async function ownerAgent() {
  const agent = request.agent(suite.server.baseUrl);
  await agent
    .post('/api/v1/auth/sign-in')
    .send({ email: owner.email, password: DEMO_PASSWORD })
    .expect(200);
  return agent;
}
type Agent = Awaited<ReturnType<typeof ownerAgent>>;

// A trial with one ranked test, so its screen shows the standings and a rank form (a rerun
// finds it there).
async function demoTrial(agent: Agent, base: string) {
  const trials = (await agent.get(`${base}/trials`).expect(200)).body.trials as { id: string }[];
  if (trials[0]) return trials[0].id;
  const trial = (
    await agent
      .post(`${base}/trials`)
      .send({ name: 'Saw table waxes', treatments: ['Paste wax', 'Bare iron'] })
      .expect(201)
  ).body as { id: string; treatments: { id: string }[] };
  const trialId = trial.id;
  const test = (
    await agent
      .post(`${base}/trials/${trialId}/tests`)
      .send({
        name: 'Wet rag night',
        kind: 'condensation',
        from: '2026-03-02T18:00:00Z',
        to: '2026-03-03T07:00:00Z',
      })
      .expect(201)
  ).body as { id: string };
  await agent
    .put(`${base}/trials/${trialId}/tests/${test.id}/ranks`)
    .send({ ranks: trial.treatments.map((t, i) => ({ treatmentId: t.id, rank: i + 1 })) })
    .expect(200);
  return trialId;
}

// A surface with a coat and an inspection, so the care pages show a state, the chart's marks and
// the log (a rerun finds it there).
async function demoSurface(agent: Agent, base: string, zoneId: string) {
  const surfaces = (await agent.get(`${base}/surfaces`).expect(200)).body.surfaces as {
    id: string;
  }[];
  if (surfaces[0]) return surfaces[0].id;
  const surface = (
    await agent
      .post(`${base}/surfaces`)
      .send({ name: 'Jointer beds', zoneId, material: 'Cast iron' })
      .expect(201)
  ).body as { id: string };
  const hourAgo = new Date(Date.now() - 3_600_000).toISOString();
  await agent
    .post(`${base}/surfaces/${surface.id}/care`)
    .send({ kind: 'coating', at: hourAgo, coating: { type: 'dry_film' }, note: 'Both beds' })
    .expect(201);
  await agent
    .post(`${base}/surfaces/${surface.id}/care`)
    .send({ kind: 'inspection', at: new Date().toISOString(), rusting: 0 })
    .expect(201);
  return surface.id;
}

/**
 * A zone of its own whose surface is wet: three readings under the dew point confirm the level
 * (ingest/hysteresis.ts), and the alarm engine opens its alarm just after they are stored.
 */
async function wetZone(agent: Agent, base: string, name: string): Promise<string> {
  const zone = await agent.post(`${base}/zones`).send({ name }).expect(201);
  const sensor = await agent
    .post(`${base}/sensors`)
    .send({ name: `${name} probe`, zoneId: zone.body.id })
    .expect(201);
  const nowMs = Date.now();
  for (const back of [2, 1, 0])
    await postReading(
      suite.server.baseUrl,
      sensor.body.token as string,
      withMargin(nowMs - back * MINUTE_MS, -1.2),
    );
  return zone.body.id as string;
}

// An open alarm, so every screen is checked with the frame a wet shop shows: the alarm banner and
// the count on the Alarms entry (a rerun finds it open).
async function openAlarm(agent: Agent, base: string) {
  const zones = (await agent.get(`${base}/zones`).expect(200)).body.zones as { name: string }[];
  if (zones.some((z) => z.name === WET_ZONE)) return;
  const zoneId = await wetZone(agent, base, WET_ZONE);
  // The alarm engine judges the readings just after they are stored (within a second).
  const openHere = async () =>
    ((await agent.get(`${base}/alarms`).expect(200)).body as AlarmsResponse).alarms.filter(
      (a) => a.zone.id === zoneId,
    ).length;
  const untilMs = Date.now() + 5000;
  while ((await openHere()) === 0 && Date.now() < untilMs)
    await new Promise((resolve) => setTimeout(resolve, 100));
  expect(await openHere()).toBeGreaterThan(0);
}
const WET_ZONE = 'Outfeed bench';

beforeAll(async () => {
  suite = await startBrowserSuite();
  const agent = await ownerAgent();
  const base = `/api/v1/shops/${suite.server.demo.shopId}`;
  const zones = (await agent.get(`${base}/zones`).expect(200)).body.zones as { id: string }[];
  zoneId = zones[0]!.id;
  // A pending invitation, so the members screen shows its "Withdraw" (a rerun finds it there).
  const res = await agent.post(`${base}/invitations`).send({ email: LONG_INVITEE, role: 'member' });
  expect([201, 409]).toContain(res.status);
  trialId = await demoTrial(agent, base);
  surfaceId = await demoSurface(agent, base, zoneId);
  await openAlarm(agent, base);
  sensorId = ((await agent.get(`${base}/sensors`).expect(200)).body.sensors as { id: string }[])[0]!
    .id;
});
afterAll(() => suite?.close());

const SIZES = [
  { label: 'phone', width: 390, height: 844 },
  { label: 'wide', width: 1440, height: 900 },
] as const;

interface Route {
  name: string;
  path: () => string;
}
const shop = () => `/shops/${suite.server.demo.shopId}`;
const SIGNED_OUT: Route[] = [
  { name: 'landing', path: () => '/' },
  { name: 'sign-in', path: () => '/sign-in' },
  { name: 'sign-up', path: () => '/sign-up' },
  { name: 'forgot-password', path: () => '/forgot-password' },
  { name: 'not-found', path: () => '/no-such-page' },
];
const SIGNED_IN: Route[] = [
  { name: 'overview', path: () => shop() },
  { name: 'zone', path: () => `${shop()}/zones/${zoneId}` },
  // The history's week span and its custom-span fields (opened by the address).
  { name: 'zone-week', path: () => `${shop()}/zones/${zoneId}?range=7d` },
  { name: 'zone-custom', path: () => `${shop()}/zones/${zoneId}?range=custom` },
  { name: 'alarms', path: () => `${shop()}/alarms` },
  { name: 'report', path: () => `${shop()}/report` },
  { name: 'sensors', path: () => `${shop()}/sensors` },
  // One sensor: its facts, the logger-file import and its past imports.
  { name: 'sensor', path: () => `${shop()}/sensors/${sensorId}` },
  { name: 'members', path: () => `${shop()}/members` },
  { name: 'settings', path: () => `${shop()}/settings` },
  { name: 'profile', path: () => `${shop()}/profile` },
  { name: 'trials', path: () => `${shop()}/trials` },
  { name: 'trial', path: () => `${shop()}/trials/${trialId}` },
  { name: 'care', path: () => `${shop()}/care` },
  { name: 'surface', path: () => `${shop()}/care/${surfaceId}` },
  { name: 'new-shop', path: () => '/new-shop' },
  { name: 'shop-not-found', path: () => '/shops/00000000-0000-4000-8000-000000000000' },
];

/**
 * Opens a route and waits until the app has drawn it: fonts in, no request in flight, the
 * screen's h1 there (every screen has one; without it the heading check says so) and nothing
 * still "Loading…". The app first paints a blank splash, which must not count as drawn.
 */
async function open(page: Page, path: string) {
  const t0 = Date.now();
  await page.goto(`${suite.server.baseUrl}${path}`);
  await page.waitForLoadState('networkidle');
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
  const drawn = () =>
    page.evaluate(
      () =>
        document.querySelector('h1') !== null &&
        !Array.from(document.querySelectorAll('body *')).some(
          (el) => el.childElementCount === 0 && /^Loading/.test(el.textContent ?? ''),
        ),
    );
  while (!(await drawn()) && Date.now() - t0 < 15_000) await page.waitForTimeout(100);
  if (process.env.ACCESS_TIMING) console.log(`${path}: open ${Date.now() - t0} ms`);
}

/** axe-core's serious and critical findings, one line each: rule id and the elements at fault. */
async function axeProblems(page: Page): Promise<string[]> {
  const result = await new AxeBuilder({ page }).analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `axe ${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

/**
 * The page's level-1 headings: exactly one, the screen's own title — a heading holding the
 * header's controls (the shop switcher, "Sign out") is the whole top bar, not a title.
 */
async function headingProblems(page: Page): Promise<string[]> {
  const h1s = await page.locator('h1').evaluateAll((els) =>
    els.map((el) => ({
      text: (el.textContent ?? '').trim(),
      controls: el.querySelectorAll('a, button, input, [role="button"], [role="link"]').length,
    })),
  );
  const problems = h1s.length === 1 ? [] : [`${h1s.length} h1 elements: ${JSON.stringify(h1s)}`];
  for (const h1 of h1s)
    if (h1.controls > 0) problems.push(`the h1 "${h1.text}" holds ${h1.controls} controls`);
  return problems;
}

// WCAG 2.2 SC 2.5.5 Target Size (Enhanced, AAA): 44 × 44 CSS px; Apple's Human Interface
// Guidelines ask for 44 × 44 pt as well. A link inside a sentence is the SC's "inline" exception.
const MIN_TARGET_PX = 44;

/** Every control smaller than 44 × 44 px, named so a person can find it. */
async function targetProblems(page: Page): Promise<string[]> {
  return page.evaluate((minPx) => {
    const selector = [
      'a[href]',
      'button',
      'input:not([type="hidden"])',
      'select',
      'textarea',
      '[role="button"]',
      '[role="link"]',
      '[role="tab"]',
      '[role="menuitem"]',
      '[role="switch"]',
      '[role="radio"]',
      '[role="checkbox"]',
      '[role="option"]',
    ].join(',');
    const out: string[] = [];
    for (const el of Array.from(document.querySelectorAll<HTMLElement>(selector))) {
      const rect = el.getBoundingClientRect();
      if (rect.width === 0 && rect.height === 0) continue; // not shown
      if (el.closest('[aria-hidden="true"]')) continue;
      const style = getComputedStyle(el);
      if (style.visibility === 'hidden' || style.display === 'none') continue;
      const parentText = el.parentElement?.textContent ?? '';
      const inline = style.display === 'inline' && parentText.trim() !== el.textContent?.trim();
      if (inline) continue;
      if (rect.width + 0.5 < minPx || rect.height + 0.5 < minPx) {
        const name = el.getAttribute('aria-label') ?? el.textContent?.trim().slice(0, 40) ?? '';
        out.push(
          `target ${Math.round(rect.width)}×${Math.round(rect.height)} px: <${el.tagName.toLowerCase()}> "${name}"`,
        );
      }
    }
    return out;
  }, MIN_TARGET_PX);
}

/**
 * Everything whose right edge passes the viewport's, or its card's (the nearest box with a
 * rounded border), by more than a pixel: text or buttons running off. Content inside a box that
 * scrolls sideways on purpose is left out.
 */
async function overflowProblems(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const viewportPx = document.documentElement.clientWidth;
    const out = new Set<string>();
    const describe = (el: Element) =>
      `<${el.tagName.toLowerCase()}${el.getAttribute('data-testid') ? ` ${el.getAttribute('data-testid')}` : ''}> "${(el.textContent ?? '').trim().slice(0, 40)}"`;
    const isCard = (el: Element) => {
      const s = getComputedStyle(el);
      return parseFloat(s.borderTopLeftRadius) >= 8 && parseFloat(s.borderTopWidth) >= 1;
    };
    for (const el of Array.from(document.body.querySelectorAll('*'))) {
      const rect = el.getBoundingClientRect();
      if (rect.width === 0 || rect.height === 0) continue;
      let scrolled = false;
      let card: Element | null = null;
      for (let a = el.parentElement; a && a !== document.body; a = a.parentElement) {
        const s = getComputedStyle(a);
        if ((s.overflowX === 'auto' || s.overflowX === 'scroll') && a.scrollWidth > a.clientWidth)
          scrolled = true;
        if (!card && isCard(a)) card = a;
      }
      if (scrolled) continue;
      if (rect.right > viewportPx + 1)
        out.add(`past the viewport (${viewportPx} px): ${describe(el)}`);
      if (card && rect.right > card.getBoundingClientRect().right + 1)
        out.add(`out of its card: ${describe(el)}`);
    }
    return [...out];
  });
}

/**
 * Tabs through the screen's first controls and checks each draws the focus ring: a solid
 * outline of at least 2 px (WCAG 2.2 SC 2.4.13; the colours are checked in
 * tests/components/focusRing.test.ts).
 */
async function focusRingProblems(page: Page, presses = 30): Promise<string[]> {
  const out = new Set<string>();
  await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
  for (let i = 0; i < presses; i++) {
    await page.keyboard.press('Tab');
    const seen = await page.evaluate(() => {
      const el = document.activeElement;
      if (!el || el === document.body) return null;
      const s = getComputedStyle(el);
      const name = el.getAttribute('aria-label') ?? (el.textContent ?? '').trim().slice(0, 40);
      return { name, tag: el.tagName.toLowerCase(), style: s.outlineStyle, width: s.outlineWidth };
    });
    if (!seen) continue;
    if (seen.style !== 'solid' || parseFloat(seen.width) < 2)
      out.add(`no focus ring (${seen.style} ${seen.width}): <${seen.tag}> "${seen.name}"`);
  }
  return [...out];
}

/**
 * The screen as it opens and, when its column scrolls, scrolled to the end: the page scrolls
 * inside the app's own scroll view, which a full-page screenshot does not unroll.
 */
async function shot(page: Page, name: string) {
  await page.screenshot({ path: `${SHOTS}/access-${name}.png` });
  const scrolled = await page.evaluate(() => {
    const boxes = Array.from(document.querySelectorAll<HTMLElement>('*')).filter(
      (el) => el.scrollHeight > el.clientHeight + 4 && getComputedStyle(el).overflowY === 'auto',
    );
    for (const box of boxes) box.scrollTop = box.scrollHeight;
    return boxes.length > 0;
  });
  if (!scrolled) return;
  await page.screenshot({ path: `${SHOTS}/access-${name}-end.png` });
  await page.evaluate(() => {
    for (const el of Array.from(document.querySelectorAll<HTMLElement>('*'))) el.scrollTop = 0;
  });
}

/** Presses the first button of each confirmation on the screen, so its question is checked too. */
async function openConfirmations(page: Page): Promise<number> {
  const starters = page.getByRole('button', { name: /^(Revoke|Withdraw|Remove)\b/ });
  const count = await starters.count();
  if (count > 0) await starters.first().click();
  return count;
}

async function checkScreen(page: Page, name: string, phone: boolean): Promise<string[]> {
  const t0 = Date.now();
  const problems = [...(await axeProblems(page)), ...(await headingProblems(page))];
  if (phone)
    problems.push(
      ...(await targetProblems(page)),
      ...(await overflowProblems(page)),
      ...(await focusRingProblems(page)),
    );
  if (process.env.ACCESS_TIMING) console.log(`${name}: checks ${Date.now() - t0} ms`);
  // Printed whole: an assertion's diff would cut a long list short.
  if (problems.length > 0) console.log(problems.map((p) => `${name}: ${p}`).join('\n'));
  return problems.map((p) => `${name}: ${p}`);
}

describe.each(SIZES)('every screen on a $label screen ($width×$height)', (size) => {
  const phone = size.width < 600;
  let signedOut: BrowserContext;
  let signedIn: BrowserContext;

  beforeAll(async () => {
    signedOut = await suite.browser.newContext({ viewport: size });
    signedIn = await suite.browser.newContext({ viewport: size });
    const page = await signedIn.newPage();
    await page.goto(`${suite.server.baseUrl}/sign-in`);
    await page.getByTestId('sign-in-email').fill(owner.email);
    await page.getByTestId('sign-in-password').fill(DEMO_PASSWORD);
    await page.getByTestId('sign-in-submit').click();
    await page.waitForURL(/\/shops\/[0-9a-f-]+/);
    await page.close();
  });
  afterAll(async () => {
    await signedOut?.close();
    await signedIn?.close();
  });

  it.each(SIGNED_OUT)('signed out: $name', async (route) => {
    const page = await signedOut.newPage();
    const errors = watchPage(page);
    await open(page, route.path());
    await shot(page, `${route.name}-${size.label}`);
    const problems = await checkScreen(page, route.name, phone);
    expect(problems, problems.join('\n')).toEqual([]);
    expect(errors).toEqual([]);
    await page.close();
  });

  it.each(SIGNED_IN)('signed in: $name', async (route) => {
    const page = await signedIn.newPage();
    const errors = watchPage(page);
    await open(page, route.path());
    await shot(page, `${route.name}-${size.label}`);
    const problems = await checkScreen(page, route.name, phone);
    if (await openConfirmations(page)) {
      await shot(page, `${route.name}-confirm-${size.label}`);
      problems.push(...(await checkScreen(page, `${route.name} (confirming)`, phone)));
    }
    expect(problems, problems.join('\n')).toEqual([]);
    expect(errors).toEqual([]);
    await page.close();
  });
});

/**
 * Presses Tab until the focused element has the test id (inside an element whose text holds
 * `inside`, when given); fails after `limit` presses.
 */
async function tabTo(
  page: Page,
  testId: string,
  options: { inside?: string; limit?: number } = {},
) {
  for (let i = 0; i <= (options.limit ?? 80); i++) {
    // Focus may already be there (a field that takes focus as it opens): look before pressing.
    if (i > 0) await page.keyboard.press('Tab');
    const found = await page.evaluate(
      ({ testId, inside }) => {
        const el = document.activeElement;
        if (!el || el.getAttribute('data-testid') !== testId) return false;
        if (!inside) return true;
        for (let a = el.parentElement; a; a = a.parentElement)
          if (a.getAttribute('data-testid') === 'alarm-card')
            return (a.textContent ?? '').includes(inside);
        return false;
      },
      { testId, inside: options.inside },
    );
    if (found) return;
  }
  throw new Error(`Tab never reached ${testId}${options.inside ? ` of ${options.inside}` : ''}`);
}

const focusedTestId = (page: Page) =>
  page.evaluate(() => document.activeElement?.getAttribute('data-testid') ?? null);

describe('with the keyboard alone (390×844)', () => {
  it('signs in, goes to Alarms and acknowledges an alarm without a mouse', async () => {
    const name = `Keyboard bench ${Date.now() % 100000}`;
    await wetZone(await ownerAgent(), `/api/v1/shops/${suite.server.demo.shopId}`, name);

    const context = await suite.browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    const errors = watchPage(page);
    await page.goto(`${suite.server.baseUrl}/sign-in`);
    await page.getByTestId('sign-in-email').waitFor();

    await tabTo(page, 'sign-in-email');
    await page.keyboard.type(member.email);
    await page.keyboard.press('Tab');
    expect(await focusedTestId(page)).toBe('sign-in-password');
    await page.keyboard.type(DEMO_PASSWORD);
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/shops\/[0-9a-f-]+$/);

    await tabTo(page, 'nav-alarms', { limit: 200 });
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/alarms$/);

    const card = page.getByTestId('alarm-card').filter({ hasText: name });
    await card.first().waitFor();
    await tabTo(page, 'alarm-ack-open', { inside: name, limit: 200 });
    await page.keyboard.press('Enter');
    // The note field takes focus as the form opens (AlarmAckForm).
    await expect.poll(() => focusedTestId(page)).toBe('alarm-ack-note');
    await page.keyboard.type('Wiped the table and covered it');
    await tabTo(page, 'alarm-ack-save');
    await page.keyboard.press('Enter');
    await expect
      .poll(() => card.first().getByTestId('alarm-acknowledged').textContent())
      .toContain(`Wiped the table and covered it — acknowledged by ${member.name}`);
    await shot(page, 'keyboard-acknowledged-phone');
    expect(errors).toEqual([]);
    await context.close();
  });
});

/** What the focused element is, and the message its aria-describedby points at. */
const focusedField = (page: Page) =>
  page.evaluate(() => {
    const el = document.activeElement;
    const ids = el?.getAttribute('aria-describedby')?.split(/\s+/) ?? [];
    return {
      testId: el?.getAttribute('data-testid') ?? null,
      invalid: el?.getAttribute('aria-invalid') ?? null,
      describedBy: ids.map((id) => document.getElementById(id)?.textContent ?? `(no #${id})`),
    };
  });

describe('forms tie their errors to the fields (390×844)', () => {
  let context: BrowserContext;
  beforeAll(async () => {
    context = await suite.browser.newContext({ viewport: { width: 390, height: 844 } });
  });
  afterAll(() => context?.close());

  it('moves focus to the first field in error and names the error on it', async () => {
    const page = await context.newPage();
    const errors = watchPage(page);
    await page.goto(`${suite.server.baseUrl}/sign-in`);
    await tabTo(page, 'sign-in-email');
    // Nothing typed: Enter submits, the client's checks fail, focus lands on the e-mail field.
    await page.keyboard.press('Enter');
    await expect
      .poll(() => focusedField(page), { timeout: 10_000 })
      .toEqual({
        testId: 'sign-in-email',
        invalid: 'true',
        describedBy: ['Enter your e-mail address'],
      });
    // The e-mail right, the password missing: focus goes to the password.
    await page.keyboard.type(member.email);
    await page.keyboard.press('Enter');
    await expect
      .poll(() => focusedField(page), { timeout: 10_000 })
      .toEqual({
        testId: 'sign-in-password',
        invalid: 'true',
        describedBy: ['Enter your password'],
      });
    // A wrong password is the server's answer about the whole form: announced as an alert.
    await page.keyboard.type('not the password');
    await page.keyboard.press('Enter');
    await expect.poll(() => page.getByRole('alert').textContent()).toMatch(/\S/);
    await shot(page, 'form-errors-phone');
    expect(errors).toEqual([]);
    await page.close();
  });

  it("moves focus to the field the server's message names", async () => {
    const page = await context.newPage();
    const errors = watchPage(page);
    await page.goto(`${suite.server.baseUrl}/sign-in`);
    await page.getByTestId('sign-in-email').fill(member.email);
    await page.getByTestId('sign-in-password').fill(DEMO_PASSWORD);
    await page.getByTestId('sign-in-password').press('Enter');
    await page.waitForURL(/\/shops\/[0-9a-f-]+/);
    await page.goto(`${suite.server.baseUrl}${shop()}/profile`);
    // The client accepts any current password; only the server knows it is wrong.
    await page.getByTestId('profile-current-password').fill('not the password');
    await page.getByTestId('profile-new-password').fill('a brand new password');
    await page.getByTestId('profile-password-submit').focus();
    await page.keyboard.press('Enter');
    await expect
      .poll(() => focusedField(page), { timeout: 10_000 })
      .toEqual({
        testId: 'profile-current-password',
        invalid: 'true',
        describedBy: ['Not your current password'],
      });
    expect(errors).toEqual([]);
    await page.close();
  });
});

describe('the shop menu with the keyboard (390×844)', () => {
  it('opens with Enter, moves with the arrows, Home and End, and closes on Escape and outside', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    const errors = watchPage(page);
    await page.goto(`${suite.server.baseUrl}/sign-in`);
    await page.getByTestId('sign-in-email').fill(owner.email);
    await page.getByTestId('sign-in-password').fill(DEMO_PASSWORD);
    await page.getByTestId('sign-in-password').press('Enter');
    await page.waitForURL(/\/shops\/[0-9a-f-]+/);
    await page.getByTestId('shop-switcher').waitFor();

    const focusedName = () =>
      page.evaluate(() => {
        const el = document.activeElement;
        return `${el?.getAttribute('role')}: ${el?.getAttribute('aria-label')}`;
      });
    await tabTo(page, 'shop-switcher');
    // The focus ring: 2 px of ink outside a 2 px band of card paper (components/ui/focusRingCss).
    const ring = await page.evaluate(() => {
      const s = getComputedStyle(document.activeElement!);
      return { style: s.outlineStyle, width: s.outlineWidth, shadow: s.boxShadow };
    });
    expect(ring).toEqual({
      style: 'solid',
      width: '2px',
      shadow: 'rgb(255, 253, 248) 0px 0px 0px 2px',
    });
    await page.keyboard.press('Enter');
    const menu = page.getByRole('menu');
    await menu.waitFor();
    const items = await menu.getByRole('menuitem').count();
    expect(items).toBeGreaterThan(0);
    const first = await focusedName();
    expect(first).toMatch(/^menuitem: /);
    await page.keyboard.press('End');
    expect(await focusedName()).toBe('menuitem: Create a new shop');
    await page.keyboard.press('Home');
    expect(await focusedName()).toBe(first);
    await page.keyboard.press('ArrowUp'); // wraps to the last
    expect(await focusedName()).toBe('menuitem: Create a new shop');
    await page.keyboard.press('ArrowDown'); // and back round to the first
    expect(await focusedName()).toBe(first);
    await shot(page, 'shop-menu-phone');

    await page.keyboard.press('Escape');
    await expect.poll(() => menu.count()).toBe(0);
    expect(await focusedTestId(page)).toBe('shop-switcher');
    expect(await page.getByTestId('shop-switcher').getAttribute('aria-expanded')).toBe('false');

    // Space opens it as well; a press elsewhere on the page closes it.
    await page.keyboard.press(' ');
    await menu.waitFor();
    await page.mouse.click(200, 600);
    await expect.poll(() => menu.count()).toBe(0);
    expect(errors).toEqual([]);
    await context.close();
  });
});
