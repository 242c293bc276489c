// The boot script's handover from the server's first screen to the app
// (scripts/webpage/firstScreenHandover.ts), on a stand-in document: the screen goes when the app's
// root shows cards or says why it has none, or the address changed, and not before. The test ids
// are the app's own (ZoneCard, ZonesScreen, ShopFrame); the browser test
// tests/e2e/firstScreen.test.ts watches the real page.
import { describe, expect, it } from 'vitest';

import { FIRST_SCREEN_ID } from '@/ingest/wire/firstScreen';
import {
  handOverIfReady,
  isOverviewPath,
  type HandoverWindow,
} from '@/scripts/webpage/firstScreenHandover';

/** A page whose root shows elements with these test ids, with or without the first screen. */
function page(opts: { screen: boolean; rootShows: string[]; path?: string; readyState?: string }) {
  const state = { removed: false };
  const screen = { remove: () => (state.removed = true) };
  const root = {
    // What querySelector would find for a selector list of [data-testid="…"] parts.
    querySelector: (selectors: string) =>
      opts.rootShows.some((id) => selectors.split(',').includes(`[data-testid="${id}"]`))
        ? {}
        : null,
  };
  const win = {
    location: { pathname: opts.path ?? '/shops/s1' },
    document: {
      readyState: opts.readyState ?? 'interactive',
      getElementById: (id: string) =>
        id === FIRST_SCREEN_ID && opts.screen && !state.removed
          ? screen
          : id === 'root'
            ? root
            : null,
    },
    MutationObserver: class {},
  } as unknown as HandoverWindow;
  return { win, state };
}

describe('the handover from the server-rendered overview', () => {
  it.each([
    // [what the app's root shows, handed over]
    [[], false],
    [['splash'], false],
    [['zone-strip'], false],
    [['zone-card'], true],
    [['zones-error'], true],
    [['zones-empty'], true],
    [['shop-error'], true],
    [['shop-not-found'], true],
  ])('root showing %j: handed over %s', (rootShows, handed) => {
    const { win, state } = page({ screen: true, rootShows });
    expect(handOverIfReady(win, '/shops/s1')).toBe(handed);
    expect(state.removed).toBe(handed);
  });

  it('hands over when the app has moved to another address', () => {
    const { win, state } = page({ screen: true, rootShows: [], path: '/sign-in' });
    expect(handOverIfReady(win, '/shops/s1')).toBe(true);
    expect(state.removed).toBe(true);
  });

  it('keeps watching while the page is read, and stops once it is read without a screen', () => {
    expect(
      handOverIfReady(
        page({ screen: false, rootShows: [], readyState: 'loading' }).win,
        '/shops/s1',
      ),
    ).toBe(false);
    expect(handOverIfReady(page({ screen: false, rootShows: [] }).win, '/shops/s1')).toBe(true);
  });

  // The addresses server/firstScreen.ts renders: a shop's overview, with or without the slash.
  it.each([
    ['/shops/s1', true],
    ['/shops/s1/', true],
    ['/shops/s1/alarms', false],
    ['/shops/s1/zones/z1', false],
    ['/shops/', false],
    ['/', false],
  ])('%s is an overview address: %s', (path, overview) => {
    expect(isOverviewPath(path)).toBe(overview);
  });
});
