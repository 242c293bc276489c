/** Shops: create, rename or move time zone, delete (the body repeats the name). */
import { useMutation, useQueryClient } from '@tanstack/react-query';

import type { Shop, ShopSummary } from '@/ingest/wire';
import type { PaperSize } from '@/ingest/wire/reports';

import { apiRequest } from './api';
import { meKeys } from './me';

export type { Shop };

const shopPath = (shopId: string) => `/api/v1/shops/${encodeURIComponent(shopId)}`;

export function useShopCreateMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { name: string; timeZone: string }) =>
      apiRequest<Shop>('/api/v1/shops', { method: 'POST', body: input }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: meKeys.all }),
  });
}

export function useShopUpdateMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { name?: string; timeZone?: string; paperSize?: PaperSize }) =>
      apiRequest<ShopSummary>(shopPath(shopId), { method: 'PATCH', body: input }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: meKeys.all }),
  });
}

export function useShopDeleteMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { confirmName: string }) =>
      apiRequest<void>(shopPath(shopId), { method: 'DELETE', body: input }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: meKeys.all }),
  });
}

export { shopPath };
