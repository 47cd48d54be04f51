import { StyleSheet, View } from 'react-native';

import { colors, radius, space } from '@/theme';

import { AppText } from './ui/text';

/**
 * Says plainly what a section will hold while its screens are still being built,
 * instead of showing empty tables that look broken or fake data that looks real.
 */
export function SectionPlan({ items }: { items: string[] }) {
  return (
    <View style={styles.card} testID="section-plan">
      <AppText variant="label">Being built</AppText>
      <AppText muted>This section is not ready yet. It will let you:</AppText>
      {items.map((item) => (
        <AppText key={item}>{'\u2022'} {item}</AppText>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  card: { gap: space.sm, padding: space.lg, borderRadius: radius.lg, backgroundColor: colors.paperRaised, borderWidth: 1, borderColor: colors.rule },
});
