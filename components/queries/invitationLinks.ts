/** An invitation link as its holder sees it: GET /api/v1/invitations/:token and accepting it. */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type { InvitationAccepted, InvitationLink } from '@/ingest/wire';

import { apiRequest } from './api';
import { meKeys } from './me';

// The shapes the server answers have one home; screens keep importing them from here.
export type { InvitationAccepted, InvitationLink };

const linkPath = (token: string) => `/api/v1/invitations/${encodeURIComponent(token)}`;

export const invitationLinkKeys = {
  all: ['invitation-link'] as const,
  token: (token: string) => [...invitationLinkKeys.all, token] as const,
};

export function useInvitationLinkQuery(token: string) {
  return useQuery({
    queryKey: invitationLinkKeys.token(token),
    queryFn: ({ signal }) => apiRequest<InvitationLink>(linkPath(token), { signal }),
    retry: false,
  });
}

export function useAcceptInvitationMutation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { name?: string; password?: string }) =>
      apiRequest<InvitationAccepted>(`${linkPath(token)}/accept`, {
        method: 'POST',
        body: input,
      }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: meKeys.all }),
  });
}
