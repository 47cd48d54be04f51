import { StyleSheet, View } from 'react-native';

import { colors, space } from '@/theme';

import { ErrorState } from './error-state';
import { AppText } from './ui/text';

/** The whole page while the app cannot show anything else yet: loading, or why not with a retry. */
export function FullPageState({ message, error, onRetry }: { message?: string; error?: unknown; onRetry?: () => void }) {
  return (
    <View style={styles.page} testID="full-page-state">
      <View style={styles.column}>
        <AppText variant="title" style={styles.brand}>Troughline</AppText>
        {error ? <ErrorState error={error} onRetry={onRetry} title="Troughline cannot start" /> : <AppText muted>{message}</AppText>}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  page: { flex: 1, backgroundColor: colors.paper, justifyContent: 'center', padding: space.lg },
  column: { width: '100%', maxWidth: 480, alignSelf: 'center', gap: space.lg },
  brand: { color: colors.brand },
});
