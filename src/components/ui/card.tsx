import type { ReactNode } from 'react';
import { StyleSheet, View, type ViewProps } from 'react-native';

import { colors, radius, space } from '@/theme';

import { AppText } from './text';

/** A raised panel with an optional heading. */
export function Card({ title, children, style, ...rest }: ViewProps & { title?: string; children?: ReactNode }) {
  return (
    <View {...rest} style={[styles.card, style]}>
      {title ? <AppText variant="lead" style={styles.title} accessibilityRole="header">{title}</AppText> : null}
      {children}
    </View>
  );
}

const styles = StyleSheet.create({
  card: { gap: space.md, padding: space.lg, borderRadius: radius.lg, backgroundColor: colors.paperRaised, borderWidth: 1, borderColor: colors.rule },
  title: { fontWeight: '600' },
});
