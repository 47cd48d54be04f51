import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type { Role } from '@/shared/permissions';
import type { CreateInvitationInput, Member, PendingInvitation } from '@/shared/schemas/accounts';

import { apiClient } from './client';
import { STALE } from './stale';

export const memberKeys = { all: ['members'] as const, invitations: ['invitations'] as const };

export const useMembersQuery = () =>
  useQuery({ queryKey: memberKeys.all, queryFn: ({ signal }) => apiClient.get<Member[]>('/api/members', signal), staleTime: STALE.SECONDS.THIRTY });

export const useInvitationsQuery = (enabled: boolean) =>
  useQuery({ queryKey: memberKeys.invitations, queryFn: ({ signal }) => apiClient.get<PendingInvitation[]>('/api/invitations', signal), enabled });

export function useInvitationCreateMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateInvitationInput) => apiClient.post<PendingInvitation>('/api/invitations', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: memberKeys.invitations }),
  });
}

export function useInvitationWithdrawMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => apiClient.delete<void>(`/api/invitations/${id}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: memberKeys.invitations }),
  });
}

export function useMemberRoleMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, role }: { id: number; role: Role }) => apiClient.patch<Member>(`/api/members/${id}`, { role }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: memberKeys.all }),
  });
}

export function useMemberRemoveMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => apiClient.delete<void>(`/api/members/${id}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: memberKeys.all }),
  });
}
