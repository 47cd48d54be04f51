import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type { LibraryName } from '@/shared/library-terms';
import type { Page } from '@/shared/schemas/library-common';
import type {
  CopySpecificationInput,
  CreatePhaseInput,
  CreateSpeciesInput,
  CreateSpecificationInput,
  Species,
  SpecificationDetail,
  SpecificationSummary,
  UpdateSpecificationInput,
} from '@/shared/schemas/specifications';

import { apiClient } from './client';
import { STALE } from './stale';

export const speciesKeys = { all: ['species'] as const, list: () => [...speciesKeys.all, 'list'] as const };

export const speciesQueryOptions = () =>
  queryOptions({ queryKey: speciesKeys.list(), queryFn: ({ signal }) => apiClient.get<Page<Species>>('/api/species?pageSize=200', signal), staleTime: STALE.MINUTES.FIVE });
export const useSpeciesQuery = () => useQuery(speciesQueryOptions());

/** Adds a species or a phase; both answer the species with its phases, which refreshes the list. */
function useSpeciesMutation<TInput>(fn: (input: TInput) => Promise<Species>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: fn, onSuccess: () => queryClient.invalidateQueries({ queryKey: speciesKeys.all }) });
}

export const useSpeciesCreateMutation = () => useSpeciesMutation((input: CreateSpeciesInput) => apiClient.post<Species>('/api/species', input));
export const usePhaseCreateMutation = () =>
  useSpeciesMutation(({ speciesId, ...input }: CreatePhaseInput & { speciesId: number }) => apiClient.post<Species>(`/api/species/${speciesId}/phases`, input));

export type SpecificationListParams = { library: LibraryName; speciesId?: number };

export const specificationKeys = {
  all: ['specifications'] as const,
  list: (params: SpecificationListParams) => [...specificationKeys.all, 'list', params] as const,
  detail: (id: number) => [...specificationKeys.all, 'detail', id] as const,
};

export const specificationsQueryOptions = (params: SpecificationListParams) =>
  queryOptions({
    queryKey: specificationKeys.list(params),
    queryFn: ({ signal }) =>
      apiClient.get<Page<SpecificationSummary>>(`/api/specifications?pageSize=200&library=${params.library}${params.speciesId ? `&speciesId=${params.speciesId}` : ''}`, signal),
    staleTime: STALE.SECONDS.THIRTY,
  });
export const useSpecificationsQuery = (params: SpecificationListParams) => useQuery(specificationsQueryOptions(params));

export const specificationQueryOptions = (id: number) =>
  queryOptions({ queryKey: specificationKeys.detail(id), queryFn: ({ signal }) => apiClient.get<SpecificationDetail>(`/api/specifications/${id}`, signal), staleTime: STALE.SECONDS.THIRTY });
export const useSpecificationQuery = (id: number) => useQuery(specificationQueryOptions(id));

function useSpecificationMutation<TInput>(fn: (input: TInput) => Promise<SpecificationDetail>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: (detail) => {
      queryClient.setQueryData(specificationKeys.detail(detail.id), detail);
      return queryClient.invalidateQueries({ queryKey: [...specificationKeys.all, 'list'] });
    },
  });
}

export const useSpecificationCreateMutation = () => useSpecificationMutation((input: CreateSpecificationInput) => apiClient.post<SpecificationDetail>('/api/specifications', input));
/** Copies a specification; with `phaseId` into that phase (same species, or another species of the same family). */
export const useSpecificationCopyMutation = () =>
  useSpecificationMutation(({ id, ...input }: CopySpecificationInput & { id: number }) => apiClient.post<SpecificationDetail>(`/api/specifications/${id}/copy`, input));
export const useSpecificationUpdateMutation = (id: number) =>
  useSpecificationMutation((input: UpdateSpecificationInput) => apiClient.put<SpecificationDetail>(`/api/specifications/${id}`, input));
