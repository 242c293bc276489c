import { QueryClient, QueryObserver } from '@tanstack/react-query';
import { describe, expect, it, vi } from 'vitest';

import { applyLiveMessage, parseLiveMessage } from '@/components/live';
import {
  DAY_WINDOW,
  readingKeys,
  withPoint,
  zoneKeys,
  type ReadingPoint,
  type ReadingsResponse,
  type ZonesResponse,
} from '@/components/queries';

const point = (at: string, margin: number): ReadingPoint => ({
  at,
  air: 12,
  rh: 70,
  surface: 9,
  dewPoint: 9 - margin,
  margin,
  marginMin: margin,
  marginMax: margin,
  emc: 13,
  level: margin <= 1 ? 'wet' : margin >= 3 ? 'dry' : 'close',
  count: 1,
});

const zones: ZonesResponse = {
  zones: [
    {
      id: 'z1',
      name: 'Machine room',
      cautionK: 3,
      wetK: 1,
      humidRhPct: 60,
      purpose: 'machines',
      emcRegion: 'most',
      latest: null,
      staleAfterS: 900,
    },
    {
      id: 'z2',
      name: 'Lumber rack',
      cautionK: 3,
      wetK: 1,
      humidRhPct: 60,
      purpose: 'machines',
      emcRegion: 'most',
      latest: null,
      staleAfterS: 900,
    },
  ],
};

const message = (at: string, margin: number, extra: Record<string, unknown> = {}) =>
  JSON.stringify({
    type: 'reading',
    shopId: 's1',
    zoneId: 'z1',
    sensorId: 'sensor-1',
    reading: {
      at,
      air: 12,
      rh: 70,
      surface: 9,
      dewPoint: 9 - margin,
      margin,
      emc: 13,
      level: 'close',
      surfaceSource: 'probe',
    },
    ...extra,
  });

describe('parseLiveMessage', () => {
  it('ignores what it does not understand', () => {
    expect(parseLiveMessage('not json')).toBeNull();
    expect(parseLiveMessage(JSON.stringify({ type: 'alarm', shopId: 's1' }))).toBeNull();
    expect(parseLiveMessage(message('not a time', 2))).toBeNull();
    expect(parseLiveMessage(message('2026-03-02T06:10:00Z', 2))).toMatchObject({ zoneId: 'z1' });
  });
});

describe('applyLiveMessage', () => {
  it('patches the zone list and appends to the zone series through the key factories', () => {
    const client = new QueryClient();
    client.setQueryData(zoneKeys.list('s1'), zones);
    const series: ReadingsResponse = {
      from: '2026-03-01T06:10:00.000Z',
      to: '2026-03-02T06:10:00.000Z',
      firstAt: '2026-02-20T06:00:00.000Z',
      bucketSeconds: 0,
      points: [point('2026-03-02T06:00:00Z', 2.5)],
    };
    client.setQueryData(readingKeys.window('s1', 'z1', DAY_WINDOW), series);

    applyLiveMessage(client, parseLiveMessage(message('2026-03-02T06:15:00Z', 1.8))!);

    const list = client.getQueryData<ZonesResponse>(zoneKeys.list('s1'))!;
    expect(list.zones[0]!.latest).toMatchObject({ margin: 1.8, sensorId: 'sensor-1' });
    expect(list.zones[1]!.latest).toBeNull();
    const next = client.getQueryData<ReadingsResponse>(readingKeys.window('s1', 'z1', DAY_WINDOW))!;
    expect(next.points.map((p) => p.at)).toEqual(['2026-03-02T06:00:00Z', '2026-03-02T06:15:00Z']);

    // An older reading (a late retry) changes neither cache.
    applyLiveMessage(client, parseLiveMessage(message('2026-03-02T06:05:00Z', 5))!);
    expect(client.getQueryData<ZonesResponse>(zoneKeys.list('s1'))!.zones[0]!.latest?.margin).toBe(
      1.8,
    );
  });

  // The server sends a live message after its commit, so a fetch already on its way answers
  // without that reading: its answer must not wipe the patch out.
  const heldFetch = (client: QueryClient, key: readonly unknown[]) => {
    let answer!: (value: ZonesResponse) => void;
    const landed = client.fetchQuery({
      queryKey: key,
      queryFn: () => new Promise<ZonesResponse>((resolve) => (answer = resolve)),
    });
    return { answer: (value: ZonesResponse) => (answer(value), landed) };
  };

  it("keeps a reading that arrives while the zone list's first fetch is on its way", async () => {
    const client = new QueryClient();
    const fetch = heldFetch(client, zoneKeys.list('s1'));
    applyLiveMessage(client, parseLiveMessage(message('2026-03-02T06:15:00Z', -2.7))!);
    expect(client.getQueryData(zoneKeys.list('s1'))).toBeUndefined();

    await fetch.answer(zones);
    const list = client.getQueryData<ZonesResponse>(zoneKeys.list('s1'))!;
    expect(list.zones[0]!.latest).toMatchObject({ margin: -2.7, at: '2026-03-02T06:15:00Z' });
    expect(list.zones[1]!.latest).toBeNull();
  });

  it('keeps a reading that arrives during a refetch, and takes a newer one the answer brings', async () => {
    const client = new QueryClient();
    client.setQueryData(zoneKeys.list('s1'), zones);
    const refetch = heldFetch(client, zoneKeys.list('s1'));
    applyLiveMessage(client, parseLiveMessage(message('2026-03-02T06:15:00Z', -2.7))!);
    await refetch.answer(zones);
    expect(client.getQueryData<ZonesResponse>(zoneKeys.list('s1'))!.zones[0]!.latest?.margin).toBe(
      -2.7,
    );

    // An answer that already holds a newer reading keeps it: the patch only ever moves forward.
    const again = heldFetch(client, zoneKeys.list('s1'));
    applyLiveMessage(client, parseLiveMessage(message('2026-03-02T06:20:00Z', 0.5))!);
    const newer = parseLiveMessage(message('2026-03-02T06:25:00Z', 4.2))!;
    if (newer.type !== 'reading') throw new Error('a reading message');
    const answered: ZonesResponse = {
      zones: [
        { ...zones.zones[0]!, latest: { ...newer.reading, sensorId: 'sensor-1' } },
        zones.zones[1]!,
      ],
    };
    await again.answer(answered);
    expect(client.getQueryData<ZonesResponse>(zoneKeys.list('s1'))!.zones[0]!.latest?.margin).toBe(
      4.2,
    );
  });
});

