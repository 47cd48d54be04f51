import { StyleSheet, View } from 'react-native';

import { colors, radius, space } from '@/theme';

import { AppText } from './ui/text';

/** A message about a whole form: what went wrong (danger) or what happened (ok). */
export function FormMessage({ tone, text, testID }: { tone: 'danger' | 'ok'; text: string | null | undefined; testID?: string }) {
  if (!text) return null;
  return (
    <View style={[styles.box, tone === 'danger' ? styles.danger : styles.ok]} accessibilityRole={tone === 'danger' ? 'alert' : undefined} testID={testID}>
      <AppText>{text}</AppText>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { padding: space.md, borderRadius: radius.md, borderLeftWidth: 4 },
  danger: { backgroundColor: colors.dangerSoft, borderLeftColor: colors.danger },
  ok: { backgroundColor: colors.okSoft, borderLeftColor: colors.ok },
});
