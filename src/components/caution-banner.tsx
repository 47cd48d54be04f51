import { StyleSheet, View } from 'react-native';

import { colors, radius, space } from '@/theme';

import { AppText } from './ui/text';

/**
 * The caution shown on every result and batch sheet. It cannot be dismissed: a ration that harms animals
 * or breaks feed law costs far more than the screen space.
 */
export function CautionBanner({ compact = false }: { compact?: boolean }) {
  return (
    <View style={styles.box} accessibilityRole="alert" testID="caution-banner">
      <AppText variant="label" style={styles.title}>Decision support, not a feeding instruction</AppText>
      <AppText variant={compact ? 'caption' : 'small'}>
        Results are estimates from the nutrient values and prices entered. A veterinarian or qualified animal nutritionist
        must review a diet before it is fed. Local feed regulations apply, including the rules on insect protein,
        processed animal proteins and what insects may be reared on.
      </AppText>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.xs, padding: space.md, borderRadius: radius.md, backgroundColor: colors.cautionSoft, borderLeftWidth: 4, borderLeftColor: colors.caution },
  title: { color: colors.caution },
});
