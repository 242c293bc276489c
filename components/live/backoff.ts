import { LIVE_PATH } from '@/ingest/wire/live';

/**
 * Reconnect delays: doubling from 1 s up to 30 s, with up to 30 % jitter so a restarted
 * server is not hit by every open dashboard in the same instant.
 */
export const BACKOFF_BASE_MS = 1_000;
export const BACKOFF_MAX_MS = 30_000;

export function backoffDelayMs(attempt: number, random: () => number = Math.random): number {
  const exponential = Math.min(BACKOFF_MAX_MS, BACKOFF_BASE_MS * 2 ** Math.max(0, attempt));
  return Math.round(exponential * (1 - 0.3 * random()));
}

/** ws:// or wss:// on the page's own host, so the session cookie goes along. */
export function liveUrl(location: { protocol: string; host: string }): string {
  const scheme = location.protocol === 'https:' ? 'wss:' : 'ws:';
  return `${scheme}//${location.host}${LIVE_PATH}`;
}
