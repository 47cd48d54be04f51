import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { FieldArray, Formik, type FormikHelpers } from 'formik';
import * as yup from 'yup';

import { useSupplyPlanCreateMutation, useSupplyPlanUpdateMutation } from '@/api/supply-plans';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { TextField } from '@/components/ui/text-field';
import { AppText } from '@/components/ui/text';
import { applyServerErrors } from '@/lib/form-errors';
import { toInput as inputText, toMetric, useUnits, useUnitsReady, type Units } from '@/lib/measures-format';
import { ORIGIN_ANIMALS, type OriginAnimal } from '@/shared/library-terms';
import type { CreateSupplyPlanInput, SupplyPlanDetail } from '@/shared/schemas/supply';
import { DEFAULT_RESIDUAL_FAT_PCT, SUBSTRATE_KINDS, SUBSTRATES, type SubstrateKind } from '@/shared/supply/substrates';
import { colors, radius, space, TOUCH_MIN } from '@/theme';

import { parseNumber } from './format';

/** `tonnesPerWeek` is typed in t or short tons; `savedTonnes` keeps the stored tonnes behind an untouched converted text. */
type StreamValues = { name: string; substrate: SubstrateKind; tonnesPerWeek: string; savedTonnes?: { text: string; tonnes: number }; moisturePct: string; bioconversionDmPct: string; residueDmPct: string; larvaeDryMatterPct: string; animals: OriginAnimal[] };
type Values = { name: string; defatted: 'full_fat' | 'pressed'; residualFatPct: string; mealIngredientId: number | null; streams: StreamValues[] };

const text = (n: number | null | undefined) => (n === null || n === undefined ? '' : String(n));
const newStream = (substrate: SubstrateKind = 'brewery_grains'): StreamValues => ({ name: '', substrate, tonnesPerWeek: '', moisturePct: '', bioconversionDmPct: '', residueDmPct: '', larvaeDryMatterPct: '', animals: [...SUBSTRATES[substrate].defaultAnimals] });

const optionalPct = (max: number, what: string) =>
  yup.string().test('pct', `${what}: enter a number from 0 to ${max}`, (v) => {
    const n = parseNumber(v ?? '');
    return n === null || (Number.isFinite(n) && n >= 0 && n <= max);
  });

const schema = yup.object({
  name: yup.string().trim().required('Name the plan.').max(160, 'At most 160 characters.'),
  residualFatPct: optionalPct(40, 'Fat left in the pressed meal'),
  streams: yup
    .array()
    .of(
      yup.object({
        name: yup.string().trim().required('Name the stream.').max(160, 'At most 160 characters.'),
        tonnesPerWeek: yup.string().test('t', 'Enter the amount delivered per week (0 or more).', (v) => {
          const n = parseNumber(v ?? '');
          return n !== null && Number.isFinite(n) && n >= 0 && n <= 100_000;
        }),
        moisturePct: optionalPct(99, 'Moisture'),
        bioconversionDmPct: optionalPct(100, 'Bioconversion'),
        residueDmPct: optionalPct(100, 'Residue'),
        larvaeDryMatterPct: optionalPct(100, 'Larvae dry matter'),
      }),
    )
    .min(1, 'Add at least one stream.'),
});

function initialValues(plan: SupplyPlanDetail | null, units: Units): Values {
  if (!plan) return { name: 'Weekly rearing plan', defatted: 'full_fat', residualFatPct: '', mealIngredientId: null, streams: [newStream()] };
  return {
    name: plan.name,
    defatted: plan.defatted ? 'pressed' : 'full_fat',
    residualFatPct: text(plan.residualFatPct),
    mealIngredientId: plan.mealIngredient?.id ?? null,
    streams: plan.streams.map((s) => ({
      name: s.name,
      substrate: s.substrate,
      tonnesPerWeek: inputText(s.tonnesPerWeek, units.bulkOf),
      savedTonnes: { text: inputText(s.tonnesPerWeek, units.bulkOf), tonnes: s.tonnesPerWeek },
      moisturePct: text(s.moisturePct),
      bioconversionDmPct: text(s.bioconversionDmPct),
      residueDmPct: text(s.residueDmPct),
      larvaeDryMatterPct: text(s.larvaeDryMatterPct),
      animals: s.animals ?? [...SUBSTRATES[s.substrate].defaultAnimals],
    })),
  };
}

