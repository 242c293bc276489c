/** Signing in and out: POST /api/v1/auth/sign-in and /sign-out. */
import { useMutation, useQueryClient } from '@tanstack/react-query';

import { apiRequest } from './api';
import { meKeys, meQueryOptions, type Me, type User } from './me';

export interface SignInInput {
  email: string;
  password: string;
}

export function useSignInMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SignInInput) =>
      apiRequest<{ user: User }>('/api/v1/auth/sign-in', { method: 'POST', body: input }),
    onSuccess: async (): Promise<void> => {
      // A new session: whatever was cached belonged to nobody or to someone else.
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== meKeys.all[0] });
      await queryClient.invalidateQueries({ queryKey: meKeys.all });
    },
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
