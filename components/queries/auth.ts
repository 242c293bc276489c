/**
 * Accounts without a session: sign-in, sign-up, e-mail verification, sign-out and password
 * reset by e-mail.
 */
import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { Me, UserResponse, VerificationSent } from '@/ingest/wire';

import { apiRequest } from './api';
import { meKeys, meQueryOptions } from './me';

export type { VerificationSent };

export interface SignInInput {
  email: string;
  password: string;
}

export interface SignUpInput extends SignInInput {
  name: string;
}

/** A new session: whatever was cached belonged to nobody or to someone else. */
export async function startFreshSession(queryClient: QueryClient): Promise<void> {
  queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== meKeys.all[0] });
  await queryClient.invalidateQueries({ queryKey: meKeys.all });
}

export function useSignInMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SignInInput) =>
      apiRequest<UserResponse>('/api/v1/auth/sign-in', { method: 'POST', body: input }),
    onSuccess: () => startFreshSession(queryClient),
  });
}

/** Sign-up starts no session: the link in the verification mail signs the person in. */
export function useSignUpMutation() {
  return useMutation({
    mutationFn: (input: SignUpInput) =>
      apiRequest<VerificationSent>('/api/v1/auth/sign-up', { method: 'POST', body: input }),
  });
}

/** Opens a verification link: proves the address and starts a session. */
export function useVerifyEmailMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { token: string }) =>
      apiRequest<UserResponse>('/api/v1/auth/verify', { method: 'POST', body: input }),
    onSuccess: () => startFreshSession(queryClient),
  });
}

/** After a sign-in: the signed-in person, fetched fresh. */
export function useFetchMe(): () => Promise<Me> {
  const queryClient = useQueryClient();
  return () => queryClient.fetchQuery({ ...meQueryOptions(), staleTime: 0 });
}

export function useSignOutMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiRequest<void>('/api/v1/auth/sign-out', { method: 'POST' }),
    onSettled: async () => {
      // Drop every cached answer so the next person sees nothing of this one's shops. `me` is
      // reset rather than removed so its observers (the live connection) learn of it at once.
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== meKeys.all[0] });
      await queryClient.resetQueries({ queryKey: meKeys.all });
    },
  });
}

export function usePasswordResetRequestMutation() {
  return useMutation({
    mutationFn: (input: { email: string }) =>
      apiRequest<{ sent: true }>('/api/v1/auth/password-reset', { method: 'POST', body: input }),
  });
}

export function usePasswordResetConfirmMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { token: string; password: string }) =>
      apiRequest<void>('/api/v1/auth/password-reset/confirm', { method: 'POST', body: input }),
    onSuccess: () => startFreshSession(queryClient),
  });
}