/** The API's plan: tonnes per week whatever unit they were typed in. */
function tonnesOf(s: StreamValues, units: Units): number {
  if (s.savedTonnes && s.tonnesPerWeek.trim() === s.savedTonnes.text) return s.savedTonnes.tonnes;
  return toMetric(parseNumber(s.tonnesPerWeek) ?? 0, units.bulkToTonnes);
}

function toInput(v: Values, plan: SupplyPlanDetail | null, units: Units): CreateSupplyPlanInput & { expectedVersion?: number } {
  return {
    name: v.name.trim(),
    defatted: v.defatted === 'pressed',
    residualFatPct: parseNumber(v.residualFatPct),
    mealIngredientId: v.mealIngredientId,
    notes: plan?.notes ?? null,
    soybeanYieldTPerHa: plan?.soybeanYieldTPerHa ?? null,
    soybeanYieldSource: plan?.soybeanYieldSource ?? null,
    soybeanCpPct: plan?.soybeanCpPct ?? null,
    weeksPerYear: plan?.weeksPerYear ?? null,
    streams: v.streams.map((s) => ({
      name: s.name.trim(),
      substrate: s.substrate,
      tonnesPerWeek: tonnesOf(s, units),
      moisturePct: parseNumber(s.moisturePct),
      bioconversionDmPct: parseNumber(s.bioconversionDmPct),
      residueDmPct: parseNumber(s.residueDmPct),
      larvaeDryMatterPct: parseNumber(s.larvaeDryMatterPct),
      animals: SUBSTRATES[s.substrate].animalChoices.length ? s.animals : null,
    })),
    ...(plan ? { expectedVersion: plan.version } : {}),
  };
}

/** Toggle chips for several choices (animals a substrate came from). */
function MultiChips<T extends string>({ label, options, value, onChange, testID }: { label: string; options: readonly { value: T; label: string }[]; value: T[]; onChange: (v: T[]) => void; testID?: string }) {
  return (
    <View style={styles.chipsWrap}>
      <AppText variant="label">{label}</AppText>
      <View style={styles.chipsRow}>
        {options.map((o) => {
          const on = value.includes(o.value);
          return (
            <Pressable key={o.value} role="checkbox" aria-checked={on} testID={testID ? `${testID}-${o.value}` : undefined} onPress={() => onChange(on ? value.filter((x) => x !== o.value) : [...value, o.value])} style={[styles.chip, on && styles.chipOn]}>
              <AppText variant="small" style={on ? styles.chipOnText : undefined}>{o.label}</AppText>
            </Pressable>
          );
        })}
      </View>
    </View>
  );
}

