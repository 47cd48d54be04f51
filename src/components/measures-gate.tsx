import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { useQuery } from '@tanstack/react-query';

import { organizationSettingsQueryOptions } from '@/api/organization-settings';
import { useActiveMembership } from '@/api/session';
import { space } from '@/theme';

import { ErrorState } from './error-state';
import { AppText } from './ui/text';

/**
 * Holds a page until the active organization's units and currency are known. Without it a mill set to
 * lb and short tons would see kg and tonnes for a moment, and a field typed in that moment would be read
 * in the wrong unit. A person with no organization yet has no settings to wait for.
 */
export function MeasuresGate({ children }: { children: ReactNode }) {
  const { membership } = useActiveMembership();
  const settings = useQuery({ ...organizationSettingsQueryOptions(), enabled: membership !== null });
  if (membership === null || settings.isSuccess) return <>{children}</>;
  return (
    <View style={styles.page} testID="measures-gate">
      {settings.isError ? (
        <ErrorState error={settings.error} onRetry={() => settings.refetch()} title="Your organization’s units could not be loaded" />
      ) : (
        <AppText muted>Loading…</AppText>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  page: { flex: 1, justifyContent: 'center', alignItems: 'center', padding: space.lg },
});
