import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Formik, type FormikHelpers } from 'formik';
import * as yup from 'yup';

import { useLabAnalysisMutation } from '@/api/ingredients';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { applyServerErrors } from '@/lib/form-errors';
import { colors, space } from '@/theme';

/** The values a feed lab usually reports, all in % (the catalogue unit). */
const FIELDS = [
  { id: 'cp', label: 'Crude protein' },
  { id: 'ee', label: 'Crude fat' },
  { id: 'cf', label: 'Crude fibre' },
  { id: 'ash', label: 'Ash' },
  { id: 'ca', label: 'Calcium' },
  { id: 'p', label: 'Phosphorus' },
] as const;

type FormValues = { laboratory: string; sample: string; analysedOn: string; dryMatterPct: string; basis: 'as_fed' | 'dry_matter'; values: Record<string, string> };

const decimal = (text: string) => Number(text.trim().replace(',', '.'));
const isPercent = (t: string | undefined) => !t || (Number.isFinite(decimal(t)) && decimal(t) >= 0 && decimal(t) <= 100);

const schema = yup.object({
  laboratory: yup.string().trim().required('Name the laboratory or report.').max(200, 'At most 200 characters.'),
  sample: yup.string().trim().max(120, 'At most 120 characters.'),
  analysedOn: yup.string().required('Enter the date of the analysis.').matches(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-03-31.'),
  dryMatterPct: yup.string().required('Enter the sample’s dry matter.').test('dm', 'A number above 0 and at most 100 %.', (t) => !!t && decimal(t) > 0 && decimal(t) <= 100),
  values: yup
    .object(Object.fromEntries(FIELDS.map((f) => [f.id, yup.string().test('pct', 'A number from 0 to 100 %.', isPercent)])))
    .test('some', 'Enter at least one value besides the dry matter.', (v) => Object.values(v ?? {}).some((t) => typeof t === 'string' && t.trim() !== '')),
});

const LABELS: Record<string, string> = { dm: 'dry matter', ...Object.fromEntries(FIELDS.map((f) => [f.id, f.label.toLowerCase()])) };
const named = (ids: string[]) => ids.map((id) => LABELS[id] ?? id).join(', ');

/**
 * A dated lab analysis typed in by hand. It joins the ingredient's analysis history like an imported
 * file's sample, and its values replace the current ones unless a later-dated analysis gave them.
 */
export function LabAnalysisCard({ ingredientId }: { ingredientId: number }) {
  const save = useLabAnalysisMutation(ingredientId);
  const [message, setMessage] = useState<{ tone: 'ok' | 'danger'; text: string } | null>(null);
  const start: FormValues = { laboratory: '', sample: '', analysedOn: new Date().toISOString().slice(0, 10), dryMatterPct: '', basis: 'as_fed', values: {} };

  const submit = async (form: FormValues, helpers: FormikHelpers<FormValues>) => {
    setMessage(null);
    const values = Object.fromEntries(Object.entries(form.values).filter(([, t]) => t?.trim()).map(([k, t]) => [k, decimal(t)]));
    try {
      const recorded = await save.mutateAsync({ laboratory: form.laboratory.trim(), sample: form.sample.trim() || null, analysedOn: form.analysedOn, dryMatterPct: decimal(form.dryMatterPct), basis: form.basis, values });
      helpers.resetForm();
      const kept = recorded.kept.map((k) => `${LABELS[k.nutrientId] ?? k.nutrientId} (${k.heldSince})`).join(', ');
      const applied = recorded.analysis.applied;
      setMessage({
        tone: 'ok',
        text: `Lab analysis recorded in the history. ${applied.length ? `Now in the library: ${named(applied)}.` : 'None of its values went into the library.'}${kept ? ` Kept from later-dated analyses: ${kept}.` : ''}`,
      });
    } catch (error) {
      setMessage({ tone: 'danger', text: `Nothing was saved. ${applyServerErrors(error, helpers)}` });
    }
  };

  return (
    <Formik initialValues={start} validationSchema={schema} onSubmit={submit} validateOnChange={false}>
      {(f) => {
        const shown = f.submitCount > 0;
        return (
          <Card title="Record a lab analysis" testID="lab-card">
            <AppText variant="small" muted>It is kept in the analysis history. Each value replaces the current one unless a later-dated analysis gave it.</AppText>
            <View style={styles.grid}>
              <View style={styles.cell}><TextField label="Laboratory or report" value={f.values.laboratory} onChangeText={f.handleChange('laboratory')} error={shown && f.errors.laboratory} testID="lab-name" /></View>
              <View style={styles.cell}><TextField label="Sample or report number" hint="optional" value={f.values.sample} onChangeText={f.handleChange('sample')} error={shown && f.errors.sample} testID="lab-sample" /></View>
            </View>
            <View style={styles.grid}>
              <View style={styles.cell}><TextField label="Date of analysis" hint="YYYY-MM-DD" value={f.values.analysedOn} onChangeText={f.handleChange('analysedOn')} error={shown && f.errors.analysedOn} testID="lab-date" /></View>
              <View style={styles.cell}><TextField label="Dry matter" hint="%" value={f.values.dryMatterPct} onChangeText={f.handleChange('dryMatterPct')} inputMode="decimal" error={shown && f.errors.dryMatterPct} testID="lab-dm" /></View>
            </View>
            <ChoiceChips label="The report gives values" options={[{ value: 'as_fed', label: 'As fed' }, { value: 'dry_matter', label: 'On dry matter' }]} value={f.values.basis} onChange={(v) => f.setFieldValue('basis', v)} testID="lab-basis" />
            <View style={styles.grid}>
              {FIELDS.map((field) => (
                <View key={field.id} style={styles.cell}>
                  <TextField label={field.label} hint="%" value={f.values.values[field.id] ?? ''} onChangeText={(t) => f.setFieldValue(`values.${field.id}`, t)} inputMode="decimal"
                    error={shown && (f.errors.values as Record<string, string> | undefined)?.[field.id]} testID={`lab-value-${field.id}`} />
                </View>
              ))}
            </View>
            {shown && typeof f.errors.values === 'string' ? <AppText variant="small" style={styles.error} testID="lab-values-error">{f.errors.values}</AppText> : null}
            <FormMessage tone={message?.tone ?? 'ok'} text={message?.text} testID="lab-message" />
            <Button label={f.isSubmitting ? 'Saving…' : 'Save the analysis'} disabled={f.isSubmitting} onPress={() => f.handleSubmit()} testID="lab-save" />
          </Card>
        );
      }}
    </Formik>
  );
}

const styles = StyleSheet.create({
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flexGrow: 1, flexBasis: 150 },
  error: { color: colors.danger },
});
