import { forwardRef } from 'react';
import { StyleSheet, TextInput, View, type TextInputProps } from 'react-native';

import { colors, fonts, fontSize, radius, space, TOUCH_MIN } from '@/theme';

import { AppText } from './text';

export type TextFieldProps = TextInputProps & {
  label: string;
  /** Shown under the field in the danger colour; also marks the field invalid for screen readers. */
  error?: string | false;
  /** A unit or hint shown beside the label, e.g. "kg" or "at least 10 characters". */
  hint?: string;
};

/** A labelled text input with its error underneath; 48 px tall for thumbs. */
export const TextField = forwardRef<TextInput, TextFieldProps>(function TextField({ label, error, hint, style, testID, ...input }, ref) {
  return (
    <View style={styles.field}>
      <View style={styles.labelRow}>
        <AppText variant="label" nativeID={testID ? `${testID}-label` : undefined}>{label}</AppText>
        {hint ? <AppText variant="caption" muted>{hint}</AppText> : null}
      </View>
      <TextInput
        ref={ref}
        testID={testID}
        aria-label={label}
        aria-invalid={!!error}
        placeholderTextColor={colors.inkFaint}
        {...input}
        style={[styles.input, !!error && styles.inputError, style]}
      />
      {error ? <AppText variant="small" style={styles.error} testID={testID ? `${testID}-error` : undefined}>{error}</AppText> : null}
    </View>
  );
});

const styles = StyleSheet.create({
  field: { gap: space.xs },
  labelRow: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'baseline', gap: space.sm },
  input: {
    minHeight: TOUCH_MIN,
    paddingHorizontal: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.rule,
    backgroundColor: colors.paperRaised,
    color: colors.ink,
    fontFamily: fonts.text,
    fontSize: fontSize.body,
  },
  inputError: { borderColor: colors.danger, borderWidth: 2 },
  error: { color: colors.danger },
});
