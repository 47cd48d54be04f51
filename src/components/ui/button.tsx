import { Pressable, StyleSheet, type PressableProps } from 'react-native';

import { colors, fonts, fontSize, radius, space, TOUCH_MIN } from '@/theme';

import { AppText } from './text';

export type ButtonProps = Omit<PressableProps, 'children'> & { label: string; tone?: 'primary' | 'quiet' };

/** A labelled button with a touch target of at least 48 px. */
export function Button({ label, tone = 'primary', style, disabled, ...rest }: ButtonProps) {
  return (
    <Pressable
      accessibilityRole="button"
      disabled={disabled}
      {...rest}
      style={(state) => [
        styles.base,
        tone === 'primary' ? styles.primary : styles.quiet,
        state.pressed && styles.pressed,
        disabled && styles.disabled,
        typeof style === 'function' ? style(state) : style,
      ]}
    >
      <AppText style={[styles.label, tone === 'primary' ? styles.primaryLabel : styles.quietLabel]}>{label}</AppText>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  base: { minHeight: TOUCH_MIN, paddingHorizontal: space.xl, borderRadius: radius.md, alignItems: 'center', justifyContent: 'center', alignSelf: 'flex-start' },
  primary: { backgroundColor: colors.brand },
  quiet: { backgroundColor: 'transparent', borderWidth: 1, borderColor: colors.brand },
  pressed: { opacity: 0.85 },
  disabled: { opacity: 0.5 },
  label: { fontFamily: fonts.textSemiBold, fontSize: fontSize.body },
  primaryLabel: { color: colors.onBrand },
  quietLabel: { color: colors.brand },
});
