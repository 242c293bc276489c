/**
 * A zone's reading history: GET /api/v1/shops/:shopId/zones/:zoneId/readings. The cache key
 * names the window (e.g. the last 24 h), not its clock times, so live readings can be appended
 * to it and a refetch simply slides the window forward.
 */
import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';

import type { ReadingPoint, ReadingsResponse } from '@/ingest/wire';

import { apiRequest } from './api';
import { refetchAfterFetch } from './livePatch';
import { zonePath } from './zones';

// The shapes the server answers have one home; screens keep importing them from here.
export type { ReadingPoint, ReadingsResponse };

/**
 * A sliding window (the last `hours`, refetched as time passes, live readings appended) or a
 * fixed span between two instants (a custom range: it never slides and takes no live points).
 */
export type ReadingsWindow =
  { hours: number; points: number } | { fromMs: number; toMs: number; points: number };

export const DAY_WINDOW: ReadingsWindow = { hours: 24, points: 500 };

export const readingKeys = {
  all: ['readings'] as const,
  shop: (shopId: string) => [...readingKeys.all, shopId] as const,
  zone: (shopId: string, zoneId: string) => [...readingKeys.shop(shopId), zoneId] as const,
  window: (shopId: string, zoneId: string, window: ReadingsWindow) =>
    [...readingKeys.zone(shopId, zoneId), window] as const,
};

export function readingsQueryOptions(
  shopId: string,
  zoneId: string,
  window: ReadingsWindow = DAY_WINDOW,
) {
  return queryOptions({
    queryKey: readingKeys.window(shopId, zoneId, window),
    queryFn: ({ signal }) => {
      const toMs = 'toMs' in window ? window.toMs : Date.now();
      const fromMs = 'fromMs' in window ? window.fromMs : toMs - window.hours * 3_600_000;
      const params = new URLSearchParams({
        from: new Date(fromMs).toISOString(),
        to: new Date(toMs).toISOString(),
        points: String(window.points),
      });
      const path = `${zonePath(shopId, zoneId)}/readings?${params.toString()}`;
      return apiRequest<ReadingsResponse>(path, { signal });
    },
    staleTime: 5 * 60_000,
  });
}

export function useReadingsQuery(shopId: string, zoneId: string, window?: ReadingsWindow) {
  return useQuery(readingsQueryOptions(shopId, zoneId, window));
}

/**
 * Adds a live point to every cached window of this zone, dropping points that have slid out of
 * the window. A raw series that has grown well past the points asked for is refetched instead,
 * so the server can bucket it again and a page left open all day stays light.
 */
export function appendReadingPoint(
  queryClient: QueryClient,
  shopId: string,
  zoneId: string,
  point: ReadingPoint,
): void {
  const queries = queryClient.getQueriesData<ReadingsResponse>({
    queryKey: readingKeys.zone(shopId, zoneId),
  });
  for (const [key, previous] of queries) {
    const window = (key[3] as ReadingsWindow | undefined) ?? DAY_WINDOW;
    // A fixed span stays as asked: a live reading lies after it.
    if (!('hours' in window)) continue;
    // A window still loading (or reloading) was read before this point: ask once more after.
    refetchAfterFetch(queryClient, key);
    if (!previous) continue;
    const next = withPoint(previous, point, window.hours);
    queryClient.setQueryData<ReadingsResponse>(key, next);
    if (next.points.length > window.points * 1.2) {
      void queryClient.invalidateQueries({ queryKey: key, exact: true });
    }
  }
}

function mean(a: number | null, countA: number, b: number | null): number | null {
  if (a === null) return b;
  if (b === null) return a;
  return (a * countA + b) / (countA + 1);
}

/**
 * Folds a raw reading into a downsampled bucket: means, the lowest margin and its level, the
 * highest margin.
 */
function mergeIntoBucket(bucket: ReadingPoint, point: ReadingPoint): ReadingPoint {
  const n = bucket.count;
  const lower =
    point.margin !== null && (bucket.marginMin === null || point.margin < bucket.marginMin);
  const higher =
    point.margin !== null && (bucket.marginMax === null || point.margin > bucket.marginMax);
  return {
    at: bucket.at,
    air: mean(bucket.air, n, point.air) ?? point.air,
    rh: mean(bucket.rh, n, point.rh) ?? point.rh,
    surface: mean(bucket.surface, n, point.surface),
    dewPoint: mean(bucket.dewPoint, n, point.dewPoint),
    margin: mean(bucket.margin, n, point.margin),
    marginMin: lower ? point.margin : bucket.marginMin,
    marginMax: higher ? point.margin : bucket.marginMax,
    emc: mean(bucket.emc, n, point.emc),
    level: lower ? point.level : bucket.level,
    count: n + 1,
  };
}

/**
 * The series with one more reading. In a downsampled series the reading joins the last bucket
 * while it falls inside it, so the chart keeps one density; a reading no newer than the last
 * point is ignored (replays, retries).
 */
export function withPoint(
  response: ReadingsResponse,
  point: ReadingPoint,
  windowHours: number,
): ReadingsResponse {
  const atMs = Date.parse(point.at);
  const last = response.points[response.points.length - 1];
  const lastMs = last ? Date.parse(last.at) : -Infinity;
  const fromMs = atMs - windowHours * 3_600_000;
  const kept = response.points.filter((p) => Date.parse(p.at) >= fromMs);
  const bucketMs = response.bucketSeconds * 1000;
  let points: ReadingPoint[];
  if (last && bucketMs > 0 && atMs >= lastMs && atMs < lastMs + bucketMs) {
    points = [...kept.slice(0, -1), mergeIntoBucket(last, point)];
  } else if (atMs > lastMs) {
    points = [...kept, point];
  } else {
    return response;
  }
  return {
    ...response,
    // A zone's very first reading, arriving live, starts its history.
    firstAt: response.firstAt ?? point.at,
    from: new Date(Math.max(fromMs, Date.parse(response.from))).toISOString(),
    to: new Date(Math.max(atMs, Date.parse(response.to))).toISOString(),
    points,
  };
}
