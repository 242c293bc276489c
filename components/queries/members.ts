/** Members of a shop and its open invitations. */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type {
  Invitation,
  InvitationsResponse,
  Member,
  MemberRole,
  MembersResponse,
  Role,
} from '@/ingest/wire';

import { apiRequest } from './api';
import { meKeys } from './me';
import { shopPath } from './shops';

// The shapes the server answers have one home; screens keep importing them from here.
export type { Invitation, InvitationsResponse, Member, MemberRole, MembersResponse };

export const memberKeys = {
  all: ['members'] as const,
  shop: (shopId: string) => [...memberKeys.all, shopId] as const,
  list: (shopId: string) => [...memberKeys.shop(shopId), 'list'] as const,
  invitations: (shopId: string) => [...memberKeys.shop(shopId), 'invitations'] as const,
};

export function membersQueryOptions(shopId: string) {
  return queryOptions({
    queryKey: memberKeys.list(shopId),
    queryFn: ({ signal }) => apiRequest<MembersResponse>(`${shopPath(shopId)}/members`, { signal }),
  });
}

export function useMembersQuery(shopId: string, enabled = true) {
  return useQuery({ ...membersQueryOptions(shopId), enabled });
}

export function useInvitationsQuery(shopId: string, enabled = true) {
  return useQuery({
    queryKey: memberKeys.invitations(shopId),
    queryFn: ({ signal }) =>
      apiRequest<InvitationsResponse>(`${shopPath(shopId)}/invitations`, { signal }),
    enabled,
  });
}

export function useRoleMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { userId: string; role: Role }) =>
      apiRequest<MemberRole>(`${shopPath(shopId)}/members/${encodeURIComponent(input.userId)}`, {
        method: 'PATCH',
        body: { role: input.role },
      }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: memberKeys.shop(shopId) }),
  });
}

export function useRemoveMemberMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: string) =>
      apiRequest<void>(`${shopPath(shopId)}/members/${encodeURIComponent(userId)}`, {
        method: 'DELETE',
      }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: memberKeys.shop(shopId) }),
  });
}

export function useLeaveShopMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiRequest<void>(`${shopPath(shopId)}/membership`, { method: 'DELETE' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: meKeys.all }),
  });
}

export function useInviteMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { email: string; role: Role }) =>
      apiRequest<Invitation>(`${shopPath(shopId)}/invitations`, { method: 'POST', body: input }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: memberKeys.invitations(shopId) }),
  });
}

export function useWithdrawInvitationMutation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) =>
      apiRequest<void>(`${shopPath(shopId)}/invitations/${encodeURIComponent(invitationId)}`, {
        method: 'DELETE',
      }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: memberKeys.invitations(shopId) }),
  });
}
