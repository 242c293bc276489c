// Photos on a trial test in Debian's Chromium against the real server and a real S3 API
// (s3rver on loopback, as scripts/test.sh runs the suite): a file that is not an image is
// refused with the server's words and a retry, a JPEG drawn here with sharp is uploaded through
// "Add a photo", its thumbnail comes back through the checked proxy, the full photo opens over
// the page, and deleting it takes the objects out of the store.
import AxeBuilder from '@axe-core/playwright';
import type { Locator, Page } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { verifiedPerson } from '../support/app';
import { SHOTS, startBrowserSuite, watchPage, type BrowserSuite } from '../support/browser';
import { startS3Fake, type S3Fake } from '../support/s3';

let s3: S3Fake;
let suite: BrowserSuite;

beforeAll(async () => {
  s3 = await startS3Fake();
  suite = await startBrowserSuite({ storage: s3.config });
});
afterAll(async () => {
  await suite?.close();
  await s3?.dispose();
});

/** A cast-iron top with rust spots after a wet-rag night, drawn here (1200 × 900). */
function drawnTop(): Promise<Buffer> {
  const spots = [
    [310, 260, 34],
    [520, 410, 22],
    [760, 300, 48],
    [880, 620, 28],
    [420, 650, 40],
  ]
    .map(([x, y, r]) => `<circle cx="${x}" cy="${y}" r="${r}" fill="#a5402d" opacity="0.8"/>`)
    .join('');
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="1200" height="900">
    <rect width="1200" height="900" fill="#8d969c"/>
    <rect x="60" y="60" width="1080" height="780" fill="#6f787e" rx="12"/>
    ${[200, 400, 600, 800, 1000].map((x) => `<rect x="${x}" y="60" width="18" height="780" fill="#5d666b"/>`).join('')}
    ${spots}
  </svg>`;
  return sharp(Buffer.from(svg)).jpeg({ quality: 85 }).toBuffer();
}

async function signIn(page: Page, email: string, password: string) {
  // The 2 MB bundle's first load on a shared, loaded CI machine can take past watchPage's 10 s.
  page.setDefaultNavigationTimeout(30_000);
  await page.goto(`${suite.server.baseUrl}/sign-in`);
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(password);
  await page.getByTestId('sign-in-submit').click();
  await page.waitForURL(/\/shops\/[0-9a-f-]+/);
}

/** axe-core's serious and critical findings (WCAG 2.x A/AA), as tests/e2e/access.test.ts. */
async function axeProblems(page: Page): Promise<string[]> {
  const result = await new AxeBuilder({ page }).analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `axe ${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

/** Taps a thumbnail, waits for the full photo (1200 px wide, as drawn) and takes a shot. */
async function openFull(page: Page, thumb: Locator, shot: string): Promise<Locator> {
  await thumb.click();
  const overlay = page.getByTestId('trial-test-photos-overlay');
  await overlay.waitFor();
  await expect
    .poll(() => overlay.locator('img').evaluate((img: HTMLImageElement) => img.naturalWidth))
    .toBe(1200);
  await page.screenshot({ path: `${SHOTS}/${shot}.png` });
  return overlay;
}

// Each test walks several uploads, a store stopped and started, axe and screenshots: more than
// the suite's 60 s on a machine shared with other builds.
describe('photos on a trial test', () => {
  let owner: Awaited<ReturnType<typeof verifiedPerson>>;
  let shopId = '';
  let trialId = '';
  let testId = '';

  it('refuses a non-image with the server’s words, then uploads a JPEG and shows it (phone)', async () => {
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
    const base = `/api/v1/shops/${shopId}`;
    const trial = (
      await owner.agent
        .post(`${base}/trials`)
        .send({
          name: 'Saw table protection',
          treatments: ['Paste wax', 'Camellia oil', 'Dry lubricant', 'Bare iron'],
        })
        .expect(201)
    ).body;
    trialId = trial.id;
    testId = (
      await owner.agent
        .post(`${base}/trials/${trialId}/tests`)
        .send({
          name: 'Wet rag night',
          kind: 'condensation',
          from: '2026-03-03T00:00:00Z',
          to: '2026-03-03T13:00:00Z',
        })
        .expect(201)
    ).body.id;

    // A context of its own: axe-core's Playwright runner opens helper pages in it.
    const context = await suite.browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    const errors = watchPage(page);
    await signIn(page, owner.email, owner.password);
    await page.goto(`${suite.server.baseUrl}/shops/${shopId}/trials/${trialId}`);
    const panel = page.getByTestId('trial-test');
    await panel.waitFor();
    const add = panel.getByTestId('trial-test-photo-add');
    expect(await add.getAttribute('aria-label')).toBe('Add a photo to Wet rag night');
    const box = (await add.boundingBox())!;
    expect(box.height).toBeGreaterThanOrEqual(44);

    // A text file named like a photo: the bytes decide (415), and the server's sentence shows.
    const input = panel.getByTestId('trial-test-photo-add-input');
    await input.setInputFiles({
      name: 'top.jpg',
      mimeType: 'image/jpeg',
      buffer: Buffer.from('Waxed on Friday, not a photo.\n'),
    });
    const error = panel.getByTestId('trial-test-photo-add-error');
    await expect.poll(() => error.textContent()).toContain('the file is not one');
    expect(await panel.getByTestId('trial-test-photo-add-retry').count()).toBe(1);
    expect(await s3.keys(`shops/${shopId}/`)).toEqual([]);

    // The drawn JPEG while the store is away: the server's 503 sentence, nothing stored; once
    // the store is back, "Try again" sends the same file.
    await s3.stop();
    try {
      await input.setInputFiles({
        name: 'wet-rag.jpg',
        mimeType: 'image/jpeg',
        buffer: await drawnTop(),
      });
      await expect
        .poll(() => error.textContent())
        .toBe('Photo storage is unavailable right now; try again shortly.');
    } finally {
      await s3.start();
    }
    expect(await s3.keys(`shops/${shopId}/`)).toEqual([]);
    // Uploaded, listed, its thumbnail served by the proxy.
    const thumbAnswer = page.waitForResponse((r) => r.url().endsWith('/thumb'));
    await panel.getByTestId('trial-test-photo-add-retry').click();
    const thumb = panel.getByTestId('trial-test-photos-thumb');
    await expect.poll(() => thumb.count()).toBe(1);
    const served = await thumbAnswer;
    expect(served.status()).toBe(200);
    expect(served.headers()['content-type']).toBe('image/jpeg');
    // The error went with the successful upload.
    expect(await error.count()).toBe(0);
    expect(await thumb.getAttribute('aria-label')).toBe('Photo 1 of Wet rag night: open full size');
    // The image really drew: the browser decoded the thumbnail at the size the server made it
    // (1200 × 900 inside 320 px: 320 × 240).
    await expect
      .poll(() =>
        thumb
          .locator('img')
          .evaluate((img: HTMLImageElement) => [img.naturalWidth, img.naturalHeight]),
      )
      .toEqual([320, 240]);

    const api = (await owner.agent.get(`${base}/trials/${trialId}`).expect(200)).body;
    const photos = api.tests[0].photos as { id: string; widthPx: number; heightPx: number }[];
    expect(photos.map((p) => [p.widthPx, p.heightPx])).toEqual([[1200, 900]]);
    expect(await s3.keys(`shops/${shopId}/`)).toEqual([
      `shops/${shopId}/photos/${photos[0]!.id}-thumb.jpg`,
      `shops/${shopId}/photos/${photos[0]!.id}.jpg`,
    ]);

    expect(await axeProblems(page)).toEqual([]);
    await panel.scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${SHOTS}/trial-photo-phone.png`, fullPage: true });

    // Tapping the thumbnail opens the full photo over the page; Close puts it away.
    const overlay = await openFull(page, thumb, 'trial-photo-open-phone');
    await overlay.getByText('Close').click();
    await expect.poll(() => overlay.count()).toBe(0);
    expect(errors).toEqual([]);
    await context.close();
  }, 180_000);

  it('shows the photo on a wide screen, and deleting it empties the store', async () => {
    expect(trialId).not.toBe('');
    const page = await suite.browser.newPage({ viewport: { width: 1440, height: 900 } });
    const errors = watchPage(page);
    await signIn(page, owner.email, owner.password);
    await page.goto(`${suite.server.baseUrl}/shops/${shopId}/trials/${trialId}`);
    const panel = page.getByTestId('trial-test');
    const thumb = panel.getByTestId('trial-test-photos-thumb');
    await expect.poll(() => thumb.count()).toBe(1);
    await expect
      .poll(() => thumb.locator('img').evaluate((img: HTMLImageElement) => img.naturalWidth))
      .toBe(320);
    await page.screenshot({ path: `${SHOTS}/trial-photo-wide.png`, fullPage: true });
    // The full photo opens over the page and Escape puts it away, as Close does.
    const overlay = await openFull(page, thumb, 'trial-photo-open-wide');
    await page.keyboard.press('Escape');
    await expect.poll(() => overlay.count()).toBe(0);

    await panel.getByTestId('trial-test-photos-delete').click();
    await page.getByText('Yes, delete').click();
    await expect.poll(() => thumb.count()).toBe(0);
    expect(await s3.keys(`shops/${shopId}/`)).toEqual([]);
    const api = (await owner.agent.get(`/api/v1/shops/${shopId}/trials/${trialId}`).expect(200))
      .body;
    expect(api.tests.find((t: { id: string }) => t.id === testId).photos).toEqual([]);
    expect(errors).toEqual([]);
    await page.close();
  }, 180_000);
});
