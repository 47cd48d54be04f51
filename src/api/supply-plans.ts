import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type {
  AllocateSupplyInput,
  CreateSupplyPlanInput,
  SupplyAllocationOptions,
  SupplyAllocationResponse,
  SupplyPlanDetail,
  SupplyPlanSummary,
  UpdateSupplyPlanInput,
} from '@/shared/schemas/supply';

import { apiClient } from './client';
import { STALE } from './stale';

export const supplyPlanKeys = {
  all: ['supply-plans'] as const,
  list: () => [...supplyPlanKeys.all, 'list'] as const,
  detail: (id: number) => [...supplyPlanKeys.all, 'detail', id] as const,
  options: () => [...supplyPlanKeys.all, 'allocation-options'] as const,
};

export const useSupplyPlansQuery = () =>
  useQuery({ queryKey: supplyPlanKeys.list(), queryFn: ({ signal }) => apiClient.get<SupplyPlanSummary[]>('/api/supply-plans', signal), staleTime: STALE.SECONDS.THIRTY });

export const useSupplyPlanQuery = (id: number | null) =>
  useQuery({
    queryKey: supplyPlanKeys.detail(id ?? 0),
    queryFn: ({ signal }) => apiClient.get<SupplyPlanDetail>(`/api/supply-plans/${id}`, signal),
    enabled: id !== null,
    staleTime: STALE.SECONDS.THIRTY,
  });

export const useSupplyAllocationOptionsQuery = (enabled: boolean) =>
  useQuery({
    queryKey: supplyPlanKeys.options(),
    queryFn: ({ signal }) => apiClient.get<SupplyAllocationOptions>('/api/supply-plans/allocation-options', signal),
    enabled,
    staleTime: STALE.MINUTES.ONE,
  });

export function useSupplyPlanCreateMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateSupplyPlanInput) => apiClient.post<SupplyPlanDetail>('/api/supply-plans', input),
    onSuccess: (plan) => {
      queryClient.setQueryData(supplyPlanKeys.detail(plan.id), plan);
      return queryClient.invalidateQueries({ queryKey: supplyPlanKeys.list() });
    },
  });
}

export function useSupplyPlanUpdateMutation(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateSupplyPlanInput) => apiClient.put<SupplyPlanDetail>(`/api/supply-plans/${id}`, input),
    onSuccess: (plan) => {
      queryClient.setQueryData(supplyPlanKeys.detail(id), plan);
      return queryClient.invalidateQueries({ queryKey: supplyPlanKeys.list() });
    },
  });
}

export const useSupplyAllocateMutation = (id: number) =>
  useMutation({ mutationFn: (input: AllocateSupplyInput) => apiClient.post<SupplyAllocationResponse>(`/api/supply-plans/${id}/allocate`, input) });
