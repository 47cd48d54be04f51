import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { useLocalSearchParams, useRouter } from 'expo-router';

import { useFormulaArchiveMutation, useFormulasQuery } from '@/api/formulas';
import { useActiveMembership } from '@/api/session';
import { describeError, ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { AppText, Figure } from '@/components/ui/text';
import { useUnits, useUnitsReady } from '@/lib/measures-format';
import type { FormulaSummary } from '@/shared/schemas/formulas';
import { colors, radius, space } from '@/theme';

import { whoMayArchive } from './archived-banner';
import { money, when } from './format';
import { NewFormulaForm } from './new-formula';
import { StatusBadge } from './status-badge';

type Shelf = 'in-use' | 'archived';

/**
 * The organization's formulas, each with its latest kept version and the approved one. A filter shows
 * the archived formulas instead, each with Restore for those who may.
 */
export function FormulaList() {
  const [shelf, setShelf] = useState<Shelf>('in-use');
  const formulas = useFormulasQuery(shelf === 'archived');
  const { can } = useActiveMembership();
  const router = useRouter();
  const [creating, setCreating] = useState(false);
  const [restored, setRestored] = useState<string | null>(null);
  // Set by the workspace after a formula was deleted or archived, so the list says what happened.
  const { removed, archived } = useLocalSearchParams<{ removed?: string; archived?: string }>();
  // The new formula's batch starts in kg or lb: open the form once the settings are known.
  const unitsReady = useUnitsReady();

  return (
    <Screen title="Formulas" lead="The cheapest mix that meets a specification at today’s prices. All amounts are as fed." testID="screen-formulas">
      {can('formulas:solve') ? (
        creating && unitsReady ? (
          <NewFormulaForm onCancel={() => setCreating(false)} onCreated={(id) => router.push(`/?formula=${id}`)} />
        ) : (
          <View style={styles.actions}>
            <Button label="New formula" onPress={() => setCreating(true)} testID="new-formula" />
            {can('ration:check') ? <Button label="Check a ration" tone="quiet" onPress={() => router.push('/ration-check')} testID="open-ration-check" /> : null}
          </View>
        )
      ) : null}
      <FormMessage tone="ok" text={removed ? `“${removed}” was deleted with its kept versions.` : null} testID="formula-removed" />
      <FormMessage tone="ok" text={archived && !restored ? `“${archived}” was archived: it is out of this list and the mill’s approved list. Find it under “Archived”, where it can be restored.` : null} testID="formula-archived" />
      <FormMessage tone="ok" text={restored ? `“${restored}” was restored: it is back in the formula list and, with its approved version, in the mill’s list.` : null} testID="formula-restored" />
      <ChoiceChips
        label="Show"
        value={shelf}
        onChange={setShelf}
        options={[
          { value: 'in-use', label: 'In use' },
          { value: 'archived', label: 'Archived' },
        ]}
        testID="formula-shelf"
      />
      {formulas.isPending ? <AppText muted>Loading formulas…</AppText> : null}
      {formulas.isError ? <ErrorState error={formulas.error} onRetry={() => formulas.refetch()} /> : null}
      {formulas.data?.length === 0 ? <AppText muted>{shelf === 'archived' ? 'No archived formulas.' : 'No formulas yet. Start one with “New formula”.'}</AppText> : null}
      <View style={styles.list}>
        {formulas.data?.map((f) =>
          f.archived ? (
            <View key={f.id} style={styles.archivedRow} testID={`archived-formula-${f.id}`}>
              <FormulaRow formula={f} onOpen={() => router.push(`/?formula=${f.id}`)} />
              <RestoreBar formula={f} onRestored={setRestored} />
            </View>
          ) : (
            <FormulaRow key={f.id} formula={f} onOpen={() => router.push(`/?formula=${f.id}`)} />
          ),
        )}
      </View>
    </Screen>
  );
}

/** Under an archived formula: who archived it and when, and Restore (or who may restore it). */
function RestoreBar({ formula, onRestored }: { formula: FormulaSummary; onRestored: (name: string) => void }) {
  const { can } = useActiveMembership();
  const restore = useFormulaArchiveMutation(formula.id);
  return (
    <View style={styles.restoreBar}>
      <AppText variant="small" muted style={styles.restoreWho}>
        Archived by {formula.archived?.by ?? 'someone no longer in the organization'}, {when(formula.archived?.at ?? null)}
      </AppText>
      {can('formulas:approve') ? (
        <Button
          label={restore.isPending ? 'Restoring…' : 'Restore'}
          tone="quiet"
          disabled={restore.isPending}
          onPress={() => restore.mutate('restore', { onSuccess: () => onRestored(formula.name) })}
          testID={`restore-formula-${formula.id}`}
          aria-label={`Restore ${formula.name}`}
        />
      ) : (
        <AppText variant="small" muted>{whoMayArchive()} can restore it.</AppText>
      )}
      <FormMessage tone="danger" text={restore.isError ? `Nothing was restored. ${describeError(restore.error)}` : null} />
    </View>
  );
}

function FormulaRow({ formula, onOpen }: { formula: FormulaSummary; onOpen: () => void }) {
  const v = formula.latestVersion;
  const units = useUnits();
  return (
    <Pressable onPress={onOpen} role="link" style={styles.row} testID={`formula-${formula.id}`} aria-label={`Open ${formula.name}`}>
      <View style={styles.rowMain}>
        <AppText variant="lead" style={styles.name}>{formula.name}</AppText>
        <AppText variant="small" muted>
          {formula.species?.name ?? 'No species'} · {formula.specification?.name ?? 'no specification'} · {formula.ingredientCount} ingredients
        </AppText>
        <View style={styles.badges}>
          {v ? <StatusBadge status={v.status} label={`Version ${v.number}`} /> : <AppText variant="caption" muted>Not solved and kept yet</AppText>}
          {formula.approvedVersion ? <StatusBadge status="approved" label={`Version ${formula.approvedVersion.number} approved`} /> : null}
          {formula.archived ? <StatusBadge status="superseded" label="Archived: read-only" /> : null}
        </View>
      </View>
      <View style={styles.rowFigures}>
        <Figure value={units.massOf(formula.batchKg).toFixed(0)} unit={`${units.mass} batch`} />
        {v?.costPerTonne != null ? <Figure value={money(units.costOf(v.costPerTonne))} unit={`${units.currency} per ${units.bulk}`} /> : null}
      </View>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: 8 },
  list: { gap: space.md },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, justifyContent: 'space-between', padding: space.lg, borderRadius: radius.lg, backgroundColor: colors.paperRaised, borderWidth: 1, borderColor: colors.rule },
  rowMain: { flex: 1, minWidth: 220, gap: space.xs },
  name: { color: colors.brand, fontWeight: '600' },
  badges: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  rowFigures: { alignItems: 'flex-end', gap: space.xs },
  archivedRow: { gap: space.sm },
  restoreBar: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.md, paddingHorizontal: space.lg },
  restoreWho: { flex: 1, minWidth: 200 },
});
