import { StyleSheet, View } from 'react-native';

import { useHealthQuery } from '@/api/health';
import { ErrorState } from '@/components/error-state';
import { Screen } from '@/components/screen';
import { SectionPlan } from '@/components/section-plan';
import { AppText } from '@/components/ui/text';
import { colors, radius, space } from '@/theme';

function ServerFacts() {
  const health = useHealthQuery();
  if (health.isPending) return <AppText muted>Checking the server…</AppText>;
  if (health.isError) return <ErrorState error={health.error} onRetry={() => health.refetch()} title="Server not reachable" />;
  return (
    <View style={styles.card} testID="server-facts">
      <AppText variant="label">This installation</AppText>
      <AppText>Troughline version {health.data.version}</AppText>
      <AppText testID="database-state">Database: {health.data.database === 'ok' ? 'answering' : 'not answering'}</AppText>
    </View>
  );
}

export function AccountScreen() {
  return (
    <Screen title="Account" lead="Your organization, its members and settings." testID="screen-account">
      <ServerFacts />
      <SectionPlan items={['sign in and switch between the organizations you belong to', 'invite members and give each a role', 'choose metric or US units and your currency']} />
    </Screen>
  );
}

const styles = StyleSheet.create({
  card: { gap: space.xs, padding: space.lg, borderRadius: radius.lg, backgroundColor: colors.paperRaised, borderWidth: 1, borderColor: colors.rule },
});
