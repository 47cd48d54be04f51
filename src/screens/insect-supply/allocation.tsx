import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { Formik, type FormikHelpers } from 'formik';
import * as yup from 'yup';

import { useSupplyAllocateMutation, useSupplyAllocationOptionsQuery } from '@/api/supply-plans';
import { CautionBanner } from '@/components/caution-banner';
import { ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { TextField } from '@/components/ui/text-field';
import { AppText, Figure } from '@/components/ui/text';
import { applyServerErrors } from '@/lib/form-errors';
import { toInput, toMetric, useUnits, useUnitsReady, type Units } from '@/lib/measures-format';
import type { SupplyAllocationOptions, SupplyAllocationResponse, SupplyPlanDetail } from '@/shared/schemas/supply';
import { colors, radius, space, TOUCH_MIN } from '@/theme';

import { massText, num, parseNumber } from './format';

type Values = { tonnes: Record<string, string>; specs: number[]; ingredients: number[]; prices: Record<string, string>; mealPrice: string };

const schema = yup.object({
  specs: yup.array().min(1, 'Choose at least one formula to make this week.'),
  ingredients: yup.array().min(1, 'Choose the ingredients the formulas may use.'),
  mealPrice: yup.string().test('price', 'Enter what your meal is counted at per kg or lb (0 or more).', (v) => {
    const n = parseNumber(v ?? '');
    return n !== null && Number.isFinite(n) && n >= 0;
  }),
});

function Toggle({ on, label, detail, onPress, testID }: { on: boolean; label: string; detail?: string; onPress: () => void; testID?: string }) {
  return (
    <Pressable role="checkbox" aria-checked={on} onPress={onPress} testID={testID} style={[styles.toggle, on && styles.toggleOn]}>
      <AppText variant="small" style={on ? styles.toggleOnText : undefined}>{on ? '✓ ' : ''}{label}</AppText>
      {detail ? <AppText variant="caption" style={on ? styles.toggleOnText : styles.muted}>{detail}</AppText> : null}
    </Pressable>
  );
}

/** The linked meal's library price per kg, and the same shown per kg or per lb. */
function linkedPrice(options: SupplyAllocationOptions, plan: SupplyPlanDetail, units: Units): { perKg: number; text: string } | null {
  const linked = options.ingredients.find((i) => i.id === plan.mealIngredient?.id);
  return linked?.pricePerKg != null ? { perKg: linked.pricePerKg, text: toInput(linked.pricePerKg, units.priceOf) } : null;
}

function initial(options: SupplyAllocationOptions, plan: SupplyPlanDetail, units: Units): Values {
  const priced = options.ingredients.filter((i) => i.category !== 'insect_meal' && i.pricePerKg !== null).map((i) => i.id);
  return { tonnes: {}, specs: [], ingredients: priced, prices: {}, mealPrice: linkedPrice(options, plan, units)?.text ?? '' };
}

/** Where the week's meal goes: the chosen formulas solved together, with the meal and with none of it. */
export function AllocationCard({ plan }: { plan: SupplyPlanDetail }) {
  const options = useSupplyAllocationOptionsQuery(true);
  const run = useSupplyAllocateMutation(plan.id);
  const [formError, setFormError] = useState<string | null>(null);
  const [result, setResult] = useState<SupplyAllocationResponse | null>(null);
  // Tonnages are typed in t or short tons and prices per kg or per lb; the API takes tonnes and per kg.
  const units = useUnits();
  const unitsReady = useUnitsReady();

  if (options.isPending || !unitsReady) return <Card title="This week’s formulas"><AppText muted>Loading your library…</AppText></Card>;
  if (options.isError) return <ErrorState error={options.error} onRetry={() => options.refetch()} />;
  const o = options.data;

  const submit = async (v: Values, helpers: FormikHelpers<Values>) => {
    setFormError(null);
    const missing = v.specs.find((id) => {
      const t = parseNumber(v.tonnes[id] ?? '');
      return t === null || !(t > 0);
    });
    if (missing !== undefined) {
      helpers.setFieldError(`tonnes.${missing}`, `Enter the ${units.tonneWord}s to make this week (more than 0).`);
      return;
    }
    const perKg = (text: string) => {
      const typed = parseNumber(text);
      return typed === null ? null : toMetric(typed, units.priceToKg);
    };
    // The library price untouched goes back exactly as stored, not through the rounded per-lb text.
    const linked = linkedPrice(o, plan, units);
    try {
      const response = await run.mutateAsync({
        formulas: v.specs.map((id) => ({ specificationId: id, tonnesPerWeek: toMetric(parseNumber(v.tonnes[id])!, units.bulkToTonnes) })),
        ingredients: v.ingredients.map((id) => ({ ingredientId: id, pricePerKg: perKg(v.prices[id] ?? '') })),
        mealPricePerKg: linked && v.mealPrice.trim() === linked.text ? linked.perKg : perKg(v.mealPrice)!,
      });
      setResult(response);
    } catch (error) {
      setResult(null);
      setFormError(applyServerErrors(error, helpers));
    }
  };

  return (
    <Formik initialValues={initial(o, plan, units)} validationSchema={schema} onSubmit={submit}>
      {({ values, errors, setFieldValue, handleSubmit, isSubmitting, submitCount }) => (
        <Card title="This week’s formulas" testID="supply-allocation">
          <AppText variant="small" muted>Choose the requirement specifications to make this week with their tonnages, and the ingredients they may use. Troughline shares the {massText(units, plan.plan.processing.mealKg)} of meal where it saves most.</AppText>
          <AppText variant="label">Formulas to make</AppText>
          <View style={styles.list}>
            {o.specifications.map((s) => {
              const on = values.specs.includes(s.id);
              return (
                <View key={s.id} style={styles.specRow}>
                  <Toggle on={on} label={s.name} detail={`${s.speciesName}${s.phaseName ? ` · ${s.phaseName}` : ''}`} onPress={() => setFieldValue('specs', on ? values.specs.filter((x) => x !== s.id) : [...values.specs, s.id])} testID={`alloc-spec-${s.id}`} />
                  {on ? (
                    <View style={styles.tonnes}>
                      <TextField label="To make" hint={`${units.bulk}/week`} keyboardType="decimal-pad" value={values.tonnes[s.id] ?? ''} onChangeText={(t) => setFieldValue(`tonnes.${s.id}`, t)} error={(errors.tonnes as Record<string, string> | undefined)?.[s.id]} testID={`alloc-tonnes-${s.id}`} />
                    </View>
                  ) : null}
                </View>
              );
            })}
          </View>
          {submitCount > 0 && typeof errors.specs === 'string' ? <FormMessage tone="danger" text={errors.specs} /> : null}
          <AppText variant="label">Ingredients they may use (library price, {units.currency} per {units.mass})</AppText>
          <View style={styles.chips}>
            {o.ingredients.filter((i) => i.id !== plan.mealIngredient?.id).map((i) => {
              const on = values.ingredients.includes(i.id);
              return (
                <Toggle key={i.id} on={on} label={i.name} detail={i.pricePerKg !== null ? `${units.money(units.priceOf(i.pricePerKg), 4)} per ${units.mass}` : 'no price: enter one'} onPress={() => setFieldValue('ingredients', on ? values.ingredients.filter((x) => x !== i.id) : [...values.ingredients, i.id])} testID={`alloc-ing-${i.id}`} />
              );
            })}
          </View>
          {submitCount > 0 && typeof errors.ingredients === 'string' ? <FormMessage tone="danger" text={errors.ingredients} /> : null}
          <TextField label="Your meal counted at" hint={`${units.currency} per ${units.mass} as fed`} keyboardType="decimal-pad" value={values.mealPrice} onChangeText={(t) => setFieldValue('mealPrice', t)} error={submitCount > 0 ? errors.mealPrice : undefined} testID="alloc-meal-price" />
          <FormMessage tone="danger" text={formError} testID="alloc-error" />
          <Button label={isSubmitting ? 'Solving…' : 'Share out the meal'} disabled={isSubmitting} onPress={() => handleSubmit()} testID="alloc-run" />
          {result ? <AllocationResult result={result} units={units} /> : null}
        </Card>
      )}
    </Formik>
  );
}

function AllocationResult({ result, units }: { result: SupplyAllocationResponse; units: Units }) {
  const perBulk = (perTonne: number) => `${units.money(units.costOf(perTonne), 2)} per ${units.bulk}`;
  const ok = result.status === 'optimal';
  return (
    <View style={styles.result} testID="alloc-result">
      <CautionBanner />
      {!ok ? <FormMessage tone="danger" text={`No mix meets every formula: ${result.message ?? result.status}`} testID="alloc-infeasible" /> : null}
      {result.warnings.map((w, k) => (
        <FormMessage key={k} tone="danger" text={w} />
      ))}
      {ok ? (
        <View style={styles.stats}>
          <Stat label="Meal used" value={massText(units, result.mealUsedKg)} testID="alloc-used" />
          <Stat label="Left over" value={massText(units, result.mealLeftKg)} testID="alloc-left" />
          <Stat label="Saving against no meal" value={result.saving !== null ? `${units.money(result.saving, 2)} per week` : result.statusWithoutMeal === 'infeasible' ? 'no mix without the meal' : '—'} testID="alloc-saving" />
          <Stat label={`One more ${units.tonneWord} of meal`} value={result.mealValuePerTonne !== null ? `worth ${perBulk(result.mealValuePerTonne)}` : '—'} testID="alloc-value" />
        </View>
      ) : null}
      {result.formulas.map((f) => (
        <View key={f.specificationId} style={[styles.formula, !f.mealOffered && styles.blocked]} testID={`alloc-formula-${f.specificationId}`}>
          <AppText variant="label">{f.name} · {num(units.bulkOf(f.tonnesPerWeek), 1)} {units.bulk}/week</AppText>
          {f.mealOffered ? (
            <View style={styles.stats}>
              <Figure value={num(units.massOf(f.mealKg), 1)} unit={`${units.mass} of meal (${num(f.mealPercent, 2)} %)`} />
              {f.costPerTonne !== null ? <Figure value={num(units.costOf(f.costPerTonne), 2)} unit={`${units.currency} per ${units.bulk} with the meal`} /> : null}
              {f.costPerTonneWithoutMeal !== null ? <Figure value={num(units.costOf(f.costPerTonneWithoutMeal), 2)} unit={`${units.currency} per ${units.bulk} without`} /> : null}
            </View>
          ) : (
            <AppText variant="small" testID={`alloc-refusal-${f.specificationId}`}>Meal not offered: {f.refusal}</AppText>
          )}
          {f.refusedIngredients.map((r) => (
            <AppText key={r.ingredientId} variant="caption">Also left out: {r.message}</AppText>
          ))}
        </View>
      ))}
    </View>
  );
}

function Stat({ label, value, testID }: { label: string; value: string; testID?: string }) {
  return (
    <View style={styles.stat}>
      <AppText variant="label">{label}</AppText>
      <AppText testID={testID}>{value}</AppText>
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  specRow: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'flex-end' },
  tonnes: { flexBasis: 160, flexGrow: 0 },
  chips: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  toggle: { minHeight: TOUCH_MIN, justifyContent: 'center', paddingHorizontal: space.md, paddingVertical: space.xs, borderRadius: radius.md, borderWidth: 1, borderColor: colors.rule, backgroundColor: colors.paperRaised, flexShrink: 1 },
  toggleOn: { backgroundColor: colors.brand, borderColor: colors.brand },
  toggleOnText: { color: colors.onBrand },
  muted: { color: colors.inkMuted },
  result: { gap: space.md },
  stats: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  stat: { flexGrow: 1, flexBasis: 140, gap: space.xs },
  formula: { gap: space.xs, padding: space.md, borderRadius: radius.md, backgroundColor: colors.paperSunken },
  blocked: { backgroundColor: colors.dangerSoft },
});
