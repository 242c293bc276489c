/**
 * A shop's surfaces and their care log: GET|POST …/surfaces, GET …/surfaces/:id, POST
 * …/surfaces/:id/care, GET …/surfaces/:id/exposure and GET|PUT …/coating-budgets. Exposure is
 * computed by the server from stored readings, so a live reading in a surface's zone refetches
 * it (invalidateZoneExposures) instead of the app adding hours itself.
 */
import {
  queryOptions,
  useMutation,
  useQueries,
  useQuery,
  useQueryClient,
  type QueryClient,
} from '@tanstack/react-query';

import type {
  CareEntry,
  CareKind,
  CoatingBudget,
  CoatingBudgetsResponse,
  CoatingType,
  Surface,
  SurfaceDetail,
  SurfaceExposure,
  SurfacesResponse,
} from '@/ingest/wire';

import { apiRequest } from './api';
import { shopPath } from './shops';

// The shapes are the server's own (ingest/wire/surfaces.ts); screens import them from here.
export type {
  CareEntry,
  CareKind,
  CoatingBudget,
  CoatingBudgetsResponse,
  CoatingType,
  RustingGrade,
  Surface,
  SurfaceDetail,
  SurfaceExposure,
  SurfacesResponse,
} from '@/ingest/wire';

export const surfaceKeys = {
  all: ['surfaces'] as const,
  shop: (shopId: string) => [...surfaceKeys.all, shopId] as const,
  list: (shopId: string) => [...surfaceKeys.shop(shopId), 'list'] as const,
  one: (shopId: string, surfaceId: string) =>
    [...surfaceKeys.shop(shopId), 'one', surfaceId] as const,
  /** Every exposure of a zone's surfaces: what a live reading in that zone makes stale. */
  zoneExposures: (shopId: string, zoneId: string) =>
    [...surfaceKeys.shop(shopId), 'exposure', zoneId] as const,
  exposure: (shopId: string, surface: Pick<Surface, 'id' | 'zoneId'>) =>
    [...surfaceKeys.zoneExposures(shopId, surface.zoneId), surface.id] as const,
  budgets: (shopId: string) => [...surfaceKeys.shop(shopId), 'budgets'] as const,
};

const surfacesPath = (shopId: string) => `${shopPath(shopId)}/surfaces`;
const surfacePath = (shopId: string, surfaceId: string) =>
  `${surfacesPath(shopId)}/${encodeURIComponent(surfaceId)}`;

export function surfacesQueryOptions(shopId: string) {
  return queryOptions({
    queryKey: surfaceKeys.list(shopId),
    queryFn: ({ signal }) => apiRequest<SurfacesResponse>(surfacesPath(shopId), { signal }),
  });
}

export function useSurfacesQuery(shopId: string) {
  return useQuery(surfacesQueryOptions(shopId));
}

export function surfaceQueryOptions(shopId: string, surfaceId: string) {
  return queryOptions({
    queryKey: surfaceKeys.one(shopId, surfaceId),
    queryFn: ({ signal }) => apiRequest<SurfaceDetail>(surfacePath(shopId, surfaceId), { signal }),
  });
}

export function useSurfaceQuery(shopId: string, surfaceId: string) {
  return useQuery(surfaceQueryOptions(shopId, surfaceId));
}

// Live readings refetch an exposure as they arrive; the interval only catches a zone whose
// sensor posts while the socket is down, so it can be slow.
const EXPOSURE_REFETCH_MS = 5 * 60_000;

export function exposureQueryOptions(shopId: string, surface: Pick<Surface, 'id' | 'zoneId'>) {
  return queryOptions({
    queryKey: surfaceKeys.exposure(shopId, surface),
    queryFn: ({ signal }) =>
      apiRequest<SurfaceExposure>(`${surfacePath(shopId, surface.id)}/exposure`, { signal }),
    refetchInterval: EXPOSURE_REFETCH_MS,
  });
}

export function useExposureQuery(shopId: string, surface: Pick<Surface, 'id' | 'zoneId'>) {
  return useQuery(exposureQueryOptions(shopId, surface));
}

/** The exposures of many surfaces at once (the Care page), in the order of `surfaces`. */
export function useExposureQueries(shopId: string, surfaces: readonly Surface[]) {
  return useQueries({ queries: surfaces.map((s) => exposureQueryOptions(shopId, s)) });
}

// Readings come in bursts (several sensors of a zone, a sensor catching up), and each exposure
// is a sum over every stored reading since the coat: one refetch per burst, not per reading.
export const EXPOSURE_COALESCE_MS = 1000;
const pendingExposureRefetch = new WeakMap<QueryClient, Set<string>>();

/**
 * A reading arrived in a zone: its surfaces' exposures have grown, so they are read again once
 * the burst it belongs to is over (EXPOSURE_COALESCE_MS after its first reading).
 */
export function invalidateZoneExposures(
  queryClient: QueryClient,
  shopId: string,
  zoneId: string,
): void {
  const pending = pendingExposureRefetch.get(queryClient) ?? new Set<string>();
  pendingExposureRefetch.set(queryClient, pending);
  const key = `${shopId}/${zoneId}`;
  if (pending.has(key)) return;
  pending.add(key);
  setTimeout(() => {
    pending.delete(key);
    void queryClient.invalidateQueries({ queryKey: surfaceKeys.zoneExposures(shopId, zoneId) });
  }, EXPOSURE_COALESCE_MS);
}

export function coatingBudgetsQueryOptions(shopId: string) {
  return queryOptions({
    queryKey: surfaceKeys.budgets(shopId),
    queryFn: ({ signal }) =>
      apiRequest<CoatingBudgetsResponse>(`${shopPath(shopId)}/coating-budgets`, { signal }),
  });
}

export function useCoatingBudgetsQuery(shopId: string) {
  return useQuery(coatingBudgetsQueryOptions(shopId));
}

export interface NewSurface {
  name: string;
  zoneId: string;
  material?: string;
  sensorId?: string;
}

export function useSurfaceCreateMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: NewSurface) =>
      apiRequest<Surface>(surfacesPath(shopId), { method: 'POST', body: input }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: surfaceKeys.list(shopId) }),
  });
}

export interface NewCareEntry {
  kind: CareKind;
  at: string;
  coating?: { type: CoatingType; product?: string };
  rusting?: number;
  note?: string;
}

/** Logs a coat or an inspection; a coat restarts the exposure, so that is read again too. */
export function useCareEntryMutation(shopId: string, surface: Pick<Surface, 'id' | 'zoneId'>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: NewCareEntry) =>
      apiRequest<CareEntry>(`${surfacePath(shopId, surface.id)}/care`, {
        method: 'POST',
        body: input,
      }),
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: surfaceKeys.one(shopId, surface.id) });
      await queryClient.invalidateQueries({ queryKey: surfaceKeys.exposure(shopId, surface) });
    },
  });
}

export type BudgetInput = Omit<CoatingBudget, 'isDefault'>;

/** A new budget changes every surface's verdict: all exposures are read again. */
export function useCoatingBudgetsMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (budgets: BudgetInput[]) =>
      apiRequest<CoatingBudgetsResponse>(`${shopPath(shopId)}/coating-budgets`, {
        method: 'PUT',
        body: { budgets },
      }),
    onSuccess: (data) => queryClient.setQueryData(surfaceKeys.budgets(shopId), data),
    onSettled: () => queryClient.invalidateQueries({ queryKey: surfaceKeys.shop(shopId) }),
  });
}
