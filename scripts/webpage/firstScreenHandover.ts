/**
 * Part of the boot script: takes the server's first screen (server/firstScreen.ts) away once the
 * app shows its own. The server's screen covers the page (fixed, above the app's root) while the
 * app starts underneath, so a person never sees the app's loading states; it goes when the app's
 * root holds a zone card, or shows why it cannot (an error, no shop, no zones), or has moved to
 * another address. Until then nothing of it flashes away.
 */
import { FIRST_SCREEN_ID } from '@/ingest/wire/firstScreen';

/** What the app's root shows instead of the cards when it has none to show (test ids). */
export const HANDOVER_SELECTOR = [
  'zone-card',
  'zones-error',
  'zones-empty',
  'shop-error',
  'shop-not-found',
]
  .map((id) => `[data-testid="${id}"]`)
  .join(',');

export interface HandoverWindow {
  location: { pathname: string };
  document: Pick<Document, 'getElementById' | 'readyState'> & Node;
  MutationObserver: typeof MutationObserver;
}

/** Only a shop's overview is rendered by the server. */
export function isOverviewPath(pathname: string): boolean {
  return /^\/shops\/[^/]+\/?$/.test(pathname);
}

/**
 * Removes the first screen when the app is ready to be seen; true once it is gone or there was
 * none (the page has been read to its end without one).
 */
export function handOverIfReady(win: HandoverWindow, startPath: string): boolean {
  const screen = win.document.getElementById(FIRST_SCREEN_ID);
  if (!screen) return win.document.readyState !== 'loading';
  const root = win.document.getElementById('root');
  if (win.location.pathname !== startPath || root?.querySelector(HANDOVER_SELECTOR)) {
    screen.remove();
    return true;
  }
  return false;
}

export function watchFirstScreen(win: HandoverWindow): void {
  const startPath = win.location.pathname;
  if (!isOverviewPath(startPath)) return;
  const observer = new win.MutationObserver(() => {
    if (handOverIfReady(win, startPath)) observer.disconnect();
  });
  observer.observe(win.document, { childList: true, subtree: true });
}
