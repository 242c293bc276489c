/** A shop's zones with each zone's latest reading: GET /api/v1/shops/:shopId/zones. */
import {
  queryOptions,
  useMutation,
  useQuery,
  useQueryClient,
  type QueryClient,
} from '@tanstack/react-query';

import type {
  EmcRegion,
  LatestReading,
  SurfaceSource,
  Zone,
  ZonePurpose,
  ZoneSettings,
  ZonesResponse,
} from '@/ingest/wire';

import { apiRequest } from './api';
import { patchCached } from './livePatch';
import { shopPath } from './shops';

// The shapes the server answers have one home; screens keep importing them from here.
export type {
  EmcRegion,
  LatestReading,
  SurfaceSource,
  Zone,
  ZonePurpose,
  ZoneSettings,
  ZonesResponse,
};

export const zonePath = (shopId: string, zoneId: string) =>
  `${shopPath(shopId)}/zones/${encodeURIComponent(zoneId)}`;

export const zoneKeys = {
  all: ['zones'] as const,
  shop: (shopId: string) => [...zoneKeys.all, shopId] as const,
  list: (shopId: string) => [...zoneKeys.shop(shopId), 'list'] as const,
};

export function zonesQueryOptions(shopId: string) {
  return queryOptions({
    queryKey: zoneKeys.list(shopId),
    queryFn: ({ signal }) => apiRequest<ZonesResponse>(`${shopPath(shopId)}/zones`, { signal }),
    // Live messages keep the list fresh; a refetch on focus catches anything missed.
    staleTime: 30_000,
  });
}

export function useZonesQuery(shopId: string) {
  return useQuery(zonesQueryOptions(shopId));
}

/** Puts a newer reading into the cached zone list; older or unknown zones change nothing. */
export function patchZoneLatest(
  queryClient: QueryClient,
  shopId: string,
  zoneId: string,
  latest: LatestReading,
): void {
  patchCached<ZonesResponse>(queryClient, zoneKeys.list(shopId), (previous) =>
    withLatest(previous, zoneId, latest),
  );
}

export function withLatest(
  response: ZonesResponse,
  zoneId: string,
  latest: LatestReading,
): ZonesResponse {
  let changed = false;
  const zones = response.zones.map((zone) => {
    if (zone.id !== zoneId) return zone;
    if (zone.latest && Date.parse(zone.latest.at) > Date.parse(latest.at)) return zone;
    changed = true;
    return { ...zone, latest };
  });
  return changed ? { ...response, zones } : response;
}

export function useZoneCreateMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { name: string; purpose?: ZonePurpose }) =>
      apiRequest<ZoneSettings>(`${shopPath(shopId)}/zones`, {
        method: 'POST',
        body: input,
      }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: zoneKeys.shop(shopId) }),
  });
}

export interface ZoneChanges {
  name?: string;
  cautionK?: number;
  wetK?: number;
  humidRhPct?: number;
  purpose?: ZonePurpose;
  emcRegion?: EmcRegion;
}

export function useZoneUpdateMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ zoneId, ...changes }: ZoneChanges & { zoneId: string }) =>
      apiRequest<ZoneSettings>(zonePath(shopId, zoneId), {
        method: 'PATCH',
        body: changes,
      }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: zoneKeys.shop(shopId) }),
  });
}

/** Deletes an empty zone (no sensor placed, no reading stored); the server refuses others. */
export function useZoneDeleteMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (zoneId: string) =>
      apiRequest<void>(zonePath(shopId, zoneId), { method: 'DELETE' }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: zoneKeys.shop(shopId) }),
  });
}
