/**
 * The signed-in person and the shops they belong to: GET /api/v1/me, profile, password and the
 * verification link sent again.
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type {
  Me,
  Role,
  ShopSummary,
  UnitPref,
  User,
  UserResponse,
  VerificationSent,
} from '@/ingest/wire';

import { apiRequest } from './api';

// The shapes the server answers have one home; screens keep importing them from here.
export type { Me, Role, ShopSummary, UnitPref, User, UserResponse };

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

/** The signed-in person's unit preference (°C until /me has answered). */
export function useUnitPref(): UnitPref {
  return useMeQuery().data?.user.unitPref ?? 'C';
}

/** The shop with this id from the signed-in person's list, if they belong to it. */
export function findShop(me: Me | undefined, shopId: string): ShopSummary | undefined {
  return me?.shops.find((shop) => shop.id === shopId);
}

export function useProfileMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: {
      name?: string;
      unitPref?: UnitPref;
      alarmMail?: boolean;
      weekReportMail?: boolean;
    }) => apiRequest<UserResponse>('/api/v1/me', { method: 'PATCH', body: input }),
    onSuccess: ({ user }) =>
      queryClient.setQueryData<Me>(meKeys.all, (me) => (me ? { ...me, user } : me)),
  });
}

/** Sends the verification link again (the first may be lost or expired). */
export function useVerificationResendMutation() {
  return useMutation({
    mutationFn: () =>
      apiRequest<VerificationSent>('/api/v1/me/verification', {
        method: 'POST',
        body: {},
      }),
  });
}

export function usePasswordChangeMutation() {
  return useMutation({
    mutationFn: (input: { currentPassword: string; newPassword: string }) =>
      apiRequest<void>('/api/v1/me/password', { method: 'POST', body: input }),
  });
}
