import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { useRouter } from 'expo-router';
import { Formik, type FormikHelpers } from 'formik';
import * as yup from 'yup';

import { useNutrientsQuery } from '@/api/nutrients';
import { useSpecificationCopyMutation, useSpecificationQuery, useSpecificationUpdateMutation } from '@/api/requirements';
import { useActiveMembership } from '@/api/session';
import { CautionBanner } from '@/components/caution-banner';
import { describeError, ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { TextField } from '@/components/ui/text-field';
import { AppText } from '@/components/ui/text';
import { applyServerErrors } from '@/lib/form-errors';
import { CONFIDENCE_LABELS, INGREDIENT_CATEGORY_LABELS, INSECT_SPECIES_LABELS } from '@/shared/library-terms';
import type { Nutrient } from '@/shared/schemas/nutrients';
import type { SpecificationCap, SpecificationDetail } from '@/shared/schemas/specifications';
import { colors, space, TOUCH_MIN } from '@/theme';

import { formatValue } from '../library/format';
import { CopyIntoPhaseForm } from './copy-forms';

/** `adjust`: open with the bounds form showing (a fresh copy lands here). */
export function SpecificationScreen({ id, adjust = false }: { id: number; adjust?: boolean }) {
  const spec = useSpecificationQuery(id);
  const nutrients = useNutrientsQuery();
  const error = spec.error ?? nutrients.error;
  if (error) return <Screen title="Specification" testID="screen-specification"><ErrorState error={error} onRetry={() => { spec.refetch(); nutrients.refetch(); }} /></Screen>;
  if (!spec.data || !nutrients.data) return <Screen title="Specification" testID="screen-specification"><AppText muted>Loading…</AppText></Screen>;
  return <SpecificationBody key={spec.data.id} spec={spec.data} nutrients={new Map(nutrients.data.items.map((n) => [n.id, n]))} adjust={adjust} />;
}

function capTarget(cap: SpecificationCap): string {
  if (cap.scope === 'ingredient') return cap.ingredientName ?? `ingredient ${cap.ingredientId}`;
  if (cap.scope === 'category' && cap.category) return `All ${INGREDIENT_CATEGORY_LABELS[cap.category].toLowerCase()}s`;
  return cap.insectSpecies ? `${INSECT_SPECIES_LABELS[cap.insectSpecies].split(' (')[0]} meals` : '';
}

function SpecificationBody({ spec, nutrients, adjust }: { spec: SpecificationDetail; nutrients: Map<string, Nutrient>; adjust: boolean }) {
  const router = useRouter();
  const { can } = useActiveMembership();
  /** One tap: a copy in the same phase. The form below chooses another phase and a name. */
  const quickCopy = useSpecificationCopyMutation();
  const [copying, setCopying] = useState(false);
  const writable = can('requirements:write');
  const [editRequested, setEditing] = useState(adjust);
  const editing = editRequested && spec.library === 'own' && writable;
  const name = (id: string) => nutrients.get(id)?.name ?? id;

  return (
    <Screen title={spec.name} lead={`${spec.species.name}${spec.phase ? ` · ${spec.phase.span ?? spec.phase.name}` : ''} · ${spec.library === 'reference' ? 'reference (read-only)' : 'ours'}`} testID="screen-specification">
      <View style={styles.actions}>
        <Button label="Back" tone="quiet" onPress={() => (router.canGoBack() ? router.back() : router.replace('/requirements'))} testID="back" />
        {spec.library === 'reference' && writable && !copying ? (
          <Button label={quickCopy.isPending ? 'Copying…' : 'Copy and adjust'} disabled={quickCopy.isPending} testID="spec-copy"
            onPress={() => quickCopy.mutate({ id: spec.id }, { onSuccess: (created) => router.replace(`/requirements/${created.id}`) })} />
        ) : null}
        {writable && !copying && !editing ? <Button label="Copy into another phase…" tone="quiet" onPress={() => setCopying(true)} testID="spec-copy-to" /> : null}
        {spec.library === 'own' && writable && !editing && !copying ? <Button label="Adjust bounds" onPress={() => setEditing(true)} testID="spec-edit" /> : null}
      </View>
      {quickCopy.isError ? <FormMessage tone="danger" text={describeError(quickCopy.error)} testID="spec-copy-error" /> : null}
      {copying ? <CopyIntoPhaseForm spec={spec} onCancel={() => setCopying(false)} /> : null}
      <AppText variant="small" muted testID="spec-source">Source: {spec.source}</AppText>
      {spec.notes ? <AppText>{spec.notes}</AppText> : null}
      {spec.feedIntakeGPerDay ? <AppText>Percentages assume a feed intake of {spec.feedIntakeGPerDay} g per animal per day.</AppText> : null}
      {editing ? (
        <BoundsForm spec={spec} name={name} nutrients={nutrients} onDone={() => setEditing(false)} />
      ) : (
        <Card title="Nutrient bounds, per kg as fed" testID="spec-bounds">
          <View style={[styles.row, styles.head]}>
            <AppText variant="label" style={styles.nameCell}>Nutrient</AppText>
            <AppText variant="label" style={styles.num}>Min</AppText>
            <AppText variant="label" style={styles.num}>Max</AppText>
          </View>
          {spec.bounds.map((b) => {
            const n = nutrients.get(b.nutrientId);
            return (
              <View key={b.nutrientId} style={styles.row} testID={`bound-${b.nutrientId}`}>
                <View style={styles.nameCell}>
                  <AppText>{name(b.nutrientId)} <AppText variant="caption" muted>{n?.unit}</AppText></AppText>
                  <AppText variant="caption" style={b.confidence === 'from_memory' ? styles.caution : styles.muted}>
                    {b.confidence ? CONFIDENCE_LABELS[b.confidence] : 'Set by us'}{b.note ? ` · ${b.note}` : ''}
                  </AppText>
                </View>
                <AppText style={styles.num}>{n ? formatValue(b.min, n.unit) : '—'}</AppText>
                <AppText style={styles.num}>{n ? formatValue(b.max, n.unit) : '—'}</AppText>
              </View>
            );
          })}
        </Card>
      )}
      {spec.ratios.length ? (
        <Card title="Ratios" testID="spec-ratios">
          {spec.ratios.map((r, i) => (
            <View key={i} style={styles.row}>
              <View style={styles.nameCell}>
                <AppText>{name(r.numeratorId)} : {name(r.denominatorId)}</AppText>
                {r.note ? <AppText variant="caption" muted>{r.note}</AppText> : null}
              </View>
              <AppText style={styles.num}>{r.min ?? '—'}</AppText>
              <AppText style={styles.num}>{r.max ?? '—'}</AppText>
            </View>
          ))}
        </Card>
      ) : null}
      {spec.caps.length ? (
        <Card title="Inclusion caps" testID="spec-caps">
          <AppText variant="small" muted>Tested levels from published feeding trials, not legal limits: a formula above one is flagged, never blocked.</AppText>
          {spec.caps.map((c, i) => (
            <View key={i} style={styles.cap}>
              <AppText variant="label">{capTarget(c)}: {c.minPct != null ? `at least ${c.minPct} %` : ''}{c.minPct != null && c.maxPct != null ? ', ' : ''}{c.maxPct != null ? `tested up to ${c.maxPct} % of the feed` : ''}</AppText>
              <AppText variant="small" muted>{c.source}</AppText>
            </View>
          ))}
        </Card>
      ) : null}
      {spec.refusedIngredients.map((r) => <FormMessage key={r.id} tone="danger" text={r.message} testID={`spec-refused-${r.id}`} />)}
      <CautionBanner compact />
    </Screen>
  );
}

type BoundRow = { nutrientId: string; min: string; max: string; note: string | null };
type RatioRow = { min: string; max: string };
type CapRow = { minPct: string; maxPct: string };
type BoundsFormValues = { bounds: BoundRow[]; ratios: RatioRow[]; caps: CapRow[] };

const optionalNumber = (message = 'Enter a number of 0 or more, or leave it empty.') =>
  yup.string().test('n', message, (t) => !t || (Number.isFinite(Number(t.replace(',', '.'))) && Number(t.replace(',', '.')) >= 0));
const notBelow = (minField: string) =>
  optionalNumber().test('order', 'The maximum must not be below the minimum.', function order(t) {
    const min = this.parent[minField] as string;
    return !t || !min || Number(t.replace(',', '.')) >= Number(min.replace(',', '.'));
  });

const boundsSchema = yup.object({
  bounds: yup.array().of(yup.object({ min: optionalNumber(), max: notBelow('min') })),
  ratios: yup.array().of(yup.object({ min: optionalNumber(), max: notBelow('min') })),
  caps: yup.array().of(
    yup.object({
      minPct: optionalNumber().test('pct', 'At most 100 %.', (t) => !t || Number(t.replace(',', '.')) <= 100),
      maxPct: notBelow('minPct').test('pct', 'At most 100 %.', (t) => !t || Number(t.replace(',', '.')) <= 100),
    }),
  ),
});

function BoundsForm({ spec, name, nutrients, onDone }: { spec: SpecificationDetail; name: (id: string) => string; nutrients: Map<string, Nutrient>; onDone: () => void }) {
  const update = useSpecificationUpdateMutation(spec.id);
  const [formError, setFormError] = useState<string | null>(null);
  const text = (v: number | null) => (v === null ? '' : String(v));
  const start: BoundsFormValues = {
    bounds: spec.bounds.map((b): BoundRow => ({ nutrientId: b.nutrientId, min: text(b.min), max: text(b.max), note: b.note })),
    ratios: spec.ratios.map((r): RatioRow => ({ min: text(r.min), max: text(r.max) })),
    caps: spec.caps.map((c): CapRow => ({ minPct: text(c.minPct), maxPct: text(c.maxPct) })),
  };
  const toNumber = (t: string) => (t.trim() ? Number(t.replace(',', '.')) : null);
  const [adding, setAdding] = useState('');

  const submit = async (form: BoundsFormValues, helpers: FormikHelpers<BoundsFormValues>) => {
    setFormError(null);
    try {
      await update.mutateAsync({
        speciesId: spec.species.id,
        phaseId: spec.phase?.id ?? null,
        name: spec.name,
        source: spec.source,
        notes: spec.notes,
        feedIntakeGPerDay: spec.feedIntakeGPerDay,
        bounds: form.bounds.filter((b) => b.min.trim() || b.max.trim()).map((b) => ({ nutrientId: b.nutrientId, min: toNumber(b.min), max: toNumber(b.max), note: b.note })),
        // A ratio or cap emptied on both sides is dropped, like a nutrient bound.
        ratios: spec.ratios
          .map((r, i) => ({ numeratorId: r.numeratorId, denominatorId: r.denominatorId, min: toNumber(form.ratios[i].min), max: toNumber(form.ratios[i].max), note: r.note }))
          .filter((r) => r.min !== null || r.max !== null),
        caps: spec.caps
          .map((c, i) => ({ scope: c.scope, ingredientId: c.ingredientId, category: c.category, insectSpecies: c.insectSpecies, minPct: toNumber(form.caps[i].minPct), maxPct: toNumber(form.caps[i].maxPct), soft: c.soft, source: c.source, note: c.note }))
          .filter((c) => c.minPct !== null || c.maxPct !== null),
        expectedVersion: spec.version,
      });
      onDone();
    } catch (error) {
      setFormError(applyServerErrors(error, helpers));
    }
  };

  return (
    <Formik initialValues={start} validationSchema={boundsSchema} onSubmit={submit} validateOnChange={false}>
      {(f) => (
        <Card title="Adjust bounds, per kg as fed" testID="spec-bounds-form">
          <FormMessage tone="danger" text={formError} testID="spec-form-error" />
          <AppText variant="small" muted>Empty both fields to drop a bound. Changed bounds are marked as set by us.</AppText>
          {f.values.bounds.map((b, i) => {
            const unit = nutrients.get(b.nutrientId)?.unit ?? '';
            const errors = (f.errors.bounds as { min?: string; max?: string }[] | undefined)?.[i];
            return (
              <View key={b.nutrientId} style={styles.formRow}>
                <AppText style={styles.formName}>{name(b.nutrientId)}</AppText>
                <View style={styles.formField}><TextField label="Min" hint={unit} value={b.min} onChangeText={f.handleChange(`bounds[${i}].min`)} error={f.submitCount > 0 ? errors?.min : undefined} inputMode="decimal" testID={`bound-min-${b.nutrientId}`} /></View>
                <View style={styles.formField}><TextField label="Max" hint={unit} value={b.max} onChangeText={f.handleChange(`bounds[${i}].max`)} error={f.submitCount > 0 ? errors?.max : undefined} inputMode="decimal" testID={`bound-max-${b.nutrientId}`} /></View>
              </View>
            );
          })}
          <AddBound
            search={adding}
            onSearch={setAdding}
            candidates={[...nutrients.values()].filter((n) => n.families.includes(spec.species.family) && !f.values.bounds.some((b) => b.nutrientId === n.id))}
            onAdd={(n) => {
              f.setFieldValue('bounds', [...f.values.bounds, { nutrientId: n.id, min: '', max: '', note: null }]);
              setAdding('');
            }}
          />
          {spec.ratios.length ? <AppText variant="label">Ratios</AppText> : null}
          {f.values.ratios.map((r, i) => {
            const errors = (f.errors.ratios as { min?: string; max?: string }[] | undefined)?.[i];
            return (
              <View key={`ratio-${i}`} style={styles.formRow}>
                <AppText style={styles.formName}>{name(spec.ratios[i].numeratorId)} : {name(spec.ratios[i].denominatorId)}</AppText>
                <View style={styles.formField}><TextField label="Min" hint="ratio" value={r.min} onChangeText={f.handleChange(`ratios[${i}].min`)} error={f.submitCount > 0 ? errors?.min : undefined} inputMode="decimal" testID={`ratio-min-${i}`} /></View>
                <View style={styles.formField}><TextField label="Max" hint="ratio" value={r.max} onChangeText={f.handleChange(`ratios[${i}].max`)} error={f.submitCount > 0 ? errors?.max : undefined} inputMode="decimal" testID={`ratio-max-${i}`} /></View>
              </View>
            );
          })}
          {spec.caps.length ? <AppText variant="label">Inclusion caps (tested levels, not legal limits)</AppText> : null}
          {f.values.caps.map((c, i) => {
            const errors = (f.errors.caps as { minPct?: string; maxPct?: string }[] | undefined)?.[i];
            return (
              <View key={`cap-${i}`} style={styles.formRow}>
                <AppText style={styles.formName}>{capTarget(spec.caps[i])}</AppText>
                <View style={styles.formField}><TextField label="At least" hint="% of feed" value={c.minPct} onChangeText={f.handleChange(`caps[${i}].minPct`)} error={f.submitCount > 0 ? errors?.minPct : undefined} inputMode="decimal" testID={`cap-min-${i}`} /></View>
                <View style={styles.formField}><TextField label="At most" hint="% of feed" value={c.maxPct} onChangeText={f.handleChange(`caps[${i}].maxPct`)} error={f.submitCount > 0 ? errors?.maxPct : undefined} inputMode="decimal" testID={`cap-max-${i}`} /></View>
              </View>
            );
          })}
          <View style={styles.actions}>
            <Button label={f.isSubmitting ? 'Saving…' : 'Save bounds'} disabled={f.isSubmitting} onPress={() => f.handleSubmit()} testID="spec-save" />
            <Button label="Cancel" tone="quiet" onPress={onDone} testID="spec-cancel" />
          </View>
        </Card>
      )}
    </Formik>
  );
}

/** Adds a bound on a nutrient the specification does not bound yet (only nutrients used for this species). */
function AddBound({ search, onSearch, candidates, onAdd }: { search: string; onSearch: (s: string) => void; candidates: Nutrient[]; onAdd: (n: Nutrient) => void }) {
  const term = search.trim().toLowerCase();
  const matches = term ? candidates.filter((n) => n.name.toLowerCase().includes(term) || n.id.includes(term)).slice(0, 8) : [];
  return (
    <View style={styles.add} testID="spec-add-bound">
      <TextField label="Bound another nutrient" hint="search by name" value={search} onChangeText={onSearch} placeholder="e.g. linoleic, sodium" testID="spec-add-search" />
      {term && matches.length === 0 ? <AppText variant="small" muted>No nutrient of this species matches “{search.trim()}”, or it is already bounded.</AppText> : null}
      <View style={styles.actions}>
        {matches.map((n) => (
          <Button key={n.id} label={`${n.name} (${n.unit})`} tone="quiet" onPress={() => onAdd(n)} testID={`spec-add-${n.id}`} />
        ))}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  add: { gap: space.sm, borderTopWidth: 1, borderTopColor: colors.rule, paddingTop: space.sm },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.md, minHeight: TOUCH_MIN - 8, borderTopWidth: 1, borderTopColor: colors.rule, paddingVertical: space.xs },
  head: { borderTopWidth: 0 },
  nameCell: { flex: 3 },
  num: { flex: 1, textAlign: 'right', fontVariant: ['tabular-nums'] },
  caution: { color: colors.caution },
  muted: { color: colors.inkMuted },
  cap: { gap: 2, borderTopWidth: 1, borderTopColor: colors.rule, paddingTop: space.xs },
  formRow: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-end', gap: space.md, borderTopWidth: 1, borderTopColor: colors.rule, paddingTop: space.sm },
  formName: { flexBasis: 200, flexGrow: 2 },
  formField: { flexBasis: 120, flexGrow: 1 },
});
