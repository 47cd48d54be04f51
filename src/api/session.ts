import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type { Permission } from '@/shared/permissions';
import { can } from '@/shared/permissions';
import type { InvitationPreview, SessionInfo, SignInInput, SignUpInput } from '@/shared/schemas/accounts';

import { ApiError, apiClient } from './client';
import { STALE } from './stale';

export const sessionKeys = { all: ['session'] as const, invitation: (token: string) => ['invitation-preview', token] as const };

/** The signed-in person and their organizations, or null when signed out (401 is an answer here, not an error). */
export async function fetchSession(signal?: AbortSignal): Promise<SessionInfo | null> {
  try {
    return await apiClient.get<SessionInfo>('/api/auth/me', signal);
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export const sessionQueryOptions = () => queryOptions({ queryKey: sessionKeys.all, queryFn: ({ signal }) => fetchSession(signal), staleTime: STALE.MINUTES.ONE });

export const useSessionQuery = () => useQuery(sessionQueryOptions());

/** The active membership and a permission check for hiding what a role cannot do (the server decides anyway). */
export function useActiveMembership() {
  const { data } = useSessionQuery();
  const membership = data?.memberships.find((m) => m.organizationId === data.activeOrganizationId) ?? null;
  return { membership, can: (permission: Permission) => can(membership?.role, permission) };
}

function useSessionMutation<TInput>(fn: (input: TInput) => Promise<SessionInfo | null>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: (session) => {
      // Another person's or organization's data must never linger in the cache.
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== sessionKeys.all[0] });
      queryClient.setQueryData(sessionKeys.all, session);
    },
  });
}

export const useSignInMutation = () => useSessionMutation((input: SignInInput) => apiClient.post<SessionInfo>('/api/auth/sign-in', input));
export const useSignUpMutation = () => useSessionMutation((input: SignUpInput) => apiClient.post<SessionInfo>('/api/auth/sign-up', input));
export const useSignOutMutation = () => useSessionMutation(async () => (await apiClient.post('/api/auth/sign-out'), null));
export const useSwitchOrganizationMutation = () =>
  useSessionMutation((organizationId: number) => apiClient.put<SessionInfo>('/api/auth/active-organization', { organizationId }));
export const useInvitationAcceptMutation = () => useSessionMutation((token: string) => apiClient.post<SessionInfo>('/api/invitations/accept', { token }));

export const usePasswordResetRequestMutation = () =>
  useMutation({ mutationFn: (email: string) => apiClient.post<{ message: string }>('/api/auth/password-reset', { email }) });

export const usePasswordResetConfirmMutation = () =>
  useMutation({ mutationFn: (input: { token: string; password: string }) => apiClient.post<{ message: string }>('/api/auth/password-reset/confirm', input) });

export const useInvitationPreviewQuery = (token: string | undefined) =>
  useQuery({
    queryKey: sessionKeys.invitation(token ?? ''),
    queryFn: ({ signal }) => apiClient.get<InvitationPreview>(`/api/invitations/preview?token=${encodeURIComponent(token!)}`, signal),
    enabled: !!token,
    retry: false,
  });
