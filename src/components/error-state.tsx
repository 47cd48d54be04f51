import { StyleSheet, View } from 'react-native';

import { ApiError } from '@/api/client';
import { colors, radius, space } from '@/theme';

import { Button } from './ui/button';
import { AppText } from './ui/text';

/** Turns any error into a sentence a person can act on; never a stack trace. */
export function describeError(error: unknown): string {
  if (error instanceof ApiError) {
    if (error.isNetwork) return 'Troughline’s server cannot be reached. Check that it is running and that you are online.';
    if (error.status === 503) return 'The database is not answering at the moment. Your saved work is safe; try again in a minute.';
    return error.message;
  }
  return 'Something went wrong while loading this page.';
}

/** The one error block every screen uses: a plain message and a retry. */
export function ErrorState({ error, onRetry, title = 'This could not be loaded' }: { error: unknown; onRetry?: () => void; title?: string }) {
  return (
    <View style={styles.box} accessibilityRole="alert" testID="error-state">
      <AppText variant="label" style={styles.title}>{title}</AppText>
      <AppText>{describeError(error)}</AppText>
      {onRetry ? <Button label="Try again" tone="quiet" onPress={onRetry} testID="error-retry" /> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.md, padding: space.lg, borderRadius: radius.md, backgroundColor: colors.dangerSoft, borderLeftWidth: 4, borderLeftColor: colors.danger },
  title: { color: colors.danger },
});
