import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { useRouter } from 'expo-router';
import { Formik, type FormikHelpers } from 'formik';
import * as yup from 'yup';

import { useIngredientCreateMutation, useIngredientQuery, useIngredientUpdateMutation } from '@/api/ingredients';
import { useNutrientsQuery } from '@/api/nutrients';
import { ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { TextField } from '@/components/ui/text-field';
import { AppText } from '@/components/ui/text';
import { applyServerErrors } from '@/lib/form-errors';
import {
  CONFIDENCE_LABELS,
  CONFIDENCE_LEVELS,
  INGREDIENT_CATEGORIES,
  INGREDIENT_CATEGORY_LABELS,
  INSECT_PROCESSING,
  INSECT_PROCESSING_LABELS,
  INSECT_SPECIES,
  INSECT_SPECIES_LABELS,
  NUTRIENT_GROUP_LABELS,
  NUTRIENT_GROUPS,
  ORIGIN_ANIMAL_CODES,
  ORIGIN_ANIMALS,
  SUBSTRATE_ORIGINS,
  VALUE_SOURCE_KIND_LABELS,
  VALUE_SOURCE_KINDS,
  type Confidence,
  type IngredientCategory,
  type InsectProcessing,
  type InsectSpecies,
  type OriginAnimal,
  type SubstrateOrigin,
  type ValueSourceKind,
} from '@/shared/library-terms';
import type { IngredientDetail } from '@/shared/schemas/ingredients';
import type { Nutrient } from '@/shared/schemas/nutrients';
import { colors, radius, space, TOUCH_MIN } from '@/theme';

type FormValues = {
  name: string;
  category: IngredientCategory;
  notes: string;
  insectSpecies: InsectSpecies;
  insectProcessing: InsectProcessing;
  substrate: string;
  substrateOrigin: SubstrateOrigin;
  substrateAnimals: OriginAnimal[];
  /** Nutrient id → text as typed (empty: no value). */
  values: Record<string, string>;
  sourceKind: ValueSourceKind;
  sourceName: string;
  confidence: Confidence;
  dryMatterPct: string;
  analysedOn: string;
};

const UNIT_MAX: Record<string, number> = { '%': 100, 'g/kg': 1000, 'mg/kg': 1_000_000, 'kcal/kg': 10_000, 'MJ/kg': 42, 'IU/kg': 100_000_000 };
const today = () => new Date().toISOString().slice(0, 10);
const decimal = (text: string) => Number(text.trim().replace(',', '.'));

function schemaFor(nutrients: Nutrient[]) {
  return yup.object({
    name: yup.string().trim().required('Give the ingredient a name.').max(160, 'At most 160 characters.'),
    substrate: yup.string().when('category', { is: 'insect_meal', then: (s) => s.trim().required('Say what the larvae were reared on.').max(200) }),
    substrateAnimals: yup.array().when(['category', 'substrateOrigin'], {
      is: (category: string, origin: string) => category === 'insect_meal' && (origin === 'animal' || origin === 'mixed'),
      then: (s) => s.min(1, 'Name the animals the substrate came from.'),
    }),
    values: yup.object().test('values', 'Check the values', function check(values: Record<string, string> | undefined) {
      for (const n of nutrients) {
        const text = values?.[n.id]?.trim();
        if (!text) continue;
        const v = decimal(text);
        if (!Number.isFinite(v)) return this.createError({ path: `values.${n.id}`, message: 'Enter a number, e.g. 8.5.' });
        if (v < 0) return this.createError({ path: `values.${n.id}`, message: 'Cannot be negative.' });
        if (v > UNIT_MAX[n.unit]) return this.createError({ path: `values.${n.id}`, message: `At most ${UNIT_MAX[n.unit]} ${n.unit}.` });
      }
      return true;
    }),
    sourceName: yup.string().trim().required('Name the table, lab report or reason for these values.').max(300),
    dryMatterPct: yup
      .string()
      .required('Enter the dry matter the values refer to.')
      .test('dm', 'Dry matter is a number above 0 and at most 100 %.', (t) => !!t && decimal(t) > 0 && decimal(t) <= 100),
    analysedOn: yup.string().when('sourceKind', { is: 'lab', then: (s) => s.required('A lab analysis needs its date.').matches(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-03-31.') }),
  });
}

function initialValues(item: IngredientDetail | undefined): FormValues {
  const values: Record<string, string> = {};
  for (const v of item?.nutrientValues ?? []) values[v.nutrientId] = String(v.value);
  return {
    name: item?.name ?? '',
    category: item?.category ?? 'cereal_grain',
    notes: item?.notes ?? '',
    insectSpecies: item?.insect?.species ?? 'hermetia_illucens',
    insectProcessing: item?.insect?.processing ?? 'full_fat',
    substrate: item?.insect?.substrate ?? '',
    substrateOrigin: item?.insect?.substrateOrigin ?? 'plant',
    substrateAnimals: item?.insect?.substrateAnimals ?? [],
    values,
    sourceKind: 'estimate',
    sourceName: '',
    confidence: 'verified',
    dryMatterPct: item?.values.dm !== undefined ? String(item.values.dm) : '',
    analysedOn: today(),
  };
}

/** New ingredient (no id) or edit of one of ours. Changed values form a new value set with the source given. */
export function IngredientFormScreen({ id }: { id?: number }) {
  const nutrients = useNutrientsQuery();
  const existing = useIngredientQuery(id ?? 0);
  const title = id ? 'Edit ingredient' : 'New ingredient';
  if (nutrients.isError) return <Screen title={title}><ErrorState error={nutrients.error} onRetry={() => nutrients.refetch()} /></Screen>;
  if (id && existing.isError) return <Screen title={title}><ErrorState error={existing.error} onRetry={() => existing.refetch()} /></Screen>;
  if (!nutrients.data || (id && !existing.data)) return <Screen title={title}><AppText muted>Loading…</AppText></Screen>;
  return <IngredientForm item={id ? existing.data : undefined} nutrients={nutrients.data.items} title={title} />;
}

function IngredientForm({ item, nutrients, title }: { item?: IngredientDetail; nutrients: Nutrient[]; title: string }) {
  const router = useRouter();
  const create = useIngredientCreateMutation();
  const update = useIngredientUpdateMutation(item?.id ?? 0);
  const [formError, setFormError] = useState<string | null>(null);
  const start = initialValues(item);

  const submit = async (form: FormValues, helpers: FormikHelpers<FormValues>) => {
    setFormError(null);
    const values: Record<string, number | null> = {};
    for (const n of nutrients) {
      const text = form.values[n.id]?.trim() ?? '';
      const before = start.values[n.id] ?? '';
      if (text === before.trim()) continue;
      values[n.id] = text === '' ? null : decimal(text);
    }
    const changed = Object.values(values).some((v) => v !== null);
    const source = { kind: form.sourceKind, name: form.sourceName.trim(), confidence: form.confidence, dryMatterPct: decimal(form.dryMatterPct), analysedOn: form.sourceKind === 'lab' ? form.analysedOn : null };
    const insect = form.category === 'insect_meal'
      ? { species: form.insectSpecies, processing: form.insectProcessing, substrate: form.substrate.trim(), substrateOrigin: form.substrateOrigin, substrateAnimals: form.substrateOrigin === 'animal' || form.substrateOrigin === 'mixed' ? form.substrateAnimals : [] }
      : null;
    const common = { name: form.name.trim(), category: form.category, notes: form.notes.trim() || null, insect };
    try {
      const saved = item
        ? await update.mutateAsync({ ...common, values, source: changed ? source : undefined, expectedVersion: item.version })
        : await create.mutateAsync({ ...common, values, source: changed ? source : undefined });
      router.replace(`/library/${saved.id}`);
    } catch (error) {
      setFormError(applyServerErrors(error, helpers));
    }
  };

  return (
    <Formik initialValues={start} validationSchema={schemaFor(nutrients)} onSubmit={submit} validateOnChange={false}>
      {(f) => {
        const err = (path: string) => (f.submitCount > 0 ? (getPath(f.errors, path) as string | undefined) : undefined);
        return (
          <Screen title={title} lead="Values per kg as fed. Leave a field empty when the value is not known." testID="screen-ingredient-form">
            <FormMessage tone="danger" text={formError} testID="form-error" />
            <Card title="Ingredient">
              <TextField label="Name" value={f.values.name} onChangeText={f.handleChange('name')} error={err('name')} testID="field-name" />
              <ChoiceChips label="Category" options={INGREDIENT_CATEGORIES.map((c) => ({ value: c, label: INGREDIENT_CATEGORY_LABELS[c] }))} value={f.values.category} onChange={(v) => f.setFieldValue('category', v)} testID="field-category" />
              <TextField label="Notes" value={f.values.notes} onChangeText={f.handleChange('notes')} multiline testID="field-notes" />
            </Card>
            {f.values.category === 'insect_meal' ? (
              <Card title="Insect meal">
                <ChoiceChips label="Insect" options={INSECT_SPECIES.map((s) => ({ value: s, label: INSECT_SPECIES_LABELS[s].split(' (')[0] }))} value={f.values.insectSpecies} onChange={(v) => f.setFieldValue('insectSpecies', v)} testID="field-insect" />
                <ChoiceChips label="Processing" options={INSECT_PROCESSING.map((p) => ({ value: p, label: INSECT_PROCESSING_LABELS[p] }))} value={f.values.insectProcessing} onChange={(v) => f.setFieldValue('insectProcessing', v)} testID="field-processing" />
                <TextField label="Rearing substrate" value={f.values.substrate} onChangeText={f.handleChange('substrate')} error={err('substrate') ?? err('insect.substrate')} placeholder="e.g. brewery spent grains" testID="field-substrate" />
                <ChoiceChips label="Substrate origin" options={SUBSTRATE_ORIGINS.map((o) => ({ value: o, label: o === 'unknown' ? 'Not known' : o[0].toUpperCase() + o.slice(1) }))} value={f.values.substrateOrigin} onChange={(v) => f.setFieldValue('substrateOrigin', v)} testID="field-origin" />
                {f.values.substrateOrigin === 'animal' || f.values.substrateOrigin === 'mixed' ? (
                  <View style={styles.group}>
                    <AppText variant="label">Animals the substrate came from</AppText>
                    <View style={styles.chips}>
                      {ORIGIN_ANIMAL_CODES.map((a) => {
                        const on = f.values.substrateAnimals.includes(a);
                        return (
                          <Pressable key={a} role="checkbox" aria-checked={on} testID={`field-animal-${a}`} style={[styles.chip, on && styles.chipOn]}
                            onPress={() => f.setFieldValue('substrateAnimals', on ? f.values.substrateAnimals.filter((x) => x !== a) : [...f.values.substrateAnimals, a])}>
                            <AppText variant="small" style={on ? styles.chipOnText : undefined}>{ORIGIN_ANIMALS[a].label}</AppText>
                          </Pressable>
                        );
                      })}
                    </View>
                    {err('substrateAnimals') ?? err('insect.substrateAnimals') ? <AppText variant="small" style={styles.error}>{err('substrateAnimals') ?? err('insect.substrateAnimals')}</AppText> : null}
                  </View>
                ) : null}
              </Card>
            ) : null}
            {NUTRIENT_GROUPS.map((group) => (
              <Card key={group} title={NUTRIENT_GROUP_LABELS[group]}>
                <View style={styles.grid}>
                  {nutrients.filter((n) => n.group === group).map((n) => (
                    <View key={n.id} style={styles.cell}>
                      <TextField label={n.name} hint={n.unit} value={f.values.values[n.id] ?? ''} onChangeText={(t) => f.setFieldValue(`values.${n.id}`, t)} keyboardType="decimal-pad" inputMode="decimal" error={err(`values.${n.id}`)} testID={`field-value-${n.id}`} />
                    </View>
                  ))}
                </View>
              </Card>
            ))}
            <Card title="Where the new or changed values come from">
              <ChoiceChips label="Source" options={VALUE_SOURCE_KINDS.map((k) => ({ value: k, label: VALUE_SOURCE_KIND_LABELS[k] }))} value={f.values.sourceKind} onChange={(v) => f.setFieldValue('sourceKind', v)} testID="field-source-kind" />
              <TextField label="Table, lab report or reason" value={f.values.sourceName} onChangeText={f.handleChange('sourceName')} error={err('sourceName') ?? err('source.name') ?? err('source')} testID="field-source-name" />
              <ChoiceChips label="Confidence" options={CONFIDENCE_LEVELS.map((c) => ({ value: c, label: CONFIDENCE_LABELS[c] }))} value={f.values.confidence} onChange={(v) => f.setFieldValue('confidence', v)} testID="field-confidence" />
              <TextField label="Dry matter of the sample" hint="%" value={f.values.dryMatterPct} onChangeText={f.handleChange('dryMatterPct')} keyboardType="decimal-pad" inputMode="decimal" error={err('dryMatterPct') ?? err('source.dryMatterPct')} testID="field-source-dm" />
              {f.values.sourceKind === 'lab' ? <TextField label="Date of analysis" hint="YYYY-MM-DD" value={f.values.analysedOn} onChangeText={f.handleChange('analysedOn')} error={err('analysedOn') ?? err('source.analysedOn')} testID="field-source-date" /> : null}
            </Card>
            {f.submitCount > 0 && Object.keys(f.errors).length > 0 ? <FormMessage tone="danger" text="Some entries need fixing: see the messages under the fields." testID="form-invalid" /> : null}
            <View style={styles.actions}>
              <Button label={f.isSubmitting ? 'Saving…' : 'Save'} disabled={f.isSubmitting} onPress={() => f.handleSubmit()} testID="ingredient-save" />
              <Button label="Cancel" tone="quiet" onPress={() => (router.canGoBack() ? router.back() : router.replace('/library'))} testID="ingredient-cancel" />
            </View>
          </Screen>
        );
      }}
    </Formik>
  );
}

function getPath(errors: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((node, key) => (node && typeof node === 'object' ? (node as Record<string, unknown>)[key] : undefined), errors);
}

const styles = StyleSheet.create({
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flexGrow: 1, flexBasis: 220, maxWidth: '100%' },
  group: { gap: space.xs },
  chips: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  chip: { minHeight: TOUCH_MIN - 8, justifyContent: 'center', paddingHorizontal: space.md, borderRadius: radius.lg, borderWidth: 1, borderColor: colors.rule, backgroundColor: colors.paperRaised },
  chipOn: { backgroundColor: colors.brand, borderColor: colors.brand },
  chipOnText: { color: colors.onBrand },
  error: { color: colors.danger },
  actions: { flexDirection: 'row', gap: space.md, flexWrap: 'wrap' },
});
