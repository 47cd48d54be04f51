import { StyleSheet, View } from 'react-native';
import type { FormikProps } from 'formik';
import * as yup from 'yup';

import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { TextField } from '@/components/ui/text-field';
import { AppText } from '@/components/ui/text';
import { toInput, toMetric, type Units } from '@/lib/measures-format';
import type { FormulaDetail, FormulaInputsInput } from '@/shared/schemas/formulas';
import { colors, space } from '@/theme';

/** `saved` keeps the stored per-kg value behind a converted text, so an untouched field goes back to the API unchanged. */
type Saved = { text: string; metric: number } | null;
export type IngredientRow = { ingredientId: number; name: string; insect: boolean; libraryPrice: number | null; priceDate: string | null; price: string; savedPrice?: Saved; minPct: string; maxPct: string };
export type BoundRow = { nutrientId: string; name: string; unit: string; min: string; max: string };
export type RatioRow = { numeratorId: string; denominatorId: string; label: string; min: string; max: string };
export type GroupRow = Omit<FormulaDetail['inputs']['groups'][number], 'minPct' | 'maxPct'> & { minPct: string; maxPct: string };
/** `batchKg` and `price` hold what the user reads and types: kg or lb, per kg or per lb (see `units`). */
export type InputValues = { batchKg: string; savedBatch?: Saved; ingredients: IngredientRow[]; nutrients: BoundRow[]; ratios: RatioRow[]; groups: GroupRow[] };

const str = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));
const num = (v: string) => (v.trim() === '' ? null : Number(v.replace(',', '.')));

/** Form values from a formula's saved inputs (kg, per kg), in the organization's units, with names and units for the labels. */
export function valuesFromFormula(formula: FormulaDetail, units: Units): InputValues {
  const ing = new Map(formula.labels.ingredients.map((i) => [i.id, i]));
  const nut = new Map(formula.labels.nutrients.map((n) => [n.id, n]));
  const name = (id: string) => nut.get(id)?.name ?? id;
  const batchText = toInput(formula.inputs.batchKg, units.massOf);
  return {
    batchKg: batchText,
    savedBatch: { text: batchText, metric: formula.inputs.batchKg },
    ingredients: formula.inputs.ingredients.map((i) => {
      const l = ing.get(i.ingredientId);
      return { ingredientId: i.ingredientId, name: l?.name ?? `Ingredient ${i.ingredientId}`, insect: l?.category === 'insect_meal', libraryPrice: l?.pricePerKg ?? null, priceDate: l?.priceDate ?? null, ...priceField(i.pricePerKg, units), minPct: str(i.minPct), maxPct: str(i.maxPct) };
    }),
    nutrients: formula.inputs.nutrients.map((b) => ({ nutrientId: b.nutrientId, name: name(b.nutrientId), unit: nut.get(b.nutrientId)?.unit ?? '', min: str(b.min), max: str(b.max) })),
    ratios: formula.inputs.ratios.map((r) => ({ numeratorId: r.numeratorId, denominatorId: r.denominatorId, label: `${name(r.numeratorId)} : ${name(r.denominatorId)}`, min: str(r.min), max: str(r.max) })),
    groups: formula.inputs.groups.map((g) => ({ ...g, minPct: str(g.minPct), maxPct: str(g.maxPct) })),
  };
}

function priceField(pricePerKg: number | null | undefined, units: Units): Pick<IngredientRow, 'price' | 'savedPrice'> {
  if (pricePerKg === null || pricePerKg === undefined) return { price: '', savedPrice: null };
  const text = toInput(pricePerKg, units.priceOf);
  return { price: text, savedPrice: { text, metric: pricePerKg } };
}

/** A typed field back to the API's unit; an untouched field keeps its stored value exactly. */
function metricOf(text: string, saved: Saved | undefined, convert: (v: number) => number): number | null {
  if (saved && text.trim() === saved.text) return saved.metric;
  const typed = num(text);
  return typed === null ? null : toMetric(typed, convert);
}

/** The API's inputs from the form values: back to kg and prices per kg, whatever the user typed in. */
export function inputsFromValues(v: InputValues, units: Units): FormulaInputsInput {
  return {
    batchKg: metricOf(v.batchKg, v.savedBatch, units.massToKg) ?? Number.NaN,
    ingredients: v.ingredients.map((i) => ({ ingredientId: i.ingredientId, pricePerKg: metricOf(i.price, i.savedPrice, units.priceToKg), minPct: num(i.minPct), maxPct: num(i.maxPct) })),
    nutrients: v.nutrients.map((b) => ({ nutrientId: b.nutrientId, min: num(b.min), max: num(b.max) })),
    ratios: v.ratios.map((r) => ({ numeratorId: r.numeratorId, denominatorId: r.denominatorId, min: num(r.min), max: num(r.max) })),
    groups: v.groups.map((g) => ({ ...g, minPct: num(g.minPct), maxPct: num(g.maxPct) })),
  };
}

