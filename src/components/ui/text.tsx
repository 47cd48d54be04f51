import { StyleSheet, Text, type TextProps } from 'react-native';

import { colors, fonts, fontSize, lineHeight } from '@/theme';

type Variant = 'display' | 'title' | 'lead' | 'body' | 'small' | 'caption' | 'label';

export type AppTextProps = TextProps & { variant?: Variant; muted?: boolean };

/** Body text in the product's text face and type scale. */
export function AppText({ variant = 'body', muted, style, ...rest }: AppTextProps) {
  return <Text {...rest} style={[styles.base, styles[variant], muted && styles.muted, style]} />;
}

/** A number with its unit, in the figures face so columns line up. The unit is never optional. */
export function Figure({ value, unit, style, ...rest }: TextProps & { value: string; unit: string }) {
  return (
    <Text {...rest} style={[styles.base, styles.figure, style]}>
      {value}
      <Text style={styles.unit}> {unit}</Text>
    </Text>
  );
}

const styles = StyleSheet.create({
  base: { color: colors.ink, fontFamily: fonts.text, fontSize: fontSize.body, lineHeight: lineHeight.body },
  display: { fontFamily: fonts.textBold, fontSize: fontSize.display, lineHeight: lineHeight.display },
  title: { fontFamily: fonts.textBold, fontSize: fontSize.title, lineHeight: lineHeight.title },
  lead: { fontSize: fontSize.lead, lineHeight: lineHeight.lead },
  body: {},
  small: { fontSize: fontSize.small, lineHeight: lineHeight.small },
  caption: { fontSize: fontSize.caption, lineHeight: lineHeight.caption },
  label: { fontFamily: fonts.textSemiBold, fontSize: fontSize.small, lineHeight: lineHeight.small, letterSpacing: 0.2 },
  muted: { color: colors.inkMuted },
  figure: { fontFamily: fonts.figures },
  unit: { color: colors.inkMuted, fontFamily: fonts.text, fontSize: fontSize.small },
});
