import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type { IngredientCategory, LibraryName } from '@/shared/library-terms';
import type { CreateIngredientInput, IngredientDetail, IngredientSummary, LabAnalysisInput, UpdateIngredientInput } from '@/shared/schemas/ingredients';
import type { LabAnalysisRecorded } from '@/shared/schemas/lab-imports';
import type { Page } from '@/shared/schemas/library-common';
import type { RecordPricesInput, RecordPricesResult } from '@/shared/schemas/prices';

import { apiClient } from './client';
import { labImportKeys } from './lab-imports';
import { STALE } from './stale';

export type IngredientListParams = { library: LibraryName; search?: string; category?: IngredientCategory; page?: number; pageSize?: number };

export const ingredientKeys = {
  all: ['ingredients'] as const,
  list: (params: IngredientListParams) => [...ingredientKeys.all, 'list', params] as const,
  detail: (id: number) => [...ingredientKeys.all, 'detail', id] as const,
};

function query(params: Record<string, string | number | undefined>): string {
  const pairs = Object.entries(params).filter(([, v]) => v !== undefined && v !== '').map(([k, v]) => `${k}=${encodeURIComponent(String(v))}`);
  return pairs.length ? `?${pairs.join('&')}` : '';
}

export const ingredientsQueryOptions = (params: IngredientListParams) =>
  queryOptions({
    queryKey: ingredientKeys.list(params),
    queryFn: ({ signal }) => apiClient.get<Page<IngredientSummary>>(`/api/ingredients${query(params)}`, signal),
    staleTime: STALE.SECONDS.THIRTY,
    placeholderData: keepPreviousData,
  });

export const useIngredientsQuery = (params: IngredientListParams) => useQuery(ingredientsQueryOptions(params));

export const ingredientQueryOptions = (id: number) =>
  queryOptions({ queryKey: ingredientKeys.detail(id), queryFn: ({ signal }) => apiClient.get<IngredientDetail>(`/api/ingredients/${id}`, signal), staleTime: STALE.SECONDS.THIRTY });

export const useIngredientQuery = (id: number) => useQuery({ ...ingredientQueryOptions(id), enabled: id > 0 });

function useIngredientMutation<TInput>(fn: (input: TInput) => Promise<IngredientDetail>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: (detail) => {
      queryClient.setQueryData(ingredientKeys.detail(detail.id), detail);
      return queryClient.invalidateQueries({ queryKey: [...ingredientKeys.all, 'list'] });
    },
  });
}

export const useIngredientCreateMutation = () => useIngredientMutation((input: CreateIngredientInput) => apiClient.post<IngredientDetail>('/api/ingredients', input));
export const useIngredientUpdateMutation = (id: number) => useIngredientMutation((input: UpdateIngredientInput) => apiClient.patch<IngredientDetail>(`/api/ingredients/${id}`, input));

/** Records a lab analysis typed in by hand: it joins the ingredient's analysis history, and its values the library. */
export function useLabAnalysisMutation(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: LabAnalysisInput) => apiClient.post<LabAnalysisRecorded>(`/api/ingredients/${id}/lab-analyses`, input),
    onSuccess: (recorded) => {
      queryClient.setQueryData(ingredientKeys.detail(id), recorded.ingredient);
      queryClient.invalidateQueries({ queryKey: labImportKeys.all });
      return queryClient.invalidateQueries({ queryKey: [...ingredientKeys.all, 'list'] });
    },
  });
}

/** Deletes an ingredient of our library; a 409 `in_use` names the formulas and other things still using it. */
export function useIngredientDeleteMutation(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiClient.delete<void>(`/api/ingredients/${id}`),
    onSuccess: () => {
      queryClient.removeQueries({ queryKey: ingredientKeys.detail(id) });
      queryClient.invalidateQueries({ queryKey: labImportKeys.all });
      return queryClient.invalidateQueries({ queryKey: [...ingredientKeys.all, 'list'] });
    },
  });
}
export const useIngredientCopyMutation = () => useIngredientMutation((id: number) => apiClient.post<IngredientDetail>(`/api/ingredients/${id}/copy`, {}));

/** Starts (or completes) our library as a copy of the reference tables. */
export function useReferenceLibraryCopyMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiClient.post<{ copied: number }>('/api/ingredients/copy-reference', {}),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ingredientKeys.all }),
  });
}

/** Many prices at once, all on one date. */
export function usePricesRecordMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: RecordPricesInput) => apiClient.post<RecordPricesResult>('/api/prices', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ingredientKeys.all }),
  });
}
