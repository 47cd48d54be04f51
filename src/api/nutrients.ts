import { queryOptions, useQuery } from '@tanstack/react-query';

import type { Page } from '@/shared/schemas/library-common';
import type { Nutrient } from '@/shared/schemas/nutrients';

import { apiClient } from './client';
import { STALE } from './stale';

export const nutrientKeys = { all: ['nutrients'] as const, list: () => [...nutrientKeys.all, 'list'] as const };

/** The whole catalogue (a few dozen rows); it changes only with a new version of Troughline. */
export const nutrientsQueryOptions = () =>
  queryOptions({
    queryKey: nutrientKeys.list(),
    queryFn: ({ signal }) => apiClient.get<Page<Nutrient>>('/api/nutrients?pageSize=200', signal),
    staleTime: STALE.INFINITY,
  });

export const useNutrientsQuery = () => useQuery(nutrientsQueryOptions());
