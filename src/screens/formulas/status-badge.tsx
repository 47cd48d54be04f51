import { StyleSheet, View } from 'react-native';

import { AppText } from '@/components/ui/text';
import { colors, radius, space } from '@/theme';

const TONES = {
  optimal: { bg: colors.okSoft, fg: colors.ok, word: 'mix found' },
  infeasible: { bg: colors.dangerSoft, fg: colors.danger, word: 'no mix meets the bounds' },
  unbounded: { bg: colors.dangerSoft, fg: colors.danger, word: 'unbounded' },
  failed: { bg: colors.dangerSoft, fg: colors.danger, word: 'solver failed' },
  approved: { bg: colors.brandSoft, fg: colors.brand, word: '' },
  superseded: { bg: colors.paperSunken, fg: colors.inkMuted, word: '' },
} as const;

/** A small coloured label with words (never colour alone). */
export function StatusBadge({ status, label }: { status: keyof typeof TONES; label: string }) {
  const tone = TONES[status];
  return (
    <View style={[styles.badge, { backgroundColor: tone.bg }]}>
      <AppText variant="caption" style={{ color: tone.fg }}>{tone.word ? `${label}: ${tone.word}` : label}</AppText>
    </View>
  );
}

const styles = StyleSheet.create({ badge: { paddingHorizontal: space.sm, paddingVertical: 2, borderRadius: radius.sm, alignSelf: 'flex-start' } });
