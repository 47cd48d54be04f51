import { useRef, useState, type RefObject } from 'react';
import { StyleSheet, useWindowDimensions, View } from 'react-native';
import { useRouter } from 'expo-router';
import { Formik, type FormikHelpers, type FormikProps } from 'formik';
import * as yup from 'yup';

import { usePhaseCreateMutation, useSpeciesCreateMutation, useSpeciesQuery, useSpecificationCreateMutation } from '@/api/requirements';
import { useActiveMembership } from '@/api/session';
import { ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { TextField } from '@/components/ui/text-field';
import { AppText } from '@/components/ui/text';
import { applyServerErrors } from '@/lib/form-errors';
import { SPECIES_FAMILY_LABELS, type SpeciesFamily } from '@/shared/library-terms';
import type { CreatePhaseInput, Phase, Species } from '@/shared/schemas/specifications';
import { colors, radius, space, WIDE_MIN_WIDTH } from '@/theme';

import { StartFromExisting } from './copy-forms';

/** Species and their production phases; owners and nutritionists add their own here. */
export function SpeciesScreen() {
  const router = useRouter();
  const { width } = useWindowDimensions();
  const wide = width >= WIDE_MIN_WIDTH;
  const { can } = useActiveMembership();
  const writable = can('requirements:write');
  const species = useSpeciesQuery();
  const phaseForm = useRef<FormikProps<PhaseValues>>(null);
  const [added, setAdded] = useState<{ species: Species; phase: Phase } | null>(null);

  const body = species.isError ? (
    <ErrorState error={species.error} onRetry={() => species.refetch()} />
  ) : !species.data ? (
    <AppText muted>Loading…</AppText>
  ) : (
    <View style={[styles.columns, wide && styles.columnsWide]}>
      {writable ? (
        <View style={[styles.column, wide && styles.formColumn]}>
          <SpeciesForm
            list={species.data.items}
            onAdded={(s) => {
              setAdded(null);
              phaseForm.current?.setValues({ ...EMPTY_PHASE, ...bandFor(s.family), speciesId: String(s.id) });
            }}
          />
          <PhaseForm list={species.data.items} formRef={phaseForm} onAdded={(s, p) => setAdded({ species: s, phase: p })} />
          {added ? (
            <View style={styles.starts} key={added.phase.id}>
              <StartSpecification species={added.species} phase={added.phase} />
              <StartFromExisting species={added.species} phase={added.phase} />
            </View>
          ) : null}
        </View>
      ) : null}
      <View style={[styles.column, wide && styles.listColumn]}>
        <SpeciesList items={species.data.items} />
      </View>
    </View>
  );

  return (
    <Screen title="Species and phases" lead="What specifications are written for. The reference list is shared and read-only; species and phases you add belong to your organization." testID="screen-species">
      <Button label="Back to specifications" tone="quiet" onPress={() => (router.canGoBack() ? router.back() : router.replace('/requirements'))} testID="species-back" />
      {body}
    </Screen>
  );
}

type SpeciesValues = { name: string; family: SpeciesFamily | '' };

const FAMILY_OPTIONS = (['poultry', 'swine'] as const).map((f) => ({ value: f, label: SPECIES_FAMILY_LABELS[f] }));
const FAMILY_MESSAGE = 'Choose poultry or pigs: it decides which nutrients (AMEn or NE, digestible or SID amino acids) its specifications use.';
const sameName = (a: string, b: string) => a.trim().toLowerCase() === b.trim().toLowerCase();

function SpeciesForm({ list, onAdded }: { list: Species[]; onAdded: (s: Species) => void }) {
  const create = useSpeciesCreateMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const schema = yup.object({
    name: yup
      .string()
      .trim()
      .required('Name the species, e.g. Japanese quail.')
      .max(120, 'At most 120 characters.')
      .test('unique', 'A species with this name is already in the list: choose another name, or add a phase to it below.', (name) => !list.some((s) => sameName(s.name, name ?? ''))),
    family: yup
      .string()
      .required(FAMILY_MESSAGE)
      .oneOf(['poultry', 'swine'], FAMILY_MESSAGE),
  });

  const submit = async (form: SpeciesValues, helpers: FormikHelpers<SpeciesValues>) => {
    setFormError(null);
    setDone(null);
    try {
      const created = await create.mutateAsync({ name: form.name.trim(), family: form.family as SpeciesFamily });
      helpers.resetForm();
      setDone(`${created.name} added. Give it its first phase below.`);
      onAdded(created);
    } catch (error) {
      setFormError(applyServerErrors(error, helpers));
    }
  };

  return (
    <Formik<SpeciesValues> initialValues={{ name: '', family: '' }} validationSchema={schema} onSubmit={submit} validateOnChange={false} validateOnBlur={false}>
      {(f) => (
        <Card title="Add a species" testID="species-form">
          <FormMessage tone="danger" text={formError} testID="species-form-error" />
          <FormMessage tone="ok" text={done} testID="species-added" />
          <TextField label="Name" value={f.values.name} onChangeText={f.handleChange('name')} error={f.submitCount > 0 ? f.errors.name : undefined} placeholder="e.g. Japanese quail" maxLength={120} testID="species-name" />
          <ChoiceChips label="Family" options={FAMILY_OPTIONS} value={f.values.family as SpeciesFamily} onChange={(v) => f.setFieldValue('family', v)} testID="species-family" />
          {f.submitCount > 0 && f.errors.family ? <AppText variant="small" style={styles.error} testID="species-family-error">{f.errors.family}</AppText> : null}
          <Button label={f.isSubmitting ? 'Adding…' : 'Add species'} disabled={f.isSubmitting} onPress={() => f.handleSubmit()} testID="species-submit" />
        </Card>
      )}
    </Formik>
  );
}

type Band = 'age' | 'weight' | 'none';
type AgeUnit = 'weeks' | 'days';
type PhaseValues = { speciesId: string; name: string; span: string; band: Band; ageUnit: AgeUnit; from: string; to: string };

const EMPTY_PHASE: PhaseValues = { speciesId: '', name: '', span: '', band: 'age', ageUnit: 'weeks', from: '', to: '' };
/** Poultry phases are usually told by age in weeks, pig phases by body weight. */
const bandFor = (family: SpeciesFamily): Pick<PhaseValues, 'band' | 'ageUnit'> => (family === 'swine' ? { band: 'weight', ageUnit: 'days' } : { band: 'age', ageUnit: 'weeks' });

const BAND_OPTIONS = [
  { value: 'age' as const, label: 'Age' },
  { value: 'weight' as const, label: 'Body weight' },
  { value: 'none' as const, label: 'Neither (a state, e.g. lactation)' },
];
const AGE_UNIT_OPTIONS = [
  { value: 'weeks' as const, label: 'Weeks' },
  { value: 'days' as const, label: 'Days' },
];

const decimal = (text: string) => Number(text.trim().replace(',', '.'));
const blank = (text: string | undefined) => !text || text.trim() === '';
const bandMax = (band: Band, unit: AgeUnit) => (band === 'weight' ? 1000 : unit === 'weeks' ? 700 : 5000);
const bandUnit = (band: Band, unit: AgeUnit) => (band === 'weight' ? 'kg' : unit);

/** The span in words when the person leaves it empty, e.g. "0–6 weeks", "18 weeks on", "8–20 kg body weight". */
function spanFromBand(v: Pick<PhaseValues, 'band' | 'ageUnit' | 'from' | 'to'>): string {
  if (v.band === 'none' || blank(v.from)) return '';
  const unit = bandUnit(v.band, v.ageUnit);
  const from = String(decimal(v.from));
  const text = blank(v.to) ? `from ${from} ${unit}` : `${from}–${decimal(v.to)} ${unit}`;
  return v.band === 'weight' ? `${text} body weight` : text;
}

/** A number for a band end: `required` for the start of an age or weight band. */
function bandEnd(required: boolean) {
  return yup.string().test('band', function check(text) {
    const { band, ageUnit } = this.parent as PhaseValues;
    if (band === 'none') return true;
    if (blank(text)) return required ? this.createError({ message: band === 'age' ? 'Enter the age the phase starts at, e.g. 0.' : 'Enter the body weight the phase starts at, e.g. 25.' }) : true;
    const v = decimal(text!);
    const max = bandMax(band, ageUnit);
    if (!Number.isFinite(v)) return this.createError({ message: 'Enter a number, e.g. 6 or 6.5.' });
    if (v < 0) return this.createError({ message: 'Cannot be negative.' });
    if (v > max) return this.createError({ message: `At most ${max} ${bandUnit(band, ageUnit)}.` });
    return true;
  });
}

function PhaseForm({ list, formRef, onAdded }: { list: Species[]; formRef: RefObject<FormikProps<PhaseValues> | null>; onAdded: (s: Species, p: Phase) => void }) {
  const create = usePhaseCreateMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const schema = yup.object({
    speciesId: yup.string().required('Choose the species the phase belongs to.'),
    name: yup
      .string()
      .trim()
      .required('Name the phase, e.g. Starter.')
      .max(120, 'At most 120 characters.')
      .test('unique', 'This species already has a phase with this name: choose another name.', (name, context) => {
        const owner = list.find((s) => String(s.id) === (context.parent as PhaseValues).speciesId);
        return !owner?.phases.some((p) => sameName(p.name, name ?? ''));
      }),
    span: yup.string().max(120, 'At most 120 characters.'),
    from: bandEnd(true),
    to: bandEnd(false).test('order', 'The phase must end after it starts.', (text, context) => {
      const { band, from } = context.parent as PhaseValues;
      return band === 'none' || blank(text) || blank(from) || !(decimal(text!) <= decimal(from));
    }),
  });

  const submit = async (form: PhaseValues, helpers: FormikHelpers<PhaseValues>) => {
    setFormError(null);
    setDone(null);
    const from = blank(form.from) ? null : decimal(form.from);
    const to = blank(form.to) ? null : decimal(form.to);
    const days = (v: number | null) => (v === null ? null : Math.round(form.ageUnit === 'weeks' ? v * 7 : v));
    const input: CreatePhaseInput = {
      name: form.name.trim(),
      span: form.span.trim() || spanFromBand(form) || null,
      ageFromDays: form.band === 'age' ? days(from) : null,
      ageToDays: form.band === 'age' ? days(to) : null,
      bodyWeightFromKg: form.band === 'weight' ? from : null,
      bodyWeightToKg: form.band === 'weight' ? to : null,
    };
    try {
      const updated = await create.mutateAsync({ ...input, speciesId: Number(form.speciesId) });
      const phase = updated.phases.find((p) => p.library === 'own' && sameName(p.name, input.name));
      helpers.resetForm({ values: { ...EMPTY_PHASE, ...bandFor(updated.family), speciesId: form.speciesId } });
      setDone(`Phase “${input.name}” added to ${updated.name}.`);
      if (phase) onAdded(updated, phase);
    } catch (error) {
      setFormError(applyServerErrors(error, helpers));
    }
  };

  return (
    <Formik<PhaseValues> innerRef={formRef} initialValues={EMPTY_PHASE} validationSchema={schema} onSubmit={submit} validateOnChange={false} validateOnBlur={false}>
      {(f) => {
        const err = (field: keyof PhaseValues) => (f.submitCount > 0 ? f.errors[field] : undefined);
        const unit = bandUnit(f.values.band, f.values.ageUnit);
        const chosen = list.find((s) => String(s.id) === f.values.speciesId);
        return (
          <Card title="Add a phase" testID="phase-form">
            <FormMessage tone="danger" text={formError} testID="phase-form-error" />
            <FormMessage tone="ok" text={done} testID="phase-added" />
            <ChoiceChips
              label="Species"
              options={list.map((s) => ({ value: String(s.id), label: s.library === 'own' ? `${s.name} (ours)` : s.name }))}
              value={f.values.speciesId}
              onChange={(id) => {
                const next = list.find((s) => String(s.id) === id);
                // A fresh form follows the species' usual band; typed numbers are kept.
                f.setValues({ ...f.values, speciesId: id, ...(next && blank(f.values.from) && blank(f.values.to) ? bandFor(next.family) : {}) });
              }}
              testID="phase-species"
            />
            {err('speciesId') ? <AppText variant="small" style={styles.error} testID="phase-species-error">{err('speciesId')}</AppText> : null}
            {chosen?.phases.length ? (
              <AppText variant="small" muted>Phases it has: {chosen.phases.map((p) => p.name).join(', ')}.</AppText>
            ) : null}
            <TextField label="Phase name" value={f.values.name} onChangeText={f.handleChange('name')} error={err('name')} placeholder="e.g. Starter" maxLength={120} testID="phase-name" />
            <ChoiceChips label="The phase is told by" options={BAND_OPTIONS} value={f.values.band} onChange={(v) => f.setFieldValue('band', v)} testID="phase-band" />
            {f.values.band === 'age' ? <ChoiceChips label="Age in" options={AGE_UNIT_OPTIONS} value={f.values.ageUnit} onChange={(v) => f.setFieldValue('ageUnit', v)} testID="phase-age-unit" /> : null}
            {f.values.band !== 'none' ? (
              <View style={styles.pair}>
                <View style={styles.pairField}>
                  <TextField label="From" hint={unit} value={f.values.from} onChangeText={f.handleChange('from')} error={err('from')} inputMode="decimal" testID="phase-from" />
                </View>
                <View style={styles.pairField}>
                  <TextField label="To" hint={unit} value={f.values.to} onChangeText={f.handleChange('to')} error={err('to')} inputMode="decimal" testID="phase-to" />
                </View>
              </View>
            ) : null}
            {f.values.band !== 'none' ? <AppText variant="small" muted>Leave “To” empty when the phase ends at an event, such as the first egg.</AppText> : null}
            <TextField
              label="Span in words"
              hint="optional"
              value={f.values.span}
              onChangeText={f.handleChange('span')}
              error={err('span')}
              placeholder={spanFromBand(f.values) || 'e.g. 21-day lactation'}
              maxLength={120}
              testID="phase-span"
            />
            <Button label={f.isSubmitting ? 'Adding…' : 'Add phase'} disabled={f.isSubmitting} onPress={() => f.handleSubmit()} testID="phase-submit" />
          </Card>
        );
      }}
    </Formik>
  );
}

type SpecValues = { name: string; source: string };

/** After a phase is added: a specification of our own for it, starting with no bounds. */
function StartSpecification({ species, phase }: { species: Species; phase: Phase }) {
  const router = useRouter();
  const create = useSpecificationCreateMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const schema = yup.object({
    name: yup.string().trim().required('Give the specification a name.').max(160, 'At most 160 characters.'),
    source: yup.string().trim().required('Say where its numbers will come from, e.g. “Our nutritionist, from trial results”.').max(300, 'At most 300 characters.'),
  });
  const submit = async (form: SpecValues, helpers: FormikHelpers<SpecValues>) => {
    setFormError(null);
    try {
      const created = await create.mutateAsync({ speciesId: species.id, phaseId: phase.id, name: form.name.trim(), source: form.source.trim(), bounds: [] });
      router.push(`/requirements/${created.id}`);
    } catch (error) {
      setFormError(applyServerErrors(error, helpers));
    }
  };
  return (
    <Formik<SpecValues> initialValues={{ name: `${species.name}, ${phase.name.toLowerCase()}`.slice(0, 160), source: '' }} validationSchema={schema} onSubmit={submit} validateOnChange={false} validateOnBlur={false}>
      {(f) => (
        <Card title={`A specification for ${phase.name}`} testID="spec-start">
          <AppText variant="small" muted>
            It starts with no bounds. On the next page choose “Adjust bounds” and add the nutrients to bound ({species.family === 'swine' ? 'NE, SID amino acids, STTD phosphorus…' : 'AMEn, amino acids, calcium, available phosphorus…'}).
          </AppText>
          <FormMessage tone="danger" text={formError} testID="spec-start-error" />
          <TextField label="Name" value={f.values.name} onChangeText={f.handleChange('name')} error={f.submitCount > 0 ? f.errors.name : undefined} maxLength={160} testID="spec-start-name" />
          <TextField label="Where the numbers come from" value={f.values.source} onChangeText={f.handleChange('source')} error={f.submitCount > 0 ? f.errors.source : undefined} placeholder="e.g. Our nutritionist, from trial results" maxLength={300} testID="spec-start-source" />
          <Button label={f.isSubmitting ? 'Creating…' : 'Create and set bounds'} disabled={f.isSubmitting} onPress={() => f.handleSubmit()} testID="spec-start-submit" />
        </Card>
      )}
    </Formik>
  );
}

/** How a phase is told apart, in words with units. */
function bandText(p: Phase): string | null {
  const range = (from: number | null, to: number | null, unit: string) => (from !== null && to !== null ? `${from}–${to} ${unit}` : from !== null ? `from ${from} ${unit}` : `up to ${to} ${unit}`);
  if (p.ageFromDays !== null || p.ageToDays !== null) {
    const inWeeks = [p.ageFromDays, p.ageToDays].every((d) => d === null || d % 7 === 0);
    const weeks = (d: number | null) => (d === null ? null : d / 7);
    return `age ${inWeeks ? range(weeks(p.ageFromDays), weeks(p.ageToDays), 'weeks') : range(p.ageFromDays, p.ageToDays, 'days')}`;
  }
  if (p.bodyWeightFromKg !== null || p.bodyWeightToKg !== null) return `${range(p.bodyWeightFromKg, p.bodyWeightToKg, 'kg')} body weight`;
  return null;
}

function SpeciesList({ items }: { items: Species[] }) {
  return (
    <View style={styles.list} testID="species-list">
      {items.map((s) => (
        <Card key={s.id} testID={`species-${s.id}`}>
          <View style={styles.heading}>
            <AppText variant="label">{s.name}</AppText>
            <AppText variant="caption" muted>{SPECIES_FAMILY_LABELS[s.family]} · {s.library === 'reference' ? 'reference' : 'ours'}</AppText>
          </View>
          {s.phases.length === 0 ? <AppText variant="small" muted>No phase yet.</AppText> : null}
          {s.phases.map((p) => {
            const band = bandText(p);
            return (
              <View key={p.id} style={styles.phase} testID={`phase-${p.id}`}>
                <AppText>{p.name}{p.library === 'own' ? <AppText variant="caption" style={styles.own}> · ours</AppText> : null}</AppText>
                <AppText variant="small" muted>{[p.span, band && !p.span?.includes(band.replace(/^age /, '').replace(/ body weight$/, '')) ? band : null].filter(Boolean).join(' · ') || 'No span given'}</AppText>
              </View>
            );
          })}
        </Card>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  columns: { gap: space.lg },
  starts: { gap: space.lg },
  columnsWide: { flexDirection: 'row', alignItems: 'flex-start' },
  column: { gap: space.lg },
  formColumn: { flex: 5 },
  listColumn: { flex: 4 },
  list: { gap: space.md },
  heading: { flexDirection: 'row', flexWrap: 'wrap', justifyContent: 'space-between', alignItems: 'baseline', gap: space.sm },
  phase: { gap: 2, borderTopWidth: 1, borderTopColor: colors.rule, paddingTop: space.xs, borderRadius: radius.sm },
  own: { color: colors.accent },
  pair: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  pairField: { flexBasis: 140, flexGrow: 1 },
  error: { color: colors.danger },
});
