import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';

import { colors, radius, space } from '@/theme';

import { AppText } from '../ui/text';

/** The frame of the signed-out pages: the product name and one narrow card, centred at any width. */
export function AuthFrame({ title, lead, children, testID }: { title: string; lead?: string; children: ReactNode; testID?: string }) {
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content} testID={testID} keyboardShouldPersistTaps="handled">
      <View style={styles.column}>
        <View style={styles.brand}>
          <AppText variant="display" style={styles.brandName}>Troughline</AppText>
          <AppText muted>Least-cost rations for pigs and poultry, insect meal included.</AppText>
        </View>
        <View style={styles.card}>
          <AppText variant="title" accessibilityRole="header">{title}</AppText>
          {lead ? <AppText muted>{lead}</AppText> : null}
          {children}
        </View>
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.paper },
  content: { flexGrow: 1, justifyContent: 'center', padding: space.lg },
  column: { width: '100%', maxWidth: 440, alignSelf: 'center', gap: space.xl },
  brand: { gap: space.xs },
  brandName: { color: colors.brand },
  card: { gap: space.lg, padding: space.xl, borderRadius: radius.lg, backgroundColor: colors.paperRaised, borderWidth: 1, borderColor: colors.rule },
});
