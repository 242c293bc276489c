/**
 * The signed-in person and the shops they belong to: GET /api/v1/me, profile, password and the
 * verification link sent again.
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { apiRequest } from './api';

export type Role = 'owner' | 'member' | 'viewer';
export type UnitPref = 'C' | 'F';

export interface User {
  id: string;
  email: string;
  name: string;
  /** How temperatures are shown; the API always speaks °C and K. */
  unitPref: UnitPref;
  /** Whether alarm e-mails reach this person in shops where they are an owner or member. */
  alarmMail: boolean;
  /** Whether the address is proved; alarm and report e-mails wait for it. */
  emailVerified: boolean;
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
    mutationFn: (input: { name?: string; unitPref?: UnitPref; alarmMail?: boolean }) =>
      apiRequest<{ user: User }>('/api/v1/me', { method: 'PATCH', body: input }),
    onSuccess: ({ user }) =>
      queryClient.setQueryData<Me>(meKeys.all, (me) => (me ? { ...me, user } : me)),
  });
}

/** Sends the verification link again (the first may be lost or expired). */
export function useVerificationResendMutation() {
  return useMutation({
    mutationFn: () =>
      apiRequest<{ status: 'verification_sent'; email: string }>('/api/v1/me/verification', {
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
