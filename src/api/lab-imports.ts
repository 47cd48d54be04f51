import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type {
  CommitLabImportInput,
  IngredientAnalyses,
  LabImportPreviewResponse,
  LabImportResult,
  LabImportSummary,
  LabTargetIngredient,
  PreviewLabImportInput,
} from '@/shared/schemas/lab-imports';

import { apiClient } from './client';
import { STALE } from './stale';

export const labImportKeys = {
  all: ['lab-imports'] as const,
  list: () => [...labImportKeys.all, 'list'] as const,
  targets: () => [...labImportKeys.all, 'targets'] as const,
  analyses: (ingredientId: number) => [...labImportKeys.all, 'analyses', ingredientId] as const,
};

export const labImportsQueryOptions = () =>
  queryOptions({ queryKey: labImportKeys.list(), queryFn: ({ signal }) => apiClient.get<{ items: LabImportSummary[] }>('/api/lab-imports', signal), staleTime: STALE.SECONDS.THIRTY });
export const useLabImportsQuery = () => useQuery(labImportsQueryOptions());

export const useLabTargetIngredientsQuery = () =>
  useQuery({ queryKey: labImportKeys.targets(), queryFn: ({ signal }) => apiClient.get<{ items: LabTargetIngredient[] }>('/api/lab-imports/ingredients', signal), staleTime: STALE.SECONDS.THIRTY });

export const useIngredientAnalysesQuery = (ingredientId: number | null) =>
  useQuery({
    queryKey: labImportKeys.analyses(ingredientId ?? 0),
    queryFn: ({ signal }) => apiClient.get<IngredientAnalyses>(`/api/lab-imports/ingredients/${ingredientId}/analyses`, signal),
    enabled: ingredientId !== null,
    staleTime: STALE.SECONDS.THIRTY,
  });

/** Reads the file on the server; writes nothing, so it is a mutation only in name. */
export const useLabImportPreviewMutation = () => useMutation({ mutationFn: (input: PreviewLabImportInput) => apiClient.post<LabImportPreviewResponse>('/api/lab-imports/preview', input) });

export const useLabImportCommitMutation = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CommitLabImportInput) => apiClient.post<LabImportResult>('/api/lab-imports', input),
    onSuccess: () => {
      queryClient.invalidateQueries({ queryKey: labImportKeys.all });
      queryClient.invalidateQueries({ queryKey: ['ingredients'] });
    },
  });
};
