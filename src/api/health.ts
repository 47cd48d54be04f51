import { queryOptions, useQuery } from '@tanstack/react-query';

import type { Health } from '@/shared/schemas/health';

import { apiClient } from './client';
import { STALE } from './stale';

export const healthKeys = { all: ['health'] as const };

export const fetchHealth = (signal?: AbortSignal) => apiClient.get<Health>('/api/health', signal);

export const healthQueryOptions = () =>
  queryOptions({ queryKey: healthKeys.all, queryFn: ({ signal }) => fetchHealth(signal), staleTime: STALE.SECONDS.FIFTEEN });

export const useHealthQuery = () => useQuery(healthQueryOptions());
