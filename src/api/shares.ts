import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type { CreateShareInput, ShareCreated, ShareDetail, ShareSummary, ShareTarget } from '@/shared/schemas/shares';

import { apiClient } from './client';
import { STALE } from './stale';

export const shareKeys = {
  all: ['shares'] as const,
  received: () => [...shareKeys.all, 'received'] as const,
  targets: () => [...shareKeys.all, 'targets'] as const,
  detail: (token: string) => [...shareKeys.all, 'detail', token] as const,
};

export const shareCsvUrl = (token: string) => `/api/shares/${token}/csv`;

export const useShareTargetsQuery = (enabled = true) =>
  useQuery({ queryKey: shareKeys.targets(), queryFn: ({ signal }) => apiClient.get<ShareTarget[]>('/api/shares/targets', signal), staleTime: STALE.MINUTES.ONE, enabled });

export const useReceivedSharesQuery = () =>
  useQuery({ queryKey: shareKeys.received(), queryFn: ({ signal }) => apiClient.get<ShareSummary[]>('/api/shares', signal), staleTime: STALE.SECONDS.THIRTY });

/** A shared result never changes once sent. */
export const useShareQuery = (token: string) =>
  useQuery({ queryKey: shareKeys.detail(token), queryFn: ({ signal }) => apiClient.get<ShareDetail>(`/api/shares/${token}`, signal), staleTime: STALE.MINUTES.FIVE, retry: false, enabled: !!token });

export function useShareCreateMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateShareInput) => apiClient.post<ShareCreated>('/api/shares', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: shareKeys.all }),
  });
}
