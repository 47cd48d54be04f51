import { useMutation, useQuery } from '@tanstack/react-query';

import type { RationCheckInput, RationCheckResponse, RationChoices } from '@/shared/schemas/ration-checks';

import { apiClient } from './client';
import { STALE } from './stale';

export const rationCheckKeys = { choices: ['ration-checks', 'choices'] as const };

export const useRationChoicesQuery = () =>
  useQuery({ queryKey: rationCheckKeys.choices, queryFn: ({ signal }) => apiClient.get<RationChoices>('/api/ration-checks/choices', signal), staleTime: STALE.MINUTES.FIVE });

/** Checks a ration; nothing is saved on the server. */
export const useRationCheckMutation = () => useMutation({ mutationFn: (input: RationCheckInput) => apiClient.post<RationCheckResponse>('/api/ration-checks', input) });