/** The plan's streams and processing, edited with formik and yup; the server's field errors land under the inputs. */
export function SupplyPlanForm({ plan, insectMeals, onSaved, onCancel }: { plan: SupplyPlanDetail | null; insectMeals: { id: number; name: string; hasLab: boolean }[]; onSaved: (id: number) => void; onCancel?: () => void }) {
  const create = useSupplyPlanCreateMutation();
  const update = useSupplyPlanUpdateMutation(plan?.id ?? 0);
  const [formError, setFormError] = useState<string | null>(null);
  const units = useUnits();
  const unitsReady = useUnitsReady();
  const [showFactors, setShowFactors] = useState(false);

  const submit = async (values: Values, helpers: FormikHelpers<Values>) => {
    setFormError(null);
    try {
      const saved = plan ? await update.mutateAsync(toInput(values, plan, units)) : await create.mutateAsync(toInput(values, null, units));
      onSaved(saved.id);
    } catch (error) {
      setFormError(applyServerErrors(error, helpers));
    }
  };

  // The tonnages start converted to the organization's unit: wait for its settings.
  if (!unitsReady) return <AppText muted>Loading…</AppText>;
  return (
    <Formik initialValues={initialValues(plan, units)} validationSchema={schema} onSubmit={submit}>
      {({ values, errors, touched, setFieldValue, handleSubmit, isSubmitting, submitCount }) => {
        const err = (path: string, e: unknown, t: unknown) => (submitCount > 0 || t ? (typeof e === 'string' ? e : undefined) : undefined);
        return (
          <Card title={plan ? 'Edit the streams' : 'Your by-product streams'} testID="supply-plan-form">
            <TextField label="Plan name" value={values.name} onChangeText={(v) => setFieldValue('name', v)} error={err('name', errors.name, touched.name)} testID="plan-name" />
            <FieldArray name="streams">
              {(helpers) => (
                <View style={styles.streams}>
                  {values.streams.map((s, i) => {
                    const d = SUBSTRATES[s.substrate];
                    const se = (errors.streams?.[i] ?? {}) as Partial<Record<keyof StreamValues, string>>;
                    const st = (touched.streams?.[i] ?? {}) as Partial<Record<keyof StreamValues, boolean>>;
                    return (
                      <View key={i} style={styles.stream} testID={`stream-${i}`}>
                        <View style={styles.streamHead}>
                          <AppText variant="label">Stream {i + 1}</AppText>
                          {values.streams.length > 1 ? <Button label="Remove" tone="quiet" onPress={() => helpers.remove(i)} testID={`stream-${i}-remove`} /> : null}
                        </View>
                        <TextField label="Name" value={s.name} placeholder={d.label} onChangeText={(v) => setFieldValue(`streams.${i}.name`, v)} error={err('', se.name, st.name)} testID={`stream-${i}-name`} />
                        <ChoiceChips
                          label="Substrate"
                          options={SUBSTRATE_KINDS.map((k) => ({ value: k, label: SUBSTRATES[k].label }))}
                          value={s.substrate}
                          onChange={(k) => {
                            setFieldValue(`streams.${i}.substrate`, k);
                            setFieldValue(`streams.${i}.animals`, [...SUBSTRATES[k].defaultAnimals]);
                          }}
                          testID={`stream-${i}-substrate`}
                        />
                        <View style={styles.row}>
                          <View style={styles.cell}>
                            <TextField label="Delivered" hint={`${units.bulk}/week`} keyboardType="decimal-pad" value={s.tonnesPerWeek} onChangeText={(v) => setFieldValue(`streams.${i}.tonnesPerWeek`, v)} error={err('', se.tonnesPerWeek, st.tonnesPerWeek)} testID={`stream-${i}-tonnes`} />
                          </View>
                          <View style={styles.cell}>
                            <TextField label="Moisture" hint={`% (default ${d.moisturePct.value})`} keyboardType="decimal-pad" placeholder={String(d.moisturePct.value)} value={s.moisturePct} onChangeText={(v) => setFieldValue(`streams.${i}.moisturePct`, v)} error={err('', se.moisturePct, st.moisturePct)} testID={`stream-${i}-moisture`} />
                          </View>
                        </View>
                        {d.animalChoices.length ? (
                          <MultiChips
                            label="Came from which animals (for the insect-protein rule)"
                            options={d.animalChoices.map((a) => ({ value: a, label: ORIGIN_ANIMALS[a].label }))}
                            value={s.animals}
                            onChange={(v) => setFieldValue(`streams.${i}.animals`, v)}
                            testID={`stream-${i}-animals`}
                          />
                        ) : null}
                        {showFactors ? (
                          <View style={styles.factors}>
                            <AppText variant="caption" muted>Leave a factor empty to use the default shown; each default names its study.</AppText>
                            {(['bioconversionDmPct', 'residueDmPct', 'larvaeDryMatterPct'] as const).map((key) => (
                              <View key={key} style={styles.factor}>
                                <TextField
                                  label={{ bioconversionDmPct: 'Larval dry matter per dry matter fed', residueDmPct: 'Frass dry matter per dry matter fed', larvaeDryMatterPct: 'Dry matter of fresh larvae' }[key]}
                                  hint={`% (default ${d.yields[key].value})`}
                                  keyboardType="decimal-pad"
                                  placeholder={String(d.yields[key].value)}
                                  value={s[key]}
                                  onChangeText={(v) => setFieldValue(`streams.${i}.${key}`, v)}
                                  error={err('', se[key], st[key])}
                                  testID={`stream-${i}-${key}`}
                                />
                                <AppText variant="caption" muted>{d.yields[key].source}</AppText>
                              </View>
                            ))}
                          </View>
                        ) : null}
                      </View>
                    );
                  })}
                  <View style={styles.row}>
                    <Button label="Add a stream" tone="quiet" onPress={() => helpers.push(newStream('fruit_vegetable_waste'))} testID="stream-add" />
                    <Button label={showFactors ? 'Hide yield factors' : 'Edit yield factors'} tone="quiet" onPress={() => setShowFactors(!showFactors)} testID="factors-toggle" />
                  </View>
                </View>
              )}
            </FieldArray>
            <ChoiceChips
              label="Processing"
              options={[{ value: 'full_fat', label: 'Full-fat meal' }, { value: 'pressed', label: 'Pressed: meal and oil' }]}
              value={values.defatted}
              onChange={(v) => setFieldValue('defatted', v)}
              testID="plan-processing"
            />
            {values.defatted === 'pressed' ? (
              <TextField label="Fat left in the pressed meal" hint={`% as fed (default ${DEFAULT_RESIDUAL_FAT_PCT.value})`} placeholder={String(DEFAULT_RESIDUAL_FAT_PCT.value)} keyboardType="decimal-pad" value={values.residualFatPct} onChangeText={(v) => setFieldValue('residualFatPct', v)} error={err('residualFatPct', errors.residualFatPct, touched.residualFatPct)} testID="plan-residual-fat" />
            ) : null}
            {insectMeals.length ? (
              <ChoiceChips
                label="The meal in your library (its lab analysis replaces the estimate)"
                options={[{ value: 'none', label: 'None' }, ...insectMeals.map((m) => ({ value: String(m.id), label: `${m.name}${m.hasLab ? ' · lab' : ''}` }))]}
                value={values.mealIngredientId ? String(values.mealIngredientId) : 'none'}
                onChange={(v) => setFieldValue('mealIngredientId', v === 'none' ? null : Number(v))}
                testID="plan-meal-ingredient"
              />
            ) : null}
            {typeof errors.streams === 'string' ? <FormMessage tone="danger" text={errors.streams} /> : null}
            <FormMessage tone="danger" text={formError} testID="plan-form-error" />
            <View style={styles.row}>
              <Button label={isSubmitting ? 'Saving…' : 'Save and estimate'} disabled={isSubmitting} onPress={() => handleSubmit()} testID="plan-save" />
              {onCancel ? <Button label="Cancel" tone="quiet" onPress={onCancel} testID="plan-cancel" /> : null}
            </View>
          </Card>
        );
      }}
    </Formik>
  );
}

const styles = StyleSheet.create({
  streams: { gap: space.lg },
  stream: { gap: space.md, padding: space.md, borderRadius: radius.md, borderWidth: 1, borderColor: colors.rule, backgroundColor: colors.paper },
  streamHead: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'center' },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flexGrow: 1, flexBasis: 140 },
  factors: { gap: space.md },
  factor: { gap: space.xs },
  chipsWrap: { gap: space.xs },
  chipsRow: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  chip: { minHeight: TOUCH_MIN - 8, justifyContent: 'center', paddingHorizontal: space.md, borderRadius: radius.lg, borderWidth: 1, borderColor: colors.rule, backgroundColor: colors.paperRaised },
  chipOn: { backgroundColor: colors.brand, borderColor: colors.brand },
  chipOnText: { color: colors.onBrand },
});
