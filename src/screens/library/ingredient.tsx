import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { useRouter } from 'expo-router';

import { ApiError } from '@/api/client';
import { useIngredientCopyMutation, useIngredientDeleteMutation, useIngredientQuery } from '@/api/ingredients';
import { useNutrientsQuery } from '@/api/nutrients';
import { useActiveMembership } from '@/api/session';
import { CautionBanner } from '@/components/caution-banner';
import { ErrorState, describeError } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { AppText, Figure } from '@/components/ui/text';
import {
  CONFIDENCE_LABELS,
  INGREDIENT_CATEGORY_LABELS,
  INSECT_PROCESSING_LABELS,
  INSECT_SPECIES_LABELS,
  NUTRIENT_GROUP_LABELS,
  NUTRIENT_GROUPS,
  ORIGIN_ANIMALS,
  VALUE_SOURCE_KIND_LABELS,
} from '@/shared/library-terms';
import { useUnits } from '@/lib/measures-format';
import type { IngredientDetail, ValueSet } from '@/shared/schemas/ingredients';
import { valueOnBasis, type CompositionBasis } from '@/shared/units';
import { colors, radius, space, TOUCH_MIN } from '@/theme';

import { AnalysisHistory } from './analysis-history';
import { BasisToggle } from './basis-toggle';
import { formatPrice, formatValue } from './format';
import { LabAnalysisCard } from './lab-analysis-card';

/** One ingredient: its nutrient profile by kind with the source of each value, insect details and prices. */
export function IngredientScreen({ id }: { id: number }) {
  const query = useIngredientQuery(id);
  if (query.isError) return <Screen title="Ingredient" testID="screen-ingredient"><ErrorState error={query.error} onRetry={() => query.refetch()} /></Screen>;
  if (!query.data) return <Screen title="Ingredient" testID="screen-ingredient"><AppText muted>Loading…</AppText></Screen>;
  return <IngredientBody item={query.data} />;
}

function IngredientBody({ item }: { item: IngredientDetail }) {
  const router = useRouter();
  const { can } = useActiveMembership();
  const copy = useIngredientCopyMutation();
  const units = useUnits();
  const [basis, setBasis] = useState<CompositionBasis>('as_fed');
  const [confirming, setConfirming] = useState(false);
  const setNumber = new Map(item.valueSets.map((s, i) => [s.id, i + 1]));

  return (
    <Screen title={item.name} lead={`${INGREDIENT_CATEGORY_LABELS[item.category]} · ${item.library === 'reference' ? 'Reference library (read-only)' : 'Our library'}`} testID="screen-ingredient">
      <View style={styles.actions}>
        <Button label="Back to the library" tone="quiet" onPress={() => (router.canGoBack() ? router.back() : router.replace('/library'))} testID="back" />
        {item.library === 'own' && can('library:write') ? <Button label="Edit" onPress={() => router.push(`/library/${item.id}/edit`)} testID="ingredient-edit" /> : null}
        {item.library === 'own' && can('library:write') && !confirming ? <Button label="Delete" tone="quiet" onPress={() => setConfirming(true)} testID="ingredient-delete" /> : null}
        {item.library === 'reference' && can('library:write') ? (
          <Button
            label={copy.isPending ? 'Copying…' : 'Copy into our library'}
            disabled={copy.isPending}
            onPress={() => copy.mutate(item.id, { onSuccess: (created) => router.replace(`/library/${created.id}`) })}
            testID="ingredient-copy"
          />
        ) : null}
      </View>
      {confirming ? <DeleteConfirm item={item} onDone={() => router.dismissTo('/library')} onCancel={() => setConfirming(false)} /> : null}
      {copy.isError ? <FormMessage tone="danger" text={describeError(copy.error)} /> : null}
      {item.refusals.map((r) => (
        <FormMessage key={r.family} tone="danger" text={r.message} testID={`refusal-${r.family}`} />
      ))}
      {item.insect ? (
        <Card title="Insect meal" testID="insect-details">
          <AppText>{INSECT_SPECIES_LABELS[item.insect.species]} · {INSECT_PROCESSING_LABELS[item.insect.processing]}</AppText>
          <AppText>Reared on: {item.insect.substrate}</AppText>
          <AppText muted>
            {item.insect.substrateOrigin === 'plant' ? 'Substrate of plant origin' : item.insect.substrateOrigin === 'unknown' ? 'Substrate origin not known: ask the supplier before feeding' : `Substrate of ${item.insect.substrateOrigin} origin, from: ${item.insect.substrateAnimals.map((a) => ORIGIN_ANIMALS[a].label).join(', ')}`}
          </AppText>
          <AppText variant="small" muted>The substrate moves fat, calcium and fatty acids: analyse each supply.</AppText>
        </Card>
      ) : null}
      {item.notes ? <AppText testID="ingredient-notes">{item.notes}</AppText> : null}
      <BasisToggle value={basis} onChange={setBasis} />
      <Profile item={item} basis={basis} setNumber={setNumber} />
      <Sources sets={item.valueSets} setNumber={setNumber} />
      {item.library === 'own' ? <AnalysisHistory ingredientId={item.id} basis={basis} canCompare={can('lab:import')} /> : null}
      {item.library === 'own' && can('lab:import') ? <LabAnalysisCard ingredientId={item.id} /> : null}
      <Card title="Price" testID="price-history">
        {item.prices.length === 0 ? <AppText muted>No price recorded.</AppText> : null}
        {item.prices.map((p) => (
          <View key={p.id} style={styles.line}>
            <AppText>{p.effectiveOn}</AppText>
            <Figure value={formatPrice(p.pricePerKg, units)} unit={`${units.currency} per ${units.mass} as fed`} />
          </View>
        ))}
      </Card>
      <CautionBanner compact />
    </Screen>
  );
}

