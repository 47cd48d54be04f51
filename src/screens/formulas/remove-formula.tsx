import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { ApiError } from '@/api/client';
import { useFormulaArchiveMutation, useFormulaDeleteMutation, useFormulaRemovalQuery } from '@/api/formulas';
import { useActiveMembership } from '@/api/session';
import { describeError, ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { AppText } from '@/components/ui/text';
import type { FormulaRemoval } from '@/shared/schemas/formulas';
import { colors, radius, space } from '@/theme';

import { whoMayArchive } from './archived-banner';

/** The holds of a formula as lines a person reads. */
function holdLines(r: FormulaRemoval): string[] {
  const { approvedVersions, batches, shares } = r.holds;
  return [
    ...approvedVersions.map((v) => `Version ${v.number}, approved by ${v.approvedBy ?? 'unknown'} on ${v.approvedAt.slice(0, 10)}${v.current ? ': the mill makes batches from it' : ' (superseded by a newer approval)'}`),
    ...(batches.count ? [`${batches.count} ${batches.count === 1 ? 'batch' : 'batches'} recorded at the mill, the last made on ${batches.lastMadeOn}`] : []),
    ...shares.map((s) => `Version ${s.versionNumber} shared with ${s.farm} on ${s.sharedAt.slice(0, 10)}`),
  ];
}

/**
 * Removing a formula, in two steps on the page itself: the first asks the server what a delete would do
 * (or what holds the formula), the second deletes it. A formula never approved, with nothing recorded
 * against it, goes for good with its kept versions; any other stays, the card says what holds it and
 * offers to archive it instead (owners and nutritionists; others read who can).
 */
export function RemoveFormula({ formulaId, formulaName, onRemoved, onArchived }: { formulaId: number; formulaName: string; onRemoved: (name: string) => void; onArchived: (name: string) => void }) {
  const { can } = useActiveMembership();
  const [asking, setAsking] = useState(false);
  const removal = useFormulaRemovalQuery(formulaId, asking);
  const remove = useFormulaDeleteMutation(formulaId);
  const archive = useFormulaArchiveMutation(formulaId);
  const close = () => {
    setAsking(false);
    remove.reset();
    archive.reset();
  };

  if (!asking) {
    return (
      <View style={styles.start}>
        <Button label="Remove this formula…" tone="quiet" onPress={() => setAsking(true)} testID="remove-formula" />
      </View>
    );
  }

  // Something came to hold it between the question and the delete: the server refused and says what.
  const refusal = remove.error instanceof ApiError && remove.error.code === 'in_use' ? remove.error : null;
  const r = removal.data;
  const held = refusal !== null || (r !== undefined && !r.removable);
  const instead = r?.archiveInstead && !refusal ? r.archiveInstead : null;
  const mayArchive = can('formulas:approve');
  return (
    <Card title={held ? `Removing “${formulaName}”` : `Delete “${formulaName}”?`} testID="remove-formula-card" style={styles.card}>
      {removal.isPending ? <AppText muted>Checking what would go with it and what holds it…</AppText> : null}
      {removal.isError ? <ErrorState error={removal.error} onRetry={() => removal.refetch()} /> : null}
      {r && !refusal ? (
        <View style={held ? styles.refusal : styles.consequence} accessibilityRole={held ? 'alert' : undefined} testID={held ? 'remove-formula-held' : 'remove-formula-consequence'}>
          <AppText>{r.message}</AppText>
          {holdLines(r).map((line) => (
            <AppText key={line} variant="small">• {line}</AppText>
          ))}
        </View>
      ) : null}
      {refusal ? (
        <View style={styles.refusal} accessibilityRole="alert" testID="remove-formula-held">
          <AppText>{refusal.message}</AppText>
          {Object.values(refusal.fieldErrors).flat().map((line) => (
            <AppText key={line} variant="small">• {line}</AppText>
          ))}
        </View>
      ) : remove.isError ? (
        <FormMessage tone="danger" text={`Nothing was deleted. ${describeError(remove.error)}`} testID="remove-formula-error" />
      ) : null}
      {instead ? (
        <View style={styles.consequence} testID="remove-formula-archive-offer">
          <AppText>{instead.message}</AppText>
          {mayArchive ? null : <AppText variant="small" muted>{whoMayArchive()} can archive it: ask one of them.</AppText>}
        </View>
      ) : null}
      <FormMessage tone="danger" text={archive.isError ? `Nothing was archived. ${describeError(archive.error)}` : null} testID="archive-formula-error" />
      <View style={styles.actions}>
        {r?.removable && !refusal ? (
          <Button
            label={remove.isPending ? 'Deleting…' : 'Yes, delete it for good'}
            disabled={remove.isPending}
            onPress={() => remove.mutate(undefined, { onSuccess: () => onRemoved(r.formulaName) })}
            testID="remove-formula-confirm"
            style={styles.danger}
          />
        ) : null}
        {instead && mayArchive && r ? (
          <Button
            label={archive.isPending ? 'Archiving…' : 'Archive it instead'}
            disabled={archive.isPending}
            onPress={() => archive.mutate('archive', { onSuccess: () => onArchived(r.formulaName) })}
            testID="remove-formula-archive"
          />
        ) : null}
        <Button label={held ? 'Close' : 'Keep it'} tone="quiet" onPress={close} disabled={remove.isPending || archive.isPending} testID="remove-formula-cancel" />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  start: { paddingTop: space.md, borderTopWidth: 1, borderTopColor: colors.rule },
  card: { borderColor: colors.danger, borderLeftWidth: 4 },
  consequence: { gap: space.xs },
  refusal: { gap: space.xs, padding: space.md, borderRadius: radius.md, backgroundColor: colors.dangerSoft },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  danger: { backgroundColor: colors.danger },
});
