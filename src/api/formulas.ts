import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type {
  ApprovedFormula,
  CreateFormulaInput,
  FormulaChoices,
  FormulaDetail,
  FormulaInputsInput,
  FormulaPriceSweep,
  FormulaRemoval,
  FormulaSolve,
  FormulaSummary,
  UpdateFormulaInput,
  VersionComparison,
  VersionDetail,
} from '@/shared/schemas/formulas';

import { apiClient } from './client';
import { STALE } from './stale';

export const formulaKeys = {
  all: ['formulas'] as const,
  /** Every list (a prefix for invalidation); `listOf` is one of them. */
  list: () => [...formulaKeys.all, 'list'] as const,
  listOf: (archived: boolean) => [...formulaKeys.list(), archived ? 'archived' : 'in-use'] as const,
  detail: (id: number) => [...formulaKeys.all, 'detail', id] as const,
  version: (id: number, versionId: number) => [...formulaKeys.all, 'version', id, versionId] as const,
  compare: (id: number, a: number, b: number) => [...formulaKeys.all, 'compare', id, a, b] as const,
  choices: (specificationId?: number) => [...formulaKeys.all, 'choices', specificationId ?? 0] as const,
  approved: () => [...formulaKeys.all, 'approved'] as const,
  removal: (id: number) => [...formulaKeys.all, 'removal', id] as const,
};

/** The formulas in use, or with `archived` the archived ones (never both in one list). */
export const formulasQueryOptions = (archived = false) =>
  queryOptions({
    queryKey: formulaKeys.listOf(archived),
    queryFn: ({ signal }) => apiClient.get<FormulaSummary[]>(`/api/formulas${archived ? '?archived=true' : ''}`, signal),
    staleTime: STALE.SECONDS.THIRTY,
  });
export const useFormulasQuery = (archived = false, enabled = true) => useQuery({ ...formulasQueryOptions(archived), enabled });

export const formulaQueryOptions = (id: number) =>
  queryOptions({ queryKey: formulaKeys.detail(id), queryFn: ({ signal }) => apiClient.get<FormulaDetail>(`/api/formulas/${id}`, signal), staleTime: STALE.SECONDS.THIRTY });
export const useFormulaQuery = (id: number) => useQuery({ ...formulaQueryOptions(id), enabled: id > 0 });

export const useFormulaVersionQuery = (id: number, versionId: number | null) =>
  useQuery({
    queryKey: formulaKeys.version(id, versionId ?? 0),
    queryFn: ({ signal }) => apiClient.get<VersionDetail>(`/api/formulas/${id}/versions/${versionId}`, signal),
    // A version never changes once kept (only its approval), so it can stay cached a while.
    staleTime: STALE.MINUTES.ONE,
    enabled: !!versionId,
  });

export const useFormulaCompareQuery = (id: number, a: number | null, b: number | null) =>
  useQuery({
    queryKey: formulaKeys.compare(id, a ?? 0, b ?? 0),
    queryFn: ({ signal }) => apiClient.get<VersionComparison>(`/api/formulas/${id}/compare?a=${a}&b=${b}`, signal),
    staleTime: STALE.MINUTES.ONE,
    enabled: !!a && !!b && a !== b,
  });

export const useFormulaChoicesQuery = (specificationId?: number, enabled = true) =>
  useQuery({
    queryKey: formulaKeys.choices(specificationId),
    queryFn: ({ signal }) => apiClient.get<FormulaChoices>(`/api/formulas/choices${specificationId ? `?specificationId=${specificationId}` : ''}`, signal),
    staleTime: STALE.SECONDS.THIRTY,
    enabled,
  });

export const useApprovedFormulasQuery = () =>
  useQuery({ queryKey: formulaKeys.approved(), queryFn: ({ signal }) => apiClient.get<ApprovedFormula[]>('/api/formulas/approved', signal), staleTime: STALE.SECONDS.THIRTY });

export function useFormulaCreateMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateFormulaInput) => apiClient.post<FormulaDetail>('/api/formulas', input),
    onSuccess: (detail) => {
      queryClient.setQueryData(formulaKeys.detail(detail.id), detail);
      return queryClient.invalidateQueries({ queryKey: formulaKeys.list() });
    },
  });
}

export function useFormulaUpdateMutation(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateFormulaInput) => apiClient.put<FormulaDetail>(`/api/formulas/${id}`, input),
    onSuccess: (detail) => {
      queryClient.setQueryData(formulaKeys.detail(id), detail);
      return queryClient.invalidateQueries({ queryKey: formulaKeys.list() });
    },
  });
}

/** Solves the given inputs on the server without saving them. */
export const useFormulaSolveMutation = (id: number) =>
  useMutation({ mutationFn: (inputs: FormulaInputsInput) => apiClient.post<FormulaSolve>(`/api/formulas/${id}/solve`, { inputs }) });

export function useVersionKeepMutation(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { inputs: FormulaInputsInput; note?: string }) => apiClient.post<VersionDetail>(`/api/formulas/${id}/versions`, input),
    onSuccess: (version) => {
      queryClient.setQueryData(formulaKeys.version(id, version.id), version);
      return queryClient.invalidateQueries({ queryKey: formulaKeys.all });
    },
  });
}

export function useVersionApproveMutation(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (versionId: number) => apiClient.post<VersionDetail>(`/api/formulas/${id}/versions/${versionId}/approve`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: formulaKeys.all }),
  });
}

export const useFormulaPriceSweepMutation = (id: number) =>
  useMutation({
    mutationFn: (input: { ingredientId: number; inputs: FormulaInputsInput; fromPrice?: number; toPrice?: number }) =>
      apiClient.post<FormulaPriceSweep>(`/api/formulas/${id}/price-sweep`, { steps: 41, ...input }),
  });

/** What deleting the formula would do, or what holds it; read fresh each time the question is asked. */
export const useFormulaRemovalQuery = (id: number, enabled: boolean) =>
  useQuery({
    queryKey: formulaKeys.removal(id),
    queryFn: ({ signal }) => apiClient.get<FormulaRemoval>(`/api/formulas/${id}/removal`, signal),
    staleTime: 0,
    gcTime: 0,
    enabled,
  });

/** Deletes a formula never approved, with its versions; a 409 `in_use` names what holds it. */
export function useFormulaDeleteMutation(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiClient.delete<void>(`/api/formulas/${id}`),
    // The screen leaves the formula at once; its cached detail goes stale with it and is never shown again.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: formulaKeys.list() }),
  });
}

/**
 * Archives (`archive`) or restores (`restore`) a formula: it leaves or rejoins the working list and the
 * mill's approved list. A 409 says someone else already did it.
 */
export function useFormulaArchiveMutation(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (action: 'archive' | 'restore') => apiClient.post<FormulaDetail>(`/api/formulas/${id}/${action}`),
    onSuccess: (detail) => {
      queryClient.setQueryData(formulaKeys.detail(id), detail);
      queryClient.removeQueries({ queryKey: formulaKeys.removal(id) });
      return Promise.all([queryClient.invalidateQueries({ queryKey: formulaKeys.list() }), queryClient.invalidateQueries({ queryKey: formulaKeys.approved() })]);
    },
  });
}
