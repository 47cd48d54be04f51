import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { useRouter } from 'expo-router';
import { Formik, type FormikHelpers } from 'formik';
import * as yup from 'yup';

import { useSpeciesQuery, useSpecificationCopyMutation, useSpecificationsQuery } from '@/api/requirements';
import { ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { TextField } from '@/components/ui/text-field';
import { AppText } from '@/components/ui/text';
import { applyServerErrors } from '@/lib/form-errors';
import { SPECIES_FAMILY_LABELS } from '@/shared/library-terms';
import type { Phase, Species, SpecificationDetail, SpecificationSummary } from '@/shared/schemas/specifications';
import { colors, space } from '@/theme';

/** Where a fresh copy opens: its own page, with the bounds form open. */
export const adjustHref = (id: number) => `/requirements/${id}?adjust=1`;

type Group = { key: string; label: string; options: { value: string; label: string }[] };

/** One choice across several groups (a phase among species, a specification among species), one chip row per group. */
function GroupedChoice({ label, groups, value, onChange, error, testID }: { label: string; groups: Group[]; value: string; onChange: (v: string) => void; error?: string; testID: string }) {
  return (
    <View style={styles.grouped} testID={`${testID}-groups`}>
      <AppText variant="label">{label}</AppText>
      {groups.map((g) => (
        <View key={g.key} style={styles.group} testID={`${testID}-group-${g.key}`}>
          <ChoiceChips label={g.label} options={g.options} value={value} onChange={onChange} testID={testID} />
        </View>
      ))}
      {error ? <AppText variant="small" style={styles.error} testID={`${testID}-error`}>{error}</AppText> : null}
    </View>
  );
}

const nameField = yup.string().trim().required('Give the copy a name.').max(160, 'At most 160 characters.');
const phaseText = (p: Pick<Phase, 'name' | 'span'>) => (p.span ? `${p.name} (${p.span})` : p.name);

type CopyValues = { phaseId: string; name: string };
const KEEP = 'keep';

/**
 * Copies the specification on screen into a phase of its species or of another species of the same
 * family (poultry bounds never go into a pig diet), then opens the copy ready to adjust.
 */
export function CopyIntoPhaseForm({ spec, onCancel }: { spec: SpecificationDetail; onCancel: () => void }) {
  const router = useRouter();
  const species = useSpeciesQuery();
  const copy = useSpecificationCopyMutation();
  const [formError, setFormError] = useState<string | null>(null);
  if (species.isError) return <ErrorState error={species.error} onRetry={() => species.refetch()} />;
  if (!species.data) return <AppText muted>Loading phases…</AppText>;

  const family = spec.species.family;
  const sameFamily = species.data.items.filter((s) => s.family === family && s.phases.length > 0);
  const phaseById = new Map(sameFamily.flatMap((s) => s.phases.map((p) => [String(p.id), { species: s, phase: p }] as const)));
  const groups: Group[] = sameFamily.map((s) => ({
    key: String(s.id),
    label: s.library === 'own' ? `${s.name} (ours)` : s.name,
    options: s.phases.map((p) => ({ value: String(p.id), label: p.id === spec.phase?.id ? `${phaseText(p)} · its own phase` : phaseText(p) })),
  }));
  if (!spec.phase) groups.unshift({ key: 'none', label: 'No phase', options: [{ value: KEEP, label: 'Keep it without a phase' }] });
  /** The name offered for a phase; replaced when the phase changes unless the person typed their own. */
  const suggestedName = (phaseId: string) => {
    const target = phaseById.get(phaseId);
    if (!target || target.phase.id === spec.phase?.id) return spec.name;
    return `${target.species.name}, ${target.phase.name} (from ${spec.name})`.slice(0, 160);
  };
  const start: CopyValues = { phaseId: spec.phase ? String(spec.phase.id) : KEEP, name: spec.name };
  const schema = yup.object({
    phaseId: yup.string().required('Choose the phase the copy is for.').test('known', 'Choose one of the phases listed.', (v) => v === KEEP || phaseById.has(v ?? '')),
    name: nameField,
  });

  const submit = async (form: CopyValues, helpers: FormikHelpers<CopyValues>) => {
    setFormError(null);
    try {
      const created = await copy.mutateAsync({ id: spec.id, name: form.name.trim(), ...(form.phaseId === KEEP ? {} : { phaseId: Number(form.phaseId) }) });
      router.replace(adjustHref(created.id));
    } catch (error) {
      setFormError(applyServerErrors(error, helpers));
    }
  };

  return (
    <Formik<CopyValues> initialValues={start} validationSchema={schema} onSubmit={submit} validateOnChange={false} validateOnBlur={false}>
      {(f) => {
        const target = phaseById.get(f.values.phaseId);
        const moved = target && target.phase.id !== spec.phase?.id;
        return (
          <Card title="Copy into a phase" testID="spec-copy-form">
            <AppText variant="small" muted>
              Every bound, ratio and inclusion cap is copied, with the studies it cites. Only {SPECIES_FAMILY_LABELS[family].toLowerCase()} phases are offered: {family === 'swine' ? 'pig bounds (NE, SID amino acids) do not fit a poultry diet' : 'poultry bounds (AMEn, total or digestible amino acids) do not fit a pig diet'}.
            </AppText>
            <FormMessage tone="danger" text={formError} testID="spec-copy-form-error" />
            <GroupedChoice
              label="Phase of the copy"
              groups={groups}
              value={f.values.phaseId}
              onChange={(v) => f.setValues({ phaseId: v, name: f.values.name.trim() === suggestedName(f.values.phaseId) ? suggestedName(v) : f.values.name }, f.submitCount > 0)}
              error={f.submitCount > 0 ? f.errors.phaseId : undefined}
              testID="spec-copy-phase"
            />
            {moved ? (
              <AppText variant="small" style={styles.caution} testID="spec-copy-moved">
                The bounds were set for {spec.species.name}{spec.phase ? `, ${phaseText(spec.phase)}` : ''}. The copy opens ready to adjust them for {target.species.name}, {phaseText(target.phase)}.
              </AppText>
            ) : null}
            <TextField label="Name of the copy" value={f.values.name} onChangeText={f.handleChange('name')} error={f.submitCount > 0 ? f.errors.name : undefined} maxLength={160} testID="spec-copy-name" />
            <View style={styles.actions}>
              <Button label={f.isSubmitting ? 'Copying…' : 'Copy and adjust'} disabled={f.isSubmitting} onPress={() => f.handleSubmit()} testID="spec-copy-submit" />
              <Button label="Cancel" tone="quiet" onPress={onCancel} testID="spec-copy-cancel" />
            </View>
          </Card>
        );
      }}
    </Formik>
  );
}

type StartValues = { sourceId: string; name: string };

/** After a phase is added: a copy of an existing specification of the same family, ready to adjust. */
export function StartFromExisting({ species, phase }: { species: Species; phase: Phase }) {
  const router = useRouter();
  const reference = useSpecificationsQuery({ library: 'reference' });
  const own = useSpecificationsQuery({ library: 'own' });
  const copy = useSpecificationCopyMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const error = reference.error ?? own.error;
  if (error) return <ErrorState error={error} onRetry={() => { reference.refetch(); own.refetch(); }} />;
  if (!reference.data || !own.data) return <AppText muted>Loading specifications…</AppText>;

  const sources = [...reference.data.items, ...own.data.items].filter((s) => s.species.family === species.family);
  const byId = new Map(sources.map((s) => [String(s.id), s]));
  // The species of the new phase first, then the others of its family.
  const speciesIds = [...new Set([species.id, ...sources.map((s) => s.species.id)])].filter((id) => sources.some((s) => s.species.id === id));
  const label = (s: SpecificationSummary) => `${s.name}${s.library === 'own' ? ' · ours' : ''}`;
  const groups: Group[] = speciesIds.map((id) => {
    const items = sources.filter((s) => s.species.id === id);
    return { key: String(id), label: items[0].species.name, options: items.map((s) => ({ value: String(s.id), label: label(s) })) };
  });
  const schema = yup.object({
    sourceId: yup.string().required('Choose the specification to start from.').test('known', 'Choose one of the specifications listed.', (v) => byId.has(v ?? '')),
    name: nameField,
  });
  const submit = async (form: StartValues, helpers: FormikHelpers<StartValues>) => {
    setFormError(null);
    try {
      const created = await copy.mutateAsync({ id: Number(form.sourceId), phaseId: phase.id, name: form.name.trim() });
      router.push(adjustHref(created.id));
    } catch (e) {
      setFormError(applyServerErrors(e, helpers));
    }
  };

  return (
    <Formik<StartValues> initialValues={{ sourceId: '', name: `${species.name}, ${phase.name.toLowerCase()}`.slice(0, 160) }} validationSchema={schema} onSubmit={submit} validateOnChange={false} validateOnBlur={false}>
      {(f) => {
        const chosen = byId.get(f.values.sourceId);
        return (
          <Card title="Or start from an existing specification" testID="spec-start-copy">
            <AppText variant="small" muted>
              A copy for {phase.name} of every bound, ratio and inclusion cap of the one you choose, with their sources; then adjust what differs. Only {SPECIES_FAMILY_LABELS[species.family].toLowerCase()} specifications are listed.
            </AppText>
            <FormMessage tone="danger" text={formError} testID="spec-start-copy-error" />
            {groups.length === 0 ? (
              <AppText testID="spec-start-copy-none">No {SPECIES_FAMILY_LABELS[species.family].toLowerCase()} specification to start from yet: start an empty one.</AppText>
            ) : (
              <GroupedChoice label="Start from" groups={groups} value={f.values.sourceId} onChange={(v) => f.setFieldValue('sourceId', v, f.submitCount > 0)} error={f.submitCount > 0 ? f.errors.sourceId : undefined} testID="spec-start-copy-source" />
            )}
            {chosen ? <AppText variant="small" muted testID="spec-start-copy-chosen">{chosen.boundCount} nutrient bounds{chosen.phase ? `, set for ${phaseText(chosen.phase)}` : ''}. Source: {chosen.source}</AppText> : null}
            <TextField label="Name" value={f.values.name} onChangeText={f.handleChange('name')} error={f.submitCount > 0 ? f.errors.name : undefined} maxLength={160} testID="spec-start-copy-name" />
            <Button label={f.isSubmitting ? 'Copying…' : 'Copy and adjust'} disabled={f.isSubmitting || groups.length === 0} onPress={() => f.handleSubmit()} testID="spec-start-copy-submit" />
          </Card>
        );
      }}
    </Formik>
  );
}

const styles = StyleSheet.create({
  grouped: { gap: space.sm },
  group: { borderTopWidth: 1, borderTopColor: colors.rule, paddingTop: space.xs },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  caution: { color: colors.caution },
  error: { color: colors.danger },
});
