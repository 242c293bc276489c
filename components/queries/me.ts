/** The signed-in person and the shops they belong to: GET /api/v1/me. */
import { queryOptions, useQuery } from '@tanstack/react-query';

import { apiRequest } from './api';

export type Role = 'owner' | 'member' | 'viewer';

export interface User {
  id: string;
  email: string;
  name: string;
}

export interface ShopSummary {
  id: string;
  name: string;
  role: Role;
  /** IANA zone; times on screen are shown in it. */
  timeZone: string;
}

export interface Me {
  user: User;
  shops: ShopSummary[];
}

export const meKeys = {
  all: ['me'] as const,
};

export function meQueryOptions() {
  return queryOptions({
    queryKey: meKeys.all,
    queryFn: ({ signal }) => apiRequest<Me>('/api/v1/me', { signal }),
    staleTime: 60_000,
  });
}

export function useMeQuery() {
  return useQuery(meQueryOptions());
}

/** The shop with this id from the signed-in person's list, if they belong to it. */
export function findShop(me: Me | undefined, shopId: string): ShopSummary | undefined {
  return me?.shops.find((shop) => shop.id === shopId);
}
