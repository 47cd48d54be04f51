import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { ApiError } from '@/api/client';
import { useFormulaDeleteMutation, useFormulaRemovalQuery } from '@/api/formulas';
import { describeError, ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { AppText } from '@/components/ui/text';
import type { FormulaRemoval } from '@/shared/schemas/formulas';
import { colors, radius, space } from '@/theme';

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
 * against it, goes for good with its kept versions; any other stays, and the card says what holds it.
 */
export function RemoveFormula({ formulaId, formulaName, onRemoved }: { formulaId: number; formulaName: string; onRemoved: (name: string) => void }) {
  const [asking, setAsking] = useState(false);
  const removal = useFormulaRemovalQuery(formulaId, asking);
  const remove = useFormulaDeleteMutation(formulaId);
  const close = () => {
    setAsking(false);
    remove.reset();
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
        <Button label={held ? 'Close' : 'Keep it'} tone="quiet" onPress={close} disabled={remove.isPending} testID="remove-formula-cancel" />
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
