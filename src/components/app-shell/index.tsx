import { StyleSheet, useWindowDimensions, View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';
import { TabList, Tabs, TabSlot, TabTrigger } from 'expo-router/ui';

import { colors, space, WIDE_MIN_WIDTH } from '@/theme';

import { MeasuresGate } from '../measures-gate';
import { AppText } from '../ui/text';
import { NavItem } from './nav-item';
import { SECTIONS } from './sections';

/**
 * The frame around every section: a bottom bar on a phone, a side rail from WIDE_MIN_WIDTH up.
 * One TabList serves both; on a wide screen the container is reversed so the list sits on the left.
 */
export function AppShell() {
  const { width } = useWindowDimensions();
  const insets = useSafeAreaInsets();
  const wide = width >= WIDE_MIN_WIDTH;
  const layout = wide ? 'rail' : 'bar';

  return (
    <Tabs style={[styles.root, wide ? styles.rootWide : styles.rootNarrow]}>
      <View style={styles.main}>
        <MeasuresGate>
          <TabSlot style={styles.slot} />
        </MeasuresGate>
      </View>
      <TabList
        accessibilityRole="tablist"
        testID={wide ? 'side-rail' : 'bottom-bar'}
        style={wide ? styles.rail : [styles.bar, { paddingBottom: insets.bottom }]}
      >
        {wide ? (
          <View style={styles.brand}>
            <AppText variant="title" style={styles.brandName}>Troughline</AppText>
            <AppText variant="caption" muted>Least-cost rations with insect meal</AppText>
          </View>
        ) : null}
        {SECTIONS.map((section) => (
          <TabTrigger key={section.name} name={section.name} href={section.href} asChild>
            <NavItem section={section} layout={layout} />
          </TabTrigger>
        ))}
      </TabList>
    </Tabs>
  );
}

const styles = StyleSheet.create({
  root: { flex: 1, backgroundColor: colors.paper },
  rootNarrow: { flexDirection: 'column' },
  rootWide: { flexDirection: 'row-reverse' },
  main: { flex: 1 },
  slot: { flex: 1 },
  bar: { flexDirection: 'row', backgroundColor: colors.paperRaised, borderTopWidth: 1, borderTopColor: colors.rule },
  rail: { width: 280, flexDirection: 'column', justifyContent: 'flex-start', gap: space.xs, padding: space.lg, backgroundColor: colors.paperRaised, borderRightWidth: 1, borderRightColor: colors.rule },
  brand: { paddingHorizontal: space.md, paddingBottom: space.xl, paddingTop: space.sm },
  brandName: { color: colors.brand },
});