/**
 * The second step of deleting: says what goes with the ingredient and what stays, then deletes or
 * shows why the server refused (the formulas and other things still using it, by name).
 */
function DeleteConfirm({ item, onDone, onCancel }: { item: IngredientDetail; onDone: () => void; onCancel: () => void }) {
  const remove = useIngredientDeleteMutation(item.id);
  const refusal = remove.error instanceof ApiError && remove.error.code === 'in_use' ? remove.error : null;
  const uses = refusal
    ? [
        ...(refusal.fieldErrors.formulas ?? []).map((n) => `Formula: ${n}`),
        ...(refusal.fieldErrors.specifications ?? []).map((n) => `Specification (inclusion limit): ${n}`),
        ...(refusal.fieldErrors.supplyPlans ?? []).map((n) => `Supply plan: ${n}`),
      ]
    : [];
  return (
    <Card title={`Delete “${item.name}”?`} testID="delete-confirm" style={styles.confirm}>
      <AppText>
        It leaves our library with its values, prices and lab analyses. Formula versions already kept are not changed: each keeps the values it was solved with.
      </AppText>
      {refusal ? (
        <View accessibilityRole="alert" style={styles.refusal} testID="delete-refused">
          <AppText>{refusal.message}</AppText>
          {uses.map((u) => (
            <AppText key={u} variant="small">• {u}</AppText>
          ))}
        </View>
      ) : remove.isError ? (
        <FormMessage tone="danger" text={`Nothing was deleted. ${describeError(remove.error)}`} testID="delete-error" />
      ) : null}
      <View style={styles.actions}>
        {refusal ? null : (
          <Button label={remove.isPending ? 'Deleting…' : 'Yes, delete it'} disabled={remove.isPending} onPress={() => remove.mutate(undefined, { onSuccess: onDone })} testID="delete-confirm-yes" style={styles.danger} />
        )}
        <Button label={refusal ? 'Close' : 'Keep it'} tone="quiet" onPress={onCancel} disabled={remove.isPending} testID="delete-confirm-no" />
      </View>
    </Card>
  );
}

function Profile({ item, basis, setNumber }: { item: IngredientDetail; basis: CompositionBasis; setNumber: Map<number, number> }) {
  const nutrients = useNutrientsQuery();
  if (nutrients.isError) return <ErrorState error={nutrients.error} onRetry={() => nutrients.refetch()} />;
  if (!nutrients.data) return <AppText muted>Loading the nutrient catalogue…</AppText>;
  const byId = new Map(item.nutrientValues.map((v) => [v.nutrientId, v]));
  const dmOf = new Map(item.valueSets.map((s) => [s.id, s.dryMatterPct]));
  if (item.nutrientValues.length === 0) return <AppText testID="no-values">No nutrient values yet. {item.library === 'own' ? 'Edit the ingredient or record a lab analysis.' : ''}</AppText>;
  return (
    <View style={styles.groups} testID="nutrient-profile">
      {NUTRIENT_GROUPS.map((group) => {
        const rows = nutrients.data.items.filter((n) => n.group === group && byId.has(n.id));
        if (rows.length === 0) return null;
        return (
          <Card key={group} title={NUTRIENT_GROUP_LABELS[group]}>
            {rows.map((n) => {
              const v = byId.get(n.id)!;
              const value = valueOnBasis(v.value, dmOf.get(v.valueSetId) ?? 100, basis, n.id);
              return (
                <View key={n.id} style={styles.line} testID={`value-${n.id}`}>
                  <AppText style={styles.name}>{n.name}</AppText>
                  <View style={styles.valueCell}>
                    <Figure value={formatValue(value, n.unit)} unit={n.unit} testID={`value-${n.id}-figure`} />
                    <AppText variant="caption" muted>source {setNumber.get(v.valueSetId)}</AppText>
                  </View>
                </View>
              );
            })}
          </Card>
        );
      })}
    </View>
  );
}

function Sources({ sets, setNumber }: { sets: ValueSet[]; setNumber: Map<number, number> }) {
  if (sets.length === 0) return null;
  return (
    <Card title="Where the values come from" testID="value-sources">
      {sets.map((s) => (
        <View key={s.id} style={styles.source}>
          <AppText variant="label">Source {setNumber.get(s.id)} · {VALUE_SOURCE_KIND_LABELS[s.sourceKind]}{s.analysedOn ? `, analysed ${s.analysedOn}` : ''}</AppText>
          <AppText>{s.sourceName}</AppText>
          <AppText variant="small" style={s.confidence === 'from_memory' ? styles.caution : undefined}>
            {CONFIDENCE_LABELS[s.confidence]} · as fed at {s.dryMatterPct} % dry matter
          </AppText>
          {s.note ? <AppText variant="small" muted>{s.note}</AppText> : null}
        </View>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  groups: { gap: space.md },
  line: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'center', minHeight: TOUCH_MIN - 8, gap: space.md, borderTopWidth: 1, borderTopColor: colors.rule, paddingTop: space.xs },
  name: { flex: 1 },
  valueCell: { alignItems: 'flex-end' },
  source: { gap: 2, paddingVertical: space.sm, borderTopWidth: 1, borderTopColor: colors.rule, borderRadius: radius.sm },
  caution: { color: colors.caution },
  confirm: { borderColor: colors.danger, borderLeftWidth: 4 },
  refusal: { gap: space.xs, padding: space.md, borderRadius: radius.md, backgroundColor: colors.dangerSoft },
  danger: { backgroundColor: colors.danger },
});
