import { useMemo, useState } from 'react';
import { Pressable, ScrollView, StyleSheet, View } from 'react-native';
import { Link } from 'expo-router';
import { Formik, type FormikErrors } from 'formik';
import * as yup from 'yup';

import { useMeasures } from '@/api/organization-settings';
import { useRationCheckMutation, useRationChoicesQuery } from '@/api/ration-checks';
import { useActiveMembership } from '@/api/session';
import { ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { massToKg, massUnit, pricePerKgFrom } from '@/shared/measures';
import type { RationCheckInput, RationChoices } from '@/shared/schemas/ration-checks';
import { colors, radius, space, TOUCH_MIN } from '@/theme';

import { SignedInGate } from '../shared-result/signed-in-gate';
import { ShareCard } from '../shared-result/share-card';
import { RationCheckResults } from './results';

/** Nutrients asked for a typed-in ingredient, by the animal's family (catalogue ids, catalogue units). */
const TYPED: Record<'poultry' | 'swine', string[]> = { poultry: ['cp', 'lys', 'met', 'ca', 'avp', 'amen_poultry'], swine: ['cp', 'sid_lys', 'ca', 'sttd_p', 'ne_swine'] };

type Line = { ingredientId: number | null; name: string; amount: string; price: string; values: Record<string, string> };
type Values = { specificationId: number | null; lines: Line[] };

const emptyLine = (): Line => ({ ingredientId: null, name: '', amount: '', price: '', values: {} });
const decimal = (s: string) => Number(s.replace(',', '.'));
const isNum = (s: string) => s.trim() !== '' && Number.isFinite(decimal(s));

const schema = yup.object({
  specificationId: yup.number().nullable().required('choose the animal and phase'),
  lines: yup
    .array(
      yup.object({
        name: yup.string().trim().required('name the ingredient or pick one from the list'),
        amount: yup.string().required('enter how much you mix').test('num', 'enter a number, 0 or more', (v) => !!v && isNum(v) && decimal(v) >= 0),
        price: yup.string().test('num', 'enter a number, 0 or more', (v) => !v || (isNum(v) && decimal(v) >= 0)),
      }),
    )
    .min(1, 'add at least one ingredient'),
});

/** "Check my ration": phone first, large targets, every number with its unit. */
export function RationCheckScreen() {
  return (
    <SignedInGate path="/ration-check">
      <RationCheckBody />
    </SignedInGate>
  );
}

function RationCheckBody() {
  const choices = useRationChoicesQuery();
  const measures = useMeasures();
  const check = useRationCheckMutation();
  const { can } = useActiveMembership();
  const unit = massUnit(measures.unitSystem);
  const [lastInput, setLastInput] = useState<RationCheckInput | null>(null);

  return (
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content} testID="screen-ration-check" keyboardShouldPersistTaps="handled">
      <View style={styles.column}>
        <Link href="/" style={styles.back}>← Troughline</Link>
        <AppText variant="display" accessibilityRole="header" style={styles.title}>Check my ration</AppText>
        <AppText variant="lead" muted>Enter what you actually mix. You will see what is short, what is too high, what it costs per {unit} and the cheapest fix from what you have.</AppText>
        {choices.isError ? <ErrorState error={choices.error} onRetry={() => choices.refetch()} /> : null}
        {choices.isPending ? <AppText muted>Loading…</AppText> : null}
        {choices.data ? (
          <Formik<Values>
            initialValues={{ specificationId: null, lines: [emptyLine(), emptyLine()] }}
            validationSchema={schema}
            onSubmit={async (v) => {
              const input: RationCheckInput = {
                specificationId: v.specificationId!,
                lines: v.lines.map((l) => {
                  const values = Object.fromEntries(Object.entries(l.values).filter(([, s]) => isNum(s)).map(([k, s]) => [k, decimal(s)]));
                  return {
                    ...(l.ingredientId ? { ingredientId: l.ingredientId } : { name: l.name.trim() }),
                    kg: massToKg(decimal(l.amount), measures.unitSystem),
                    ...(isNum(l.price) ? { pricePerKg: pricePerKgFrom(decimal(l.price), measures.unitSystem) } : {}),
                    ...(Object.keys(values).length ? { values } : {}),
                  };
                }),
              };
              setLastInput(input);
              await check.mutateAsync(input).catch(() => undefined);
            }}
          >
            {(f) => <RationForm f={f} choices={choices.data} unit={unit} currency={measures.currency} pending={check.isPending} serverError={check.error?.message ?? null} />}
          </Formik>
        ) : null}
        {check.data ? <RationCheckResults check={check.data} /> : null}
        {check.data && lastInput && can('results:share') ? <ShareCard what={{ kind: 'ration_check', check: lastInput }} /> : null}
      </View>
    </ScrollView>
  );
}

type FormBag = import('formik').FormikProps<Values>;

