/**
 * A zone's reading history: GET /api/v1/shops/:shopId/zones/:zoneId/readings. The cache key
 * names the window (e.g. the last 24 h), not its clock times, so live readings can be appended
 * to it and a refetch simply slides the window forward.
 */
import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';

import type { Level } from '@/ingest';

import { apiRequest } from './api';

export interface ReadingPoint {
  at: string;
  air: number;
  rh: number;
  surface: number | null;
  dewPoint: number | null;
  margin: number | null;
  /** The lowest margin inside a bucket; equals `margin` for a raw reading. */
  marginMin: number | null;
  emc: number | null;
  level: Level;
  count: number;
}

export interface ReadingsResponse {
  from: string;
  to: string;
  /** 0 means the points are raw readings. */
  bucketSeconds: number;
  points: ReadingPoint[];
}

export interface ReadingsWindow {
  hours: number;
  points: number;
}

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
      const toMs = Date.now();
      const params = new URLSearchParams({
        from: new Date(toMs - window.hours * 3_600_000).toISOString(),
        to: new Date(toMs).toISOString(),
        points: String(window.points),
      });
      const path =
        `/api/v1/shops/${encodeURIComponent(shopId)}/zones/${encodeURIComponent(zoneId)}` +
        `/readings?${params.toString()}`;
      return apiRequest<ReadingsResponse>(path, { signal });
    },
    staleTime: 5 * 60_000,
  });
}

export function useReadingsQuery(shopId: string, zoneId: string, window?: ReadingsWindow) {
  return useQuery(readingsQueryOptions(shopId, zoneId, window));
}

/**
 * Appends a live point to every cached window of this zone, dropping points that have slid
 * out of the window. A point no newer than the last one is ignored (replays, retries).
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
    if (!previous) continue;
    const window = key[3] as ReadingsWindow | undefined;
    const hours = window?.hours ?? DAY_WINDOW.hours;
    queryClient.setQueryData<ReadingsResponse>(key, withPoint(previous, point, hours));
  }
}

export function withPoint(
  response: ReadingsResponse,
  point: ReadingPoint,
  windowHours: number,
): ReadingsResponse {
  const atMs = Date.parse(point.at);
  const last = response.points[response.points.length - 1];
  if (last && Date.parse(last.at) >= atMs) return response;
  const fromMs = atMs - windowHours * 3_600_000;
  const kept = response.points.filter((p) => Date.parse(p.at) >= fromMs);
  return {
    ...response,
    from: new Date(Math.max(fromMs, Date.parse(response.from))).toISOString(),
    to: new Date(Math.max(atMs, Date.parse(response.to))).toISOString(),
    points: [...kept, point],
  };
}
