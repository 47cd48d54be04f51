import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { useFormik } from 'formik';
import * as yup from 'yup';

import { useFormulaChoicesQuery, useFormulaCreateMutation } from '@/api/formulas';
import { ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { TextField } from '@/components/ui/text-field';
import { AppText } from '@/components/ui/text';
import { applyServerErrors } from '@/lib/form-errors';
import { toMetric, useUnits, type Units } from '@/lib/measures-format';
import { colors, space } from '@/theme';

import { IngredientPicker } from './ingredient-picker';
import { maxBatch } from './inputs-form';

type Values = { name: string; specificationId: string; batchKg: string; ingredientIds: number[] };

// The batch is typed in the organization's unit (kg or lb) and sent in kg.
const schemaFor = (units: Units) => yup.object({
  name: yup.string().trim().required('Give the formula a name').max(160, 'At most 160 characters'),
  specificationId: yup.string().required('Choose a species and phase'),
  batchKg: yup
    .number()
    .typeError(`Enter the batch size in ${units.mass}`)
    .moreThan(0, `The batch must be more than 0 ${units.mass}`)
    .max(maxBatch(units), `At most ${maxBatch(units).toLocaleString('en-US')} ${units.mass}`)
    .required(`Enter the batch size in ${units.mass}`),
  ingredientIds: yup.array().min(1, 'Choose at least one ingredient'),
});

/** Starts a formula: a specification (species and phase) fills the bounds; the planner picks the ingredients. */
export function NewFormulaForm({ onCancel, onCreated }: { onCancel: () => void; onCreated: (id: number) => void }) {
  const create = useFormulaCreateMutation();
  const units = useUnits();
  const [message, setMessage] = useState<string | null>(null);
  const form = useFormik<Values>({
    // A tonne, or a short ton (2,000 lb) in US units.
    initialValues: { name: '', specificationId: '', batchKg: units.system === 'us' ? '2000' : '1000', ingredientIds: [] },
    validationSchema: schemaFor(units),
    onSubmit: async (values, helpers) => {
      setMessage(null);
      try {
        const created = await create.mutateAsync({
          name: values.name.trim(),
          specificationId: Number(values.specificationId),
          batchKg: toMetric(Number(values.batchKg), units.massToKg),
          ingredients: values.ingredientIds.map((ingredientId) => ({ ingredientId })),
        });
        onCreated(created.id);
      } catch (error) {
        setMessage(applyServerErrors(error, helpers));
      }
    },
  });
  const specId = form.values.specificationId ? Number(form.values.specificationId) : undefined;
  const choices = useFormulaChoicesQuery(specId);
  const specs = choices.data?.specifications ?? [];
  const touched = form.submitCount > 0;

  return (
    <Card title="New formula" testID="new-formula-form">
      <AppText variant="small" muted>The specification fills the nutrient, ratio and inclusion bounds; you can adjust them after. Every amount is per kg of feed as fed.</AppText>
      <TextField label="Name" value={form.values.name} onChangeText={form.handleChange('name')} error={touched && form.errors.name} testID="new-formula-name" />
      {choices.isError ? <ErrorState error={choices.error} onRetry={() => choices.refetch()} /> : null}
      <ChoiceChips
        label="Species and phase (specification)"
        value={form.values.specificationId}
        onChange={(v) => form.setFieldValue('specificationId', v)}
        options={specs.map((s) => ({ value: String(s.id), label: s.name }))}
        testID="new-formula-spec"
      />
      {touched && form.errors.specificationId ? <AppText variant="small" style={styles.error}>{form.errors.specificationId}</AppText> : null}
      {specs.length === 0 && choices.isSuccess ? <AppText muted>Your library has no specifications yet: copy one in Requirements first.</AppText> : null}
      <TextField label="Batch size" hint={`${units.mass} as fed`} keyboardType="decimal-pad" value={form.values.batchKg} onChangeText={form.handleChange('batchKg')} error={touched && form.errors.batchKg} testID="new-formula-batch" />
      <View style={styles.picker}>
        <AppText variant="label">Ingredients from your library ({form.values.ingredientIds.length} chosen)</AppText>
        {touched && typeof form.errors.ingredientIds === 'string' ? <AppText variant="small" style={styles.error}>{form.errors.ingredientIds}</AppText> : null}
        {choices.data ? (
          <IngredientPicker
            choices={choices.data.ingredients}
            selected={form.values.ingredientIds}
            onToggle={(c) => form.setFieldValue('ingredientIds', form.values.ingredientIds.includes(c.id) ? form.values.ingredientIds.filter((x) => x !== c.id) : [...form.values.ingredientIds, c.id])}
          />
        ) : null}
      </View>
      <FormMessage tone="danger" text={message} testID="new-formula-message" />
      <View style={styles.actions}>
        <Button label={form.isSubmitting ? 'Creating…' : 'Create formula'} disabled={form.isSubmitting} onPress={() => form.handleSubmit()} testID="new-formula-submit" />
        <Button label="Cancel" tone="quiet" onPress={onCancel} />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  picker: { gap: space.sm },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  error: { color: colors.danger },
});
