import { useState } from 'react';
import { ActivityIndicator, StyleSheet, View } from 'react-native';

import { useFormulaPriceSweepMutation } from '@/api/formulas';
import { PriceSweepChart } from '@/components/charts/price-sweep-chart';
import { CautionBanner } from '@/components/caution-banner';
import { describeError } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { AppText } from '@/components/ui/text';
import type { Units } from '@/lib/measures-format';
import type { FormulaInputsInput } from '@/shared/schemas/formulas';
import { colors, space } from '@/theme';

import { pct } from './format';
import { sweepSentence } from './sweep-words';

/**
 * What an insect meal is worth in this diet: the formula re-solved on the server over a range of the
 * meal's price, with where it stands (the price at which it enters, already in today, out or in over the whole
 * range, or kept in at any price by a minimum or the specification) and how its inclusion grows as it gets cheaper.
 */
export function InsectValue({ formulaId, meals, currentInputs, units }: { units: Units; formulaId: number; meals: { id: number; name: string }[]; currentInputs: () => FormulaInputsInput | null }) {
  const [chosen, setChosen] = useState(meals[0] ? String(meals[0].id) : '');
  const sweep = useFormulaPriceSweepMutation(formulaId);
  if (meals.length === 0) {
    return (
      <Card title="Insect meal value">
        <AppText muted>Add an insect meal to the ingredients to see what it is worth in this diet.</AppText>
      </Card>
    );
  }
  const run = () => {
    const inputs = currentInputs();
    if (inputs) sweep.mutate({ ingredientId: Number(chosen), inputs });
  };
  const data = sweep.data;
  const steps = data?.sweep.points ?? [];
  const p = (perKg: number | undefined, digits: number) => (perKg === undefined ? '—' : units.priceOf(perKg).toFixed(digits));
  const per = `per ${units.mass}`;
  return (
    <Card title="Insect meal value" testID="insect-value">
      <ChoiceChips label="Insect meal" value={chosen} onChange={(v) => { setChosen(v); sweep.reset(); }} options={meals.map((m) => ({ value: String(m.id), label: m.name.length > 34 ? `${m.name.slice(0, 33)}…` : m.name }))} testID="insect-choice" />
      <Button label={sweep.isPending ? 'Re-solving over its price…' : 'Show its value'} disabled={sweep.isPending} onPress={run} testID="insect-sweep" />
      {sweep.isPending ? <ActivityIndicator color={colors.brand} /> : null}
      <FormMessage tone="danger" text={sweep.isError ? describeError(sweep.error) : null} />
      {data ? (
        <View style={styles.result} testID="insect-value-result">
          <CautionBanner compact />
          <AppText testID="insect-enters">{sweepSentence(data, units)}</AppText>
          <PriceSweepChart data={data} units={units} />
          {data.sweep.breakpoints.length ? (
            <AppText variant="small" muted>
              Its inclusion changes at {[...new Set(data.sweep.breakpoints.map((b) => p(b, 3)))].join(', ')} {units.currency} {per}. At the lowest price it makes {pct(steps[0]?.percent ?? 0, 1)} % of the batch.
            </AppText>
          ) : null}
        </View>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({ result: { gap: space.md } });
