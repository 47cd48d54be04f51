import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { useRouter } from 'expo-router';
import { Formik, type FormikHelpers } from 'formik';
import * as yup from 'yup';

import { useIngredientsQuery, usePricesRecordMutation } from '@/api/ingredients';
import { ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { AppText } from '@/components/ui/text';
import { applyServerErrors } from '@/lib/form-errors';
import { toInput, toMetric, useUnits, useUnitsReady } from '@/lib/measures-format';
import type { IngredientSummary } from '@/shared/schemas/ingredients';
import { colors, space } from '@/theme';

import { formatPrice } from './format';

type FormValues = { effectiveOn: string; prices: Record<string, string> };

const decimal = (text: string) => Number(text.trim().replace(',', '.'));

const schema = yup.object({
  effectiveOn: yup.string().required('Enter the date the prices apply from.').matches(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-03-31.'),
  // Formik hands empty fields to yup as undefined.
  prices: yup.object().test('prices', 'Check the prices', function check(prices: Record<string, string | undefined> | undefined) {
    for (const [id, text] of Object.entries(prices ?? {})) {
      if (!text?.trim()) continue;
      const v = decimal(text);
      if (!Number.isFinite(v) || v < 0) return this.createError({ path: `prices.${id}`, message: 'Enter a price of 0 or more, e.g. 0.245.' });
    }
    return true;
  }),
});

/** The weekly price update: every ingredient of our library on one page; only changed prices are saved, all at once. */
export function PriceUpdateScreen() {
  const list = useIngredientsQuery({ library: 'own', pageSize: 200 });
  const unitsReady = useUnitsReady();
  if (list.isError) return <Screen title="Update prices"><ErrorState error={list.error} onRetry={() => list.refetch()} /></Screen>;
  if (!list.data || !unitsReady) return <Screen title="Update prices"><AppText muted>Loading…</AppText></Screen>;
  return <PriceForm items={list.data.items} />;
}

function PriceForm({ items }: { items: IngredientSummary[] }) {
  const router = useRouter();
  const record = usePricesRecordMutation();
  const [message, setMessage] = useState<{ tone: 'ok' | 'danger'; text: string } | null>(null);
  // Prices are typed per kg or per lb, in the organization's currency; the API stores them per kg.
  const units = useUnits();
  const startText = (i: IngredientSummary) => (i.pricePerKg === null ? '' : toInput(i.pricePerKg, units.priceOf));
  const start: FormValues = { effectiveOn: new Date().toISOString().slice(0, 10), prices: Object.fromEntries(items.map((i) => [String(i.id), startText(i)])) };

  const submit = async (form: FormValues, helpers: FormikHelpers<FormValues>) => {
    setMessage(null);
    const changed = items.flatMap((item) => {
      const text = form.prices[String(item.id)]?.trim() ?? '';
      // An untouched field (shown rounded when converted) is not a change.
      if (!text || text === startText(item)) return [];
      const price = toMetric(decimal(text), units.priceToKg);
      return price === item.pricePerKg ? [] : [{ ingredientId: item.id, pricePerKg: price }];
    });
    if (changed.length === 0) return setMessage({ tone: 'danger', text: 'No price was changed: type the new prices first.' });
    try {
      const result = await record.mutateAsync({ effectiveOn: form.effectiveOn, items: changed });
      setMessage({ tone: 'ok', text: `Saved ${result.saved} ${result.saved === 1 ? 'price' : 'prices'} from ${result.effectiveOn}.` });
    } catch (error) {
      // Server paths are items[n].pricePerKg: put them back under the ingredient's own field.
      const text = applyServerErrors(error, { setFieldError: (field, msg) => {
        const index = /^items\[(\d+)\]/.exec(field)?.[1];
        if (index !== undefined) helpers.setFieldError(`prices.${changed[Number(index)].ingredientId}`, msg);
        else helpers.setFieldError(field, msg);
      } });
      setMessage({ tone: 'danger', text: `Nothing was saved. ${text}` });
    }
  };

  return (
    <Formik initialValues={start} validationSchema={schema} onSubmit={submit} validateOnChange={false}>
      {(f) => (
        <Screen title="Update prices" lead={`Type this week’s prices in ${units.currency} per ${units.mass} as fed; only the ones you change are saved, all together.`} testID="screen-prices">
          <TextField label="Prices apply from" hint="YYYY-MM-DD" value={f.values.effectiveOn} onChangeText={f.handleChange('effectiveOn')} error={f.submitCount > 0 ? f.errors.effectiveOn : undefined} testID="prices-date" />
          {items.length === 0 ? <AppText>Our library has no ingredients yet: copy some from the reference tables first.</AppText> : null}
          <View style={styles.list}>
            {items.map((item) => (
              <View key={item.id} style={styles.row}>
                <View style={styles.name}>
                  <AppText>{item.name}</AppText>
                  <AppText variant="caption" muted>{item.priceDate ? `now ${formatPrice(item.pricePerKg, units)} ${units.currency} per ${units.mass} since ${item.priceDate}` : 'no price yet'}</AppText>
                </View>
                <View style={styles.input}>
                  <TextField
                    label={`Price of ${item.name}`}
                    hint={`${units.currency} per ${units.mass}`}
                    value={f.values.prices[String(item.id)] ?? ''}
                    onChangeText={(t) => f.setFieldValue(`prices.${item.id}`, t)}
                    keyboardType="decimal-pad"
                    inputMode="decimal"
                    error={f.submitCount > 0 || record.isError ? (f.errors.prices as Record<string, string> | undefined)?.[String(item.id)] : undefined}
                    testID={`price-${item.id}`}
                  />
                </View>
              </View>
            ))}
          </View>
          <FormMessage tone={message?.tone ?? 'ok'} text={message?.text} testID="prices-message" />
          <View style={styles.actions}>
            <Button label={f.isSubmitting ? 'Saving…' : 'Save prices'} disabled={f.isSubmitting} onPress={() => f.handleSubmit()} testID="prices-save" />
            <Button label="Back to the library" tone="quiet" onPress={() => (router.canGoBack() ? router.back() : router.replace('/library'))} testID="prices-back" />
          </View>
        </Screen>
      )}
    </Formik>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  row: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-end', gap: space.md, paddingBottom: space.sm, borderBottomWidth: 1, borderBottomColor: colors.rule },
  name: { flexGrow: 1, flexBasis: 200 },
  input: { flexBasis: 160, flexGrow: 1, maxWidth: 240 },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
});
