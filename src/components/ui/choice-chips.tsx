import { Pressable, StyleSheet, View } from 'react-native';

import { colors, radius, space, TOUCH_MIN } from '@/theme';

import { AppText } from './text';

/** A small set of mutually exclusive choices shown all at once (better than a dropdown on a phone). */
export function ChoiceChips<T extends string>({ label, options, value, onChange, testID }: { label: string; options: readonly { value: T; label: string }[]; value: T; onChange: (value: T) => void; testID?: string }) {
  return (
    <View style={styles.wrap} role="radiogroup" aria-label={label} testID={testID}>
      <AppText variant="label">{label}</AppText>
      <View style={styles.row}>
        {options.map((option) => {
          const selected = option.value === value;
          return (
            <Pressable
              key={option.value}
              role="radio"
              aria-checked={selected}
              onPress={() => onChange(option.value)}
              testID={testID ? `${testID}-${option.value}` : undefined}
              style={[styles.chip, selected && styles.chipSelected]}
            >
              <AppText variant="small" style={selected ? styles.textSelected : undefined}>{option.label}</AppText>
            </Pressable>
          );
        })}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.xs },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  chip: { minHeight: TOUCH_MIN - 8, justifyContent: 'center', paddingHorizontal: space.md, borderRadius: radius.lg, borderWidth: 1, borderColor: colors.rule, backgroundColor: colors.paperRaised },
  chipSelected: { backgroundColor: colors.brand, borderColor: colors.brand },
  textSelected: { color: colors.onBrand },
});
