import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { DEFAULT_MEASURES, type Measures } from '@/shared/measures';
import type { OrganizationSettings, OrganizationSettingsInput } from '@/shared/schemas/organization-settings';

import { apiClient } from './client';
import { STALE } from './stale';

export const organizationSettingsKeys = { all: ['organization-settings'] as const };

export const organizationSettingsQueryOptions = () =>
  queryOptions({ queryKey: organizationSettingsKeys.all, queryFn: ({ signal }) => apiClient.get<OrganizationSettings>('/api/organization-settings', signal), staleTime: STALE.MINUTES.FIVE });
export const useOrganizationSettingsQuery = () => useQuery(organizationSettingsQueryOptions());

/** The active organization's units and currency; metric and EUR until they arrive. */
export function useMeasures(): Measures {
  const q = useOrganizationSettingsQuery();
  return q.data ? { unitSystem: q.data.unitSystem, currency: q.data.currency } : DEFAULT_MEASURES;
}

export function useOrganizationSettingsMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: OrganizationSettingsInput) => apiClient.put<OrganizationSettings>('/api/organization-settings', input),
    // Every screen reads amounts through these settings: refresh them all.
    onSuccess: (saved) => {
      queryClient.setQueryData(organizationSettingsKeys.all, saved);
      return queryClient.invalidateQueries();
    },
  });
}
