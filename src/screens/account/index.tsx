import { StyleSheet, useWindowDimensions, View } from 'react-native';
import { useRouter } from 'expo-router';

import { useHealthQuery } from '@/api/health';
import { useActiveMembership, useSessionQuery, useSignOutMutation } from '@/api/session';
import { ErrorState } from '@/components/error-state';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { AppText } from '@/components/ui/text';
import { ROLE_DESCRIPTIONS, ROLE_LABELS } from '@/shared/permissions';
import { space, WIDE_MIN_WIDTH } from '@/theme';

import { InviteCard } from './invite-card';
import { MembersCard } from './members-card';
import { OrganizationsCard } from './organizations-card';
import { SettingsCard } from './settings-card';

function YouCard() {
  const router = useRouter();
  const session = useSessionQuery();
  const { membership } = useActiveMembership();
  const signOut = useSignOutMutation();
  if (!session.data) return null;
  return (
    <Card title="You" testID="you-card">
      <AppText testID="you-name">{session.data.user.name} · {session.data.user.email}</AppText>
      {membership ? (
        <AppText testID="you-role">
          {ROLE_LABELS[membership.role]} at {membership.organizationName}. {ROLE_DESCRIPTIONS[membership.role]}
        </AppText>
      ) : null}
      <Button label={signOut.isPending ? 'Signing out…' : 'Sign out'} tone="quiet" testID="sign-out" onPress={async () => {
        await signOut.mutateAsync(undefined);
        router.replace('/sign-in');
      }} />
    </Card>
  );
}

function ServerFacts() {
  const health = useHealthQuery();
  if (health.isPending) return <AppText muted>Checking the server…</AppText>;
  if (health.isError) return <ErrorState error={health.error} onRetry={() => health.refetch()} title="Server not reachable" />;
  return (
    <Card title="This installation" testID="server-facts">
      <AppText>Troughline version {health.data.version}</AppText>
      <AppText testID="database-state">Database: {health.data.database === 'ok' ? 'answering' : 'not answering'}</AppText>
    </Card>
  );
}

export function AccountScreen() {
  const { can } = useActiveMembership();
  const wide = useWindowDimensions().width >= WIDE_MIN_WIDTH;
  return (
    <Screen title="Account" lead="You, your organizations and their members." testID="screen-account">
      <View style={[styles.columns, wide && styles.columnsWide]}>
        <View style={styles.column}>
          <YouCard />
          <OrganizationsCard />
          <ServerFacts />
        </View>
        <View style={styles.column}>
          <MembersCard />
          {can('members:manage') ? <InviteCard /> : null}
          {can('settings:manage') ? <SettingsCard /> : null}
        </View>
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  columns: { gap: space.lg },
  columnsWide: { flexDirection: 'row', alignItems: 'flex-start' },
  column: { flex: 1, gap: space.lg, minWidth: 0 },
});