function RationForm({ f, choices, unit, currency, pending, serverError }: { f: FormBag; choices: RationChoices; unit: string; currency: string; pending: boolean; serverError: string | null }) {
  const speciesNames = useMemo(() => [...new Set(choices.specifications.map((s) => s.species))], [choices]);
  const [species, setSpecies] = useState<string>(speciesNames[0] ?? '');
  const spec = choices.specifications.find((s) => s.id === f.values.specificationId);
  const family: 'poultry' | 'swine' = /pig|sow|swine/i.test(spec?.species ?? species) ? 'swine' : 'poultry';
  const nutrientInfo = new Map(choices.nutrients.map((n) => [n.id, n]));
  const lineError = (k: number, field: keyof Line) => {
    const e = (f.errors.lines as FormikErrors<Line>[] | undefined)?.[k]?.[field];
    return f.submitCount > 0 && typeof e === 'string' ? e : undefined;
  };
  const setLine = (k: number, patch: Partial<Line>) => f.setFieldValue('lines', f.values.lines.map((l, i) => (i === k ? { ...l, ...patch } : l)));

  return (
    <View style={styles.form}>
      <Card title="1. Animal and phase">
        <ChoiceChips label="Animal" options={speciesNames.map((s) => ({ value: s, label: s }))} value={species} onChange={setSpecies} testID="ration-species" />
        <View style={styles.specList}>
          {choices.specifications.filter((s) => s.species === species).map((s) => {
            const selected = s.id === f.values.specificationId;
            return (
              <Pressable key={s.id} role="radio" aria-checked={selected} onPress={() => f.setFieldValue('specificationId', s.id)} style={[styles.spec, selected && styles.specSelected]} testID={`ration-spec-${s.id}`}>
                <AppText style={styles.specName}>{s.name}</AppText>
                <AppText variant="caption" muted numberOfLines={2}>{s.source}</AppText>
              </Pressable>
            );
          })}
        </View>
        {f.submitCount > 0 && f.errors.specificationId ? <AppText variant="small" style={styles.error}>{f.errors.specificationId}</AppText> : null}
      </Card>

      <Card title="2. What you mix">
        {f.values.lines.map((line, k) => {
          const matches = !line.ingredientId && line.name.trim().length >= 2
            ? choices.ingredients.filter((i) => i.name.toLowerCase().includes(line.name.trim().toLowerCase())).slice(0, 4)
            : [];
          return (
            <View key={k} style={styles.line} testID={`ration-line-${k}`}>
              <TextField label={`Ingredient ${k + 1}`} hint={line.ingredientId ? 'from the library' : 'type a name'} value={line.name} onChangeText={(name) => setLine(k, { name, ingredientId: null })} error={lineError(k, 'name')} testID={`ration-name-${k}`} />
              {matches.map((m) => (
                <Pressable key={m.id} onPress={() => setLine(k, { ingredientId: m.id, name: m.name, price: line.price })} style={styles.suggestion} testID={`ration-suggest-${k}-${m.id}`}>
                  <AppText>{m.name}</AppText>
                  <AppText variant="caption" muted>{m.library === 'own' ? 'your library' : 'reference library'}</AppText>
                </Pressable>
              ))}
              <View style={styles.pair}>
                <View style={styles.half}>
                  <TextField label="Amount" hint={unit} keyboardType="decimal-pad" inputMode="decimal" value={line.amount} onChangeText={(amount) => setLine(k, { amount })} error={lineError(k, 'amount')} testID={`ration-amount-${k}`} />
                </View>
                <View style={styles.half}>
                  <TextField label="Price" hint={`${currency} per ${unit}`} keyboardType="decimal-pad" inputMode="decimal" placeholder={line.ingredientId ? 'library price' : ''} value={line.price} onChangeText={(price) => setLine(k, { price })} error={lineError(k, 'price')} testID={`ration-price-${k}`} />
                </View>
              </View>
              {!line.ingredientId ? (
                <View style={styles.values}>
                  <AppText variant="caption" muted>Values you know, per kg as fed (leave the others empty)</AppText>
                  <View style={styles.pair}>
                    {TYPED[family].filter((id) => nutrientInfo.has(id)).map((id) => (
                      <View key={id} style={styles.half}>
                        <TextField label={nutrientInfo.get(id)!.name} hint={nutrientInfo.get(id)!.unit} keyboardType="decimal-pad" inputMode="decimal" value={line.values[id] ?? ''} onChangeText={(v) => setLine(k, { values: { ...line.values, [id]: v } })} testID={`ration-value-${k}-${id}`} />
                      </View>
                    ))}
                  </View>
                </View>
              ) : null}
              {f.values.lines.length > 1 ? <Button label="Remove this ingredient" tone="quiet" onPress={() => f.setFieldValue('lines', f.values.lines.filter((_, i) => i !== k))} testID={`ration-remove-${k}`} /> : null}
            </View>
          );
        })}
        <Button label="Add an ingredient" tone="quiet" onPress={() => f.setFieldValue('lines', [...f.values.lines, emptyLine()])} testID="ration-add-line" />
      </Card>
      <FormMessage tone="danger" text={serverError} testID="ration-error" />
      <Button label={pending ? 'Checking…' : 'Check my ration'} disabled={pending} onPress={() => f.handleSubmit()} testID="ration-submit" />
    </View>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.paper },
  content: { padding: space.md, paddingBottom: space.xxl },
  column: { width: '100%', maxWidth: 720, alignSelf: 'center', gap: space.lg },
  title: { color: colors.brand },
  back: { color: colors.brand, paddingVertical: space.sm, minHeight: TOUCH_MIN },
  form: { gap: space.lg },
  specList: { gap: space.sm },
  spec: { minHeight: TOUCH_MIN + 8, padding: space.md, borderRadius: radius.md, borderWidth: 1, borderColor: colors.rule, backgroundColor: colors.paperRaised, gap: 2, justifyContent: 'center' },
  specSelected: { borderColor: colors.brand, borderWidth: 2, backgroundColor: colors.brandSoft },
  specName: { fontWeight: '600' },
  line: { gap: space.sm, paddingVertical: space.md, borderBottomWidth: 1, borderBottomColor: colors.rule },
  suggestion: { minHeight: TOUCH_MIN, padding: space.sm, borderRadius: radius.md, backgroundColor: colors.paperSunken, justifyContent: 'center' },
  pair: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  half: { flexGrow: 1, flexBasis: 140, minWidth: 0 },
  values: { gap: space.xs },
  error: { color: colors.danger },
});
