import { describe, expect, it } from 'vitest';

import { backoffDelayMs, liveUrl } from '@/components/live/backoff';

describe('live connection helpers', () => {
  it('backs off from 1 s to at most 30 s, jitter only shortening it', () => {
    expect(backoffDelayMs(0, () => 0)).toBe(1000);
    expect(backoffDelayMs(3, () => 0)).toBe(8000);
    expect(backoffDelayMs(20, () => 0)).toBe(30000);
    expect(backoffDelayMs(20, () => 1)).toBe(21000);
  });

  it('uses wss on https pages and the page host', () => {
    expect(liveUrl({ protocol: 'https:', host: 'shop.example' })).toBe(
      'wss://shop.example/api/v1/live',
    );
    expect(liveUrl({ protocol: 'http:', host: '127.0.0.1:8085' })).toBe(
      'ws://127.0.0.1:8085/api/v1/live',
    );
  });
});
