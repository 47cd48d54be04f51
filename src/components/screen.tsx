import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';

import { colors, space } from '@/theme';

import { AppText } from './ui/text';

/** The scrolling body of a section: a heading, an optional lead line, then the content, capped in width. */
export function Screen({ title, lead, children, testID }: { title: string; lead?: string; children?: ReactNode; testID?: string }) {
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content} testID={testID}>
      <View style={styles.column}>
        <AppText variant="display" accessibilityRole="header" style={styles.title}>{title}</AppText>
        {lead ? <AppText variant="lead" muted>{lead}</AppText> : null}
        {children}
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.paper },
  content: { padding: space.lg, paddingBottom: space.xxl },
  column: { width: '100%', maxWidth: 1200, alignSelf: 'center', gap: space.lg },
  title: { color: colors.brand },
});