const optionalNumber = (max: number, unit = '') =>
  yup
    .string()
    .test('number', 'Enter a number, or leave it empty', (v) => !v || (v.trim() !== '' && Number.isFinite(Number(v.replace(',', '.')))))
    .test('range', `Between 0 and ${max}${unit}`, (v) => !v || (Number(v.replace(',', '.')) >= 0 && Number(v.replace(',', '.')) <= max));

const minBelowMax = (row: { min?: string; max?: string; minPct?: string; maxPct?: string }) => {
  const lo = num(row.min ?? row.minPct ?? '');
  const hi = num(row.max ?? row.maxPct ?? '');
  return lo === null || hi === null || lo <= hi;
};

/** The largest batch the API takes (1,000,000 kg), in the organization's unit: 1,000,000 kg or 2,204,622 lb. */
export const maxBatch = (units: Units) => Math.floor(units.massOf(1_000_000));

export const inputsSchemaFor = (units: Units) => yup.object({
  batchKg: yup
    .string()
    .required(`Enter the batch size in ${units.mass}`)
    .test('batch', `The batch must be more than 0 and at most ${maxBatch(units).toLocaleString('en-US')} ${units.mass}`, (v) => !!v && Number(v.replace(',', '.')) > 0 && Number(v.replace(',', '.')) <= maxBatch(units)),
  ingredients: yup
    .array(yup.object({ price: optionalNumber(1_000_000), minPct: optionalNumber(100, ' %'), maxPct: optionalNumber(100, ' %') }).test('order', 'The minimum is above the maximum', minBelowMax))
    .min(1, 'Choose at least one ingredient'),
  nutrients: yup.array(yup.object({ min: optionalNumber(100_000), max: optionalNumber(100_000) }).test('order', 'The minimum is above the maximum', minBelowMax)),
  ratios: yup.array(yup.object({ min: optionalNumber(100_000), max: optionalNumber(100_000) }).test('order', 'The minimum is above the maximum', minBelowMax)),
  groups: yup.array(yup.object({ minPct: optionalNumber(100, ' %'), maxPct: optionalNumber(100, ' %') }).test('order', 'The minimum is above the maximum', minBelowMax)),
});

type Form = FormikProps<InputValues>;

function errorAt(form: Form, path: string): string | undefined {
  const parts = path.split('.');
  let e: unknown = form.errors;
  for (const p of parts) e = e && typeof e === 'object' ? (e as Record<string, unknown>)[p] : undefined;
  return typeof e === 'string' ? e : undefined;
}

function rowError(form: Form, list: string, index: number): string | undefined {
  const e = (form.errors as Record<string, unknown>)[list];
  const row = Array.isArray(e) ? e[index] : undefined;
  return typeof row === 'string' ? row : undefined;
}

function Pair({ form, base, lo, hi, unit, testID }: { form: Form; base: string; lo: string; hi: string; unit: string; testID: string }) {
  const get = (p: string) => p.split('.').reduce<unknown>((o, k) => (o as Record<string, unknown>)?.[k], form.values) as string;
  return (
    <View style={styles.pair}>
      <View style={styles.pairField}>
        <TextField label="Min" hint={unit} keyboardType="decimal-pad" value={get(`${base}.${lo}`)} onChangeText={form.handleChange(`${base}.${lo}`)} error={errorAt(form, `${base}.${lo}`)} testID={`${testID}-min`} />
      </View>
      <View style={styles.pairField}>
        <TextField label="Max" hint={unit} keyboardType="decimal-pad" value={get(`${base}.${hi}`)} onChangeText={form.handleChange(`${base}.${hi}`)} error={errorAt(form, `${base}.${hi}`)} testID={`${testID}-max`} />
      </View>
    </View>
  );
}

/**
 * The formula's inputs: batch size, each ingredient's price (empty: today's library price) and
 * inclusion limits, and the nutrient, ratio and group bounds. Every number carries its unit; every
 * amount is per kg of feed as fed.
 */
