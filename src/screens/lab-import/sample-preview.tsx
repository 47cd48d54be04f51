import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/ui/card';
import { TextField } from '@/components/ui/text-field';
import { AppText, Figure } from '@/components/ui/text';
import type { PreviewSample } from '@/shared/lab-import/preview';
import type { CatalogueNutrient, LabValue } from '@/shared/lab-import/types';
import { colors, space } from '@/theme';

import { formatValue, ORIGIN_LABELS } from './format';

/** One sample's values as they would be saved: as fed and on dry matter, each marked with where it came from. */
export function SamplePreview({ sample, catalogue, onOverride }: { sample: PreviewSample; catalogue: CatalogueNutrient[]; onOverride: (nutrientId: string, value: number | null) => void }) {
  const name = (id: string) => catalogue.find((n) => n.id === id)?.name ?? id;
  const order = (v: LabValue) => catalogue.findIndex((n) => n.id === v.nutrientId);
  const values = [...sample.values].sort((a, b) => order(a) - order(b));
  return (
    <Card title={`Sample ${sample.sampleId}${sample.name ? ` — ${sample.name}` : ''}`} testID={`sample-${sample.sampleId}`}>
      <AppText variant="small" muted>
        {sample.analysedOn ? `Analysed ${sample.analysedOn}. ` : 'No date in the file. '}
        {sample.dryMatterPct !== null ? `Dry matter ${formatValue(sample.dryMatterPct, '%')} %.` : 'No dry matter.'}
      </AppText>
      <View style={styles.head}>
        <AppText variant="label" style={styles.nameCol}>Nutrient</AppText>
        <AppText variant="label" style={styles.numCol}>As fed</AppText>
        <AppText variant="label" style={styles.numCol}>Dry matter</AppText>
      </View>
      {values.map((v) => (
        <ValueRow key={v.nutrientId} value={v} label={name(v.nutrientId)} sampleId={sample.sampleId} onOverride={onOverride} />
      ))}
      {sample.gaps.length > 0 ? (
        <View style={styles.gaps} testID={`gaps-${sample.sampleId}`}>
          <AppText variant="label">Not estimated</AppText>
          {sample.gaps.map((g) => (
            <AppText key={g.nutrientId} variant="small" muted>
              {name(g.nutrientId)}: {g.message}
            </AppText>
          ))}
        </View>
      ) : null}
    </Card>
  );
}

function ValueRow({ value, label, sampleId, onOverride }: { value: LabValue; label: string; sampleId: string; onOverride: (nutrientId: string, value: number | null) => void }) {
  const [draft, setDraft] = useState('');
  const editable = value.origin === 'estimated' || value.origin === 'override';
  const commit = () => {
    const text = draft.trim().replace(',', '.');
    if (text === '') return;
    const n = Number(text);
    if (Number.isFinite(n) && n >= 0) {
      onOverride(value.nutrientId, n);
      setDraft('');
    }
  };
  return (
    <View style={[styles.row, value.origin !== 'measured' && styles.rowMarked]} testID={`value-${sampleId}-${value.nutrientId}`}>
      <View style={styles.nameCol}>
        <AppText variant="small">{label}</AppText>
        <AppText variant="caption" style={value.origin === 'measured' ? styles.lab : styles.estimate}>
          {ORIGIN_LABELS[value.origin]}
          {value.method ? `: ${value.method.name}` : ''}
          {value.origin === 'override' && value.estimatedAsFed !== undefined ? ` (estimate was ${formatValue(value.estimatedAsFed, value.unit)} ${value.unit})` : ''}
        </AppText>
        {value.method?.caution ? <AppText variant="caption" muted>{value.method.caution}</AppText> : null}
        {value.method && value.origin !== 'measured' ? <AppText variant="caption" muted>{value.method.source}</AppText> : null}
      </View>
      <Figure value={formatValue(value.asFed, value.unit)} unit={value.unit} style={styles.numCol} testID={`asfed-${sampleId}-${value.nutrientId}`} />
      <Figure value={formatValue(value.dryMatter, value.unit)} unit={value.unit} style={styles.numCol} testID={`dm-${sampleId}-${value.nutrientId}`} />
      {editable ? (
        <View style={styles.override}>
          <TextField
            label={`Your value, ${value.unit} as fed`}
            value={draft}
            onChangeText={setDraft}
            onBlur={commit}
            onSubmitEditing={commit}
            inputMode="decimal"
            testID={`override-${sampleId}-${value.nutrientId}`}
          />
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  head: { flexDirection: 'row', gap: space.sm, borderBottomWidth: 1, borderBottomColor: colors.rule, paddingBottom: space.xs },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, paddingVertical: space.xs, borderBottomWidth: 1, borderBottomColor: colors.paperSunken },
  rowMarked: { backgroundColor: colors.accentSoft },
  nameCol: { flexGrow: 1, flexBasis: 160, flexShrink: 1 },
  numCol: { width: 96, textAlign: 'right' },
  override: { flexBasis: '100%' },
  lab: { color: colors.inkMuted },
  estimate: { color: colors.caution, fontWeight: '600' },
  gaps: { gap: space.xs, paddingTop: space.sm },
});
