import { forwardRef } from 'react';
import { Pressable, StyleSheet, View, type View as ViewType } from 'react-native';
import type { TabTriggerSlotProps } from 'expo-router/ui';

import { colors, fonts, radius, space, TOUCH_MIN } from '@/theme';

import { AppText } from '../ui/text';
import type { Section } from './sections';

type NavItemProps = TabTriggerSlotProps & { section: Section; layout: 'bar' | 'rail' };

/** One entry of the navigation: an icon over a label in the bottom bar, an icon beside label and hint on the rail. */
export const NavItem = forwardRef<ViewType, NavItemProps>(function NavItem({ section, layout, isFocused, ...pressable }, ref) {
  const tint = isFocused ? colors.brand : colors.inkMuted;
  const { Icon } = section;
  return (
    <Pressable
      ref={ref}
      {...pressable}
      role="link"
      // A tab here is a link to a section; aria-current marks the one shown.
      aria-current={isFocused ? 'page' : undefined}
      testID={`nav-${section.name}`}
      style={[layout === 'bar' ? styles.bar : styles.rail, isFocused && (layout === 'bar' ? styles.barFocused : styles.railFocused)]}
    >
      <Icon color={tint} size={layout === 'bar' ? 22 : 24} />
      {layout === 'bar' ? (
        <AppText variant="caption" numberOfLines={1} style={[styles.barLabel, { color: tint }, isFocused && styles.focusedLabel]}>
          {section.label}
        </AppText>
      ) : (
        <View style={styles.railText}>
          <AppText style={[{ color: isFocused ? colors.brand : colors.ink }, isFocused && styles.focusedLabel]}>{section.label}</AppText>
          <AppText variant="caption" muted>{section.hint}</AppText>
        </View>
      )}
    </Pressable>
  );
});

const styles = StyleSheet.create({
  bar: { flex: 1, minHeight: TOUCH_MIN + 8, alignItems: 'center', justifyContent: 'center', gap: 2, paddingTop: space.xs, borderTopWidth: 3, borderTopColor: 'transparent' },
  barFocused: { borderTopColor: colors.accent },
  barLabel: { fontSize: 12 },
  rail: { flexDirection: 'row', alignItems: 'center', gap: space.md, minHeight: TOUCH_MIN + 8, paddingHorizontal: space.md, borderRadius: radius.md },
  railFocused: { backgroundColor: colors.brandSoft },
  railText: { flex: 1 },
  focusedLabel: { fontFamily: fonts.textSemiBold },
});