describe('a chart window loading while points arrive', () => {
  it('asks once more after the fetch, however many points came during it', async () => {
    const client = new QueryClient();
    const key = readingKeys.window('s1', 'z1', DAY_WINDOW);
    const empty: ReadingsResponse = {
      from: '2026-03-01T06:10:00.000Z',
      to: '2026-03-02T06:10:00.000Z',
      firstAt: null,
      bucketSeconds: 0,
      points: [],
    };
    let fetches = 0;
    let answer!: (value: ReadingsResponse) => void;
    const queryFn = () => {
      fetches += 1;
      return new Promise<ReadingsResponse>((resolve) => (answer = resolve));
    };
    // An observer, as a mounted chart has: invalidation refetches only watched queries.
    const stop = new QueryObserver(client, { queryKey: key, queryFn }).subscribe(() => {});
    expect(fetches).toBe(1);

    applyLiveMessage(client, parseLiveMessage(message('2026-03-02T06:15:00Z', 1.8))!);
    applyLiveMessage(client, parseLiveMessage(message('2026-03-02T06:16:00Z', 1.7))!);
    answer(empty);
    await vi.waitFor(() => expect(fetches).toBe(2));
    answer({ ...empty, points: [point('2026-03-02T06:16:00Z', 1.7)] });
    await vi.waitFor(() =>
      expect(client.getQueryData<ReadingsResponse>(key)!.points).toHaveLength(1),
    );
    // Settled: no further fetch once nothing arrived during the last one.
    await new Promise((resolve) => setTimeout(resolve, 20));
    expect(fetches).toBe(2);
    stop();
  });
});

describe('withPoint', () => {
  it('folds a reading into the last bucket of a downsampled series', () => {
    const series: ReadingsResponse = {
      from: '2026-03-01T06:00:00.000Z',
      to: '2026-03-02T06:00:00.000Z',
      firstAt: '2026-02-20T06:00:00.000Z',
      bucketSeconds: 300,
      points: [{ ...point('2026-03-02T06:00:00Z', 2.5), count: 3 }],
    };
    const next = withPoint(series, point('2026-03-02T06:02:00Z', 0.5), 24);
    expect(next.points).toHaveLength(1);
    expect(next.points[0]).toMatchObject({ count: 4, marginMin: 0.5, level: 'wet' });
    expect(next.points[0]!.margin).toBeCloseTo((2.5 * 3 + 0.5) / 4);

    const later = withPoint(next, point('2026-03-02T06:06:00Z', 2), 24);
    expect(later.points).toHaveLength(2);
  });

  it("takes a new zone's first live reading as the start of its history", () => {
    const empty: ReadingsResponse = {
      from: '2026-03-01T06:00:00.000Z',
      to: '2026-03-02T06:00:00.000Z',
      firstAt: null,
      bucketSeconds: 0,
      points: [],
    };
    const next = withPoint(empty, point('2026-03-02T06:01:00Z', 4), 24);
    expect(next.firstAt).toBe('2026-03-02T06:01:00Z');
    // An older history keeps its start.
    const again = withPoint(next, point('2026-03-02T06:02:00Z', 4), 24);
    expect(again.firstAt).toBe('2026-03-02T06:01:00Z');
  });

  it('drops points that slid out of the window', () => {
    const series: ReadingsResponse = {
      from: '2026-03-01T06:00:00.000Z',
      to: '2026-03-02T06:00:00.000Z',
      firstAt: '2026-02-20T06:00:00.000Z',
      bucketSeconds: 0,
      points: [point('2026-03-01T06:00:00Z', 4), point('2026-03-02T05:00:00Z', 4)],
    };
    const next = withPoint(series, point('2026-03-02T07:00:00Z', 4), 24);
    expect(next.points.map((p) => p.at)).toEqual(['2026-03-02T05:00:00Z', '2026-03-02T07:00:00Z']);
    expect(next.from).toBe('2026-03-01T07:00:00.000Z');
  });
});