export function InputsForm({ form, units, onRemoveIngredient, onAddIngredients, footer }: { form: Form; units: Units; onRemoveIngredient: (index: number) => void; onAddIngredients: () => void; footer?: React.ReactNode }) {
  return (
    <View style={styles.wrap} testID="formula-inputs">
      <Card title="Batch">
        <AppText variant="small" muted>Basis: as fed. Prices in {units.currency} per {units.mass} as fed; inclusion limits in % of the batch; nutrient bounds per kg of feed whatever the units.</AppText>
        <TextField label="Batch size" hint={`${units.mass} as fed`} keyboardType="decimal-pad" value={form.values.batchKg} onChangeText={form.handleChange('batchKg')} error={errorAt(form, 'batchKg')} testID="input-batch" />
      </Card>
      <Card title={`Ingredients (${form.values.ingredients.length})`}>
        {form.values.ingredients.map((row, i) => (
          <View key={row.ingredientId} style={styles.ingredient} testID={`input-ingredient-${row.ingredientId}`}>
            <View style={styles.ingredientHead}>
              <AppText variant="label" style={[styles.flex, row.insect && styles.insect]}>{row.name}{row.insect ? ' · insect meal' : ''}</AppText>
              <Button label="Remove" tone="quiet" onPress={() => onRemoveIngredient(i)} testID={`remove-${row.ingredientId}`} />
            </View>
            <View style={styles.pair}>
              <View style={styles.pairField}>
                <TextField
                  label="Price"
                  hint={row.libraryPrice !== null ? `${units.currency} per ${units.mass}; library ${units.money(units.priceOf(row.libraryPrice), 4)} (${row.priceDate})` : `${units.currency} per ${units.mass}; no library price`}
                  placeholder={row.libraryPrice !== null ? units.priceOf(row.libraryPrice).toFixed(4) : 'enter a price'}
                  keyboardType="decimal-pad"
                  value={row.price}
                  onChangeText={form.handleChange(`ingredients.${i}.price`)}
                  error={errorAt(form, `ingredients.${i}.price`)}
                  testID={`input-price-${row.ingredientId}`}
                />
              </View>
            </View>
            <Pair form={form} base={`ingredients.${i}`} lo="minPct" hi="maxPct" unit="% of batch" testID={`input-inclusion-${row.ingredientId}`} />
            {rowError(form, 'ingredients', i) ? <AppText variant="small" style={styles.error}>{rowError(form, 'ingredients', i)}</AppText> : null}
          </View>
        ))}
        {typeof form.errors.ingredients === 'string' ? <AppText variant="small" style={styles.error}>{form.errors.ingredients}</AppText> : null}
        <Button label="Add ingredients" tone="quiet" onPress={onAddIngredients} testID="add-ingredients" />
      </Card>
      {/* Concentrations per kg of feed (%, g/kg, kcal/kg): ratios, the same in metric and US units. */}
      <Card title="Nutrient bounds (per kg as fed)">
        {units.system === 'us' ? <AppText variant="caption" muted testID="per-kg-note">Energy and nutrient levels stay per kg of feed (kcal/kg, g/kg, %) in US units too: they are concentrations, not amounts.</AppText> : null}
        {form.values.nutrients.map((b, i) => (
          <View key={b.nutrientId} style={styles.bound} testID={`input-bound-${b.nutrientId}`}>
            <AppText variant="label">{b.name}</AppText>
            <Pair form={form} base={`nutrients.${i}`} lo="min" hi="max" unit={b.unit} testID={`bound-${b.nutrientId}`} />
            {rowError(form, 'nutrients', i) ? <AppText variant="small" style={styles.error}>{rowError(form, 'nutrients', i)}</AppText> : null}
          </View>
        ))}
      </Card>
      {form.values.ratios.length ? (
        <Card title="Ratios">
          {form.values.ratios.map((r, i) => (
            <View key={`${r.numeratorId}:${r.denominatorId}`} style={styles.bound}>
              <AppText variant="label">{r.label}</AppText>
              <Pair form={form} base={`ratios.${i}`} lo="min" hi="max" unit="ratio" testID={`ratio-${i}`} />
              {rowError(form, 'ratios', i) ? <AppText variant="small" style={styles.error}>{rowError(form, 'ratios', i)}</AppText> : null}
            </View>
          ))}
        </Card>
      ) : null}
      {form.values.groups.length ? (
        <Card title="Group caps (% of batch)">
          {form.values.groups.map((g, i) => (
            <View key={`${g.label}-${i}`} style={styles.bound}>
              <AppText variant="label">{g.label}</AppText>
              {g.testedMaxPct != null ? <AppText variant="caption" muted>Tested up to {g.testedMaxPct} % in feeding trials{g.source ? ` (${g.source})` : ''}. Above it the result warns.</AppText> : null}
              <Pair form={form} base={`groups.${i}`} lo="minPct" hi="maxPct" unit="% of batch" testID={`group-${i}`} />
              {rowError(form, 'groups', i) ? <AppText variant="small" style={styles.error}>{rowError(form, 'groups', i)}</AppText> : null}
            </View>
          ))}
        </Card>
      ) : null}
      {footer}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.lg },
  ingredient: { gap: space.sm, paddingBottom: space.md, borderBottomWidth: 1, borderBottomColor: colors.rule },
  ingredientHead: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  flex: { flex: 1 },
  insect: { color: colors.accent },
  pair: { flexDirection: 'row', gap: space.md },
  pairField: { flex: 1 },
  bound: { gap: space.xs },
  error: { color: colors.danger },
});
