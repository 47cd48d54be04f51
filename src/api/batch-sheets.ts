import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type { BatchLogEntry, BatchSheetResponse, RecordBatchInput } from '@/shared/schemas/batch-sheets';

import { apiClient } from './client';
import { STALE } from './stale';

export type SheetParams = { batchSize?: number; macroStep?: number; minorStep?: number };

export const batchSheetKeys = {
  all: ['batch-sheets'] as const,
  sheet: (versionId: number, p: SheetParams) => [...batchSheetKeys.all, versionId, p.batchSize ?? 0, p.macroStep ?? 0, p.minorStep ?? 0] as const,
  log: (versionId?: number) => ['batches', versionId ?? 0] as const,
};

/** Query string of a sheet request (sizes in the organization's unit). */
export function sheetQuery(p: SheetParams): string {
  const q = Object.entries(p).filter(([, v]) => v !== undefined && Number.isFinite(v) && v > 0).map(([k, v]) => `${k}=${v}`);
  return q.length ? `?${q.join('&')}` : '';
}

export const batchSheetCsvUrl = (versionId: number, p: SheetParams) => `/api/batch-sheets/${versionId}/csv${sheetQuery(p)}`;

export const useBatchSheetQuery = (versionId: number, p: SheetParams) =>
  useQuery({
    queryKey: batchSheetKeys.sheet(versionId, p),
    queryFn: ({ signal }) => apiClient.get<BatchSheetResponse>(`/api/batch-sheets/${versionId}${sheetQuery(p)}`, signal),
    staleTime: STALE.SECONDS.THIRTY,
    placeholderData: (previous) => previous,
    enabled: versionId > 0,
  });

export const useBatchLogQuery = (versionId?: number) =>
  useQuery({
    queryKey: batchSheetKeys.log(versionId),
    queryFn: ({ signal }) => apiClient.get<BatchLogEntry[]>(`/api/batches${versionId ? `?versionId=${versionId}` : ''}`, signal),
    staleTime: STALE.SECONDS.THIRTY,
  });

export function useRecordBatchMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: RecordBatchInput) => apiClient.post<BatchLogEntry>('/api/batches', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['batches'] }),
  });
}
