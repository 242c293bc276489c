// The answers the page asked for before the app ran (components/queries/early.ts) and how
// apiRequest takes them: once per path, only while fresh, only when they succeeded. The
// reference is HTTP's own meaning (RFC 9110 §15): a 2xx answers the request; a 401 or 5xx from
// before the app started says nothing reliable about now, so the app asks again.
import { afterEach, describe, expect, it, vi } from 'vitest';

import { apiRequest } from '@/components/queries/api';
import {
  EARLY_FRESH_MS,
  EARLY_GLOBAL,
  dropEarlyAnswers,
  takeEarlyAnswer,
  type EarlyAnswers,
} from '@/components/queries/early';

const json = (status: number, body: unknown) =>
  new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });

function install(answers: Record<string, Response>, startedMs = performance.now()): EarlyAnswers {
  const early: EarlyAnswers = {
    startedMs,
    answers: Object.fromEntries(
      Object.entries(answers).map(([path, res]) => [path, Promise.resolve(res)]),
    ),
  };
  (globalThis as Record<string, unknown>)[EARLY_GLOBAL] = early;
  return early;
}

afterEach(() => {
  delete (globalThis as Record<string, unknown>)[EARLY_GLOBAL];
  vi.unstubAllGlobals();
});

describe('takeEarlyAnswer', () => {
  it('hands each answer out once', async () => {
    const me = json(200, { user: { id: 'u1' } });
    const host = { [EARLY_GLOBAL]: install({ '/api/v1/me': me }, 0) };
    expect(await takeEarlyAnswer('/api/v1/me', host, 5)).toBe(me);
    expect(takeEarlyAnswer('/api/v1/me', host, 6)).toBeUndefined();
    expect(takeEarlyAnswer('/api/v1/other', host, 6)).toBeUndefined();
  });

  it.each([
    [EARLY_FRESH_MS, true],
    [EARLY_FRESH_MS + 1, false],
  ])('at %i ms after the page started, the answer is used: %s', (nowMs, used) => {
    const host = { [EARLY_GLOBAL]: install({ '/api/v1/me': json(200, {}) }, 0) };
    expect(takeEarlyAnswer('/api/v1/me', host, nowMs) !== undefined).toBe(used);
    // Stale or not, it is gone: a later GET goes to the network.
    expect(host[EARLY_GLOBAL].answers).toEqual({});
  });

  it('finds nothing on a page without the boot script (native, tests)', () => {
    expect(takeEarlyAnswer('/api/v1/me', {}, 0)).toBeUndefined();
  });

  it('has nothing left to hand out once a live message says the shop changed', () => {
    const zonesPath = '/api/v1/shops/s1/zones';
    const host = { [EARLY_GLOBAL]: install({ [zonesPath]: json(200, { zones: [] }) }, 0) };
    dropEarlyAnswers(host);
    expect(takeEarlyAnswer(zonesPath, host, 5)).toBeUndefined();
    dropEarlyAnswers({});
  });
});

describe('apiRequest with early answers', () => {
  it("takes a 2xx early answer instead of asking, and asks for the path's next GET", async () => {
    install({ '/api/v1/me': json(200, { user: { id: 'early' } }) });
    const fetchMock = vi.fn(async () => json(200, { user: { id: 'network' } }));
    vi.stubGlobal('fetch', fetchMock);
    expect(await apiRequest('/api/v1/me')).toEqual({ user: { id: 'early' } });
    expect(fetchMock).not.toHaveBeenCalled();
    expect(await apiRequest('/api/v1/me')).toEqual({ user: { id: 'network' } });
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });

  it.each([401, 404, 503])('asks again after an early %i', async (status) => {
    install({
      '/api/v1/me': json(status, { error: { code: 'x', message: 'early', details: [] } }),
    });
    const fetchMock = vi.fn(async () => json(200, { user: { id: 'now' } }));
    vi.stubGlobal('fetch', fetchMock);
    expect(await apiRequest('/api/v1/me')).toEqual({ user: { id: 'now' } });
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });

  it('asks again when the early request failed on the network', async () => {
    const early = install({});
    early.answers['/api/v1/me'] = Promise.reject(new TypeError('Failed to fetch'));
    early.answers['/api/v1/me'].catch(() => undefined);
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => json(200, { ok: true })),
    );
    expect(await apiRequest('/api/v1/me')).toEqual({ ok: true });
  });

  it('never answers a write with an early answer', async () => {
    install({ '/api/v1/me': json(200, { user: { id: 'early' } }) });
    const fetchMock = vi.fn(async () => json(200, { user: { id: 'patched' } }));
    vi.stubGlobal('fetch', fetchMock);
    expect(await apiRequest('/api/v1/me', { method: 'PATCH', body: { name: 'A' } })).toEqual({
      user: { id: 'patched' },
    });
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });
});
