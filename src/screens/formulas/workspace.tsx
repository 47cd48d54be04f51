import { useMemo, useState } from 'react';
import { ActivityIndicator, StyleSheet, useWindowDimensions, View } from 'react-native';
import { useRouter } from 'expo-router';
import { useFormik } from 'formik';

import { useFormulaChoicesQuery, useFormulaQuery, useFormulaSolveMutation, useFormulaUpdateMutation, useFormulaVersionQuery, useVersionKeepMutation } from '@/api/formulas';
import { useActiveMembership } from '@/api/session';
import { ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { AppText } from '@/components/ui/text';
import { applyServerErrors } from '@/lib/form-errors';
import { useUnits, useUnitsReady, type Units } from '@/lib/measures-format';
import type { FormulaDetail, FormulaSolve, IngredientChoice } from '@/shared/schemas/formulas';
import { colors, space, WIDE_MIN_WIDTH } from '@/theme';

import { ArchivedBanner } from './archived-banner';
import { when } from './format';
import { IngredientPicker } from './ingredient-picker';
import { InsectValue } from './insect-value';
import { inputsFromValues, InputsForm, inputsSchemaFor, valuesFromFormula, type InputValues } from './inputs-form';
import { ShareCard } from '@/screens/shared-result/share-card';

import { RemoveFormula } from './remove-formula';
import { ResultPanel } from './result-panel';
import { VersionsPanel } from './versions-panel';

/** The formula workspace: inputs on the left (or first on a phone), the result and its explanations beside them. */
export function FormulaWorkspace({ id }: { id: number }) {
  const formula = useFormulaQuery(id);
  const unitsReady = useUnitsReady();
  const units = useUnits();
  const router = useRouter();
  if (formula.isError) {
    return (
      <Screen title="Formula" testID="screen-formula">
        <ErrorState error={formula.error} onRetry={() => formula.refetch()} />
        <Button label="Back to formulas" tone="quiet" onPress={() => router.push('/')} />
      </Screen>
    );
  }
  // The inputs are shown in the organization's units: wait for them (metric if they cannot be read).
  if (!formula.data || !unitsReady) {
    return (
      <Screen title="Formula" testID="screen-formula">
        <AppText muted>Loading the formula…</AppText>
      </Screen>
    );
  }
  // Keyed by revision: a saved change from elsewhere starts the form afresh.
  return <Workspace key={`${formula.data.id}-${formula.data.revision}-${units.system}`} formula={formula.data} units={units} />;
}

type Shown = { kind: 'solve'; solve: FormulaSolve } | { kind: 'version'; versionId: number } | null;

function Workspace({ formula, units }: { formula: FormulaDetail; units: Units }) {
  const { width } = useWindowDimensions();
  const wide = width >= WIDE_MIN_WIDTH;
  const router = useRouter();
  const { can } = useActiveMembership();
  const solve = useFormulaSolveMutation(formula.id);
  const keep = useVersionKeepMutation(formula.id);
  const save = useFormulaUpdateMutation(formula.id);
  // An archived formula is read-only: no solving, keeping, saving, sharing or approving until restored.
  const readOnly = formula.archived !== null;
  // Archived, it opens on the version the mill was making (its approved one), else the latest.
  const opening = readOnly ? (formula.approvedVersion ?? formula.latestVersion) : formula.latestVersion;
  const [shown, setShown] = useState<Shown>(opening ? { kind: 'version', versionId: opening.id } : null);
  const [message, setMessage] = useState<{ tone: 'danger' | 'ok'; text: string } | null>(null);
  const [picking, setPicking] = useState(false);
  const version = useFormulaVersionQuery(formula.id, shown?.kind === 'version' ? shown.versionId : null);
  const choices = useFormulaChoicesQuery(formula.specification?.id, picking);

  const form = useFormik<InputValues>({
    initialValues: valuesFromFormula(formula, units),
    validationSchema: inputsSchemaFor(units),
    validateOnChange: false,
    onSubmit: async (values, helpers) => {
      setMessage(null);
      try {
        const result = await solve.mutateAsync(inputsFromValues(values, units));
        setShown({ kind: 'solve', solve: result });
      } catch (error) {
        // The inputs stay as typed; the message says what to fix.
        setMessage({ tone: 'danger', text: applyServerErrors(error, helpers) });
      }
    },
  });

  const validInputs = () => {
    const errors = form.errors;
    return Object.keys(errors).length ? null : inputsFromValues(form.values, units);
  };

  const keepVersion = async () => {
    const errors = await form.validateForm();
    if (Object.keys(errors).length) return setMessage({ tone: 'danger', text: 'Some inputs need fixing first (marked in red).' });
    setMessage(null);
    try {
      const v = await keep.mutateAsync({ inputs: inputsFromValues(form.values, units) });
      setShown({ kind: 'version', versionId: v.id });
      setMessage({ tone: 'ok', text: `Kept as version ${v.number}.` });
    } catch (error) {
      setMessage({ tone: 'danger', text: applyServerErrors(error, form) });
    }
  };

  const saveInputs = async () => {
    const errors = await form.validateForm();
    if (Object.keys(errors).length) return setMessage({ tone: 'danger', text: 'Some inputs need fixing first (marked in red).' });
    try {
      await save.mutateAsync({ inputs: inputsFromValues(form.values, units), expectedRevision: formula.revision });
      setMessage({ tone: 'ok', text: 'Inputs saved.' });
    } catch (error) {
      setMessage({ tone: 'danger', text: applyServerErrors(error, form) });
    }
  };

  const togglePick = (c: IngredientChoice) => {
    const list = form.values.ingredients;
    if (list.some((r) => r.ingredientId === c.id)) form.setFieldValue('ingredients', list.filter((r) => r.ingredientId !== c.id));
    else form.setFieldValue('ingredients', [...list, { ingredientId: c.id, name: c.name, insect: c.category === 'insect_meal', libraryPrice: c.pricePerKg, priceDate: c.priceDate, price: '', savedPrice: null, minPct: '', maxPct: '' }]);
  };

  const meals = useMemo(() => form.values.ingredients.filter((r) => r.insect).map((r) => ({ id: r.ingredientId, name: r.name })), [form.values.ingredients]);
  const busy = solve.isPending || keep.isPending;

  // On a phone the buttons also close the (long) inputs; the second set carries its own test ids.
  const actions = (suffix = '') => (
    <View style={styles.actions}>
      <Button label={solve.isPending ? 'Solving…' : 'Solve'} onPress={() => form.handleSubmit()} disabled={busy} testID={`solve${suffix}`} />
      {can('formulas:solve') ? <Button label={keep.isPending ? 'Keeping…' : 'Keep as version'} tone="quiet" onPress={keepVersion} disabled={busy} testID={`keep-version${suffix}`} /> : null}
      <Button label="Save inputs" tone="quiet" onPress={saveInputs} disabled={busy || save.isPending} testID={`save-inputs${suffix}`} />
    </View>
  );

  const results = (
    <View style={styles.column}>
      {readOnly ? null : actions()}
      {busy ? (
        <View style={styles.working} testID="solve-working" accessibilityRole="progressbar">
          <ActivityIndicator color={colors.brand} />
          <AppText>{keep.isPending ? 'Solving and keeping a version on the server…' : 'Solving on the server…'}</AppText>
        </View>
      ) : null}
      <FormMessage tone={message?.tone ?? 'ok'} text={message?.text} testID="workspace-message" />
      {shown?.kind === 'solve' ? <ResultPanel units={units} solve={shown.solve} heading={`Solved just now with today’s library values, not kept (${when(shown.solve.solvedAt)})`} /> : null}
      {shown?.kind === 'version' && version.data ? (
        <ResultPanel units={units} solve={version.data.snapshot} heading={`Version ${version.data.number}, kept by ${version.data.createdBy} ${when(version.data.createdAt)}`} />
      ) : null}
      {shown?.kind === 'version' && version.isError ? <ErrorState error={version.error} onRetry={() => version.refetch()} /> : null}
      {!shown ? <AppText muted>{readOnly ? 'No version was kept of this formula.' : 'Press Solve to see the least-cost mix for these inputs.'}</AppText> : null}
      {readOnly ? null : <InsectValue units={units} formulaId={formula.id} meals={meals} currentInputs={validInputs} />}
      <VersionsPanel units={units} formula={formula} readOnly={readOnly} viewing={shown?.kind === 'version' ? shown.versionId : null} onView={(versionId) => setShown({ kind: 'version', versionId })} />
      {/* Only a kept version can be shared: a farm must see exactly what was solved, not today's re-solve. */}
      {shown?.kind === 'version' && can('results:share') && !readOnly ? <ShareCard what={{ kind: 'formula_version', formulaId: formula.id, versionId: shown.versionId }} /> : null}
    </View>
  );

  const inputs = readOnly ? (
    <View style={styles.column}>
      <Card title="Inputs" testID="formula-inputs-archived">
        <AppText muted>The inputs of an archived formula cannot be changed. Each version shown beside holds the inputs, library values and prices it was solved with; restore the formula to work on it again.</AppText>
      </Card>
    </View>
  ) : (
    <View style={styles.column}>
      {picking ? (
        <Card title="Add or remove ingredients" testID="workspace-picker">
          {choices.data ? <IngredientPicker choices={choices.data.ingredients} selected={form.values.ingredients.map((r) => r.ingredientId)} onToggle={togglePick} /> : <AppText muted>Loading your library…</AppText>}
          {choices.isError ? <ErrorState error={choices.error} onRetry={() => choices.refetch()} /> : null}
          <Button label="Done" onPress={() => setPicking(false)} />
        </Card>
      ) : null}
      <InputsForm
        form={form}
        units={units}
        onRemoveIngredient={(i) => form.setFieldValue('ingredients', form.values.ingredients.filter((_, k) => k !== i))}
        onAddIngredients={() => setPicking(true)}
        footer={wide ? null : actions('-end')}
      />
    </View>
  );

  return (
    <Screen title={formula.name} lead={`${formula.species?.name ?? ''}${formula.specification ? ` · ${formula.specification.name}` : ''} · every amount as fed`} testID="screen-formula">
      <Button label="← All formulas" tone="quiet" onPress={() => router.push('/')} testID="back-to-formulas" />
      <ArchivedBanner formula={formula} />
      {wide ? (
        <View style={styles.wide}>
          <View style={styles.inputsWide}>{inputs}</View>
          <View style={styles.resultsWide}>{results}</View>
        </View>
      ) : (
        <View style={styles.column}>
          {results}
          {inputs}
        </View>
      )}
      {can('formulas:solve') ? (
        <RemoveFormula
          formulaId={formula.id}
          formulaName={formula.name}
          onRemoved={(name) => router.replace(`/?removed=${encodeURIComponent(name)}`)}
          onArchived={(name) => router.replace(`/?archived=${encodeURIComponent(name)}`)}
        />
      ) : null}
    </Screen>
  );
}

const styles = StyleSheet.create({
  wide: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  inputsWide: { flex: 5, minWidth: 0 },
  resultsWide: { flex: 6, minWidth: 0 },
  column: { gap: space.lg },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  working: { flexDirection: 'row', alignItems: 'center', gap: space.md, padding: space.md, backgroundColor: colors.brandSoft, borderRadius: 8 },
});
