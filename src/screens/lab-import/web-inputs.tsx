import { createElement, useRef } from 'react';
import { Platform, StyleSheet, View } from 'react-native';

import { Button } from '@/components/ui/button';
import { AppText } from '@/components/ui/text';
import { colors, fonts, fontSize, radius, space, TOUCH_MIN } from '@/theme';

/**
 * A button that opens the browser's file chooser (a hidden file input), then hands over the chosen file.
 * On a phone this offers files, cloud drives and mail attachments alike.
 */
export function FileButton({ label, onFile, testID }: { label: string; onFile: (file: File) => void; testID: string }) {
  const input = useRef<HTMLInputElement | null>(null);
  if (Platform.OS !== 'web') return <AppText muted>Uploading a lab file works in the browser.</AppText>;
  return (
    <View>
      {createElement('input', {
        ref: input,
        type: 'file',
        accept: '.csv,.tsv,.txt,text/csv,text/plain,text/tab-separated-values',
        'data-testid': `${testID}-input`,
        style: { display: 'none' },
        onChange: (event: { target: HTMLInputElement }) => {
          const file = event.target.files?.[0];
          // Cleared so choosing the same file again after fixing it still fires a change.
          event.target.value = '';
          if (file) onFile(file);
        },
      })}
      <Button label={label} onPress={() => input.current?.click()} testID={testID} />
    </View>
  );
}

export type SelectOption = { value: string; label: string; group?: string };

/** A native drop-down (the browser's own, good on phones) for long lists such as the nutrient catalogue. */
export function Select({ label, value, options, onChange, testID }: { label: string; value: string; options: SelectOption[]; onChange: (value: string) => void; testID?: string }) {
  const groups = [...new Set(options.map((o) => o.group ?? ''))];
  const optionEl = (o: SelectOption) => createElement('option', { key: o.value, value: o.value }, o.label);
  return createElement(
    'select',
    {
      'aria-label': label,
      'data-testid': testID,
      value,
      onChange: (event: { target: HTMLSelectElement }) => onChange(event.target.value),
      style: styles.select,
    },
    groups.map((g) => (g ? createElement('optgroup', { key: g, label: g }, options.filter((o) => o.group === g).map(optionEl)) : options.filter((o) => !o.group).map(optionEl))),
  );
}

const styles = {
  select: { minHeight: TOUCH_MIN - 8, padding: `0 ${space.sm}px`, borderRadius: radius.md, border: `1px solid ${colors.rule}`, backgroundColor: colors.paperRaised, color: colors.ink, fontFamily: fonts.text, fontSize: fontSize.small, maxWidth: '100%' },
};

export const progressStyles = StyleSheet.create({
  track: { height: 8, borderRadius: 4, backgroundColor: colors.paperSunken, overflow: 'hidden' },
  bar: { height: 8, backgroundColor: colors.brand },
});
