import { StyleSheet, View } from 'react-native';

import { useHealthQuery } from '@/api/health';
import { colors, space } from '@/theme';

import { describeError } from '../error-state';
import { Button } from '../ui/button';
import { AppText } from '../ui/text';

/**
 * A strip across the top of every screen that appears only when the API or its database is down,
 * so a person knows why nothing loads and can retry instead of staring at a blank page.
 */
export function ServiceStatus() {
  const health = useHealthQuery();
  const down = health.isError || health.data?.database === 'down';
  if (!down) return null;
  const message = health.isError
    ? describeError(health.error)
    : 'The database is not answering at the moment. Your saved work is safe; try again in a minute.';
  return (
    <View style={styles.strip} accessibilityRole="alert" testID="service-status">
      <AppText style={styles.text}>{message}</AppText>
      <Button label={health.isFetching ? 'Checking…' : 'Retry'} tone="quiet" disabled={health.isFetching} onPress={() => health.refetch()} testID="service-retry" />
    </View>
  );
}

const styles = StyleSheet.create({
  strip: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.md, padding: space.md, backgroundColor: colors.dangerSoft, borderBottomWidth: 1, borderBottomColor: colors.danger },
  text: { flex: 1, minWidth: 200, color: colors.ink },
});
